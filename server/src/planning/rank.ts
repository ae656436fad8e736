// Which of two candidate plans is better, exactly, and the running leader of a search.
//
// Order of plans (the README quotes this):
//   1. smaller |f_out − f_target| (exact);
//   jitter-free plans, then:  2. larger samples per cycle S = N/M,  3. shorter table N,
//                             4. lower achieved frequency;
//   fractional plans, then:   2. smaller long-share term p(1−p), p = F/2^k (so F = 0 first),
//                             3. larger S,  4. shorter N,  5. smaller divider D.
// Within one mode these keys leave no two distinct plans tied.
//
// The search estimates each error in doubles; two errors closer than the doubles can tell apart
// are compared exactly on bigints, so the leader is always the exact best of what was offered.

import type { Domain } from './domain';
import type { WorkBudget } from './work';

/** Walk steps one exact comparison of two plans counts for (bigint products). */
const EXACT_COST = 16;

export interface Candidate {
  j: number;
  n: number;
  m: number;
}

/** a·b < c·d for non-negative integers, exactly. */
function productLess(a: number, b: number, c: number, d: number): boolean {
  const l = a * b;
  const r = c * d;
  if (l < 2 ** 53 && r < 2 ** 53) return l < r;
  return BigInt(a) * BigInt(b) < BigInt(c) * BigInt(d);
}

/** Negative when a is the better plan, positive when b is, 0 when they are the same plan. */
export function comparePlans(d: Domain, a: Candidate, b: Candidate): number {
  const ea = errorNumerator(d, a);
  const eb = errorNumerator(d, b);
  const l = ea * BigInt(b.j) * BigInt(b.n);
  const r = eb * BigInt(a.j) * BigInt(a.n);
  if (l !== r) return l < r ? -1 : 1;
  if (d.mode === 'fractional' && d.scale > 1) {
    const fa = a.j % d.scale;
    const fb = b.j % d.scale;
    const pa = fa * (d.scale - fa);
    const pb = fb * (d.scale - fb);
    if (pa !== pb) return pa < pb ? -1 : 1;
  }
  // Larger S = N/M first.
  if (productLess(b.n, a.m, a.n, b.m)) return -1;
  if (productLess(a.n, b.m, b.n, a.m)) return 1;
  if (a.n !== b.n) return a.n < b.n ? -1 : 1;
  if (d.mode === 'fractional') return a.j === b.j ? 0 : a.j < b.j ? -1 : 1;
  // Lower f_out = C·M/(J·N).
  const fl = BigInt(a.m) * BigInt(b.j) * BigInt(b.n);
  const fr = BigInt(b.m) * BigInt(a.j) * BigInt(a.n);
  return fl === fr ? 0 : fl < fr ? -1 : 1;
}

/** |kM·M − kJN·J·N|: the exact error times a positive factor common to all plans, over J·N. */
export function errorNumerator(d: Domain, c: Candidate): bigint {
  const e = d.kM * BigInt(c.m) - d.kJN * BigInt(c.j) * BigInt(c.n);
  return e < 0n ? -e : e;
}

/** The best candidate offered so far. */
export class Leader {
  j = 0;
  n = 0;
  m = 0;
  /** Double estimate of the leader's |error| in Hz; Infinity while empty. */
  errF = Infinity;
  private readonly clockF: number;
  private readonly targetF: number;

  /**
   * `budget`: an exact comparison costs about as much as EXACT_COST walk steps, and is counted so
   * (near-ties are the rule, not the exception, for targets with more digits than the doubles hold).
   */
  constructor(
    private readonly d: Domain,
    private readonly budget: WorkBudget | null = null,
  ) {
    this.clockF = d.clockF;
    this.targetF = d.targetF;
  }

  get empty(): boolean {
    return this.errF === Infinity;
  }

  /** Double estimate of |f_out − f_target|. */
  estimate(j: number, n: number, m: number): number {
    return Math.abs((this.clockF * m) / (j * n) - this.targetF);
  }

  /** Room the doubles need: below it two estimates may hide either order. */
  private slack(errF: number): number {
    return 1e-12 * (this.targetF + errF + (this.errF === Infinity ? 0 : this.errF));
  }

  /** Could a plan with this error estimate still beat (or tie) the leader? */
  competitive(errF: number): boolean {
    return errF <= this.errF + this.slack(errF);
  }

  /** Offers a plan; true when it becomes the leader. */
  offer(j: number, n: number, m: number, errF = this.estimate(j, n, m)): boolean {
    if (this.errF !== Infinity) {
      const s = this.slack(errF);
      if (errF > this.errF + s) return false;
      if (errF >= this.errF - s) {
        this.budget?.take(EXACT_COST);
        if (comparePlans(this.d, { j, n, m }, this) >= 0) return false;
      }
    }
    this.j = j;
    this.n = n;
    this.m = m;
    this.errF = errF;
    return true;
  }

  /** The leader's error is exactly zero. */
  exact(): boolean {
    return !this.empty && errorNumerator(this.d, this) === 0n;
  }

  result(): Candidate | null {
    return this.empty ? null : { j: this.j, n: this.n, m: this.m };
  }
}
