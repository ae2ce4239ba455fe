// Storage across tabs and when the browser refuses it: two tabs of one browser make, save and
// reload analyses in turn and each keeps its own while the shared recent list keeps both; with
// setItem throwing (private windows, full quota) the page says nothing is kept and offers the download.
import { assert, clickWidget, lastResult, pasteText, pageUrl, withPage } from './harness.mjs';

async function ready(page) {
  await page.waitForFunction(() => document.getElementById('tp-results')?.dataset.state === 'result', null, { timeout: 20000 });
}
async function pasteAndWait(page, text, first) {
  await pasteText(page, text);
  await page.waitForFunction((f) => JSON.parse(globalThis.tallyproofPage.lastResult).categories?.[0] === f, first);
}
// The shared recent list as a new tab reads it: one localStorage key per entry, newest first.
function recentInPage() {
  const out = [];
  for (let i = 0; i < localStorage.length; i++) {
    const k = localStorage.key(i);
    if (k.startsWith('tallyproof.recent.')) out.push(JSON.parse(localStorage.getItem(k)));
  }
  return out.sort((a, b) => b.saved_ms - a.saved_ms);
}
const firstRecentTitle = `((${recentInPage})()[0] || {}).title || ''`;
async function recentTitles(page) {
  return (await page.evaluate(`(${recentInPage})()`)).map((e) => e.title);
}

export const tests = {
  async 'titles describe the data: an example keeps its name only while unchanged; an edit and a restore are titled from the data'() {
    await withPage({}, async (page) => {
      await clickWidget(page, 'Examples');
      await clickWidget(page, 'Fruit grading against the contract mix');
      await page.waitForFunction(`(${firstRecentTitle}).startsWith('Example: ')`, null, { timeout: 10000 });
      const demo = await lastResult(page);
      let titles = await recentTitles(page);
      assert(titles[0].includes(demo.categories[0]) && titles[0].includes('N = '), `the example's entry names its data: ${titles[0]}`);
      // Edit the first count on the canvas: the data are no longer the example's.
      await clickWidget(page, 'count 1');
      await page.keyboard.press('End');
      for (let i = 0; i < 12; i++) await page.keyboard.press('Backspace');
      const edited = demo.observed[0] + 7;
      await page.keyboard.type(String(edited), { delay: 20 });
      await page.keyboard.press('Enter');
      await page.waitForFunction((v) => JSON.parse(globalThis.tallyproofPage.lastResult).observed[0] === v, edited, { timeout: 10000 });
      await page.waitForFunction(`!(${firstRecentTitle}).startsWith('Example: ')`, null, { timeout: 10000 });
      titles = await recentTitles(page);
      const n = demo.observed.reduce((a, b) => a + b, 0) + 7;
      assert(titles[0].startsWith(demo.categories[0]) && titles[0].includes(`N = ${n.toLocaleString('en-US')}`), `the edited entry is titled from its data: ${titles[0]}`);
      await page.reload();
      await ready(page);
      titles = await recentTitles(page);
      for (const t of titles) assert(t.trim() && !t.includes('restored from') && !t.startsWith('('), `title after a restore: ${t}`);
      assert(titles[0].startsWith(demo.categories[0]), `the restored analysis keeps its data's title: ${titles}`);
    });
  },

  async 'two tabs keep their own analyses and share the recent list'() {
    await withPage({}, async (a, context) => {
      const b = await context.newPage();
      await b.goto(pageUrl);
      await ready(b);
      await pasteAndWait(a, 'North\t31\nSouth\t44\nEast\t25\nWest\t40\n', 'North');
      await pasteAndWait(b, 'Red\t12\nGreen\t19\nBlue\t9\n', 'Red');
      await pasteAndWait(a, 'North\t31\nSouth\t44\nEast\t25\nWest\t41\n', 'North');  // tab A saves again after B
      await a.reload();
      await ready(a);
      let r = await lastResult(a);
      assert(r.categories.join(',') === 'North,South,East,West' && r.observed[3] === 41, `tab A after reload: ${r.categories} ${r.observed}`);
      await b.reload();
      await ready(b);
      r = await lastResult(b);
      assert(r.categories.join(',') === 'Red,Green,Blue', `tab B after reload: ${r.categories}`);
      const titles = await recentTitles(a);
      assert(titles.some((t) => t.startsWith('North, South, East, …') && t.includes('N = 141')), `recent list has A's: ${titles}`);
      assert(titles.some((t) => t.startsWith('Red, Green, Blue') && t.includes('N = 40')), `recent list has B's: ${titles}`);
      // Each analysis has one entry: A's reload did not add its analysis again.
      assert(titles.filter((t) => t.includes('N = 141')).length === 1, `one entry for A's analysis: ${titles}`);
      assert(titles.some((t) => t.includes('N = 140')), `A's first paste is kept too: ${titles}`);
      for (const t of titles) {
        assert(!t.startsWith(' ') && !t.includes('restored from the last session') && !t.startsWith('('), `title ${t}`);
      }
      // A third tab starts from the latest analysis of any tab (B's reload saved it last).
      const c = await context.newPage();
      await c.goto(pageUrl);
      await ready(c);
      r = await lastResult(c);
      assert(r.categories[0] === 'Red', `a new tab starts from the latest: ${r.categories}`);
    });
  },

  async 'a recent list kept whole by an earlier version is moved to one key per entry and stays offered'() {
    await withPage({}, async (page) => {
      await pasteAndWait(page, 'Left\t14\nRight\t22\n', 'Left');
      await page.evaluate(() => {
        const doc = globalThis.tallyproofPage.lastDocument.replace(/14,\s*22/, '15, 21');
        for (const k of Object.keys(localStorage)) if (k.startsWith('tallyproof.recent.')) localStorage.removeItem(k);
        localStorage.setItem('tallyproof.recent', JSON.stringify([
          { title: 'Kept from before · N = 36', when: 'yesterday', document: doc, id: 'before-1', saved_ms: 5 }]));
      });
      await page.reload();
      await ready(page);
      const titles = await recentTitles(page);
      assert(titles.includes('Kept from before · N = 36'), `the earlier entry is offered: ${titles}`);
      assert(titles.filter((t) => t.startsWith('Left, Right')).length <= 1, `one entry for the same data: ${titles}`);
      const old = await page.evaluate(() => localStorage.getItem('tallyproof.recent'));
      assert(old === null, `the old single key is gone once moved: ${old}`);
    });
  },

  async 'storage refused: the notice says nothing is kept and offers the download'() {
    const initScript = () => {
      Storage.prototype.setItem = function () { throw new DOMException('refused', 'QuotaExceededError'); };
    };
    await withPage({ initScript }, async (page) => {
      await page.waitForFunction(() => (globalThis.tallyproofPage.lastNotice || '').includes('not being kept in this browser'), null, { timeout: 5000 });
      await pasteAndWait(page, 'A\t5\nB\t9\nC\t7\n', 'A');  // the analysis itself is unchanged by the refusal
      const r = await lastResult(page);
      assert(r.n === 21, `analysed as usual: N = ${r.n}`);
      const notice = await page.evaluate(() => globalThis.tallyproofPage.lastNotice);
      assert(notice.includes('not being kept in this browser') && notice.includes('Download analysis (JSON)'), notice);
    });
  },
};
