// The best plans for one fixed divider J, or for one fixed table length N, offered to a Leader.
//
// Fixed J: f_out = (C/J)·(M/N), so the best M/N is a Farey neighbour of x = f_target·J/C among
// fractions with denominator ≤ N max and value ≤ 1/S floor. Fixed N: f_out = (C/N)·(M/J), so the
// best M/J is a neighbour of y = f_target·N/C with numerator ≤ M max(N) and denominator ≤ J max.
// A reduced neighbour below the lower bound (N min, J min) is scaled by the smallest factor that
// lifts it into range; when none does, a plain scan of that one J or N stands in.

import { fareyFloat, FloatNeighbours } from './farey';
import { type Domain, keepsCeiling, maxCycles, minCycles } from './domain';
import type { Leader } from './rank';
import { quietestMultiple } from './exact';
import { WorkBudget } from './work';

const out = new FloatNeighbours();

const UNLIMITED = (): WorkBudget => new WorkBudget(Infinity);

export { WorkBudget };

/** a/b keeps S = b/a ≥ S floor. */
function keepsFloor(d: Domain, a: number, b: number): boolean {
  const l = a * d.sNumF;
  const r = b * d.sDenF;
  if (l < 2 ** 53 && r < 2 ** 53) return l <= r;
  return BigInt(a) * d.sNum <= BigInt(b) * d.sDen;
}

/**
 * The largest M/N ≤ 1/S floor with N ≤ N max (or, for the S ceiling, the smallest M/N ≥ 1/S
 * ceiling), as [M, N]; computed once per domain.
 */
export interface Cap {
  m: number;
  n: number;
  valueF: number;
}

export class ScanJ {
  private readonly ratio: number;
  constructor(
    private readonly d: Domain,
    private readonly lead: Leader,
    private readonly cap: Cap | null,
    private readonly budget: WorkBudget = UNLIMITED(),
    /** The smallest M/N ≥ 1/S ceiling, when the domain has a ceiling. */
    private readonly ceilingCap: Cap | null = null,
  ) {
    this.ratio = d.targetF / d.clockF;
  }

  /** Offers the best plans with divider J. */
  run(j: number): void {
    const d = this.d;
    if (d.powerOfTwo) return this.lengths(j);
    const x = this.ratio * j;
    fareyFloat(x, d.nMax, Infinity, out);
    const la = out.lowerNum, lb = out.lowerDen, ua = out.upperNum, ub = out.upperDen;
    let whole = true;
    const cap = this.cap;
    if (cap !== null && x >= cap.valueF * (1 - 1e-9) && keepsCeiling(d, cap.m, cap.n)) whole = this.offer(j, cap.m, cap.n) && whole;
    // Below 1/S ceiling the best allowed M/N is the smallest one at or above it (the neighbours are out).
    const low = this.ceilingCap;
    if (low !== null && x <= low.valueF * (1 + 1e-9) && keepsFloor(d, low.m, low.n)) whole = this.offer(j, low.m, low.n) && whole;
    if (la >= 1 && keepsFloor(d, la, lb) && keepsCeiling(d, la, lb)) whole = this.offer(j, la, lb) && whole;
    if (ub > 0 && keepsFloor(d, ua, ub) && keepsCeiling(d, ua, ub)) whole = this.offer(j, ua, ub) && whole;
    if (!whole) this.lengths(j);
  }

  /** Offers a/b lifted into [N min, N max]; false when no multiple fits and it could matter. */
  private offer(j: number, a: number, b: number): boolean {
    const d = this.d;
    if (b >= d.nMin) {
      this.lead.offer(j, b, a);
      return true;
    }
    const k = Math.ceil(d.nMin / b);
    if (k * b <= d.nMax) {
      this.lead.offer(j, k * b, k * a);
      return true;
    }
    return !this.lead.competitive(this.lead.estimate(j, b, a));
  }

  /** Plain scan of every allowed N for divider J. */
  lengths(j: number): void {
    const d = this.d;
    const x = this.ratio * j;
    if (d.powerOfTwo) for (const n of d.lengths) this.cycles(j, n, x);
    else for (let n = d.nMin; n <= d.nMax && this.budget.take(); n++) this.cycles(j, n, x);
  }

