// Frequency steps on one table: firmware that steps an output through several frequencies keeps
// one table (N samples holding M cycles) and changes only the divider. The planner chooses the
// table shared by every step and each step's divider (step-table.ts), the table ranked as the
// planner ranks one output's plans (ranking.ts), with the steps' figures in place of one plan's:
//   1. every step within its tolerance first;
//   among tables where every step is:  2. fewer steps on a fractional divider (jitter-free first),
//                                       3. S ≤ S max first;
//   4. the smaller worst share of the tolerance, max over the steps of |f − f_i| / tolerance_i;
//   5. (outside the tolerance) S ≤ S max first;  6. larger min(S, S max);  7. shorter N;  8. larger S.
//
// The search. Only S = N/M matters to the dividers, so the candidates are the fractions u = M/N
// in lowest terms with N ≤ N max and u ≤ 1/S floor, each on its shortest allowed table. A table
// whose worst share is at most E has its pivot step (the one whose tolerance window is narrowest,
// the highest frequency for equal tolerances) within E·tolerance with some divider D, and that
// confines u to [D·(f − E·tol)/f_sys, D·(f + E·tol)/f_sys]. So the search visits, divider by
// divider, the fractions in those windows (farey-walk.ts) and narrows E to the best share found:
// every table it skips is provably worse. Tables within tolerance are looked for first; only when
// there is none (or the best needs fractional dividers) the windows widen. The work is capped
// (STEPS_BUDGET): a search that reaches the cap reports the best table found, marked as such.

import { type Rational, ZERO, cmp, div, mul, rat, sub, toNumber } from '../../../shared-schema/src/rational';
import { walkFractions } from './farey-walk';
import { lengthMultiple } from './exact';
import { jitterFreeDomain, type Domain } from './domain';
import { MemberWalk } from './stages';
import { type StepContext, type StepDivider, exactError, stepDivider } from './step-table';
import type { Hardware, Plan } from './types';

/** Units of work one steps search may take (a window opened, a table judged, a step's divider): about a tenth of a second; counted, not timed, so results do not depend on the machine. */
export const STEPS_BUDGET = 1 << 20;

export interface StepTarget {
  targetHz: Rational;
  toleranceHz: Rational;
}

export interface StepsQuery {
  steps: StepTarget[];
  minSamplesPerCycle: Rational;
  maxSamplesPerCycle: Rational | null;
  wholeSamplesPerCycle: boolean;
  /** Steps may use a fractional divider where no whole one meets their tolerance. */
  fractional: boolean;
  clockTolerance: Rational | null;
}

export interface SteppedPlans {
  /** Each step's plan on the shared table, in the order of the steps. */
  steps: Plan[];
  /** Every step meets its tolerance. */
  within: boolean;
}

/** A judged table: u = m0/n0 in lowest terms on the table (n, m). */
interface Judged {
  m0: number;
  n0: number;
  n: number;
  m: number;
  dividers: StepDivider[];
  within: boolean;
  frac: number;
  under: boolean;
  /** Worst share of the tolerance, in doubles. */
  w: number;
}

const MARGIN = 1e-9;

export function planSteps(hw: Hardware, q: StepsQuery, budget = STEPS_BUDGET): SteppedPlans | null {
  if (q.steps.length === 0) return null;
  const d = jitterFreeDomain(hw, { targetHz: q.steps[0]!.targetHz, minSamplesPerCycle: q.minSamplesPerCycle });
  if (d === null) return null;
  const k = q.fractional ? hw.divider.fractionBits : 0;
  const ctx: StepContext = {
    clock: hw.systemClockHz,
    clockF: toNumber(hw.systemClockHz),
    fractionBits: k,
    scale: 2 ** k,
    jMin: d.jMin,
    jMax: d.jMax,
    stages: d.dividers,
    targets: q.steps.map((s) => s.targetHz),
    tolerances: q.steps.map((s) => s.toleranceHz),
    targetF: q.steps.map((s) => toNumber(s.targetHz)),
    toleranceF: q.steps.map((s) => toNumber(s.toleranceHz)),
    clockTolerance: q.clockTolerance ?? ZERO,
    clockToleranceF: q.clockTolerance ? toNumber(q.clockTolerance) : 0,
  };
  return new StepsSearch(ctx, d, q, budget, hw.divider.fractionBits).run();
}

class StepsSearch {
  private best: Judged | null = null;
  /** Tables the doubles cannot rank against the best: settled exactly at the end. */
  private finalists: Judged[] = [];
  private readonly seen = new Set<number>();
  private readonly scratch: StepDivider[];
  private left: number;
  private readonly order: number[];
  private readonly pivot: number;
  private readonly capNum: number;
  private readonly capDen: number;

