// A ranked clock's figures are what the checker reports once the clock file is set to it: for
// each of the best candidates the clock file's `system-clock` is rewritten to that clock, the
// wave spec is checked again, and the counts, the worst error and the table bytes read off the
// checker's JSON must be the candidate's. The board (invented) has a tight budget, so most clocks
// need the board's budget fit, and a phase-locked pair, so the groups are planned as the checker
// plans them. The worst case is recomputed from the JSON's plan errors as |p| + e·(1 + p) (derived,
// docs/DESIGN.md "The clock's own error").
import { describe, expect, it } from 'vitest';
import { isExactDecimal, toNumber } from '../../../shared-schema/src/rational';
import { analyze } from '../../../server/src/spec/analyze';
import { clockCandidatesJson } from '../../../server/src/cli/clock-json';
import { jsonReport } from '../../../server/src/cli/format-json';
import { clockCandidatesOf } from '../../../server/src/spec/clock-candidates';
import { frequencyText } from '../../../server/src/lsp/code-actions';

const clockText = (systemClock: string) => `system-clock: ${systemClock}
rated-system-clock: 150 MHz
system-clock-tolerance: 10 ppm
pll:
  crystal: 16 MHz
  reference-divider: { min: 1, max: 4 }
  feedback-multiplier: { min: 10, max: 60 }
  vco: { min: 200 MHz, max: 600 MHz }
  post-dividers:
    p: { values: [2, 4, 5, 8] }
divider:
  integer: { min: 1, max: 4095 }
dac:
  bits: 12
  sample-bytes: 2
  full-scale: 3.3 V
  max-sample-rate: 10 MHz
memory:
  budget: 12 KiB
  table-length: { min: 16, max: 4096 }
`;

const waveText = `clock: ./bench.clock.yaml
outputs:
  tone: { shape: sine, frequency: 1 kHz, tolerance: 20 ppm }
  carrier: { shape: sine, frequency: 40 kHz, tolerance: 50 ppm }
  odd: { shape: sine, frequency: 12.345 kHz, tolerance: 100 ppm }
  clock-out: { shape: square, frequency: 25 kHz, tolerance: 100 ppm }
  ramp: { shape: sawtooth, frequency: 7.3 kHz, tolerance: 200 ppm }
  in-phase: { shape: sine, frequency: 10 kHz, tolerance: 50 ppm }
  quadrature: { shape: sine, frequency: 10 kHz, tolerance: 50 ppm }
groups:
  pair:
    outputs: [in-phase, quadrature]
    lock: phase
    phase-offsets: { quadrature: 90 }
`;

const check = (systemClock: string) => {
  const clock = clockText(systemClock);
  const host = { readFile: (p: string) => (p.endsWith('bench.clock.yaml') ? clock : undefined) };
  return analyze('/w/bench.wave.yaml', waveText, host);
};

/** What the checker's JSON says about the spec's outputs, recomputed from its per-output fields. */
function reported(systemClock: string) {
  const [file] = jsonReport([{ path: 'bench.wave.yaml', analysis: check(systemClock) }], '0').files;
  const e = 10e-6;
  const worst = Math.max(...file!.outputs.map((o) => {
    const p = o.plan!.errorPpm / 1e6;
    return (Math.abs(p) + e * (1 + p)) * 1e6;
  }));
  return {
    exactOutputs: file!.outputs.filter((o) => o.plan?.errorHzExact === '0').length,
    withinTolerance: file!.outputs.filter((o) => o.withinTolerance).length,
    worstErrorPpm: worst,
    tableBytes: file!.memory!.usedBytes,
    fitted: file!.diagnostics.filter((d) => d.code === 'fitted-to-budget').length,
  };
}

describe('every ranked clock = the checker on the clock file retuned to it', () => {
  it('the best five: exact and within-tolerance counts, worst error and table bytes agree', () => {
    const now = check('96 MHz');
    const result = clockCandidatesOf(now)!;
    const shown = clockCandidatesJson(now);
    expect(shown.length).toBe(5);
    let fitted = 0;
    shown.forEach((c, k) => {
      const hz = result.candidates[k]!.clock.systemClockHz;
      // Every clock written back exactly: the rewrite checks the very clock that was ranked.
      expect(isExactDecimal(hz), `candidate ${k}`).toBe(true);
      const after = reported(frequencyText(hz));
      expect(toNumber(hz)).toBe(c.systemClockHz);
      expect({ exact: after.exactOutputs, within: after.withinTolerance, bytes: after.tableBytes }, `candidate ${k} at ${c.systemClockHz} Hz`).toEqual({
        exact: c.exactOutputs,
        within: c.withinTolerance,
        bytes: c.tableBytes,
      });
      expect(after.worstErrorPpm).toBeCloseTo(c.worstErrorPpm!, 6);
      fitted += after.fitted;
    });
    // The budget is tight enough that the fit shrinks tables on the clocks ranked.
    expect(fitted).toBeGreaterThan(0);
  });
});
