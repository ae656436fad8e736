// What a user of the demo sees, checked in order through the page. Expectations come from outside
// the editor: the headless checker's JSON (the same bundle, run as a CLI) for what must be flagged,
// and fraction.js for the exact frequency of the demo's hand-pinned plan (see demo.mjs).

import fs from 'node:fs';
import path from 'node:path';
import { expect } from './checks.mjs';
import { checkerReport } from './checker.mjs';
import { pinnedOutput, shownHertz } from './demo.mjs';
import { activeEditor, goTo, lineWith, openFile, plain, runCommand, save, tokenColour, until, waitForWorkbench } from './workbench.mjs';

const WAVE = 'bench-rig.wave.yaml';
const CLOCK = 'bench-rig.clock.yaml';
const DOCS = path.resolve(path.dirname(new URL(import.meta.url).pathname), '../../docs');

async function statusProblems(page) {
  const label = await page.locator('[id="status.problems"]').first().getAttribute('aria-label');
  const count = (word) => Number(new RegExp(`${word}: (\\d+)`).exec(label ?? '')?.[1] ?? 0);
  return { label: label ?? '', errors: count('Errors'), warnings: count('Warnings') };
}

async function shoot(page, shots, name, copyTo) {
  const file = path.join(shots, `${name}.png`);
  await page.screenshot({ path: file });
  if (copyTo) {
    fs.mkdirSync(DOCS, { recursive: true });
    fs.copyFileSync(file, path.join(DOCS, copyTo));
  }
}

/** The editor's counts settle on the checker's: same findings, same severities. */
async function problemsMatch(page, want, what) {
  return until(page, async () => {
    const p = await statusProblems(page);
    return p.errors === want.errors && p.warnings === want.warnings ? p : null;
  }, `${what}: Problems to show ${want.errors} errors and ${want.warnings} warnings`, 30_000);
}

/** The annotation (inlay hint) text of an output's line, once the server has sent it. */
async function annotationOf(page, output) {
  return until(page, async () => {
    const t = plain(await lineWith(page, `${output}:`).textContent());
    return t.includes('÷') ? t : null;
  }, `an annotation on the ${output} line`, 30_000);
}

