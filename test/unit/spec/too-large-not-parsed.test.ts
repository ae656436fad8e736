// Found by the fuzz harness (seed 20261203, case 1100 of a long run): with a 10 MB buffer open,
// requests went unanswered for over 30 s. The spec layer refuses a text over its read limit
// (file-too-large) without parsing it, but the cursor features' tree of an analysis not yet under
// way (the first request after every edit, in the server) parsed the whole text. A text over the limit now has an empty tree, as the
// checker reads nothing of it.

import { join } from 'node:path';
import { describe, expect, it } from 'vitest';
import { analyze, analyzeInSteps } from '../../../server/src/spec/analyze';
import { MAX_FILE_CHARS } from '../../../server/src/spec/source';
import { syntaxOf } from '../../../server/src/spec/syntax';
import { FIXTURES, diskHost } from './fixture-host';

const spec = join(FIXTURES, 'good', 'too-large.wave.yaml');

describe('a text over the read limit', () => {
  it('gives file-too-large and an empty syntax tree', () => {
    const entry = (i: number) => `  o${i}:\n    shape: sine\n    frequency: ${i + 1} Hz\n`;
    let text = 'clock: ./bench.clock.yaml\noutputs:\n';
    for (let i = 0; text.length <= MAX_FILE_CHARS; i++) text += entry(i);
    // Read whole (the checker) and in steps (the server), with its line breaks as they come.
    for (const t of [text, text.replaceAll('\n', '\r\n')]) {
      const run = analyzeInSteps(spec, t, diskHost);
      // A request that comes before the first step sees the analysis as it starts: text, no tree yet.
      expect(syntaxOf(run.analysis).topLevel()).toStrictEqual([]);
      while (!run.steps.next().done);
      for (const a of [analyze(spec, t, diskHost), run.analysis]) {
        expect(a.diagnostics.map((d) => d.code)).toStrictEqual(['file-too-large']);
        const tree = syntaxOf(a);
        expect(tree.topLevel()).toStrictEqual([]);
        expect(tree.outputEntries()).toStrictEqual([]);
        expect(tree.nodeAt(t.indexOf('frequency'))).toBeUndefined();
      }
    }
  });

  it('one just under the limit keeps its tree', () => {
    const text = 'clock: ./bench.clock.yaml\noutputs:\n  tone:\n    shape: sine\n    frequency: 1 kHz\n';
    const tree = syntaxOf(analyze(spec, text, diskHost));
    expect(tree.outputEntries().length).toBe(1);
  });
});
