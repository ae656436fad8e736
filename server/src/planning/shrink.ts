// The smaller plans one output could take when the board's tables must share a memory budget
// (board.ts): plans of the output's own divider kind, within its tolerance, with S ≥ S floor, the
// duty still realised when its own plan realises it, and no more bytes than its own plan.
//
// Two questions, each answered by a scan over table lengths N, shortest first:
// - the frontier: for each N the largest S = N/M within tolerance (the smallest such M), kept
//   where S rises — the fewest bytes for each share of the output's own S;
// - the error staircase above a given S: for each N the least error of a plan with S ≥ that, kept
//   where the error falls — the fewest bytes for each share of the tolerance.
// For one (N, M) the best dividers are the floor and the ceiling of J* = C·M/(N·f_target), since
// f_out = C·M/(J·N) is monotone in J; doubles decide unless a value sits within 1e-12 of a
// boundary, which is then settled exactly. Both scans stop at a step budget (SHRINK_BUDGET).

import { type Rational, ZERO, cmp, div, mul, rat, sub, toNumber } from '../../../shared-schema/src/rational';
import { worstErrorHz } from './clock-error';
import { realisesDutyAt } from './duty';
import { type Preference, samplesPerCycle, withinTolerance } from './ranking';
import type { Hardware, Plan } from './types';

/** Table lengths and (N, M) checks one scan may make: a few milliseconds. */
export const SHRINK_BUDGET = 1 << 18;

/** One plan of the menu, by its table length, cycles and best divider (in 1/2^k steps when fractional). */
export interface MenuPlan {
  n: number;
  m: number;
  j: number;
}

/**
 * The work a whole board's menus may do together (table lengths and (N, M) checks): each menu
 * gets an even share, at least MENU_MIN_STEPS, so neither time nor memory grows past it.
 */
export const BOARD_BUDGET = 1 << 21;
const MENU_MIN_STEPS = 1 << 12;

/** The steps each of `menus` menus may take. */
export const menuSteps = (menus: number): number => Math.min(SHRINK_BUDGET, Math.max(MENU_MIN_STEPS, Math.floor(BOARD_BUDGET / Math.max(1, menus))));

/** Menu plans in typed arrays: a frontier can hold one per table length. */
export class Frontier {
  private ns = new Float64Array(16);
  private ms = new Float64Array(16);
  private js = new Float64Array(16);
  length = 0;

  push(p: MenuPlan): void {
    if (this.length === this.ns.length) {
      const grow = (a: Float64Array<ArrayBuffer>): Float64Array<ArrayBuffer> => {
        const b = new Float64Array(a.length * 2);
        b.set(a);
        return b;
      };
      this.ns = grow(this.ns);
      this.ms = grow(this.ms);
      this.js = grow(this.js);
    }
    this.ns[this.length] = p.n;
    this.ms[this.length] = p.m;
    this.js[this.length] = p.j;
    this.length++;
  }

  at(k: number): MenuPlan {
    return { n: this.ns[k]!, m: this.ms[k]!, j: this.js[k]! };
  }

  n(k: number): number {
    return this.ns[k]!;
  }

  m(k: number): number {
    return this.ms[k]!;
  }
}

export class ShrinkMenu {
  /** S of the output's own plan, exact. */
  readonly sRef: Rational;
  readonly nRef: number;
  readonly sampleBytes: number;
  /** Every scan stayed within its budget. */
  complete = true;
  /** The menu holds fractional dividers (the own plan's kind). */
  readonly fractional: boolean;
  private readonly nMin: number;
  private readonly powerOfTwo: boolean;
  private readonly scale: number;
  private readonly clock: Rational;
  private readonly C: number;
  private readonly T: number;
  private readonly tolF: number;
  private readonly e: number;
  private readonly jLo: number;
  private readonly jHi: number;
  private readonly floorF: number;
  private frontierCache: { steps: number; frontier: Frontier } | null = null;

