// Hand-built analyses for the formatter tests: the figures are computed here from trade facts and
// closed forms (named beside each), not by the planning engine, so the formatters are tested on
// their own; test/cli/hand-built.test.ts checks that the engine agrees with every one of them.

import { rat, sub, type Rational } from '../../shared-schema/src/rational';
import type { Hardware, Jitter, PlanFigures } from '../../server/src/planning/types';
import type { Analysis, OutputAnalysis, Range, SpecDiagnostic } from '../../server/src/spec/types';

const range = (line: number, character: number, endCharacter: number): Range => ({
  start: { line, character },
  end: { line, character: endCharacter },
});

/**
 * The board these analyses describe (a trade-fact board: 125 MHz, divider I = 1 with 8 fraction
 * bits, power-of-two tables of 256…4096 samples). test/cli/hand-built.test.ts plans every output
 * below on it with the engine and checks that each figure here is what the engine reports.
 */
export const HAND_BUILT_HARDWARE: Hardware = {
  systemClockHz: rat(125_000_000),
  divider: { integerMin: 1, integerMax: 1, fractionBits: 8 },
  dac: { bits: 12, sampleBytes: 2, fullScaleV: 3.3, maxSampleRateHz: rat(200_000_000) },
  memory: { budgetBytes: 65536, tableLengthMin: 256, tableLengthMax: 4096, powerOfTwo: true },
};

/**
 * Divider jitter of D = I + F/2^k on a clock of period tSys, from the closed forms of a first-order
 * accumulator (docs/DESIGN.md "Divider jitter"; derived): long share p = F/2^k, pattern
 * L = 2^k/gcd(F, 2^k), period jitter T_sys pk-pk and T_sys·sqrt(p(1 − p)) RMS, TIE T_sys·(L − 1)/L
 * pk-pk and T_sys·sqrt(L² − 1)/(L·sqrt(12)) RMS, SNR −20·log10(2π·f·TIE_rms) (ADI MT-008), spurs
 * at multiples of f_s/L.
 */
function accumulator(F: number, k: number, tSys: number, fOut: number, fS: number): Jitter {
  if (F === 0) {
    return { longShare: 0, samplePeriodJitterPkPkS: 0, samplePeriodJitterRmsS: 0, tiePkPkS: 0, tieRmsS: 0, patternLength: 1, jitterSnrDb: null, spurOffsetsHz: [] };
  }
  const modulus = 2 ** k;
  let g = modulus;
  for (let a = F; a !== 0; ) [g, a] = [a, g % a];
  const L = modulus / g;
  const p = F / modulus;
  const tieRmsS = (tSys * Math.sqrt(L * L - 1)) / (L * Math.sqrt(12));
  return {
    longShare: p,
    samplePeriodJitterPkPkS: tSys,
    samplePeriodJitterRmsS: tSys * Math.sqrt(p * (1 - p)),
    tiePkPkS: (tSys * (L - 1)) / L,
    tieRmsS,
    patternLength: L,
    jitterSnrDb: -20 * Math.log10(2 * Math.PI * fOut * tieRmsS),
    spurOffsetsHz: [1, 2, 3, 4].filter((n) => n < L).map((n) => (n * fS) / L),
  };
}

function figures(
  fSys: Rational,
  dividerInteger: number,
  dividerFraction: number,
  fractionBits: number,
  tableLength: number,
  cycles: Rational,
  target: Rational,
): PlanFigures {
  const d = rat(BigInt(dividerInteger) * 2n ** BigInt(fractionBits) + BigInt(dividerFraction), 2n ** BigInt(fractionBits));
  const sampleRateHz = rat(fSys.num * d.den, fSys.den * d.num);
  const achievedHz = rat(sampleRateHz.num * cycles.num, sampleRateHz.den * cycles.den * BigInt(tableLength));
  const errorHz = sub(achievedHz, target);
  const num = (r: Rational): number => Number(r.num) / Number(r.den);
  return {
    systemClockHz: fSys,
    dividerInteger,
    dividerFraction,
    fractionBits,
    tableLength,
    cycles,
    achievedHz,
    errorHz,
    sampleRateHz,
    errorPpm: (num(errorHz) / num(target)) * 1e6,
    jitterFree: dividerFraction === 0,
    jitter: accumulator(dividerFraction, fractionBits, 1 / num(fSys), num(achievedHz), num(sampleRateHz)),
    // Whole cycles over an open span wrap seamlessly (docs/DESIGN.md "Seam").
    seam: { ok: true, jumpLsb: 0, cause: null },
    tableBytes: tableLength * 2,
  };
}

