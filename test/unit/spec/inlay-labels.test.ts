// Annotation labels within VS Code's inlay-hint length: `editor.inlayHints.maximumLength` is 43
// characters by default (from memory; VS Code cuts a longer label and shows "…"). Every output of
// every spec in the repository — the demo, the fixtures, the protocol corpus, the export fixtures —
// gets a label that fits, holding the frequency and error always and whatever else fits in order
// of importance; the tooltip holds every part, so nothing is lost.

import { readFileSync, readdirSync } from 'node:fs';
import { join, relative } from 'node:path';
import { TextDocument } from 'vscode-languageserver-textdocument';
import { describe, expect, it } from 'vitest';
import { fitLabel, inlayHints, LABEL_LIMIT } from '../../../server/src/lsp/inlay-hints';
import { analyze } from '../../../server/src/spec/analyze';
import { diskHost } from './fixture-host';

const ROOT = join(__dirname, '..', '..', '..');
const SEPARATOR = ' · ';

function specs(dir: string): string[] {
  return readdirSync(dir, { withFileTypes: true }).flatMap((e) => {
    const p = join(dir, e.name);
    return e.isDirectory() ? specs(p) : p.endsWith('.wave.yaml') ? [p] : [];
  });
}

const files = [...specs(join(ROOT, 'examples')), ...specs(join(ROOT, 'test'))].sort();
const everything = { start: { line: 0, character: 0 }, end: { line: 1e6, character: 0 } };

const hints = files.flatMap((file) => {
  const text = readFileSync(file, 'utf8');
  const analysis = analyze(file, text, diskHost);
  const doc = TextDocument.create(`file://${file}`, 'yaml', 1, text);
  return inlayHints(doc, analysis, everything).map((hint) => ({ file: relative(ROOT, file), hint }));
});

describe('annotation labels fit the inlay-hint length', () => {
  it('covers a corpus with fractional plans, steps, clock shares and bad seams', () => {
    expect(files.length).toBeGreaterThan(40);
    expect(hints.length).toBeGreaterThan(100);
    const tips = hints.map((h) => h.hint.tooltip as string);
    expect(tips.filter((t) => t.includes('jitter ')).length).toBeGreaterThan(5);
    expect(tips.filter((t) => t.includes(' steps, worst ')).length).toBeGreaterThan(0);
    expect(tips.filter((t) => t.includes("with the clock's ±")).length).toBeGreaterThan(0);
    expect(tips.filter((t) => t.includes('seam jump ')).length).toBeGreaterThan(0);
  });

  it.each(hints.map((h) => [`${h.file} ${h.hint.label as string}`, h] as const))('%s', (_, { hint }) => {
    const label = hint.label as string;
    const tooltip = hint.tooltip as string;
    const full = tooltip.slice(tooltip.indexOf(' — ') + ' — '.length);
    const mark = /^[✗⚠] /.exec(full)?.[0] ?? '';
    expect(label.startsWith(mark)).toBe(true);
    const all = full.slice(mark.length).split(SEPARATOR);
    const shown = label.slice(mark.length).replace(/ …$/, '').split(SEPARATOR);
    // Frequency and error always; beyond them only what fits.
    expect(shown.slice(0, 2)).toEqual(all.slice(0, 2));
    if (shown.length > 2 || all.length <= 2) expect(label.length, label).toBeLessThanOrEqual(LABEL_LIMIT);
    // The parts shown are the tooltip's, in its order; "…" exactly when one is left out.
    let at = 0;
    for (const part of shown) {
      at = all.indexOf(part, at);
      expect(at, `${part} in ${full}`).toBeGreaterThanOrEqual(0);
    }
    expect(label.endsWith(' …')).toBe(shown.length < all.length);
  });
});

describe('fitLabel', () => {
  // derived: the parts' lengths add up by hand, with " · " (3) between parts and " …" (2) at the end.
  const parts = [
    { text: '≈1.5 MHz', rank: 0 }, // 8
    { text: '+2.44 ppm', rank: 0 }, // 9
    { text: '÷2+5461/65536', rank: 3 }, // 13
    { text: 'jitter 2.76 ns', rank: 2 }, // 14
    { text: 'seam ok', rank: 4 }, // 7
  ];
  it('keeps every part when all fit', () => {
    expect(fitLabel(parts, 100)).toBe('≈1.5 MHz · +2.44 ppm · ÷2+5461/65536 · jitter 2.76 ns · seam ok'); // 63
  });
  it('drops the lowest-ranked parts first and marks the cut', () => {
    expect(fitLabel(parts, 41)).toBe('≈1.5 MHz · +2.44 ppm · jitter 2.76 ns …'); // 8+3+9+3+14+2 = 39
    // seam ok (rank 4) still fits after the divider (rank 3) did not: 39 + 3 + 7 = 49 > 41, so no.
    expect(fitLabel(parts, 49)).toBe('≈1.5 MHz · +2.44 ppm · jitter 2.76 ns · seam ok …');
  });
  it('never drops the frequency or the error', () => {
    expect(fitLabel(parts, 5)).toBe('≈1.5 MHz · +2.44 ppm …');
  });
});
