// Workbooks in and out through the page (issue 29), with trusted input only: files through the
// page's file picker (setInputFiles), the sheet chosen with the mouse on the canvas and with the
// keyboard in the form view.
// Outside sources: the workbooks are made by LibreOffice 7.4 (Debian 12's libreoffice-calc-nogui)
// from a CSV held here, and by openpyxl 3.0 (Debian's python3-openpyxl) then saved again by
// LibreOffice (so its formulas carry saved values). The counts are of our own invention (an
// appliance plant's door defects).
import { execFileSync } from 'node:child_process';
import { existsSync, mkdirSync, mkdtempSync, readFileSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { assert, chooseFile, clickWidget, lastResult, openFormView, pasteText, screenshot, withPage } from './harness.mjs';

const soffice = ['/usr/bin/soffice', '/usr/bin/libreoffice'].find(existsSync);
const python = '/usr/bin/python3';
const XLSX = 'application/vnd.openxmlformats-officedocument.spreadsheetml.sheet';
const ODS = 'application/vnd.oasis.opendocument.spreadsheet';

const csv = 'Defect,Count\nScratch,31\nDent,18\nMisaligned door,12\nLoose hinge,9\nOther,10\n';
const thisYear = [31, 18, 12, 9, 10], lastYear = [22, 25, 14, 11, 8], audit = [7, 5, 6, 4, 3];

// LibreOffice converts `files` (in `dir`) to `to` (xlsx, ods); a profile of its own in `dir`.
function convert(dir, files, to, infilter = null) {
  const args = [`-env:UserInstallation=file://${join(dir, 'profile')}`, '--headless'];
  if (infilter) args.push(`--infilter=${infilter}`);
  args.push('--convert-to', to, '--outdir', dir, ...files.map((f) => join(dir, f)));  // written beside them, into `dir`
  execFileSync(soffice, args, { timeout: 180000, stdio: 'ignore', env: { ...process.env, HOME: dir, LANG: 'C.UTF-8' } });
}

function makeWorkbooks() {
  const dir = mkdtempSync(join(tmpdir(), 'tp-workbooks-'));
  writeFileSync(join(dir, 'defects.csv'), csv);
  // Three sheets, the third hidden, the header in bold.
  const script = `
import sys, openpyxl
from openpyxl.styles import Font
wb = openpyxl.Workbook()
names = ["Scratch", "Dent", "Misaligned door", "Loose hinge", "Other"]
for title, counts, hidden in (("This year", ${JSON.stringify(thisYear)}, False), ("Last year", ${JSON.stringify(lastYear)}, False),
                              ("Audit", ${JSON.stringify(audit)}, True)):
    ws = wb.active if title == "This year" else wb.create_sheet(title)
    ws.title = title
    ws.append(["Defect", "Count"])
    ws["A1"].font = Font(bold=True)
    for n, c in zip(names, counts):
        ws.append([n, c])
    if hidden:
        ws.sheet_state = "hidden"
wb.save(sys.argv[1])
`;
  mkdirSync(join(dir, 'openpyxl'));
  execFileSync(python, ['-c', script, join(dir, 'openpyxl', 'three-sheets.xlsx')], { timeout: 60000 });
  convert(dir, ['defects.csv'], 'xlsx', 'CSV:44,34,76');
  convert(dir, ['defects.csv'], 'ods', 'CSV:44,34,76');
  // Saved again by LibreOffice (into `dir`): a workbook as a spreadsheet program writes it.
  convert(dir, ['openpyxl/three-sheets.xlsx'], 'xlsx');
  return dir;
}

async function otherAnalysis(page) {
  await pasteText(page, 'Known A\t10\nKnown B\t12\n');
  await page.waitForFunction(() => JSON.parse(globalThis.tallyproofPage.lastResult).categories?.[0] === 'Known A', null, { timeout: 5000 });
}

const observedIs = (page, counts) => page.waitForFunction((c) => JSON.stringify(JSON.parse(globalThis.tallyproofPage.lastResult).observed) === c,
  JSON.stringify(counts), { timeout: 10000 });

export const tests = {
  async 'an .xlsx and an .ods made by LibreOffice from a CSV open to the same analysis as the CSV'() {
    if (!soffice) throw new Error('LibreOffice is not installed (Debian package libreoffice-calc-nogui, installed by .ci/bootstrap)');
    const dir = makeWorkbooks();
    await withPage({ permissions: ['clipboard-read', 'clipboard-write'] }, async (page) => {
      await chooseFile(page, 'defects.csv', readFileSync(join(dir, 'defects.csv')), 'text/csv');
      await observedIs(page, thisYear);
      const fromCsv = await lastResult(page);
      for (const [name, mime] of [['defects.xlsx', XLSX], ['defects.ods', ODS]]) {
        await otherAnalysis(page);
        await chooseFile(page, name, readFileSync(join(dir, name)), mime);
        await observedIs(page, thisYear);
        const r = await lastResult(page);
        assert(JSON.stringify(r.categories) === JSON.stringify(fromCsv.categories), `${name}: categories ${r.categories}`);
        assert(r.statistic === fromCsv.statistic && r.df === fromCsv.df && r.p_value === fromCsv.p_value,
          `${name}: ${r.statistic} ${r.df} ${r.p_value} against the CSV's ${fromCsv.statistic} ${fromCsv.df} ${fromCsv.p_value}`);
        const shown = await page.evaluate(() => document.getElementById('tp-results').textContent);
        assert(shown.includes(r.categories[2]), `${name}: the report shows the categories`);
      }
      await screenshot(page, 'workbook-ods');
    });
  },

  async 'a workbook of three sheets: another chosen on the canvas with the mouse, the hidden one in the form view with the keyboard'() {
    if (!soffice) throw new Error('LibreOffice is not installed (Debian package libreoffice-calc-nogui, installed by .ci/bootstrap)');
    const dir = makeWorkbooks();
    await withPage({}, async (page) => {
      await chooseFile(page, 'three-sheets.xlsx', readFileSync(join(dir, 'three-sheets.xlsx')), XLSX);
      await observedIs(page, thisYear);  // the first visible sheet with values
      const notice = await page.evaluate(() => document.getElementById('tp-progress').textContent);
      assert(notice.includes('"This year"') && notice.includes('Audit (hidden)'), `the notice names the sheet read and the others: ${notice}`);
      await clickWidget(page, 'Sheet');
      await page.waitForFunction(() => !!globalThis.tallyproofPage.widgets['sheet Last year'], null, { timeout: 3000 });
      await screenshot(page, 'workbook-sheet-list');
      await clickWidget(page, 'sheet Last year');
      await observedIs(page, lastYear);
      await openFormView(page);
      const options = await page.evaluate(() => Array.from(document.querySelectorAll('#tp-f-sheet option')).map((o) => o.textContent));
      assert(JSON.stringify(options) === JSON.stringify(['This year', 'Last year', 'Audit (hidden)']), `form sheet list: ${options}`);
      await page.focus('#tp-f-sheet');
      await page.keyboard.press('ArrowDown');  // a closed select moves to the next option and says so (change)
      await observedIs(page, audit);
      await screenshot(page, 'workbook-form-sheet');
      // Saved as a workbook from the form (Enter on its button), read back by openpyxl 3.0.
      await page.focus('#tp-f-xlsx');
      const [download] = await Promise.all([page.waitForEvent('download', { timeout: 10000 }), page.keyboard.press('Enter')]);
      assert(download.suggestedFilename() === 'tallyproof-categories.xlsx', `download name ${download.suggestedFilename()}`);
      const saved = join(dir, 'saved.xlsx');
      await download.saveAs(saved);
      const cells = JSON.parse(execFileSync(python, ['-c', `
import sys, json, openpyxl
wb = openpyxl.load_workbook(sys.argv[1])
ws = wb.worksheets[0]
print(json.dumps({"sheets": wb.sheetnames, "rows": [[c.value for c in r[:2]] for r in ws.iter_rows()]}))
`, saved], { timeout: 60000 }).toString());
      const r = await lastResult(page);
      assert(cells.sheets.length === 2, `sheets ${cells.sheets}`);
      const body = cells.rows.slice(1, 1 + r.categories.length);
      assert(JSON.stringify(body.map((row) => row[0])) === JSON.stringify(r.categories), `labels ${JSON.stringify(body)}`);
      assert(JSON.stringify(body.map((row) => row[1])) === JSON.stringify(audit), `counts ${JSON.stringify(body)}`);
    });
  },
};
