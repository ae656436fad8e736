// The outline (server/src/lsp/symbols.ts) over every fixture and example, on LF, CR LF and lone-CR
// versions of each: every output entry is listed, broken ones included, each selection range lies
// inside its range (VS Code drops the whole outline otherwise, DEVELOPERS.md "Toolchain notes"), and
// the three versions give the same outline. Positions are counted as LSP counts them (LSP 3.17,
// "Position": CR LF, CR and LF each end a line), with vscode-languageserver-textdocument, the
// general-purpose implementation of those rules, as the oracle for where a range lies in the text.

import { readFileSync } from 'node:fs';
import { join } from 'node:path';
import { TextDocument } from 'vscode-languageserver-textdocument';
import { describe, expect, it } from 'vitest';
import { analyze } from '../../../server/src/spec/analyze';
import { syntaxOf } from '../../../server/src/spec/syntax';
import type { SpecHost } from '../../../server/src/spec/types';
import { clockSymbols, waveSymbols } from '../../../server/src/lsp/symbols';
import { VERDICT_WORDS } from '../../../server/src/lsp/plan-card';
import { FIXTURES, diskHost } from '../spec/fixture-host';
import { BREAKS, outputNamesByLine, specFiles, withBreaks } from '../../support/outline';

const ROOT = join(__dirname, '..', '..', '..');

type DocumentSymbol = ReturnType<typeof waveSymbols>[number];
const key = (p: DocumentSymbol['range']['start']) => p.line * 1e6 + p.character;

function outline(file: string, text: string, host: SpecHost = diskHost): { symbols: DocumentSymbol[]; doc: TextDocument } {
  const analysis = analyze(file, text, host);
  const doc = TextDocument.create(`file://${file}`, 'yaml', 1, text);
  const tree = syntaxOf(analysis);
  return { doc, symbols: analysis.kind === 'wave' ? waveSymbols(doc, analysis, tree) : clockSymbols(doc, analysis, tree) };
}

const STATES = [...Object.values(VERDICT_WORDS), 'not read: ', 'no plan: ', 'not planned yet'];

