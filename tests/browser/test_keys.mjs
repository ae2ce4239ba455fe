// Real keys and real touches (issue 24): Ctrl+V / ⌘V paste wherever the focus is, the form view
// takes typing and presses its buttons with Enter and Space, Escape and Cancel stop a long job in
// both views, Tab walks every control of the canvas, a tap explains a term on a phone. Every
// input here is trusted (input.mjs); the page's state is only read.
// Reference for the counts used: SciPy 1.10, scipy.stats.chisquare([31, 44, 25]) -> statistic
// 5.66, p = 0.05899 (equal shares); chisquare([61,214,103,22], [80,200,100,20]) -> 5.7825, p 0.12269.
import { assert, chooseFile, clickWidget, closeFormView, focusCanvas, lastResult, openFormView, pasteText, screenshot, tapWidget, typeInto,
  withPage } from './harness.mjs';

const threeRegions = 'North\t31\nSouth\t44\nEast\t25\n';
const longJob = JSON.stringify({ categories: ['0', '1', '2', '3', '4', '5'], observed: [21, 15, 6, 2, 1, 1],
  pvalue: { method: 'monte-carlo', replicates: 16000000, seed: 7 } });  // 9.6e7 draws: within the Monte Carlo budget of 1e8 (docs/methods.md)

async function firstCategory(page, name) {
  await page.waitForFunction((n) => JSON.parse(globalThis.tallyproofPage.lastResult).categories?.[0] === n, name, { timeout: 5000 });
}
async function running(page, yes) {
  await page.waitForFunction((y) => document.getElementById('tp-progress').dataset.running === (y ? '1' : '0'), yes, { timeout: 10000 });
}
// Records whether the page cancelled the keydown of V (which would stop the browser's paste).
function watchV() {
  globalThis.__vPrevented = null;
  const watch = (e) => {
    if (e.key !== 'v' && e.key !== 'V') return;
    window.removeEventListener('keydown', watch, true);
    setTimeout(() => { globalThis.__vPrevented = e.defaultPrevented; }, 0);
  };
  window.addEventListener('keydown', watch, true);  // capture: the page stops the key's propagation at the canvas
}