export async function editorChecks({ checks, page, url, shots, state }) {
  const OPEN = 'editor: the workbench opens the demo workspace';
  await checks.run(OPEN, async () => {
    expect(url, 'the editor did not start');
    await page.goto(url);
    await waitForWorkbench(page);
  });

  const LANG = 'language: *.wave.yaml and *.clock.yaml open in their own languages';
  await checks.run(LANG, async () => {
    const mode = page.locator('[id="status.editor.mode"]');
    await openFile(page, CLOCK);
    await until(page, async () => plain(await mode.textContent()) === 'waveplan clock spec', 'language "waveplan clock spec"');
    await openFile(page, WAVE);
    await until(page, async () => plain(await mode.textContent()) === 'waveplan wave spec', 'language "waveplan wave spec"');
  }, { needs: [OPEN] });

  await checks.run('grammar: quantities and shape words are coloured apart from plain YAML strings', async () => {
    // Without the grammar's injection YAML colours `3.3 V` as one plain string, like the description.
    await openFile(page, CLOCK);
    const clockNumber = await until(page, () => tokenColour(page, 'full-scale:', '3.3'), 'a quantity in the clock file');
    const clockPlain = await tokenColour(page, 'description:', 'Bench rig');
    expect(clockNumber !== clockPlain, `"3.3" in the clock file has the plain string colour ${clockPlain}`);
    await openFile(page, WAVE);
    const stringColour = await tokenColour(page, 'clock: ./', './');
    const numberColour = await until(page, () => tokenColour(page, 'tolerance: ', 'ppm'), 'the quantity token');
    const shapeColour = await tokenColour(page, 'shape: sine', 'sine');
    expect(stringColour, 'no token for the clock path');
    expect(numberColour !== stringColour, `"ppm" has the plain string colour ${stringColour}`);
    expect(shapeColour !== stringColour, `"sine" has the plain string colour ${stringColour}`);
    return `string ${stringColour}, quantity ${numberColour}, shape ${shapeColour}`;
  }, { needs: [LANG] });

  let expected;
  const DIAG = 'diagnostics: squiggles and the Problems count match the headless checker';
  await checks.run(DIAG, async () => {
    expected = checkerReport(state);
    // The demo's header promises findings of both severities (examples/bench-rig.wave.yaml).
    expect(expected.errors >= 1 && expected.warnings >= 1, `the checker found ${expected.errors} errors, ${expected.warnings} warnings; the demo promises both`);
    const seen = await problemsMatch(page, expected, 'on opening');
    for (const severity of ['error', 'warning']) {
      const d = expected.diagnostics.find((x) => x.file === WAVE && x.severity === severity);
      if (!d) continue;
      await goTo(page, d.line, d.column);
      await activeEditor(page).locator(`.squiggly-${severity}`).first().waitFor();
    }
    await page.keyboard.press('Control+Shift+M');
    await page.locator('.markers-panel .monaco-list-row').first().waitFor();
    const panel = plain(await page.locator('.markers-panel').textContent());
    // Each row shows its source and stable code (waveplan(code); the brackets are drawn apart), whatever the wording.
    const codes = [...new Set(expected.diagnostics.map((d) => d.code))];
    const absent = codes.filter((c) => !panel.includes(`waveplan${c}`) && !panel.includes(`waveplan(${c})`));
    expect(absent.length === 0, `the Problems panel lacks ${absent.join(', ')}: "${panel.slice(0, 500)}"`);
    await page.keyboard.press('Control+Shift+M'); // close it again; it covers the editor
    return seen.label;
  }, { needs: [LANG] });

  await checks.run('status bar: the out-of-tolerance count matches the checker', async () => {
    const want = expected.outOfTolerance;
    const item = page.locator('.statusbar-item', { hasText: 'waveplan' }).first();
    return until(page, async () => {
      const t = plain(await item.textContent());
      const ok = want === 0 ? t === 'waveplan' : t.includes(`waveplan: ${want} output${want === 1 ? '' : 's'} out of tolerance`);
      return ok ? `"${t}"` : null;
    }, `the status bar to count ${want} out of tolerance`);
  }, { needs: [DIAG] });

  let pinned;
  await checks.run('annotations: the pinned output shows f_sys·M/(D·N) and its divider', async () => {
    pinned = pinnedOutput(state.workspace, WAVE);
    // Oracle: fraction.js, f_out = f_sys · M / (D · N) (docs/DESIGN.md "Quantities"; derived).
    const line = expected.diagnostics.find((d) => d.output === pinned.name)?.line;
    if (line) await goTo(page, line);
    const text = await annotationOf(page, pinned.name);
    const shown = shownHertz(text);
    const want = pinned.achievedHz.valueOf();
    expect(shown, `no frequency in "${text}"`);
    expect(Math.abs(shown.hz - want) <= want * 5e-6, `shows ${shown.hz} Hz, fraction.js gives ${pinned.achievedHz.toFraction()} Hz: "${text}"`);
    expect(text.includes(`÷${pinned.divider}`), `does not show the pinned divider ÷${pinned.divider}: "${text}"`);
    // An integer divider holds no fractional jitter (docs/DESIGN.md "Quantities": a plan is jitter-free when F = 0).
    expect(!/jitter/.test(text), `an integer divider shown with jitter: "${text}"`);
    return `${pinned.name}: "${text}"`;
  }, { needs: [DIAG] });

  await checks.run('annotations: every output line carries the checker\'s achieved frequency and divider', async () => {
    await goTo(page, 1);
    const first = expected.outputs.find((o) => o.plan);
    expect(first, 'the checker planned no output');
    const text = await annotationOf(page, first.name);
    const shown = shownHertz(text);
    expect(shown && Math.abs(shown.hz - first.plan.achievedHz) <= first.plan.achievedHz * 5e-6, `${first.name}: "${text}" vs checker ${first.plan.achievedHzExact} Hz`);
    expect(text.includes(`÷${first.plan.dividerInteger}`), `${first.name}: "${text}" lacks ÷${first.plan.dividerInteger}`);
    await shoot(page, shots, 'annotations', 'annotations.png');
    return `${first.name}: "${text}"`;
  }, { needs: [DIAG] });

  await checks.run('hover: the summary and the waveform picture open the card, every picture renders', async () => {
    const name = expected.outputs.find((o) => o.plan)?.name ?? '';
    const token = lineWith(page, `${name}:`).locator('span > span', { hasText: name }).first();
    const hover = page.locator('.monaco-hover:not(.hidden)').first();
    await until(page, async () => {
      await token.hover({ position: { x: 12, y: 6 } });
      return (await hover.locator('img').count()) > 0;
    }, 'a hover with an image');
    const sizes = await until(page, () => hover.locator('img').evaluateAll((imgs) => {
      const done = imgs.every((i) => i.complete && i.naturalWidth > 0);
      return done ? imgs.map((i) => `${i.naturalWidth}×${i.naturalHeight}`) : null;
    }), 'every hover image to load');
    // The card opens with its one-line summary and the waveform picture: the picture's top edge
    // lies within the hover's first 250 px, before any table (measured in the rendered hover).
    const firstTop = await hover.evaluate((box) => {
      const img = box.querySelector('img');
      return img ? img.getBoundingClientRect().top - box.getBoundingClientRect().top : Infinity;
    });
    expect(firstTop <= 250, `the first picture starts ${firstTop} px into the hover`);
    const beforeTable = await hover.evaluate((box) => {
      const img = box.querySelector('img');
      const table = box.querySelector('table');
      return !!img && (!table || !!(img.compareDocumentPosition(table) & Node.DOCUMENT_POSITION_FOLLOWING));
    });
    expect(beforeTable, 'the first picture comes before the plan table');
    // The hover scrolls inside itself; bring the first picture into view for the screenshot.
    await hover.locator('img').first().scrollIntoViewIfNeeded();
    await shoot(page, shots, 'hover', 'hover.png');
    await page.keyboard.press('Escape');
    return `${sizes.length} image(s): ${sizes.join(', ')}; the first ${Math.round(firstTop)} px into the hover`;
  }, { needs: [DIAG] });

  // Out of tolerance is the headline error; a pinned plan's finding is the other kind of fix.
  const fixTargets = [
    ['the out-of-tolerance error', (report) => report.diagnostics.find((d) => d.file === WAVE && d.code === 'out-of-tolerance')],
    ['the pinned output\'s finding', (report) => report.diagnostics.find((d) => d.file === WAVE && d.output === pinnedOutput(state.workspace, WAVE).name)],
  ];
  for (const [what, pick] of fixTargets) {
    await checks.run(`quick fix: the first fix for ${what} edits the file and the finding is gone after save`, async () => {
      const target = pick(checkerReport(state));
      expect(target, `the demo has no ${what}`);
      return applyFirstFix(page, state, target);
    }, { needs: [DIAG] });
  }

  await checks.run('commands: "waveplan: Show plan report" opens the markdown preview', async () => {
    await openFile(page, WAVE);
    await runCommand(page, 'waveplan: Show plan report');
    await page.locator('.tab[aria-label*="plan.md"]').first().waitFor({ timeout: 20_000 });
    const first = expected.outputs[0]?.name ?? '';
    const text = await until(page, async () => {
      for (const frame of page.frames()) {
        const body = await frame.evaluate(() => document.body?.innerText ?? '').catch(() => '');
        if (body.includes('Plan report') && body.includes(first)) return body;
      }
      return null;
    }, 'the report text in the preview');
    await shoot(page, shots, 'plan-report');
    return `${text.length} characters`;
  }, { needs: [DIAG] });
}