  constructor(
    private readonly c: StepContext,
    private readonly d: Domain,
    private readonly q: StepsQuery,
    budget: number,
    private readonly fractionBits: number,
  ) {
    this.left = budget;
    const n = q.steps.length;
    this.scratch = q.steps.map(() => ({ j: 0, k: 0, err: 0, within: false }));
    // Pivot: the narrowest window per divider, tolerance / f² (its windows hold the fewest tables);
    // a step of tolerance 0 only when every step has it (its windows never widen).
    const weight = (i: number): number => (c.toleranceF[i]! > 0 ? c.toleranceF[i]! / (c.targetF[i]! * c.targetF[i]!) : Infinity);
    this.order = [...Array(n).keys()].sort((a, b) => weight(a) - weight(b) || a - b);
    this.pivot = this.order[0]!;
    const cap = q.maxSamplesPerCycle;
    this.capNum = cap === null ? 0 : Number(cap.num);
    this.capDen = cap === null ? 0 : Number(cap.den);
  }

  private take(units: number): boolean {
    this.left -= units;
    return this.left >= 0;
  }

  get complete(): boolean {
    return this.left >= 0;
  }

  run(): SteppedPlans | null {
    const c = this.c;
    const k = this.q.fractional ? c.fractionBits : 0;
    // Within tolerance, whole pivot dividers; then fractional ones when they could still help.
    this.windows(1, 0);
    const settled = (): boolean => this.best !== null && this.best.within && this.best.frac === 0;
    if (!settled() && k > 0) this.windows(1, k);
    if (this.best !== null && this.best.within) return this.result();
    // Nothing within tolerance: the nearest table, the windows widening until one holds it. Once
    // neighbouring windows overlap (E·tol·(2·D min + 1) ≥ f) they hold every table: one plain
    // pass over all of them instead.
    const p = this.pivot;
    // A step of tolerance 0 that no table hits exactly leaves every share infinite: no window
    // bound can help then.
    const zero = c.toleranceF.some((t) => t === 0);
    const cover = this.c.toleranceF[p]! > 0 && !zero ? this.c.targetF[p]! / (this.c.toleranceF[p]! * (2 * c.jMin + 1)) : 0;
    for (let e = 2; this.complete; e *= 2) {
      if (e >= cover) {
        this.everyTable();
        break;
      }
      this.windows(e, 0);
      if (k > 0) this.windows(e, k);
      if (this.best !== null && this.best.w <= e) break;
    }
    return this.result();
  }

  /**
   * A search stopped by its budget before it judged any table still names one: the first tables
   * from the S floor up, judged outside the budget (at most a few thousand units).
   */
  private anyTable(): void {
    const saved = this.left;
    this.left = 4096;
    const uMax = Number(this.d.sDen) / Number(this.d.sNum);
    walkFractions(uMax / 2, uMax, this.d.nMax, (m0, n0) => this.judge(m0, n0) && this.best === null);
    this.left = Math.min(saved, -1);
  }

  /** Judges every table (the nearest when no bound helps). */
  private everyTable(): void {
    const uMax = Number(this.d.sDen) / Number(this.d.sNum);
    if (this.q.wholeSamplesPerCycle) {
      for (let sp = Math.max(1, Math.ceil(1 / uMax)); sp <= this.d.nMax; sp++) if (!this.judge(1, sp)) return;
    } else walkFractions(1 / this.d.nMax, uMax, this.d.nMax, (m0, n0) => this.judge(m0, n0));
  }

  /** The bound on the worst share the windows use now: E, narrowed to the best when that is safe. */
  private bound(e: number): number {
    const b = this.best;
    if (b === null) return e;
    // A table with fewer fractional steps or under the ceiling beats the best whatever its share.
    if (b.within && b.frac === 0 && (this.capDen === 0 || b.under)) return Math.min(e, b.w * (1 + MARGIN));
    if (!b.within) return Math.min(e, b.w * (1 + MARGIN));
    return e;
  }

