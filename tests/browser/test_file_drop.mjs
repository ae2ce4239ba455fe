// Files dropped on the page reach the core's text decoder as bytes (issue 17): a PNG (made by
// Chromium's own screenshot encoder) and a workbook are refused saying what they are while the
// previous analysis stays; UTF-16 text (encoded by Node's Buffer, an outside encoder) reads as
// the same counts as the UTF-8 paste. Files go in through the page's file picker (setInputFiles), which shares openLocalFile with a drop.
import { assert, chooseFile, lastResult, pasteText, screenshot, withPage } from './harness.mjs';

// A file chosen in the page's file picker: the same openLocalFile path a dropped file takes (a
// drag from the desktop cannot be made with trusted input in the browser under test).
async function dropFile(page, bytes, name) {
  await chooseFile(page, name, bytes, 'application/octet-stream');
}

async function knownAnalysis(page) {
  await pasteText(page, 'Known A\t10\nKnown B\t12\n');
  await page.waitForFunction(() => JSON.parse(globalThis.tallyproofPage.lastResult).categories?.[0] === 'Known A');
  await page.evaluate(() => { globalThis.tallyproofPage.lastRefusal = ''; globalThis.__before = globalThis.tallyproofPage.lastResult; });
}

export const tests = {
  async 'a dropped PNG or workbook is refused and the previous analysis stays'() {
    await withPage({}, async (page) => {
      await knownAnalysis(page);
      const png = await page.screenshot({ clip: { x: 0, y: 0, width: 40, height: 30 } });
      await dropFile(page, png, 'chart.png');
      await page.waitForFunction(() => globalThis.tallyproofPage.lastRefusal !== '', null, { timeout: 5000 });
      const refusal = await page.evaluate(() => globalThis.tallyproofPage.lastRefusal);
      assert(refusal.startsWith('chart.png: This is not text: it looks like a PNG image.'), `PNG refusal: ${refusal}`);
      assert((await lastResult(page)).categories[0] === 'Known A', 'the previous analysis stays after a PNG');
      assert(await page.evaluate(() => globalThis.tallyproofPage.lastResult === globalThis.__before), 'no new result after a PNG');
      await screenshot(page, 'file-drop-png-refused');

      await knownAnalysis(page);
      // The start of a workbook: a zip whose first member is [Content_Types].xml, then xl/ parts.
      const head = Buffer.concat([Buffer.from('PK\x03\x04', 'latin1'), Buffer.alloc(26), Buffer.from('[Content_Types].xml'),
        Buffer.from('PK\x03\x04', 'latin1'), Buffer.alloc(26), Buffer.from('xl/workbook.xml')]);
      await dropFile(page, head, 'tally.xlsx');
      await page.waitForFunction(() => globalThis.tallyproofPage.lastRefusal !== '', null, { timeout: 5000 });
      const wb = await page.evaluate(() => globalThis.tallyproofPage.lastRefusal);
      // Workbooks are read since issue 29: this one, cut short after two headers, is refused as damaged.
      assert(wb.includes('damaged or incomplete') && wb.includes('copy the cells'), `workbook refusal: ${wb}`);
      assert((await lastResult(page)).categories[0] === 'Known A', 'the previous analysis stays after a workbook');
    });
  },

  async 'a p below the double range is written a × 10^b in the report and the table'() {
    await withPage({}, async (page) => {
      await pasteText(page, 'A\t1000000000000\nB\t1\n');
      await page.waitForFunction(() => JSON.parse(globalThis.tallyproofPage.lastResult).observed?.[1] === 1);
      const report = await page.evaluate(() => document.getElementById('tp-results').textContent);
      // log10 p = -217147240957.0725 (mpmath, erfc(sqrt(X²/2)) with X² = 999999999997)
      assert(report.includes('p = 8.5 × 10⁻²¹⁷¹⁴⁷²⁴⁰⁹⁵⁸'), `report: ${report.slice(0, 300)}`);
      const cells = await page.evaluate(() => Array.from(document.querySelectorAll('#tp-table tbody tr')).map((r) => r.cells[5].textContent));
      assert(cells.length === 2 && cells.every((c) => /^[1-9]\.[0-9] × 10⁻[⁰¹²³⁴⁵⁶⁷⁸⁹]+$/.test(c)), `adjusted p cells: ${cells}`);
    });
  },

  async 'a dropped UTF-16 file reads as the UTF-8 text does'() {
    await withPage({}, async (page) => {
      const text = 'Größe S\t48\nGröße M\t35\nχ² 🍎\t17\n';
      await pasteText(page, text);
      await page.waitForFunction(() => JSON.parse(globalThis.tallyproofPage.lastResult).categories?.[0] === 'Größe S');
      const reference = await lastResult(page);
      for (const [name, bytes] of [
        ['le-bom.txt', Buffer.concat([Buffer.from([0xff, 0xfe]), Buffer.from(text, 'utf16le')])],
        ['le.txt', Buffer.from(text, 'utf16le')],
        ['be.txt', Buffer.from(text, 'utf16le').swap16()]]) {
        await knownAnalysis(page);
        await dropFile(page, bytes, name);
        await page.waitForFunction(() => globalThis.tallyproofPage.lastResult !== globalThis.__before ||
          globalThis.tallyproofPage.lastRefusal !== '', null, { timeout: 5000 });
        const r = await lastResult(page);
        assert(JSON.stringify(r.categories) === JSON.stringify(reference.categories), `${name}: categories ${JSON.stringify(r.categories)}`);
        assert(r.p_value === reference.p_value, `${name}: p ${r.p_value} vs ${reference.p_value}`);
        const notice = await page.evaluate(() => globalThis.tallyproofPage.lastNotice);
        assert(notice.includes('UTF-16'), `${name}: notice ${notice}`);
      }
    });
  },
};
