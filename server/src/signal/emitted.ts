// The sample stream an output really emits, as one periodic sequence.
//
// The DMA plays the table c_0 … c_{N−1} over and over. With an integer divider every sample lasts
// D system clocks, so the stream is the table itself. A first-order accumulator (D = I + F/2^k)
// moves edge n of the staircase e_n = frac(n·F/2^k) clocks early against the grid of the mean
// period D (jitter.ts). An early edge lends a sliver of the next code to the sample before it, so
// to first order in the timing error the stream is the regular sequence
//
//     ĉ_n = c_n + d_{n+1} · ẽ_{n+1} / D,   d_n = c_n − c_{n−1},   ẽ_n = e_n − mean(e)   (derived)
//
// (the mean of e is a constant delay of the whole stream, not an error). ĉ repeats after
// P = lcm(N', L) samples: N' is the table's own period and L = 2^k/gcd(F, 2^k) the accumulator's.
// Referred to the samples like this, a jitter-free stream's spectrum is exactly the table's DFT;
// the hold's sin(x)/x, which acts on the codes and not on the sliver of an early edge, is
// reported on its own (hold.ts). The model is first order in 2π·f·T_sys, which is small whenever
// the output is far below the system clock.

import { type Rational, gcdNumber, isInteger } from '../../../shared-schema/src/rational';
import type { TableSpan } from '../planning/types';

/** The plan and table a spectrum is computed from. */
export interface EmittedPlan {
  /** The table's DAC codes as exported (N entries). */
  codes: ArrayLike<number>;
  /** M. */
  cycles: Rational;
  span: TableSpan;
  dividerInteger: number;
  /** F; 0 = jitter-free. */
  dividerFraction: number;
  /** k. */
  fractionBits: number;
}

/** The stream reduced to what its spectrum needs. */
export interface StreamModel {
  /** The table's own period N' (N/gcd(M, N) for whole cycles on an open span, else N). */
  tableLength: number;
  /** The period's codes c_0 … c_{N'−1}. */
  codes: Float64Array;
  /** Exact fundamental position in cycles per sample, ν0 = M/N, as a number. */
  cyclesPerSample: number;
  /** Accumulator pattern length L (1 when jitter-free). */
  patternLength: number;
  /** F/gcd(F, 2^k), coprime to L. */
  fractionStep: number;
  /** The mean divider D in system clocks. */
  divider: number;
  /** P = lcm(N', L): samples before the stream repeats. */
  period: number;
  /** gcd(N', L). */
  common: number;
}

export function streamModel(plan: EmittedPlan): StreamModel {
  const n = plan.codes.length;
  const wholeOpen = plan.span === 'open' && isInteger(plan.cycles) && plan.cycles.num > 0n;
  // M whole cycles in N samples at phases M·i/N: the table is gcd(M, N) copies of a shorter one.
  const g = wholeOpen ? gcdNumber(Number(plan.cycles.num), n) : 1;
  const nr = n / g;
  const codes = new Float64Array(nr);
  for (let i = 0; i < nr; i++) codes[i] = plan.codes[i];
  const modulus = 2 ** plan.fractionBits;
  const f = plan.dividerFraction % modulus;
  const gf = f === 0 ? modulus : gcdNumber(f, modulus);
  const L = modulus / gf;
  const common = gcdNumber(nr, L);
  return {
    tableLength: nr,
    codes,
    cyclesPerSample: Number(plan.cycles.num) / Number(plan.cycles.den) / n,
    patternLength: L,
    fractionStep: f / gf,
    divider: plan.dividerInteger + f / modulus,
    period: (nr / common) * L,
    common,
  };
}

/** ẽ_n in system clocks over one accumulator pattern (all zero when jitter-free). */
export function edgeErrors(model: StreamModel): Float64Array {
  const L = model.patternLength;
  const e = new Float64Array(L);
  const mean = (L - 1) / (2 * L);
  for (let n = 0; n < L; n++) e[n] = ((n * model.fractionStep) % L) / L - mean;
  return e;
}

/** The stream ĉ over one whole period P (for the exact transform). */
export function streamSamples(model: StreamModel): Float64Array {
  const { tableLength: nr, codes, patternLength: L, period: P, divider: D } = model;
  const e = edgeErrors(model);
  const out = new Float64Array(P);
  for (let n = 0; n < P; n++) {
    const i = n % nr;
    const next = (n + 1) % nr;
    out[n] = codes[i] + ((codes[next] - codes[i]) * e[(n + 1) % L]) / D;
  }
  return out;
}

/**
 * Power of the jitter term d_{n+1}·ẽ_{n+1}/D over a period, exactly: pairs (n mod N', n mod L)
 * agree mod g = gcd(N', L) and cover every such pair equally (Chinese remainder theorem), so the
 * mean is the mean over residues ρ mod g of mean(d² | ρ)·mean(ẽ² | ρ). For a sine of amplitude A
 * this is A²/2 · (2·sin(πν0)·TIE_rms/T_s)², the sampled form of ADI MT-008's (2π·f·t_j)².
 */
export function jitterPower(model: StreamModel): number {
  if (model.patternLength <= 1) return 0;
  const { tableLength: nr, codes, common: g, divider: D } = model;
  const e = edgeErrors(model);
  const d2 = new Float64Array(g);
  const e2 = new Float64Array(g);
  for (let i = 0; i < nr; i++) {
    const d = codes[i] - codes[(i - 1 + nr) % nr];
    d2[i % g] += d * d;
  }
  for (let n = 0; n < e.length; n++) e2[n % g] += e[n] * e[n];
  let sum = 0;
  for (let r = 0; r < g; r++) sum += (d2[r] / (nr / g)) * (e2[r] / (e.length / g));
  return sum / g / (D * D);
}

/** Power of the table's codes about their mean (its whole AC power, by Parseval). */
export function tableAcPower(model: StreamModel): number {
  const c = model.codes;
  let mean = 0;
  for (let i = 0; i < c.length; i++) mean += c[i];
  mean /= c.length;
  let p = 0;
  for (let i = 0; i < c.length; i++) p += (c[i] - mean) * (c[i] - mean);
  return p / c.length;
}
