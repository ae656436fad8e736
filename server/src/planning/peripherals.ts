// A peripheral clock divided from the tree (a baud rate from f_sys, a USB clock from the VCO):
// the nearest whole divider and its worst-case error with the clock's own tolerance counted in.

import { type Rational, abs, cmp, div, floor, rat, sub } from '../../../shared-schema/src/rational';
import { withinWorstCase } from './clock-error';
import type { PeripheralClock } from './clock-source';

export interface PeripheralResult {
  divider: number;
  achievedHz: Rational;
  errorHz: Rational;
  withinTolerance: boolean;
}

/** The best whole divider of `sourceHz` for the peripheral (ties: the smaller divider). */
export function peripheralAchieved(p: PeripheralClock, sourceHz: Rational, e: Rational): PeripheralResult {
  const ideal = div(sourceHz, p.targetHz);
  const lo = floor(ideal);
  let best: PeripheralResult | null = null;
  for (const d of [lo, lo + 1n]) {
    const clamped = Number(d < BigInt(p.dividerMin) ? BigInt(p.dividerMin) : d > BigInt(p.dividerMax) ? BigInt(p.dividerMax) : d);
    const achievedHz = div(sourceHz, rat(clamped));
    const errorHz = sub(achievedHz, p.targetHz);
    if (best === null || cmp(abs(errorHz), abs(best.errorHz)) < 0) {
      best = { divider: clamped, achievedHz, errorHz, withinTolerance: withinWorstCase({ achievedHz, errorHz }, p.toleranceHz, e) };
    }
  }
  return best!;
}
