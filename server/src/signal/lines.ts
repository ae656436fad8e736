// The line spectrum of the emitted stream (emitted.ts) over the first Nyquist zone.
//
// Line m sits at m·f_s/P, 0 ≤ m ≤ P/2; its one-sided power is 2·|Z_m|² (|Z_0|² and, for even P,
// |Z_{P/2}|² once), in code² units, so a sine of amplitude A codes has a line of A²/2.
//
// exact: one transform of the whole period P, when it is short enough to transform.
// analytic: the table's own lines (one transform of N', or single bins when even that is too
// long) plus the jitter term line by line. ĉ is the table plus d·ẽ/D, the product of an
// N'-periodic and an L-periodic sequence, so its line m is
//   Z_m = C_{m/b}/N' (when b | m)  +  e^(j2πm/P)/(N'·D) · Σ G_q·Ê_r  over the g pairs (q, r)
// with q·b + r·a ≡ m (mod P) (N' = g·a, L = g·b), where C and G = C·(1 − e^(−j2πq/N')) are the
// DFTs of the table and of its steps, and the accumulator's TIE has the closed-form DFT
// Ê_r = 1/(L·(e^(−j2πs/L) − 1)), s = r·F'⁻¹ mod L (derived: Σ u·z^u = L/(z − 1) for z^L = 1).
// The band's total power is exact by Parseval (tableAcPower + jitterPower, emitted.ts); the lines
// evaluated are the fundamental, its harmonics, the table's strongest spurs and the strongest
// jitter sidebands of the strongest lines, which is where the worst spur lies.

import { dftBin, fft, transformPoints } from './fft';
import { type StreamModel, jitterPower, streamSamples, tableAcPower } from './emitted';

/** Largest radix-2 transform a spectrum takes (2^18 points: 4 MiB of working arrays). */
export const MAX_TRANSFORM_POINTS = 2 ** 18;

export type SpectrumMethod = 'exact' | 'analytic';

export interface LineSpectrum {
  method: SpectrumMethod;
  /** P: line m sits at m·f_s/P. */
  period: number;
  /** One-sided power of line m, 0 ≤ m ≤ P/2. */
  power(m: number): number;
  /** Total one-sided power over 0 < m ≤ P/2 (DC excluded). */
  bandPower: number;
  /** Of bandPower, the part the divider jitter adds (0 when jitter-free). */
  jitterPower: number;
  /** Lines to search for the worst spur: every line (exact) or the evaluated ones (analytic). */
  candidates(): Iterable<number>;
  /** Exact spectra: every line's power, index m (the hot loops read it directly). */
  powers?: Float64Array;
  /** Analytic spectra whose table was not transformed either: each line costs O(N'). */
  binByBin?: boolean;
}

export interface SpectrumOptions {
  /** Transforms above this many radix-2 points are not taken (hover asks for fewer). */
  maxTransformPoints?: number;
  /** Leave the jitter out: the spectrum of the table alone. */
  withoutJitter?: boolean;
}

const oneSided = (m: number, P: number): number => (m === 0 || 2 * m === P ? 1 : 2);

function exactLines(samples: Float64Array, jitter: number): LineSpectrum {
  const P = samples.length;
  const re = samples;
  const im = new Float64Array(P);
  fft(re, im);
  const half = Math.floor(P / 2);
  const power = new Float64Array(half + 1);
  let band = 0;
  for (let m = 0; m <= half; m++) {
    const zr = re[m] / P;
    const zi = im[m] / P;
    power[m] = oneSided(m, P) * (zr * zr + zi * zi);
    if (m > 0) band += power[m];
  }
  return {
    method: 'exact',
    period: P,
    power: (m) => (m >= 0 && m <= half ? power[m] : 0),
    bandPower: band,
    jitterPower: jitter,
    *candidates() {
      for (let m = 1; m <= half; m++) yield m;
    },
    powers: power,
  };
}

/** The table's DFT C_q (unnormalised): by one transform of N' when it fits the limit, else bin by bin. */
function tableBins(model: StreamModel, maxPoints: number): (q: number) => { re: number; im: number } {
  const nr = model.tableLength;
  if (transformPoints(nr) <= maxPoints) {
    const re = Float64Array.from(model.codes);
    const im = new Float64Array(nr);
    fft(re, im);
    return (q) => {
      const i = ((q % nr) + nr) % nr;
      return { re: re[i], im: im[i] };
    };
  }
  const memo = new Map<number, { re: number; im: number }>();
  return (q) => {
    const i = ((q % nr) + nr) % nr;
    let v = memo.get(i);
    if (!v) memo.set(i, (v = dftBin(model.codes, i)));
    return v;
  };
}

/** x⁻¹ mod m for gcd(x, m) = 1 (extended Euclid on numbers below 2^26). */
function inverseMod(x: number, m: number): number {
  if (m === 1) return 0;
  let [r0, r1] = [((x % m) + m) % m, m];
  let [s0, s1] = [1, 0];
  while (r1 !== 0) {
    const q = Math.floor(r0 / r1);
    [r0, r1] = [r1, r0 - q * r1];
    [s0, s1] = [s1, s0 - q * s1];
  }
  return ((s0 % m) + m) % m;
}

