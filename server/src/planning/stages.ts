// Dividers made of counter stages in a chain: D = x·y, one value from each stage's range (a timer
// that divides by (prescaler + 1)·(period + 1) is two such stages). The dividers two stages make
// are not a contiguous range — no prime above both stages' tops is one, and near the top of the
// range few numbers split into two values that fit — so the searches ask this set instead:
// is D a member, which member comes next, which member is the next multiple of g.
//
// Every answer is exact. Two ways to find a member, the cheaper chosen each time:
//   - test candidates one by one (D is a member when it has a divisor in the window
//     [max(x1, D/y2), min(x2, D/y1)]); cheap where members are dense (low D, wide windows);
//   - walk the window of the narrower stage once, taking for each x the best partner y; cheap
//     where members are sparse, which is exactly where that window is narrow (D near x2·y2).
// All values are whole doubles below 2^53 (stage tops ≤ 2^32 each, products ≤ 2^32 in practice).

import { divisorsInRange } from './divisors';

export interface DividerStage {
  /** The stage's name in the clock file, e.g. `prescaler`. */
  name: string;
  min: number;
  max: number;
  /** What the stage's register holds: value + registerOffset (a counter that divides by register + 1 has −1). */
  registerOffset: number;
}

/** One stage's part of a divider, as the JSON and the C export report it. */
export interface StageValue {
  name: string;
  value: number;
  /** value + registerOffset: what firmware writes to the stage's register. */
  register: number;
}

/** Candidates tested one by one before the window walk takes over. */
const SCAN = 24;
/** Windows up to this width are walked at once rather than scanned. */
const WINDOW = 256;

const scratch: number[] = [];

/**
 * The smallest divisor of p in [lo, hi] (whole numbers, 1 ≤ lo), or 0 when there is none. The
 * cheapest of: testing each candidate, testing each cofactor, or factoring p.
 */
export function smallestDivisorIn(p: number, lo: number, hi: number): number {
  if (hi > p) hi = p;
  if (lo > hi) return 0;
  const width = hi - lo + 1;
  const coLo = Math.ceil(p / hi);
  const coHi = Math.floor(p / lo);
  if (width <= 64 || width <= (coHi - coLo + 1) / 4) {
    for (let x = lo; x <= hi; x++) if (Number.isInteger(p / x)) return x;
    return 0;
  }
  if (coHi - coLo + 1 <= 64) {
    // The largest cofactor gives the smallest divisor.
    for (let c = coHi; c >= coLo; c--) if (Number.isInteger(p / c)) return p / c;
    return 0;
  }
  if (divisorsInRange(p, lo, hi, scratch) === 0) return 0;
  let least = Infinity;
  for (const x of scratch) if (x < least) least = x;
  return least;
}

/** The products x·y with x in [x1, x2] and y in [y1, y2] (all whole, 1 ≤ x1 ≤ x2, 1 ≤ y1 ≤ y2). */
export class StageProducts {
  readonly min: number;
  readonly max: number;
  /** Every whole number in [min, completeTo] is a member (one stage at 1 lets the other run through). */
  readonly completeTo: number;

  constructor(
    readonly x1: number,
    readonly x2: number,
    readonly y1: number,
    readonly y2: number,
  ) {
    this.min = x1 * y1;
    this.max = x2 * y2;
    let complete = this.min;
    if (x1 === 1) complete = Math.max(complete, y2);
    if (y1 === 1) complete = Math.max(complete, x2);
    this.completeTo = complete;
  }

  /** p is a member: it has a divisor x in [max(x1, ⌈p/y2⌉), min(x2, ⌊p/y1⌋)], the x that pair with a y. */
  has(p: number): boolean {
    if (!Number.isInteger(p) || p < this.min || p > this.max) return false;
    if (p <= this.completeTo) return true;
    return smallestDivisorIn(p, Math.max(this.x1, Math.ceil(p / this.y2)), Math.min(this.x2, Math.floor(p / this.y1))) !== 0;
  }

