// Descriptions of the tables that are not a plain shape (planning/custom-wave.ts evaluates them):
// a band-limited square, triangle or sawtooth, a list of harmonics, and one cycle from a sample
// file. Pure: the spec layer reads the file through its host and hands the text here.

import type { CustomWave, FourierTerm } from '../planning/custom-wave';
import type { Shape } from '../planning/types';
import { MAX_HARMONIC_ORDER } from '../../../shared-schema/src/wave-schema';
import { shapeTerms } from './ideal-shapes';

export { MAX_HARMONIC_ORDER };

/**
 * A square, triangle or sawtooth with only its harmonics below a corner: f_s/2 of each plan
 * (`nyquist`), or the orders h with h·f_target < cornerHz (a reconstruction filter's corner).
 */
export function bandLimitedWave(shape: Exclude<Shape, 'sine'>, duty: number, limit: 'nyquist' | { cornerHz: number; targetHz: number }): CustomWave {
  if (limit === 'nyquist') {
    return { key: `band:${shape}:${duty}:nyquist`, terms: shapeTerms(shape, duty, MAX_HARMONIC_ORDER), belowNyquist: true };
  }
  const top = Math.max(1, Math.min(MAX_HARMONIC_ORDER, Math.ceil(limit.cornerHz / limit.targetHz) - 1));
  return { key: `band:${shape}:${duty}:${top}`, terms: shapeTerms(shape, duty, top), belowNyquist: true };
}

export interface HarmonicEntry {
  /** h ≥ 1. */
  order: number;
  /** Relative amplitude (any scale: the sum is scaled to the output's amplitude). */
  amplitude: number;
  /** Phase in degrees, of a sine: amplitude·sin(2π·h·φ + phase). */
  phaseDeg: number;
}

/** A waveform from an amplitude/phase list; harmonics at or above each plan's f_s/2 are dropped. */
export function harmonicsWave(list: readonly HarmonicEntry[]): CustomWave {
  const terms: FourierTerm[] = list.map((h) => {
    const p = (h.phaseDeg * Math.PI) / 180;
    // A·sin(x + p) = A·sin(p)·cos(x) + A·cos(p)·sin(x)
    return { order: h.order, cos: h.amplitude * Math.sin(p), sin: h.amplitude * Math.cos(p) };
  });
  const key = list.map((h) => `${h.order}:${h.amplitude}:${h.phaseDeg}`).join(',');
  return { key: `harmonics:${key}`, terms, belowNyquist: true };
}

/** Sample files hold at most this many values and this many bytes of text. */
export const SAMPLE_FILE_MAX_VALUES = 1 << 20;
export const SAMPLE_FILE_MAX_BYTES = 16 << 20;

export type SampleFileResult =
  | { ok: true; values: Float64Array }
  | { ok: false; message: string; /** 0-based line of the problem, when it has one. */ line?: number };

/**
 * One cycle of a waveform as text: one value a line, or comma/semicolon separated columns of
 * which the last is the value (so `time,value` exports work). Blank lines and lines starting
 * with # are skipped; a first line that is not a number is taken as a header.
 */
export function parseSampleFile(text: string): SampleFileResult {
  if (text.length > SAMPLE_FILE_MAX_BYTES) {
    return { ok: false, message: `The sample file is ${text.length} bytes, over the limit of ${SAMPLE_FILE_MAX_BYTES}.` };
  }
  const values: number[] = [];
  const lines = text.split(/\r\n|\r|\n/);
  for (let i = 0; i < lines.length; i++) {
    const line = lines[i].trim();
    if (line === '' || line.startsWith('#')) continue;
    const cells = line.split(/[,;\t]/).map((c) => c.trim()).filter((c) => c !== '');
    const cell = cells[cells.length - 1] ?? '';
    const v = /^[+-]?(\d+(\.\d*)?|\.\d+)([eE][+-]?\d+)?$/.test(cell) ? Number(cell) : NaN;
    if (!Number.isFinite(v)) {
      if (values.length === 0 && i === firstContentLine(lines)) continue; // a header
      return { ok: false, message: `Line ${i + 1} of the sample file is not a number: "${cell.slice(0, 40)}".`, line: i };
    }
    if (values.length >= SAMPLE_FILE_MAX_VALUES) {
      return { ok: false, message: `The sample file holds more than ${SAMPLE_FILE_MAX_VALUES} values.`, line: i };
    }
    values.push(v);
  }
  if (values.length < 2) return { ok: false, message: 'The sample file needs at least 2 values (one cycle of the waveform).' };
  return { ok: true, values: Float64Array.from(values) };
}

function firstContentLine(lines: readonly string[]): number {
  for (let i = 0; i < lines.length; i++) {
    const l = lines[i].trim();
    if (l !== '' && !l.startsWith('#')) return i;
  }
  return -1;
}

export interface SampleSeam {
  ok: boolean;
  /** |last − first| against the largest step inside the cycle, as a ratio (≤ 1 wraps like any step). */
  wrapToLargestStep: number;
  /** The last value repeats the first (a closed cycle: one sample of dwell every cycle). */
  repeatsFirst: boolean;
}

/**
 * The seam of a cycle read from a file: its wrap (last value back to the first) should look like
 * any other step of the cycle. A cycle whose last value repeats its first was written with its
 * end point included (the closed-span off-by-one, planning/seam.ts).
 */
export function sampleSeam(values: Float64Array): SampleSeam {
  const n = values.length;
  let largest = 0;
  for (let i = 1; i < n; i++) largest = Math.max(largest, Math.abs(values[i] - values[i - 1]));
  const wrap = Math.abs(values[0] - values[n - 1]);
  const repeatsFirst = wrap === 0 && largest > 0;
  const ratio = largest > 0 ? wrap / largest : wrap > 0 ? Infinity : 0;
  return { ok: !repeatsFirst && ratio <= 1, wrapToLargestStep: ratio, repeatsFirst };
}

/** The file's cycle scaled to −1 … +1 (a flat file stays at 0). */
export function sampleWave(values: Float64Array, key: string): CustomWave {
  let lo = Infinity;
  let hi = -Infinity;
  for (const v of values) {
    lo = Math.min(lo, v);
    hi = Math.max(hi, v);
  }
  const mid = (hi + lo) / 2;
  const half = (hi - lo) / 2;
  const samples = values.map((v) => (half > 0 ? (v - mid) / half : 0));
  return { key: `samples:${key}`, samples };
}
