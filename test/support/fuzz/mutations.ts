// The mutation kinds and how a case combines them: one to three kinds on a seed file, and now and
// then its line breaks changed afterwards, so every other kind is also tried on CR LF and CR files.

import { aliasBomb, deepNesting } from './mutate-structure';
import { byteOrderMark, lineBreaks, tabs, trailingSpace } from './mutate-layout';
import { deleteTokens, duplicateLines, duplicateToken, swapLines } from './mutate-tokens';
import { oddNumber, unicode, wrongUnit } from './mutate-values';
import { between, chance, pick, type Random } from './random';

export type Mutation = (text: string, r: Random) => string;

export const MUTATIONS: Record<string, Mutation> = {
  'delete-tokens': deleteTokens,
  'duplicate-token': duplicateToken,
  'duplicate-lines': duplicateLines,
  'swap-lines': swapLines,
  unicode,
  'odd-number': oddNumber,
  'wrong-unit': wrongUnit,
  'deep-nesting': deepNesting,
  'alias-bomb': aliasBomb,
  tabs,
  'byte-order-mark': byteOrderMark,
  'line-breaks': lineBreaks,
  'trailing-space': trailingSpace,
};

/** How often each kind is drawn: the cheap, common edits more than the structural extremes. */
const WEIGHTS: Record<keyof typeof MUTATIONS, number> = {
  'delete-tokens': 4,
  'duplicate-token': 3,
  'duplicate-lines': 3,
  'swap-lines': 1,
  unicode: 4,
  'odd-number': 5,
  'wrong-unit': 4,
  'deep-nesting': 1,
  'alias-bomb': 1,
  tabs: 2,
  'byte-order-mark': 1,
  'line-breaks': 3,
  'trailing-space': 1,
};

const BAG = Object.entries(WEIGHTS).flatMap(([k, w]) => Array<string>(w).fill(k));

export function drawKind(r: Random): string {
  return pick(r, BAG);
}

export interface Mutated {
  text: string;
  kinds: string[];
}

/** One to `most` mutations of `text`, then sometimes new line breaks. */
export function mutate(text: string, r: Random, most = 3): Mutated {
  const kinds: string[] = [];
  let out = text;
  for (let n = between(r, 1, most); n > 0; n--) {
    const kind = drawKind(r);
    kinds.push(kind);
    out = MUTATIONS[kind](out, r);
  }
  if (!kinds.includes('line-breaks') && chance(r, 0.25)) {
    kinds.push('line-breaks');
    out = lineBreaks(out, r);
  }
  return { text: out, kinds };
}

/** Mutations that mostly keep the YAML valid, so the checker plans and quick fixes are offered. */
const MILD = ['odd-number', 'wrong-unit', 'wrong-unit', 'unicode', 'trailing-space', 'duplicate-lines'];

/** One mild mutation of `text`, then its line breaks changed half the time. */
export function mutateMildly(text: string, r: Random): Mutated {
  const kind = pick(r, MILD);
  let out = MUTATIONS[kind](text, r);
  const kinds = [kind];
  if (chance(r, 0.5)) {
    kinds.push('line-breaks');
    out = lineBreaks(out, r);
  }
  return { text: out, kinds };
}
