// Found by the fuzz harness (seed 20261203, case 666 of a long run): a group entry without its
// `outputs` list (or with one the schema refuses) ended the analysis in an internal-error ("Cannot
// read properties of undefined"). Such an entry has its schema diagnostics and is not planned; the
// outputs of the file still are.

import { join } from 'node:path';
import { describe, expect, it } from 'vitest';
import { analyze } from '../../../server/src/spec/analyze';
import { diagnosticProblems } from '../../support/ranges';
import { FIXTURES, diskHost } from './fixture-host';

const spec = join(FIXTURES, 'bad', 'fuzz-group.wave.yaml');

describe('a group the schema refuses', () => {
  for (const group of ['{ shape: sine, frequency: 1 kHz }', '{ outputs: tone }', '{ outputs: [tone, 7], lock: phase }', '"tone"']) {
    it(`is reported, not planned: ${group}`, () => {
      const text = `clock: ./coarse-crystal.clock.yaml\ngroups:\n  pair: ${group}\noutputs:\n  tone: { shape: sine, frequency: 1 kHz, tolerance: 1000 ppm }\n  other: { shape: sine, frequency: 2 kHz, tolerance: 1000 ppm }\n`;
      const a = analyze(spec, text, diskHost);
      expect(diagnosticProblems(a.diagnostics, text)).toStrictEqual([]);
      expect(a.diagnostics.filter((d) => d.severity === 'error').length).toBeGreaterThan(0);
      expect(a.outputs.map((o) => o.name).sort()).toStrictEqual(['other', 'tone']);
    });
  }
});