  private cycles(j: number, n: number, x: number): void {
    const top = maxCycles(this.d, n);
    const least = minCycles(this.d, n);
    if (top < least) return;
    // The best M is floor or ceil of x·N; one more each side covers the rounding of x.
    const m0 = Math.floor(x * n);
    let last = 0;
    for (let m = m0 - 1; m <= m0 + 2; m++) {
      const mc = Math.min(Math.max(m, least), top);
      if (mc !== last) this.lead.offer(j, n, mc);
      last = mc;
    }
  }
}

export class ScanN {
  private readonly ratio: number;
  constructor(
    private readonly d: Domain,
    private readonly lead: Leader,
    private readonly budget: WorkBudget = UNLIMITED(),
  ) {
    this.ratio = d.targetF / d.clockF;
  }

  /** Offers the best plans with table length N. */
  run(n: number): void {
    const d = this.d;
    const top = maxCycles(d, n);
    const least = minCycles(d, n);
    if (top < least) return;
    fareyFloat(this.ratio * n, d.jMax, top, out);
    const la = out.lowerNum, lb = out.lowerDen, ua = out.upperNum, ub = out.upperDen;
    let whole = true;
    if (la >= 1) whole = this.offer(n, top, least, la, lb) && whole;
    if (ub > 0) whole = this.offer(n, top, least, ua, ub) && whole;
    if (!whole) this.dividers(n, top);
  }

  /**
   * Offers m/j lifted into [J min, J max] with M ≥ least (the S ceiling); false when no multiple
   * fits and it could matter.
   */
  private offer(n: number, top: number, least: number, m: number, j: number): boolean {
    const d = this.d;
    const errF = this.lead.estimate(j, n, m);
    if (!this.lead.competitive(errF)) return true;
    const k0 = Math.max(1, Math.ceil(d.jMin / j), Math.ceil(least / m));
    const k1 = Math.min(Math.floor(d.jMax / j), Math.floor(top / m));
    if (k0 > k1) return false;
    let k = k0;
    if (d.mode === 'fractional') {
      // Choosing the quietest multiple walks up to a period of the fraction's residues.
      this.budget.take(Math.min(k1 - k0 + 1, d.scale));
      k = quietestMultiple(d.scale, j, k0, k1);
    }
    this.lead.offer(k * j, n, k * m, errF);
    return true;
  }

  /** Plain scan of every J (or every M, whichever is fewer) for table length N. */
  dividers(n: number, top: number): void {
    const d = this.d;
    const y = this.ratio * n;
    const least = minCycles(d, n);
    if (d.jMax - d.jMin + 1 <= top - least + 1) {
      for (let j = d.jMin; j <= d.jMax && this.budget.take(); j++) {
        // Kept within a step of [least, top]: the clamp below gives the same M, and a value near
        // 2^53 (a target far off the clock's range) would stop m++ from moving.
        const m0 = Math.min(Math.max(Math.floor(y * j), least - 2), top + 1);
        let last = 0;
        for (let m = m0 - 1; m <= m0 + 2; m++) {
          const mc = Math.min(Math.max(m, least), top);
          if (mc !== last) this.lead.offer(j, n, mc);
          last = mc;
        }
      }
      return;
    }
    for (let m = least; m <= top && this.budget.take(); m++) {
      // For fixed N and M the error falls then rises in J: floor or ceil of M/y is best.
      // Kept within a step of [J min, J max], for the same reason as M above: a tiny target makes
      // M/y reach 2^53, where j++ no longer moves, and the loop never ended.
      const j0 = Math.min(Math.max(Math.floor(m / y), d.jMin - 2), d.jMax + 1);
      let last = 0;
      for (let j = j0 - 1; j <= j0 + 2; j++) {
        const jc = Math.min(Math.max(j, d.jMin), d.jMax);
        if (jc !== last) this.lead.offer(jc, n, m);
        last = jc;
      }
    }
  }
}
