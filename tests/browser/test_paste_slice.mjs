// The thin slice end to end: paste TSV counts, read the results region, look at the canvas.
import { assert, chooseFile, clickWidget, lastResult, pasteText, resultsText, screenshot, withPage } from './harness.mjs';

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

  async 'a refused paste is shown with its cell marked and can be fixed on the page'() {
    await withPage({}, async (page) => {
      // Invented counts with one mistyped cell (a letter O for a zero).
      await pasteText(page, 'Grade\tCount\nA\t31\nB\t4O\nC\t22\n');
      await page.waitForFunction(() => document.getElementById('tp-results').dataset.state === 'error');
      const refusal = await page.evaluate(() => globalThis.tallyproofPage.lastRefusal);
      assert(refusal.includes('Line 3, column 2: "4O"'), `message: ${refusal}`);
      // The offending cell is drawn boxed: it is the second cell of the quoted line.
      await page.waitForFunction(() => !!globalThis.tallyproofPage.widgets['refused cell'], null, { timeout: 5000 });
      await screenshot(page, 'slice-05-refused-cell');
      await clickWidget(page, 'fix it here');
      await clickWidget(page, 'refused paste editor');
      await page.keyboard.press('Control+a');
      // Retyped with commas (the Tab key does not reach the editor in this headless setup).
      await page.keyboard.type('Grade,Count\nA,31\nB,40\nC,22', { delay: 15 });
      await page.waitForTimeout(200);
      await screenshot(page, 'slice-06-fixing');
      await clickWidget(page, 'read edited paste');
      await page.waitForFunction(() => document.getElementById('tp-results').dataset.state === 'result', null, { timeout: 5000 });
      const r = JSON.parse(await page.evaluate(() => globalThis.tallyproofPage.lastResult));
      assert(r.categories.join(',') === 'A,B,C' && r.observed.join(',') === '31,40,22', `read back ${r.categories} ${r.observed}`);
      assert(!(await page.evaluate(() => globalThis.tallyproofPage.widgets['refused paste editor'] &&
        document.getElementById('tp-results').dataset.state !== 'result')), 'editor state');
      await screenshot(page, 'slice-06-fixed');
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
      await chooseFile(page, 'zaehlung.csv', text, 'text/csv');  // the picker; a drop takes the same openLocalFile
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
      await clickWidget(page, 'Read as');
      await clickWidget(page, 'first two digits of raw numbers');
      await page.waitForFunction(() => JSON.parse(globalThis.tallyproofPage.lastResult).model?.kind === 'benford-first-two', null, { timeout: 5000 });
      const two = await lastResult(page);
      // Counted by hand (x10): 14, 23, 31, 18, 56, 91, 10, 27, 41, 19; categories 10 to 99. The amounts
      // under 10 (1.20, 7.80) are left out, as the first-two-digits test does (Nigrini 2012).
      const byHand = new Array(90).fill(0);
      for (const d of [14, 23, 31, 18, 56, 91, 10, 27, 41, 19]) byHand[d - 10] += 10;
      assert(two.categories.length === 90 && two.categories[0] === '10', `first-two categories ${two.categories.slice(0, 3)}`);
      assert(two.observed.join(',') === byHand.join(','), `first two digits ${two.observed}`);
    });
  },

  async 'pasted measurements can be put into equal-width, equal-probability and stated bins'() {
    // Invented fill weights in grams: 200 values from a fixed formula (a Park-Miller generator,
    // four uniforms summed), written to 0.1 g, one per line.
    let seed = 20240611;
    const uniform = () => { seed = (seed * 16807) % 2147483647; return seed / 2147483647; };
    const weights = Array.from({ length: 200 }, () =>
      Number((500 + 5 * (uniform() + uniform() + uniform() + uniform() - 2)).toFixed(1)));
    const text = 'weight_g\n' + weights.map((w) => w.toFixed(1)).join('\n') + '\n';
    // Counts by hand: a value on an inner edge goes to the bin above, the largest to the last bin.
    const countInto = (edges) => {
      const counts = new Array(edges.length - 1).fill(0);
      for (const w of weights) {
        let b = edges.filter((e) => e <= w).length - 1;
        if (w === edges[edges.length - 1]) b = counts.length - 1;
        counts[b]++;
      }
      return counts;
    };
    const labelEdges = (labels) => labels.map((l) => {
      const m = /^\[(\S+), (\S+)[)\]]$/.exec(l);
      assert(m, `bin label ${l}`);
      return [Number(m[1].replace('inf', 'Infinity')), Number(m[2].replace('inf', 'Infinity'))];
    });
    const near = (a, b, rel) => a === b || Math.abs(a - b) <= rel * Math.max(Math.abs(a), Math.abs(b));
    const documentEdges = async (page) => JSON.parse(await page.evaluate(() => globalThis.tallyproofPage.lastDocument)).model.edges
      .map((e) => (typeof e === 'number' ? e : e === '-inf' || e === '-Infinity' ? -Infinity : Infinity));
    const typeInto = async (page, widget, value) => {
      await clickWidget(page, widget);
      await page.keyboard.press('End');
      await page.keyboard.press('Shift+Home');
      await page.keyboard.type(value, { delay: 20 });
    };

    await withPage({}, async (page) => {
      await pasteText(page, text);
      await clickWidget(page, 'Read as');
      await clickWidget(page, 'measurements in equal-width bins');
      await page.waitForFunction(() => JSON.parse(globalThis.tallyproofPage.lastResult).categories?.[0]?.startsWith('['), null, { timeout: 5000 });
      let r = await lastResult(page);
      // Equal width, K = 10 (the page's default), by hand: from the smallest to the largest value.
      const lo = Math.min(...weights), hi = Math.max(...weights);
      const widthEdges = Array.from({ length: 11 }, (_, i) => (i === 10 ? hi : lo + (hi - lo) * i / 10));
      assert(r.categories.length === 10, `equal-width bins: ${r.categories.length}`);
      assert(r.observed.join(',') === countInto(widthEdges).join(','), `equal-width counts ${r.observed} vs ${countInto(widthEdges)}`);
      labelEdges(r.categories).forEach(([a, b], i) => assert(near(a, widthEdges[i], 5e-6) && near(b, widthEdges[i + 1], 5e-6),
        `bin ${i + 1} label ${r.categories[i]} vs ${widthEdges[i]}, ${widthEdges[i + 1]}`));
      (await documentEdges(page)).forEach((e, i) => assert(near(e, widthEdges[i], 1e-12), `edge ${i}: ${e} vs ${widthEdges[i]}`));
      await screenshot(page, 'slice-08-equal-width-bins');

      // Equal probability under the normal fitted by maximum likelihood (mean, sd with divisor n), K = 8.
      await clickWidget(page, 'Read as');
      await screenshot(page, 'slice-09-read-as-list');
      await clickWidget(page, 'measurements in equal-probability bins (normal)');
      await page.waitForFunction(() => JSON.parse(globalThis.tallyproofPage.lastResult).model?.kind === 'normal', null, { timeout: 5000 });
      await typeInto(page, 'number of bins', '8');
      await page.keyboard.press('Enter');
      await page.waitForFunction(() => JSON.parse(globalThis.tallyproofPage.lastResult).categories?.length === 8, null, { timeout: 5000 });
      r = await lastResult(page);
      const mean = weights.reduce((a, b) => a + b, 0) / weights.length;
      const sd = Math.sqrt(weights.reduce((a, w) => a + (w - mean) ** 2, 0) / weights.length);
      // Reference: SciPy 1.10 scipy.stats.norm.ppf([i/8 for i in 1..7]).
      const z = [-1.1503493803760079, -0.6744897501960817, -0.31863936396437514, 0.0,
        0.31863936396437514, 0.6744897501960817, 1.1503493803760079];
      const normalEdges = [-Infinity, ...z.map((q) => mean + sd * q), Infinity];
      for (const w of weights) for (const e of normalEdges) assert(!(Math.abs(w - e) < 1e-6), `value ${w} on edge ${e}`);
      assert(r.observed.join(',') === countInto(normalEdges).join(','), `normal bins counts ${r.observed} vs ${countInto(normalEdges)}`);
      labelEdges(r.categories).forEach(([a, b], i) => assert(near(a, normalEdges[i], 5e-6) && near(b, normalEdges[i + 1], 5e-6),
        `bin ${i + 1} label ${r.categories[i]} vs ${normalEdges[i]}, ${normalEdges[i + 1]}`));
      (await documentEdges(page)).forEach((e, i) => assert(near(e, normalEdges[i], 1e-9), `edge ${i}: ${e} vs ${normalEdges[i]}`));
      assert(r.df === 8 - 1 - 2, `df ${r.df}`);
      await page.mouse.move(640, 790);  // no tooltip over the bins row
      await screenshot(page, 'slice-10-equal-probability-normal');

      // A number of bins out of range is refused with a message; the analysis stays.
      await typeInto(page, 'number of bins', '1');
      await clickWidget(page, 'apply bins');
      await page.waitForFunction(() => globalThis.tallyproofPage.lastRefusal.includes('from 2 to 1000'), null, { timeout: 5000 });
      assert((await lastResult(page)).observed.join(',') === r.observed.join(','), 'the normal bins stay after a refused K');
      await page.mouse.move(640, 790);
      await screenshot(page, 'slice-11-bin-count-refused');

      // Stated edges: out of order is refused with the parser's message, then a valid set is counted.
      await clickWidget(page, 'Read as');
      await clickWidget(page, 'measurements in bins with stated edges');
      await typeInto(page, 'bin edges', '480, 500, 490, inf');
      await page.keyboard.press('Enter');
      await page.waitForFunction(() => globalThis.tallyproofPage.lastRefusal.includes('must increase strictly'), null, { timeout: 5000 });
      await page.mouse.move(640, 790);
      await screenshot(page, 'slice-12-stated-edges-refused');
      const stated = [-Infinity, 496, 498, 500, 502, 504, Infinity];
      await typeInto(page, 'bin edges', '-inf, 496, 498, 500, 502, 504, inf');
      await clickWidget(page, 'apply bins');
      await page.waitForFunction(() => JSON.parse(globalThis.tallyproofPage.lastResult).categories?.length === 6, null, { timeout: 5000 });
      r = await lastResult(page);
      assert(r.observed.join(',') === countInto(stated).join(','), `stated-edge counts ${r.observed} vs ${countInto(stated)}`);
      assert(r.categories[1] === '[496, 498)', `label ${r.categories[1]}`);
      await screenshot(page, 'slice-13-stated-edges');
    });

    // Narrow screen: the inputs come under the results; scroll down to the bins row.
    await withPage({ viewport: { width: 520, height: 800 } }, async (page) => {
      await pasteText(page, text);
      await page.mouse.move(260, 400);
      for (let i = 0; i < 12; i++) {
        const box = await page.evaluate(() => globalThis.tallyproofPage.widgets['Read as']);
        if (box && box.y > 200 && box.y < 450) break;
        await page.mouse.wheel(0, box && box.y < 200 ? -120 : 240);
        await page.waitForTimeout(150);
      }
      await clickWidget(page, 'Read as');
      await clickWidget(page, 'measurements in equal-probability bins (normal)');
      await page.waitForFunction(() => JSON.parse(globalThis.tallyproofPage.lastResult).model?.kind === 'normal', null, { timeout: 5000 });
      await screenshot(page, 'slice-14-bins-narrow');
    });
    // The narrowest two-column layout: the inputs column at its least width.
    await withPage({ viewport: { width: 940, height: 760 } }, async (page) => {
      await pasteText(page, text);
      await clickWidget(page, 'Read as');
      const before = await page.evaluate(() => globalThis.tallyproofPage.lastResult);
      // Weights near 500 g all fall in one bin of the fitted exponential: refused, the analysis stays.
      await clickWidget(page, 'measurements in equal-probability bins (exponential)');
      await page.waitForFunction(() => globalThis.tallyproofPage.lastRefusal.includes('exponential rate'), null, { timeout: 5000 });
      assert(await page.evaluate(() => globalThis.tallyproofPage.lastResult) === before, 'the previous analysis stays');
      await page.mouse.move(700, 750);
      await screenshot(page, 'slice-15-bins-two-columns-refused');
      await clickWidget(page, 'Read as');
      await clickWidget(page, 'measurements in equal-probability bins (lognormal)');
      await page.waitForFunction(() => JSON.parse(globalThis.tallyproofPage.lastResult).model?.kind === 'lognormal', null, { timeout: 5000 });
      assert((await lastResult(page)).categories.length === 10, 'ten lognormal bins');
      await page.mouse.move(700, 750);
      await screenshot(page, 'slice-16-bins-two-columns');
    });
  },
};
