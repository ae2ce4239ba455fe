// The calculator screen driven as a user would: example scenarios from the menu, result tabs,
// remedies for thin cells (merge, undo, exact, Monte Carlo with progress and cancel), theme,
// narrow viewport, keyboard. Each step saves a screenshot that must not be blank.
import { assert, clickWidget, lastResult, pasteText, resultsText, screenshot, withPage } from './harness.mjs';

async function notBlank(page, name) {
  const colours = await screenshot(page, name);
  assert(colours > 150, `${name}: the screen looks blank (${colours} colours)`);
}

export const tests = {
  async 'every example scenario loads from the menu'() {
    await withPage({}, async (page) => {
      const titles = ['Fruit grading against the contract mix', 'Meter readings: last-digit preference',
        'Invoice amounts against the first-digit law', 'Defects per unit against a fitted Poisson',
        'Seedling types against 9:3:3:1', 'Survey sample against census shares'];
      for (let i = 0; i < titles.length; i++) {
        await clickWidget(page, 'Examples');
        await clickWidget(page, titles[i]);
        await page.waitForFunction((t) => document.getElementById('tp-results').textContent.length > 0 &&
          JSON.parse(globalThis.tallyproofPage.lastResult).categories !== undefined, titles[i]);
        const r = await lastResult(page);
        assert(r.p_value > 0 && r.p_value <= 1, `${titles[i]}: p ${r.p_value}`);
        await notBlank(page, `screen-demo-${i + 1}`);
      }
      const r = await lastResult(page);
      assert(r.categories[3] === '65 and over', 'the last example is on screen');
    });
  },

  async 'result tabs: bars, where it differs, planning, write-up'() {
    await withPage({}, async (page) => {
      await clickWidget(page, 'Examples');
      await clickWidget(page, 'Meter readings: last-digit preference');
      for (const tab of ['Bars', 'Where it differs', 'Planning', 'Write-up']) {
        await clickWidget(page, tab);
        await notBlank(page, `screen-tab-${tab.replace(/ /g, '-').toLowerCase()}`);
      }
      const r = await lastResult(page);
      // The invented readings favour 0 and 5: both must be flagged, as "more than expected".
      assert(r.drivers.includes(0) && r.drivers.includes(5), `drivers ${r.drivers}`);
      assert(r.directions[0] === 'more than expected', r.directions[0]);
      // The DOM mirrors the per-category table as a real table element.
      const rows = await page.evaluate(() => document.querySelectorAll('#tp-table tbody tr').length);
      assert(rows === 10, `DOM table has ${rows} rows`);
    });
  },

  async 'thin cells: merge, undo, exact and Monte Carlo with progress and cancel'() {
    await withPage({}, async (page) => {
      // Invented: defects per unit on a short run against a fitted Poisson, with thin upper
      // cells; pasted as an analysis document.
      await pasteText(page, JSON.stringify({ categories: ['0', '1', '2', '3', '4', '5 or more'], observed: [21, 15, 6, 2, 1, 1],
        model: { kind: 'poisson' } }));
      await page.waitForFunction(() => document.getElementById('tp-results').textContent.includes('N = 46'));
      let r = await lastResult(page);
      assert(!r.validity.all_at_least_5, 'thin cells expected');
      await notBlank(page, 'screen-thin-01');
      await clickWidget(page, 'Merge thin categories');
      await page.waitForFunction(() => JSON.parse(globalThis.tallyproofPage.lastResult).merged === true);
      r = await lastResult(page);
      const merged = r.merge_map.flat().sort((a, b) => a - b);
      assert(merged.join(',') === '0,1,2,3,4,5', `merge map covers every category once: ${JSON.stringify(r.merge_map)}`);
      assert(r.tested_observed.reduce((a, b) => a + b, 0) === 46, 'merged totals equal the original total');
      await notBlank(page, 'screen-thin-02-merged');
      await clickWidget(page, 'Undo merge');
      await page.waitForFunction(() => JSON.parse(globalThis.tallyproofPage.lastResult).merged === false);
      await clickWidget(page, 'Use the exact p-value');
      await page.waitForFunction(() => JSON.parse(globalThis.tallyproofPage.lastResult).method === 'exact', null, { timeout: 20000 });
      r = await lastResult(page);
      assert(r.exact && r.exact.p_value > 0 && r.exact.p_value <= 1, `exact ${JSON.stringify(r.exact)}`);
      await notBlank(page, 'screen-thin-03-exact');
      // A long Monte Carlo run shows progress and can be cancelled (Escape).
      await pasteText(page, JSON.stringify({
        categories: ['0', '1', '2', '3', '4', '5'], observed: [21, 15, 6, 2, 1, 1],
        pvalue: { method: 'monte-carlo', replicates: 16000000, seed: 7 } }));  // within the 1e8-draw budget
      await page.waitForFunction(() => document.getElementById('tp-progress').dataset.running === '1', null, { timeout: 10000 });
      await page.waitForTimeout(300);
      await notBlank(page, 'screen-thin-04-progress');
      // The page stays responsive while the work runs: a frame comes back promptly.
      const t0 = Date.now();
      await page.evaluate(() => new Promise((r) => requestAnimationFrame(r)));
      assert(Date.now() - t0 < 500, 'a frame took more than 0.5 s while working');
      await page.keyboard.press('Escape');
      await page.waitForFunction(() => document.getElementById('tp-progress').dataset.running === '0', null, { timeout: 5000 });
      r = await lastResult(page);
      assert(r.monte_carlo && r.monte_carlo.refusal && r.monte_carlo.refusal.includes('cancelled'), JSON.stringify(r.monte_carlo));
      assert(r.method === 'asymptotic', 'after cancelling, the asymptotic p-value is the one shown');
    });
  },

  async 'Monte Carlo p-value is reproducible from its seed'() {
    await withPage({}, async (page) => {
      const doc = { categories: ['A', 'B', 'C', 'D'], observed: [12, 5, 9, 2], pvalue: { method: 'monte-carlo', replicates: 20000, seed: 42 } };
      await pasteText(page, JSON.stringify(doc));
      await page.waitForFunction(() => { const r = JSON.parse(globalThis.tallyproofPage.lastResult); return r.monte_carlo && r.monte_carlo.p_value; }, null, { timeout: 20000 });
      const r = await lastResult(page);
      assert(r.monte_carlo.replicates === 20000 && r.monte_carlo.seed === 42, JSON.stringify(r.monte_carlo));
      // The native tool must give the same hits for the same seed (checked by the CLI tests
      // through the same document); here: p = (b + 1) / (B + 1) exactly.
      assert(Math.abs(r.monte_carlo.p_value - (r.monte_carlo.hits + 1) / 20001) < 1e-15, 'p = (b+1)/(B+1)');
      await page.evaluate(() => { globalThis.__mc = JSON.parse(globalThis.tallyproofPage.lastResult).monte_carlo.hits; });
      const { execFileSync } = await import('node:child_process');
      const native = JSON.parse(execFileSync(new URL('../../build/native/shell/tallyproof', import.meta.url).pathname, ['--json', '-'],
        { input: JSON.stringify(doc) }).toString());
      assert(native.monte_carlo.hits === r.monte_carlo.hits, `browser b = ${r.monte_carlo.hits}, native b = ${native.monte_carlo.hits}`);
      // A total above 1024 takes the sampler's table-free (BTRD) path: the same hits here too.
      const big = { categories: ['A', 'B', 'C', 'D'], observed: [2100, 1900, 2050, 1950], pvalue: { method: 'monte-carlo', replicates: 5000, seed: 9 } };
      await pasteText(page, JSON.stringify(big));
      await page.waitForFunction(() => { const x = JSON.parse(globalThis.tallyproofPage.lastResult); return x.monte_carlo && x.monte_carlo.p_value && x.monte_carlo.seed === 9; }, null, { timeout: 20000 });
      const rb = await lastResult(page);
      const nb = JSON.parse(execFileSync(new URL('../../build/native/shell/tallyproof', import.meta.url).pathname, ['--json', '-'],
        { input: JSON.stringify(big) }).toString());
      assert(nb.monte_carlo.hits === rb.monte_carlo.hits, `N = 8000: browser b = ${rb.monte_carlo.hits}, native b = ${nb.monte_carlo.hits}`);
      // N = 5e6 (N k = 3e7, above the exact tests' limit): BTRD with its logarithms (portable_log) and,
      // for the share of 2e-6, the waiting-time method: the same hits natively and in the browser.
      const huge = { categories: ['A', 'B', 'C', 'D', 'E', 'F'], observed: [1500800, 12, 999500, 1250100, 749600, 499988],
        model: { kind: 'shares', values: [0.3, 0.000002, 0.2, 0.25, 0.15, 0.099998] },
        pvalue: { method: 'monte-carlo', replicates: 4000, seed: 11 } };
      await pasteText(page, JSON.stringify(huge));
      await page.waitForFunction(() => { const x = JSON.parse(globalThis.tallyproofPage.lastResult); return x.monte_carlo && x.monte_carlo.p_value && x.monte_carlo.seed === 11; }, null, { timeout: 30000 });
      const rh = await lastResult(page);
      const nh = JSON.parse(execFileSync(new URL('../../build/native/shell/tallyproof', import.meta.url).pathname, ['--json', '-'],
        { input: JSON.stringify(huge) }).toString());
      assert(nh.monte_carlo.hits === rh.monte_carlo.hits && nh.monte_carlo.replicates === 4000,
        `N = 5e6: browser b = ${rh.monte_carlo.hits}, native b = ${nh.monte_carlo.hits}`);
    });
  },

  async 'dark theme, narrow viewport and keyboard use'() {
    await withPage({ viewport: { width: 1100, height: 760 } }, async (page) => {
      await clickWidget(page, 'Theme');
      await notBlank(page, 'screen-dark');
    });
    await withPage({ viewport: { width: 420, height: 860 }, deviceScaleFactor: 2 }, async (page) => {
      await notBlank(page, 'screen-narrow');
    });
    await withPage({}, async (page) => {
      await page.focus('#canvas');
      // Keyboard only: the copy shortcut, then arrow-key navigation with Space to activate.
      await page.keyboard.press('Control+Shift+C');
      await page.waitForFunction(() => globalThis.tallyproofPage.lastCopy !== null, null, { timeout: 5000 });
      const copied = await page.evaluate(() => globalThis.tallyproofPage.lastCopy.text);
      assert(copied.includes('χ² = 5.78'), `Ctrl+Shift+C copied: ${copied.slice(0, 80)}`);
      const before = await page.evaluate(() => globalThis.tallyproofPage.lastDocument);
      for (let i = 0; i < 3; i++) { await page.keyboard.press('ArrowDown'); await page.waitForTimeout(60); }
      await notBlank(page, 'screen-keyboard');
      // Walk down the controls with the arrow key to the last one (the design effect field), one up
      // to the merge rule, open it with Space, move to the next rule and choose it with Space.
      for (let i = 0; i < 40; i++) { await page.keyboard.press('ArrowDown'); await page.waitForTimeout(25); }
      await page.keyboard.press('ArrowUp');
      await page.waitForTimeout(60);
      await page.keyboard.press('Space');
      await page.waitForTimeout(100);
      await page.keyboard.press('ArrowDown');
      await page.waitForTimeout(100);
      await page.keyboard.press('Space');
      await page.waitForTimeout(200);
      const after = JSON.parse(await page.evaluate(() => globalThis.tallyproofPage.lastDocument));
      const switched = after.merge.rule !== JSON.parse(before).merge.rule;
      await notBlank(page, 'screen-keyboard-changed');
      assert(switched, `keyboard navigation did not change the merge rule (${after.merge.rule})`);
    });
  },

  async 'works without DecompressionStream (older browsers)'() {
    await withPage({ initScript: 'delete window.DecompressionStream;' }, async (page) => {
      const text = await resultsText(page);
      assert(text.includes('χ² ='), 'the page started with the fallback inflater');
    });
  },
};
