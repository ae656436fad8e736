// A rough tokenizer for mutation: words, numbers, runs of white space, and single characters
// (whole code points, so an astral character is never split). Good enough to cut specs at
// places a person's edit would.

export interface Token {
  text: string;
  at: number;
}

const TOKEN = /[A-Za-z_][A-Za-z0-9_-]*|[+-]?\d+(?:\.\d+)?(?:[eE][+-]?\d+)?|[ \t]+|\r\n|\r|\n|./gsu;

export function tokens(text: string): Token[] {
  return [...text.matchAll(TOKEN)].map((m) => ({ text: m[0], at: m.index! }));
}

/** Tokens that are not white space or line breaks. */
export const solidTokens = (text: string): Token[] => tokens(text).filter((t) => !/^\s+$/.test(t.text));

/** The text with `[at, at + length)` replaced by `insert`. */
export const splice = (text: string, at: number, length: number, insert: string): string => text.slice(0, at) + insert + text.slice(at + length);

/** Start offsets of every line (after CR LF, lone CR or LF). */
export function lineStarts(text: string): number[] {
  const starts = [0];
  for (const m of text.matchAll(/\r\n|\r|\n/g)) starts.push(m.index! + m[0].length);
  return starts;
}
