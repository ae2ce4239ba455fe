// The thin slice end to end: paste TSV counts, read the results region, look at the canvas.
import { assert, clickWidget, pasteText, resultsText, screenshot, withPage } from './harness.mjs';

export const tests = {
  async 'paste of label<TAB>count lines gives the Pearson result'() {
    await withPage({}, async (page) => {
      const initial = await screenshot(page, 'slice-01-example');
      assert(initial > 200, `the first frame looks blank (${initial} distinct colours)`);

      // Invented counts: defect types found on one inspection shift.
      await pasteText(page, 'Defect\tCount\r\nScratch\t30\r\nDent\t14\r\nCrack\t34\r\nStain\t45\r\nWarp\t57\r\nChip\t20\r\n');
      await page.waitForFunction(() => document.getElementById('tp-results').textContent.includes('Scratch'));
      const text = await resultsText(page);
      // Reference: SciPy 1.10 scipy.stats.chisquare([30,14,34,45,57,20]) gives statistic 37.78 and
      // p = 4.177325475265192e-07; R 4.2 qchisq(0.95, 5) = 11.070497693516351.
      assert(text.includes('χ² = 37.78, df = 5, p = 4.18 × 10⁻⁷'), `statistic line missing in: ${text}`);
      assert(text.includes('Critical value at α = 0.05: 11.070'), `critical value missing in: ${text}`);
      assert(text.includes('not consistent with the stated mix'), 'decision missing');
      const json = JSON.parse(await page.evaluate(() => globalThis.tallyproofPage.lastResult));
      assert(Math.abs(json.p_value - 4.177325475265192e-07) <= 1e-12 * 4.177325475265192e-07, `p ${json.p_value}`);
      assert(json.categories.length === 6 && json.observed[4] === 57, 'counts as read');
      const colours = await screenshot(page, 'slice-02-pasted');
      assert(colours > 200, `canvas after paste looks blank (${colours} distinct colours)`);
    });
  },

  async 'bad paste names the line and keeps the previous analysis'() {
    await withPage({}, async (page) => {
      const before = await resultsText(page);
      await pasteText(page, 'A\t12\nB\t-3\nC\t5\n');
      await page.waitForFunction(() => document.getElementById('tp-results').dataset.state === 'error');
      const text = await resultsText(page);
      assert(text.includes('Line 2, column 2: "-3" is negative'), `message: ${text}`);
      const json = JSON.parse(await page.evaluate(() => globalThis.tallyproofPage.lastResult));
      assert(before.includes(json.categories[0]), 'the previous analysis stays');
      await screenshot(page, 'slice-03-refused');
      for (const [paste, message] of [['', 'Nothing to read'], ['   \n\n', 'Nothing to read'], ['Only\t9\n', 'at least two'],
        ['A\t0\nB\t0\n', 'All counts are zero'], ['A\t3\nB\tmany\n', 'Line 2, column 2: "many" is not a count']]) {
        await page.evaluate(() => { document.getElementById('tp-results').textContent = ''; });
        await pasteText(page, paste);
        await page.waitForFunction((m) => document.getElementById('tp-results').textContent.includes(m), message);
      }
    });
  },

  async 'crisp at device scale factor 2'() {
    await withPage({ deviceScaleFactor: 2, viewport: { width: 900, height: 700 } }, async (page) => {
      const size = await page.evaluate(() => [document.getElementById('canvas').width, window.devicePixelRatio]);
      assert(size[1] === 2 && size[0] === 1800, `canvas backing store is ${size[0]} px for dpr ${size[1]}`);
      const colours = await screenshot(page, 'slice-04-dpr2');
      assert(colours > 200, 'blank at dpr 2');
    });
  },

  async 'a file dropped on the page is read there, never uploaded'() {
    await withPage({}, async (page) => {
      // Invented: a semicolon-separated export from a decimal-comma locale, with a header row.
      const text = 'Klasse;Anzahl;Anteil\r\nA;120;40,0 %\r\nB;95;35,0 %\r\nC;85;25,0 %\r\n';
      await page.evaluate((t) => {
        const data = new DataTransfer();
        data.items.add(new File([t], 'zaehlung.csv', { type: 'text/csv' }));
        window.dispatchEvent(new DragEvent('dragover', { dataTransfer: data, bubbles: true, cancelable: true }));
        window.dispatchEvent(new DragEvent('drop', { dataTransfer: data, bubbles: true, cancelable: true }));
      }, text);
      await page.waitForFunction(() => JSON.parse(globalThis.tallyproofPage.lastResult).categories?.[0] === 'A');
      const r = JSON.parse(await page.evaluate(() => globalThis.tallyproofPage.lastResult));
      assert(r.observed.join(',') === '120,95,85', `observed ${r.observed}`);
      // The percentage column became the stated mix: expected 120, 105, 75 (40/35/25 % of 300).
      assert(r.model.kind === 'shares', `model ${r.model.kind}`);
      assert(Math.abs(r.expected_counts[1] - 105) < 1e-9, `expected ${r.expected_counts}`);
      // Reference: SciPy 1.10 chisquare([120,95,85], [120,105,75]) -> statistic 2.2857142857, p = 0.31890.
      assert(Math.abs(r.statistic - 2.2857142857142856) < 1e-9, `statistic ${r.statistic}`);
      await screenshot(page, 'slice-05-dropped-file');
    });
  },

  async 'the detected shape is shown and can be changed'() {
    await withPage({}, async (page) => {
      // Invented: defects found on each of 30 units, one value per line (raw observations).
      const values = [0, 1, 0, 2, 1, 0, 0, 3, 1, 1, 0, 2, 0, 1, 0, 0, 1, 2, 0, 1, 0, 0, 1, 1, 0, 2, 0, 1, 0, 0];
      await pasteText(page, values.join('\n') + '\n');
      await page.waitForFunction(() => JSON.parse(globalThis.tallyproofPage.lastResult).categories?.join(',') === '0,1,2,3');
      let r = JSON.parse(await page.evaluate(() => globalThis.tallyproofPage.lastResult));
      assert(r.observed.join(',') === '15,10,4,1', `tallied ${r.observed}`);
      await clickWidget(page, 'Read as');
      await clickWidget(page, 'one column of counts');
      await page.waitForFunction(() => JSON.parse(globalThis.tallyproofPage.lastResult).categories?.length === 30, null, { timeout: 5000 })
        .catch(() => null);
      r = JSON.parse(await page.evaluate(() => globalThis.tallyproofPage.lastResult));
      const refusal = await page.evaluate(() => globalThis.tallyproofPage.lastRefusal);
      // Read as 30 counts, the zeros make some categories empty; either it analyses 30
      // categories or it refuses with a located message; it must not keep the tally silently.
      assert(r.categories.length === 30 || refusal.length > 0, `still ${r.categories.length} categories`);
      await screenshot(page, 'slice-06-read-as');
    });
  },

  async 'raw amounts can be read as first digits for the Benford test'() {
    await withPage({}, async (page) => {
      // Invented invoice amounts; first digits 1,1,2,3,1,5,9,1,2,4,7,1 (+ more of the same shape).
      const amounts = ['1.20', '14.99', '230', '3,120.50', '1875', '56.10', '912', '104.00', '27.35', '4100', '7.80', '199'];
      const text = Array.from({ length: 10 }, () => amounts).flat().join('\n') + '\n';
      await pasteText(page, text);
      // Read as counts first, the decimals are refused; the paste stays on offer under "Read as".
      await page.waitForFunction(() => globalThis.tallyproofPage.lastRefusal.includes('not a whole number'));
      await clickWidget(page, 'Read as');
      await clickWidget(page, 'first digits of raw numbers');
      await page.waitForFunction(() => JSON.parse(globalThis.tallyproofPage.lastResult).model?.kind === 'benford-first', null, { timeout: 5000 });
      const r = JSON.parse(await page.evaluate(() => globalThis.tallyproofPage.lastResult));
      // Counted by hand from the list above (x10): digit 1 five times, 2 twice, 3, 4, 5, 7, 9 once.
      assert(r.observed.join(',') === '50,20,10,10,10,0,10,0,10', `first digits ${r.observed}`);
      await screenshot(page, 'slice-07-first-digits');
    });
  },
};
