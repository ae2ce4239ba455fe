// The test's two goals on the page: "find a departure" and "show it conforms within w0"
// (equivalence test), switched by the same AppState transition as the document's conformity
// member; and a comparison with a previous sample. Reference values from SciPy 1.10:
// ncx2.cdf(0.72941, 2, 10.2) = 0.0040613 for counts 330, 352, 338 against equal shares, w0 = 0.1;
// chi2_contingency([[150,420,190,40],[140,390,230,40]], correction=False) -> 5.2655, p = 0.15336.
import { assert, clickWidget, lastResult, openFormView, pasteText, typeInto, resultsText, screenshot, withPage } from './harness.mjs';

const conformDoc = JSON.stringify({
  format: 'tallyproof/1', categories: ['A', 'B', 'C'], observed: [330, 352, 338],
  model: { kind: 'equal' }, conformity: { margin_w: 0.1 },
});

async function waitFor(page, text) {
  await page.waitForFunction((t) => document.getElementById('tp-results').textContent.includes(t), text, { timeout: 10000 });
}

export const tests = {
  async 'goal "show it conforms within w0": verdict, noncentral curve and lower-tail region'() {
    await withPage({}, async (page) => {
      await pasteText(page, conformDoc);
      await waitFor(page, 'conform to the stated mix within w < 0.10');
      const r = await lastResult(page);
      assert(r.conformity && r.conformity.conforms === true, `conformity: ${JSON.stringify(r.conformity)}`);
      assert(Math.abs(r.conformity.p_value - 0.004061303243092804) < 1e-9, `p ${r.conformity.p_value}`);  // SciPy ncx2.cdf
      const colours = await screenshot(page, 'conformity-curve');
      assert(colours > 20, `the curve view drew ${colours} colours`);
      const text = await resultsText(page);
      assert(text.includes('Conformity margin w0 = 0.100'), text);
      // The answer to the goal leads (issue 27): the conformity verdict and p before the departure test's p.
      assert(text.indexOf('Answer (the goal is conformity): The counts conform') >= 0 &&
             text.indexOf('Answer (the goal is conformity)') < text.indexOf('p = '), text);
      assert(r.answer && r.answer.test === 'conformity' && r.answer.p_value === r.conformity.p_value, JSON.stringify(r.answer));
    });
  },

  async 'margin w0 is typed through the text-entry element (touch keyboards); an unreadable margin is refused'() {
    await withPage({}, async (page) => {
      await pasteText(page, conformDoc);
      await waitFor(page, 'conform to the stated mix within w < 0.10');
      await clickWidget(page, 'margin w0');
      const f = await page.evaluate(() => ({ id: document.activeElement.id, mode: document.activeElement.inputMode, value: document.activeElement.value }));
      // A text keyboard: the margin may be typed in percentage points too ("2 pp").
      assert(f.id === 'tp-ime' && f.mode === 'text' && f.value === '0.1', `margin field: ${JSON.stringify(f)}`);
      await page.keyboard.press('End');
      for (let i = 0; i < 8; i++) await page.keyboard.press('Backspace');
      await page.keyboard.type('0.2', { delay: 20 });
      await page.keyboard.press('Enter');
      await page.waitForFunction(() => JSON.parse(globalThis.tallyproofPage.lastDocument).conformity.margin_w === 0.2, null, { timeout: 5000 });
      const r = await lastResult(page);
      // SciPy 1.10: ncx2.cdf(0.72941, 2, 1020 * 0.2**2 = 40.8) is far below 0.004 (the margin is wider).
      assert(r.conformity && r.conformity.margin_w === 0.2 && r.conformity.p_value < 0.0040613, `conformity at w0 = 0.2: ${JSON.stringify(r.conformity)}`);
      await clickWidget(page, 'margin w0');
      await page.keyboard.press('End');
      for (let i = 0; i < 8; i++) await page.keyboard.press('Backspace');
      await page.keyboard.type('1.5', { delay: 20 });
      await page.keyboard.press('Enter');
      await page.waitForFunction(() => document.body.textContent.includes('must lie in (0, 1]'), null, { timeout: 5000 });
      assert(JSON.parse(await page.evaluate(() => globalThis.tallyproofPage.lastDocument)).conformity.margin_w === 0.2, 'the refused margin leaves w0 = 0.2');
    });
  },

  async 'the margin typed in percentage points ("2 pp") is shown with its w0'() {
    await withPage({}, async (page) => {
      await pasteText(page, conformDoc);
      await waitFor(page, 'conform to the stated mix within w < 0.10');
      await clickWidget(page, 'margin w0');
      await page.keyboard.press('End');
      for (let i = 0; i < 8; i++) await page.keyboard.press('Backspace');
      await page.keyboard.type('2 pp', { delay: 20 });
      await page.keyboard.press('Enter');
      await page.waitForFunction(() => JSON.parse(globalThis.tallyproofPage.lastDocument).conformity.margin_points === 2, null, { timeout: 5000 });
      const r = await lastResult(page);
      // Closed form (docs/methods.md): three equal shares of 1/3, w0 = 0.02 * sqrt(3 + 3).
      assert(Math.abs(r.conformity.margin_w - 0.02 * Math.sqrt(6)) < 1e-12 && r.conformity.margin_points === 2, JSON.stringify(r.conformity));
      const text = await resultsText(page);
      assert(text.includes('w < 0.05, a shift of up to 2.0 percentage points between two categories'), text);
      await screenshot(page, 'conformity-margin-points');
    });
  },

  async 'goal "find a departure" after conformity, and back, through the goal buttons'() {
    await withPage({}, async (page) => {
      await pasteText(page, conformDoc);
      await waitFor(page, 'conform to the stated mix');
      await clickWidget(page, 'find a departure');
      await page.waitForFunction(() => !document.getElementById('tp-results').textContent.includes('Conformity margin'), null, { timeout: 10000 });
      let r = await lastResult(page);
      assert(!r.conformity, 'no conformity section once the goal is a departure');
      assert((await resultsText(page)).includes('No evidence against the stated mix'), await resultsText(page));
      await screenshot(page, 'conformity-departure-goal');
      // Fewer counts: conformity is not shown, and the verdict says what the data allow.
      await clickWidget(page, 'show it conforms');
      await waitFor(page, 'Conformity margin');
      await pasteText(page, 'A\t30\nB\t52\nC\t38\n');
      await waitFor(page, 'is not shown');
      r = await lastResult(page);
      assert(r.conformity.conforms === false, JSON.stringify(r.conformity));
      assert((await resultsText(page)).includes('with N = 120 the data allow only w <'), await resultsText(page));
      await screenshot(page, 'conformity-not-shown');
    });
  },

  async 'a pasted third column headed "Last month" is the previous sample; Read as turns it into expected counts'() {
    await withPage({}, async (page) => {
      await pasteText(page, 'Defect,This month,Last month\nScratch,150,140\nDent,420,390\nCrack,190,230\nOther,40,40\n');
      await waitFor(page, 'compared with the previous sample of N = 800');
      let r = await lastResult(page);
      // SciPy 1.10: chi2_contingency([[150,420,190,40],[140,390,230,40]], correction=False) -> 5.265462506841817.
      assert(Math.abs(r.statistic - 5.265462506841817) < 1e-9 && r.reference_sample, `statistic ${r.statistic}`);
      await clickWidget(page, 'Read as');
      await clickWidget(page, 'label, observed, expected');
      await page.waitForFunction(() => !document.getElementById('tp-results').textContent.includes('previous sample'), null, { timeout: 5000 });
      r = await lastResult(page);
      // SciPy 1.10: chisquare([150,420,190,40], f_exp=[140,390,230,40]) -> 9.978499761108456, p 0.018749782273771807.
      assert(Math.abs(r.statistic - 9.978499761108456) < 1e-9 && !r.reference_sample, `as expected counts: ${r.statistic}`);
      await clickWidget(page, 'Read as');
      await clickWidget(page, 'label, observed, previous sample');
      await waitFor(page, 'compared with the previous sample of N = 800');
      await screenshot(page, 'previous-sample-pasted');
    });
  },

  async 'the form view sets the goal: conformity within w0, a refused margin, and back to a departure'() {
    await withPage({}, async (page) => {
      await pasteText(page, 'A\t330\nB\t352\nC\t338\n');
      await waitFor(page, 'No evidence against');
      await openFormView(page);
      const goal = page.getByRole('combobox', { name: 'Goal of the test' });
      await goal.selectOption('conform');
      await waitFor(page, 'conform to the stated mix within w < 0.10');
      const r = await lastResult(page);
      assert(Math.abs(r.conformity.p_value - 0.004061303243092804) < 1e-9, `p ${r.conformity.p_value}`);  // SciPy ncx2.cdf(0.72941, 2, 10.2)
      const margin = page.getByRole('textbox', { name: /Conformity margin w0/ });
      assert(await margin.inputValue() === '0.1', `margin ${await margin.inputValue()}`);
      await typeInto(page, margin, '1.5', { then: 'Tab' });
      await page.waitForFunction(() => document.getElementById('tp-results').dataset.state === 'error', null, { timeout: 5000 });
      assert((await page.getByRole('status').textContent()).includes('must lie in (0, 1]'), await page.getByRole('status').textContent());
      await goal.selectOption('departure');
      await page.waitForFunction(() => !JSON.parse(globalThis.tallyproofPage.lastResult).conformity, null, { timeout: 5000 });
      await screenshot(page, 'conformity-form-goal');
    });
  },

  async 'comparison with a previous sample from a document'() {
    await withPage({}, async (page) => {
      await pasteText(page, JSON.stringify({
        format: 'tallyproof/1', categories: ['A', 'B', 'C', 'D'], observed: [150, 420, 190, 40],
        model: { kind: 'reference-sample', values: [140, 390, 230, 40] },
      }));
      await waitFor(page, 'compared with the previous sample of N = 800');
      const r = await lastResult(page);
      assert(Math.abs(r.statistic - 5.265462506841817) < 1e-9 && Math.abs(r.p_value - 0.15335924154056324) < 1e-9,
        `statistic ${r.statistic}, p ${r.p_value}`);  // SciPy chi2_contingency
      assert(r.reference_sample && r.reference_sample.n === 800, JSON.stringify(r.reference_sample));
      await screenshot(page, 'reference-sample');
    });
  },
};
