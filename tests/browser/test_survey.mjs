// Survey rows on the page (issue 30): respondent-level data opened as a file (setInputFiles), read
// as survey rows through "Read as", with the category, stratum and cluster columns chosen from the
// first line's names, the mix typed in the form view; the design-corrected test is the one the
// verdict, the heading and the curve show.
// Reference: R 4.2.2 with survey 4.1-1, svygofchisq(~channel, p = c(25,30,20,25)/100, design) for
// svydesign(ids = ~store, strata = ~region, weights = ~weight, nest = TRUE) on the invented
// tests/reference/survey_respondents.csv: second-order statistic 7.473091653177697 on
// 2.4821769793584738 df, p = 0.038050170155375929 (tests/reference/survey_reference.csv, row
// "clusters", written by tests/reference/make_survey_reference.R).
import { readFileSync } from 'node:fs';
import { dirname, resolve } from 'node:path';
import { fileURLToPath } from 'node:url';
import { assert, chooseFile, clickWidget, lastResult, openFormView, closeFormView, pasteText, resultsText, screenshot, typeInto, withPage } from './harness.mjs';

const here = dirname(fileURLToPath(import.meta.url));
const respondents = readFileSync(resolve(here, '../reference/survey_respondents.csv'));

async function pick(page, column, value) {
  await clickWidget(page, `survey ${column}`);
  await clickWidget(page, `survey ${column} ${value}`);
}