export const tests = {
  async 'Ctrl+V pastes counts with the canvas focused and with nothing focused; the key is not cancelled'() {
    await withPage({}, async (page) => {
      await focusCanvas(page);
      await page.evaluate((t) => navigator.clipboard.writeText(t), threeRegions);
      await page.evaluate(watchV);
      await page.keyboard.press('Control+V');
      await page.waitForFunction(() => globalThis.__vPrevented !== null, null, { timeout: 3000 });
      assert(await page.evaluate(() => globalThis.__vPrevented) === false, 'the keydown of Ctrl+V on the canvas was cancelled');
      await firstCategory(page, 'North');
      const r = await lastResult(page);
      assert(Math.abs(r.statistic - 5.66) < 1e-9, `statistic ${r.statistic}`);  // SciPy chisquare([31,44,25])
      assert(await page.evaluate(() => globalThis.tallyproofPage.lastPasteVia) === 'paste-event', 'read from the browser\'s paste event');
      await pasteText(page, 'West\t12\nEast\t30\n', { focus: 'body' });
      assert(await page.evaluate(() => document.activeElement === document.body), 'the body had the focus');
      await firstCategory(page, 'West');
      await screenshot(page, 'keys-ctrl-v-body');
    });
  },

  async '⌘V with a Mac user agent pastes (the clipboard is read when the browser fires no paste)'() {
    const mac = 'Mozilla/5.0 (Macintosh; Intel Mac OS X 13_5) AppleWebKit/537.36 (KHTML, like Gecko) Chrome/120.0 Safari/537.36';
    await withPage({ userAgent: mac }, async (page) => {
      assert((await page.evaluate(() => navigator.userAgent)).includes('Macintosh'), 'Mac user agent');
      await pasteText(page, threeRegions, { key: 'Meta+V' });
      await firstCategory(page, 'North');
      await pasteText(page, 'Left\t5\nRight\t9\n', { key: 'Meta+V', focus: 'body' });
      await firstCategory(page, 'Left');
    });
  },

  async 'Ctrl+V inside the paste box and the form view\'s counts box pastes into the box'() {
    await withPage({ initScript: 'navigator.clipboard.readText = () => Promise.reject(new Error("denied"));' }, async (page) => {
      await clickWidget(page, 'Paste');  // the clipboard refused: the box to paste into opens, focused
      const box = page.getByRole('textbox', { name: 'Counts to read' });
      await box.waitFor({ state: 'visible', timeout: 5000 });
      await pasteText(page, 'Left\t12\nRight\t30\n', { focus: 'keep' });
      assert(await box.inputValue() === 'Left\t12\nRight\t30\n', `box holds: ${JSON.stringify(await box.inputValue())}`);
      await page.keyboard.press('Tab');  // to "Read this text"
      await page.keyboard.press('Enter');
      await firstCategory(page, 'Left');
    });
    await withPage({}, async (page) => {
      await openFormView(page);
      const counts = page.getByRole('textbox', { name: /counts/i });
      await counts.click();
      await page.keyboard.press('Control+A');
      await pasteText(page, threeRegions, { focus: 'keep' });
      assert(await counts.inputValue() === threeRegions, `counts box: ${JSON.stringify(await counts.inputValue())}`);
      await page.keyboard.press('Control+Enter');
      await firstCategory(page, 'North');
    });
  },

  async 'a binary Ctrl+V (the text of a PDF) is refused as the Paste button refuses it, the text kept for correction'() {
    await withPage({}, async (page) => {
      await pasteText(page, threeRegions);
      await firstCategory(page, 'North');
      await page.evaluate(() => { globalThis.tallyproofPage.lastRefusal = ''; });
      // Text that starts as a PDF file does (copied from a PDF's source): not text, refused saying so.
      await pasteText(page, '%PDF-1.4\nA\t12\nB\t12\nC\t5\n');
      await page.waitForFunction(() => globalThis.tallyproofPage.lastRefusal !== '', null, { timeout: 5000 });
      const viaKey = await page.evaluate(() => globalThis.tallyproofPage.lastRefusal);
      await firstCategory(page, 'North');  // the analysis stays
      await clickWidget(page, 'fix it here');  // the refused text is kept for correction
      await clickWidget(page, 'refused paste editor');
      const kept = await page.waitForFunction(() => document.activeElement?.id === 'tp-ime-area' && document.activeElement.value, null, { timeout: 5000 });
      assert((await kept.jsonValue()).startsWith('%PDF-1.4\nA\t12'), 'the refused paste is in the editor');
      assert(viaKey.includes('PDF'), `refusal: ${viaKey}`);
      // The same text through the Paste button: the same refusal.
      await page.keyboard.press('Escape');
      await page.evaluate(() => { globalThis.tallyproofPage.lastRefusal = ''; });
      await clickWidget(page, 'Paste');
      await page.waitForFunction(() => globalThis.tallyproofPage.lastRefusal !== '', null, { timeout: 5000 });
      assert(await page.evaluate(() => globalThis.tallyproofPage.lastRefusal) === viaKey, `Paste button: ${viaKey}`);
      await screenshot(page, 'keys-refused-binary');
    });
  },

  async 'an over-limit Ctrl+V (270 MB) is refused as the Paste button refuses it, and the analysis stays'() {
    await withPage({ permissions: ['clipboard-read', 'clipboard-write'] }, async (page) => {
      await pasteText(page, threeRegions);
      await firstCategory(page, 'North');
      // 270 MB of text on the clipboard (written there in the page: sending it from the test
      // would copy it twice more), then a real Ctrl+V on the focused canvas.
      await page.evaluate(() => navigator.clipboard.writeText('Region\t12\n'.repeat(27 * 1024 * 1024)));
      await focusCanvas(page);
      await page.evaluate(() => { globalThis.tallyproofPage.lastRefusal = ''; });
      await page.keyboard.press('Control+V');
      await page.waitForFunction(() => globalThis.tallyproofPage.lastRefusal !== '', null, { timeout: 120000 });
      const viaKey = await page.evaluate(() => globalThis.tallyproofPage.lastRefusal);
      assert(viaKey.includes('270 MB') && viaKey.includes('at most 256 MB'), `refusal: ${viaKey}`);
      await firstCategory(page, 'North');  // the analysis stays
      await page.evaluate(() => { globalThis.tallyproofPage.lastRefusal = ''; });
      await clickWidget(page, 'Paste');
      await page.waitForFunction(() => globalThis.tallyproofPage.lastRefusal !== '', null, { timeout: 120000 });
      assert(await page.evaluate(() => globalThis.tallyproofPage.lastRefusal) === viaKey, 'the Paste button gives the same refusal');
      await firstCategory(page, 'North');
    });
  },

  async 'a paste while a job runs stops the job and says so'() {
    await withPage({}, async (page) => {
      await pasteText(page, longJob);
      await running(page, true);
      await pasteText(page, threeRegions);
      await firstCategory(page, 'North');
      const notice = await page.evaluate(() => globalThis.tallyproofPage.lastNotice);
      assert(notice.includes('was stopped'), `notice: ${notice}`);
      // The new counts keep the Monte Carlo setting: their own run starts, and Escape stops it.
      await page.keyboard.press('Escape');
      await running(page, false);
      assert((await lastResult(page)).tested_observed.join(',') === '31,44,25', 'the result is for the pasted counts');
    });
  },

  async 'form view: typing into every field applies it (Enter in one-line fields), selects by keys'() {
    await withPage({}, async (page) => {
      await openFormView(page);
      const counts = page.getByRole('textbox', { name: /counts/i });
      await typeInto(page, counts, 'Premium 61', { perKey: true });
      assert(await counts.inputValue() === 'Premium 61', `typed counts: ${await counts.inputValue()}`);
      await page.keyboard.press('Enter');
      await page.keyboard.type('Standard 214\nSecond 103\nReject 22', { delay: 5 });
      await page.keyboard.press('Tab');  // "Read the counts"
      await page.keyboard.press('Enter');
      await firstCategory(page, 'Premium');
      // The expected mix by keys: the list takes the first letter typed.
      const model = page.getByRole('combobox', { name: /expected mix/i });
      await model.focus();
      await page.keyboard.type('St');
      await page.waitForFunction(() => JSON.parse(globalThis.tallyproofPage.lastDocument).model.kind === 'shares', null, { timeout: 5000 });
      const values = page.getByRole('textbox', { name: /expected mix values/i });
      await typeInto(page, values, '20, 50, 25, 5', { then: 'Enter' });
      await page.waitForFunction(() => Math.abs(JSON.parse(globalThis.tallyproofPage.lastResult).statistic - 5.7825) < 1e-3, null, { timeout: 5000 });
      const live = await page.getByRole('status').textContent();
      assert(live.length <= 200 && live.includes('χ² = 5.78') && live.includes('df = 3') && live.includes('p = '), `live region: ${live}`);
      const alpha = page.getByRole('textbox', { name: /α/ });
      await typeInto(page, alpha, '0.1', { then: 'Enter' });
      await page.waitForFunction(() => JSON.parse(globalThis.tallyproofPage.lastDocument).alpha === 0.1, null, { timeout: 5000 });
      await typeInto(page, alpha, '2', { then: 'Enter' });  // refused: announced, the field keeps what was typed
      await page.waitForFunction(() => document.getElementById('tp-results').dataset.state === 'error', null, { timeout: 5000 });
      assert((await page.getByRole('status').textContent()).startsWith('Not used:'), 'the refusal is announced');
      assert(await alpha.inputValue() === '2', `the refused α stays in its field: ${await alpha.inputValue()}`);
      await typeInto(page, alpha, '0.05', { then: 'Enter' });
      const goal = page.getByRole('combobox', { name: 'Goal of the test' });
      await goal.focus();
      await page.keyboard.type('Show');
      const margin = page.getByRole('textbox', { name: /Conformity margin w0/ });
      await margin.waitFor({ state: 'visible', timeout: 5000 });
      await typeInto(page, margin, '0.3', { then: 'Enter' });
      await page.waitForFunction(() => JSON.parse(globalThis.tallyproofPage.lastDocument).conformity?.margin_w === 0.3, null, { timeout: 5000 });
      await goal.focus();
      await page.keyboard.type('Find');
      await page.waitForFunction(() => !JSON.parse(globalThis.tallyproofPage.lastResult).conformity, null, { timeout: 5000 });
      const merge = page.getByRole('combobox', { name: /merge rule/i });
      await merge.focus();
      await page.keyboard.type('Until C');
      await page.waitForFunction(() => JSON.parse(globalThis.tallyproofPage.lastDocument).merge.rule === 'cochran', null, { timeout: 5000 });
      const method = page.getByRole('combobox', { name: /p-value method/i });
      await method.focus();
      await page.keyboard.type('Ex');
      await page.waitForFunction(() => JSON.parse(globalThis.tallyproofPage.lastResult).method === 'exact', null, { timeout: 20000 });
      await screenshot(page, 'keys-form-typed');
    });
  },

  async 'form view: Enter and Space press every button'() {
    await withPage({}, async (page) => {
      await openFormView(page);
      const press = async (name, key) => {
        await page.getByRole('button', { name }).focus();
        await page.keyboard.press(key);
      };
      await typeInto(page, page.getByRole('textbox', { name: /counts/i }), threeRegions);
      await press('Read the counts', 'Enter');
      await firstCategory(page, 'North');
      await typeInto(page, page.getByRole('textbox', { name: /counts/i }), 'West\t12\nEast\t30\n');
      await press('Read the counts', 'Space');
      await firstCategory(page, 'West');
      for (const [name, key] of [['Copy the write-up', 'Enter'], ['Copy the table', 'Space']]) {
        await page.evaluate(() => { globalThis.tallyproofPage.lastCopy = null; });
        await press(name, key);
        await page.waitForFunction(() => globalThis.tallyproofPage.lastCopy !== null, null, { timeout: 5000 });
      }
      for (const key of ['Enter', 'Space']) {
        const download = page.waitForEvent('download', { timeout: 5000 });
        await press('Download the analysis file (.json)', key);
        assert((await download).suggestedFilename().endsWith('.json'), 'the analysis file downloads');
        const picker = page.waitForEvent('filechooser', { timeout: 5000 });
        await press('Open a file', key);
        await picker;
      }
      await page.evaluate((t) => navigator.clipboard.writeText(t), threeRegions);
      await press('Paste', 'Space');
      await firstCategory(page, 'North');
      // "They are counts": a question the result asks (percent-like counts summing to 100).
      await typeInto(page, page.getByRole('textbox', { name: /counts/i }), 'A\t40\nB\t60\n');
      await press('Read the counts', 'Enter');
      const answer = page.getByRole('button', { name: 'They are counts' });
      await answer.waitFor({ state: 'visible', timeout: 5000 });
      await press('They are counts', 'Space');
      await answer.waitFor({ state: 'hidden', timeout: 5000 });
      await press('Back to the canvas view', 'Enter');
      await page.waitForFunction(() => !document.body.classList.contains('tp-form-view'), null, { timeout: 3000 });
      await openFormView(page);
      await press('Back to the canvas view', 'Space');
      await page.waitForFunction(() => !document.body.classList.contains('tp-form-view'), null, { timeout: 3000 });
    });
  },

  async 'Escape and Cancel stop a long job, on the canvas and in the form view'() {
    await withPage({}, async (page) => {
      // Canvas: Escape, then the Cancel button.
      await pasteText(page, longJob);
      await running(page, true);
      let t0 = Date.now();
      await page.keyboard.press('Escape');
      await running(page, false);
      const escapeMs = Date.now() - t0;
      let r = await lastResult(page);
      assert(r.monte_carlo?.refusal?.includes('cancelled') && r.method === 'asymptotic', JSON.stringify(r.monte_carlo));
      await pasteText(page, threeRegions);
      await pasteText(page, longJob);
      await running(page, true);
      await clickWidget(page, 'Cancel');
      await running(page, false);
      // Form view: the visible Cancel (Enter), then Escape in a field.
      await openFormView(page);
      const counts = page.getByRole('textbox', { name: /counts/i });
      await typeInto(page, counts, threeRegions);
      await page.getByRole('button', { name: 'Read the counts' }).press('Enter');
      await firstCategory(page, 'North');
      await typeInto(page, counts, longJob);
      await page.keyboard.press('Control+Enter');
      await running(page, true);
      const cancel = page.getByRole('button', { name: /Cancel the calculation/ });
      await cancel.waitFor({ state: 'visible', timeout: 5000 });
      await screenshot(page, 'keys-form-cancel');
      await cancel.focus();
      await page.keyboard.press('Enter');
      await running(page, false);
      assert(await cancel.isHidden(), 'Cancel hides once the job stopped');
      assert(await page.evaluate(() => document.activeElement.id) === 'tp-f-method', 'the focus stays in the form');
      await typeInto(page, counts, threeRegions);
      await page.keyboard.press('Control+Enter');
      await typeInto(page, counts, longJob);
      await page.keyboard.press('Control+Enter');
      await running(page, true);
      t0 = Date.now();
      await page.keyboard.press('Escape');
      await running(page, false);
      r = await lastResult(page);
      assert(r.monte_carlo?.refusal?.includes('cancelled'), `form Escape: ${JSON.stringify(r.monte_carlo)}`);
      console.log(`     Escape stopped the job in ${escapeMs} ms (canvas), ${Date.now() - t0} ms (form view)`);
    });
  },

  async 'Tab walks the canvas: counts table, expected mix, test settings, result views and menus, with a focus frame'() {
    await withPage({ viewport: { width: 1366, height: 768 } }, async (page) => {
      await pasteText(page, threeRegions);
      await firstCategory(page, 'North');
      // From the page's start: the skip link first, then the canvas.
      await page.evaluate(() => document.activeElement.blur());
      await page.focus('#tp-skip');
      assert(await page.evaluate(() => document.activeElement.id) === 'tp-skip', 'the skip link comes first');
      await page.keyboard.press('Tab');
      assert(await page.evaluate(() => document.activeElement.id) === 'canvas', 'then the canvas');
      const names = Object.keys(await page.evaluate(() => globalThis.tallyproofPage.widgets));
      const reached = new Set();
      let frames = 0;
      const total = await page.evaluate(() => Module._tp_control_count());
      assert(total > 20, `the canvas has ${total} controls`);
      for (let i = 0; i < total + 5; i++) {
        const before = await page.evaluate(() => JSON.stringify(globalThis.tallyproofPage.focusRect || null));
        await page.keyboard.press('Tab');
        // Wait until the frame has moved (or the focus left the canvas): a loaded machine draws
        // the next frame later than a fixed pause would allow.
        await page.waitForFunction((b) => JSON.stringify(globalThis.tallyproofPage.focusRect || null) !== b
          || !['canvas', 'tp-ime', 'tp-ime-area'].includes(document.activeElement.id), before, { timeout: 3000 }).catch(() => {});
        const at = await page.evaluate(() => ({ f: globalThis.tallyproofPage.focusRect, w: globalThis.tallyproofPage.widgets, a: document.activeElement.id }));
        if (at.a !== 'canvas' && at.a !== 'tp-ime' && at.a !== 'tp-ime-area') break;  // left the canvas for the page
        if (!at.f) continue;
        frames++;
        for (const n of names) {
          const r = at.w[n];
          if (r && Math.abs(r.x - at.f.x) < 2 && Math.abs(r.y - at.f.y) < 2 && Math.abs(r.w - at.f.w) < 2) reached.add(n);
        }
        if (i === 6) await screenshot(page, 'keys-tab-focus-frame');
      }
      for (const n of ['count 1', 'label 1', 'Expected mix', 'alpha', 'merge rule', 'Examples', 'Save & share', 'Open a file', 'Paste']) {
        assert(reached.has(n), `Tab never reached "${n}" (reached: ${[...reached].join(', ')})`);
      }
      assert(frames > 20, `a focus frame was shown on ${frames} stops`);
      // Past the last control the focus leaves the canvas for the page (no keyboard trap).
      const after = await page.evaluate(() => document.activeElement.id);
      assert(after !== 'canvas', `Tab past the last control stayed on the canvas (${after})`);
      assert(await page.evaluate(() => document.body.classList.contains('tp-form-view')), `the next stop is the form view (${after})`);
      await closeFormView(page);
      // A menu opened from the keyboard: Tab walks its items, Space chooses one.
      await focusCanvas(page);
      await clickWidget(page, 'Examples');
      await page.keyboard.press('Tab');
      await page.keyboard.press('Tab');
      await page.waitForTimeout(60);
      const inMenu = await page.evaluate(() => globalThis.tallyproofPage.focusRect);
      assert(inMenu, 'a menu item has the focus frame');
      await page.keyboard.press('Space');
      await page.waitForFunction(() => JSON.parse(globalThis.tallyproofPage.lastResult).categories?.[0] !== 'North', null, { timeout: 5000 });
    });
  },

  async 'on a phone a tap explains a term until the next tap; tap targets are 44 px; nothing is cut at 360 and 390 px'() {
    for (const width of [360, 390]) {
      await withPage({ viewport: { width, height: 844 }, hasTouch: true, isMobile: true, deviceScaleFactor: 2 }, async (page) => {
        await pasteText(page, threeRegions);
        await firstCategory(page, 'North');
        await page.evaluate(() => { globalThis.tallyproofPage.tooltip = ''; });
        await tapWidget(page, 'verdict statistic');
        await page.waitForTimeout(200);
        const tip = await page.evaluate(() => globalThis.tallyproofPage.tooltip || '');
        assert(tip.includes('df') || tip.includes('χ²'), `tap on the statistic explained: "${tip}"`);
        await screenshot(page, `keys-tap-explain-${width}`);
        // Recent list: Remove buttons at least 44 CSS px.
        await tapWidget(page, 'Save & share');
        await page.waitForFunction(() => !!globalThis.tallyproofPage.widgets['recent-remove-0'], null, { timeout: 5000 });
        const remove = await page.evaluate(() => globalThis.tallyproofPage.widgets['recent-remove-0']);
        console.log(`     ${width} px: Remove ${remove.w.toFixed(0)} x ${remove.h.toFixed(0)} CSS px`);
        assert(remove.h >= 44 && remove.w >= 44, `Remove button ${remove.w} x ${remove.h}`);
        assert(remove.x >= 0 && remove.x + remove.w <= width, 'Remove inside the screen');
        await screenshot(page, `keys-recent-${width}`);
      });
    }
  },

  async 'Groups view on a phone: rows are 44 px tap targets and a tap on a column head explains it'() {
    // Invented readings of 12 readers (the Groups test's own long table shape): reader, digit, count.
    const rows = ['reader,digit,count'];
    ['Anna', 'Ben', 'Cara', 'Dev', 'Eli', 'Fay'].forEach((n, gi) => {
      for (let d = 0; d < 10; d++) rows.push(`${n},${d},${8 + ((gi * 7 + d * 3) % 5)}`);
    });
    for (const width of [360, 390]) {
      await withPage({ viewport: { width, height: 844 }, hasTouch: true, isMobile: true, deviceScaleFactor: 2 }, async (page) => {
        await pasteText(page, rows.join('\n') + '\n');
        await page.waitForFunction(() => !!globalThis.tallyproofPage.widgets['group column'], null, { timeout: 10000 });
        // The table lies below the screen's fold: scrolled into view (a wheel; Playwright has no swipe).
        await page.mouse.move(width / 2, 600);
        for (let i = 0; i < 12 && !(await page.evaluate(() => { const r = globalThis.tallyproofPage.widgets['group row 1']; return r && r.y > 0 && r.y + r.h < 800; })); i++) {
          await page.mouse.wheel(0, 250);
          await page.waitForTimeout(120);
        }
        const r = await page.evaluate(() => globalThis.tallyproofPage.widgets['group row 1']);
        console.log(`     ${width} px: Groups row ${r.w.toFixed(0)} x ${r.h.toFixed(0)} CSS px`);
        assert(r.h >= 44, `a Groups table row is ${r.h} px tall`);
        const heads = await page.evaluate(() => Object.keys(globalThis.tallyproofPage.widgets).filter((n) => n.startsWith('group head ')));
        assert(heads.length > 0, 'the Groups table heads are marked');
        const head = heads.find((h) => / p$| df$| w$/.test(h)) || heads[0];
        await page.evaluate(() => { globalThis.tallyproofPage.tooltip = ''; });
        await tapWidget(page, head);
        await page.waitForTimeout(200);
        const tip = await page.evaluate(() => globalThis.tallyproofPage.tooltip || '');
        assert(tip.length > 10, `tap on "${head}" explained: "${tip}"`);
        await screenshot(page, `keys-groups-tap-${width}`);
      });
    }
  },

  async 'nothing is clipped mid-word or mid-number at 360 and 390 px: every result view and the Groups view'() {
    // The page draws on a canvas, so "clipped" is measured from what it draws: the clip audit
    // (web/clip_audit.cpp) counts glyphs that reach past the rectangle they are drawn in, where
    // no window they sit in scrolls that way. Checked at a phone's height and at a tall one, so
    // the whole of each view is laid out on screen once.
    const ages = 'Age 18 to 24\t131\nAge 25 to 44\t402\nAge 45 to 64\t355\n65 and over\t212\n';
    const rows = ['reader,digit,count'];
    ['Anna', 'Ben', 'Cara', 'Dev', 'Eli', 'Fay'].forEach((n, gi) => {
      for (let d = 0; d < 10; d++) rows.push(`${n},${d},${8 + ((gi * 7 + d * 3) % 5)}`);
    });
    const audit = async (page, where) => {
      await page.waitForTimeout(250);
      await page.evaluate(() => { globalThis.tallyproofPage.clipped = null; Module._tp_clip_audit(); });
      await page.waitForFunction(() => globalThis.tallyproofPage.clipped, null, { timeout: 5000 });
      const c = await page.evaluate(() => globalThis.tallyproofPage.clipped);
      assert(c.glyphs > 200, `${where}: the audit saw ${c.glyphs} glyphs`);
      assert(c.cut === 0, `${where}: ${c.cut} glyphs cut, in ${c.windows.join(', ')}: ${JSON.stringify(c.samples.slice(0, 3))}`);
      // Only a wide table may scroll sideways (its first column stays put); a panel that scrolls
      // sideways hides the end of its lines as surely as a cut does. The audit sees through
      // scrolling, so this is checked apart.
      const panels = c.sideways.filter((w) => !/\/(diagnostics|counts|groups)_[0-9A-F]+$/.test(w));
      assert(panels.length === 0, `${where}: scrolls sideways: ${panels.join(', ')}`);
      return c.glyphs;
    };
    for (const width of [360, 390]) {
      for (const height of [844, 2400]) {
        await withPage({ viewport: { width, height }, hasTouch: true, isMobile: true, deviceScaleFactor: 2 }, async (page) => {
          await pasteText(page, ages);
          await firstCategory(page, 'Age 18 to 24');
          let seen = await audit(page, `${width}x${height} Curve`);
          for (const tab of ['Bars', 'Where it differs', 'Planning', 'Write-up']) {
            await tapWidget(page, tab);
            seen += await audit(page, `${width}x${height} ${tab}`);
          }
          await pasteText(page, rows.join('\n') + '\n');
          await page.waitForFunction(() => !!globalThis.tallyproofPage.widgets['group column'], null, { timeout: 10000 });
          seen += await audit(page, `${width}x${height} Groups`);
          if (height === 2400) await screenshot(page, `keys-clip-groups-${width}`);
          console.log(`     ${width}x${height}: ${seen} glyphs over six views, none cut`);
        });
      }
    }
  },
};
