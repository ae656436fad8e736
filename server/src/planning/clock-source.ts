// Every system clock the clock tree can make, exactly and once each. An integer-N PLL locks
// when the divided VCO equals the divided reference (the standard relations of any PLL text):
//   f_pfd = f_ref / R,   f_vco = f_pfd · N = f_ref · N / R,   f_sys = f_vco / (P1 · P2 · …)
// with R, N and every post-divider stage within their ranges, f_pfd and f_vco within the
// datasheet's. Many settings make the same f_sys; each clock keeps the setting that serves the
// peripherals, then the one with the most VCO margin, then the smallest R, N and post dividers.

import { type Rational, ZERO, ceil, cmp, div, floor, gcdNumber, mul, rat, sub, toNumber } from '../../../shared-schema/src/rational';
import { peripheralAchieved } from './peripherals';

export interface PllRanges {
  /** f_ref, the crystal. */
  crystalHz: Rational;
  referenceDivider: { min: number; max: number };
  feedbackMultiplier: { min: number; max: number };
  /** Allowed f_pfd; null: any. */
  phaseDetectorHz: { min: Rational; max: Rational } | null;
  vcoHz: { min: Rational; max: Rational };
  /** The post-divider stages in file order, each with its allowed values ascending. */
  postStages: { name: string; values: number[] }[];
}

/** A peripheral that takes its clock from the tree, with its tolerance resolved to hertz. */
export interface PeripheralClock {
  name: string;
  targetHz: Rational;
  toleranceHz: Rational;
  source: 'system-clock' | 'vco';
  dividerMin: number;
  dividerMax: number;
}

/** Where the system clock comes from, and what else the tree must feed. */
export interface ClockTree {
  /** fixed: `system-clock` only; pll: every clock the PLL reaches; list: `system-clock-candidates`. */
  source: 'fixed' | 'pll' | 'list';
  pll: PllRanges | null;
  /** The listed clocks (list source). */
  candidatesHz: Rational[];
  /** e, the clock's relative tolerance (`system-clock-tolerance`); 0 when not given. */
  toleranceRatio: Rational;
  /** `rated-system-clock`, or null. */
  ratedHz: Rational | null;
  peripherals: PeripheralClock[];
}

export interface PllSetting {
  referenceDivider: number;
  feedbackMultiplier: number;
  /** One value per post-divider stage, in the stages' order. */
  postDividers: number[];
  pfdHz: Rational;
  vcoHz: Rational;
}

/** One system clock the tree can make. */
export interface ReachableClock {
  systemClockHz: Rational;
  /** The PLL setting kept for it (null for a listed or fixed clock). */
  setting: PllSetting | null;
  /** min(f_vco − VCO min, VCO max − f_vco) / (VCO max − VCO min): 0 at an edge, 0.5 mid-range; 0 without a PLL. */
  vcoMargin: number;
  /** Every peripheral gets its clock within its tolerance. */
  peripheralsOk: boolean;
}

/** Settings one enumeration may visit (R · N · post-divider products after the range checks). */
export const MAX_PLL_SETTINGS = 1 << 20;
/** Distinct post-divider products kept. */
export const MAX_POST_PRODUCTS = 1 << 12;

/** The distinct products of the post-divider stages, ascending, each with its first (smallest-first) stage values. */
export function postProducts(stages: PllRanges['postStages']): { product: number; values: number[] }[] | null {
  let products = new Map<number, number[]>([[1, []]]);
  for (const stage of stages) {
    const next = new Map<number, number[]>();
    for (const [p, values] of products) {
      for (const v of stage.values) {
        const q = p * v;
        if (!next.has(q)) next.set(q, [...values, v]);
      }
      if (next.size > MAX_POST_PRODUCTS) return null;
    }
    products = next;
  }
  return [...products].sort((a, b) => a[0] - b[0]).map(([product, values]) => ({ product, values }));
}

/** The feedback multipliers that keep f_vco in range for one R, or null when f_pfd is out of range. */
export function multiplierSpan(pll: PllRanges, r: number): { lo: number; hi: number; pfd: Rational } | null {
  const pfd = div(pll.crystalHz, rat(r));
  const pd = pll.phaseDetectorHz;
  if (pd && (cmp(pfd, pd.min) < 0 || cmp(pfd, pd.max) > 0)) return null;
  const lo = Math.max(pll.feedbackMultiplier.min, Number(ceil(div(pll.vcoHz.min, pfd))));
  const hi = Math.min(pll.feedbackMultiplier.max, Number(floor(div(pll.vcoHz.max, pfd))));
  return lo <= hi ? { lo, hi, pfd } : null;
}

/** How many settings the PLL has after the f_pfd and f_vco checks; null when the products overflow. */
export function pllSettingCount(pll: PllRanges): number | null {
  const products = postProducts(pll.postStages);
  if (products === null) return null;
  let count = 0;
  for (let r = pll.referenceDivider.min; r <= pll.referenceDivider.max; r++) {
    const span = multiplierSpan(pll, r);
    if (span) count += (span.hi - span.lo + 1) * products.length;
  }
  return count;
}

/** Share of the VCO range between f_vco and the nearer edge, in [0, 0.5]. */
export function vcoMargin(pll: PllRanges, vcoHz: Rational): number {
  const width = sub(pll.vcoHz.max, pll.vcoHz.min);
  if (width.num === 0n) return 0;
  const below = toNumber(div(sub(vcoHz, pll.vcoHz.min), width));
  return Math.max(0, Math.min(below, 1 - below));
}

