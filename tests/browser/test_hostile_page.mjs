// The hostile-input catalogue (tests/hostile/catalogue.json) through the page: every entry that
// needs no command-line option is pasted through a real paste event (documents included). The
// page must not throw, must answer within 5 s, must show the catalogue's message for a refusal,
// and must keep the previous analysis on screen when it refuses.
import { readFileSync } from 'node:fs';
import { assert, pasteText, withPage } from './harness.mjs';

const catalogue = JSON.parse(readFileSync(new URL('../hostile/catalogue.json', import.meta.url), 'utf8'));

export const tests = {
  async 'hostile catalogue through the page'() {
    // Invalid UTF-8 cannot reach the page: clipboard and file text arrive as Unicode strings.
    const entries = catalogue.filter((e) => typeof e.input === 'string' && !(e.args && e.args.length) && !e.generate &&
      !e.id.includes('invalid-utf8') && !e.encoding && !e.known_defect);  // other encodings cannot be pasted; known hangs would stall the page
    assert(entries.length >= 40, `only ${entries.length} catalogue entries apply to the page`);
    const problems = [];
    await withPage({}, async (page) => {
      for (const e of entries) {
        // A known analysis first, so that keeping it on a refusal can be checked.
        await pasteText(page, 'Known A\t10\nKnown B\t12\n');
        await page.waitForFunction(() => JSON.parse(globalThis.tallyproofPage.lastResult).categories?.[0] === 'Known A');
        await page.evaluate(() => { globalThis.tallyproofPage.lastRefusal = ''; globalThis.__before = globalThis.tallyproofPage.lastResult; });
        const t0 = Date.now();
        await pasteText(page, e.input);
        try {
          await page.waitForFunction(() => globalThis.tallyproofPage.lastRefusal !== '' ||
            globalThis.tallyproofPage.lastResult !== globalThis.__before, null, { timeout: 5000, polling: 50 });
        } catch (err) {
          if (e.exit === 0) problems.push(`${e.id}: no answer within 5 s`);
          else problems.push(`${e.id}: no refusal within 5 s`);
          continue;
        }
        const seconds = (Date.now() - t0) / 1000;
        const refusal = await page.evaluate(() => globalThis.tallyproofPage.lastRefusal);
        const result = JSON.parse(await page.evaluate(() => globalThis.tallyproofPage.lastResult));
        if (e.exit === 0) {
          if (refusal) problems.push(`${e.id}: refused on the page ("${refusal}") but analysed by the tool`);
        } else {
          if (!refusal) problems.push(`${e.id}: analysed on the page but refused by the tool`);
          else if (e.stream === 'stderr' && !refusal.includes(e.message)) problems.push(`${e.id}: page says "${refusal}", catalogue "${e.message}"`);
          if (result.categories?.[0] !== 'Known A') problems.push(`${e.id}: the previous analysis was not kept`);
        }
        if (seconds > 5) problems.push(`${e.id}: ${seconds.toFixed(1)} s`);
      }
    });
    assert(problems.length === 0, `${problems.length} of ${entries.length} entries:\n  ${problems.join('\n  ')}`);
  },
};
