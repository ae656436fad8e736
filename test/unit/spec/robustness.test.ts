// Any text gives diagnostics with valid ranges and known codes: never a throw, never a range
// outside the text. Truncations at every offset and seeded random edits of the good wave spec
// and its clock file (the technique is ordinary mutation fuzzing; a fixed seed keeps it repeatable).
import { readFileSync } from 'node:fs';
import { join } from 'node:path';
import { describe, expect, it } from 'vitest';
import { analyze } from '../../../server/src/spec/analyze';
import type { Analysis } from '../../../server/src/spec/types';
import { diagnosticProblems } from '../../support/ranges';
import { seededRandom } from '../../support/seeded';
import { FIXTURES, diskHost } from './fixture-host';

const GOOD = join(FIXTURES, 'good');
const cases = [join(GOOD, 'good.wave.yaml'), join(GOOD, 'bench.clock.yaml')].map((path) => ({ path, text: readFileSync(path, 'utf8') }));

function checkRanges(a: Analysis, text: string): void {
  expect(diagnosticProblems(a.diagnostics, text), JSON.stringify(a.diagnostics)).toStrictEqual([]);
}

const PIECES = ['', ' ', '\n', '\t', ':', '-', '[', ']', '{', '}', '"', "'", '#', '&a', '*a', '!!str', '?', '|', '>', '0', '-1', '1e999', 'MHz', 'mhz', '%', 'ppm', '\u0000', '🎵', '\r\n', '    ', 'outputs:', 'plan:'];

describe('robustness', () => {
  for (const { path, text } of cases) {
    const name = path.split('/').pop()!;
    it(`${name}: every truncation analyses without throwing`, () => {
      for (let cut = 0; cut <= text.length; cut++) {
        const t = text.slice(0, cut);
        checkRanges(analyze(path, t, diskHost), t);
      }
    }, 120_000);

    it(`${name}: 400 seeded random edits analyse without throwing`, () => {
      const random = seededRandom(name.length * 7919);
      for (let i = 0; i < 400; i++) {
        let t = text;
        const edits = 1 + Math.floor(random() * 3);
        for (let e = 0; e < edits; e++) {
          const at = Math.floor(random() * (t.length + 1));
          const len = Math.floor(random() * 4);
          const piece = random() < 0.5 ? PIECES[Math.floor(random() * PIECES.length)] : String.fromCharCode(Math.floor(random() * 0x7f));
          t = t.slice(0, at) + piece + t.slice(at + len);
        }
        checkRanges(analyze(path, t, diskHost), t);
      }
    }, 120_000);
  }

  it('analysis never writes: the fixtures are unchanged afterwards', () => {
    for (const { path, text } of cases) {
      analyze(path, text, diskHost);
      expect(readFileSync(path, 'utf8')).toBe(text);
    }
  });
});
