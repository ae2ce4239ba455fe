// Verdict details on the page (issue 27): whole-number "shares" such as 5:3:1:1 are refused
// with Ratio offered, and one tap reads them as a ratio; labels 0..6 tick "Categories are in
// order" and the verdict suggests a count model. Reference: SciPy 1.10,
// scipy.stats.chisquare([48, 31, 12, 9], [50, 30, 10, 10]) -> statistic 0.6133333333333334.
import { assert, chooseFile, clickWidget, lastResult, pasteText, resultsText, screenshot, withPage } from './harness.mjs';

export const tests = {
  async 'a 4-row file opened after the fruit example is tested against equal shares, and the notice says the mix was reset'() {
    await withPage({}, async (page) => {
      await clickWidget(page, 'Examples');
      await clickWidget(page, 'Fruit grading against the contract mix');
      await page.waitForFunction(() => JSON.parse(globalThis.tallyproofPage.lastResult).categories?.[0] === 'Extra', null, { timeout: 10000 });
      await page.evaluate(() => { globalThis.tallyproofPage.lastNotice = ''; });
      await chooseFile(page, 'defects.csv', 'Defect,Count\nScratch,31\nDent,12\nCrack,40\nOther,17\n');
      await page.waitForFunction(() => JSON.parse(globalThis.tallyproofPage.lastResult).categories?.[0] === 'Scratch', null, { timeout: 10000 });
      const doc = JSON.parse(await page.evaluate(() => globalThis.tallyproofPage.lastDocument));
      assert(doc.model.kind === 'equal', `the mix is equal shares, not the fruit contract's: ${JSON.stringify(doc.model)}`);
      // SciPy 1.10: scipy.stats.chisquare([31, 12, 40, 17]) -> statistic 19.76, p = 0.000190
      const r = await lastResult(page);
      assert(Math.abs(r.statistic - 19.76) < 1e-9, `statistic ${r.statistic}`);
      const notice = await page.evaluate(() => globalThis.tallyproofPage.lastNotice || '');
      assert(notice.includes('was for other categories'), `the notice says the mix was reset: ${notice}`);
    });
  },

  async '5:3:1:1 typed as stated shares is refused with Ratio offered, and one tap reads it as a ratio'() {
    await withPage({}, async (page) => {
      await pasteText(page, 'A\t48\nB\t31\nC\t12\nD\t9\n');
      await page.waitForFunction(() => JSON.parse(globalThis.tallyproofPage.lastResult).categories?.[3] === 'D', null, { timeout: 10000 });
      await clickWidget(page, 'Expected mix');
      await clickWidget(page, 'Stated shares (fractions or %)');
      await page.waitForFunction(() => JSON.parse(globalThis.tallyproofPage.lastDocument).model.kind === 'shares', null, { timeout: 5000 });
      await clickWidget(page, 'expected values');
      await page.keyboard.press('Control+A');
      await page.keyboard.type('5:3:1:1', { delay: 20 });
      await page.keyboard.press('Enter');
      const status = page.getByRole('status');
      await page.waitForFunction(() => document.getElementById('tp-results').textContent.includes('choose Ratio'), null, { timeout: 5000 })
        .catch(async () => { throw new Error(`no refusal: status ${await status.textContent()}`); });
      const refusal = await status.textContent();
      assert(refusal.includes('choose Ratio') && refusal.includes('5:3:1:1'), `refusal offers Ratio: ${refusal}`);
      await clickWidget(page, 'Read them as a ratio');
      await page.waitForFunction(() => JSON.parse(globalThis.tallyproofPage.lastDocument).model.kind === 'ratio', null, { timeout: 5000 });
      const r = await lastResult(page);
      assert(Math.abs(r.statistic - 0.6133333333333334) < 1e-12, `statistic against 5:3:1:1: ${r.statistic}`);  // SciPy chisquare
      await screenshot(page, 'verdicts-ratio-offered');
    });
  },

  async 'counts per plot 0..6: in order, and the verdict suggests a count model'() {
    await withPage({}, async (page) => {
      await pasteText(page, '0\t12\n1\t30\n2\t25\n3\t15\n4\t8\n5\t3\n6\t1\n');
      await page.waitForFunction(() => JSON.parse(globalThis.tallyproofPage.lastResult).categories?.[6] === '6', null, { timeout: 10000 });
      const r = await lastResult(page);
      assert(r.ordered === true, 'Categories are in order');
      assert(JSON.parse(await page.evaluate(() => globalThis.tallyproofPage.lastDocument)).ordered === true, 'the document says ordered');
      assert((r.model_suggestion || '').includes('Poisson'), `suggestion: ${r.model_suggestion}`);
      assert((await resultsText(page)).includes('Suggestion: The categories are whole numbers in order (0 to 6)'), await resultsText(page));
      await screenshot(page, 'verdicts-count-model-suggested');
    });
  },
};
