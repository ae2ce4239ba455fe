// Labels with invisible and direction-control characters and in two Unicode forms: drawn on the
// canvas exactly as their visible form (pixel for pixel against a rendering of that form, so
// never as "?"), the same in the accessible table and the results text; look-alike labels raise
// the notice, and its button merges them; the downloaded CSV starts with a UTF-8 byte-order mark
// (copied text does not) and LibreOffice Calc's CSV import with its default settings keeps χ² and
// non-Latin labels and does not read the mark as text.
import { execFileSync } from 'node:child_process';
import { existsSync, mkdtempSync, readFileSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join, resolve, dirname } from 'node:path';
import { fileURLToPath } from 'node:url';
import { assert, clickWidget, lastResult, pasteText, screenshot, withPage } from './harness.mjs';
import { decodePng } from './png.mjs';

const here = dirname(fileURLToPath(import.meta.url));

// U+200B zero-width space, U+202E right-to-left override, e + U+0301 (é decomposed).
const hidden = 'A\t30\nA\u200B\t4\n\u202Eexe.txt\t9\ncafe\u0301\t12\nχ²\t7\n';
// The same labels as they should be shown: the codes typed out, é as one character.
const visible = 'A\t30\nA<U+200B>\t4\n<U+202E>exe.txt\t9\ncaf\u00E9\t12\nχ²\t7\n';
const shown = ['A', 'A<U+200B>', '<U+202E>exe.txt', 'caf\u00E9', 'χ²'];

async function pasteAndWait(page, text, firstLabel) {
  await pasteText(page, text);
  await page.waitForFunction((l) => JSON.parse(globalThis.tallyproofPage.lastResult).categories?.[1] === l, firstLabel);
}

async function canvasPixels(page, name) {
  await screenshot(page, name);
  return decodePng(readFileSync(resolve(here, 'screenshots', `${name}.png`)));
}

async function openMenuItem(page, item) {
  await clickWidget(page, 'Save & share');
  await clickWidget(page, item);
}