  /** The stage values of member p, the first stage as small as it can be; null when p is no member. */
  split(p: number): [number, number] | null {
    if (!Number.isInteger(p) || p < this.min || p > this.max) return null;
    const x = smallestDivisorIn(p, Math.max(this.x1, Math.ceil(p / this.y2)), Math.min(this.x2, Math.floor(p / this.y1)));
    return x === 0 ? null : [x, p / x];
  }

  /** Width of the narrower stage window around p: what one window walk costs. */
  private windowWidth(p: number): number {
    return this.narrower(p)[4];
  }

  /** The smallest member in [lo, hi]; 0 when there is none. */
  next(lo: number, hi: number): number {
    lo = Math.max(Math.ceil(lo), this.min);
    hi = Math.min(Math.floor(hi), this.max);
    if (lo > hi) return 0;
    if (lo <= this.completeTo) return lo;
    if (this.windowWidth(lo) > WINDOW) {
      const top = Math.min(hi, lo + SCAN - 1);
      for (let p = lo; p <= top; p++) if (this.has(p)) return p;
      lo = top + 1;
      if (lo > hi) return 0;
    }
    // Walk the narrower window: for each value a of one stage the least partner b with a·b ≥ lo.
    const [a1, a2, b1, b2] = this.narrower(lo);
    let best = Infinity;
    const aHi = Math.min(a2, Math.ceil(lo / b1));
    for (let a = Math.max(a1, Math.floor(lo / b2)); a <= aHi; a++) {
      const b = Math.max(b1, Math.ceil(lo / a));
      if (b > b2) continue;
      const p = a * b;
      if (p < best) {
        best = p;
        if (p === lo) break;
      }
    }
    return best <= hi ? best : 0;
  }

  /** The largest member in [lo, hi]; 0 when there is none. */
  prev(lo: number, hi: number): number {
    lo = Math.max(Math.ceil(lo), this.min);
    hi = Math.min(Math.floor(hi), this.max);
    if (lo > hi) return 0;
    if (hi <= this.completeTo) return hi;
    if (this.windowWidth(hi) > WINDOW) {
      const bottom = Math.max(lo, hi - SCAN + 1, this.completeTo + 1);
      for (let p = hi; p >= bottom; p--) if (this.has(p)) return p;
      hi = bottom - 1;
      if (hi <= this.completeTo) return hi >= lo ? hi : 0;
    }
    const [a1, a2, b1, b2] = this.narrower(hi);
    let best = 0;
    const aHi = Math.min(a2, Math.floor(hi / b1));
    for (let a = Math.max(a1, Math.floor(hi / b2)); a <= aHi; a++) {
      const b = Math.min(b2, Math.floor(hi / a));
      if (b < b1) continue;
      const p = a * b;
      if (p > best) {
        best = p;
        if (p === hi) break;
      }
    }
    return best >= lo ? best : 0;
  }

  /** The stage ranges, the one with the narrower window around p first, and that window's width. */
  private narrower(p: number): [number, number, number, number, number] {
    const wx = Math.min(this.x2, Math.ceil(p / this.y1)) - Math.max(this.x1, Math.floor(p / this.y2)) + 1;
    const wy = Math.min(this.y2, Math.ceil(p / this.x1)) - Math.max(this.y1, Math.floor(p / this.x2)) + 1;
    return wx <= wy ? [this.x1, this.x2, this.y1, this.y2, wx] : [this.y1, this.y2, this.x1, this.x2, wy];
  }

  /**
   * The smallest member in [lo, hi] that is a multiple of g; 0 when there is none. With
   * g | x·y there is a split g = gx·gy with gx | x and gy | y (take gx = gcd(g, x)), so the
   * answer is g times the smallest member of one of the scaled sets {x/gx}·{y/gy}.
   */
  nextMultiple(g: number, lo: number, hi: number): number {
    if (g === 1) return this.next(lo, hi);
    lo = Math.max(lo, this.min);
    hi = Math.min(hi, this.max);
    const t0 = Math.ceil(lo / g);
    let t1 = Math.floor(hi / g);
    if (t0 > t1) return 0;
    if (t0 * g <= this.completeTo) return t0 * g;
    const splits: number[] = [];
    divisorsInRange(g, Math.ceil(g / this.y2), this.x2, splits);
    let best = 0;
    for (const gx of splits) {
      const gy = g / gx;
      const x1 = Math.ceil(this.x1 / gx);
      const x2 = Math.floor(this.x2 / gx);
      const y1 = Math.ceil(this.y1 / gy);
      const y2 = Math.floor(this.y2 / gy);
      if (x1 > x2 || y1 > y2) continue;
      const t = new StageProducts(x1, x2, y1, y2).next(t0, t1);
      if (t === 0) continue;
      best = t * g;
      if (t === t0) break;
      t1 = t - 1;
    }
    return best;
  }
}

