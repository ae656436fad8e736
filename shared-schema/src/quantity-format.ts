// Quantities back to text for messages, hovers, annotations, reports and the checker: the one
// place every face formats a figure. Exact decimals when they are short, otherwise rounded and
// marked with ≈ so a reader never mistakes a rounded figure for an exact one. Signs are ASCII
// '+' and '-' everywhere, so logs grep cleanly; no figure is ever written with an exponent.

import { type Rational, abs, cmp, div, eq, fromNumber, parseDecimal, rat, sign, toDecimal } from './rational';

const SCALES: [string, Rational][] = [
  ['GHz', rat(1_000_000_000n)],
  ['MHz', rat(1_000_000n)],
  ['kHz', rat(1000n)],
  ['Hz', rat(1n)],
];

/** Position of the leading digit: 0 for 1 ≤ |v| < 10, 2 for 100…999, -3 for 0.001…0.00999. */
function leadingExponent(value: Rational): number {
  const m = abs(value);
  if (m.num >= m.den) return (m.num / m.den).toString().length - 1;
  let e = 0;
  let scaled = m.num;
  while (scaled < m.den) {
    scaled *= 10n;
    e--;
  }
  return e;
}

/**
 * Plain decimal text of `value` with at least `significant` significant digits (every digit of
 * the whole part is kept: 23440 stays 23440), rounded half away from zero. Never an exponent.
 */
export function significantText(value: Rational, significant: number): string {
  if (value.num === 0n) return '0';
  const decimals = Math.max(0, significant - 1 - leadingExponent(value));
  return toDecimal(value, decimals);
}

/** Decimal text of `value`: exact up to `exactDigits` places, else "≈" and `significant` digits. */
export function decimalText(value: Rational, exactDigits = 12, significant = 12): string {
  const exact = toDecimal(value, exactDigits);
  const back = parseDecimal(exact);
  if (back && eq(back, value)) return exact;
  return `≈${significantText(value, significant)}`;
}

/** "3.997802734375 MHz", "≈21.428571 kHz", "500 mHz". */
export function formatHz(hz: Rational): string {
  const mag = abs(hz);
  if (mag.num === 0n) return '0 Hz';
  for (const [unit, scale] of SCALES) {
    if (cmp(mag, scale) >= 0) return `${decimalText(div(hz, scale))} ${unit}`;
  }
  return `${decimalText(div(hz, rat(1n, 1000n)))} mHz`;
}

const COMPACT_SCALES: [string, Rational][] = [...SCALES, ['mHz', rat(1n, 1000n)]];

/** Six significant digits for a short face (annotations, quick-fix titles): "≈36.9971 kHz", "5 kHz". */
export function compactHz(hz: Rational): string {
  const mag = abs(hz);
  if (mag.num === 0n) return '0 Hz';
  const [unit, scale] = COMPACT_SCALES.find(([, s]) => cmp(mag, s) >= 0) ?? COMPACT_SCALES[COMPACT_SCALES.length - 1];
  const value = div(hz, scale);
  const text = significantText(value, 6);
  const back = parseDecimal(text);
  return `${back && eq(back, value) ? '' : '≈'}${text} ${unit}`;
}

const ERROR_SCALES: ReadonlyArray<[string, Rational]> = [
  ['MHz', rat(1_000_000n)],
  ['kHz', rat(1000n)],
  ['Hz', rat(1n)],
  ['mHz', rat(1n, 1000n)],
  ['µHz', rat(1n, 1_000_000n)],
  ['nHz', rat(1n, 1_000_000_000n)],
  ['pHz', rat(1n, 1_000_000_000_000n)],
  ['fHz', rat(1n, 1_000_000_000_000_000n)],
];

/**
 * An error in Hz with an explicit sign and its own prefix: "+1.25 Hz", "≈-38.79 µHz", "0 Hz".
 * Exact when a short decimal holds it, else four significant digits; the prefix is the largest
 * that keeps a digit before the point, so a non-zero error never reads as zero.
 */
