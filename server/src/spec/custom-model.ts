// The table of an output that is not its plain shape: `band-limit` (the shape's harmonics below
// f_s/2 or below a filter corner), `harmonics` (an amplitude/phase list) and `sample-file` (one
// cycle read from a file, sample-file.ts), read into the CustomWave descriptions of
// signal/custom-tables.ts, with the diagnostics of what cannot be read.

import type { Document } from 'yaml';
import { parseQuantity, magnitudeProblem, MIN_FREQUENCY_HZ } from '../../../shared-schema/src/quantity';
import { formatHz } from '../../../shared-schema/src/quantity-format';
import { type Rational, cmp, fromNumber, toNumber } from '../../../shared-schema/src/rational';
import { MAX_FREQUENCY_HZ } from '../../../shared-schema/src/clock-schema';
import type { OutputEntry } from '../../../shared-schema/src/wave-schema';
import type { CustomWave } from '../planning/custom-wave';
import { bandLimitedWave, harmonicsWave, MAX_HARMONIC_ORDER } from '../signal/custom-tables';
import { locate, scalarText, valueRange } from './nodes';
import type { SampleSource } from './sample-file';
import type { LineIndex } from './source';
import type { Range } from './types';

export type CustomCode = 'unused-key' | 'bad-harmonics' | 'bad-unit' | 'bad-quantity' | 'out-of-range' | 'sample-file-unreadable' | 'sample-file-invalid' | 'seam-glitch';
export type Push = (code: CustomCode, range: Range, message: string) => void;

export interface CustomContext {
  name: string;
  entry: OutputEntry;
  shape: OutputEntry['shape'];
  duty: number;
  /** f_target, or every step's frequency. */
  targetsHz: readonly Rational[];
  doc: Document.Parsed;
  lines: LineIndex;
  /** The range of a key's value in this output (the output's name when it has none). */
  at: (key: string) => Range;
  push: Push;
  /** The file `sample-file:` names, read (when the entry has one). */
  samples?: SampleSource;
}

/** The custom table, {} for the plain shape, or null when what is asked defines no table (an error says why). */
export function customTable(c: CustomContext): { custom?: CustomWave } | null {
  const fromFile = sampleFile(c);
  if (fromFile === null) return null;
  if (fromFile.custom) {
    if (c.entry.harmonics !== undefined) c.push('unused-key', c.at('harmonics'), 'harmonics is not read when sample-file gives the table: remove one of them.');
    return fromFile;
  }
  const listed = harmonics(c);
  if (listed === null) return null;
  const limited = bandLimit(c);
  if (limited === null) return null;
  return { ...limited, ...listed };
}

/**
 * `band-limit` on a square, triangle or sawtooth: `nyquist` keeps the harmonics below each plan's
 * f_s/2, a frequency those below it as well (h·f < corner, at the highest frequency the table plays).
 */
function bandLimit(c: CustomContext): { custom?: CustomWave } | null {
  const value = c.entry['band-limit'];
  if (value === undefined || value === 'none' || c.shape === 'sine') return {};
  if (value === 'nyquist') return { custom: bandLimitedWave(c.shape, c.duty, 'nyquist') };
  const range = c.at('band-limit');
  const text = scalarText(c.doc, locate(c.doc, ['outputs', c.name, 'band-limit'])?.value) ?? String(value);
  const parsed = parseQuantity('frequency', text);
  if (!parsed.ok) {
    c.push(parsed.code, range, parsed.message);
    return null;
  }
  const size = magnitudeProblem('frequency', parsed.value, parsed.base);
  if (size || cmp(parsed.value, fromNumber(MIN_FREQUENCY_HZ)) < 0 || cmp(parsed.value, fromNumber(MAX_FREQUENCY_HZ)) > 0) {
    c.push('out-of-range', range, `\`band-limit\` must be a corner from ${formatHz(fromNumber(MIN_FREQUENCY_HZ))} to ${formatHz(fromNumber(MAX_FREQUENCY_HZ))}: change \`${text.trim()}\`.`);
    return null;
  }
  const top = c.targetsHz.reduce((m, f) => (cmp(f, m) > 0 ? f : m), c.targetsHz[0]!);
  if (cmp(parsed.value, top) <= 0) {
    const which = c.targetsHz.length > 1 ? "the output's highest step" : "the output's frequency";
    c.push('out-of-range', range, `The band-limit corner ${text.trim()} is not above ${which}, ${formatHz(top)}: the table would keep no harmonic of the ${c.shape}. Write a corner above ${formatHz(top)}, or shape: sine.`);
    return null;
  }
  return { custom: bandLimitedWave(c.shape, c.duty, { cornerHz: toNumber(parsed.value), targetHz: toNumber(top) }) };
}

