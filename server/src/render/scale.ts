// Axis arithmetic: linear maps, "nice" tick steps (1, 2, 5 × 10^n) and an SI prefix per axis, so
// tick labels stay short ("0 2 4 µs") instead of repeating exponents on every tick.

export interface Linear {
  (v: number): number;
  domain: [number, number];
}

export function linear(d0: number, d1: number, r0: number, r1: number): Linear {
  const span = d1 - d0 || 1;
  const f = ((v: number) => r0 + ((v - d0) / span) * (r1 - r0)) as Linear;
  f.domain = [d0, d1];
  return f;
}

/** Step of about `count` intervals over [min, max], rounded to 1, 2 or 5 × 10^n. */
export function niceStep(min: number, max: number, count: number): number {
  const raw = Math.abs(max - min) / Math.max(1, count);
  if (!(raw > 0) || !Number.isFinite(raw)) return 1;
  const mag = 10 ** Math.floor(Math.log10(raw));
  const norm = raw / mag;
  return (norm <= 1 ? 1 : norm <= 2 ? 2 : norm <= 5 ? 5 : 10) * mag;
}

/** Multiples of the nice step inside [min, max]. */
export function ticks(min: number, max: number, count: number): number[] {
  const step = niceStep(min, max, count);
  const out: number[] = [];
  const first = Math.ceil(min / step - 1e-9);
  const last = Math.floor(max / step + 1e-9);
  for (let k = first; k <= last && out.length < 50; k++) out.push(k * step);
  return out;
}

/** Expands [min, max] outwards to whole nice steps so the frame starts and ends on a tick. */
export function niceDomain(min: number, max: number, count: number): [number, number] {
  if (!(max > min)) {
    const pad = Math.abs(min) > 0 ? Math.abs(min) * 0.1 : 1;
    return [min - pad, max + pad];
  }
  const step = niceStep(min, max, count);
  return [Math.floor(min / step + 1e-9) * step, Math.ceil(max / step - 1e-9) * step];
}

const PREFIXES: Array<[number, string]> = [
  [1e9, 'G'],
  [1e6, 'M'],
  [1e3, 'k'],
  [1, ''],
  [1e-3, 'm'],
  [1e-6, 'µ'],
  [1e-9, 'n'],
  [1e-12, 'p'],
];

/** The SI prefix that keeps the largest magnitude of an axis between 1 and 1000. */
export function prefixFor(maxAbs: number): { factor: number; prefix: string } {
  for (const [factor, prefix] of PREFIXES) if (maxAbs >= factor * 0.9995) return { factor, prefix };
  return { factor: 1e-12, prefix: 'p' };
}

/** A tick label: the value divided by the axis factor, with no trailing zeros or float dust. */
export function tickLabel(value: number, factor: number): string {
  const v = value / factor;
  const r = Number(v.toPrecision(4));
  return Object.is(r, -0) ? '0' : String(r);
}

/** One quantity with its own prefix, three significant digits ("20.8 ns", "1.65 V"). */
export function siText(value: number, unit: string): string {
  if (value === 0) return `0 ${unit}`;
  const { factor, prefix } = prefixFor(Math.abs(value));
  return `${Number((value / factor).toPrecision(3))} ${prefix}${unit}`;
}
