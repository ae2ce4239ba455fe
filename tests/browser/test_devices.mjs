// Every device and every reader: text entry on touch screens through the page's real input
// element, drag scrolling, 44 px tap targets, the file picker and the Paste button, the form view
// driven by role and accessible name only, the browser's own print, and phone / tablet layouts
// with no control past the screen's edge.
import { execFileSync } from 'node:child_process';
import { mkdtempSync, readFileSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join, resolve, dirname } from 'node:path';
import { fileURLToPath } from 'node:url';
import { assert, openFormView, closeFormView, clickWidget, lastResult, pasteText, typeInto, screenshot, withPage } from './harness.mjs';

const here = dirname(fileURLToPath(import.meta.url));
const phone = { viewport: { width: 390, height: 844 }, deviceScaleFactor: 2, hasTouch: true, isMobile: true };
// Counts every animation frame the page asks for, so a test can see the idle page draws none.
const countFrames = `(() => { const raf = window.requestAnimationFrame.bind(window); globalThis.__frames = 0;
  window.requestAnimationFrame = (f) => { globalThis.__frames++; return raf(f); }; })();`;

const widget = (page, name) => page.evaluate((n) => globalThis.tallyproofPage.widgets[n], name);
async function tap(page, name) {
  await page.waitForFunction((n) => !!globalThis.tallyproofPage.widgets[n], name, { timeout: 5000 });
  const r = await widget(page, name);
  await page.touchscreen.tap(r.x + r.w / 2, r.y + r.h / 2);
  await page.waitForTimeout(150);
}
// A one-finger drag through the DevTools protocol (Playwright's touchscreen only taps).
async function drag(page, from, to, steps = 8) {
  const cdp = await page.context().newCDPSession(page);
  const point = (p) => [{ x: p.x, y: p.y, id: 1 }];
  await cdp.send('Input.dispatchTouchEvent', { type: 'touchStart', touchPoints: point(from) });
  for (let i = 1; i <= steps; i++) {
    const p = { x: from.x + (to.x - from.x) * i / steps, y: from.y + (to.y - from.y) * i / steps };
    await cdp.send('Input.dispatchTouchEvent', { type: 'touchMove', touchPoints: point(p) });
    await page.waitForTimeout(16);
  }
  await cdp.send('Input.dispatchTouchEvent', { type: 'touchEnd', touchPoints: [] });
  await page.waitForTimeout(150);
}
const focused = (page) => page.evaluate(() => {
  const el = document.activeElement;
  return { tag: el.tagName, id: el.id, inputMode: el.inputMode, value: el.value, editable: !el.disabled && !el.readOnly,
    autocorrect: el.getAttribute('autocorrect'), autocapitalize: el.getAttribute('autocapitalize') };
});
async function retype(page, text) {
  await page.keyboard.press('End');
  for (let i = 0; i < 12; i++) await page.keyboard.press('Backspace');
  await page.keyboard.type(text, { delay: 20 });
  await page.keyboard.press('Enter');
}

