// Seeded choices for the fuzz harness. Every case draws from its own generator, made from the run's
// seed and the case number alone, so a case replays the same whatever ran before it.

import { seededRandom } from '../seeded';

export type Random = () => number;

/** The generator of case `n` of a run seeded `seed` (the two mixed by a multiplicative hash). */
export function caseRandom(seed: number, n: number, stream = 0): Random {
  const mixed = Math.imul((seed >>> 0) ^ 0x9e3779b9, 0x85ebca6b) ^ Math.imul(n + 1, 0xc2b2ae35) ^ Math.imul(stream + 1, 0x27d4eb2f);
  return seededRandom(mixed >>> 0);
}

/** An integer in [0, n). */
export const int = (r: Random, n: number): number => Math.floor(r() * n);

/** An integer in [lo, hi]. */
export const between = (r: Random, lo: number, hi: number): number => lo + int(r, hi - lo + 1);

export const pick = <T>(r: Random, items: readonly T[]): T => items[int(r, items.length)];

export const chance = (r: Random, p: number): boolean => r() < p;
