// One table (N, M) for every frequency step of an output, judged: each step takes the divider
// nearest its own frequency, and the table is ranked by what all the steps get (steps.ts).
//
// For a table holding M cycles in N samples a divider D gives f = f_sys·M/(D·N), so step i's
// best dividers lie on either side of D*_i = f_sys·M/(f_i·N): the nearest whole divider (or the
// nearest the stages make), and, where the output allows jitter and no whole divider meets the
// step's tolerance, the nearest I + F/2^k. Ties between two dividers: the lower frequency (whole),
// the smaller p(1−p), then the smaller divider (fractional) — rank.ts's order for one plan.
//
// Doubles carry the search; every decision the doubles cannot make safely (two dividers whose
// errors are within 1e-12 of each other, an error within 1e-9 of the tolerance) is made exactly.

import { type Rational, abs, add, cmp, div, mul, rat, sub } from '../../../shared-schema/src/rational';
import type { StageProducts } from './stages';

/** What steps.ts resolves once per output and the evaluation reads on every table. */
export interface StepContext {
  clock: Rational;
  clockF: number;
  /** Fraction bits k used for fractional steps (0 when the output forbids jitter). */
  fractionBits: number;
  scale: number;
  /** Whole-divider range after the sample-rate limit (members of `stages` when set). */
  jMin: number;
  jMax: number;
  stages: StageProducts | null;
  targets: Rational[];
  tolerances: Rational[];
  targetF: number[];
  toleranceF: number[];
  /** e, the system clock's relative tolerance (0 = exact). */
  clockTolerance: Rational;
  clockToleranceF: number;
}

/** One step's divider on one table: D = J / 2^k (J = I·2^k + F); k = 0 for a whole divider. */
export interface StepDivider {
  j: number;
  k: number;
  /** |f − f_i| in doubles. */
  err: number;
  within: boolean;
}

const achieved = (c: StepContext, m: number, n: number, j: number, k: number): Rational =>
  div(mul(c.clock, rat(BigInt(m) << BigInt(k))), rat(BigInt(j) * BigInt(n)));

/** Exact |f − f_i| of divider j/2^k on the table (m, n). */
export function exactError(c: StepContext, i: number, m: number, n: number, j: number, k: number): Rational {
  return abs(sub(achieved(c, m, n, j, k), c.targets[i]!));
}

/** The step meets its tolerance in the worst case |error| + e·f (clock-error.ts), exactly. */
export function exactWithin(c: StepContext, i: number, m: number, n: number, j: number, k: number): boolean {
  const f = achieved(c, m, n, j, k);
  const worst = add(abs(sub(f, c.targets[i]!)), mul(c.clockTolerance, f));
  return cmp(worst, c.tolerances[i]!) <= 0;
}

function within(c: StepContext, i: number, m: number, n: number, j: number, k: number, err: number): boolean {
  const f = (c.clockF * m * 2 ** k) / (j * n);
  const worst = err + c.clockToleranceF * f;
  const tol = c.toleranceF[i]!;
  if (Math.abs(worst - tol) > 1e-9 * (tol + worst) + 1e-300) return worst < tol;
  return exactWithin(c, i, m, n, j, k);
}

/** Negative when divider a/2^k is the better one for step i, positive when b is (never 0 for a ≠ b). */
function better(c: StepContext, i: number, m: number, n: number, k: number, a: number, ea: number, b: number, eb: number): number {
  if (Math.abs(ea - eb) > 1e-12 * (ea + eb) + 1e-300) return ea < eb ? -1 : 1;
  const e = cmp(exactError(c, i, m, n, a, k), exactError(c, i, m, n, b, k));
  if (e !== 0) return e;
  if (k === 0) return a > b ? -1 : 1; // the lower frequency
  const s = 2 ** k;
  const pa = (a % s) * (s - (a % s));
  const pb = (b % s) * (s - (b % s));
  if (pa !== pb) return pa < pb ? -1 : 1;
  return a < b ? -1 : 1;
}

const errorOf = (c: StepContext, i: number, u: number, j: number, scale: number): number => Math.abs((c.clockF * u * scale) / j - c.targetF[i]!);

/**
 * The divider of step i on the table (m, n) with u = m/n: the nearest whole one, or (allowed and
 * needed) the nearest fractional one, written into `out`. Null when the divider range is empty.
 */
export function stepDivider(c: StepContext, i: number, m: number, n: number, fractional: boolean, out: StepDivider = { j: 0, k: 0, err: 0, within: false }): StepDivider | null {
  const u = m / n;
  const ideal = (c.clockF * u) / c.targetF[i]!;
  let lo: number, hi: number;
  if (c.stages !== null) {
    lo = c.stages.prev(c.jMin, Math.min(c.jMax, Math.floor(ideal)));
    hi = c.stages.next(Math.max(c.jMin, Math.floor(ideal) + 1), c.jMax);
  } else {
    lo = Math.min(c.jMax, Math.max(c.jMin, Math.floor(ideal)));
    hi = Math.min(c.jMax, Math.max(c.jMin, Math.floor(ideal) + 1));
  }
  let j = lo !== 0 ? lo : hi;
  if (j === 0) return null;
  let err = errorOf(c, i, u, j, 1);
  if (hi !== 0 && hi !== j) {
    const eh = errorOf(c, i, u, hi, 1);
    if (better(c, i, m, n, 0, hi, eh, j, err) < 0) {
      j = hi;
      err = eh;
    }
  }
  out.j = j;
  out.k = 0;
  out.err = err;
  out.within = within(c, i, m, n, j, 0, err);
  if (out.within || !fractional || c.fractionBits === 0) return out;
  const s = c.scale;
  const jLo = c.jMin * s;
  const jHi = c.jMax * s + s - 1;
  const a = Math.min(jHi, Math.max(jLo, Math.floor(ideal * s)));
  const b = Math.min(jHi, Math.max(jLo, Math.floor(ideal * s) + 1));
  let fj = a;
  let fe = errorOf(c, i, u, a, s);
  if (b !== a) {
    const eb = errorOf(c, i, u, b, s);
    if (better(c, i, m, n, c.fractionBits, b, eb, a, fe) < 0) {
      fj = b;
      fe = eb;
    }
  }
  out.j = fj;
  out.k = c.fractionBits;
  out.err = fe;
  out.within = within(c, i, m, n, fj, c.fractionBits, fe);
  return out;
}
