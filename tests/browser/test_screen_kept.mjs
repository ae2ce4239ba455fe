// A screen of many groups is kept like any other analysis (issue 26): a long table pasted through
// the clipboard (permission granted, Ctrl+V on the focused page), sorted and with a group opened,
// comes back after a reload, through a share link opened in a fresh browser, and from the recent
// list: the Groups view with the same groups, flags and order, an opened group with its way back.
// Reference: SciPy 1.10, scipy.stats.chisquare([38,12,10,8,11,38,9,12,10,8]) -> statistic
// 81.56410256410255 for "Dev" (the same invented data as test_groups.mjs).
import { assert, clickWidget, closeFormView, focusCanvas, lastResult, openFormView, pasteText, resultsText, screenshot, withPage } from './harness.mjs';
import { longTable } from './test_groups.mjs';  // the same twelve invented meter readers
import { execFileSync } from 'node:child_process';
import { mkdtempSync, readFileSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { dirname, join, resolve } from 'node:path';
import { fileURLToPath } from 'node:url';

const here = dirname(fileURLToPath(import.meta.url));

// Trusted input only: the text goes to the clipboard and the page gets it by Ctrl+V (input.mjs).
async function pasteByClipboard(page, text, ready) {
  await pasteText(page, text);
  await page.waitForFunction(ready, null, { timeout: 20000 });
}

const screenShown = () => document.getElementById('tp-results').textContent.includes('of 12 groups depart');
const order = (page) => page.evaluate(() => JSON.stringify(globalThis.tallyproofPage.groupOrder));
const banner = (page) => page.evaluate(() => document.getElementById('tp-group-banner').textContent);

async function openMenuItem(page, item) {
  await clickWidget(page, 'Save & share');
  await clickWidget(page, item);
}

// The screen as the page shows it: the live region's sentence, the result document's groups and
// flags (Dev flagged at SciPy's statistic), and the table's order.
async function expectScreen(page, expectedOrder, where) {
  await page.waitForFunction(screenShown, null, { timeout: 20000 });
  const r = await lastResult(page);
  assert(r.screen && r.screen.groups === 12 && r.screen.flagged === 1, `${where}: screen ${JSON.stringify(r.screen)}`);
  const dev = r.groups.find((g) => g.name === 'Dev');
  assert(dev && dev.flagged && Math.abs(dev.statistic - 81.56410256410255) < 1e-9, `${where}: Dev ${JSON.stringify(dev)}`);  // SciPy chisquare
  assert((await resultsText(page)).includes('1 of 12 groups departs'), `${where}: ${await resultsText(page)}`);
  if (expectedOrder) {
    await page.waitForFunction((o) => JSON.stringify(globalThis.tallyproofPage.groupOrder) === o, expectedOrder, { timeout: 5000 })
      .catch(async () => { throw new Error(`${where}: order ${await order(page)}, expected ${expectedOrder}`); });
  }
  return r;
}

// Long tasks of the page's main thread (Chrome's trace, through the DevTools protocol), each
// named by what took most of it: the page's work slices, an input handler, a frame's read-back
// of the canvas (software WebGL), or other.
async function startTaskTrace(page) {
  const cdp = await page.context().newCDPSession(page);
  const events = [];
  cdp.on('Tracing.dataCollected', (e) => events.push(...e.value));
  const complete = new Promise((r) => cdp.on('Tracing.tracingComplete', r));
  await cdp.send('Tracing.start', { categories: 'devtools.timeline,disabled-by-default-devtools.timeline', transferMode: 'ReportEvents' });
  return {
    async finish() {
      await cdp.send('Tracing.end');
      await complete;
      const main = events.find((e) => e.ph === 'M' && e.name === 'thread_name' && e.args.name === 'CrRendererMain');
      const on = events.filter((e) => main && e.pid === main.pid && e.tid === main.tid && e.ph === 'X' && e.dur);
      const tasks = on.filter((e) => (e.name === 'RunTask' || e.name === 'ThreadControllerImpl::RunTask') && e.dur > 50000);
      return tasks.map((t) => {
        const inside = on.filter((e) => e !== t && e.ts >= t.ts && e.ts + e.dur <= t.ts + t.dur && e.dur > 0.3 * t.dur);
        const names = inside.map((e) => e.name + ':' + ((e.args && e.args.data && e.args.data.functionName) || ''));
        const kind = names.some((n) => n.includes('onmessage')) ? 'work'
          : names.some((n) => n.startsWith('EventDispatch')) ? 'input'
          : names.some((n) => n.startsWith('Commit') || n.includes('ReadPixels')) ? 'frame' : 'other';
        return { kind, ms: t.dur / 1000 };
      });
    },
  };
}

export const tests = {
  async 'the form view pages through every group of a long screen, 200 at a time, by keys'() {
    await withPage({ permissions: ['clipboard-read', 'clipboard-write'] }, async (page) => {
      // 450 invented groups of ten digit counts (a wide table under a header of the digits).
      const rows = ['unit,0,1,2,3,4,5,6,7,8,9'];
      for (let g = 0; g < 450; g++) rows.push(`U${g},` + Array.from({ length: 10 }, (_, d) => 20 + ((g * 3 + d * 7) % 9)).join(','));
      await pasteByClipboard(page, rows.join('\n') + '\n', () => document.getElementById('tp-results').textContent.includes('of 450 groups'));
      await openFormView(page);
      const caption = () => page.evaluate(() => document.querySelector('#tp-groups-table caption').textContent);
      const names = () => page.evaluate(() => [...document.querySelectorAll('#tp-groups-table tbody th button')].map((b) => b.textContent));
      assert((await caption()).includes('groups 1 to 200 of 450'), `caption: ${await caption()}`);
      const next = page.getByRole('button', { name: 'Next 200 groups' });
      await next.focus();
      await page.keyboard.press('Enter');
      assert((await caption()).includes('groups 201 to 400 of 450'), `caption: ${await caption()}`);
      await page.keyboard.press('Space');
      assert((await caption()).includes('groups 401 to 450 of 450'), `caption: ${await caption()}`);
      const last = await names();
      assert(last.length === 50 && last.includes('U449'), `last page: ${last.length} rows, ${last.slice(-3)}`);
      assert(await next.isDisabled(), 'no page after the last');
      const prev = page.getByRole('button', { name: 'Previous 200 groups' });
      await prev.focus();
      await page.keyboard.press('Enter');
      assert((await caption()).includes('groups 201 to 400 of 450'), `caption after Previous: ${await caption()}`);
      await closeFormView(page);
    });
  },

  async 'printing a screen gives one page: its summary, the flagged group with its drivers, the funnel chart, the cautions'() {
    await withPage({ permissions: ['clipboard-read', 'clipboard-write'] }, async (page) => {
      await pasteByClipboard(page, longTable(), screenShown);
      await expectScreen(page, null, 'pasted');
      await page.emulateMedia({ media: 'print' });  // the browser's own Print, as Ctrl+P
      await page.waitForFunction(() => globalThis.tallyproofPage.printReady === true, null, { timeout: 10000 });
      const alts = await page.evaluate(() => [...document.querySelectorAll('#tp-print img')].map((i) => i.alt));
      assert(alts.length === 1 && alts[0].startsWith('Effect size w against group size N'), `print images: ${JSON.stringify(alts)}`);
      const dir = mkdtempSync(join(tmpdir(), 'tp-print-screen-'));
      const pdf = join(dir, 'screen.pdf');
      await page.pdf({ path: pdf, format: 'A4' });
      const pages = /Pages:\s+(\d+)/.exec(execFileSync('pdfinfo', [pdf]).toString());
      assert(pages && pages[1] === '1', `the printed screen has ${pages && pages[1]} pages`);
      const text = execFileSync('pdftotext', [pdf, '-']).toString().replace(/\s+/g, ' ');
      assert(text.includes('1 of 12 groups departs'), `printed summary: ${text.slice(0, 400)}`);
      assert(/Dev: N = 156, q = [^;]+; driven by /.test(text), `printed flagged group: ${text.slice(0, 600)}`);
      assert(text.includes('Caution:'), `printed cautions: ${text.slice(0, 800)}`);
      assert(!text.includes('Chi-square density'), 'the pooled sample is not printed for a screen');
      execFileSync('pdftoppm', ['-png', '-r', '50', '-f', '1', '-l', '1', pdf, join(dir, 'page')]);
      const png = ['page-1.png', 'page-01.png'].map((n) => join(dir, n)).find((f) => { try { readFileSync(f); return true; } catch { return false; } });
      writeFileSync(resolve(here, 'screenshots', 'screen-print-page-1.png'), readFileSync(png));
      await page.emulateMedia({ media: 'screen' });
    });
  },

  async 'a screen survives reload, an opened group keeps its way back, a share link and the recent list restore it'() {
    let link = '', sorted = '';
    await withPage({ permissions: ['clipboard-read', 'clipboard-write'] }, async (page) => {
      await pasteByClipboard(page, longTable(), screenShown);
      const first = await expectScreen(page, null, 'pasted');
      const dev = first.groups.findIndex((g) => g.name === 'Dev');
      // Sorted by N descending (two clicks on its head): Dev (N = 156) leads.
      await clickWidget(page, 'group head N');
      await clickWidget(page, 'group head N');
      await page.waitForFunction((d) => globalThis.tallyproofPage.groupOrder[0] === d, dev, { timeout: 5000 });
      sorted = await order(page);
      // Reload: the Groups view, the same flags, the same order.
      await page.reload();
      await expectScreen(page, sorted, 'after reload');
      await screenshot(page, 'screen-kept-reload');
      // Opened group, reload: still that group, and the way back leads to the same sorted table.
      await clickWidget(page, 'group row 1');
      await page.waitForFunction(() => document.getElementById('tp-group-banner').textContent.includes('Group Dev'), null, { timeout: 5000 });
      await page.reload();
      await page.waitForFunction(() => document.getElementById('tp-group-banner').textContent.includes('Group Dev'), null, { timeout: 20000 })
        .catch(async () => { throw new Error(`after reload of an opened group: banner "${await banner(page)}", ${await resultsText(page)}`); });
      const single = await lastResult(page);
      assert(Math.abs(single.statistic - 81.56410256410255) < 1e-9 && single.n === 156, `opened Dev after reload: ${single.statistic}, N ${single.n}`);
      assert((await banner(page)).includes('flagged'), `banner: ${await banner(page)}`);
      await screenshot(page, 'screen-kept-opened-group');
      await clickWidget(page, 'Back to all groups');
      await expectScreen(page, sorted, 'back from the restored group');
      // The share link carries the whole screen.
      await page.evaluate(() => { globalThis.tallyproofPage.lastCopy = null; });
      await openMenuItem(page, 'Copy share link');
      await page.waitForFunction(() => globalThis.tallyproofPage.lastCopy !== null, null, { timeout: 5000 });
      link = await page.evaluate(() => navigator.clipboard.readText());
      assert(link.includes('#tp1.'), `link: ${link.slice(0, 80)}`);
      const notice = await page.evaluate(() => globalThis.tallyproofPage.lastNotice || '');
      assert(notice.includes('whole screen'), `share notice: ${notice}`);
      // The recent list: titled as a screen, and it brings the screen back after "Start fresh".
      const titles = await page.evaluate(() => Object.keys(localStorage).filter((k) => k.startsWith('tallyproof.recent.'))
        .map((k) => JSON.parse(localStorage.getItem(k)).title));
      assert(titles.some((t) => t.startsWith('12 groups') && t.includes('1 flagged')), `recent titles: ${JSON.stringify(titles)}`);
      await openMenuItem(page, 'Start fresh');
      await page.waitForFunction(() => !document.getElementById('tp-results').textContent.includes('groups depart'), null, { timeout: 5000 });
      await clickWidget(page, 'Save & share');
      await clickWidget(page, 'recent-1');
      await expectScreen(page, sorted, 'from the recent list');
    });
    // A fresh browser (no storage) opens the link to the same screen, in the same order.
    await withPage({ url: link }, async (page) => {
      await expectScreen(page, sorted, 'share link in a fresh browser');
      await screenshot(page, 'screen-kept-share-link');
    });
  },

  async '100,000 groups: read and tested in slices, on screen in seconds, paged in the form view, never a long freeze'() {
    await withPage({ permissions: ['clipboard-read', 'clipboard-write'] }, async (page) => {
      // 100,000 invented groups x 10 categories as a wide table under a header of the digits 0-9,
      // about 415 counts a group (not thin: each group by the asymptotic test).
      const rows = ['group,0,1,2,3,4,5,6,7,8,9'];
      for (let g = 0; g < 100000; g++) rows.push(`G${g},` + Array.from({ length: 10 }, (_, d) => 40 + ((g * 7 + d * 13) % 4)).join(','));
      await focusCanvas(page);
      const tasks = await startTaskTrace(page);
      const start = Date.now();
      await pasteText(page, rows.join('\n') + '\n', { focus: 'keep' });
      await page.waitForFunction(() => document.getElementById('tp-results').textContent.includes('0 of 100000 groups depart'), null, { timeout: 60000, polling: 100 });
      const shown = Date.now() - start;
      await page.waitForTimeout(500);
      const long = await tasks.finish();
      const longest = (kind) => Math.max(0, ...long.filter((t) => t.kind === kind).map((t) => t.ms));
      // The target is 100 ms a task. The page's own work comes in slices of about 30 ms;
      // on the shared 2-core build machine, with software WebGL, the slices measured 50-130 ms and a
      // frame's pixel read-back 80-200 ms (work no page code can split). Asserted here: no freeze of a
      // second (finishing this screen was one task of 6.3 s before the result was handed over in parts).
      console.log(`     100,000 groups pasted: on screen after ${shown} ms; longest tasks: page work ${longest('work').toFixed(0)} ms, ` +
        `paste handler ${longest('input').toFixed(0)} ms, frame read-back ${longest('frame').toFixed(0)} ms, other ${longest('other').toFixed(0)} ms (${long.length} over 50 ms)`);
      assert(Math.max(0, ...long.map((t) => t.ms)) < 1000, `a task of a second or more: ${JSON.stringify(long.filter((t) => t.ms >= 1000))}`);
      assert(longest('work') < 400, `a work slice of ${longest('work').toFixed(0)} ms`);
      // Too large to keep in the browser's storage: said, with the file offered.
      const notice = await page.evaluate(() => document.getElementById('tp-progress').textContent);
      assert(notice.includes('too large to keep in this browser') && notice.includes('Download analysis (JSON)'), `notice: ${notice}`);
      const r = await lastResult(page);
      assert(r.screen.groups === 100000 && r.screen.groups_listed === false && r.groups.length === 0, `result: ${JSON.stringify(r.screen)}`);
      await screenshot(page, 'screen-100k');
      // The form view pages through the groups, asking the page for 200 rows at a time.
      await openFormView(page);
      const caption = () => page.evaluate(() => document.querySelector('#tp-groups-table caption').textContent);
      const names = () => page.evaluate(() => [...document.querySelectorAll('#tp-groups-table tbody th button')].map((b) => b.textContent));
      assert((await caption()).includes('groups 1 to 200 of 100000'), `caption: ${await caption()}`);
      const first = await names();
      assert(first.length === 200 && first[0] === 'G0' && first[199] === 'G199', `first page: ${first.length} rows, ${first.slice(0, 2)} ... ${first.slice(-1)}`);
      await page.getByRole('button', { name: 'Next 200 groups' }).focus();
      await page.keyboard.press('Enter');
      assert((await caption()).includes('groups 201 to 400 of 100000'), `caption: ${await caption()}`);
      const second = await names();
      assert(second[0] === 'G200' && second[199] === 'G399', `second page: ${second.slice(0, 2)} ... ${second.slice(-1)}`);
      await closeFormView(page);
    });
  },

  async '100,000 groups: Escape stops the reading midway and the counts before it stay; Cancel stops the testing'() {
    await withPage({ permissions: ['clipboard-read', 'clipboard-write'] }, async (page) => {
      // Counts of 1 to 4 make every group thin (expected 2.5 a cell): an exact or simulated p each,
      // so the testing lasts long enough to be cancelled midway too.
      const rows = ['group,0,1,2,3,4,5,6,7,8,9'];
      for (let g = 0; g < 100000; g++) rows.push(`G${g},` + Array.from({ length: 10 }, (_, d) => 1 + ((g * 7 + d * 13) % 4)).join(','));
      const text = rows.join('\n') + '\n';
      const before = await resultsText(page);
      await focusCanvas(page);
      await pasteText(page, text, { focus: 'keep' });
      // While the text is read, the counts on screen are the ones before it; Escape stops the reading.
      await page.waitForFunction(() => document.getElementById('tp-progress').dataset.running === '1', null, { timeout: 20000, polling: 20 });
      assert(!(await resultsText(page)).includes('100,000 groups'), 'the reading was over before Escape');
      await page.keyboard.press('Escape');
      await page.waitForFunction(() => /^Reading stopped at/.test(globalThis.tallyproofPage.lastNotice), null, { timeout: 10000 });
      await page.waitForTimeout(300);
      assert((await resultsText(page)) === before, `after Escape: ${(await resultsText(page)).slice(0, 200)}`);
      const said = await page.evaluate(() => document.getElementById('tp-progress').textContent);
      assert(/Reading stopped at \d+%: the counts on screen are the ones before it\./.test(said), `notice: ${said}`);
      // Pasted again and left to read: the testing runs in slices with progress, and Cancel stops it.
      await pasteText(page, text, { focus: 'keep' });
      await page.waitForFunction(() => document.getElementById('tp-results').textContent.includes('testing 100,000 groups'), null, { timeout: 60000, polling: 200 });
      await page.waitForFunction(() => /Working: ([1-9]\d?)%/.test(document.getElementById('tp-progress').textContent), null, { timeout: 60000, polling: 100 });
      await clickWidget(page, 'Cancel screen');
      await page.waitForFunction(() => document.getElementById('tp-results').textContent.includes('cancelled at'), null, { timeout: 10000 });
      await screenshot(page, 'screen-100k-cancelled');
    });
  },

  async 'a table of groups refused for its groups gets the same message as the command-line tool'() {
    // The messages tests/cli/test_cli_screen_rules.py checks for `tallyproof --by reader`.
    await withPage({ permissions: ['clipboard-read', 'clipboard-write'] }, async (page) => {
      const cases = [
        ['reader\tdigit\tcount\nA\t0\t3\nA\t1\t2\n', 'Only one group ("A"): screening compares two or more groups; read its counts as one sample instead.'],
        ['reader\tdigit\tcount\nA\t0\t3\n\t1\t2\nB\t0\t1\nB\t1\t1\n', 'Line 3, column 1: the group cell is empty; every row needs the name of its group.'],
      ];
      for (const [text, message] of cases) {
        await page.evaluate(() => { globalThis.tallyproofPage.lastRefusal = ''; });
        await pasteByClipboard(page, text, () => (globalThis.tallyproofPage.lastRefusal || '') !== '');
        const refusal = await page.evaluate(() => globalThis.tallyproofPage.lastRefusal);
        assert(refusal.includes(message), `refusal: "${refusal}", expected "${message}"`);
      }
    });
  },
};
