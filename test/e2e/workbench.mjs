// Page-level moves in the browser-hosted editor. Every step waits on a condition in the page
// (an element, a text, an attribute); none waits a fixed time. Selectors are those that held in
// VS Code 1.139, recorded in test/e2e/README.md ("How the editor is driven").

/** Inlay hints and some labels render spaces as U+00A0; compare text with them normalised. */
export function plain(text) {
  return (text ?? '').replace(/\u00a0/g, ' ').replace(/\s+/g, ' ').trim();
}

export async function waitForWorkbench(page) {
  await page.waitForSelector('.monaco-workbench', { timeout: 60_000 });
  await page.waitForSelector('.explorer-folders-view .monaco-list-row', { timeout: 60_000 });
}

/** Opens a workspace file through Quick Open and waits for its tab and its first line. */
export async function openFile(page, name) {
  const tab = page.locator(`.tab[aria-label*="${name}"]`);
  if ((await tab.count()) > 0) {
    await tab.first().click();
  } else {
    await page.locator('.monaco-workbench').click({ position: { x: 5, y: 5 } }).catch(() => undefined);
    await page.keyboard.press('Control+P');
    const input = page.locator('.quick-input-widget input');
    await input.waitFor({ state: 'visible' });
    await input.fill(name);
    await page.locator(`.quick-input-widget .monaco-list-row[aria-label*="${name}"]`).first().waitFor();
    await page.keyboard.press('Enter');
  }
  await page.locator(`.tab.active[aria-label*="${name}"]`).waitFor({ timeout: 20_000 });
  await activeEditor(page).locator('.view-line').first().waitFor();
}

export function activeEditor(page) {
  return page.locator('.editor-group-container.active .monaco-editor').first();
}

/** The rendered line whose text contains `needle` (scrolling is left to the caller; demo files fit). */
export function lineWith(page, needle) {
  return activeEditor(page).locator('.view-line', { hasText: needle }).first();
}

/** Waits until `probe()` returns a truthy value and returns it; polls the page, never sleeps blindly. */
export async function until(page, probe, what, timeoutMs = 20_000) {
  const deadline = Date.now() + timeoutMs;
  let last;
  while (Date.now() < deadline) {
    try {
      last = await probe();
      if (last) return last;
    } catch (error) {
      last = error;
    }
    await page.waitForTimeout(100); // the polling interval; the condition is what ends the wait
  }
  throw new Error(`timed out after ${timeoutMs} ms waiting for ${what}${last instanceof Error ? ` (${last.message})` : ''}`);
}

/** Runs a palette command by its title. */
export async function runCommand(page, title) {
  await page.keyboard.press('Control+Shift+P');
  const input = page.locator('.quick-input-widget input');
  await input.waitFor({ state: 'visible' });
  await input.fill(`>${title}`);
  await page.locator('.quick-input-widget .monaco-list-row', { hasText: title }).first().waitFor();
  await page.keyboard.press('Enter');
  await input.waitFor({ state: 'hidden' });
}

/** The computed text colour of the first rendered token containing `text` on a line with `lineNeedle`. */
export async function tokenColour(page, lineNeedle, text) {
  const line = lineWith(page, lineNeedle);
  await line.waitFor();
  return line.evaluate((el, t) => {
    for (const span of el.querySelectorAll('span > span')) {
      if (span.textContent.replace(/\u00a0/g, ' ').includes(t)) return getComputedStyle(span).color;
    }
    return null;
  }, text);
}

export async function save(page) {
  await page.keyboard.press('Control+S');
  await page.locator('.tab.active.dirty').waitFor({ state: 'detached', timeout: 10_000 });
}

/** Moves the caret to a 1-based line and column with Go to Line (Ctrl+G), which also scrolls there. */
export async function goTo(page, line, column = 1) {
  const input = page.locator('.quick-input-widget input');
  // A quick input still closing would swallow the keys meant for Go to Line, and Enter would land
  // in the text; so start from none, and type only once the box is in Go to Line mode (":").
  await input.waitFor({ state: 'hidden' });
  await until(page, async () => {
    // A click inside the text gives the editor the keyboard (a panel or hover may hold it).
    await activeEditor(page).click({ position: { x: 200, y: 12 } });
    await page.keyboard.press('Control+G');
    try {
      await until(page, async () => (await input.isVisible()) && (await input.inputValue()).startsWith(':'), 'Go to Line', 3_000);
      return true;
    } catch {
      await page.keyboard.press('Escape');
      return false;
    }
  }, 'the Go to Line box', 15_000);
  await input.fill(`:${line}:${column}`);
  await page.locator('.quick-input-widget .monaco-list-row', { hasText: `${line}` }).first().waitFor();
  await page.keyboard.press('Enter');
  await input.waitFor({ state: 'hidden' });
  await until(page, async () => plain(await page.locator('[id="status.editor.selection"]').textContent()).startsWith(`Ln ${line},`), `the caret on line ${line}`);
}