export const tests = {
  async 'survey rows: weights, strata and clusters chosen on the page give the Rao–Scott test R survey gives'() {
    await withPage({}, async (page) => {
      await chooseFile(page, 'survey_respondents.csv', respondents, 'text/csv');
      await page.waitForFunction(() => document.getElementById('tp-results').dataset.state === 'error', null, { timeout: 5000 });
      await clickWidget(page, 'Read as');
      await clickWidget(page, 'survey rows');
      await page.waitForFunction(() => JSON.parse(globalThis.tallyproofPage.lastResult).design, null, { timeout: 5000 });
      await pick(page, 'Category', 'channel');
      await pick(page, 'Stratum', 'region');
      await pick(page, 'Cluster', 'store');
      await page.waitForFunction(() => JSON.parse(globalThis.tallyproofPage.lastResult).design?.clusters === 22, null, { timeout: 5000 });
      // The mix as a ratio, typed in the form view (the same state as the canvas).
      await openFormView(page);
      const model = page.getByRole('combobox', { name: /expected mix/i });
      await model.focus();
      await page.keyboard.type('Ra');
      await page.waitForFunction(() => JSON.parse(globalThis.tallyproofPage.lastDocument).model.kind === 'ratio', null, { timeout: 5000 });
      // R's levels are sorted (Online, Partner, Phone, Store: 25:30:20:25); the page keeps the
      // first-seen order (Phone, Partner, Online, Store), so the same mix reads 20:30:25:25 here.
      const cats = (await lastResult(page)).categories.join(',');
      assert(cats === 'Phone,Partner,Online,Store', `categories in first-seen order: ${cats}`);
      await typeInto(page, page.getByRole('textbox', { name: /expected mix values/i }), '20:30:25:25', { then: 'Enter' });
      await page.waitForFunction(() => JSON.parse(globalThis.tallyproofPage.lastDocument).model.values?.length === 4, null, { timeout: 5000 });
      await closeFormView(page);
      const r = await lastResult(page);
      const d = r.design;
      assert(d && d.strata === 4 && d.clusters === 22, `design: ${JSON.stringify(d && [d.strata, d.clusters])}`);
      const rel = (a, b) => Math.abs(a - b) / Math.abs(b);
      assert(rel(d.second_order.statistic, 7.473091653177697) < 1e-8, `second-order statistic ${d.second_order.statistic}`);  // R survey 4.1-1
      assert(rel(d.second_order.df, 2.4821769793584738) < 1e-8, `second-order df ${d.second_order.df}`);                   // R survey 4.1-1
      assert(rel(d.second_order.p_value, 0.038050170155375929) < 1e-6, `second-order p ${d.second_order.p_value}`);        // R survey 4.1-1
      assert(rel(r.p_value, 0.038050170155375929) < 1e-6, `the verdict's p is the corrected one: ${r.p_value}`);
      const text = await resultsText(page);
      assert(text.includes('χ²/(δ̄(1 + a²)) = 7.473'), `report: ${text.slice(0, 500)}`);
      assert(/Uncorrected: χ² = [0-9.]+, df = 3/.test(text), 'the uncorrected test is shown beside it');
      // The document keeps the design: a reload brings the same corrected test back.
      await page.reload();
      await page.waitForFunction(() => JSON.parse(globalThis.tallyproofPage.lastResult || '{}').design?.clusters === 22, null, { timeout: 20000 });
      const again = await lastResult(page);
      assert(rel(again.design.second_order.statistic, 7.473091653177697) < 1e-8, 'restored with its design');
      await screenshot(page, 'survey-rows');
    });
  },

  async 'the form view reads survey rows from the columns typed in its survey field'() {
    await withPage({}, async (page) => {
      await openFormView(page);
      await chooseFile(page, 'survey_respondents.csv', respondents, 'text/csv');
      await page.waitForFunction(() => document.getElementById('tp-results').dataset.state === 'error', null, { timeout: 5000 });
      const survey = page.getByRole('textbox', { name: /Survey rows/ });
      await typeInto(page, survey, 'channel, weight, region, store', { then: 'Enter' });
      await page.waitForFunction(() => JSON.parse(globalThis.tallyproofPage.lastResult).design?.clusters === 22, null, { timeout: 5000 });
      const model = page.getByRole('combobox', { name: /expected mix/i });
      await model.focus();
      await page.keyboard.type('Ra');
      await page.waitForFunction(() => JSON.parse(globalThis.tallyproofPage.lastDocument).model.kind === 'ratio', null, { timeout: 5000 });
      await typeInto(page, page.getByRole('textbox', { name: /expected mix values/i }), '20:30:25:25', { then: 'Enter' });  // first-seen order, as above
      await page.waitForFunction(() => Math.abs(JSON.parse(globalThis.tallyproofPage.lastResult).design.second_order.statistic - 7.473091653177697) < 1e-6,
        null, { timeout: 5000 });  // R survey 4.1-1 svygofchisq (survey_reference.csv, "clusters")
      const live = await page.getByRole('status').textContent();
      assert(live.length <= 200, `live region: ${live}`);
      // A column that is not there is refused by name, and the analysis stays.
      await typeInto(page, survey, 'channel, weight, county', { then: 'Enter' });
      await page.waitForFunction(() => document.getElementById('tp-results').dataset.state === 'error', null, { timeout: 5000 });
      assert((await page.getByRole('status').textContent()).includes('county'), 'the refusal names the missing column');
      await closeFormView(page);
    });
  },

  async 'design effects typed for counts: one overall (crude) on the canvas, one per category in the form view'() {
    await withPage({ permissions: ['clipboard-read', 'clipboard-write'] }, async (page) => {
      // Invented counts of three shifts. SciPy 1.10: chisquare([48, 61, 35]) -> 7.041666666666667,
      // p 0.02957477924664611; chi2.sf(7.041666666666667 / 2, 2) -> 0.17197319339550018.
      await pasteText(page, 'Early\t48\nDay\t61\nNight\t35\n');
      await page.waitForFunction(() => JSON.parse(globalThis.tallyproofPage.lastResult).categories?.[0] === 'Early', null, { timeout: 5000 });
      await clickWidget(page, 'design effect');
      await page.keyboard.type('2', { delay: 20 });
      await page.keyboard.press('Enter');
      await page.waitForFunction(() => JSON.parse(globalThis.tallyproofPage.lastResult).design, null, { timeout: 5000 });
      let r = await lastResult(page);
      assert(Math.abs(r.p_value - 0.17197319339550018) < 1e-12, `crude p ${r.p_value}`);  // SciPy chi2.sf
      assert(Math.abs(r.design.uncorrected.p_value - 0.02957477924664611) < 1e-12, 'the uncorrected p beside it');  // SciPy chisquare
      assert((await resultsText(page)).includes('crude correction'), 'labelled as the crude correction');
      await openFormView(page);
      const deff = page.getByRole('textbox', { name: /Design effect/ });
      assert(await deff.inputValue() === '2', `the form shows the design effect: ${await deff.inputValue()}`);
      await typeInto(page, deff, '1.4, 1.2', { then: 'Enter' });  // two for three categories: refused
      await page.waitForFunction(() => document.getElementById('tp-results').dataset.state === 'error', null, { timeout: 5000 });
      assert((await page.getByRole('status').textContent()).includes('one per category (3)'), 'the refusal says how many');
      await typeInto(page, deff, '1.4, 1.2, 1.9', { then: 'Enter' });
      await page.waitForFunction(() => (JSON.parse(globalThis.tallyproofPage.lastResult).design || {}).design_effects?.length === 3, null, { timeout: 5000 });
      r = await lastResult(page);
      assert(r.design.second_order === null || r.design.second_order.statistic === undefined || !r.design.second_order.available,
        `tier 2 offers no second order: ${JSON.stringify(r.design.second_order)}`);
      await typeInto(page, deff, '', { then: 'Enter' });  // none again: the plain test, SciPy's p
      await page.waitForFunction(() => !JSON.parse(globalThis.tallyproofPage.lastResult).design, null, { timeout: 5000 });
      r = await lastResult(page);
      assert(Math.abs(r.p_value - 0.02957477924664611) < 1e-12, `plain p ${r.p_value}`);  // SciPy chisquare
      await closeFormView(page);
    });
  },
};