  constructor(
    private readonly hw: Hardware,
    private readonly targetHz: Rational,
    private readonly minSamplesPerCycle: Rational,
    private readonly pref: Preference,
    readonly own: Plan,
    private readonly whole: boolean,
    private readonly dutyKept: Preference['duty'],
  ) {
    const fractional = own.dividerFraction !== 0;
    this.fractional = fractional;
    const k = fractional ? hw.divider.fractionBits : 0;
    this.scale = 2 ** k;
    this.clock = mul(hw.systemClockHz, rat(this.scale));
    this.C = toNumber(this.clock);
    this.T = toNumber(targetHz);
    this.tolF = toNumber(pref.toleranceHz);
    this.e = pref.clockTolerance ? toNumber(pref.clockTolerance) : 0;
    const jRate = Math.ceil(this.C / toNumber(hw.dac.maxSampleRateHz) - 1e-9);
    this.jLo = Math.max(hw.divider.integerMin * this.scale, jRate, 1);
    // The rate limit in doubles may sit one off: settle the edge exactly.
    while (this.jLo > 1 && cmp(div(this.clock, rat(this.jLo - 1)), hw.dac.maxSampleRateHz) <= 0 && this.jLo - 1 >= hw.divider.integerMin * this.scale) this.jLo--;
    while (cmp(div(this.clock, rat(this.jLo)), hw.dac.maxSampleRateHz) > 0) this.jLo++;
    this.jHi = hw.divider.integerMax * this.scale + this.scale - 1;
    this.floorF = toNumber(minSamplesPerCycle);
    this.sRef = samplesPerCycle(own);
    this.nRef = own.tableLength;
    this.sampleBytes = hw.dac.sampleBytes;
    this.nMin = Math.max(1, hw.memory.tableLengthMin);
    if (hw.memory.powerOfTwo) this.nMin = 2 ** Math.ceil(Math.log2(this.nMin));
    this.powerOfTwo = hw.memory.powerOfTwo;
  }

  /** The exact plan of a menu entry. */
  planOf(p: MenuPlan): Plan {
    const achievedHz = div(mul(this.clock, rat(p.m)), rat(BigInt(p.j) * BigInt(p.n)));
    return {
      dividerInteger: Math.floor(p.j / this.scale),
      dividerFraction: p.j % this.scale,
      fractionBits: this.hw.divider.fractionBits,
      tableLength: p.n,
      cycles: rat(p.m),
      achievedHz,
      errorHz: sub(achievedHz, this.targetHz),
    };
  }

  /** The allowed table length after n (powers of two only when the clock asks for them). */
  private next(n: number): number {
    return this.powerOfTwo ? 2 * n : n + 1;
  }

  /** The output's own plan as a menu entry. */
  private ownPlan(): MenuPlan {
    return { n: this.own.tableLength, m: Number(this.own.cycles.num), j: this.own.dividerInteger * this.scale + this.own.dividerFraction };
  }

  /** M may hold N: S ≥ floor, whole S where asked, and the duty kept. */
  private admissible(n: number, m: number): boolean {
    if (n < m * this.floorF * (1 - 1e-12)) return false;
    if (n < m * this.floorF * (1 + 1e-12) && cmp(rat(n, m), this.minSamplesPerCycle) < 0) return false;
    if (this.whole && n % m !== 0) return false;
    if (this.dutyKept && !realisesDutyAt(this.dutyKept, n / m)) return false;
    return true;
  }

  /** The divider of least worst-case error for (N, M), and that error in hertz (doubles); j = 0 for none. */
  private best(n: number, m: number, out: { j: number; err: number }): void {
    const cm = this.C * m;
    const ideal = cm / (n * this.T);
    const j0 = Math.min(this.jHi, Math.max(this.jLo, Math.floor(ideal)));
    const j1 = Math.min(this.jHi, Math.max(this.jLo, Math.floor(ideal) + 1));
    const f0 = cm / (j0 * n);
    const f1 = cm / (j1 * n);
    const e0 = Math.abs(f0 - this.T) + this.e * f0;
    const e1 = Math.abs(f1 - this.T) + this.e * f1;
    if (e1 < e0) {
      out.j = j1;
      out.err = e1;
    } else {
      out.j = j0;
      out.err = e0;
    }
  }

  /** The plan (N, M, j) is within the tolerance, exactly when the doubles are too close to call. */
  private within(n: number, m: number, j: number, err: number): boolean {
    if (err < this.tolF * (1 - 1e-12)) return true;
    if (err > this.tolF * (1 + 1e-12)) return false;
    return withinTolerance(this.planOf({ n, m, j }), this.pref);
  }