/** min(f_vco − VCO min, VCO max − f_vco), exact: the tie-break when two margins agree in doubles. */
function marginHz(pll: PllRanges, vcoHz: Rational): Rational {
  const below = sub(vcoHz, pll.vcoHz.min);
  const above = sub(pll.vcoHz.max, vcoHz);
  return cmp(below, above) <= 0 ? below : above;
}

/** The VCO at `a` (margin ma) has more margin than the one at `b` (margin mb), exactly. */
export function moreMargin(pll: PllRanges, a: Rational, ma: number, b: Rational, mb: number): boolean {
  if (Math.abs(ma - mb) > 1e-9) return ma > mb;
  return cmp(marginHz(pll, a), marginHz(pll, b)) > 0;
}

const keyOf = (r: Rational): string => `${r.num}/${r.den}`;

/** Does every peripheral fed from this source get its clock? (Memoised per source frequency.) */
function peripheralCheck(tree: ClockTree, source: 'system-clock' | 'vco') {
  const wanted = tree.peripherals.filter((p) => p.source === source);
  const memo = new Map<string, boolean>();
  return (hz: Rational): boolean => {
    if (wanted.length === 0) return true;
    const key = keyOf(hz);
    let ok = memo.get(key);
    if (ok === undefined) {
      ok = wanted.every((p) => peripheralAchieved(p, hz, tree.toleranceRatio).withinTolerance);
      memo.set(key, ok);
    }
    return ok;
  };
}

/** f_ref · n / d reduced: on exact doubles while every part stays below 2^53, else on bigints. */
function scaled(ref: Rational, n: number, d: number): Rational {
  const num = Number(ref.num) * n;
  const den = Number(ref.den) * d;
  if (Number.isSafeInteger(num) && Number.isSafeInteger(den) && ref.num <= BigInt(Number.MAX_SAFE_INTEGER)) {
    const g = gcdNumber(num, den);
    return { num: BigInt(num / g), den: BigInt(den / g) };
  }
  return rat(ref.num * BigInt(n), ref.den * BigInt(d));
}

/**
 * Every distinct system clock of the tree, ascending. A fixed tree gives `current` alone; a
 * list gives its clocks; a PLL gives every f_sys it reaches (null when its settings exceed
 * MAX_PLL_SETTINGS: the clock file reports that).
 */
export function reachableClocks(tree: ClockTree, current: Rational): ReachableClock[] | null {
  const sysOk = peripheralCheck(tree, 'system-clock');
  if (tree.source === 'fixed' || (tree.source === 'list' && tree.candidatesHz.length === 0)) {
    return [{ systemClockHz: current, setting: null, vcoMargin: 0, peripheralsOk: sysOk(current) }];
  }
  if (tree.source === 'list') {
    const seen = new Map<string, ReachableClock>();
    for (const hz of tree.candidatesHz) {
      if (!seen.has(keyOf(hz))) seen.set(keyOf(hz), { systemClockHz: hz, setting: null, vcoMargin: 0, peripheralsOk: sysOk(hz) });
    }
    return [...seen.values()].sort((a, b) => cmp(a.systemClockHz, b.systemClockHz));
  }
  const pll = tree.pll!;
  const count = pllSettingCount(pll);
  if (count === null || count > MAX_PLL_SETTINGS) return null;
  const products = postProducts(pll.postStages)!;
  const vcoOk = peripheralCheck(tree, 'vco');
  const best = new Map<string, ReachableClock>();
  for (let r = pll.referenceDivider.min; r <= pll.referenceDivider.max; r++) {
    const span = multiplierSpan(pll, r);
    if (!span) continue;
    for (let n = span.lo; n <= span.hi; n++) {
      const vcoHz = mul(span.pfd, rat(n));
      const margin = vcoMargin(pll, vcoHz);
      const vcoServes = vcoOk(vcoHz);
      for (const { product, values } of products) {
        const f = scaled(pll.crystalHz, n, r * product);
        const key = keyOf(f);
        const held = best.get(key);
        const ok = vcoServes && sysOk(f);
        // Settings arrive in ascending R, then N, then product: the first of equals is the smallest.
        if (held && !(ok && !held.peripheralsOk) && !(ok === held.peripheralsOk && moreMargin(pll, vcoHz, margin, held.setting!.vcoHz, held.vcoMargin))) continue;
        best.set(key, {
          systemClockHz: f,
          setting: { referenceDivider: r, feedbackMultiplier: n, postDividers: values, pfdHz: span.pfd, vcoHz },
          vcoMargin: margin,
          peripheralsOk: ok,
        });
      }
    }
  }
  return [...best.values()].sort((x, y) => cmp(x.systemClockHz, y.systemClockHz));
}

/** The reachable clock equal to `hz`, if the tree makes it. */
export function findClock(clocks: readonly ReachableClock[], hz: Rational): ReachableClock | undefined {
  let lo = 0;
  let hi = clocks.length - 1;
  while (lo <= hi) {
    const mid = (lo + hi) >> 1;
    const c = cmp(clocks[mid]!.systemClockHz, hz);
    if (c === 0) return clocks[mid];
    if (c < 0) lo = mid + 1;
    else hi = mid - 1;
  }
  return undefined;
}

/** The tree of a clock file that names only `system-clock`. */
export const FIXED_CLOCK: ClockTree = { source: 'fixed', pll: null, candidatesHz: [], toleranceRatio: ZERO, ratedHz: null, peripherals: [] };
