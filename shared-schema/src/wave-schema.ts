// `*.wave.yaml`: the outputs of one board and what each must produce. The single source of truth
// for the file's keys: validation, the JSON Schema, the reference docs and hover text.

import { z } from 'zod';
import {
  DEFAULT_DUTY,
  DEFAULT_DUTY_TOLERANCE,
  DEFAULT_JITTER,
  DEFAULT_MIN_SAMPLES_PER_CYCLE,
  DEFAULT_REASONS,
  DEFAULT_TABLE_SPAN,
  DEFAULT_TOLERANCE,
} from './defaults';
import { MAX_DIVIDER_INTEGER, MAX_FREQUENCY_HZ, MAX_TABLE_LENGTH } from './clock-schema';
import { MIN_FREQUENCY_HZ } from './quantity';
import { SHAPES, type Shape } from './shape';
import { appliesTo, optional, optionalDerived, quantity, required, whole } from './schema-kit';

/**
 * Harmonics a table holds at most (a `harmonics:` list, a band-limited shape), whatever its corner:
 * each sample sums them all, and past this the square's next harmonic is below −66 dBc (4/(π·h)).
 */
export const MAX_HARMONIC_ORDER = 2048;

/** Output names become identifiers in exported firmware tables. */
export const OUTPUT_NAME_PATTERN = /^[A-Za-z_][A-Za-z0-9_-]{0,63}$/;

const floors = Object.entries(DEFAULT_MIN_SAMPLES_PER_CYCLE)
  .map(([shape, s]) => `${shape} ${s}`)
  .join(', ');

const pinnedPlanSchema = z.strictObject({
  divider: required(
    quantity({ kind: 'number', min: 0, minExclusive: true, max: MAX_DIVIDER_INTEGER }),
    'The divider D as a decimal, e.g. `1.953125`; it must be I + F/2^k for the clock file\'s fraction bits k.',
  ),
  'table-length': required(whole(1, MAX_TABLE_LENGTH), 'N, the samples in the table.'),
  cycles: required(
    quantity({ kind: 'number', min: 0, minExclusive: true, max: MAX_TABLE_LENGTH }),
    'M, the cycles the table holds; anything but a whole number breaks the seam at the wrap, and waveplan says so.',
  ),
  'table-span': optional(
    z.enum(['open', 'closed']),
    '`open`: the table spans N intervals and wraps seamlessly; `closed`: it spans N − 1 intervals, so its last sample repeats the first (a glitch at the wrap).',
    DEFAULT_TABLE_SPAN,
  ),
});

/** Steps one output may list (each adds a divider to the exported arrays). */
export const MAX_STEPS = 64;

const stepSchema = z
  .strictObject({
    frequency: required(
      quantity({ kind: 'frequency', min: MIN_FREQUENCY_HZ, max: MAX_FREQUENCY_HZ }),
      'f_target of this step, e.g. `466.163761518 Hz`; exact as written.',
    ),
    tolerance: optional(
      quantity({ kind: 'tolerance', min: 0 }),
      "This step's allowed |achieved − target| in ppm, ppb, % or Hz; the output's `tolerance` when absent.",
    ),
  })
  .describe('One frequency step: its frequency and, optionally, its own tolerance.');

