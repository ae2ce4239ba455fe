// The Groups view (issue 12): a pasted long table opens a screen of many groups; the table sorts
// through the app (canvas and form view alike), a flagged group opens as its full analysis with
// the screen kept, and the funnel chart names a group under the pointer. Reference: SciPy 1.10,
// scipy.stats.chisquare on the flagged group's own counts, computed in the test data's comment.
import { assert, openFormView, closeFormView, clickWidget, lastResult, pasteText, resultsText, screenshot, withPage } from './harness.mjs';

// Twelve invented meter readers, last digits 0-9. "Dev" prefers 0 and 5 strongly; the rest are
// close to uniform. SciPy: chisquare([38,12,10,8,11,38,9,12,10,8]) -> statistic 81.56410256410255 for Dev.
export function longTable() {
  const rows = ['reader,digit,count'];
  const names = ['Anna', 'Ben', 'Cara', 'Dev', 'Eli', 'Fay', 'Gus', 'Hal', 'Ivy', 'Jon', 'Kim', 'Lou'];
  names.forEach((n, gi) => {
    for (let d = 0; d < 10; d++) {
      let c = 8 + ((gi * 7 + d * 3) % 5);
      if (n === 'Dev') c = [38, 12, 10, 8, 11, 38, 9, 12, 10, 8][d];
      rows.push(`${n},${d},${c}`);
    }
  });
  return rows.join('\n') + '\n';
}

async function order(page) { return page.evaluate(() => globalThis.tallyproofPage.groupOrder); }