describe('the outline', () => {
  const files = [...specFiles(FIXTURES), ...specFiles(join(ROOT, 'examples'))];

  it(`lists every output of every fixture and example on LF, CR LF and lone CR, selections inside ranges`, () => {
    // Enough files that every kind of fixture is met (one per diagnostic code, the boards, the demo).
    expect(files.length).toBeGreaterThanOrEqual(60);
    let checked = 0;
    let broken = 0;
    for (const file of files) {
      const lf = withBreaks(readFileSync(file, 'utf8'), 'lf');
      const reference = outline(file, lf).symbols;
      for (const b of Object.keys(BREAKS) as (keyof typeof BREAKS)[]) {
        const text = withBreaks(lf, b);
        const { symbols, doc } = outline(file, text);
        const where = `${file} ${b}`;
        for (const s of symbols) {
          expect(key(s.selectionRange.start), `${where} ${s.name}`).toBeGreaterThanOrEqual(key(s.range.start));
          expect(key(s.selectionRange.end), `${where} ${s.name}`).toBeLessThanOrEqual(key(s.range.end));
          // The ranges lie in the text, and the selection is the name as written.
          expect(doc.offsetAt(s.range.end), where).toBeLessThanOrEqual(text.length);
          expect(doc.getText(s.selectionRange), where).toBe(s.name);
        }
        // A line ending changes no position and no word of the outline.
        expect(symbols, where).toStrictEqual(reference);
        if (file.endsWith('.wave.yaml')) {
          expect(symbols.map((s) => s.name), where).toStrictEqual(outputNamesByLine(text));
          for (const s of symbols) expect(STATES.some((w) => s.detail!.startsWith(w)), `${where} ${s.name}: ${s.detail}`).toBe(true);
          broken += symbols.filter((s) => /^(not read|no plan)/.test(s.detail!)).length;
        }
        checked++;
      }
    }
    expect(checked).toBe(files.length * 3);
    // The bad fixtures hold outputs that fail the schema, do not parse or have no clock.
    expect(broken).toBeGreaterThanOrEqual(3 * 10);
  });

  const rig = join(FIXTURES, 'bad', 'typing.wave.yaml');
  const typing = [
    'clock: ./rig.clock.yaml',
    'outputs:',
    '  tone:',
    '    shape: sine',
    '    frequency: 1 kHz',
    '  broken:',
    '    shape: sine',
    '    frequency: "1 kHz',
    '  new-o',
    '  typo:',
    '    shape: sine',
    '    frequncy: 2 kHz',
    '  gate:',
    '    shape: square',
    '    frequency: 10 kHz',
    '',
  ].join('\n');

  it('lists an output whose own text does not parse, one half typed and one the schema refuses, with why', () => {
    for (const b of Object.keys(BREAKS) as (keyof typeof BREAKS)[]) {
      const { symbols } = outline(rig, withBreaks(typing, b));
      const detail = Object.fromEntries(symbols.map((s) => [s.name, s.detail]));
      expect(Object.keys(detail), b).toStrictEqual(['tone', 'broken', 'new-o', 'typo', 'gate']);
      // Lines are 1-based in the words, as an editor numbers them: the unclosed quote runs to the
      // end of line 8, `new-o` (line 9) is no `name:` key.
      expect(detail.broken).toBe('not read: YAML syntax error, line 8');
      expect(detail['new-o']).toBe('not read: YAML syntax error, line 9');
      expect(detail.typo).toBe('not read: unknown key "frequncy", line 12');
      // The untouched outputs keep their plans while the file does not parse. derived: on the rig's
      // 125 MHz clock, 125 MHz / 1 kHz = 125 000 and 125 MHz / 10 kHz = 12 500 = D·N/M have whole
      // factors within its divider, table and 12.5 MHz sample-rate limits, so both plans are exact.
      expect(detail.tone).toMatch(/^exact, jitter-free · 1 kHz · 0 ppm · ÷\d+ · seam ok$/);
      expect(detail.gate).toMatch(/^exact, jitter-free · 10 kHz · 0 ppm · ÷\d+ · seam ok$/);
    }
  });

  it('says why an output has no plan when its clock file is the reason, and while planning is under way', () => {
    const text = 'clock: ./no-such.clock.yaml\noutputs:\n  tone:\n    shape: sine\n    frequency: 1 kHz\n';
    const { symbols } = outline(rig, text);
    expect(symbols.map((s) => [s.name, s.detail])).toStrictEqual([['tone', 'no plan: the clock file no-such.clock.yaml cannot be read']]);
    const analysis = analyze(rig, typing, diskHost);
    const doc = TextDocument.create('file:///x', 'yaml', 1, typing);
    // A partial analysis holds the findings before planning but not every plan yet.
    const partial = waveSymbols(doc, { ...analysis, outputs: [] }, syntaxOf(analysis), true);
    expect(partial.find((s) => s.name === 'tone')!.detail).toBe('not planned yet');
    expect(partial.find((s) => s.name === 'typo')!.detail).toBe('not read: unknown key "frequncy", line 12');
  });

  it('gives a clock file’s sections their value as written and their findings', () => {
    const file = join(FIXTURES, 'bad', 'wrong-type.clock.yaml');
    const { symbols } = outline(file, readFileSync(file, 'utf8'));
    const analysis = analyze(file, readFileSync(file, 'utf8'), diskHost);
    const errors = analysis.diagnostics.filter((d) => d.severity === 'error');
    expect(errors.length).toBeGreaterThan(0);
    // Each error is counted in the one section whose lines hold it.
    const counted = symbols.map((s) => Number(/(\d+) errors?/.exec(s.detail ?? '')?.[1] ?? 0)).reduce((a, b) => a + b, 0);
    expect(counted).toBe(errors.length);
    expect(symbols.find((s) => s.name === 'system-clock')!.detail).toMatch(/^\d[\d.]* [kMG]?Hz/);
  });
});
