// Best rational approximation with bounded numerator and denominator: the two neighbours of a
// value among the fractions u/w with 0 ≤ u ≤ maxNum and 1 ≤ w ≤ maxDen. Found by walking the
// Stern–Brocot tree in runs (one run per continued-fraction term), so a run cut short by a bound
// is a semiconvergent; the walk takes O(log maxDen) steps and never enumerates fractions.
//
// Two versions of one walk: an exact one on bigint rationals (the reference, and the kernel of
// `limitDenominator`), and one on a double value with integer endpoints for the planner's hot
// loop. The double walk is exact in its endpoints; only the side of the value it chooses can be
// wrong, and only when the value lies within about 1e-12 (relative) of a fraction, which it
// flags as a near hit so the caller can treat that fraction with care.

import { type Rational, rat, sub, abs, cmp } from '../../../shared-schema/src/rational';

export interface Neighbours {
  /** Largest fraction ≤ y in the set (0/1 when y is below every positive member). */
  lower: Rational;
  /** Smallest fraction ≥ y in the set; null when y exceeds every member (y > maxNum). */
  upper: Rational | null;
}

/**
 * Neighbours of y ≥ 0 among u/w with u ≤ maxNum (null = unbounded), 1 ≤ w ≤ maxDen.
 * When y itself belongs to the set, lower = upper = y.
 */
export function fareyNeighbours(y: Rational, maxDen: bigint, maxNum: bigint | null = null): Neighbours {
  if (y.num < 0n) throw new RangeError('fareyNeighbours needs y ≥ 0');
  if (maxDen < 1n) throw new RangeError('fareyNeighbours needs maxDen ≥ 1');
  const yn = y.num;
  const yd = y.den;
  // lo ≤ y < hi, always adjacent in the Stern–Brocot sense: hn·ld − ln·hd = 1.
  let ln = 0n, ld = 1n, hn = 1n, hd = 0n;
  if (maxNum !== null && maxNum < 1n) return { lower: rat(0n), upper: y.num === 0n ? rat(0n) : null };
  const room = (bn: bigint, bd: bigint, sn: bigint, sd: bigint): bigint => {
    // Largest t with bd + t·sd ≤ maxDen and bn + t·sn ≤ maxNum; −1 = unbounded.
    let t = sd === 0n ? -1n : (maxDen - bd) / sd;
    if (maxNum !== null && sn !== 0n) {
      const tn = (maxNum - bn) / sn;
      if (t < 0n || tn < t) t = tn;
    }
    return t;
  };
  for (;;) {
    // Run of lo towards y: largest t with (ln + t·hn)/(ld + t·hd) ≤ y.
    const below = yn * ld - ln * yd; // ≥ 0
    if (below === 0n) return { lower: rat(ln, ld), upper: rat(ln, ld) };
    const above = hn * yd - yn * hd; // > 0
    const tFull = below / above;
    if (tFull > 0n) {
      const tRoom = room(ln, ld, hn, hd);
      const t = tRoom < 0n || tFull < tRoom ? tFull : tRoom;
      ln += t * hn;
      ld += t * hd;
      if (t < tFull) break;
      if (yn * ld === ln * yd) return { lower: rat(ln, ld), upper: rat(ln, ld) };
    }
    // Run of hi towards y: largest s with (hn + s·ln)/(hd + s·ld) > y.
    const below2 = yn * ld - ln * yd; // > 0
    const above2 = hn * yd - yn * hd;
    const sFull = (above2 + below2 - 1n) / below2 - 1n;
    if (sFull <= 0n && tFull <= 0n) break;
    if (sFull > 0n) {
      const sRoom = room(hn, hd, ln, ld);
      const s = sRoom < 0n || sFull < sRoom ? sFull : sRoom;
      hn += s * ln;
      hd += s * ld;
      if (s < sFull) break;
    }
  }
  return { lower: rat(ln, ld), upper: hd === 0n ? null : rat(hn, hd) };
}

/**
 * The fraction closest to y ≥ 0 with denominator ≤ maxDen (a tie goes to the smaller denominator).
 */
export function limitDenominator(y: Rational, maxDen: bigint): Rational {
  const { lower, upper } = fareyNeighbours(y, maxDen);
  if (upper === null) return lower;
  const c = cmp(abs(sub(upper, y)), abs(sub(y, lower)));
  if (c < 0) return upper;
  if (c > 0) return lower;
  return upper.den < lower.den ? upper : lower;
}

/** NEAR values: which endpoint (if any) lies within the float noise of x. */
export const NEAR_NONE = 0, NEAR_LOWER = 1, NEAR_UPPER = 2;

/** Result slots of `fareyFloat`, reused from call to call (the hot loop allocates nothing). */
export class FloatNeighbours {
  lowerNum = 0;
  lowerDen = 1;
  /** upperDen 0 = no upper neighbour. */
  upperNum = 1;
  upperDen = 0;
  near = NEAR_NONE;
}

/** Relative distance under which a double value and a fraction are not told apart. */
const NEAR_TOLERANCE = 1e-12;

/**
 * The same walk for a double x > 0, endpoints kept as exact integers (below 2^53), written into
 * `out`. On a near hit the near fraction is returned as both neighbours and `near` names it.
 */
export function fareyFloat(x: number, maxDen: number, maxNum: number, out: FloatNeighbours): void {
  let ln = 0, ld = 1, hn = 1, hd = 0;
  let near = NEAR_NONE;
  const tol = NEAR_TOLERANCE * x;
  for (let guard = 0; guard < 4096; guard++) {
    // Run of lo towards x: largest t with (ln + t·hn)/(ld + t·hd) ≤ x.
    const below = x * ld - ln;
    const above = hn - x * hd;
    if (below <= tol * ld) { near = NEAR_LOWER; break; }
    if (hd !== 0 && above <= tol * hd) { near = NEAR_UPPER; break; }
    const tFull = Math.floor(below / above);
    if (tFull > 0) {
      let t = tFull;
      if (hd !== 0) { const r = Math.floor((maxDen - ld) / hd); if (r < t) t = r; }
      const rn = Math.floor((maxNum - ln) / hn);
      if (rn < t) t = rn;
      if (t < 0) t = 0;
      ln += t * hn;
      ld += t * hd;
      if (t < tFull) break;
    }
    // Run of hi towards x: largest s with (hn + s·ln)/(hd + s·ld) > x.
    const below2 = x * ld - ln;
    if (below2 <= tol * ld) { near = NEAR_LOWER; break; }
    const sFull = Math.ceil(above / below2) - 1;
    if (sFull <= 0) {
      if (tFull <= 0) break;
      continue;
    }
    let s = sFull;
    const r = Math.floor((maxDen - hd) / ld);
    if (r < s) s = r;
    if (ln !== 0) { const rn = Math.floor((maxNum - hn) / ln); if (rn < s) s = rn; }
    if (s < 0) s = 0;
    hn += s * ln;
    hd += s * ld;
    if (s < sFull) break;
  }
  if (near === NEAR_LOWER) { hn = ln; hd = ld; }
  if (near === NEAR_UPPER) { ln = hn; ld = hd; }
  out.lowerNum = ln;
  out.lowerDen = ld;
  out.upperNum = hn;
  out.upperDen = hd;
  out.near = near;
}