/**
 * Trade fact (common practice): 125 MHz ÷ 1 with N = 4096 and M = 131 gives
 * 125e6 · 131 / 4096 = 3 997 802.734375 Hz exactly — the nearest jitter-free plan to 4 MHz with
 * power-of-two tables up to 4096 at f_s = 125 MHz (M/N nearest 4/125 = 131.072/4096, derived).
 */
export const EXACT_PLAN = figures(rat(125_000_000), 1, 0, 8, 4096, rat(131), rat(4_000_000));

/**
 * 4 MHz from 125 MHz needs D·N/M = 125/4; with N = 256, M = 16 that is D = 125/64 = 1 + 244/256
 * (derived: 125e6·16/(256·4e6)), held exactly by an 8-bit fraction; long-period share p = 244/256.
 * Period jitter: pk-pk = T_sys = 8 ns; RMS = 8 ns·sqrt(0.953125·0.046875) ≈ 1.691 ns. Pattern
 * L = 256/gcd(244, 256) = 64, so TIE = 8 ns·63/64 = 7.875 ns pk-pk and
 * 8 ns·sqrt(4095)/(64·sqrt(12)) ≈ 2.309 ns RMS (derived).
 */
export const FRACTIONAL_PLAN = figures(rat(125_000_000), 1, 244, 8, 256, rat(16), rat(4_000_000));

function output(
  name: string,
  line: number,
  target: Rational,
  toleranceHz: Rational,
  minSamplesPerCycle: number,
  jitter: 'allow' | 'forbid',
  plan: PlanFigures | null,
  nearestJitterFree: PlanFigures | null,
  verdict: OutputAnalysis['planning']['verdict'],
): OutputAnalysis {
  return {
    name,
    nameRange: range(line, 2, 2 + name.length),
    entryRange: range(line, 2, 40),
    valueRanges: {},
    targetHz: target,
    request: {
      targetHz: target,
      minSamplesPerCycle: rat(minSamplesPerCycle),
      waveform: { shape: 'sine', duty: 0.5, amplitudeVpp: 2, offsetV: 1.65 },
      toleranceHz,
      jitter,
    },
    planning: {
      verdict,
      plan,
      nearestJitterFree,
      bestFractional: plan?.jitterFree === false ? plan : null,
      withinTolerance: verdict === 'exact' || verdict === 'within-tolerance' || verdict === 'fractional',
    },
  };
}

export const FRACTIONAL_WARNING: SpecDiagnostic = {
  range: range(7, 2, 11),
  severity: 'warning',
  code: 'fractional-plan',
  message: 'Only a fractional divider meets the tolerance; it adds 1.69 ns RMS period jitter',
  output: 'tone-b',
};

export const TOLERANCE_ERROR: SpecDiagnostic = {
  range: range(3, 2, 8),
  severity: 'error',
  code: 'out-of-tolerance',
  message: 'No jitter-free plan meets 1 ppm; the nearest is 3.997802734375 MHz (-549.3 ppm).',
  output: 'tone-a',
};

export function handBuiltWave(path: string): Analysis {
  return {
    path,
    kind: 'wave',
    text: '',
    diagnostics: [FRACTIONAL_WARNING, TOLERANCE_ERROR],
    outputs: [
      // 1 ppm of 4 MHz = 4 Hz; jitter forbidden: the nearest jitter-free plan is 2197 Hz off.
      output('tone-a', 3, rat(4_000_000), rat(4), 8, 'forbid', EXACT_PLAN, EXACT_PLAN, 'out-of-tolerance'),
      // 50 ppm of 4 MHz = 200 Hz; jitter allowed: the fractional plan is exact.
      output('tone-b', 7, rat(4_000_000), rat(200), 8, 'allow', FRACTIONAL_PLAN, EXACT_PLAN, 'fractional'),
      // 8192 samples per cycle do not fit a 4096-sample table: no plan at all.
      output('unreachable', 11, rat(1000), rat(1), 8192, 'forbid', null, null, 'no-plan'),
    ],
    hardware: HAND_BUILT_HARDWARE,
    clockPath: null,
    memory: { usedBytes: 8704, budgetBytes: 65536 },
  };
}