  /** Visits the windows of the pivot's dividers of k fraction bits for shares up to e. */
  private windows(e: number, k: number): void {
    const c = this.c;
    const p = this.pivot;
    const f = c.targetF[p]!;
    const s = 2 ** k;
    const uMax = Number(this.d.sDen) / Number(this.d.sNum);
    const uMin = 1 / this.d.nMax;
    const spread = (x: number): number => x * c.toleranceF[p]!;
    const jLo = Math.max(c.jMin * s, Math.floor((c.clockF * s * uMin) / (f + spread(e))));
    const jHi = Math.min(c.jMax * s + s - 1, Math.ceil((c.clockF * s * uMax) / Math.max(f - spread(e), f * 1e-300)));
    const members = k === 0 && c.stages !== null ? new MemberWalk(c.stages, jLo, jHi) : null;
    for (let j = members === null ? jLo : members.next(); j !== 0 && j <= jHi; j = members === null ? j + 1 : members.next()) {
      if (!this.take(1)) return;
      const bound = this.bound(e);
      const lo = Math.max(uMin, ((j / s) * (f - spread(bound))) / c.clockF) * (1 - MARGIN);
      const hi = Math.min(uMax, ((j / s) * (f + spread(bound))) / c.clockF) * (1 + MARGIN);
      if (hi < lo) continue;
      // Every other step narrows the window too, when every table that could win needs a whole
      // divider on each step within the bound: step i's windows [D·(f_i − E·tol_i), D·(f_i + E·tol_i)]/f_sys.
      if (this.order.length > 1 && this.wholeNeeded(bound)) {
        if (!this.narrow(1, lo, hi, bound)) return;
      } else if (!this.fractionsIn(lo, hi)) return;
    }
  }

  /** The part of [lo, hi] where steps order[level…] are each within `bound` of some whole divider. */
  private narrow(level: number, lo: number, hi: number, bound: number): boolean {
    if (level === this.order.length) return this.fractionsIn(lo, hi);
    const c = this.c;
    const i = this.order[level]!;
    const f = c.targetF[i]!;
    const t = bound * c.toleranceF[i]!;
    const dLo = Math.max(c.jMin, Math.floor((c.clockF * lo) / (f + t)));
    const dHi = Math.min(c.jMax, Math.ceil((c.clockF * hi) / Math.max(f - t, f * 1e-300)));
    if (!this.take(1)) return false;
    for (let d = dLo; d <= dHi; d++) {
      const sub = Math.max(lo, ((d * (f - t)) / c.clockF) * (1 - MARGIN));
      const top = Math.min(hi, ((d * (f + t)) / c.clockF) * (1 + MARGIN));
      if (top >= sub && !this.narrow(level + 1, sub, top, bound)) return false;
    }
    return true;
  }

  /** Every table that could beat the best needs whole dividers within this bound on every step. */
  private wholeNeeded(bound: number): boolean {
    const b = this.best;
    if (!this.q.fractional || this.c.fractionBits === 0) return bound < Infinity;
    return b !== null && b.within && b.frac === 0 && bound <= 1;
  }

  /** Judges the tables of the fractions in [lo, hi]; false once the budget is spent. */
  private fractionsIn(lo: number, hi: number): boolean {
    if (this.q.wholeSamplesPerCycle) {
      for (let sp = Math.max(1, Math.ceil(1 / hi)); sp <= Math.floor(1 / lo) && sp <= this.d.nMax; sp++) if (!this.judge(1, sp)) return false;
      return true;
    }
    walkFractions(lo, hi, this.d.nMax, (m0, n0) => this.judge(m0, n0));
    return this.complete;
  }

  /** Judges the table of u = m0/n0; false once the budget is spent. */
  private judge(m0: number, n0: number): boolean {
    if (!this.take(1)) return false;
    const d = this.d;
    // S = n0/m0 ≥ S floor, exactly.
    if (n0 * Number(d.sDen) < m0 * Number(d.sNum)) return true;
    const n = lengthMultiple(d, n0);
    if (n === 0) return true;
    const m = m0 * (n / n0);
    const under = this.capDen === 0 || n0 * this.capDen <= m0 * this.capNum;
    const b = this.best;
    const dividers = this.scratch;
    let within = true;
    let frac = 0;
    let w = 0;
    for (const i of this.order) {
      this.take(1);
      const sd = stepDivider(this.c, i, m, n, this.q.fractional, dividers[i]);
      if (sd === null) return true;
      within &&= sd.within;
      if (sd.k > 0 && sd.j % this.c.scale !== 0) frac++;
      const tol = this.c.toleranceF[i]!;
      w = Math.max(w, tol > 0 ? sd.err / tol : sd.err === 0 ? 0 : Infinity);
      if (b !== null && this.worse(b, within, frac, under, w)) return true;
    }
    // Copied only when kept: the scratch is reused for the next table.
    this.offer({ m0, n0, n, m, dividers: dividers.map((x) => ({ ...x })), within, frac, under, w });
    return true;
  }

  /** A table whose steps so far give these figures can only rank after b. */
  private worse(b: Judged, within: boolean, frac: number, under: boolean, w: number): boolean {
    if (b.within) {
      if (!within) return true;
      if (frac > b.frac) return true;
      if (frac < b.frac) return false;
      if (under !== b.under) return !under;
      return w > b.w * (1 + MARGIN);
    }
    return !within && w > b.w * (1 + MARGIN);
  }

