// The PLL settings behind one system clock, without enumerating the whole PLL: for each R and
// post-divider product P, f_sys = f_ref·N/(R·P) fixes N = f_sys·R·P/f_ref, which must be whole
// and within range. O(R range · products) per clock.

import { type Rational, abs, cmp, div, floor, isInteger, mul, rat, sub } from '../../../shared-schema/src/rational';
import { type ClockTree, type PllRanges, type PllSetting, moreMargin, multiplierSpan, postProducts, vcoMargin } from './clock-source';
import { peripheralAchieved } from './peripherals';

/** Every setting that makes `hz` exactly, in ascending R then product. */
export function settingsFor(pll: PllRanges, hz: Rational): PllSetting[] {
  const products = postProducts(pll.postStages) ?? [];
  const out: PllSetting[] = [];
  for (let r = pll.referenceDivider.min; r <= pll.referenceDivider.max; r++) {
    const span = multiplierSpan(pll, r);
    if (!span) continue;
    for (const { product, values } of products) {
      const n = div(mul(hz, rat(BigInt(r) * BigInt(product))), pll.crystalHz);
      if (!isInteger(n) || n.num < BigInt(span.lo) || n.num > BigInt(span.hi)) continue;
      out.push({ referenceDivider: r, feedbackMultiplier: Number(n.num), postDividers: values, pfdHz: span.pfd, vcoHz: mul(span.pfd, n) });
    }
  }
  return out;
}

/** The setting kept for `hz`: it feeds the VCO's peripherals, then has the most VCO margin, then the smallest R, N, P. */
export function bestSettingFor(tree: ClockTree, hz: Rational): PllSetting | null {
  if (!tree.pll) return null;
  const vcoPeripherals = tree.peripherals.filter((p) => p.source === 'vco');
  let best: PllSetting | null = null;
  let bestKey: [boolean, number] = [false, -1];
  for (const s of settingsFor(tree.pll, hz)) {
    const ok = vcoPeripherals.every((p) => peripheralAchieved(p, s.vcoHz, tree.toleranceRatio).withinTolerance);
    const margin = vcoMargin(tree.pll, s.vcoHz);
    if (best === null || (ok && !bestKey[0]) || (ok === bestKey[0] && moreMargin(tree.pll, s.vcoHz, margin, best.vcoHz, bestKey[1]))) {
      best = s;
      bestKey = [ok, margin];
    }
  }
  return best;
}

/** The reachable clock nearest `hz` (ties: the lower), or null when the PLL reaches none. */
export function nearestReachable(pll: PllRanges, hz: Rational): Rational | null {
  let best: Rational | null = null;
  for (let r = pll.referenceDivider.min; r <= pll.referenceDivider.max; r++) {
    const span = multiplierSpan(pll, r);
    if (!span) continue;
    for (const { product } of postProducts(pll.postStages) ?? []) {
      const ideal = floor(div(mul(hz, rat(BigInt(r) * BigInt(product))), pll.crystalHz));
      for (const n of [ideal, ideal + 1n]) {
        const clamped = n < BigInt(span.lo) ? BigInt(span.lo) : n > BigInt(span.hi) ? BigInt(span.hi) : n;
        const f = div(mul(pll.crystalHz, rat(clamped)), rat(BigInt(r) * BigInt(product)));
        const c = best === null ? -1 : cmp(abs(sub(f, hz)), abs(sub(best, hz)));
        if (c < 0 || (c === 0 && cmp(f, best!) < 0)) best = f;
      }
    }
  }
  return best;
}
