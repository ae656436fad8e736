// The best value of a board-wide threshold: each output offers a ladder of plans whose value
// (its share of S_own, or minus its share of the tolerance) rises with its bytes, and a value v
// is feasible when the cheapest step of every ladder at or above v fits the budget together.
// Feasibility only falls as v rises, so the largest feasible value is found by bisection — in
// doubles over the whole range, then exactly among the few values the doubles cannot tell from
// the boundary — without listing the union of every ladder's values.

import { type Rational, cmp } from '../../../shared-schema/src/rational';

export interface Ladder {
  /** The values, ascending, as doubles. */
  approx: Float64Array;
  /** The exact value of step k. */
  exact(k: number): Rational;
  /** Bytes of step k (non-decreasing in k). */
  bytes(k: number): number;
}

/** First step with approx ≥ v (length when none). */
function firstAtLeast(l: Ladder, v: number): number {
  let a = 0;
  let b = l.approx.length;
  while (a < b) {
    const mid = (a + b) >> 1;
    if (l.approx[mid]! >= v) b = mid;
    else a = mid + 1;
  }
  return a;
}

/** First step whose exact value is ≥ v (the doubles place it within a few steps). */
export function firstExact(l: Ladder, v: Rational, vf: number): number {
  const slack = 1e-9 * Math.max(1, Math.abs(vf));
  let k = firstAtLeast(l, vf - slack);
  while (k < l.approx.length && cmp(l.exact(k), v) < 0) k++;
  return k;
}

/** The largest value some step offers for which the cheapest steps at or above it fit; null when none fits. */
export function largestFeasible(ladders: readonly Ladder[], fixedBytes: number, budgetBytes: number): Rational | null {
  const totalAt = (v: number): number => {
    let t = fixedBytes;
    for (const l of ladders) {
      const k = firstAtLeast(l, v);
      if (k === l.approx.length) return Infinity;
      t += l.bytes(k);
    }
    return t;
  };
  let lo = Infinity;
  let hi = -Infinity;
  for (const l of ladders) {
    if (l.approx.length === 0) return null;
    lo = Math.min(lo, l.approx[0]!);
    hi = Math.max(hi, l.approx[l.approx.length - 1]!);
  }
  if (ladders.length === 0) return null;
  // At the lowest value every ladder takes its first step: the fewest bytes of all.
  if (totalAt(lo) > budgetBytes) return null;
  // Bisection in doubles: lo feasible, hi + 1 infeasible (or the top itself feasible).
  let top = hi + Math.max(1, Math.abs(hi));
  if (totalAt(hi) <= budgetBytes) top = hi;
  else {
    for (let i = 0; i < 200 && top - lo > 1e-13 * Math.max(1, Math.abs(top)); i++) {
      const mid = lo + (top - lo) / 2;
      if (totalAt(mid) <= budgetBytes) lo = mid;
      else top = mid;
    }
  }
  // Exactly among the values near the boundary, largest first.
  const slack = 1e-9 * Math.max(1, Math.abs(lo), Math.abs(top));
  const near: Rational[] = [];
  for (const l of ladders) {
    for (let k = firstAtLeast(l, lo - slack); k < l.approx.length && l.approx[k]! <= top + slack; k++) near.push(l.exact(k));
  }
  near.sort((a, b) => cmp(b, a));
  for (const v of near) {
    const vf = Number(v.num) / Number(v.den);
    let t = fixedBytes;
    let ok = true;
    for (const l of ladders) {
      const k = firstExact(l, v, vf);
      if (k === l.approx.length) {
        ok = false;
        break;
      }
      t += l.bytes(k);
    }
    if (ok && t <= budgetBytes) return v;
  }
  // Below the window every value is feasible: the largest value under it.
  let best: Rational | null = null;
  for (const l of ladders) {
    const k = firstAtLeast(l, lo - slack) - 1;
    if (k >= 0 && (best === null || cmp(l.exact(k), best) > 0)) best = l.exact(k);
  }
  return best;
}