  private offer(t: Judged): void {
    const b = this.best;
    if (b === null || compareJudged(t, b, this.q) < 0) {
      this.best = t;
      this.finalists = this.finalists.filter((f) => !definitelyAfter(f, t, this.q));
      this.seen.clear();
      for (const f of this.finalists) this.seen.add(f.n0 * 2 ** 26 + f.m0);
    }
    // A table is judged again by each window that holds it: keep it once.
    const key = t.n0 * 2 ** 26 + t.m0;
    if (!this.seen.has(key) && !definitelyAfter(t, this.best!, this.q)) {
      this.seen.add(key);
      this.finalists.push(t);
    }
  }

  private result(): SteppedPlans | null {
    if (this.best === null && !this.complete) this.anyTable();
    if (this.best === null) return null;
    const exact = this.finalists.map((t) => ({ t, share: exactShare(this.c, t) }));
    exact.sort((a, b) => compareExact(a.t, a.share, b.t, b.share, this.q));
    const t = exact[0]!.t;
    const limited = !this.complete;
    const k = this.fractionBits;
    const steps = t.dividers.map((sd, i): Plan => {
      const achievedHz = div(mul(this.c.clock, rat(BigInt(t.m) << BigInt(sd.k))), rat(BigInt(sd.j) * BigInt(t.n)));
      // A whole divider J = D; a fractional one J = I·2^k + F with the hardware's k.
      return {
        ...(limited ? { searchLimited: true as const } : {}),
        dividerInteger: Math.floor(sd.j / 2 ** sd.k),
        dividerFraction: sd.k === 0 ? 0 : sd.j % 2 ** sd.k,
        fractionBits: k,
        tableLength: t.n,
        cycles: rat(t.m),
        achievedHz,
        errorHz: sub(achievedHz, this.c.targets[i]!),
      };
    });
    return { steps, within: t.within };
  }
}

const first = (x: boolean, y: boolean): number => (x === y ? 0 : x ? -1 : 1);

/** The keys before the share (1–3): within, fractional steps, S ≤ S max. */
function beforeShare(a: Judged, b: Judged): number {
  const c = first(a.within, b.within);
  if (c !== 0 || !a.within) return c;
  if (a.frac !== b.frac) return a.frac < b.frac ? -1 : 1;
  return first(a.under, b.under);
}

/** The keys after the share (5–8). */
function afterShare(a: Judged, b: Judged, q: StepsQuery): number {
  if (!a.within) {
    const c = first(a.under, b.under);
    if (c !== 0) return c;
  }
  const bySamples = (): number => {
    const s = a.n0 * b.m0 - b.n0 * a.m0;
    return s === 0 ? 0 : s > 0 ? -1 : 1;
  };
  // Larger min(S, S max): both under the ceiling compare S; both over it tie at S max.
  if (q.maxSamplesPerCycle === null || (a.under && b.under)) {
    const c = bySamples();
    if (c !== 0) return c;
  }
  if (a.n !== b.n) return a.n < b.n ? -1 : 1;
  return bySamples();
}

/** The documented order on judged tables, the share in doubles. */
function compareJudged(a: Judged, b: Judged, q: StepsQuery): number {
  return beforeShare(a, b) || (a.w === b.w ? 0 : a.w < b.w ? -1 : 1) || afterShare(a, b, q);
}

/** a ranks after b whatever the exact shares within the doubles' margin. */
function definitelyAfter(a: Judged, b: Judged, q: StepsQuery): boolean {
  const c = beforeShare(a, b);
  if (c !== 0) return c > 0;
  // Both infinite (a step of tolerance 0 missed): the shares tie exactly, the rest decides.
  if (a.w === Infinity && b.w === Infinity) return afterShare(a, b, q) > 0;
  return a.w > b.w * (1 + MARGIN);
}

/** max over the steps of |f − f_i| / tolerance_i, exactly (null stands for infinity). */
function exactShare(c: StepContext, t: Judged): Rational | null {
  let worst: Rational = ZERO;
  for (let i = 0; i < t.dividers.length; i++) {
    const sd = t.dividers[i]!;
    const err = exactError(c, i, t.m, t.n, sd.j, sd.k);
    if (c.tolerances[i]!.num === 0n) {
      if (err.num !== 0n) return null;
      continue;
    }
    const share = div(err, c.tolerances[i]!);
    if (cmp(share, worst) > 0) worst = share;
  }
  return worst;
}

function compareExact(a: Judged, sa: Rational | null, b: Judged, sb: Rational | null, q: StepsQuery): number {
  const share = sa === null ? (sb === null ? 0 : 1) : sb === null ? -1 : cmp(sa, sb);
  return beforeShare(a, b) || share || afterShare(a, b, q);
}
