// Best-first search over the cycles M and the products K = J·N, for domains where both the
// divider span and the table-length span are long (low targets).
//
// f_out = C·M/K, so for one M the error |C·M/K − f_target| falls as K rises to K* = C·M/f_target
// and grows beyond it. Each M thus gives two streams of products, down from K* and up from it,
// each in rising error. A heap merges the streams and hands out (M, K) in rising error; a pair
// stands for the value M/K in lowest terms, and all the plans with that f_out are ranked at once
// by number theory (exact.ts); its multiples (same value, same error) are then passed over.
// Every plan is some (M, K), so the first pair that has plans has the least error; the search
// goes on through the pairs within float noise of it, and the Leader settles those near-ties
// exactly.
//
// Most streams never matter, so their heads wait in a flat frontier and enter the heap only
// when a rising threshold admits them: the heap stays small and set-up is one linear pass.
//
// Exact plans are settled before (exact.ts): a pair with error 0 is skipped here, so this search
// must only run when the domain has no exact plan.

import { div, rat, toNumber } from '../../../shared-schema/src/rational';
import { type Domain, maxCycles } from './domain';
import { DIVISOR_REACH } from './divisors';
import { gcdNumber } from '../../../shared-schema/src/rational';
import { offerPlansOfRatio } from './exact';
import { ProductHeap } from './heap';
import type { Leader } from './rank';
import { WorkBudget } from './work';

export interface CyclesLimits {
  /** Most values of M the search may set up; more and it declines. */
  maxCycles: number;
  /** Most (M, K) pairs it may test; more and it gives up. */
  maxPairs: number;
}

/** Relative margin on float bounds, so exact ties at their edge stay in. */
const EDGE = 1e-9;
/** Keys are accurate to a few ulps: two closer than this (relative) are settled exactly. */
const KEY_NOISE = 1e-12;
/** Each round admits stream heads up to this factor above the previous threshold. */
const WIDEN = 16;

// Reused from search to search: slot 2M is the head of M's down stream, 2M + 1 its up stream.
const heap = new ProductHeap();
/** Values M/K (lowest terms) already ranked in this search: K → M. */
const ranked = new Map<number, number>();
let headKey = new Float64Array(512);
let headK = new Float64Array(512);
let productFloor = new Float64Array(256);
/** Largest product K = J·N of each M under the S ceiling (N ≤ M·S ceiling). */
let productCeil = new Float64Array(256);

/**
 * Offers the plans of least error to the leader. False when the search declined (too many M,
 * numbers beyond exact doubles) or gave up (too many pairs): the caller must search otherwise.
 */
