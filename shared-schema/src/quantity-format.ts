// Quantities back to text for messages and hovers: exact decimals when they are short, otherwise
// rounded and marked with ≈ so a reader never mistakes a rounded figure for an exact one.

import { type Rational, abs, cmp, div, eq, parseDecimal, rat, toDecimal } from './rational';

const SCALES: [string, Rational][] = [
  ['GHz', rat(1_000_000_000n)],
  ['MHz', rat(1_000_000n)],
  ['kHz', rat(1000n)],
  ['Hz', rat(1n)],
];

/** Decimal text of `value`: exact up to `exactDigits` places, else "≈" and `significant` digits. */
export function decimalText(value: Rational, exactDigits = 12, significant = 12): string {
  const exact = toDecimal(value, exactDigits);
  const back = parseDecimal(exact);
  if (back && eq(back, value)) return exact;
  const wholeDigits = (value.num < 0n ? -value.num : value.num) / value.den === 0n ? 0 : ((value.num < 0n ? -value.num : value.num) / value.den).toString().length;
  return `≈${toDecimal(value, Math.max(0, significant - wholeDigits))}`;
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

/** "48 KiB" when a whole number of KiB, else "1000 B". */
export function formatBytes(bytes: number): string {
  if (bytes >= 1_048_576 && bytes % 1_048_576 === 0) return `${bytes / 1_048_576} MiB`;
  if (bytes >= 1024 && bytes % 1024 === 0) return `${bytes / 1024} KiB`;
  return `${bytes} B`;
}

/** Seconds as ns/µs/ms with 3 significant digits: "2.08 ns". */
export function formatSeconds(s: number): string {
  const a = Math.abs(s);
  if (a === 0) return '0 s';
  const [scale, unit] = a < 1e-9 ? [1e12, 'ps'] : a < 1e-6 ? [1e9, 'ns'] : a < 1e-3 ? [1e6, 'µs'] : a < 1 ? [1e3, 'ms'] : [1, 's'];
  return `${Number((s * scale).toPrecision(3))} ${unit}`;
}

/** Volts with up to 4 significant digits: "1.65 V". */
export const formatVolts = (v: number, unit = 'V'): string => `${Number(v.toPrecision(4))} ${unit}`;
