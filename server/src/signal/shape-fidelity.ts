// How closely one cycle of a table, as the DAC holds it and a reconstruction filter smooths it,
// follows the ideal shape: rise and fall times and overshoot of edges, the rounding of a
// triangle's corners, and the harmonic content against the ideal shape's.
//
// The output after an ideal low-pass at `cornerHz` (f_s/2 unless a filter corner is stated) is
// the table's Fourier series up to the corner, each harmonic weighted by the hold's
// sin(x)/x (hold.ts) — what a scope shows behind a good reconstruction filter. Edges can only
// land on the sample grid, so an edge's timing resolution is one sample period.

import type { Shape } from '../planning/types';
import { dftBin, fft, transformPoints } from './fft';
import { MAX_TRANSFORM_POINTS } from './lines';
import { sinc } from './hold';
import { idealHarmonicRatio, idealThd } from './ideal-shapes';

export interface HarmonicMatch {
  order: number;
  /** Level against the fundamental, dB: the ideal shape's and the table's. */
  idealDbc: number;
  tableDbc: number;
}

export interface ShapeFidelity {
  shape: Shape;
  samplesPerCycle: number;
  /** THD of the ideal continuous shape and of the table's samples (harmonics below the corner), %. */
  idealThdPercent: number;
  tableThdPercent: number;
  /** The first harmonics (up to 9) below the corner. */
  harmonics: HarmonicMatch[];
  /** 10–90 % time of the rising and falling edge (square; the sawtooth's reset is its fall). */
  riseTimeS: number | null;
  fallTimeS: number | null;
  /** Peak overshoot past the ideal level, % of peak-to-peak (Gibbs: about 9 % for an ideal low-pass). */
  overshootPercent: number | null;
  /** Triangle: how far the reconstructed peaks fall short of the ideal corners, % of peak-to-peak. */
  cornerErrorPercent: number | null;
  /** Edges land on the sample grid: one sample period, s. */
  edgeResolutionS: number;
}

const STEPS_PER_SAMPLE = 32;
const db = (x: number) => 20 * Math.log10(Math.max(x, 1e-300));

/**
 * Fidelity of one cycle of S whole samples (codes: the table's first cycle, as exported).
 * Returns null for a sine, or when S is not whole (then no cycle repeats the last).
 */