/** Ctrl+. on the finding (up to three tries, test/e2e/README.md), Enter on the first fix, save, then ask the checker. */
async function applyFirstFix(page, state, target) {
  const file = path.join(state.workspace, WAVE);
  const before = fs.readFileSync(file, 'utf8');
  await goTo(page, target.line, target.column);
  const menu = page.locator('.action-widget .monaco-list-row.action');
  let attempts = 0;
  await until(page, async () => {
    if (++attempts > 3) throw new Error('Ctrl+. opened no quick-fix menu in 3 tries');
    await page.keyboard.press('Control+.');
    try {
      await menu.first().waitFor({ timeout: 4_000 });
      return true;
    } catch {
      await page.keyboard.press('Escape');
      return false;
    }
  }, 'the quick-fix menu (Ctrl+.)', 20_000);
  const title = plain(await menu.first().textContent());
  await page.keyboard.press('Enter');
  await page.locator('.tab.active.dirty').waitFor();
  await save(page);
  expect(fs.readFileSync(file, 'utf8') !== before, 'the saved file did not change');
  const now = checkerReport(state);
  const still = now.diagnostics.find((d) => d.file === WAVE && d.code === target.code && d.output === target.output);
  expect(!still, `"${title}" was applied, yet the checker still reports ${target.code} on ${target.output}: ${still?.message}`);
  const seen = await problemsMatch(page, now, 'after the fix');
  return `${target.code} on ${target.output}: "${title}" → ${seen.label}`;
}
