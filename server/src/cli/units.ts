// The checker's own figures on top of the shared quantity formatting (shared-schema): signed
// errors, ppm and the divider as the trade writes it. Exact values stay exact; rounded ones
// carry "≈" in front, sign included, so "≈+0.1 mHz" reads as one figure.

import { decimalText, formatBytes, formatHz as formatUnsignedHz, formatSeconds } from '../../../shared-schema/src/quantity-format';
import { abs, cmp, div, rat, sign, type Rational } from '../../../shared-schema/src/rational';
import type { Plan } from '../planning/types';

// One formatting for every face: the editor and the exporters import these from here too.
export { formatBytes, formatSeconds };
/** Decimal text, exact when a short decimal holds the value, else rounded and marked "≈". */
export const exactOrRounded = (r: Rational): string => decimalText(r);

/** "3.997802734375 MHz"; with `signed`, an error with an explicit sign (see formatSignedHz). */
export const formatHz = (hz: Rational, signed = false): string => (signed ? formatSignedHz(hz) : formatUnsignedHz(hz));

const ERROR_SCALES: ReadonlyArray<[string, Rational]> = [
  ['MHz', rat(1_000_000n)],
  ['kHz', rat(1000n)],
  ['Hz', rat(1n)],
  ['mHz', rat(1n, 1000n)],
  ['µHz', rat(1n, 1_000_000n)],
  ['nHz', rat(1n, 1_000_000_000n)],
];

/** Significant digits of a rounded error: enough to compare plans, short enough for a column. */
const ERROR_DIGITS = 4;

/**
 * An error in Hz with an explicit sign and its own prefix: "+1.25 Hz", "≈-38.79 µHz", "0 Hz".
 * Exact when a short decimal holds it, else four significant digits (the ppm beside it says the rest).
 */
export function formatSignedHz(hz: Rational): string {
  const s = sign(hz);
  if (s === 0) return '0 Hz';
  const magnitude = abs(hz);
  const [unit, scale] = ERROR_SCALES.find(([, k]) => cmp(magnitude, k) >= 0) ?? ERROR_SCALES[ERROR_SCALES.length - 1];
  const text = decimalText(div(magnitude, scale), 12, ERROR_DIGITS);
  const mark = s < 0 ? '-' : '+';
  return text.startsWith('≈') ? `≈${mark}${text.slice(1)} ${unit}` : `${mark}${text} ${unit}`;
}

/** Parts per million with four significant digits and an explicit sign. */
export function formatPpm(ppm: number): string {
  if (!Number.isFinite(ppm)) return 'n/a ppm';
  if (ppm === 0) return '0 ppm';
  const shown = Number(ppm.toPrecision(4));
  return `${shown > 0 ? '+' : ''}${shown} ppm`;
}

/** The divider as written in the trade: "÷3", or "÷1+244/256" when it has a binary fraction. */
export function formatDivider(plan: Pick<Plan, 'dividerInteger' | 'dividerFraction' | 'fractionBits'>): string {
  if (plan.dividerFraction === 0) return `÷${plan.dividerInteger}`;
  return `÷${plan.dividerInteger}+${plan.dividerFraction}/${2 ** plan.fractionBits}`;
}

/** Whole cycles M; a pinned plan may hold a fractional M, shown exactly or marked "≈". */
export const formatCycles = (cycles: Rational): string => decimalText(cycles);