export const tests = {
  async 'a pasted long table opens the Groups view; sorting, opening a flagged group and back, on the canvas'() {
    await withPage({}, async (page) => {
      await pasteText(page, longTable());
      await page.waitForFunction(() => document.getElementById('tp-results').textContent.includes('of 12 groups depart'), null, { timeout: 15000 });
      const screen = await lastResult(page);
      assert(screen.screen.groups === 12 && screen.screen.flagged === 1, `screen: ${JSON.stringify(screen.screen)}`);
      const dev = screen.groups.findIndex((g) => g.name === 'Dev');
      assert(Math.abs(screen.groups[dev].statistic - 81.56410256410255) < 1e-9 && screen.groups[dev].flagged, `Dev: ${JSON.stringify(screen.groups[dev])}`);  // SciPy chisquare
      assert((await resultsText(page)).includes('1 of 12 groups departs'), await resultsText(page));
      await screenshot(page, 'groups-view');
      // Sorted by q ascending at first: the flagged group leads.
      assert((await order(page))[0] === dev, `first row ${(await order(page))[0]}`);
      await clickWidget(page, 'group head N');  // sort by N: Dev (N = 156) is the largest, last ascending
      await page.waitForFunction((d) => { const o = globalThis.tallyproofPage.groupOrder; return o && o[o.length - 1] === d; }, dev, { timeout: 5000 });
      await clickWidget(page, 'group head N');  // descending: first
      await page.waitForFunction((d) => globalThis.tallyproofPage.groupOrder[0] === d, dev, { timeout: 5000 });
      await clickWidget(page, 'group row 1');
      await page.waitForFunction(() => document.getElementById('tp-group-banner').textContent.includes('Group Dev'), null, { timeout: 5000 });
      const single = await lastResult(page);
      assert(Math.abs(single.statistic - 81.56410256410255) < 1e-9 && single.n === 156, `opened Dev: ${single.statistic}, N ${single.n}`);
      assert((await page.evaluate(() => document.getElementById('tp-group-banner').textContent)).includes('flagged'), 'banner says flagged');
      await screenshot(page, 'groups-opened-group');
      await clickWidget(page, 'Back to all groups');
      await page.waitForFunction(() => document.getElementById('tp-results').textContent.includes('of 12 groups'), null, { timeout: 5000 });
      // The funnel chart: hovering Dev's point names it.
      await clickWidget(page, 'Funnel chart');
      await page.waitForFunction(() => !!globalThis.tallyproofPage.widgets['funnel chart'], null, { timeout: 5000 });
      await screenshot(page, 'groups-funnel-chart');
      await page.waitForFunction(() => !!globalThis.tallyproofPage.widgets['funnel point Dev'], null, { timeout: 5000 });
      const pt = await page.evaluate(() => globalThis.tallyproofPage.widgets['funnel point Dev']);
      await page.mouse.move(pt.x + pt.w / 2 + 3, pt.y + pt.h / 2 + 2);  // near the point, as a finger lands
      await page.waitForFunction(() => (globalThis.tallyproofPage.tooltip || '').startsWith('Dev\n'), null, { timeout: 3000 });
      const named = await page.evaluate(() => globalThis.tallyproofPage.tooltip);
      assert(named.includes('flagged') && named.includes('N = 156'), `the funnel names Dev under the pointer: ${named}`);
      await screenshot(page, 'groups-funnel-tooltip');
      await page.mouse.down();
      await page.mouse.up();
      await page.waitForFunction(() => document.getElementById('tp-group-banner').textContent.includes('Group Dev'), null, { timeout: 5000 });
      await clickWidget(page, 'Back to all groups');
      await page.waitForFunction(() => document.getElementById('tp-results').textContent.includes('of 12 groups'), null, { timeout: 5000 });
      await clickWidget(page, 'Read as one sample');
      await page.waitForFunction(() => !document.getElementById('tp-results').textContent.includes('groups depart'), null, { timeout: 5000 });
      const pooled = await lastResult(page);
      const total = longTable().trim().split('\n').slice(1).reduce((t, l) => t + Number(l.split(',')[2]), 0);
      assert(pooled.n === total && !pooled.screen, `one sample of all counts: N ${pooled.n}, the table totals ${total}`);
    });
  },

  async 'phones: the Groups view, its table and its chart stay inside the screen'() {
    for (const [width, height] of [[360, 640], [390, 844]]) {
      await withPage({ viewport: { width, height }, hasTouch: true, isMobile: true, deviceScaleFactor: 2 }, async (page) => {
        await pasteText(page, longTable());
        await page.waitForFunction(() => document.getElementById('tp-results').textContent.includes('of 12 groups depart'), null, { timeout: 15000 });
        await page.waitForFunction(() => !!globalThis.tallyproofPage.widgets['Read as one sample'], null, { timeout: 5000 });
        await screenshot(page, `groups-phone-${width}`);
        // The groups table scrolls sideways on a phone (its cells beyond the edge are clipped, by
        // design, as in "Where it differs"); every other control must lie inside the screen.
        const past = (w) => Object.entries(w).filter(([n, r]) => !/^group (head|row) /.test(n) && (r.x < -0.5 || r.x + r.w > width + 0.5)).map(([n]) => n);
        const widgets = await page.evaluate(() => globalThis.tallyproofPage.widgets);
        for (const n of ['Read as one sample', 'screen q', 'group shape', 'Copy summary', 'Download groups table', 'Groups table', 'Funnel chart'])
          assert(widgets[n], `${width}x${height}: ${n} not shown`);
        assert(past(widgets).length === 0, `${width}x${height}: past the edge: ${past(widgets).join('; ')}`);
        assert(widgets['Read as one sample'].h >= 43.5, `${width}: a 44 px target on touch (${widgets['Read as one sample'].h})`);
        await page.mouse.move(width / 2, height * 0.7);  // the results scroll under a finger (here the wheel) to the tabs
        for (let i = 0; i < 16; i++) {
          const tab = await page.evaluate(() => globalThis.tallyproofPage.widgets['Funnel chart']);
          if (tab.y > 60 && tab.y < height - 120) break;
          await page.mouse.wheel(0, 240);
          await page.waitForTimeout(150);
        }
        await clickWidget(page, 'Funnel chart');
        await page.waitForFunction(() => !!globalThis.tallyproofPage.widgets['funnel chart'], null, { timeout: 5000 });
        await screenshot(page, `groups-phone-${width}-funnel`);
        const after = await page.evaluate(() => globalThis.tallyproofPage.widgets);
        assert(past(after).length === 0, `${width}x${height} funnel: past the edge: ${past(after).join('; ')}`);
        assert(after['funnel chart'].w >= width * 0.6, `the chart takes the width: ${after['funnel chart'].w}`);
      });
    }
  },

  async 'the form view shows the same screen: sort with a column button, open a group by name, back'() {
    await withPage({}, async (page) => {
      await pasteText(page, longTable());
      await page.waitForFunction(() => document.getElementById('tp-results').textContent.includes('of 12 groups depart'), null, { timeout: 15000 });
      await openFormView(page);
      const rows = page.getByRole('table', { name: /One test per group/ }).getByRole('row');
      assert(await rows.count() === 13, `a head row and 12 groups: ${await rows.count()}`);
      await page.getByRole('button', { name: /^Sort by Group/ }).click();
      await page.waitForFunction(() => document.querySelector('#tp-groups-table tbody th button')?.textContent === 'Anna', null, { timeout: 5000 });
      await page.getByRole('button', { name: /^Sort by Group/ }).click();  // again: descending
      await page.waitForFunction(() => document.querySelector('#tp-groups-table tbody th button')?.textContent === 'Lou', null, { timeout: 5000 });
      await page.getByRole('button', { name: 'Open group Dev (flagged)' }).click();
      await page.waitForFunction(() => !document.getElementById('tp-group-place').hidden, null, { timeout: 5000 });
      assert(await page.getByRole('table', { name: /One test per group/ }).isHidden(), 'the groups table gives way to the group');
      assert((await resultsText(page)).includes('χ² = 81.56'), await resultsText(page));  // SciPy chisquare: 81.564
      await screenshot(page, 'groups-form-opened');
      await page.getByRole('button', { name: 'Back to all groups' }).click();
      await page.waitForFunction(() => !document.getElementById('tp-groups').hidden, null, { timeout: 5000 });
      assert(await page.getByRole('button', { name: 'Open group Dev (flagged)' }).isVisible(), 'back at the screen');
    });
  },
};
