// The checker's JSON carries the signal figures on every plan, and where the spectrum is exact
// and the plan jitter-free they agree with an independent FFT (mathjs) of the table the C
// export writes, within 0.5 dB.

import { readdirSync, readFileSync } from 'node:fs';
import { join } from 'node:path';
import { describe, expect, it } from 'vitest';
import { jsonReport, type JsonPlan } from '../../../server/src/cli/format-json';
import { exportModel } from '../../../server/src/export/model';
import { analyze } from '../../../server/src/spec/analyze';
import { diskHost } from '../spec/fixture-host';
import { oracleSineFigures } from './oracle';

const EXAMPLES = join(__dirname, '..', '..', '..', 'examples');
const specs = readdirSync(EXAMPLES).filter((f) => f.endsWith('.wave.yaml')).map((f) => join(EXAMPLES, f));
const FIELDS = ['snrDb', 'sinadDb', 'enob', 'sfdrDb', 'worstSpurHz', 'thdPercent', 'droopDb', 'firstImageHz', 'firstImageDbc', 'spectrumMethod'] as const;

describe('signal figures in the JSON of the demo specs', () => {
  it.each(specs.map((s) => [s.split('/').pop()!, s]))('%s: every plan has every figure; exact ones match mathjs within 0.5 dB', (_name, path) => {
    const analysis = analyze(path, readFileSync(path, 'utf8'), diskHost);
    const report = jsonReport([{ path, analysis }], 'test');
    const model = exportModel({ analysis } as Parameters<typeof exportModel>[0]);
    expect(model).not.toBeNull();
    let compared = 0;
    for (const o of report.files[0]!.outputs) {
      for (const plan of [o.plan, o.nearestJitterFree]) {
        if (!plan) continue;
        for (const f of FIELDS) expect(plan, `${o.name}.${f}`).toHaveProperty(f);
        expect(Number.isFinite(plan.droopDb) && Number.isFinite(plan.firstImageDbc) && Number.isFinite(plan.thdPercent)).toBe(true);
      }
      const plan = o.plan as JsonPlan;
      const exported = model!.outputs.find((x) => x.analysis.name === o.name);
      if (!exported || plan.spectrumMethod !== 'exact' || !plan.jitterFree || !Number.isInteger(plan.cycles)) continue;
      const sine = exported.analysis.request.waveform.shape === 'sine';
      // The table's own period: gcd(M, N) copies of a shorter one; its fundamental is on bin M.
      const ref = oracleSineFigures(exported.codes, plan.cycles, sine);
      const near = (ours: number | null | undefined, theirs: number) => {
        if (ours === null || ours === undefined) expect(theirs, o.name).toBeGreaterThan(150); // unbounded: the oracle sees rounding only
        else expect(Math.abs(ours - theirs), o.name).toBeLessThan(0.5);
      };
      near(plan.snrDb, ref.snrDb);
      near(plan.sinadDb, ref.sinadDb);
      near(plan.sfdrDb, ref.sfdrDb);
      if (ref.thdPercent > 1e-6) expect(Math.abs(20 * Math.log10(plan.thdPercent! / ref.thdPercent)), o.name).toBeLessThan(0.5);
      compared++;
    }
    expect(compared).toBeGreaterThan(0);
  });
});

describe('band-limit: nyquist through the spec layer', () => {
  const clock = 'system-clock: 125 MHz\ndivider:\n  integer: { min: 1, max: 65535 }\ndac:\n  bits: 12\n  sample-bytes: 2\n  full-scale: 3.3 V\n  max-sample-rate: 12.5 MHz\nmemory:\n  budget: 24 KiB\n  table-length: { min: 16, max: 16384 }\n';
  const host = (wave: string) => ({ readFile: (p: string) => (p.endsWith('.clock.yaml') ? clock : p.endsWith('.wave.yaml') ? wave : undefined) });
  // A pinned square of 33⅓ samples per cycle: the plain table folds its harmonics between its own
  // (SINAD ≈ 16 dB, the samples-per-cycle warning); the band-limited one is quantisation-limited.
  const wave = (limit: string) => `clock: ./r.clock.yaml\noutputs:\n  gate:\n    shape: square\n    frequency: 30 kHz\n    ${limit}\n    plan: { divider: 125, table-length: 100, cycles: 3 }\n`;
  const sinad = (limit: string) => {
    const text = wave(limit);
    const a = analyze('/w/r.wave.yaml', text, host(text));
    const o = jsonReport([{ path: 'r.wave.yaml', analysis: a }], 'test').files[0]!.outputs[0]!;
    return o.plan!.sinadDb!;
  };
  it('lifts a 33⅓-sample square from fold-limited to quantisation-limited SINAD', () => {
    expect(sinad('band-limit: none')).toBeLessThan(25);
    expect(sinad('band-limit: nyquist')).toBeGreaterThan(60);
  });
});
