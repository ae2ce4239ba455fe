// Page benchmark (prints figures; not a test): single-file size, time from opening the file to
// the first interactive frame, CPU per frame with 200 categories, CPU while idle. Headless
// Chromium with software WebGL on this machine; every network request blocked.
import { statSync } from 'node:fs';
import { fileURLToPath } from 'node:url';
import { chromium } from 'playwright-core';
import { pageUrl } from './harness.mjs';

const args = ['--no-sandbox', '--disable-gpu', '--disable-quic', '--no-first-run', '--disable-background-networking',
  '--disable-component-update', '--disable-sync', '--use-gl=angle', '--use-angle=swiftshader', '--enable-unsafe-swiftshader'];
const browser = await chromium.launch({ executablePath: '/usr/bin/chromium', args, headless: true });
const context = await browser.newContext({ viewport: { width: 1280, height: 800 } });
let requests = 0;
await context.route('**/*', (r) => (r.request().url().startsWith('file:') ? r.continue() : (requests++, r.abort())));
// Time every animation-frame callback (the app's frame function runs in them).
await context.addInitScript(() => {
  const raf = window.requestAnimationFrame.bind(window);
  globalThis.__frameTimes = [];
  window.requestAnimationFrame = (cb) => raf((t) => { const t0 = performance.now(); cb(t); globalThis.__frameTimes.push(performance.now() - t0); });
});
const page = await context.newPage();
const cdp = await context.newCDPSession(page);
await cdp.send('Performance.enable');
async function taskSeconds() {
  const { metrics } = await cdp.send('Performance.getMetrics');
  return metrics.find((m) => m.name === 'TaskDuration').value;
}

const size = statSync(fileURLToPath(pageUrl)).size;
const loads = [];
for (let i = 0; i < 5; i++) {
  const t0 = Date.now();
  await page.goto(pageUrl);
  await page.waitForFunction(() => document.getElementById('tp-results').dataset.state === 'result');
  await page.evaluate(() => new Promise((r) => requestAnimationFrame(() => requestAnimationFrame(r))));
  loads.push(Date.now() - t0);
}
loads.sort((a, b) => a - b);

// 200 invented categories.
const rows = Array.from({ length: 200 }, (_, i) => `Item ${i + 1}\t${40 + ((i * 37) % 23)}`).join('\n');
await page.evaluate((t) => globalThis.tallyproofPage.paste(t), rows);
await page.waitForFunction(() => JSON.parse(globalThis.tallyproofPage.lastResult).categories.length === 200);
const frames = 120;
await page.mouse.move(300, 300);
await page.evaluate(() => { globalThis.__frameTimes = []; });
const before = await taskSeconds();
const t0 = Date.now();
for (let i = 0; i < frames; i++) {
  await page.mouse.move(300 + (i % 40), 300 + (i % 30));  // input keeps the page drawing
  await page.evaluate(() => new Promise((r) => requestAnimationFrame(r)));
}
const busy = (await taskSeconds()) - before;
const wall = (Date.now() - t0) / frames;
const ft = (await page.evaluate(() => globalThis.__frameTimes)).filter((x) => x > 0.05).sort((a, b) => a - b);
const median = ft.length ? ft[Math.floor(ft.length / 2)] : 0;
// Idle: no input for 2 s.
await page.waitForTimeout(500);
await page.evaluate(() => { globalThis.__frameTimes = []; });
const idle0 = await taskSeconds();
await page.waitForTimeout(2000);
const idle = (await taskSeconds()) - idle0;
const idleFrames = (await page.evaluate(() => globalThis.__frameTimes)).filter((x) => x > 0.05).length;

// Monte Carlo, one million replicates, N = 1000, k = 10 (the native benchmark's workload), run
// in slices a frame at a time; timed from the paste to the finished result.
const mcDoc = { categories: Array.from({ length: 10 }, (_, i) => `c${i}`), observed: [95, 105, 98, 102, 110, 90, 101, 99, 104, 96],
  pvalue: { method: 'monte-carlo', replicates: 1000000, seed: 11 } };
const mc0 = Date.now();
await page.evaluate((d) => globalThis.tallyproofPage.paste(JSON.stringify(d)), mcDoc);
await page.waitForFunction(() => { const r = JSON.parse(globalThis.tallyproofPage.lastResult); return r.monte_carlo && r.monte_carlo.p_value; },
  null, { timeout: 60000, polling: 20 });
const mcSeconds = (Date.now() - mc0) / 1000;

console.log(`single file: ${(size / 1e6).toFixed(3)} MB (budget 1.5 MB)`);
console.log(`open to first interactive frame: median ${loads[2]} ms, best ${loads[0]} ms of 5 (budget 1000 ms)`);
console.log(`200 categories, whole renderer main thread (the harness's input dispatch, compositing and software ` +
  `WebGL included): ${(1000 * busy / frames).toFixed(1)} ms per step, ${wall.toFixed(1)} ms wall per step`);
console.log(`200 categories: app frame function ${median.toFixed(2)} ms median, ${ft.length ? ft[Math.floor(ft.length * 0.9)].toFixed(2) : 0} ms 90th percentile over ${ft.length} drawn frames (budget 4 ms)`);
console.log(`idle page: ${idleFrames} frames drawn in 2 s with no input; renderer main thread ${(1000 * idle / 2).toFixed(1)} ms CPU per second (includes the harness's own metric polling)`);
console.log(`Monte Carlo 1e6 replicates, N = 1000, k = 10, in slices of 40 ms per frame: ${mcSeconds.toFixed(2)} s wall from paste to result`);
console.log(`network requests attempted: ${requests}`);
await browser.close();
