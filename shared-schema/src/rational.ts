// Exact rational numbers on bigint. Frequencies, dividers and ratios are kept exact from the
// decimal text the engineer typed to the plan the engine reports; binary floating point is used
// only for display and for derived figures such as jitter in seconds.

export interface Rational {
  /** Numerator; the sign lives here. */
  readonly num: bigint;
  /** Denominator, always > 0; gcd(num, den) = 1. */
  readonly den: bigint;
}

export function gcd(a: bigint, b: bigint): bigint {
  if (a < 0n) a = -a;
  if (b < 0n) b = -b;
  while (b !== 0n) [a, b] = [b, a % b];
  return a;
}

/** Greatest common divisor of two whole numbers below 2^53 (the hot loops' version of gcd). */
export function gcdNumber(a: number, b: number): number {
  a = Math.abs(a);
  b = Math.abs(b);
  while (b !== 0) [a, b] = [b, a % b];
  return a;
}

export function rat(num: bigint | number, den: bigint | number = 1n): Rational {
  let n = BigInt(num);
  let d = BigInt(den);
  if (d === 0n) throw new RangeError('rational with zero denominator');
  if (d < 0n) {
    n = -n;
    d = -d;
  }
  const g = gcd(n, d);
  return g > 1n ? { num: n / g, den: d / g } : { num: n, den: d };
}

export const ZERO: Rational = { num: 0n, den: 1n };
export const ONE: Rational = { num: 1n, den: 1n };

export const add = (a: Rational, b: Rational): Rational => rat(a.num * b.den + b.num * a.den, a.den * b.den);
export const sub = (a: Rational, b: Rational): Rational => rat(a.num * b.den - b.num * a.den, a.den * b.den);
export const mul = (a: Rational, b: Rational): Rational => rat(a.num * b.num, a.den * b.den);
export function div(a: Rational, b: Rational): Rational {
  if (b.num === 0n) throw new RangeError('division of a rational by zero');
  return rat(a.num * b.den, a.den * b.num);
}
export const neg = (a: Rational): Rational => ({ num: -a.num, den: a.den });
export const abs = (a: Rational): Rational => (a.num < 0n ? neg(a) : a);
export const sign = (a: Rational): -1 | 0 | 1 => (a.num < 0n ? -1 : a.num > 0n ? 1 : 0);
/** -1, 0 or 1 as a <, =, > b. */
export function cmp(a: Rational, b: Rational): -1 | 0 | 1 {
  const l = a.num * b.den;
  const r = b.num * a.den;
  return l < r ? -1 : l > r ? 1 : 0;
}
export const eq = (a: Rational, b: Rational): boolean => a.num === b.num && a.den === b.den;
export const isInteger = (a: Rational): boolean => a.den === 1n;

/** Largest integer ≤ a. */
export function floor(a: Rational): bigint {
  const q = a.num / a.den;
  return a.num < 0n && q * a.den !== a.num ? q - 1n : q;
}
/** Smallest integer ≥ a. */
export function ceil(a: Rational): bigint {
  return -floor(neg(a));
}

/** Nearest double; exact when num and den are exactly representable and the quotient is. */
export function toNumber(a: Rational): number {
  const n = Number(a.num);
  const d = Number(a.den);
  if (Number.isFinite(n) && Number.isFinite(d)) return n / d;
  // Very large parts: scale both down to keep the quotient accurate.
  const shift = BigInt(Math.max(a.num.toString(2).length, a.den.toString(2).length) - 1000);
  return Number(a.num >> shift) / Number(a.den >> shift);
}

/**
 * Parses plain decimal text ("125", "-3.25", "3.997802734375", "1e6", "2.5E-3") exactly.
 * Returns undefined when the text is not a decimal number.
 */
export function parseDecimal(text: string): Rational | undefined {
  const m = /^([+-]?)(\d+)?(?:\.(\d*))?(?:[eE]([+-]?\d+))?$/.exec(text.trim());
  if (!m || (m[2] === undefined && (m[3] === undefined || m[3] === ''))) return undefined;
  const digits = (m[2] ?? '') + (m[3] ?? '');
  let exp = -(m[3]?.length ?? 0) + (m[4] ? Number(m[4]) : 0);
  if (!Number.isSafeInteger(exp) || Math.abs(exp) > 400) return undefined;
  let num = BigInt(digits === '' ? '0' : digits);
  let den = 1n;
  if (exp >= 0) num *= 10n ** BigInt(exp);
  else den = 10n ** BigInt(-exp);
  if (m[1] === '-') num = -num;
  return rat(num, den);
}

/** Exact value of a finite JS number (every double is a dyadic rational). */
export function fromNumber(x: number): Rational {
  if (!Number.isFinite(x)) throw new RangeError('not a finite number');
  if (Number.isInteger(x) && Number.isSafeInteger(x)) return rat(BigInt(x));
  // Use the shortest round-trip decimal text the engineer would have typed, e.g. 0.1 → 1/10.
  return parseDecimal(String(x)) ?? rat(0n);
}

/**
 * Decimal text with at most `digits` digits after the point, trailing zeros removed,
 * rounded half away from zero. toDecimal(rat(131, 4096), 12) = "0.031982421875".
 */
export function toDecimal(a: Rational, digits = 6): string {
  const scale = 10n ** BigInt(digits);
  const negative = a.num < 0n;
  const n = negative ? -a.num : a.num;
  let scaled = (n * scale * 2n + a.den) / (a.den * 2n);
  const whole = scaled / scale;
  let frac = (scaled % scale).toString().padStart(digits, '0').replace(/0+$/, '');
  const text = frac ? `${whole}.${frac}` : `${whole}`;
  return negative && scaled !== 0n ? `-${text}` : text;
}

export const isExactDecimal = (a: Rational): boolean => {
  let d = a.den;
  while (d % 2n === 0n) d /= 2n;
  while (d % 5n === 0n) d /= 5n;
  return d === 1n;
};
