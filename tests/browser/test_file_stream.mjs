// Files read in chunks (issue 28): a file of raw amounts larger than 8 MB, opened through the
// page's file picker (setInputFiles, as "Open a file" does) while a digit test is on screen, is
// tallied a chunk at a time with progress and Cancel, in memory that does not grow with the file.
// The counts are checked against two outside references: Python's own first-digit count of the
// generated file (Debian's /usr/bin/python3, reading the text line by line) and the command-line
// tool's streamed reading of the same file (tallyproof --json --digits first FILE). A file over
// the page's whole-read limit is refused saying the limit in MB; a reload restores the counts and says
// the file's text was not kept.
import { execFileSync } from 'node:child_process';
import { closeSync, existsSync, mkdtempSync, openSync, rmSync, statSync, writeSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { dirname, join, resolve } from 'node:path';
import { fileURLToPath } from 'node:url';
import { assert, clickWidget, lastResult, pasteText, screenshot, withPage } from './harness.mjs';

const here = dirname(fileURLToPath(import.meta.url));
const tool = resolve(here, '../../build/native/shell/tallyproof');

// Invented amounts, log-uniform over [1, 10^6) from the Park–Miller minimal standard generator,
// written with two decimals, one per line: `lines` of them into `path`.
function writeAmounts(path, lines, seed = 12345) {
  const fd = openSync(path, 'w');
  let x = seed, piece = [];
  for (let i = 0; i < lines; i++) {
    x = (x * 16807) % 2147483647;
    piece.push((10 ** (6 * (x / 2147483647))).toFixed(2));
    if (piece.length === 100000) { writeSync(fd, piece.join('\n') + '\n'); piece = []; }
  }
  if (piece.length) writeSync(fd, piece.join('\n') + '\n');
  closeSync(fd);
  return statSync(path).size;
}

// Outside reference 1: Python's count of first significant digits, line by line.
function pythonFirstDigits(path) {
  const script = 'import sys\nc=[0]*9\nfor line in open(sys.argv[1]):\n  s=line.strip().lstrip("0.")\n  if s: c[int(s[0])-1]+=1\nprint(",".join(map(str,c)))';
  return execFileSync('/usr/bin/python3', ['-c', script, path]).toString().trim().split(',').map(Number);
}
// Outside reference 2: the command-line tool, which streams the same file with --digits first.
function toolResult(path) {
  return JSON.parse(execFileSync(tool, ['--json', '--digits', 'first', path], { maxBuffer: 1 << 24 }).toString());
}

async function wasmBytes(page) { return page.evaluate(() => Module.HEAPU8.length); }
async function jsHeapUsed(page, cdp) {
  await cdp.send('HeapProfiler.collectGarbage');
  const { metrics } = await cdp.send('Performance.getMetrics');
  return metrics.find((m) => m.name === 'JSHeapUsedSize').value;
}

// The digit test on screen, as a user sets it: a few amounts pasted, then Read as › first digits.
async function firstDigitsOnScreen(page) {
  const amounts = ['1.20', '14.99', '230', '3,120.50', '1875', '56.10', '912', '104.00', '27.35', '4100', '7.80', '199'];
  await pasteText(page, Array.from({ length: 10 }, () => amounts).flat().join('\n') + '\n');
  await page.waitForFunction(() => globalThis.tallyproofPage.lastRefusal.includes('not a whole number'));
  await clickWidget(page, 'Read as');
  await clickWidget(page, 'first digits of raw numbers');
  await page.waitForFunction(() => JSON.parse(globalThis.tallyproofPage.lastResult).model?.kind === 'benford-first', null, { timeout: 5000 });
}

// Reads while the file is read: the highest wasm memory seen and whether the canvas drew the progress.
async function watchReading(page, shot) {
  let peak = 0, sawProgress = false, shotTaken = false;
  for (let i = 0; i < 2000; i++) {
    const s = await page.evaluate(() => ({ mem: Module.HEAPU8.length, running: document.getElementById('tp-progress').dataset.running === '1',
      cancel: !!globalThis.tallyproofPage.widgets['Cancel reading'], done: !!globalThis.tallyproofPage.streamed?.done }));
    peak = Math.max(peak, s.mem);
    if (s.running) sawProgress = true;
    if (s.running && s.cancel && shot && !shotTaken) { await screenshot(page, shot); shotTaken = true; }
    if (s.done) break;
    await page.waitForTimeout(20);
  }
  return { peak, sawProgress, shotTaken };
}

export const tests = {
  async 'a large file of amounts is tallied in chunks, equal to Python and the tool, in constant memory; Escape stops a second reading'() {
    const dir = mkdtempSync(join(tmpdir(), 'tp-stream-'));
    try {
      const path = join(dir, 'amounts.txt');
      const size = writeAmounts(path, 4500000);  // about 40 MB
      assert(size > 30e6, `generated ${size} bytes`);
      const python = pythonFirstDigits(path);
      const n = python.reduce((a, b) => a + b, 0);
      assert(n === 4500000, `Python counted ${n} amounts`);
      const native = existsSync(tool) ? toolResult(path) : null;
      await withPage({}, async (page, context) => {
        const cdp = await context.newCDPSession(page);
        await cdp.send('Performance.enable');
        await firstDigitsOnScreen(page);
        const before = await lastResult(page);
        const mem0 = await wasmBytes(page), heap0 = await jsHeapUsed(page, cdp);
        const t0 = Date.now();
        await page.setInputFiles('#tp-file', path);
        const watch = await watchReading(page, 'stream-01-progress');
        assert(watch.sawProgress, 'no progress was shown while the file was read');
        await page.waitForFunction((b) => globalThis.tallyproofPage.lastResult !== b, JSON.stringify(before), { timeout: 120000 })
          .catch(() => null);
        await page.waitForFunction((m) => JSON.parse(globalThis.tallyproofPage.lastResult).observed?.reduce((a, b) => a + b, 0) === m, n,
          { timeout: 120000 });
        const seconds = (Date.now() - t0) / 1000;
        const r = await lastResult(page);
        assert(r.observed.join(',') === python.join(','), `page ${r.observed} vs Python ${python}`);
        assert(r.model.kind === 'benford-first', `model ${r.model.kind}`);
        if (native) {
          assert(native.observed.join(',') === r.observed.join(','), `tool ${native.observed} vs page ${r.observed}`);
          assert(native.statistic === r.statistic && native.p_value === r.p_value, `tool χ² ${native.statistic} p ${native.p_value}, page ${r.statistic} ${r.p_value}`);
        } else console.log(`     (skipped the comparison with the tool: ${tool} is not built)`);
        const notice = await page.evaluate(() => globalThis.tallyproofPage.lastNotice);
        assert(notice.includes('amounts.txt: 4,500,000 values tallied by their first digit') && notice.includes('read in chunks'), `notice: ${notice}`);
        const report = await page.evaluate(() => document.getElementById('tp-results').textContent);
        assert(report.includes('N = 4500000') || report.includes('4,500,000') || report.includes('4 500 000'), `the report names N: ${report.slice(0, 400)}`);
        const mem1 = await wasmBytes(page), heap1 = await jsHeapUsed(page, cdp);
        console.log(`     ${(size / 1e6).toFixed(1)} MB in ${seconds.toFixed(1)} s (${(size / 1e6 / seconds).toFixed(1)} MB/s with the test's polling); ` +
          `wasm memory ${(mem0 / 2 ** 20).toFixed(1)} -> peak ${(watch.peak / 2 ** 20).toFixed(1)} -> ${(mem1 / 2 ** 20).toFixed(1)} MB; ` +
          `JS heap used ${(heap0 / 2 ** 20).toFixed(1)} -> ${(heap1 / 2 ** 20).toFixed(1)} MB`);
        // Constant memory: the chunk (4 MiB), the first MiB held while the shape is decided and the
        // tally; the file (34 MB) read whole would need over 100 MB of wasm memory.
        assert(watch.peak - mem0 <= 16 * 2 ** 20, `wasm memory grew by ${(watch.peak - mem0) / 2 ** 20} MB while streaming`);
        assert(heap1 - heap0 <= 8 * 2 ** 20, `JS heap grew by ${(heap1 - heap0) / 2 ** 20} MB`);
        await screenshot(page, 'stream-02-result');

        // A second reading of the same file, stopped with Escape while its progress shows.
        const shown = JSON.stringify(r);
        await page.setInputFiles('#tp-file', path);
        // Escape once a chunk has been counted, so that the reading stops partway through the file.
        await page.waitForFunction(() => document.getElementById('tp-progress').dataset.running === '1' &&
          globalThis.tallyproofPage.streamed?.chunks >= 1, null, { timeout: 20000, polling: 5 });
        await page.keyboard.press('Escape');
        await page.waitForFunction(() => / stopped at \d+% /.test(globalThis.tallyproofPage.lastNotice), null, { timeout: 10000 });
        const stopped = await page.evaluate(() => globalThis.tallyproofPage.lastNotice);
        assert(/^Reading amounts\.txt stopped at \d+% \([\d.]+ MB of [\d.]+ MB, line [\d,]+\): the counts on screen are the ones before it\./.test(stopped),
          `stopped notice: ${stopped}`);
        const at = Number(/ stopped at (\d+)% /.exec(stopped)[1]);
        assert(at > 0 && at < 100 && !/, line 0\)/.test(stopped), `stopped partway: ${stopped}`);
        await page.waitForTimeout(300);
        assert(JSON.stringify(await lastResult(page)) === shown, 'the counts on screen changed after Cancel');
        assert(await page.evaluate(() => document.getElementById('tp-progress').dataset.running) === '0', 'progress still running');
        await screenshot(page, 'stream-03-stopped');

        // Reload: the counts come back (the document holds them), and the page says the file's text was not kept.
        await page.reload();
        await page.waitForFunction(() => document.getElementById('tp-results')?.dataset.state === 'result', null, { timeout: 20000 });
        await page.waitForFunction(() => globalThis.tallyproofPage.lastNotice.includes('Restored the counts tallied from amounts.txt'), null, { timeout: 5000 });
        const back = await lastResult(page);
        assert(back.observed.join(',') === python.join(','), `restored ${back.observed}`);
        await screenshot(page, 'stream-04-restored');
      });
    } finally {
      rmSync(dir, { recursive: true, force: true });
    }
  },

  async 'a file over the whole-read limit is refused naming the limit, with or without a digit test on screen'() {
    const dir = mkdtempSync(join(tmpdir(), 'tp-stream-'));
    try {
      // Invented answers, one word a line, 70 MB: raw text to tally, not numbers, so it could only be read whole.
      const path = join(dir, 'big-table.tsv');
      const fd = openSync(path, 'w');
      const block = Array.from({ length: 20000 }, (_, i) => ['apple', 'pear', 'plum', 'quince'][(i * 7919) % 4]).join('\n') + '\n';
      while (statSync(path).size < 70 * 2 ** 20) writeSync(fd, block);
      closeSync(fd);
      await withPage({}, async (page) => {
        const before = await page.evaluate(() => globalThis.tallyproofPage.lastResult);
        await page.setInputFiles('#tp-file', path);
        await page.waitForFunction(() => globalThis.tallyproofPage.lastRefusal !== '', null, { timeout: 10000 });
        const refusal = await page.evaluate(() => globalThis.tallyproofPage.lastRefusal);
        assert(/^big-table\.tsv is 70\.\d MB: this page reads a file of up to 64\.0 MB whole/.test(refusal), `refusal: ${refusal}`);
        assert(await page.evaluate(() => globalThis.tallyproofPage.lastResult) === before, 'the previous analysis stays');
        await screenshot(page, 'stream-05-too-large');
        // With a digit test on screen the file is tried in chunks first: its first lines are not amounts.
        await firstDigitsOnScreen(page);
        await page.evaluate(() => { globalThis.tallyproofPage.lastRefusal = ''; });
        await page.setInputFiles('#tp-file', path);
        await page.waitForFunction(() => globalThis.tallyproofPage.lastRefusal !== '', null, { timeout: 10000 });
        const second = await page.evaluate(() => globalThis.tallyproofPage.lastRefusal);
        assert(second.includes('its first lines are not raw numbers for the digit test on screen') && second.includes('64.0 MB'), `refusal: ${second}`);
      });
    } finally {
      rmSync(dir, { recursive: true, force: true });
    }
  },
};
