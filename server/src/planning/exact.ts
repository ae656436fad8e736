// Plans of one given f_out, found by number theory: the exact plans before any scan, and in the
// cycles search (cycles.ts) all the plans that share one value of f_out/C at once.
//
// With f_out/C = a/b in lowest terms, (J, N, M) has that f_out iff M = a·J·N/b is a whole
// number, i.e. b divides J·N. Writing n for a divisor of b that some allowed N is a multiple of,
// the dividers that pair with it are exactly the multiples of b/n. Every such plan has
// S = N/M = b/(a·J), so the S floor is one upper bound on J (an S ceiling a lower one), and among them the order of rank.ts
// reduces to: (fractional) the quietest F, then the smallest J, then the shortest N.
// So each divisor n contributes its best multiple of b/n, and the Leader keeps the best of those.
// With a stage divider (stages.ts) that is the least multiple of b/n the stages can make.

import { div, gcdNumber } from '../../../shared-schema/src/rational';
import { type Domain, maxCycles } from './domain';
import { divisorsInRange } from './divisors';
import type { Leader } from './rank';

const divisorsOfB: number[] = [];

/** Offers the best exact plans of the domain to the leader; true when there is one. */
export function offerExactPlans(d: Domain, lead: Leader): boolean {
  const r = div(d.target, d.clock);
  // b | J·N needs b ≤ J·N ≤ J max · N max; M = a·J·N/b ≥ a needs a ≤ the most cycles a table holds.
  if (r.den > BigInt(d.jMax) * BigInt(d.nMax) || r.num > BigInt(maxCycles(d, d.nMax))) return false;
  // The divisors of b are listed in doubles (divisors.ts): beyond 2^52 the walk finds the exact
  // plans itself (and may stop at its limit).
  if (r.den >= 2n ** 52n) return false;
  return offerPlansOfRatio(d, lead, Number(r.num), Number(r.den));
}

/**
 * Offers the best plans with f_out/C = a/b (lowest terms, b ≤ J max · N max < 2^52) to the
 * leader; true when there is one.
 */
export function offerPlansOfRatio(d: Domain, lead: Leader, a: number, b: number): boolean {
  // S = b/(a·J) ≥ sNum/sDen  ⇔  J ≤ b·sDen / (a·sNum).
  const jHi = Math.min(d.jMax, floorOfRatio(b, d.sDen, a, d.sNum));
  // S ≤ cNum/cDen  ⇔  J ≥ b·cDen / (a·cNum).
  const jLo = d.cNum === 0n ? d.jMin : Math.max(d.jMin, ceilOfRatio(b, d.cDen, a, d.cNum));
  if (jHi < jLo) return false;
  let found = false;
  // J is a multiple of b/n ≤ jHi, so n ≥ b/jHi.
  divisorsInRange(b, Math.ceil(b / jHi), d.nMax, divisorsOfB);
  // A stage divider: the least member that is a multiple of g; each found bounds the next search.
  let stagesHi = jHi;
  for (const n of divisorsOfB) {
    if (lengthMultiple(d, n) === 0) continue;
    const g = b / n;
    const t0 = Math.ceil(jLo / g);
    const j =
      d.dividers !== null
        ? d.dividers.nextMultiple(g, jLo, stagesHi)
        : g * (d.scale > 1 ? quietestMultiple(d.scale, g, t0, Math.floor(jHi / g)) : t0);
    if (j === 0 || j > jHi) continue;
    if (d.dividers !== null) stagesHi = j;
    // The shortest table for this J: a multiple of b/gcd(b, J), which divides n.
    const len = lengthMultiple(d, b / gcdNumber(b, j));
    // b divides J·N; past 2^53 the quotient is taken in bigints.
    const m = j * len < 2 ** 53 ? a * ((j * len) / b) : Number(BigInt(a) * ((BigInt(j) * BigInt(len)) / BigInt(b)));
    if (m < 1 || m > maxCycles(d, len)) continue;
    lead.offer(j, len, m);
    found = true;
  }
  return found;
}

/** floor(x·y / (u·v)) for positive integers, exactly; y and v as bigints (the S floor's parts). */
function floorOfRatio(x: number, y: bigint, u: number, v: bigint): number {
  const top = x * Number(y);
  const bottom = u * Number(v);
  if (top < 2 ** 52 && bottom < 2 ** 52) return Math.floor(top / bottom);
  const q = (BigInt(x) * y) / (BigInt(u) * v);
  return q < 2n ** 52n ? Number(q) : 2 ** 52;
}

/** ceil(x·y / (u·v)) for positive integers, exactly (capped at 2^52). */
function ceilOfRatio(x: number, y: bigint, u: number, v: bigint): number {
  const top = BigInt(x) * y;
  const bottom = BigInt(u) * v;
  const q = (top + bottom - 1n) / bottom;
  return q < 2n ** 52n ? Number(q) : 2 ** 52;
}

/** The shortest allowed table length that is a multiple of n; 0 when there is none. */
export function lengthMultiple(d: Domain, n: number): number {
  if (d.powerOfTwo) {
    for (const len of d.lengths) if (len % n === 0) return len;
    return 0;
  }
  const len = Math.ceil(d.nMin / n) * n;
  return len <= d.nMax ? len : 0;
}

/**
 * Every multiple t·g of a divider gives the same f_out; fractional plans prefer the smallest
 * long-share term F·(2^k − F) of F = t·g mod 2^k, then the smallest t (larger S). Returns that t
 * among [t0, t1], or 0 when the range is empty. The residues repeat after 2^k / gcd(g, 2^k)
 * steps, so one period holds every first occurrence.
 */
export function quietestMultiple(scale: number, g: number, t0: number, t1: number): number {
  const period = scale / gcdNumber(g % scale, scale);
  // F = t·g mod scale is 0 exactly when t is a multiple of the period: a span holding a whole
  // period has one, and the first is the answer (without a loop of up to 2^k steps per call).
  if (t1 - t0 + 1 >= period) return Math.ceil(t0 / period) * period;
  let best = 0;
  let bestTerm = Infinity;
  for (let t = t0; t <= t1 && t < t0 + period; t++) {
    const f = (t * g) % scale;
    const term = f * (scale - f);
    if (term < bestTerm) {
      best = t;
      bestTerm = term;
      if (term === 0) break;
    }
  }
  return best;
}