export function shapeFidelity(
  cycle: ArrayLike<number>,
  shape: Shape,
  duty: number,
  sampleRateHz: number,
  cornerHz?: number,
): ShapeFidelity | null {
  const S = cycle.length;
  if (shape === 'sine' || S < 2) return null;
  const fOut = sampleRateHz / S;
  const corner = Math.min(cornerHz ?? sampleRateHz / 2, sampleRateHz / 2);
  // Harmonics strictly below the corner; the Nyquist line of an even S is left out (its phase
  // is undefined in a real table).
  const top = Math.max(1, Math.min(Math.ceil(S / 2) - 1, Math.ceil(corner / fOut) - 1));
  // Line amplitudes of the samples (the DFT, as the tone figures measure them) and of the
  // reconstructed output (each line weighted by the hold's sin(x)/x).
  const re = new Float64Array(top + 1);
  const im = new Float64Array(top + 1);
  const raw = new Float64Array(top + 1);
  const bins = cycleBins(cycle);
  for (let h = 0; h <= top; h++) {
    const c = bins(h);
    const w = (h === 0 ? 1 : 2) * sinc(h / S);
    re[h] = (c.re * w) / S;
    im[h] = (c.im * w) / S;
    raw[h] = (Math.hypot(c.re, c.im) * (h === 0 ? 1 : 2)) / S;
  }
  let harmonicsPower = 0;
  for (let h = 2; h <= top; h++) harmonicsPower += raw[h] ** 2;
  const harmonics: HarmonicMatch[] = [];
  for (let h = 2; h <= Math.min(top, 9); h++) {
    const ideal = idealHarmonicRatio(shape, duty, h);
    if (ideal === 0 && raw[h] / raw[1] < 1e-6) continue; // an absent harmonic that stays absent
    harmonics.push({ order: h, idealDbc: db(ideal), tableDbc: db(raw[h] / raw[1]) });
  }

  // The reconstructed output at position t in samples (t = i is the start of sample i's hold;
  // the hold delays by half a sample, which the phase of each line carries).
  const at = (t: number): number => {
    let v = re[0];
    for (let h = 1; h <= top; h++) {
      const a = (2 * Math.PI * h * (t - 0.5)) / S;
      v += re[h] * Math.cos(a) - im[h] * Math.sin(a);
    }
    return v;
  };
  let low = Infinity;
  let high = -Infinity;
  for (let i = 0; i < S; i++) {
    low = Math.min(low, cycle[i]);
    high = Math.max(high, cycle[i]);
  }
  const span = high - low;
  // An edge behind a corner B takes about 0.44/B (ideal low-pass, Si function): scan a few times
  // that either side of it, within a quarter cycle so no other edge is reached.
  const reach = Math.max(3, Math.min(Math.floor(S / 4), Math.ceil((1.5 * sampleRateHz) / corner)));
  const edgeTime = (i: number, rising: boolean): { time: number; peak: number } => {
    // Sample i is the first of the new level.
    const lvl = (f: number) => low + f * span;
    let t10 = NaN;
    let t90 = NaN;
    let peak = rising ? -Infinity : Infinity;
    for (let k = -reach * STEPS_PER_SAMPLE; k <= reach * STEPS_PER_SAMPLE; k++) {
      const t = i + k / STEPS_PER_SAMPLE;
      const v = at(t);
      peak = rising ? Math.max(peak, v) : Math.min(peak, v);
      const f10 = rising ? v >= lvl(0.1) : v <= lvl(0.9);
      const f90 = rising ? v >= lvl(0.9) : v <= lvl(0.1);
      if (f10 && Number.isNaN(t10)) t10 = t;
      if (f90 && Number.isNaN(t90)) t90 = t;
    }
    return { time: (t90 - t10) / sampleRateHz, peak };
  };

  let riseTimeS: number | null = null;
  let fallTimeS: number | null = null;
  let overshootPercent: number | null = null;
  let cornerErrorPercent: number | null = null;
  if ((shape === 'square' || shape === 'sawtooth') && span > 0) {
    const rises: number[] = [];
    const falls: number[] = [];
    for (let i = 0; i < S; i++) {
      const prev = cycle[(i - 1 + S) % S];
      if (shape === 'square' && cycle[i] === high && prev === low) rises.push(i);
      if (cycle[i] - prev < -span / 2) falls.push(i);
    }
    let over = 0;
    if (rises.length > 0) {
      const r = edgeTime(rises[0], true);
      riseTimeS = Number.isNaN(r.time) ? null : r.time;
      over = Math.max(over, (r.peak - high) / span);
    }
    if (falls.length > 0) {
      const f = edgeTime(falls[0], false);
      fallTimeS = Number.isNaN(f.time) ? null : f.time;
      over = Math.max(over, (low - f.peak) / span);
    }
    overshootPercent = 100 * Math.max(0, over);
  }
  if (shape === 'triangle' && span > 0) {
    // The ideal corners sit at phases 0 and ½: look two samples either side of each.
    let max = -Infinity;
    let min = Infinity;
    for (const centre of [0, S / 2]) {
      for (let k = -2 * STEPS_PER_SAMPLE; k <= 2 * STEPS_PER_SAMPLE; k++) {
        const v = at(centre + 0.5 + k / STEPS_PER_SAMPLE);
        max = Math.max(max, v);
        min = Math.min(min, v);
      }
    }
    cornerErrorPercent = (100 * (span - (max - min))) / 2 / span;
  }
  return {
    shape,
    samplesPerCycle: S,
    idealThdPercent: 100 * idealThd(shape, duty),
    tableThdPercent: (100 * Math.sqrt(harmonicsPower)) / raw[1],
    harmonics,
    riseTimeS,
    fallTimeS,
    overshootPercent,
    cornerErrorPercent,
    edgeResolutionS: 1 / sampleRateHz,
  };
}

/** The cycle's DFT bins: one transform, or bin by bin when the cycle is too long to transform. */
function cycleBins(cycle: ArrayLike<number>): (h: number) => { re: number; im: number } {
  const S = cycle.length;
  if (transformPoints(S) > MAX_TRANSFORM_POINTS) return (h) => dftBin(cycle, h);
  const re = Float64Array.from(cycle as ArrayLike<number>);
  const im = new Float64Array(S);
  fft(re, im);
  return (h) => ({ re: re[h], im: im[h] });
}
