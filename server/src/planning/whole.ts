// The nearest plan whose table holds a whole number of samples per cycle (N a multiple of M), as
// square, triangle and sawtooth tables need: with a fractional S their edges and corners land
// on different samples from cycle to cycle.
//
// With S = N/M a whole number, f_out = f_sys / (D·S) depends on D and S only; the table is
// S samples long, or the shortest multiple of S the table-length limits admit. So the search is
// one walk over S with the best divider for each (floor or ceiling of the ideal), in doubles,
// and an exact re-ranking of the candidates the doubles cannot tell apart.
//
// Order of plans: the same keys as rank.ts — smaller |error|; fractional: smaller p(1−p);
// larger S; shorter N; then jitter-free: lower f_out, fractional: smaller D.

import {
  type Rational, abs, ceil, cmp, div, mul, rat, sub, toNumber,
} from '../../../shared-schema/src/rational';
import type { Hardware, Plan, PlanRequest } from './types';

interface Candidate {
  /** Divider in 1/2^q steps: D = j / scale. */
  j: number;
  s: number;
  n: number;
}

/** Shortest allowed table holding whole cycles of S samples, or 0 when none fits. */
function shortestTable(s: number, nMin: number, nMax: number, powerOfTwo: boolean): number {
  if (powerOfTwo) {
    if ((s & (s - 1)) !== 0) return 0;
    let n = s;
    while (n < nMin) n *= 2;
    return n <= nMax ? n : 0;
  }
  const n = Math.max(s, Math.ceil(nMin / s) * s);
  return n <= nMax ? n : 0;
}

/**
 * Best plan with whole samples per cycle. fractional = false keeps F = 0 (jitter-free);
 * true admits every F of the clock's fraction bits. Null when no plan exists.
 */
export function nearestWholeCycle(hw: Hardware, req: PlanRequest, fractional: boolean): Plan | null {
  const q = fractional ? hw.divider.fractionBits : 0;
  const scale = 2 ** q;
  const clock = mul(hw.systemClockHz, rat(scale));
  if (req.targetHz.num <= 0n || hw.dac.maxSampleRateHz.num <= 0n) return null;
  // J ≥ scale·f_sys / f_s max keeps the sample rate within the DAC's limit.
  const jRate = Number(ceil(div(clock, hw.dac.maxSampleRateHz)));
  const jLo = Math.max(hw.divider.integerMin * scale, jRate, 1);
  const jHi = hw.divider.integerMax * scale + (scale - 1);
  const nMax = Math.min(hw.memory.tableLengthMax, Math.floor(hw.memory.budgetBytes / hw.dac.sampleBytes));
  const nMin = Math.max(1, hw.memory.tableLengthMin);
  const sLo = Math.max(1, Number(ceil(req.minSamplesPerCycle)));
  if (jLo > jHi || sLo > nMax) return null;

  const C = toNumber(clock);
  const T = toNumber(req.targetHz);
  // Beyond S ≥ C/(jLo·T) even the fastest divider lands below the target and the error grows
  // with S, so the first allowed S past that point ends the walk. Below C/(jHi·T) the slowest
  // divider is still above the target and the error shrinks as S grows, so the walk starts at
  // the last allowed S before it.
  const sHigh = C / (jLo * T);
  const sLow = C / (jHi * T);
  let start = sLo;
  for (let s = Math.min(nMax, Math.floor(sLow)); s >= sLo; s--) {
    if (shortestTable(s, nMin, nMax, hw.memory.powerOfTwo) > 0) {
      start = s;
      break;
    }
  }

  const found: { c: Candidate; err: number }[] = [];
  let bestErr = Infinity;
  const offer = (c: Candidate): void => {
    const err = Math.abs(C / (c.j * c.s) - T);
    // Keep everything the doubles cannot separate from the best; settle it exactly below.
    if (err > bestErr * (1 + 1e-9) + 1e-300) return;
    if (err < bestErr) bestErr = err;
    found.push({ c, err });
  };
  for (let s = start; s <= nMax; s++) {
    const n = shortestTable(s, nMin, nMax, hw.memory.powerOfTwo);
    if (n === 0) continue;
    const ideal = C / (T * s);
    const jf = Math.min(jHi, Math.max(jLo, Math.floor(ideal)));
    const jc = Math.min(jHi, Math.max(jLo, Math.ceil(ideal)));
    offer({ j: jf, s, n });
    if (jc !== jf) offer({ j: jc, s, n });
    if (s >= sHigh) break;
  }
  const finalists = found.filter((f) => f.err <= bestErr * (1 + 1e-9) + 1e-300).map((f) => f.c);
  if (finalists.length === 0) return null;

  const achieved = (c: Candidate): Rational => div(clock, rat(BigInt(c.j) * BigInt(c.s)));
  const error = (c: Candidate): Rational => abs(sub(achieved(c), req.targetHz));
  const longShare = (c: Candidate): number => (c.j % scale) * (scale - (c.j % scale));
  const order = (a: Candidate, b: Candidate): number => {
    const e = cmp(error(a), error(b));
    if (e !== 0) return e;
    if (fractional && longShare(a) !== longShare(b)) return longShare(a) - longShare(b);
    if (a.s !== b.s) return b.s - a.s;
    if (a.n !== b.n) return a.n - b.n;
    return fractional ? a.j - b.j : cmp(achieved(a), achieved(b));
  };
  const best = finalists.reduce((a, b) => (order(b, a) < 0 ? b : a));
  const achievedHz = achieved(best);
  return {
    dividerInteger: Math.floor(best.j / scale),
    dividerFraction: best.j % scale,
    fractionBits: hw.divider.fractionBits,
    tableLength: best.n,
    cycles: rat(best.n / best.s),
    achievedHz,
    errorHz: sub(achievedHz, req.targetHz),
  };
}
