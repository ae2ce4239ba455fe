// Entering data as a person does, and only so: real key presses and typing (page.keyboard), the
// clipboard with permission granted and Ctrl+V (or ⌘V), the file picker (setInputFiles), mouse
// clicks and touchscreen taps. Tests read the page's state through page.evaluate; they never
// enter data through it (no dispatchEvent, no fill(), no value set by script).

// Puts `text` on the clipboard (the harness grants clipboard-read and clipboard-write) and
// presses `key` with the focus on `focus`: 'canvas' (the default: the canvas is focused by a
// click on the page's title bar area first if it does not have the focus), 'body' (nothing
// focused), or 'keep' (wherever the focus is: a text box pastes into itself). Waits until the
// page has seen the paste.
export async function pasteText(page, text, { key = 'Control+V', focus = 'canvas' } = {}) {
  await page.evaluate((t) => navigator.clipboard.writeText(t), text);
  if (focus === 'canvas') await focusCanvas(page);
  if (focus === 'body') await page.evaluate(() => { if (document.activeElement) document.activeElement.blur(); });
  const before = await page.evaluate(() => globalThis.tallyproofPage.pasteEvents || 0);
  await page.keyboard.press(key);
  await page.waitForFunction((n) => (globalThis.tallyproofPage.pasteEvents || 0) > n, before, { timeout: 5000 });
  await page.waitForTimeout(30);
}

// Gives the canvas the keyboard focus the way a person does: a click on the canvas where no
// control is (the title bar's empty middle), unless it already has the focus.
export async function focusCanvas(page) {
  if (await page.evaluate(() => document.activeElement === document.getElementById('canvas'))) return;
  const spot = await page.evaluate(() => {
    const w = globalThis.tallyproofPage.widgets;
    const first = w['Open a file'];
    // Just under the title bar, at its left edge: the window's own padding, never a control.
    return first ? { x: 3, y: Math.max(3, first.y - 6) } : { x: 3, y: 3 };
  });
  await page.mouse.click(spot.x, spot.y);
  await page.waitForFunction(() => document.activeElement === document.getElementById('canvas'), null, { timeout: 3000 });
}

// Clicks a text box of the page (a Playwright locator), selects what it holds and types `text`
// over it: short text key by key, longer text as one insertion (what an input method or a
// dictation tool sends). `then` is pressed afterwards (for example 'Enter' or 'Tab').
export async function typeInto(page, locator, text, { then = null, perKey = text.length <= 40 } = {}) {
  await locator.click();
  await page.keyboard.press('Control+A');
  await page.keyboard.press('Backspace');
  if (perKey && !text.includes('\n')) await page.keyboard.type(text, { delay: 10 });
  else await page.keyboard.insertText(text);
  if (then) await page.keyboard.press(then);
}

// Opens a file through the page's own file picker (what "Open a file" shows).
export async function chooseFile(page, name, bytes, mimeType = 'text/plain') {
  await page.setInputFiles('#tp-file', { name, mimeType, buffer: Buffer.from(bytes) });
}

// A finger's tap at the centre of the canvas control the page recorded under `name`.
export async function tapWidget(page, name) {
  await page.waitForFunction((n) => !!globalThis.tallyproofPage.widgets[n], name, { timeout: 5000 });
  const r = await page.evaluate((n) => globalThis.tallyproofPage.widgets[n], name);
  await page.touchscreen.tap(r.x + r.w / 2, r.y + r.h / 2);
  await page.waitForTimeout(150);
}

// The form view, opened as a keyboard user does: the skip link ("Form view: ...") and Enter.
export async function openFormView(page) {
  await page.focus('#tp-skip');
  await page.keyboard.press('Enter');
  await page.waitForFunction(() => document.body.classList.contains('tp-form-view'), null, { timeout: 3000 });
}
// Back to the canvas: the form's own button, pressed with Enter.
export async function closeFormView(page) {
  await page.focus('#tp-f-close');
  await page.keyboard.press('Enter');
  try {
    await page.waitForFunction(() => !document.body.classList.contains('tp-form-view'), null, { timeout: 3000 });
  } catch (e) {
    const why = await page.evaluate(() => ({ body: document.body.className, active: document.activeElement && (document.activeElement.id || document.activeElement.tagName),
      state: document.getElementById('tp-results').dataset.state, live: document.getElementById('tp-live')?.textContent }));
    throw new Error(`the form view stayed open: ${JSON.stringify(why)}`);
  }
}