export const tests = {
  async 'touch: tap "count 1" and "alpha", type on the keyboard, the result follows'() {
    await withPage({ ...phone, initScript: countFrames }, async (page) => {
      // On a phone the counts come below the result: a drag up scrolls the page to them.
      const inView = (r) => r && r.y > 80 && r.y + r.h < 800;
      for (let i = 0; i < 10 && !inView(await widget(page, 'count 2')); i++) await drag(page, { x: 370, y: 700 }, { x: 370, y: 250 });
      assert(inView(await widget(page, 'count 2')), `dragging did not bring the counts into view: ${JSON.stringify(await widget(page, 'count 2'))}`);
      await screenshot(page, 'devices-touch-counts');
      await tap(page, 'count 1');
      let f = await focused(page);
      assert(f.tag === 'INPUT' && f.id === 'tp-ime' && f.editable, `after tapping count 1 the focus is on ${f.tag}#${f.id}`);
      assert(f.inputMode === 'decimal' && f.value === '61', `count field: inputmode ${f.inputMode}, value "${f.value}"`);
      assert(f.autocorrect === 'off' && f.autocapitalize === 'off', 'no autocorrect or autocapitalisation');
      await retype(page, '90');
      await page.waitForFunction(() => JSON.parse(globalThis.tallyproofPage.lastResult).observed?.[0] === 90, null, { timeout: 5000 });
      await screenshot(page, 'devices-touch-count-typed');
      // The keyboard's deletion and composition reach the field too: an input method composes
      // "7" (the field shows it while composing), then commits it.
      await tap(page, 'count 2');
      await page.keyboard.press('End');
      await page.keyboard.press('Backspace');
      const cdp = await page.context().newCDPSession(page);
      await cdp.send('Input.imeSetComposition', { text: '7', selectionStart: 1, selectionEnd: 1 });
      await page.waitForTimeout(150);
      const composing = await page.evaluate(() => document.activeElement.value);
      assert(composing === '217', `while composing the element holds "${composing}"`);
      await cdp.send('Input.insertText', { text: '7' });
      await page.keyboard.press('Enter');
      await page.waitForFunction(() => JSON.parse(globalThis.tallyproofPage.lastResult).observed?.[1] === 217, null, { timeout: 5000 });
      // Tapping elsewhere ends the edit: the input element gives up focus.
      await tap(page, 'label 1');
      f = await focused(page);
      assert(f.id === 'tp-ime' && f.inputMode === 'text' && f.value === 'Extra', `label field: ${JSON.stringify(f)}`);
      await page.touchscreen.tap(200, 12);
      await page.waitForTimeout(200);
      f = await focused(page);
      assert(f.id !== 'tp-ime', 'tapping outside the field ended the edit');
      // α lies below the screen on a phone: a drag up scrolls the page to it.
      const before = await widget(page, 'alpha');
      assert(before.y > 700, `alpha starts below the screen (y ${before.y})`);
      for (let i = 0; i < 8 && (await widget(page, 'alpha')).y > 700; i++) await drag(page, { x: 370, y: 700 }, { x: 370, y: 250 });
      const after = await widget(page, 'alpha');
      assert(after.y < 700 && after.y > 0, `after dragging, alpha at y ${after.y} (was ${before.y})`);
      await screenshot(page, 'devices-touch-scrolled');
      await tap(page, 'alpha');
      f = await focused(page);
      assert(f.id === 'tp-ime' && f.inputMode === 'decimal' && f.value === '0.05', `alpha field: ${JSON.stringify(f)}`);
      await retype(page, '0.01');
      await page.waitForFunction(() => JSON.parse(globalThis.tallyproofPage.lastDocument).alpha === 0.01, null, { timeout: 5000 });
      const r = await lastResult(page);
      assert(r.observed[0] === 90, 'the edited count stays');
      // Tap targets of at least 44 CSS px.
      for (const name of ['count 1', 'label 1', 'alpha', 'Examples', 'Open a file', 'Paste', 'asymptotic']) {
        const w = await widget(page, name);
        assert(w.h >= 44 - 0.5 && w.w >= 44 - 0.5, `${name}: ${w.w.toFixed(1)} x ${w.h.toFixed(1)} CSS px`);
      }
      // The idle page draws nothing.
      await page.waitForTimeout(800);
      const n0 = await page.evaluate(() => globalThis.__frames);
      await page.waitForTimeout(1500);
      const idle = (await page.evaluate(() => globalThis.__frames)) - n0;
      assert(idle === 0, `the idle page asked for ${idle} frames in 1.5 s`);
    });
  },

  async 'the whole job with roles and names only: counts, stated shares, the statistic, the write-up'() {
    await withPage({ permissions: ['clipboard-read', 'clipboard-write'] }, async (page) => {
      await page.keyboard.press('Tab');  // the skip link comes first, and shows when focused
      const skip = page.getByRole('link', { name: /form view/i });
      assert(await skip.evaluate((el) => el === document.activeElement && el.getBoundingClientRect().top >= 0), 'the skip link is focused and on screen');
      await skip.press('Enter');
      const status = page.getByRole('status');
      // Invented grading counts against a stated 20/50/25/5 mix. Reference: SciPy 1.10,
      // scipy.stats.chisquare([61,214,103,22], [80,200,100,20]) -> statistic 5.7825, p 0.12269.
      await typeInto(page, page.getByRole('textbox', { name: /counts/i }), 'Premium\t61\nStandard\t214\nSecond\t103\nReject\t22');
      await page.getByRole('button', { name: 'Read the counts' }).click();
      await page.waitForFunction(() => JSON.parse(globalThis.tallyproofPage.lastResult).categories?.[0] === 'Premium', null, { timeout: 5000 });
      await page.getByRole('combobox', { name: /expected mix/i }).selectOption('shares');
      const values = page.getByRole('textbox', { name: /expected mix/i });
      await typeInto(page, values, '20, 50, 25, 5', { then: 'Tab' });
      await page.waitForFunction(() => document.getElementById('tp-results').textContent.includes('5.78'), null, { timeout: 5000 });
      const text = await status.textContent();
      assert(text.includes('χ² = 5.78'), `live region: ${text.slice(0, 200)}`);
      // A refused value is announced, and the analysis stays.
      await typeInto(page, values, '20, 50, 30', { then: 'Enter' });
      await page.waitForFunction(() => document.getElementById('tp-results').dataset.state === 'error', null, { timeout: 5000 });
      const refusal = await status.textContent();
      assert(refusal.startsWith('Not used:') && refusal.includes('3 values for 4 categories'), `refusal: ${refusal}`);
      await typeInto(page, values, '20, 50, 25, 5', { then: 'Tab' });
      // Counts go through the paste parser and its refusals.
      const counts = page.getByRole('textbox', { name: /counts/i });
      await typeInto(page, counts, 'Premium\t61\nStandard\t2l4');
      await page.getByRole('button', { name: 'Read the counts' }).click();
      await page.waitForFunction(() => document.getElementById('tp-results').dataset.state === 'error', null, { timeout: 5000 });
      assert((await status.textContent()).includes('"2l4"'), `counts refusal: ${await status.textContent()}`);
      assert((await lastResult(page)).observed.join(',') === '61,214,103,22', 'the refused counts left the analysis as it was');
      const alpha = page.getByRole('textbox', { name: /α/ });
      await typeInto(page, alpha, '0.1', { then: 'Enter' });
      await page.waitForFunction(() => JSON.parse(globalThis.tallyproofPage.lastDocument).alpha === 0.1, null, { timeout: 5000 });
      await page.getByRole('combobox', { name: /p-value method/i }).selectOption('exact');
      await page.waitForFunction(() => JSON.parse(globalThis.tallyproofPage.lastResult).method === 'exact', null, { timeout: 20000 });
      await page.getByRole('combobox', { name: /p-value method/i }).selectOption('asymptotic');
      await page.getByRole('combobox', { name: /merge rule/i }).selectOption('cochran');
      await page.waitForFunction(() => JSON.parse(globalThis.tallyproofPage.lastDocument).merge.rule === 'cochran', null, { timeout: 5000 });
      await page.getByRole('combobox', { name: /merge rule/i }).selectOption('none');
      await typeInto(page, alpha, '0.05', { then: 'Tab' });
      await page.waitForFunction(() => JSON.parse(globalThis.tallyproofPage.lastDocument).alpha === 0.05, null, { timeout: 5000 });
      await page.getByRole('button', { name: 'Copy the write-up' }).click();
      await page.waitForFunction(() => globalThis.tallyproofPage.lastCopy !== null, null, { timeout: 5000 });
      const copied = await page.evaluate(() => navigator.clipboard.readText());
      assert(copied.includes('χ²(3, N = 400) = 5.78, p = .123'), `write-up: ${copied.slice(0, 200)}`);
      await page.getByRole('button', { name: 'Copy the table' }).click();
      await page.waitForFunction((c) => globalThis.tallyproofPage.lastCopy.text !== c, copied, { timeout: 5000 });
      const table = await page.evaluate(() => navigator.clipboard.readText());
      assert(table.split('\n')[1].startsWith('Premium\t61\t80'), `table: ${table.split('\n')[1]}`);
      const download = page.waitForEvent('download');
      await page.getByRole('button', { name: /download the analysis/i }).click();
      const doc = JSON.parse(readFileSync(await (await download).path(), 'utf8'));
      assert(doc.model.kind === 'shares' && doc.observed.join(',') === '61,214,103,22', JSON.stringify(doc).slice(0, 200));
      await screenshot(page, 'devices-form-view');
      await page.getByRole('button', { name: 'Back to the canvas view' }).focus();
      await page.keyboard.press('Enter');
      await page.waitForFunction(() => !document.body.classList.contains('tp-form-view'), null, { timeout: 5000 });
    });
  },

  async 'Open a file: the file picker opens and its CSV is read here'() {
    await withPage({}, async (page) => {
      // Invented counts of three shifts, as a spreadsheet would save them.
      const csv = 'Shift,Count\nEarly,48\nDay,61\nNight,35\n';
      let chooser = page.waitForEvent('filechooser', { timeout: 5000 });
      await clickWidget(page, 'Open a file');
      let fc = await chooser;
      assert(!fc.isMultiple(), 'one file at a time');
      await fc.setFiles({ name: 'shifts.csv', mimeType: 'text/csv', buffer: Buffer.from(csv) });
      await page.waitForFunction(() => JSON.parse(globalThis.tallyproofPage.lastResult).categories?.[0] === 'Early', null, { timeout: 5000 });
      const r = await lastResult(page);
      assert(r.observed.join(',') === '48,61,35', `read ${r.observed}`);
      const accept = await page.evaluate(() => document.getElementById('tp-file').accept);
      for (const ext of ['.csv', '.tsv', '.txt', '.json']) assert(accept.includes(ext), `picker accepts ${ext}: ${accept}`);
      // The form's button opens the same picker.
      await openFormView(page);
      chooser = page.waitForEvent('filechooser', { timeout: 5000 });
      await page.getByRole('button', { name: 'Open a file' }).click();
      fc = await chooser;
      await fc.setFiles({ name: 'plan.tsv', mimeType: 'text/tab-separated-values', buffer: Buffer.from('A\t10\nB\t20\n') });
      await page.waitForFunction(() => JSON.parse(globalThis.tallyproofPage.lastResult).categories?.[0] === 'A', null, { timeout: 5000 });
    });
  },

  async 'Paste: the clipboard when granted, else a box to paste into'() {
    await withPage({ permissions: ['clipboard-read', 'clipboard-write'] }, async (page) => {
      await page.evaluate(() => navigator.clipboard.writeText('North\t31\nSouth\t44\nEast\t25\n'));
      await clickWidget(page, 'Paste');
      await page.waitForFunction(() => JSON.parse(globalThis.tallyproofPage.lastResult).categories?.[0] === 'North', null, { timeout: 5000 });
    });
    await withPage({ initScript: 'navigator.clipboard.readText = () => Promise.reject(new Error("denied"));' }, async (page) => {
      await clickWidget(page, 'Paste');
      const box = page.getByRole('dialog');
      await box.waitFor({ state: 'visible', timeout: 5000 });
      await screenshot(page, 'devices-paste-box');
      await page.keyboard.insertText('Left\t12\nRight\t30\n');  // the box has the focus
      await page.getByRole('button', { name: 'Read this text' }).click();
      await page.waitForFunction(() => JSON.parse(globalThis.tallyproofPage.lastResult).categories?.[1] === 'Right', null, { timeout: 5000 });
      assert(await box.isHidden(), 'the box closes after reading');
    });
  },

  async "the browser's own print, without the menu, prints the report with its charts"() {
    await withPage({}, async (page) => {
      await page.emulateMedia({ media: 'print' });
      await page.waitForFunction(() => globalThis.tallyproofPage.printReady === true, null, { timeout: 5000 });
      const images = await page.evaluate(() => document.querySelectorAll('#tp-print img').length);
      assert(images === 2, `print layout has ${images} chart images`);
      const dir = mkdtempSync(join(tmpdir(), 'tp-print-'));
      const pdf = join(dir, 'print.pdf');
      await page.pdf({ path: pdf, format: 'A4' });
      const text = execFileSync('pdftotext', ['-layout', pdf, '-']).toString();
      // The first example: SciPy 1.10, chisquare([61,214,103,22], [80,200,100,20]) -> 5.7825.
      assert(text.includes('χ² = 5.78'), `the printed text lacks the statistic: ${text.slice(0, 300)}`);
      execFileSync('pdftoppm', ['-png', '-r', '50', '-f', '1', '-l', '1', pdf, join(dir, 'page')]);
      const png = ['page-1.png', 'page-01.png'].map((n) => join(dir, n)).find((f) => { try { readFileSync(f); return true; } catch { return false; } });
      writeFileSync(resolve(here, 'screenshots', 'devices-print-page-1.png'), readFileSync(png));
      await page.emulateMedia({ media: 'screen' });
    });
  },

  async 'phone: the categories table scrolls sideways under a finger, and the merge rules are 44 px apart'() {
    await withPage(phone, async (page) => {
      await tap(page, 'Where it differs');
      await page.waitForFunction(() => !!globalThis.tallyproofPage.widgets['direction 1'], null, { timeout: 5000 });
      const before = await widget(page, 'direction 1');
      // Eight columns do not fit in 390 px: the last starts past the screen's right edge until dragged in.
      assert(before.x + before.w > 390, `the direction column already fits: ${JSON.stringify(before)}`);
      const y = before.y + before.h / 2;
      await drag(page, { x: 300, y }, { x: 80, y });
      const after = await widget(page, 'direction 1');
      assert(after.x < before.x - 100, `a sideways drag did not scroll the table: x ${before.x.toFixed(0)} -> ${after.x.toFixed(0)}`);
      assert(Math.abs(after.y - before.y) < 2, `the sideways drag moved the page up or down: y ${before.y.toFixed(0)} -> ${after.y.toFixed(0)}`);
      await screenshot(page, 'devices-phone-table-scrolled');
      // The merge rule's list: each item a 44 px tap target.
      for (let i = 0; i < 12; i++) {
        const r = await widget(page, 'merge rule');
        if (r && r.y > 80 && r.y + r.h < 760) break;
        await drag(page, { x: 370, y: 700 }, { x: 370, y: 400 });
      }
      await tap(page, 'merge rule');
      await page.waitForFunction(() => !!globalThis.tallyproofPage.widgets['until Cochran\'s rule holds'], null, { timeout: 5000 });
      const open = await page.evaluate(() => globalThis.tallyproofPage.widgets);
      for (const item of ['no merging', 'until every expected count is at least 5', 'until Cochran\'s rule holds', 'until every expected count reaches a minimum'])
        assert(open[item] && open[item].h >= 44 - 0.5, `merge rule item ${item} is ${open[item]?.h?.toFixed(1)} px tall`);
      await screenshot(page, 'devices-phone-merge-rules');
    });
  },
  async 'phones, tablet and laptop: no control past the screen edge'() {
    const sizes = [[360, 640, true], [390, 844, true], [820, 1180, true], [1366, 768, false]];
    for (const [width, height, touch] of sizes) {
      await withPage({ viewport: { width, height }, hasTouch: touch, isMobile: touch && width < 800, deviceScaleFactor: touch ? 2 : 1 }, async (page) => {
        await page.waitForFunction(() => !!globalThis.tallyproofPage.widgets['Copy results'], null, { timeout: 5000 });
        await screenshot(page, `devices-${width}x${height}`);
        const widgets = await page.evaluate(() => globalThis.tallyproofPage.widgets);
        const past = Object.entries(widgets).filter(([, r]) => r.x < -0.5 || r.x + r.w > width + 0.5);
        assert(past.length === 0, `${width}x${height}: past the edge: ${past.map(([n, r]) => `${n} [${r.x.toFixed(0)}, ${(r.x + r.w).toFixed(0)}]`).join('; ')}`);
        for (const tab of ['Curve', 'Bars', 'Where it differs', 'Planning', 'Write-up']) assert(widgets[tab], `${width}x${height}: view ${tab} not shown`);
        // Every result view, and the write-up's buttons, stay inside the screen too.
        await clickWidget(page, 'Write-up');
        await screenshot(page, `devices-${width}x${height}-writeup`);
        const after = await page.evaluate(() => globalThis.tallyproofPage.widgets);
        const past2 = Object.entries(after).filter(([, r]) => r.x < -0.5 || r.x + r.w > width + 0.5);
        assert(past2.length === 0, `${width}x${height} write-up: past the edge: ${past2.map(([n]) => n).join('; ')}`);
        // The menus open inside the screen too (a pasted analysis fills the recent list first).
        await pasteText(page, 'A very long category name from a survey sheet\t31\nAnother long category name\t44\nA third one\t25\n');
        await page.waitForFunction(() => JSON.parse(globalThis.tallyproofPage.lastResult).categories?.[2] === 'A third one');
        for (const [menu, item] of [['Save & share', 'Start fresh'], ['Examples', 'Survey sample against census shares']]) {
          await clickWidget(page, menu);
          await page.waitForFunction((n) => !!globalThis.tallyproofPage.widgets[n], item, { timeout: 5000 });
          await screenshot(page, `devices-${width}x${height}-${menu.split(' ')[0].toLowerCase()}`);
          const open = await page.evaluate(() => globalThis.tallyproofPage.widgets);
          if (touch) assert(open[item].h >= 44 - 0.5, `${width}x${height}: menu item ${item} is ${open[item].h.toFixed(1)} px tall`);
          const out = Object.entries(open).filter(([, r]) => r.x < -0.5 || r.x + r.w > width + 0.5);
          assert(out.length === 0, `${width}x${height} ${menu} menu: past the edge: ${out.map(([n, r]) => `${n} [${r.x.toFixed(0)}, ${(r.x + r.w).toFixed(0)}]`).join('; ')}`);
          await page.keyboard.press('Escape');
          await page.waitForTimeout(150);
        }
      });
    }
  },
};