export function formatSignedHz(hz: Rational): string {
  const s = sign(hz);
  if (s === 0) return '0 Hz';
  const magnitude = abs(hz);
  const [unit, scale] = ERROR_SCALES.find(([, k]) => cmp(magnitude, k) >= 0) ?? ERROR_SCALES[ERROR_SCALES.length - 1];
  const text = decimalText(div(magnitude, scale), 12, 4);
  const mark = s < 0 ? '-' : '+';
  return text.startsWith('≈') ? `≈${mark}${text.slice(1)} ${unit}` : `${mark}${text} ${unit}`;
}

const RATIO_UNITS: ReadonlyArray<[string, number]> = [
  ['ppm', 1],
  ['ppb', 1e3],
  ['ppt', 1e6],
  ['ppq', 1e9],
];

/**
 * A relative error given in ppm, in the unit of ppm, ppb, ppt or ppq that puts a digit before
 * the point, with three significant digits and an explicit sign: "+82.1 ppb", "-79.2 ppm",
 * "0 ppm" for an exact plan. Never an exponent, never "+0" for a non-zero error.
 */
export function formatPpm(ppm: number): string {
  if (!Number.isFinite(ppm)) return 'n/a';
  if (ppm === 0) return '0 ppm';
  const a = Math.abs(ppm);
  // Pick the unit on the rounded figure, so 0.9996 ppb reads "1 ppb", not "1000 ppt".
  const [unit, scale] = RATIO_UNITS.find(([, s]) => Number((a * s).toPrecision(3)) >= 1) ?? RATIO_UNITS[RATIO_UNITS.length - 1];
  return `${ppm < 0 ? '-' : '+'}${significantText(fromNumber(a * scale), 3)} ${unit}`;
}

/** A jump or level in LSB: whole numbers exactly ("4095 LSB"), others to three significant digits. */
export function formatLsb(lsb: number): string {
  if (!Number.isFinite(lsb)) return 'n/a LSB';
  const shown = Math.abs(lsb) >= 100 ? String(Math.round(lsb)) : significantText(fromNumber(lsb), 3);
  return `${shown} LSB`;
}

/** "48 KiB" when a whole number of KiB, else "1000 B". */
export function formatBytes(bytes: number): string {
  if (bytes >= 1_048_576 && bytes % 1_048_576 === 0) return `${bytes / 1_048_576} MiB`;
  if (bytes >= 1024 && bytes % 1024 === 0) return `${bytes / 1024} KiB`;
  return `${bytes} B`;
}

/** Seconds as ps/ns/µs/ms with 3 significant digits: "2.08 ns". */
export function formatSeconds(s: number): string {
  if (!Number.isFinite(s)) return 'n/a';
  const a = Math.abs(s);
  if (a === 0) return '0 s';
  const [scale, unit] = a < 1e-9 ? [1e12, 'ps'] : a < 1e-6 ? [1e9, 'ns'] : a < 1e-3 ? [1e6, 'µs'] : a < 1 ? [1e3, 'ms'] : [1, 's'];
  return `${significantText(fromNumber(s * scale), 3)} ${unit}`;
}

/** Volts with up to 4 significant digits: "1.65 V". */
export const formatVolts = (v: number, unit = 'V'): string => `${Number(v.toPrecision(4))} ${unit}`;

/** A file's size for messages: "1.0 GiB (1073741824 bytes)", "512 bytes". */
export function formatFileSize(bytes: number): string {
  const units: ReadonlyArray<[string, number]> = [
    ['TiB', 2 ** 40],
    ['GiB', 2 ** 30],
    ['MiB', 2 ** 20],
    ['KiB', 2 ** 10],
  ];
  for (const [unit, scale] of units) if (bytes >= scale) return `${(bytes / scale).toFixed(1)} ${unit} (${bytes} bytes)`;
  return `${bytes} byte${bytes === 1 ? '' : 's'}`;
}