function analyticLines(model: StreamModel, maxPoints: number, withJitter: boolean): LineSpectrum {
  const { tableLength: nr, patternLength: L, common: g } = model;
  const jitter = withJitter ? jitterPower(model) : 0;
  const useJitter = withJitter && L > 1;
  const P = useJitter ? model.period : nr;
  const a = nr / g;
  const b = useJitter ? L / g : 1;
  const C = tableBins(model, maxPoints);
  const invA = b > 1 ? inverseMod(a, b) : 0;
  const invF = L > 1 ? inverseMod(model.fractionStep, L) : 0;
  const D = model.divider;

  const lineZ = (m: number): { re: number; im: number } => {
    let zr = 0;
    let zi = 0;
    if (m % b === 0) {
      const c = C(m / b);
      zr += c.re / nr;
      zi += c.im / nr;
    }
    if (useJitter) {
      let sr = 0;
      let si = 0;
      const r0 = (((m % b) * invA) % b + b) % b;
      for (let j = 0; j < g; j++) {
        const r = r0 + j * b;
        if (r === 0) continue; // Ê_0 = 0: the mean edge error is a delay
        // q·b ≡ m − r·a (mod P); the residue divides exactly by b.
        const rest = (((m - r * a) % P) + P) % P;
        const q = (rest / b) % nr;
        const c = C(q);
        const ang = (-2 * Math.PI * q) / nr;
        const oneR = 1 - Math.cos(ang);
        const oneI = -Math.sin(ang);
        const gr = c.re * oneR - c.im * oneI;
        const gi = c.re * oneI + c.im * oneR;
        // Ê_r = 1/(L·(z − 1)), z = e^(−j2πs/L).
        const s = (r * invF) % L;
        const ph = (-2 * Math.PI * s) / L;
        const wr = Math.cos(ph) - 1;
        const wi = Math.sin(ph);
        const den = L * (wr * wr + wi * wi);
        const er = wr / den;
        const ei = -wi / den;
        sr += gr * er - gi * ei;
        si += gr * ei + gi * er;
      }
      const sh = (2 * Math.PI * (m % P)) / P;
      const kr = Math.cos(sh) / (nr * D);
      const ki = Math.sin(sh) / (nr * D);
      zr += sr * kr - si * ki;
      zi += sr * ki + si * kr;
    }
    return { re: zr, im: zi };
  };

  const memo = new Map<number, number>();
  const power = (m: number): number => {
    if (m < 0 || 2 * m > P) return 0;
    let p = memo.get(m);
    if (p === undefined) {
      const z = lineZ(m);
      p = oneSided(m, P) * (z.re * z.re + z.im * z.im);
      memo.set(m, p);
    }
    return p;
  };

  const candidates = (): number[] => {
    const out = new Set<number>();
    const fold = (m: number) => {
      const x = ((m % P) + P) % P;
      out.add(2 * x > P ? P - x : x);
    };
    // The table's strongest bins: the fundamental's neighbourhood and the largest few overall when
    // the whole table was transformed.
    const bins = strongestBins(model, C, maxPoints);
    for (const q of bins) {
      fold(q * b);
      if (!useJitter) continue;
      // The sidebands of a strong line: s = ±1…±8 are the strongest (|Ê| ≈ 1/(2π·s)).
      for (let s = 1; s <= 8 && s < L; s++) {
        for (const sg of [s, L - s]) {
          const r = (sg * model.fractionStep) % L;
          fold(q * b + r * a);
        }
      }
    }
    out.delete(0);
    return [...out];
  };

  return {
    method: 'analytic',
    period: P,
    power,
    bandPower: tableAcPower(model) + jitter,
    jitterPower: jitter,
    candidates,
    binByBin: transformPoints(nr) > maxPoints,
  };
}

/** Bins of the table with the most power (up to 16), scanning it when it was transformed. */
function strongestBins(model: StreamModel, C: (q: number) => { re: number; im: number }, maxPoints: number): number[] {
  const nr = model.tableLength;
  const half = Math.floor(nr / 2);
  const fundamental = Math.round(model.cyclesPerSample * nr);
  const picked = new Set<number>();
  for (let h = 1; h <= 10 && h * fundamental <= half; h++) picked.add(h * fundamental);
  if (transformPoints(nr) <= maxPoints) {
    const top: { q: number; p: number }[] = [];
    for (let q = 1; q <= half; q++) {
      const c = C(q);
      const p = c.re * c.re + c.im * c.im;
      if (top.length < 16 || p > top[top.length - 1].p) {
        top.push({ q, p });
        top.sort((x, y) => y.p - x.p);
        if (top.length > 16) top.pop();
      }
    }
    for (const t of top) picked.add(t.q);
  }
  picked.delete(0);
  return [...picked];
}

/**
 * The spectrum of a stream: exact when its whole period transforms within the limit, analytic
 * otherwise (and for the table alone when asked).
 */
export function lineSpectrum(model: StreamModel, options: SpectrumOptions = {}): LineSpectrum {
  const maxPoints = options.maxTransformPoints ?? MAX_TRANSFORM_POINTS;
  const withJitter = options.withoutJitter !== true && model.patternLength > 1;
  if (!withJitter) {
    if (transformPoints(model.tableLength) <= maxPoints) {
      return exactLines(Float64Array.from(model.codes), 0);
    }
    return analyticLines(model, maxPoints, false);
  }
  if (transformPoints(model.period) <= maxPoints) {
    return exactLines(streamSamples(model), jitterPower(model));
  }
  return analyticLines(model, maxPoints, true);
}