export const outputSchema = z.strictObject({
  description: optional(z.string(), 'Free text about this output; waveplan shows it and does not read it.'),
  shape: required(z.enum(SHAPES), 'The waveform the table holds.'),
  duty: optional(
    quantity({ kind: 'duty', min: 0, minExclusive: true, max: 1, maxExclusive: true }),
    'Square waves only: the share of the cycle spent high, as `50 %` or `0.5`.',
    DEFAULT_DUTY,
  ),
  'duty-tolerance': optional(
    quantity({ kind: 'duty', min: 0, max: 1, maxExclusive: true }),
    `Square waves only: how far the duty the table really has (a whole number of high samples per cycle) may be from \`duty\`, in points of the cycle, e.g. \`1 %\`; plans that hold the duty this closely are preferred, and waveplan warns when no plan within the frequency tolerance does. The default is ${DEFAULT_REASONS.dutyTolerance}.`,
    DEFAULT_DUTY_TOLERANCE,
  ),
  frequency: optionalDerived(
    quantity({ kind: 'frequency', min: MIN_FREQUENCY_HZ, max: MAX_FREQUENCY_HZ }),
    'f_target, the output frequency, e.g. `3.997802734375 MHz`; exact as written.',
    'required unless `steps` lists the frequencies',
  ),
  steps: optional(
    z.array(stepSchema).min(1).max(MAX_STEPS),
    `Frequencies the output steps through on one table, instead of \`frequency\` (a tone sequencer, a stepped frequency response, a scale): firmware keeps the table and changes only the divider. waveplan chooses one table (N, M) for every step and a divider per step (whole; fractional where \`jitter: allow\` and no whole one meets the step's tolerance), ranked as one output's plans are, with the worst share of the tolerance over the steps in place of the error. Up to ${MAX_STEPS} steps, e.g. \`- { frequency: 440 Hz }\`.`,
  ),
  tolerance: optional(
    quantity({ kind: 'tolerance', min: 0 }),
    `Allowed |achieved − target| in ppm, ppb, % or Hz. The default is ${DEFAULT_REASONS.tolerance}.`,
    DEFAULT_TOLERANCE,
  ),
  'min-samples-per-cycle': optionalDerived(
    quantity({ kind: 'number', min: 0, minExclusive: true, max: MAX_TABLE_LENGTH }),
    `Floor on S = N/M, the samples per cycle. Defaults: ${floors}. Sine: ${DEFAULT_REASONS.minSamplesPerCycle.sine}; square: ${DEFAULT_REASONS.minSamplesPerCycle.square}; triangle and sawtooth: ${DEFAULT_REASONS.minSamplesPerCycle.triangle}. A sine must stay above 2 (Nyquist).`,
    `by shape: ${floors}`,
  ),
  'max-samples-per-cycle': optionalDerived(
    quantity({ kind: 'number', min: 0, minExclusive: true, max: MAX_TABLE_LENGTH }),
    'S max, the samples per cycle beyond which more samples buy nothing on this DAC: a preference, not a limit. Among the plans within tolerance, those with S ≤ S max come first and the largest S up to S max is chosen; a plan above it is used only when none at or below it meets the tolerance.',
    DEFAULT_REASONS.maxSamplesPerCycle,
  ),
  'whole-samples-per-cycle': optionalDerived(
    z.boolean(),
    'Plan only tables whose length is a multiple of their cycles (S = N/M whole), so every cycle is sampled at the same phases.',
    DEFAULT_REASONS.wholeSamplesPerCycle,
  ),
  'band-limit': optional(
    z.union([z.enum(['none', 'nyquist']), quantity({ kind: 'frequency', min: MIN_FREQUENCY_HZ, max: MAX_FREQUENCY_HZ })]),
    "Square, triangle and sawtooth: `nyquist` fills the table with only the shape's harmonics below each plan's f_s/2 (scaled to the amplitude), so none folds back between them and every cycle looks alike even when S is not whole; a frequency, e.g. `20 kHz`, is a filter corner: only the harmonics h·f_target below it (and below f_s/2), with the highest step's frequency on an output with steps; it must lie above that frequency. `none` samples the ideal shape.",
    'none',
  ),
  harmonics: optional(
    z
      .array(
        z.strictObject({
          order: z.number().int().min(1).max(MAX_HARMONIC_ORDER).describe(`h, the harmonic: 1 is the fundamental, a whole number up to ${MAX_HARMONIC_ORDER}.`),
          amplitude: z.number().min(0).describe("Relative amplitude (any scale: the sum is scaled to the output's `amplitude`)."),
          phase: z.number().min(-360).max(360).optional().describe("Phase in degrees of this harmonic's sine, amplitude·sin(2π·h·t/T + phase); 0 when absent."),
        }),
      )
      .min(1)
      .max(MAX_HARMONIC_ORDER),
    "A waveform of our own: the table holds the sum of these sines (harmonics at or above each plan's f_s/2 are left out), scaled to `amplitude`. Written with `shape: sine`, whose defaults apply; each order once, e.g. `- { order: 3, amplitude: 0.1, phase: 90 }`.",
  ),
  'sample-file': optional(
    z.string().min(1),
    "A waveform of our own from a file: one cycle of values, one a line or in CSV columns (the last column is the value; # comments, blank lines and a header line are skipped), scaled so the cycle spans `amplitude`. The path is relative to this file and must stay inside the workspace folder (at most 3 MiB). Written with `shape: sine`, whose defaults apply but one: `max-samples-per-cycle` is the file's number of values K, so a plan with S = K, which plays the file sample for sample, is preferred; at any other S the table is the cycle resampled by linear interpolation. The wrap from the last value back to the first is checked like any table's seam. E.g. `./pulse.csv`.",
  ),
  'min-snr': optionalDerived(
    quantity({ kind: 'decibel', min: 0, max: 400 }),
    "Signal-quality floor: the least SNR the output's stream may have, e.g. `70 dB`. Below it a warning names the cause (divider jitter, the table, quantisation) and a plan or change that would meet it.",
    DEFAULT_REASONS.qualityFloor,
  ),
  'min-sfdr': optionalDerived(
    quantity({ kind: 'decibel', min: 0, max: 400 }),
    'Signal-quality floor: the least SFDR (the fundamental against the largest spur) the output may have, e.g. `70 dB`.',
    DEFAULT_REASONS.qualityFloor,
  ),
  jitter: optional(
    z.enum(['forbid', 'allow']),
    '`forbid`: integer dividers only, no divider jitter; `allow`: a fractional divider may be used when no integer one meets the tolerance.',
    DEFAULT_JITTER,
  ),
  amplitude: optionalDerived(
    quantity({ kind: 'voltage-pp', min: 0, max: 2000 }),
    "Peak-to-peak swing, e.g. `2 Vpp`; offset ± amplitude/2 must stay within 0 V and the DAC's full scale.",
    DEFAULT_REASONS.amplitude,
  ),
  offset: optionalDerived(
    quantity({ kind: 'voltage', min: -1000, max: 1000 }),
    "Mid-level of the waveform, e.g. `1.65 V`; offset ± amplitude/2 must stay within 0 V and the DAC's full scale.",
    DEFAULT_REASONS.offset,
  ),
  plan: optional(pinnedPlanSchema, 'A plan written by hand: waveplan checks it instead of searching for one.'),
}).describe('One output: the waveform, its frequency and tolerance, and the limits its plan must keep.');

