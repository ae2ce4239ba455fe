// Browser test harness: Debian's Chromium through playwright-core, software WebGL, and every
// network request blocked and counted (a test fails on any). Pages open from file://.
import { chromium } from 'playwright-core';
import { mkdirSync, writeFileSync } from 'node:fs';
import { dirname, resolve } from 'node:path';
import { fileURLToPath, pathToFileURL } from 'node:url';
import { decodePng, distinctColours } from './png.mjs';
// Data goes in through input.mjs only (trusted keys, clipboard, file picker, taps).
export { pasteText, focusCanvas, typeInto, chooseFile, tapWidget, openFormView, closeFormView } from './input.mjs';

const here = dirname(fileURLToPath(import.meta.url));
export const pageUrl = pathToFileURL(resolve(here, '../../dist/tallyproof.html')).href;
export const screenshotDir = resolve(here, 'screenshots');
mkdirSync(screenshotDir, { recursive: true });  // a clean checkout has none

const launchArgs = ['--no-sandbox', '--disable-gpu', '--disable-quic', '--no-first-run',
  '--disable-background-networking', '--disable-component-update', '--disable-sync',
  '--use-gl=angle', '--use-angle=swiftshader', '--enable-unsafe-swiftshader'];

export async function withPage(options, body) {
  const browser = await chromium.launch({ executablePath: '/usr/bin/chromium', args: launchArgs, headless: true });
  const blocked = [];
  const problems = [];
  try {
    const context = await browser.newContext({
      viewport: options.viewport || { width: 1280, height: 800 },
      deviceScaleFactor: options.deviceScaleFactor || 1,
      hasTouch: !!options.hasTouch,
      isMobile: !!options.isMobile,
      // The clipboard is granted unless a test says otherwise: pastes are Ctrl+V (input.mjs).
      permissions: options.permissions || ['clipboard-read', 'clipboard-write'],
      acceptDownloads: true,
      ...(options.userAgent ? { userAgent: options.userAgent } : {}),
      serviceWorkers: options.allowOrigin ? 'allow' : 'block',
    });
    const allowed = (url) => url.startsWith('file:') || url.startsWith('data:') || url.startsWith('blob:') ||
      (options.allowOrigin && url.startsWith(options.allowOrigin + '/'));
    await context.route('**/*', (route) => {
      const url = route.request().url();
      if (allowed(url)) return route.continue();
      blocked.push(url);
      return route.abort();
    });
    context.on('request', (req) => {
      const url = req.url();
      if (!allowed(url) && !blocked.includes(url)) blocked.push(url);
    });
    if (options.initScript) await context.addInitScript(options.initScript);
    const page = await context.newPage();
    page.on('pageerror', (e) => problems.push(`page error: ${e.message}`));
    page.on('console', (m) => { if (m.type() === 'error') problems.push(`console error: ${m.text()}`); });
    await page.goto(options.url || pageUrl);
    await page.waitForFunction(() => document.getElementById('tp-results')?.dataset.state === 'result', null, { timeout: 20000 });
    await body(page, context);
    if (blocked.length) throw new Error(`the page attempted ${blocked.length} network request(s): ${blocked.join(', ')}`);
    if (problems.length) throw new Error(problems.join('\n'));
  } finally {
    await browser.close();
  }
}

export async function resultsText(page) {
  return page.evaluate(() => document.getElementById('tp-results').textContent);
}

// Waits two animation frames so the canvas shows the latest state, then saves a screenshot and
// returns the number of distinct colours in it.
export async function screenshot(page, name) {
  await page.evaluate(() => new Promise((r) => requestAnimationFrame(() => requestAnimationFrame(r))));
  await page.waitForTimeout(150);
  mkdirSync(screenshotDir, { recursive: true });
  const png = await page.screenshot();
  writeFileSync(resolve(screenshotDir, `${name}.png`), png);
  return distinctColours(decodePng(png));
}

export function assert(cond, message) { if (!cond) throw new Error(message); }

// Clicks the canvas control the page recorded under `name` (tallyproofPage.widgets).
export async function clickWidget(page, name) {
  await page.waitForFunction((n) => !!globalThis.tallyproofPage.widgets[n], name, { timeout: 5000 });
  const r = await page.evaluate((n) => globalThis.tallyproofPage.widgets[n], name);
  await page.mouse.move(r.x + r.w / 2, r.y + r.h / 2);
  await page.waitForTimeout(60);
  await page.mouse.down();
  await page.waitForTimeout(40);
  await page.mouse.up();
  await page.waitForTimeout(120);
}

export async function lastResult(page) {
  return JSON.parse(await page.evaluate(() => globalThis.tallyproofPage.lastResult));
}
