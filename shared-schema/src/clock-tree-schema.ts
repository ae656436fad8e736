// The clock tree of a clock file: where the system clock comes from (a crystal through a PLL, or
// a list of settings the board can run at), how accurate it is, and the peripherals that take
// their own clock from the same tree. Spread into clockSchema; kept here so the file formats of
// the divider and the analog chain grow beside it without touching it.

import { z } from 'zod';
import { MIN_FREQUENCY_HZ } from './quantity';
import { optional, quantity, required, whole } from './schema-kit';

/** Enough for any microcontroller or FPGA PLL; the enumeration's cost is bounded separately. */
export const MAX_REFERENCE_DIVIDER = 1024;
export const MAX_FEEDBACK_MULTIPLIER = 65536;
export const MAX_POST_DIVIDER = 65536;
export const MAX_POST_DIVIDER_STAGES = 4;
export const MAX_CANDIDATE_CLOCKS = 256;
/** Peripheral names become part of messages, like output names. */
export const PERIPHERAL_NAME_PATTERN = /^[A-Za-z_][A-Za-z0-9_-]{0,63}$/;

/** The same bound as clockSchema's frequencies (not imported: clockSchema imports this file). */
const MAX_HZ = 1e11;
const frequency = () => quantity({ kind: 'frequency', min: MIN_FREQUENCY_HZ, max: MAX_HZ });

const frequencyRange = (what: string) =>
  z.strictObject({
    min: required(frequency(), `Lowest ${what}.`),
    max: required(frequency(), `Highest ${what}.`),
  });

const wholeRange = (symbol: string, what: string, max: number) =>
  z.strictObject({
    min: required(whole(1, max), `Smallest ${symbol}, the ${what}.`),
    max: required(whole(1, max), `Largest ${symbol}, the ${what}.`),
  });

const postDividerStage = z.strictObject({
  min: optional(whole(1, MAX_POST_DIVIDER), 'Smallest value of this stage (with `max`: every whole number between them).'),
  max: optional(whole(1, MAX_POST_DIVIDER), 'Largest value of this stage (with `min`).'),
  values: optional(
    z.array(whole(1, MAX_POST_DIVIDER)).min(1).max(64),
    'The values this stage can take, when they are not every whole number of a range, e.g. `[2, 4, 6, 8]`.',
  ),
}).describe('One post-divider stage, by name: the values it can divide the VCO by.');

const pllSchema = z.strictObject({
  crystal: required(
    frequency(),
    'f_ref, the crystal (or oscillator) that feeds the PLL, e.g. `25 MHz`; its accuracy is `system-clock-tolerance`.',
  ),
  'reference-divider': required(
    wholeRange('R', 'reference divider before the phase detector: f_pfd = f_ref / R', MAX_REFERENCE_DIVIDER),
    'R, the reference divider: f_pfd = f_ref / R.',
  ),
  'feedback-multiplier': required(
    wholeRange('N', 'feedback divider in the loop, which multiplies: f_vco = f_pfd · N', MAX_FEEDBACK_MULTIPLIER),
    'N, the feedback divider: the loop locks when f_vco / N = f_pfd, so f_vco = f_ref · N / R.',
  ),
  'phase-detector': optional(
    frequencyRange('phase-detector (comparison) frequency f_pfd = f_ref / R the datasheet allows'),
    'Range of f_pfd = f_ref / R, the frequency the phase detector compares at; absent: any.',
  ),
  vco: required(frequencyRange('VCO frequency f_vco = f_ref · N / R the datasheet allows'), 'Range of f_vco, the VCO frequency.'),
  'post-dividers': required(
    z.record(z.string().regex(PERIPHERAL_NAME_PATTERN), postDividerStage),
    `The dividers between the VCO and the system clock, by name (at most ${MAX_POST_DIVIDER_STAGES}): f_sys = f_vco / (P1 · P2 · …). Each stage is \`{ min, max }\` or \`{ values: [...] }\`.`,
  ),
});

const peripheralSchema = z.strictObject({
  frequency: required(frequency(), 'The clock (or baud rate) this peripheral needs, e.g. `115200 Hz` or `48 MHz`.'),
  tolerance: required(
    quantity({ kind: 'tolerance', min: 0 }),
    'Allowed |achieved − wanted| in ppm, ppb, % or Hz, with the system clock\'s own tolerance counted in (e.g. `2 %` for a serial link, `0.25 %` for a USB clock).',
  ),
  source: optional(
    z.enum(['system-clock', 'vco']),
    '`system-clock`: divided from f_sys; `vco`: divided from the PLL\'s VCO by a divider of its own.',
    'system-clock',
  ),
  divider: required(
    wholeRange('divider', 'whole divider between the source and the peripheral (its register value as a divider, oversampling included)', 2 ** 32),
    'Range of the whole divider between the source and this peripheral.',
  ),
}).describe('One peripheral clock, by name: the frequency it needs, its tolerance and the divider that makes it.');

/** The keys clockSchema spreads in. */
export const clockTreeKeys = {
  'system-clock-tolerance': optional(
    quantity({ kind: 'tolerance', min: 0 }),
    'The accuracy of the system clock, ±, in ppm, ppb or % (with a crystal, the crystal\'s tolerance: a PLL multiplies the frequency and keeps its relative error). Every output\'s worst-case error adds it to the plan\'s; absent: the clock is taken as exact.',
  ),
  'system-clock-candidates': optional(
    z.array(frequency()).min(1).max(MAX_CANDIDATE_CLOCKS),
    'The system clocks the board can run at, when it has no PLL to describe, e.g. `[100 MHz, 120 MHz]`; waveplan ranks them for the outputs (`system-clock` stays the one in use).',
  ),
  pll: optional(
    pllSchema,
    'The PLL that makes the system clock from a crystal: f_pfd = f_ref / R, f_vco = f_pfd · N, f_sys = f_vco / P. waveplan ranks every system clock it can reach for the outputs (`system-clock` stays the one in use).',
  ),
  'peripheral-clocks': optional(
    z.record(z.string().regex(PERIPHERAL_NAME_PATTERN), peripheralSchema),
    'Peripherals that take their clock from the same tree (a serial baud rate, a USB clock), by name: a system clock that cannot give each its frequency within its tolerance is ruled out.',
  ),
};

export type PllEntry = z.infer<typeof pllSchema>;
export type PeripheralEntry = z.infer<typeof peripheralSchema>;