/** Outputs tied together: one sample clock, and with `lock: phase` one table length and stated phases. */
export const groupSchema = z
  .strictObject({
    description: optional(z.string(), 'Free text about this group; waveplan shows it and does not read it.'),
    outputs: required(
      z.array(z.string().regex(OUTPUT_NAME_PATTERN)).min(2).max(16),
      'The outputs of the group by name, e.g. `[coil, reference]`; the first is the phase reference. An output belongs to at most one group.',
    ),
    lock: optional(
      z.enum(['sample-clock', 'phase']),
      '`sample-clock`: the outputs share one divider (two DAC channels paced by one timer or one DMA request), each with its own table; `phase`: they also share the table length, keep their frequencies in the exact ratio of their targets, and hold the stated phase offsets (a quadrature pair, a three-phase set, a harmonic family).',
      'sample-clock',
    ),
    'phase-offsets': optional(
      z.record(z.string().regex(OUTPUT_NAME_PATTERN), z.number().min(-360).max(360).describe('Degrees this member runs ahead of the first output.')),
      'With `lock: phase`: each member\'s phase in degrees ahead of the first output, e.g. `{ reference: 90 }`; unlisted members are in phase (0). Realised as a whole number of samples; the phase error that leaves is reported in degrees and seconds.',
    ),
    'offsets-as': optional(
      z.enum(['table-rotation', 'start-offset']),
      '`table-rotation`: each member gets its own table, rotated by its offset; `start-offset`: the members share one table and the firmware starts each DMA channel that many samples in (only for members with the same waveform and frequency).',
      'table-rotation',
    ),
  })
  .describe('One group of outputs, by name.');

export const waveSchema = z
  .strictObject({
    description: optional(z.string(), 'Free text about these outputs; waveplan shows it and does not read it.'),
    clock: required(z.string().min(1), 'Path of the clock file these outputs run on, relative to this file, e.g. `./bench.clock.yaml`.'),
    outputs: required(
      z.record(z.string().regex(OUTPUT_NAME_PATTERN), outputSchema),
      'The outputs by name (a letter or _, then letters, digits, _ or -); each is planned on its own, and their tables share the memory budget.',
    ),
    groups: optional(
      z.record(z.string().regex(OUTPUT_NAME_PATTERN), groupSchema),
      'Outputs planned together, by group name: sharing one sample clock, or phase-locked with stated offsets.',
    ),
  })
  .describe('A waveplan wave file: the outputs one board produces, planned against its clock file.');

export type WaveFile = z.infer<typeof waveSchema>;
export type OutputEntry = z.infer<typeof outputSchema>;
export type GroupEntry = z.infer<typeof groupSchema>;

// Which output keys apply to which shape, once for every face (completion, the check): the duty is
// a square's; a band-limited table is the harmonics of a square, triangle or sawtooth; `harmonics`
// and `sample-file` define the waveform of a sine (server/src/spec/wave-model.ts, custom-model.ts).
appliesTo(outputSchema.shape, {
  duty: ['square'],
  'duty-tolerance': ['square'],
  'band-limit': ['square', 'triangle', 'sawtooth'],
  harmonics: ['sine'],
  'sample-file': ['sine'],
} satisfies { [K in keyof OutputEntry]?: readonly Shape[] });
