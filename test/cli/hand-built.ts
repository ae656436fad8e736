// Hand-built analyses for the formatter tests: the figures come from published worked examples
// (named beside each), not from the planning engine, so the formatters are tested on their own.

import { rat, sub, type Rational } from '../../shared-schema/src/rational';
import type { Jitter, PlanFigures } from '../../server/src/planning/types';
import type { Analysis, OutputAnalysis, Range, SpecDiagnostic } from '../../server/src/spec/types';

const range = (line: number, character: number, endCharacter: number): Range => ({
  start: { line, character },
  end: { line, character: endCharacter },
});

const NO_JITTER: Jitter = {
  longShare: 0,
  samplePeriodJitterPkPkS: 0,
  samplePeriodJitterRmsS: 0,
  tiePkPkS: 0,
  tieRmsS: 0,
  patternLength: 1,
  jitterSnrDb: null,
  spurOffsetsHz: [],
};

function figures(
  fSys: Rational,
  dividerInteger: number,
  dividerFraction: number,
  fractionBits: number,
  tableLength: number,
  cycles: Rational,
  target: Rational,
  jitter: Jitter,
): PlanFigures {
  const d = rat(BigInt(dividerInteger) * 2n ** BigInt(fractionBits) + BigInt(dividerFraction), 2n ** BigInt(fractionBits));
  const sampleRateHz = rat(fSys.num * d.den, fSys.den * d.num);
  const achievedHz = rat(sampleRateHz.num * cycles.num, sampleRateHz.den * cycles.den * BigInt(tableLength));
  const errorHz = sub(achievedHz, target);
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
    errorPpm: (Number(errorHz.num) / Number(errorHz.den) / (Number(target.num) / Number(target.den))) * 1e6,
    jitterFree: dividerFraction === 0,
    jitter,
    seam: { ok: true, jumpLsb: 0, cause: null },
    tableBytes: tableLength * 2,
  };
}

/**
 * Trade fact (common practice): 125 MHz ÷ 1 with N = 4096 and M = 131 gives
 * 125e6 · 131 / 4096 = 3 997 802.734375 Hz exactly.
 */
export const EXACT_PLAN = figures(rat(125_000_000), 1, 0, 8, 4096, rat(131), rat(4_000_000), NO_JITTER);

/**
 * 4 MHz from 125 MHz with N = 256, M = 16 needs D = 125/64 = 1 + 244/256 (derived: 125e6·16/(256·4e6)),
 * held exactly by an 8-bit fraction; long-period share p = 244/256.
 * Period jitter: pk-pk = T_sys = 8 ns; RMS = T_sys·sqrt(p(1−p)) = 8 ns·sqrt(0.953125·0.046875) ≈ 1.691 ns (derived).
 */
export const FRACTIONAL_PLAN = figures(rat(125_000_000), 1, 244, 8, 256, rat(16), rat(4_000_000), {
  longShare: 244 / 256,
  samplePeriodJitterPkPkS: 8e-9,
  samplePeriodJitterRmsS: 8e-9 * Math.sqrt((244 / 256) * (12 / 256)),
  tiePkPkS: 4e-9,
  tieRmsS: 1.2e-9,
  patternLength: 64,
  jitterSnrDb: null,
  spurOffsetsHz: [],
});

function output(name: string, line: number, target: Rational, plan: PlanFigures | null, verdict: OutputAnalysis['planning']['verdict']): OutputAnalysis {
  return {
    name,
    nameRange: range(line, 2, 2 + name.length),
    entryRange: range(line, 2, 40),
    valueRanges: {},
    targetHz: target,
    request: {
      targetHz: target,
      minSamplesPerCycle: rat(8),
      waveform: { shape: 'sine', duty: 0.5, amplitudeVpp: 2, offsetV: 1.65 },
      toleranceHz: rat(200),
      jitter: 'allow',
    },
    planning: { verdict, plan, nearestJitterFree: plan?.jitterFree ? plan : null, bestFractional: null, withinTolerance: verdict !== 'out-of-tolerance' },
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
      output('tone-a', 3, rat(4_000_000), EXACT_PLAN, 'out-of-tolerance'),
      output('tone-b', 7, rat(4_000_000), FRACTIONAL_PLAN, 'fractional'),
      output('unreachable', 11, rat(90_000_000), null, 'no-plan'),
    ],
    hardware: null,
    clockPath: null,
    memory: { usedBytes: 8704, budgetBytes: 65536 },
  };
}
