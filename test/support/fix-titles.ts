// Reads the figures back out of a quick fix's title and compares them with a plan, in exact
// rational arithmetic of fraction.js (a general-purpose library, the oracle here): a figure shown
// without "≈" must equal the plan's value exactly; a rounded one must lie within half a unit of
// its last shown digit. Nothing here reuses the project's own formatting or rationals.

import Fraction from 'fraction.js';

export interface ShownPlan {
  standing: 'exact' | 'within tolerance' | 'out of tolerance';
  frequency: string;
  error: string;
  divider: { integer: number; fraction: number; steps: number };
  tableLength: number;
  cycles: string;
  jitterRms?: string;
}

/** The result clause every plan-bearing title ends with (see server/src/lsp/fix-preview.ts). */
const RESULT =
  /(exact|within tolerance|out of tolerance) at (≈?[\d.]+ (?:GHz|MHz|kHz|Hz|mHz)) \(([^)]*)\), ÷(\d+)(?:\+(\d+)\/(\d+))?, N = (\d+), M = (≈?[\d.]+)(?:, (≈?[\d.]+ (?:ps|ns|µs|ms|s)) rms period jitter)?(?: — does not clear [a-z-]+)?$/;

export function shownPlan(title: string): ShownPlan | undefined {
  const m = RESULT.exec(title);
  if (!m) return undefined;
  return {
    standing: m[1] as ShownPlan['standing'],
    frequency: m[2],
    error: m[3],
    divider: { integer: Number(m[4]), fraction: Number(m[5] ?? 0), steps: Number(m[6] ?? 1) },
    tableLength: Number(m[7]),
    cycles: m[8],
    jitterRms: m[9],
  };
}

export const fraction = (r: { num: bigint; den: bigint }): Fraction => new Fraction(r.num, r.den);

/** A double as a fraction, through its plain decimal text (fraction.js reads no exponents). */
export const floatFraction = (x: number): Fraction => new Fraction(x.toFixed(60));

const SCALE: Record<string, Fraction> = {
  GHz: new Fraction(1_000_000_000),
  MHz: new Fraction(1_000_000),
  kHz: new Fraction(1000),
  Hz: new Fraction(1),
  mHz: new Fraction(1, 1000),
  ppm: new Fraction(1, 1_000_000),
  ppb: new Fraction(1, 1_000_000_000),
  ppt: new Fraction(1, 1_000_000_000_000),
  ppq: new Fraction(1, 1_000_000_000_000_000),
  s: new Fraction(1),
  ms: new Fraction(1, 1000),
  µs: new Fraction(1, 1_000_000),
  ns: new Fraction(1, 1_000_000_000),
  ps: new Fraction(1, 1_000_000_000_000),
};

/** A shown figure as an interval: [value − half, value + half] of its last digit, or exact. */
export interface Reading {
  value: Fraction;
  half: Fraction;
  rounded: boolean;
}

/** "≈36.9971 kHz", "-79.2 ppm", "+1.5 ppb", "0 ppm", "2.08 ns" → its value in base units. */
export function readFigure(text: string): Reading {
  const m = /^(≈)?([+-])?(\d+(?:\.(\d+))?) (\S+)$/.exec(text.trim());
  if (!m) throw new Error(`not a figure: "${text}"`);
  const unit = SCALE[m[5]];
  if (!unit) throw new Error(`unknown unit in "${text}"`);
  const decimals = m[4]?.length ?? 0;
  const value = new Fraction(m[3]).mul(unit).mul(m[2] === '-' ? -1 : 1);
  return { value, half: new Fraction(1, 2).div(new Fraction(10).pow(decimals)).mul(unit), rounded: m[1] === '≈' };
}

/**
 * True when `actual` is what `text` shows. `exactUnlessMarked`: a figure without "≈" must be
 * exact (frequencies, cycles); relative errors and seconds are always rounded to their digits.
 */
export function shows(text: string, actual: Fraction, exactUnlessMarked: boolean): boolean {
  const r = readFigure(text);
  if (exactUnlessMarked && !r.rounded) return r.value.equals(actual);
  return actual.sub(r.value).abs().compare(r.half) <= 0;
}

/** The shown sign must also match: "+x" for a positive, "-x" for a negative, "0 ppm" only for zero. */
export function showsSigned(text: string, actual: Fraction): boolean {
  const sign = actual.compare(0);
  if (sign === 0) return text === '0 ppm';
  if (!text.startsWith(sign > 0 ? '+' : '-')) return false;
  return shows(text, actual, false);
}
