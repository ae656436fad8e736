// Completion as a user meets it: the suggestion list opens by itself while a key is typed (no
// Ctrl+Space), and offers only the keys that apply to the output's shape. The keys the schema
// ties to a shape are checked against shared-schema/src/wave-schema.ts (appliesTo) in the unit
// tier; here the editor must show them, or not, on a real keystroke.

import fs from 'node:fs';
import path from 'node:path';
import { expect } from './checks.mjs';
import { activeEditor, goTo, openFile, plain, runCommand, until } from './workbench.mjs';

const WAVE = 'bench-rig.wave.yaml';

/** Types `word` on a new line after the demo's line holding `needle`, and returns the labels the list opens with. */
async function suggestionsAfter(page, lines, needle, word) {
  const line = lines.findIndex((l) => l.includes(needle)) + 1;
  expect(line > 0, `the demo has no line "${needle}"`);
  await goTo(page, line, lines[line - 1].length + 1);
  // Enter keeps the entry's indentation (language-configuration.json); then a key typed as a user types it.
  await page.keyboard.press('Enter');
  await page.keyboard.type(word, { delay: 80 });
  const widget = activeEditor(page).locator('.suggest-widget.visible');
  return until(page, async () => {
    if (!(await widget.isVisible())) return null;
    const rows = await widget.locator('.monaco-list-row').evaluateAll((els) => els.map((e) => e.getAttribute('aria-label') ?? ''));
    return rows.length > 0 ? rows.map((r) => plain(r)) : null;
  }, `the suggestion list to open after typing "${word}"`);
}

async function discard(page) {
  await page.keyboard.press('Escape');
  await runCommand(page, 'File: Revert File');
}

export async function typingChecks({ checks, page, state }) {
  await checks.run('completion: the list opens while a key is typed, with only the keys of the output\'s shape', async () => {
    // The earlier checks leave the report preview beside the spec: start from one editor group.
    await runCommand(page, 'View: Close All Editor Groups');
    await openFile(page, WAVE);
    const lines = fs.readFileSync(path.join(state.workspace, WAVE), 'utf8').split('\n');
    // A square (sample-clock, whose duty is written): `duty-tolerance` is its key.
    const square = await suggestionsAfter(page, lines, 'tolerance: 20 ppm', 'du');
    await discard(page);
    expect(square.some((r) => r.startsWith('duty-tolerance')), `under a square "du" offers ${square.join(', ')}`);
    // A sine (chopper-ref): no duty of any kind, and its own `harmonics`.
    const sine = await suggestionsAfter(page, lines, 'jitter: allow', 'd');
    await discard(page);
    expect(sine.some((r) => r.startsWith('description')), `under a sine "d" offers ${sine.join(', ')}`);
    expect(!sine.some((r) => r.startsWith('duty')), `under a sine "d" offers a duty key: ${sine.join(', ')}`);
    return `square "du": ${square.length} item(s); sine "d": ${sine.map((r) => r.split(/[ ,]/)[0]).join(', ')}`;
  }, { needs: ['editor: the workbench opens the demo workspace'] });
}