export function searchByCycles(d: Domain, lead: Leader, limits: CyclesLimits, budget: WorkBudget = new WorkBudget(Infinity)): boolean {
  const C = d.clockF;
  const T = d.targetF;
  const jMin = d.jMin;
  const kMax = d.jMax * d.nMax;
  if (!(kMax < 2 ** 52) || d.nMax > DIVISOR_REACH) return false;
  let mTop = maxCycles(d, d.nMax);
  // f_out ≥ C·M/K max: larger M overshoot by more than the leader's error.
  if (lead.errF < Infinity) mTop = Math.min(mTop, Math.floor(((T + lead.errF) * kMax * (1 + EDGE)) / C) + 1);
  if (mTop > limits.maxCycles) return false;
  // Its set-up (one pass over M) and every pair it tests are steps of the output's work.
  if (mTop > budget.remaining || !budget.take(mTop)) return false;

  // f_target/C = a/b, so |f_out − f_target| = (C/b)·|M·b − a·K|/K. With b = q·a + s the
  // residue M·b − a·K = a·(M·q − K) + M·s stays exact in doubles near K*, which keeps the keys
  // accurate to a few ulps even when the errors are far below f_target's own ulp. A target with
  // more digits than that allows falls back to |C·M/K − f_target| in doubles, whose noise of a
  // few ulps of f_target the bound then has to absorb.
  const r = div(d.target, d.clock);
  const a = Number(r.num);
  const q = Number(r.den / r.num);
  const s = Number(r.den % r.num);
  const exactKeys = a * mTop < 2 ** 52 && (q + 1) * mTop < 2 ** 52;
  const unit = toNumber(div(d.clock, rat(r.den)));
  const keyOf = exactKeys
    ? (m: number, k: number): number => (unit * Math.abs(a * (m * q - k) + m * s)) / k
    : (m: number, k: number): number => Math.abs((C * m) / k - T);
  const noise = exactKeys ? 0 : 1e-14 * T;

  if (productFloor.length <= mTop) {
    productFloor = new Float64Array(2 * mTop + 2);
    productCeil = new Float64Array(2 * mTop + 2);
  }
  if (headKey.length <= 2 * mTop + 1) {
    headKey = new Float64Array(4 * mTop + 4);
    headK = new Float64Array(4 * mTop + 4);
  }
  heap.clear();
  ranked.clear();
  // The least key of a plan seen so far: the leader's, measured the same accurate way.
  let bestKey = lead.empty ? Infinity : keyOf(lead.m, lead.j * lead.n);
  const bound = (): number => bestKey * (1 + KEY_NOISE) + noise;

  // One pass sets every stream head. K* = M·b/a = M·q + (M·s)/a: its floor and the residue
  // there (0 ≤ rest < a), stepped along M. (Without exact keys the floor comes from doubles and
  // may sit one off; the two streams still cover every K, each in rising error.)
  let rest = 0;
  let kFloor = 0;
  let least = Infinity;
  for (let m = 1; m <= mTop; m++) {
    if (exactKeys) {
      rest += s;
      kFloor += q;
      if (rest >= a) {
        rest -= a;
        kFloor++;
      }
    } else kFloor = Math.floor((C * m) / T);
    const shortest = shortestLength(d, m);
    if (shortest === 0) {
      mTop = m - 1;
      break;
    }
    const kLo = jMin * shortest;
    const kHi = d.jMax * longestLength(d, m);
    productFloor[m] = kLo;
    productCeil[m] = kHi;
    // A residue of 0 is an exact plan, and the domain has none (exact.ts ran first).
    const down = Math.min(kHi, exactKeys && rest === 0 ? kFloor - 1 : kFloor);
    const up = Math.max(kLo, kFloor + 1);
    const keyDown = down >= kLo ? keyOf(m, down) : Infinity;
    const keyUp = up <= kHi ? keyOf(m, up) : Infinity;
    headKey[2 * m] = keyDown;
    headK[2 * m] = down;
    headKey[2 * m + 1] = keyUp;
    headK[2 * m + 1] = up;
    if (keyDown < least) least = keyDown;
    if (keyUp < least) least = keyUp;
  }
  if (least === Infinity) return true;

  let pairs = 0;
  let threshold = least * WIDEN;
  for (;;) {
    // Admit the waiting heads up to the threshold; note the least one left waiting.
    const limit = Math.min(threshold, bound());
    let waiting = Infinity;
    for (let slot = 2; slot <= 2 * mTop + 1; slot++) {
      const key = headKey[slot]!;
      if (key <= limit) {
        heap.push(key, slot >> 1, headK[slot]!, slot & 1 ? 1 : -1);
        headKey[slot] = Infinity;
      } else if (key < waiting) waiting = key;
    }
    while (heap.size > 0) {
      const key = heap.topKey();
      if (key > bound()) break;
      const m = heap.topCycles();
      const k = heap.topProduct();
      const step = heap.topStep();
      heap.pop();
      if (++pairs > limits.maxPairs || !budget.take()) return false;
      if (offerValue(d, lead, m, k) && key < bestKey) bestKey = key;
      const next = k + step;
      if (next < productFloor[m]! || next > productCeil[m]!) continue;
      const nextKey = keyOf(m, next);
      if (nextKey <= limit) heap.push(nextKey, m, next, step);
      else if (nextKey <= bound()) {
        // Back to the frontier until a later round admits it.
        const slot = 2 * m + (step > 0 ? 1 : 0);
        headKey[slot] = nextKey;
        headK[slot] = next;
        if (nextKey < waiting) waiting = nextKey;
      }
    }
    heap.clear();
    // Every pair left has a key above the limit: done once the limit reached the bound.
    if (waiting > bound() || limit >= bound()) return true;
    threshold = Math.max(threshold * WIDEN, waiting);
  }
}

/** The shortest allowed table holding M cycles above the S floor; 0 when none does. */
function shortestLength(d: Domain, m: number): number {
  if (d.powerOfTwo) {
    for (const len of d.lengths) if (maxCycles(d, len) >= m) return len;
    return 0;
  }
  // N ≥ M·sNum/sDen: exact in doubles while the product stays below 2^52 (see divisors.ts).
  const top = m * d.sNumF;
  if (top < 2 ** 52) {
    const n = Math.max(d.nMin, Math.ceil(top / d.sDenF));
    return n <= d.nMax ? n : 0;
  }
  let n = Math.max(d.nMin, Math.ceil(m * d.sFloorF * (1 - EDGE)));
  while (n <= d.nMax && maxCycles(d, n) < m) n++;
  return n <= d.nMax ? n : 0;
}

/** The longest allowed table holding M cycles under the S ceiling (N max without one); 0 when none does. */
function longestLength(d: Domain, m: number): number {
  if (d.cNum === 0n) return d.nMax;
  // floor(M·cNum/cDen), in doubles while the product is exact, corrected by one either way.
  const cNum = Number(d.cNum);
  const cDen = Number(d.cDen);
  let n: number;
  if (m * cNum < 2 ** 52 && cDen < 2 ** 52) {
    n = Math.floor((m * cNum) / cDen);
    if (n * cDen > m * cNum) n--;
    else if ((n + 1) * cDen <= m * cNum) n++;
    n = Math.min(n, d.nMax);
  } else {
    const cap = (BigInt(m) * d.cNum) / d.cDen;
    n = cap >= BigInt(d.nMax) ? d.nMax : Number(cap);
  }
  if (!d.powerOfTwo) return n;
  let best = 0;
  for (const len of d.lengths) if (len <= n) best = len;
  return best;
}

/** Offers the best plans with f_out = C·M/K, once per value; true when that value has plans. */
function offerValue(d: Domain, lead: Leader, m: number, k: number): boolean {
  const g = gcdNumber(k, m);
  const m0 = m / g;
  const k0 = k / g;
  const seen = ranked.get(k0);
  if (seen === m0) return false;
  // One remembered value per K0 is enough: a collision only costs ranking a value again.
  ranked.set(k0, m0);
  return offerPlansOfRatio(d, lead, m0, k0);
}
