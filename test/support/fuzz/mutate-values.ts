// Mutations of what a person types into values: look-alike and invisible characters, bidirectional
// controls and astral characters; extreme and oddly written numbers; wrong, misspelt or missing units.

import { chance, int, pick, type Random } from './random';
import { solidTokens, splice, windowOf } from './tokens';

/** ASCII characters and a look-alike of each from another block (Cyrillic, full width, math signs). */
const LOOKALIKES: Record<string, string[]> = {
  a: ['\u0430', '\u03b1'],
  e: ['\u0435'],
  o: ['\u043e', '\u03bf', '0'],
  p: ['\u0440'],
  c: ['\u0441'],
  i: ['\u0456', '\u0131'],
  s: ['\u0455'],
  x: ['\u0445', '\u00d7'],
  H: ['\u041d', '\u0397'],
  M: ['\u041c'],
  k: ['\u03ba'],
  z: ['\u1d22'],
  '-': ['\u2010', '\u2212', '\u2013'],
  ':': ['\uff1a', '\u2236', '\u02d0'],
  '/': ['\u00f7', '\u2215'],
  '*': ['\u00b7', '\u2217'],
  '.': ['\u00b7', '\u3002', ','],
  ' ': ['\u00a0', '\u2009', '\u3000'],
  '0': ['\uff10', '\u0660', 'O'],
  '1': ['\uff11', 'l', '\u0661'],
  '5': ['\uff15'],
  '%': ['\u066a', '\uff05'],
  '#': ['\uff03'],
};

/** Characters to insert: bidirectional controls, zero-width and other invisible ones, astral ones, lone surrogates, other line separators. */
const INSERTS = [
  '\u202e', '\u202d', '\u200f', '\u200e', '\u061c', '\u2066', '\u2069', '\u200b', '\u200c', '\u200d', '\u2060', '\ufeff', '\u00ad',
  '\u{1f3b5}', '\u{1d7d9}', '\u{1f1fa}\u{1f1f8}', '\u{10ffff}', 'e\u0301', '\u0000', '\u0007', '\u2028', '\u2029', '\u0085', '\ud800', '\udc00', '\uffff', '\u00b5', '\u03bc',
];

export function unicode(text: string, r: Random): string {
  const all = solidTokens(text, r);
  if (all.length === 0) return pick(r, INSERTS) + text;
  const t = pick(r, all);
  if (chance(r, 0.5)) {
    // Replace one character of the token by a look-alike.
    const chars = [...t.text];
    const from = int(r, chars.length);
    const at = [...chars.keys()].map((i) => (from + i) % chars.length).find((i) => LOOKALIKES[chars[i]]) ?? -1;
    if (at >= 0) {
      const offset = t.at + chars.slice(0, at).join('').length;
      return splice(text, offset, chars[at].length, pick(r, LOOKALIKES[chars[at]]));
    }
  }
  return splice(text, chance(r, 0.5) ? t.at : t.at + t.text.length, 0, pick(r, INSERTS));
}

/** Numbers at and beyond the edges of doubles and of the format: underflow, overflow, signed zero, words. */
export const ODD_NUMBERS = [
  '1e-400', '5e-324', '4.9e-324', '2.2250738585072014e-308', '1' + '0'.repeat(400), '1e400', '1e+308', '1.8e308', '1e309', '-0', '-0.0', '0', '0.0',
  'NaN', 'nan', '.nan', 'Infinity', '-Infinity', '.inf', '-.inf', '0x1F', '0x', '0o17', '0b101', '1_000', '1,5', '1.', '.5', '+5', '--5', '1e', '1e+',
  '9007199254740993', '18446744073709551617', '0.' + '0'.repeat(300) + '1', '123456789.123456789123456789', '-1', '-1e-400', '1/3', '\u0661\u0662', '\uff11\uff12', '½', '²', '1e-9999999999',
];

export function oddNumber(text: string, r: Random): string {
  const numbers = solidTokens(text, r).filter((t) => /^[+-]?\d/.test(t.text));
  if (numbers.length === 0) return text;
  const t = pick(r, numbers);
  return splice(text, t.at, t.text.length, pick(r, ODD_NUMBERS));
}

const UNIT = /(\d)( ?)(GHz|MHz|kHz|Hz|mHz|ppm|ppb|ppt|ppq|%|Vpp|V|mV|B|KiB|MiB|kB|ns|µs|us|ms|s|dB|bits)\b/g;
const OTHER_UNITS = ['GHz', 'MHz', 'kHz', 'Hz', 'mHz', 'MHZ', 'mhz', 'khz', 'KHz', 'Mhz', 'hz', 'rpm', 'ppm', 'ppb', '%', '‰', 'V', 'mV', 'Vpp', 'A', 'Ω', 'B', 'KiB', 'MiB', 'GiB', 'kB', 'ns', 'µs', 'μs', 'us', 's', 'dB', 'dBc', 'bits', 'K', '°C', 'Hz²', '1/s', 'kHz/s', 'M Hz', ''];

export function wrongUnit(text: string, r: Random): string {
  const { part, base } = windowOf(text, r);
  const found = [...part.matchAll(UNIT)];
  if (found.length === 0) return text;
  const m = pick(r, found);
  const at = base + m.index! + m[1].length;
  // Sometimes drop or double the space between number and unit as well.
  const space = pick(r, [m[2], m[2], '', '  ', '\t']);
  return splice(text, at, m[2].length + m[3].length, space + pick(r, OTHER_UNITS));
}
