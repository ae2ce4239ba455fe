// Results that leave the page: copied write-up and table, PNG charts, the print layout as PDF,
// share links (100 random analyses and hostile links), autosave across a reload, and offline use
// through the service worker when served over http.
import { execFileSync } from 'node:child_process';
import { mkdtempSync, readFileSync, writeFileSync, existsSync } from 'node:fs';
import { createServer } from 'node:http';
import { tmpdir } from 'node:os';
import { join, resolve, dirname } from 'node:path';
import { fileURLToPath } from 'node:url';
import { chromium } from 'playwright-core';
import { assert, clickWidget, lastResult, pasteText, screenshot, withPage, pageUrl } from './harness.mjs';
import { decodePng, distinctColours } from './png.mjs';

const here = dirname(fileURLToPath(import.meta.url));
const tool = resolve(here, '../../build/native/shell/tallyproof');

// A seeded generator (mulberry32, public domain) so the random analyses are the same every run.
function rng(seed) {
  return () => { seed |= 0; seed = (seed + 0x6D2B79F5) | 0; let t = Math.imul(seed ^ (seed >>> 15), 1 | seed);
    t = (t + Math.imul(t ^ (t >>> 7), 61 | t)) ^ t; return ((t ^ (t >>> 14)) >>> 0) / 4294967296; };
}

async function openMenuItem(page, item) {
  await clickWidget(page, 'Save & share');
  await clickWidget(page, item);
}