/** Members visited in ascending order, found a chunk at a time by marking the products that fall in it. */
export class MemberWalk {
  private chunk = new Uint8Array(0);
  private chunkLo = 0;
  private chunkHi = -1;
  private at: number;

  constructor(
    private readonly set: StageProducts,
    lo: number,
    private readonly hi: number,
  ) {
    this.at = Math.max(Math.ceil(lo), set.min);
  }

  /** The next member above the last one returned (the first: at or above lo); 0 past hi. */
  next(): number {
    const top = Math.min(this.hi, this.set.max);
    while (this.at <= top) {
      if (this.at > this.chunkHi) this.mark(this.at, Math.min(top, this.at + CHUNK - 1));
      for (; this.at <= this.chunkHi; this.at++) {
        if (this.chunk[this.at - this.chunkLo] === 1) return this.at++;
      }
    }
    return 0;
  }

  /** Marks the members of [lo, hi]: every a·b in it, over the stage with fewer values that can reach it. */
  private mark(lo: number, hi: number): void {
    const { x1, x2, y1, y2 } = this.set;
    if (this.chunk.length < hi - lo + 1) this.chunk = new Uint8Array(CHUNK);
    this.chunk.fill(0);
    this.chunkLo = lo;
    this.chunkHi = hi;
    if (hi <= this.set.completeTo) {
      this.chunk.fill(1, 0, hi - lo + 1);
      return;
    }
    const xs = Math.min(x2, Math.floor(hi / y1)) - Math.max(x1, Math.ceil(lo / y2));
    const ys = Math.min(y2, Math.floor(hi / x1)) - Math.max(y1, Math.ceil(lo / x2));
    const [a1, a2, b1, b2] = xs <= ys ? [x1, x2, y1, y2] : [y1, y2, x1, x2];
    const aHi = Math.min(a2, Math.floor(hi / b1));
    for (let a = Math.max(a1, Math.ceil(lo / b2)); a <= aHi; a++) {
      const bHi = Math.min(b2, Math.floor(hi / a));
      for (let p = a * Math.max(b1, Math.ceil(lo / a)); p <= a * bHi; p += a) this.chunk[p - lo] = 1;
    }
  }
}

/** Members marked at once by a MemberWalk. */
const CHUNK = 4096;

/** The set of a two-stage divider, or null for one stage (a contiguous range needs none). */
export function stageProducts(stages: readonly DividerStage[] | undefined): StageProducts | null {
  if (stages === undefined || stages.length !== 2) return null;
  const [x, y] = stages as [DividerStage, DividerStage];
  const set = new StageProducts(x.min, x.max, y.min, y.max);
  return set.completeTo >= set.max ? null : set;
}

/**
 * The stage values of divider d, or null when the stages cannot make it. Tie-break: the earliest
 * stage takes the smallest value that works, so the last stage (a timer's period) counts the
 * longest and a firmware that retunes it at run time gets the finest steps.
 */
export function splitDivider(stages: readonly DividerStage[], d: number): StageValue[] | null {
  const at = (stage: DividerStage, value: number): StageValue => ({ name: stage.name, value, register: value + stage.registerOffset });
  if (stages.length === 1) {
    const s = stages[0]!;
    return Number.isInteger(d) && d >= s.min && d <= s.max ? [at(s, d)] : null;
  }
  if (stages.length !== 2) return null;
  const [x, y] = stages as [DividerStage, DividerStage];
  const values = new StageProducts(x.min, x.max, y.min, y.max).split(d);
  return values === null ? null : [at(x, values[0]), at(y, values[1])];
}