/**
 * `harmonics:` with `shape: sine`: the table of the listed sines. Another shape is named (the
 * list is not read); a list that defines no waveform (an order twice, every amplitude 0) is an
 * error and null, so the output is not planned as something it does not ask for.
 */
function harmonics(c: CustomContext): { custom?: CustomWave } | null {
  const list = c.entry.harmonics;
  if (list === undefined) return {};
  const at = (i?: number): Range => (i === undefined ? undefined : valueRange(c.doc, c.lines, ['outputs', c.name, 'harmonics', i])) ?? c.at('harmonics');
  if (c.shape !== 'sine') {
    c.push('unused-key', at(), `harmonics defines the waveform with shape: sine; this output is a ${c.shape}: write shape: sine or remove harmonics.`);
    return {};
  }
  const seen = new Set<number>();
  for (let i = 0; i < list.length; i++) {
    const h = list[i]!;
    if (h.order > MAX_HARMONIC_ORDER) return {};
    if (seen.has(h.order)) {
      c.push('bad-harmonics', at(i), `Order ${h.order} is listed twice in harmonics: give each order once.`);
      return null;
    }
    seen.add(h.order);
  }
  if (!list.some((h) => h.amplitude > 0)) {
    c.push('bad-harmonics', at(), 'Every amplitude in harmonics is 0: give at least one a positive amplitude.');
    return null;
  }
  return { custom: harmonicsWave(list.map((h) => ({ order: h.order, amplitude: h.amplitude, phaseDeg: h.phase ?? 0 }))) };
}

/**
 * `sample-file:` with `shape: sine`: the file's cycle. A file that cannot be read or parsed is an
 * error and null; a cycle whose wrap is not like its other steps is a seam-glitch warning (the
 * table is still planned from it).
 */
function sampleFile(c: CustomContext): { custom?: CustomWave } | null {
  const written = c.entry['sample-file'];
  if (written === undefined || !c.samples) return {};
  const range = c.at('sample-file');
  if (c.shape !== 'sine') {
    c.push('unused-key', range, `sample-file defines the waveform with shape: sine; this output is a ${c.shape}: write shape: sine or remove sample-file.`);
    return {};
  }
  const read = c.samples.read;
  if (!read.ok) {
    c.push(read.code, range, read.message);
    return null;
  }
  if (read.seam.repeatsFirst) {
    c.push('seam-glitch', range, `The last value of ${written} repeats its first, so the table dwells one sample at the wrap every cycle: the file holds its cycle's end point; remove the last value.`);
  } else if (!read.seam.ok) {
    const ratio = Number.isFinite(read.seam.wrapToLargestStep) ? `${read.seam.wrapToLargestStep.toFixed(1)} times` : 'larger than';
    c.push('seam-glitch', range, `The wrap from the last value of ${written} back to its first is ${ratio} the largest step inside the cycle, a jump at every wrap: the file holds no whole cycle, or its jump sits at the end; start the file elsewhere in the cycle if the jump is the waveform's own.`);
  }
  return { custom: read.wave };
}