  /** For each table length, the largest S within tolerance, where it rises; the last entry has S ≥ the own plan's. */
  frontier(budget = SHRINK_BUDGET): Frontier {
    if (this.frontierCache !== null && this.frontierCache.steps === budget) return this.frontierCache.frontier;
    const out = new Frontier();
    const slot = { j: 0, err: 0 };
    let bestN = 0, bestM = 1; // largest S so far = bestN / bestM (0 = none)
    let steps = budget;
    for (let n = this.nMin; n <= this.nRef; n = this.next(n)) {
      // Every length counts, whether or not a cycle count is tried at it.
      if (--steps < 0) break;
      for (let m = 1; n * bestM > bestN * m; m++) {
        if (--steps < 0) break;
        if (!this.admissible(n, m)) {
          if (n < m * this.floorF) break;
          continue;
        }
        this.best(n, m, slot);
        if (slot.j !== 0 && this.within(n, m, slot.j, slot.err)) {
          out.push({ n, m, j: slot.j });
          bestN = n;
          bestM = m;
          break;
        }
      }
      if (steps < 0) {
        this.complete = false;
        break;
      }
    }
    // The own plan is always on the menu (its divider kind, tolerance and duty are the menu's).
    const own = this.ownPlan();
    if (out.length === 0 || out.n(out.length - 1) * own.m < own.n * out.m(out.length - 1)) out.push(own);
    this.frontierCache = { steps: budget, frontier: out };
    return out;
  }

  /**
   * Above S ≥ sMin: for each table length from the start plan's up to nLimit, the plan of least
   * error, where the error falls (exact errors, as shares of the tolerance), until an exact plan.
   */
  staircase(sMin: Rational, start: MenuPlan, nLimit = Infinity, budget = SHRINK_BUDGET): { plan: MenuPlan; share: Rational }[] {
    const out: { plan: MenuPlan; share: Rational }[] = [];
    const sF = toNumber(sMin);
    const slot = { j: 0, err: 0 };
    const tol = this.pref.toleranceHz;
    const shareOf = (e: Rational): Rational => (tol.num === 0n ? rat(0) : div(e, tol));
    // The frontier's plan at the first length is within tolerance with S ≥ sMin: the first step.
    let leastExact: Rational | null = worstError(this.planOf(start), this.pref);
    let least = toNumber(leastExact);
    out.push({ plan: start, share: shareOf(leastExact) });
    let steps = budget;
    for (let n = start.n; n <= this.nRef; n = this.next(n)) {
      if (--steps < 0) break;
      if (n > nLimit || leastExact.num === 0n) break;
      for (let m = 1; n >= m * sF * (1 - 1e-12); m++) {
        if (--steps < 0) break;
        if (n < m * sF * (1 + 1e-12) && cmp(rat(n, m), sMin) < 0) break;
        if (!this.admissible(n, m)) continue;
        this.best(n, m, slot);
        if (slot.j === 0 || slot.err > least * (1 + 1e-12) || !this.within(n, m, slot.j, slot.err)) continue;
        const plan = { n, m, j: slot.j };
        const exact = worstError(this.planOf(plan), this.pref);
        if (cmp(exact, leastExact) >= 0) continue;
        leastExact = exact;
        least = slot.err;
        out.push({ plan, share: shareOf(exact) });
      }
      if (steps < 0) {
        this.complete = false;
        break;
      }
    }
    // The own plan closes the staircase when the scan stopped short of it.
    const own = this.ownPlan();
    const ownError = worstError(this.own, this.pref);
    if (own.n <= nLimit && cmp(ownError, leastExact) < 0 && cmp(rat(own.n, own.m), sMin) >= 0) out.push({ plan: own, share: shareOf(ownError) });
    return out;
  }

  /** Every plan with table length N, S ≥ sMin and error share ≤ maxShare, as exact plans. */
  plansAt(n: number, sMin: Rational, maxShare: Rational): Plan[] {
    const out: Plan[] = [];
    const limit = mul(maxShare, this.pref.toleranceHz);
    for (let m = 1; cmp(rat(n, m), sMin) >= 0; m++) {
      if (!this.admissible(n, m)) continue;
      const ideal = (this.C * m) / (n * this.T);
      for (const raw of [Math.floor(ideal) - 1, Math.floor(ideal), Math.floor(ideal) + 1, Math.floor(ideal) + 2]) {
        const j = Math.min(this.jHi, Math.max(this.jLo, raw));
        const plan = this.planOf({ n, m, j });
        if (withinTolerance(plan, this.pref) && cmp(worstError(plan, this.pref), limit) <= 0 && !out.some((p) => p.dividerInteger === plan.dividerInteger && p.dividerFraction === plan.dividerFraction && p.cycles.num === plan.cycles.num)) {
          out.push(plan);
        }
      }
    }
    return out;
  }
}

/** The error the tolerance is held against: |error| + e·f_out (e = the clock's tolerance). */
export const worstError = (p: Plan, pref: Preference): Rational => worstErrorHz(p, pref.clockTolerance ?? ZERO);