export const tests = {
  async 'copy the sentence and the table (clipboard granted)'() {
    await withPage({ permissions: ['clipboard-read', 'clipboard-write'] }, async (page) => {
      await clickWidget(page, 'Write-up');
      await clickWidget(page, 'Copy sentence');
      await page.waitForFunction(() => globalThis.tallyproofPage.lastCopy !== null);
      const copied = await page.evaluate(() => navigator.clipboard.readText());
      // The first example: grades 61, 214, 103, 22 against 20/50/25/5 %. Reference values from
      // SciPy 1.10: chisquare([61,214,103,22], [80,200,100,20]) -> statistic 5.7825, p = 0.12269.
      assert(copied.includes('χ²(3, N = 400) = 5.78, p = .123'), `sentence: ${copied}`);
      assert(copied.includes('no evidence against the stated mix'), copied);
      await clickWidget(page, 'Copy table');
      await page.waitForFunction((s) => globalThis.tallyproofPage.lastCopy.text !== s, copied);
      const table = await page.evaluate(() => navigator.clipboard.readText());
      const lines = table.trim().split('\n');
      assert(lines.length === 5, `table has ${lines.length} lines`);
      const cells = lines[1].split('\t');
      assert(cells[0] === 'Extra' && cells[1] === '61' && cells[2] === '80', `first row: ${lines[1]}`);
    });
  },

  async 'copy falls back where the Clipboard API is refused'() {
    await withPage({ initScript: 'Object.defineProperty(navigator, "clipboard", { value: undefined });' }, async (page) => {
      await clickWidget(page, 'Copy results');
      await page.waitForFunction(() => globalThis.tallyproofPage.lastCopy !== null);
      const via = await page.evaluate(() => globalThis.tallyproofPage.lastCopy.via);
      assert(via === 'fallback', `copied via ${via}`);
    });
  },

  async 'charts export as PNG at 2x'() {
    await withPage({}, async (page) => {
      for (const [item, name] of [['Save curve as PNG', 'tallyproof-curve.png'], ['Save bars as PNG', 'tallyproof-bars.png']]) {
        const download = page.waitForEvent('download');
        await openMenuItem(page, item);
        const d = await download;
        assert(d.suggestedFilename() === name, d.suggestedFilename());
        const file = join(mkdtempSync(join(tmpdir(), 'tp-')), name);
        await d.saveAs(file);
        const png = readFileSync(file);
        const img = decodePng(png);
        assert(img.width === 1920 && img.height === 1080, `${name}: ${img.width}x${img.height}`);
        const colours = distinctColours(img);
        assert(colours > 200, `${name} looks blank (${colours} colours)`);
        writeFileSync(resolve(here, 'screenshots', `export-${name}`), png);
      }
    });
  },

  async 'downloads: analysis document and CSV table'() {
    await withPage({}, async (page) => {
      let download = page.waitForEvent('download');
      await openMenuItem(page, 'Download analysis (JSON)');
      let file = await (await download).path();
      const doc = JSON.parse(readFileSync(file, 'utf8'));
      assert(doc.format === 'tallyproof/1' && doc.observed.join(',') === '61,214,103,22', JSON.stringify(doc));
      // The downloaded document analyses to the same statistic in the native tool.
      const native = JSON.parse(execFileSync(tool, ['--json', file]).toString());
      const shown = await lastResult(page);
      assert(Math.abs(native.statistic - shown.statistic) < 1e-12, 'same statistic natively');
      download = page.waitForEvent('download');
      await openMenuItem(page, 'Download table (CSV)');
      file = await (await download).path();
      const csv = readFileSync(file, 'utf8').replace(/^\uFEFF/, '');
      const rows = csv.trim().split('\r\n');
      assert(rows.length === 5 && rows[1].startsWith('Extra,61,80'), `csv: ${rows.slice(0, 2)}`);
    });
  },

  async 'labels with formulas are neutralised in CSV'() {
    await withPage({}, async (page) => {
      await pasteText(page, '=HYPERLINK("x")\t12\n+cmd|calc\t9\n@SUM(A1)\t11\n<script>alert(1)</script>\t10\n');
      await page.waitForFunction(() => JSON.parse(globalThis.tallyproofPage.lastResult).categories?.[0] === '=HYPERLINK("x")');
      const download = page.waitForEvent('download');
      await openMenuItem(page, 'Download table (CSV)');
      const csv = readFileSync(await (await download).path(), 'utf8');
      for (const line of csv.trim().split('\r\n').slice(1)) {
        const first = line.replace(/^"/, '')[0];
        assert(!'=+-@'.includes(first), `a cell starts with a formula trigger: ${line}`);
      }
      // Labels are only ever drawn as text: no element was created from the label.
      const scripts = await page.evaluate(() => document.querySelectorAll('script').length);
      const inTable = await page.evaluate(() => document.querySelector('#tp-table tbody th').textContent);
      assert(inTable === '=HYPERLINK("x")', inTable);
      assert(scripts <= 4, `unexpected script elements: ${scripts}`);
    });
  },

  async 'print layout to PDF is not blank'() {
    // window.print() is recorded, not run: headless Chromium cannot print twice at once, and the
    // test prints the same layout with page.pdf() below.
    await withPage({ initScript: 'window.print = () => { globalThis.__printed = (globalThis.__printed || 0) + 1; };' }, async (page) => {
      await openMenuItem(page, 'Print or save as PDF');
      await page.waitForFunction(() => globalThis.tallyproofPage.printReady === true && globalThis.__printed === 1, null, { timeout: 10000 });
      const dir = mkdtempSync(join(tmpdir(), 'tp-pdf-'));
      const pdf = join(dir, 'print.pdf');
      await page.pdf({ path: pdf, format: 'A4' });
      execFileSync('pdftoppm', ['-png', '-r', '60', '-f', '1', '-l', '1', pdf, join(dir, 'page')]);
      const pngFile = ['page-1.png', 'page-01.png'].map((n) => join(dir, n)).find(existsSync);
      assert(pngFile, 'pdftoppm wrote no page image');
      const png = readFileSync(pngFile);
      writeFileSync(resolve(here, 'screenshots', 'print-page-1.png'), png);
      const img = decodePng(png);
      const colours = distinctColours(img);
      assert(colours > 50, `printed page looks blank (${colours} colours)`);
      const pages = execFileSync('pdfinfo', [pdf]).toString().match(/Pages:\s+(\d+)/)[1];
      assert(pages === '1', `print layout runs to ${pages} pages`);
    });
  },

  async 'share links: 100 random analyses round-trip, hostile links are refused'() {
    await withPage({ permissions: ['clipboard-read', 'clipboard-write'] }, async (page) => {
      const rand = rng(20261201);
      const kinds = ['equal', 'shares', 'ratio', 'counts'];
      const links = [];
      for (let i = 0; i < 100; i++) {
        const k = 2 + Math.floor(rand() * 8);
        const kind = kinds[Math.floor(rand() * kinds.length)];
        const observed = Array.from({ length: k }, () => 5 + Math.floor(rand() * 60));
        const doc = { categories: observed.map((_, j) => `C${i}-${j} ${'äβ'.slice(0, j % 3)}`), observed, model: { kind },
          alpha: [0.05, 0.01, 0.1][i % 3], statistic: { lambda: [1, 0, 2 / 3][i % 3] } };
        if (kind === 'shares') doc.model.values = observed.map(() => 1 / k);
        if (kind === 'ratio') doc.model.values = observed.map((_, j) => 1 + (j % 3));
        if (kind === 'counts') doc.model.values = observed.map(() => observed.reduce((a, b) => a + b) / k);
        await pasteText(page, JSON.stringify(doc));
        await page.waitForFunction((c) => JSON.parse(globalThis.tallyproofPage.lastResult).categories?.[0] === c, doc.categories[0]);
        const before = await page.evaluate(() => globalThis.tallyproofPage.lastDocument);
        await page.evaluate(() => { globalThis.tallyproofPage.lastCopy = null; });
        await openMenuItem(page, 'Copy share link');
        await page.waitForFunction(() => globalThis.tallyproofPage.lastCopy !== null);
        const link = await page.evaluate(() => globalThis.tallyproofPage.lastCopy.text);
        assert(link.startsWith(pageUrl + '#tp1.'), `link: ${link.slice(0, 80)}`);
        links.push([link, before]);
      }
      for (const [i, [link, before]] of links.entries()) {
        // Every tenth link in a fresh load (about a second each); the others in the same tab,
        // where only the fragment changes.
        if (i % 10) await page.goto(link);
        else { await page.goto('about:blank'); await page.goto(link); }
        try {
          await page.waitForFunction((b) => globalThis.tallyproofPage?.lastDocument === b, before, { timeout: 8000 });
        } catch (e) {
          throw new Error(`link ${i} did not restore the exact analysis`);
        }
      }
      const hostile = [
        ['#tp1.', 'share link'], ['#tp1.!!!!', 'share link'], ['#tp2.AAAA', 'newer version'],
        ['#tp1.' + 'A'.repeat(70000), 'share link'], ['#nonsense', 'share link'], ['#tp1.%3Cscript%3E', 'share link'],
      ];
      for (const [fragment, words] of hostile) {
        await page.goto('about:blank');
        await page.goto(pageUrl + fragment);
        await page.waitForFunction(() => (globalThis.tallyproofPage?.lastRefusal || '') !== '', null, { timeout: 8000 });
        const text = await page.evaluate(() => document.getElementById('tp-results').textContent);
        const shown = await page.evaluate(() => globalThis.tallyproofPage.lastResult);
        assert(shown && JSON.parse(shown).categories, `hostile link ${fragment.slice(0, 20)}: no analysis on screen`);
        const refusal = await page.evaluate(() => globalThis.tallyproofPage.lastRefusal || '');
        assert(refusal.toLowerCase().includes(words), `hostile link ${fragment.slice(0, 20)}: message "${refusal}"`);
      }
      await screenshot(page, 'share-hostile');
      // An analysis too large for a link says so and points to the file download instead.
      const rand2 = rng(7);
      const k = 3000;
      const labels = Array.from({ length: k }, (_, i) => `${i}-` + Array.from({ length: 10 }, () => String.fromCharCode(97 + Math.floor(rand2() * 26))).join(''));
      await pasteText(page, JSON.stringify({ categories: labels, observed: labels.map(() => 1 + Math.floor(rand2() * 50)) }));
      await page.waitForFunction((n) => JSON.parse(globalThis.tallyproofPage.lastResult).categories?.length === n, k, { timeout: 15000 });
      await openMenuItem(page, 'Copy share link');
      await page.waitForFunction(() => (globalThis.tallyproofPage.lastNotice || '').includes('too large for a share link'), null, { timeout: 5000 });
    });
  },

  async 'autosave restores the analysis after a reload; start fresh forgets it'() {
    await withPage({}, async (page) => {
      await pasteText(page, 'North\t31\nSouth\t44\nEast\t25\nWest\t40\n');
      await page.waitForFunction(() => JSON.parse(globalThis.tallyproofPage.lastResult).categories?.[0] === 'North');
      await page.reload();
      await page.waitForFunction(() => document.getElementById('tp-results').dataset.state === 'result');
      let r = await lastResult(page);
      assert(r.categories.join(',') === 'North,South,East,West', `after reload: ${r.categories}`);
      await screenshot(page, 'autosave-restored');
      await openMenuItem(page, 'Start fresh');
      await page.reload();
      await page.waitForFunction(() => document.getElementById('tp-results').dataset.state === 'result');
      r = await lastResult(page);
      assert(r.categories[0] === 'Extra', `after start fresh: ${r.categories}`);
      // The recent list still offers the pasted analysis.
      await clickWidget(page, 'Save & share');
      await clickWidget(page, 'recent-1');
      await page.waitForFunction(() => JSON.parse(globalThis.tallyproofPage.lastResult).categories?.[0] === 'North');
    });
  },

  async 'served over http, the page keeps working offline'() {
    const dist = resolve(here, '../../dist');
    const server = createServer((req, res) => {
      const name = req.url.split('?')[0].replace(/^\//, '') || 'tallyproof.html';
      if (!['tallyproof.html', 'tallyproof-sw.js'].includes(name)) { res.writeHead(404); res.end(); return; }
      res.writeHead(200, { 'content-type': name.endsWith('.js') ? 'text/javascript' : 'text/html' });
      res.end(readFileSync(join(dist, name)));
    });
    await new Promise((r) => server.listen(0, '127.0.0.1', r));
    const origin = `http://127.0.0.1:${server.address().port}`;
    try {
      await withPage({ allowOrigin: origin, url: `${origin}/tallyproof.html` }, async (page, context) => {
        await page.waitForFunction(() => navigator.serviceWorker.controller !== null || globalThis.tallyproofPage.offlineReady, null, { timeout: 10000 });
        await page.evaluate(() => navigator.serviceWorker.ready);
        await page.reload();  // now controlled by the worker, which has cached the page
        await page.waitForFunction(() => navigator.serviceWorker.controller !== null, null, { timeout: 10000 });
        await context.setOffline(true);
        await page.reload();
        await page.waitForFunction(() => document.getElementById('tp-results').dataset.state === 'result', null, { timeout: 15000 });
        await screenshot(page, 'offline-http');
      });
    } finally {
      server.close();
    }
  },
};
