// Hand-built plan figures for the renderer tests. The achieved frequency is computed exactly from
// f_out = f_sys · M / (D · N) (docs/DESIGN.md, "Quantities"); jitter numbers use the closed forms of a
// first-order accumulator (docs/REFERENCES.md, "Jitter": RMS period jitter Ts·sqrt(p(1 − p)), derived).

import { div, mul, rat, sub, toNumber, type Rational } from '../../../shared-schema/src/rational';
import type { Hardware, PlanFigures, Seam, Waveform } from '../../../server/src/planning/types';

export const dac12: Hardware['dac'] = { bits: 12, sampleBytes: 2, fullScaleV: 3.3, maxSampleRateHz: rat(50_000_000) };
export const dac8: Hardware['dac'] = { bits: 8, sampleBytes: 1, fullScaleV: 1, maxSampleRateHz: rat(50_000_000) };

export function wave(shape: Waveform['shape'], dac: Hardware['dac'], duty = 0.5): Waveform {
  return { shape, duty, amplitudeVpp: dac.fullScaleV * 0.9, offsetV: dac.fullScaleV / 2 };
}

export interface PlanInput {
  systemClockHz?: number;
  dividerInteger: number;
  dividerFraction?: number;
  fractionBits?: number;
  tableLength: number;
  cycles: Rational;
  targetHz?: Rational;
  seam?: Seam;
  sampleBytes?: number;
}

export function figures(p: PlanInput): PlanFigures {
  const fSys = rat(p.systemClockHz ?? 150_000_000);
  const k = p.fractionBits ?? 0;
  const f = p.dividerFraction ?? 0;
  const d = rat(BigInt(p.dividerInteger) * 2n ** BigInt(k) + BigInt(f), 2n ** BigInt(k));
  const fs = div(fSys, d);
  const achieved = div(mul(fs, p.cycles), rat(p.tableLength));
  const target = p.targetHz ?? achieved;
  const error = sub(achieved, target);
  const share = f / 2 ** k;
  const tSys = 1 / toNumber(fSys);
  const pattern = f === 0 ? 1 : 2 ** k / gcd(f, 2 ** k);
  return {
    dividerInteger: p.dividerInteger,
    dividerFraction: f,
    fractionBits: k,
    tableLength: p.tableLength,
    cycles: p.cycles,
    achievedHz: achieved,
    errorHz: error,
    systemClockHz: fSys,
    sampleRateHz: fs,
    errorPpm: (toNumber(error) / toNumber(target)) * 1e6,
    jitterFree: f === 0,
    jitter: {
      longShare: share,
      samplePeriodJitterPkPkS: f === 0 ? 0 : tSys,
      samplePeriodJitterRmsS: tSys * Math.sqrt(share * (1 - share)),
      tiePkPkS: f === 0 ? 0 : (1 - 1 / pattern) * tSys,
      tieRmsS: f === 0 ? 0 : tSys * Math.sqrt((pattern * pattern - 1) / 12) / pattern,
      patternLength: pattern,
      jitterSnrDb: null,
      spurOffsetsHz: [],
    },
    seam: p.seam ?? { ok: true, jumpLsb: 0, cause: null },
    tableBytes: p.tableLength * (p.sampleBytes ?? 2),
  };
}

function gcd(a: number, b: number): number {
  while (b) [a, b] = [b, a % b];
  return a;
}
