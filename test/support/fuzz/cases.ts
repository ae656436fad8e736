// Case n of a run: which seed file, which mutations, and (for a clock seed) a wave spec that reads
// the mutated clock, so a broken clock file is also seen through its reader.

import * as path from 'node:path';
import type { Seed } from './corpus';
import type { FuzzConfig } from './config';
import { bigFile } from './mutate-structure';
import { mutate } from './mutations';
import { caseRandom, pick, type Random } from './random';

export interface FuzzCase {
  n: number;
  seed: Seed;
  kinds: string[];
  text: string;
  /** For a clock seed: a wave spec of the same folder whose `clock:` names the mutated clock. */
  reader?: string;
}

/** The size of case n when it is a large file, else undefined. */
export function bigSize(config: FuzzConfig, n: number): number | undefined {
  if (n % config.bigEvery !== Math.floor(config.bigEvery / 2)) return undefined;
  return config.bigSizes[Math.floor(n / config.bigEvery) % config.bigSizes.length];
}

export const caseFileName = (kind: Seed['kind'], tag: string): string => `fuzz-${tag}.${kind}.yaml`;

export function makeCase(config: FuzzConfig, seeds: readonly Seed[], n: number, r: Random = caseRandom(config.seed, n)): FuzzCase {
  const big = bigSize(config, n);
  // Large files grow from wave specs with outputs, so they are specs of thousands of outputs.
  const seed = big ? pick(r, seeds.filter((s) => s.kind === 'wave' && /^outputs:/m.test(s.text))) : pick(r, seeds);
  const mutated = mutate(seed.text, r);
  // A large file starts without a byte order mark: its size on disk would count the mark an
  // editor's buffer does not hold, and the size is what its finding reports.
  const text = big ? bigFile(mutated.text.replace(/^\ufeff+/, ''), r, big) : mutated.text;
  const kinds = big ? [...mutated.kinds, `big-file ${(text.length / 1e6).toFixed(2)} M`] : mutated.kinds;
  if (seed.kind === 'wave') return { n, seed, kinds, text };
  const waves = seeds.filter((s) => s.kind === 'wave' && s.folder === seed.folder && /^clock:/m.test(s.text));
  const reader = waves.length ? pick(r, waves).text.replace(/^clock:.*$/m, `clock: ./${caseFileName('clock', 'case')}`) : undefined;
  return { n, seed, kinds, text, reader };
}

/** The files of a case in its seed's folder, under names tagged `tag`. */
export function caseFiles(c: FuzzCase, tag: string): { file: string; text: string }[] {
  const main = { file: path.join(c.seed.folder, caseFileName(c.seed.kind, tag)), text: c.text };
  if (!c.reader) return [main];
  return [main, { file: path.join(c.seed.folder, caseFileName('wave', `${tag}-reader`)), text: c.reader.replace(caseFileName('clock', 'case'), caseFileName('clock', tag)) }];
}
