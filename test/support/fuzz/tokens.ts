// A rough tokenizer for mutation: words, numbers, runs of white space, and single characters
// (whole code points, so an astral character is never split). Good enough to cut specs at
// places a person's edit would.

export interface Token {
  text: string;
  at: number;
}

const TOKEN = /[A-Za-z_][A-Za-z0-9_-]*|[+-]?\d+(?:\.\d+)?(?:[eE][+-]?\d+)?|[ \t]+|\r\n|\r|\n|./gsu;

/** Characters tokenized at once: a word of millions of letters overflows the regular expression's stack. */
export const WINDOW = 1 << 16;

/** One window of a long text (all of a short one), its start drawn from `r` only when the text is long. */
export function windowOf(text: string, r: () => number): { part: string; base: number } {
  if (text.length <= WINDOW) return { part: text, base: 0 };
  const base = Math.floor(r() * (text.length - WINDOW));
  return { part: text.slice(base, base + WINDOW), base };
}

/** The tokens of one window of the text, at offsets into the whole text. */
export function tokens(text: string, r: () => number): Token[] {
  const { part, base } = windowOf(text, r);
  return [...part.matchAll(TOKEN)].map((m) => ({ text: m[0], at: base + m.index! }));
}

/** Tokens that are not white space or line breaks, in one window of a long text. */
export const solidTokens = (text: string, r: () => number): Token[] => tokens(text, r).filter((t) => !/^\s+$/.test(t.text));

/** The text with `[at, at + length)` replaced by `insert`. */
export const splice = (text: string, at: number, length: number, insert: string): string => text.slice(0, at) + insert + text.slice(at + length);

/** Start offsets of every line (after CR LF, lone CR or LF). */
export function lineStarts(text: string): number[] {
  const starts = [0];
  for (const m of text.matchAll(/\r\n|\r|\n/g)) starts.push(m.index! + m[0].length);
  return starts;
}