export const tests = {
  async 'invisible characters and a decomposed é are drawn as their visible form, never as "?"'() {
    let drawn;
    await withPage({}, async (page) => {
      await pasteAndWait(page, hidden, 'A<U+200B>');
      const r = await lastResult(page);
      assert(JSON.stringify(r.categories) === JSON.stringify(shown), `categories: ${JSON.stringify(r.categories)}`);
      // The accessible table and the results text show the same labels.
      const heads = await page.evaluate(() => [...document.querySelectorAll('#tp-table tbody th')].map((th) => th.textContent));
      assert(JSON.stringify(heads) === JSON.stringify(shown), `accessible table: ${JSON.stringify(heads)}`);
      const text = await page.evaluate(() => document.getElementById('tp-results').textContent);
      assert(text.includes('A<U+200B>') && text.includes('<U+202E>exe.txt') && !/[\u200B\u202E]/.test(text), 'results text');
      assert(text.includes('look the same'), 'the look-alike note is in the results text');
      const widgets = await page.evaluate(() => globalThis.tallyproofPage.widgets);
      assert(widgets['look-alike labels'] && widgets['Merge look-alike labels'], 'no look-alike notice on the canvas');
      drawn = await canvasPixels(page, 'labels-hidden');
    });
    let reference;
    await withPage({}, async (page) => {
      await pasteAndWait(page, visible, 'A<U+200B>');
      reference = await canvasPixels(page, 'labels-visible-reference');
    });
    assert(drawn.width === reference.width && drawn.height === reference.height, 'screenshot sizes differ');
    let differing = 0;
    for (let i = 0; i < drawn.rgba.length; i += 4)
      if (drawn.rgba[i] !== reference.rgba[i] || drawn.rgba[i + 1] !== reference.rgba[i + 1] || drawn.rgba[i + 2] !== reference.rgba[i + 2]) differing++;
    assert(differing === 0, `${differing} pixels differ from the rendering of the visible labels (see screenshots/labels-*.png)`);
    // The reference itself is a drawn page, not a blank one.
    const colours = new Set();
    for (let i = 0; i < reference.rgba.length; i += 16) colours.add(reference.rgba.readUInt32BE(i));
    assert(colours.size > 50, `reference looks blank (${colours.size} colours)`);
  },

  async 'the look-alike notice merges the labels through one click'() {
    await withPage({}, async (page) => {
      await pasteAndWait(page, hidden, 'A<U+200B>');
      await clickWidget(page, 'Merge look-alike labels');
      await page.waitForFunction(() => JSON.parse(globalThis.tallyproofPage.lastResult).categories?.length === 4);
      const r = await lastResult(page);
      assert(JSON.stringify(r.categories) === JSON.stringify(['A', '<U+202E>exe.txt', 'caf\u00E9', 'χ²']), JSON.stringify(r.categories));
      assert(r.observed[0] === 34 && r.n === 62, `counts ${r.observed}`);  // 30 + 4; N unchanged
      assert(!r.warnings.some((w) => w.includes('look the same')), 'the look-alike note stayed');
      const notice = await page.evaluate(() => globalThis.tallyproofPage.lastNotice);
      assert(notice.includes('Merged the look-alike labels into "A"'), notice);
      await screenshot(page, 'labels-merged');
    });
  },

  async 'downloaded CSV has a byte-order mark, copied table none; LibreOffice keeps χ² and non-Latin labels'() {
    const labels = ['χ² high', 'Категория', '日本語', 'caf\u00E9'];
    let file;
    await withPage({ permissions: ['clipboard-read', 'clipboard-write'] }, async (page) => {
      await pasteText(page, labels.map((l, i) => `${l}\t${10 + 7 * i}`).join('\n') + '\n');
      await page.waitForFunction((l) => JSON.parse(globalThis.tallyproofPage.lastResult).categories?.[0] === l, labels[0]);
      const download = page.waitForEvent('download');
      await openMenuItem(page, 'Download table (CSV)');
      const d = await download;
      file = join(mkdtempSync(join(tmpdir(), 'tp-labels-')), 'tallyproof-categories.csv');
      await d.saveAs(file);
      const bytes = readFileSync(file);
      assert(bytes[0] === 0xEF && bytes[1] === 0xBB && bytes[2] === 0xBF, `no byte-order mark: ${bytes.subarray(0, 3).toString('hex')}`);
      assert(bytes.subarray(3, 4).toString() !== '\uFEFF'[0], 'two byte-order marks');
      await clickWidget(page, 'Write-up');
      await clickWidget(page, 'Copy table');
      await page.waitForFunction(() => globalThis.tallyproofPage.lastCopy !== null);
      const copied = await page.evaluate(() => navigator.clipboard.readText());
      assert(copied.startsWith('Category\t'), `copied table starts ${JSON.stringify(copied.slice(0, 12))}`);
    });
    const soffice = ['/usr/bin/soffice', '/usr/bin/libreoffice'].find(existsSync);
    if (!soffice) {
      console.log('     skip: LibreOffice is not installed (Debian package libreoffice-calc-nogui); CSV import not checked');
      return;
    }
    // Calc's CSV import with its default settings (comma, double quote, the system character set:
    // filter token 0) on a UTF-8 system. Measured with LibreOffice 7.4: a conversion with no filter
    // options at all reads any CSV as Windows-1252, with or without a byte-order mark (docs/robustness.md).
    const dir = dirname(file);
    const profile = 'file://' + join(dir, 'profile');
    const convert = (src) => {
      execFileSync(soffice, [`-env:UserInstallation=${profile}`, '--headless', '--infilter=CSV:44,34,0', '--convert-to', 'fods', '--outdir', dir, src],
        { timeout: 120000, stdio: 'ignore', env: { ...process.env, LANG: 'C.UTF-8' } });
      const fods = readFileSync(src.replace(/\.csv$/, '.fods'), 'utf8');
      return [...fods.matchAll(/<table:table-row[^>]*>(.*?)<\/table:table-row>/gs)]
        .map((m) => (m[1].match(/<text:p>(.*?)<\/text:p>/) || [])[1]).filter(Boolean);
    };
    const firstColumn = convert(file);
    assert(firstColumn[0] === 'Category', `header: ${firstColumn[0]}`);  // the byte-order mark is not read as text
    assert(JSON.stringify(firstColumn.slice(1, 5)) === JSON.stringify(labels), `Calc read the labels as ${JSON.stringify(firstColumn.slice(1, 5))}`);
  },
};
