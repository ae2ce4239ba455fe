// Every word on screen explained (issue 18). The abbreviation detector below is written apart from
// the glossary (Greek letters, superscripts, short capitals, single letters, "df", "Fei"), so a
// new symbol shown without an explanation fails here. Checks of wording: no outside reference
// needed (common practice); the statistics themselves are checked against SciPy elsewhere.
import { assert, openFormView, closeFormView, clickWidget, lastResult, pasteText, resultsText, screenshot, withPage } from './harness.mjs';

function abbreviations(text) {
  const out = new Set();
  for (const s of ['χ²', 'G²', 'T²', 'GM²', 'NM²', 'λ', 'α', '◆', 'w0']) if (text.includes(s)) out.add(s);
  for (const m of text.matchAll(/(^|[^A-Za-z0-9'’])([A-Za-z][A-Za-z0-9]*)/g)) {
    const w = m[2];
    if (/^[A-Z]{2,5}$/.test(w) || (w.length === 1 && !['a', 'A', 'I'].includes(w)) || w === 'df' || w === 'Fei') out.add(w);
  }
  // A short label with a shortened word ("Adj. res."): in a sentence a full stop ends it instead.
  if (text.length < 25) for (const m of text.matchAll(/([A-Za-z]{2,5})\./g)) out.add(m[0]);
  return out;
}

// The glossary terms a text of "term: meaning" lines explains.
function explainedTerms(notes) {
  return notes.split('\n').map((l) => l.slice(0, l.indexOf(': '))).filter((t) => t.length > 0);
}
const covers = (terms, token) => terms.some((t) => t === token || t.includes(token));

// Shares 0.4/0.3/0.2/0.1 (Fei is shown), category A exactly as expected (its Holm p is capped).
const doc = JSON.stringify({
  format: 'tallyproof/1', categories: ['Alpha', 'Beta', 'Gamma', 'Delta'], observed: [40, 22, 26, 12],
  model: { kind: 'shares', values: [0.4, 0.3, 0.2, 0.1] },
  pvalue: { method: 'monte-carlo', replicates: 20000, seed: 3 },
});

async function hoverTooltip(page, name) {
  const r = await page.evaluate((n) => globalThis.tallyproofPage.widgets[n], name);
  await page.evaluate(() => { globalThis.tallyproofPage.tooltip = ''; });
  await page.mouse.move(r.x + Math.min(r.w / 2, 20), r.y + r.h / 2);
  await page.waitForFunction(() => !!globalThis.tallyproofPage.tooltip, null, { timeout: 3000 }).catch(() => {});
  return page.evaluate(() => globalThis.tallyproofPage.tooltip || '');
}

async function walkCanvas(page, seen) {
  const { widgets, explained } = await page.evaluate(() => ({
    widgets: Object.keys(globalThis.tallyproofPage.widgets), explained: globalThis.tallyproofPage.explained || {},
  }));
  for (const name of widgets) {
    if (seen.has(name)) continue;
    const shown = explained[name] ?? name;  // a marked control shows its name
    const tokens = [...abbreviations(shown)];
    if (!tokens.length) continue;
    seen.add(name);
    assert(name in explained, `the control "${name}" shows ${tokens.join(', ')} with no explanation`);
    const tip = await hoverTooltip(page, name);
    const terms = explainedTerms(tip);
    for (const t of tokens) assert(covers(terms, t), `hovering "${name}" ("${shown}") does not explain "${t}"; tooltip:\n${tip}`);
  }
}

export const tests = {
  async 'every abbreviation on the canvas explains itself on hover, and the form view lists their meanings'() {
    await withPage({}, async (page) => {
      await pasteText(page, doc);
      await page.waitForFunction(() => document.getElementById('tp-results').textContent.includes('replicates at least as extreme'), null, { timeout: 20000 });
      await page.waitForFunction(() => !!globalThis.tallyproofPage.widgets['monte carlo counts'], null, { timeout: 5000 });
      const seen = new Set();
      await walkCanvas(page, seen);
      assert(seen.has('verdict details') && seen.has('effect sizes') && seen.has('verdict statistic'), `walked: ${[...seen].join(', ')}`);
      const mc = await hoverTooltip(page, 'monte carlo counts');  // words of the trade, explained too
      assert(mc.includes('replicates: The simulated samples') && mc.includes('Monte Carlo: A p-value by simulation'), mc);
      const tip = await hoverTooltip(page, 'effect sizes');
      assert(tip.includes('Fei: w rescaled to run from 0 to 1'), `Fei explained: ${tip}`);
      await screenshot(page, 'glossary-tooltip-effect');
      await clickWidget(page, 'Where it differs');
      await page.waitForFunction(() => !!globalThis.tallyproofPage.widgets['head Holm p'], null, { timeout: 5000 });
      await walkCanvas(page, seen);
      for (const h of ['head O', 'head E', 'head O − E', 'head χ² share', 'head Adj. res.', 'head Holm p'])
        assert(seen.has(h), `column head ${h} explained: ${[...seen].join(', ')}`);
      const holm = await hoverTooltip(page, 'head Holm p');
      assert(holm.includes("Holm's method") && holm.includes('capped at 1'), holm);
      await screenshot(page, 'glossary-tooltip-head');
      // The write-up, planning, the save menu and the statistic list, each walked in turn.
      for (const view of ['Write-up', 'Planning']) {
        await clickWidget(page, view);
        await page.waitForTimeout(200);
        await walkCanvas(page, seen);
      }
      assert(seen.has('Spreadsheet (TSV)') && seen.has('Copy table'), `write-up walked: ${[...seen].join(', ')}`);
      await clickWidget(page, 'Save & share');
      await page.waitForFunction(() => !!globalThis.tallyproofPage.widgets['Download analysis (JSON)'], null, { timeout: 5000 });
      await walkCanvas(page, seen);
      assert(seen.has('Download analysis (JSON)') && seen.has('Download table (CSV)') && seen.has('Print or save as PDF'), `menu walked: ${[...seen].join(', ')}`);
      await page.keyboard.press('Escape');
      await clickWidget(page, 'statistic');
      await page.waitForFunction(() => !!globalThis.tallyproofPage.widgets['Neyman NM² (λ = −2)'], null, { timeout: 5000 });
      await walkCanvas(page, seen);
      assert(seen.has('Likelihood ratio G² (λ = 0)') && seen.has('statistic'), `statistic list walked: ${[...seen].join(', ')}`);
      await page.keyboard.press('Escape');
      await clickWidget(page, 'show it conforms');
      await page.waitForFunction(() => !!globalThis.tallyproofPage.widgets['margin w0 label'], null, { timeout: 5000 });
      await walkCanvas(page, seen);
      assert(seen.has('margin w0') && seen.has('conformity rule'), `conformity walked: ${[...seen].join(', ')}`);
      await clickWidget(page, 'find a departure');
      const r = await lastResult(page);
      assert(!r.category_p_adjusted_text.includes('1'), `a bare "1" among the adjusted p-values: ${r.category_p_adjusted_text}`);
      assert(r.category_p_adjusted_text.includes('1.000'), `the capped p of Alpha (40 of 100 at share 0.4) prints 1.000: ${r.category_p_adjusted_text}`);
      const text = await resultsText(page);
      assert(text.includes('20,000 replicates') && !/B = /.test(text), `replicates in words: ${text}`);

      // The form view: every abbreviation in its visible text has its meaning in the list under it.
      await openFormView(page);
      const terms = await page.getByRole('term').allTextContents();
      const definitions = await page.getByRole('definition').allTextContents();
      assert(terms.length >= 5 && definitions.length === terms.length, `glossary list: ${terms.length} terms, ${definitions.length} meanings`);
      const visible = await page.evaluate(() => {
        const form = document.getElementById('tp-form');
        const skip = (el) => el.closest('textarea, #tp-glossary, select') || (el.closest('tbody') && el.closest('th'));
        const parts = [];
        const walker = document.createTreeWalker(form, NodeFilter.SHOW_TEXT);
        for (let n = walker.nextNode(); n; n = walker.nextNode())
          if (!skip(n.parentElement) && n.parentElement.offsetParent !== null) parts.push(n.textContent);
        return parts.join('\n');
      });
      for (const t of abbreviations(visible)) assert(covers(terms, t), `the form view shows "${t}" with no meaning in its list; list: ${terms.join(' | ')}`);
      const cells = await page.locator('#tp-table tbody td').allTextContents();
      assert(!cells.includes('1'), `a bare "1" in the form's table: ${cells.join(' | ')}`);
      await screenshot(page, 'glossary-form');
    });
  },

  async 'whole counts totalling 100 get a question one tap dismisses; decimals get the percentages note; print has the footnote'() {
    await withPage({}, async (page) => {
      await pasteText(page, 'A\t40\nB\t60\n');
      await page.waitForFunction(() => document.getElementById('tp-results').textContent.includes('are they counts of items'), null, { timeout: 10000 });
      let r = await lastResult(page);
      assert(!r.warnings.some((w) => w.includes('percent')), `no percentages warning: ${r.warnings}`);
      assert(r.questions.length === 1, `one question: ${r.questions}`);
      await screenshot(page, 'glossary-question');
      await clickWidget(page, 'They are counts');
      await page.waitForFunction(() => !document.getElementById('tp-results').textContent.includes('Check:'), null, { timeout: 5000 });
      r = await lastResult(page);
      assert(r.questions.length === 0, `the answered question is gone: ${r.questions}`);
      // Other counts totalling 100 are asked about again, and the form view answers with its own button.
      await pasteText(page, 'A\t45\nB\t55\n');
      await page.waitForFunction(() => document.getElementById('tp-results').textContent.includes('are they counts of items'), null, { timeout: 10000 });
      await openFormView(page);
      await page.getByRole('button', { name: 'They are counts' }).click();
      await page.waitForFunction(() => !document.getElementById('tp-results').textContent.includes('Check:'), null, { timeout: 5000 });
      assert(await page.getByRole('button', { name: 'They are counts' }).count() === 0, 'the form hides the answered question\'s button');
      await closeFormView(page);
      await pasteText(page, 'A\t25.5\nB\t74.5\n');
      await page.waitForFunction(() => (globalThis.tallyproofPage.lastRefusal || '').includes('percentages'), null, { timeout: 5000 });
      // Print: the footnote explains the symbols of the printed report.
      await page.emulateMedia({ media: 'print' });
      await page.waitForFunction(() => document.getElementById('tp-print').textContent.includes('Symbols and abbreviations'), null, { timeout: 10000 });
      const printed = await page.evaluate(() => document.getElementById('tp-print').textContent);
      assert(printed.includes('df: Degrees of freedom') && printed.includes('χ²: Pearson'), printed.slice(-800));
      await page.emulateMedia({ media: 'screen' });
    });
  },
};
