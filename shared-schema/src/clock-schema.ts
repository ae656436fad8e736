// `*.clock.yaml`: the hardware every wave spec of a board plans against. The single source of
// truth for the file's keys: validation, the JSON Schema, the reference docs and hover text.

import { z } from 'zod';
import { DEFAULT_FRACTION_BITS, DEFAULT_POWER_OF_TWO, DEFAULT_REGISTER_OFFSET } from './defaults';
import { MIN_FREQUENCY_HZ } from './quantity';
import { optional, optionalDerived, quantity, required, whole } from './schema-kit';
import { clockTreeKeys } from './clock-tree-schema';

/** 100 GHz: far above any microcontroller, low enough to catch a slipped exponent. */
export const MAX_FREQUENCY_HZ = 1e11;
/** 2^26 samples: a table larger than this is not held in microcontroller RAM. */
export const MAX_TABLE_LENGTH = 2 ** 26;
export const MAX_DIVIDER_INTEGER = 2 ** 32;
/** Above 16 bits the divider's period pattern (2^k samples) stops being a useful figure. */
export const MAX_FRACTION_BITS = 16;

/**
 * Stage names become parts of C identifiers in exported headers: a letter, then letters and
 * digits in runs joined by single underscores (a double or trailing underscore would give a name
 * C and C++ reserve), at most 32 characters.
 */
export const STAGE_NAME_PATTERN = /^(?=.{1,32}$)[A-Za-z][A-Za-z0-9]*(?:_[A-Za-z0-9]+)*$/;
/** Stages the planner searches exactly (their products are tested by divisor windows). */
export const MAX_DIVIDER_STAGES = 2;

const stageSchema = z.strictObject({
  min: required(whole(1, MAX_DIVIDER_INTEGER), 'Smallest value this stage divides by.'),
  max: required(whole(1, MAX_DIVIDER_INTEGER), 'Largest value this stage divides by; the product of every stage\'s max may be at most 2^32.'),
  'register-offset': optional(
    z.number().int().min(-MAX_DIVIDER_INTEGER).max(MAX_DIVIDER_INTEGER),
    'What the stage\'s register holds: value + register-offset, e.g. -1 for a counter that divides by its register + 1. Every register value must be 0 or more.',
    DEFAULT_REGISTER_OFFSET,
  ),
}).describe('One counter stage: the range of values it divides by and how its register holds the value.');

const frequency = () => quantity({ kind: 'frequency', min: MIN_FREQUENCY_HZ, max: MAX_FREQUENCY_HZ });

export const clockSchema = z
  .strictObject({
    description: optional(z.string(), 'Free text about the board or the clock setup; waveplan shows it and does not read it.'),
    'system-clock': required(
      frequency(),
      'f_sys, the clock the sample-clock divider divides, e.g. `125 MHz`; exact as written (decimal text, never rounded).',
    ),
    'rated-system-clock': optional(
      frequency(),
      "The highest system clock the part's datasheet allows. A `system-clock` above it gets a caution: check the datasheet and qualified practice before running hardware that way.",
    ),
    ...clockTreeKeys,
    divider: required(
      z.strictObject({
        integer: optionalDerived(
          z.strictObject({
            min: required(whole(1, MAX_DIVIDER_INTEGER), 'Smallest integer part I of the divider D = I + F/2^k.'),
            max: required(whole(1, MAX_DIVIDER_INTEGER), 'Largest integer part I of the divider D = I + F/2^k.'),
          }),
          'Range of the integer part I of the sample-clock divider.',
          'required unless `stages` describes the divider',
        ),
        'fraction-bits': optional(
          whole(0, MAX_FRACTION_BITS),
          'k, the fraction bits of the divider D = I + F/2^k; 0 means an integer-only divider (no divider jitter).',
          DEFAULT_FRACTION_BITS,
        ),
        stages: optional(
          z.record(z.string().regex(STAGE_NAME_PATTERN), stageSchema),
          `The divider as it is built, instead of \`integer\`: ${MAX_DIVIDER_STAGES === 2 ? 'one or two' : `up to ${MAX_DIVIDER_STAGES}`} counter stages in a chain, by name in chain order, e.g. \`prescaler\` then \`period\`. D is the product of one value from each stage (a timer that divides by (prescaler + 1)·(period + 1) is two stages with register-offset -1), so the planner uses only the dividers the stages can make; the stage values are chosen with the first stage as small as it can be, which leaves the last stage the longest count. Integer only: no fraction-bits.`,
        ),
      }),
      'The sample-clock divider: f_s = f_sys / D with D = I + F/2^k, or D the product of counter stages.',
    ),
    dac: required(
      z.strictObject({
        bits: required(whole(1, 31), 'Resolution of the DAC in bits (up to 31, so every code fits a signed 32-bit word); one LSB is full-scale / 2^bits.'),
        'sample-bytes': required(whole(1, 8), 'Bytes one sample takes in RAM (the DMA transfer width), e.g. 2 for a 12-bit DAC.'),
        'full-scale': required(
          quantity({ kind: 'voltage', min: 0, minExclusive: true, max: 1000 }),
          'Output voltage at the top code, e.g. `3.3 V`; outputs are checked to stay within 0 V and this.',
        ),
        'max-sample-rate': required(
          frequency(),
          'Highest sample rate the DAC and the DMA sustain (settling, bus bandwidth), e.g. `50 MHz`.',
        ),
      }),
      'The DAC the tables stream into.',
    ),
    memory: required(
      z.strictObject({
        budget: required(
          quantity({ kind: 'bytes', min: 0, minExclusive: true, max: 2 ** 32 }),
          'RAM set aside for all tables together, e.g. `64 KiB`.',
        ),
        'table-length': required(
          z.strictObject({
            min: required(whole(1, MAX_TABLE_LENGTH), 'Fewest samples a table may hold.'),
            max: required(whole(1, MAX_TABLE_LENGTH), 'Most samples a table may hold (a DMA transfer-count limit, for example).'),
          }),
          'Range of the table length N in samples.',
        ),
        'power-of-two': optional(
          z.boolean(),
          'true when every table length must be a power of two (a DMA ring buffer wraps on an aligned power-of-two size).',
          DEFAULT_POWER_OF_TWO,
        ),
      }),
      'Limits on the sample tables.',
    ),
    analog: optional(
      z.strictObject({
        gain: optional(
          quantity({ kind: 'number', min: -1000, max: 1000 }),
          "Voltage gain (V/V) of the amplifier after the DAC; the output's swing is gain × the DAC's.",
          1,
        ),
        'slew-rate': optional(quantity({ kind: 'slew-rate', min: 0, minExclusive: true, max: 1e12 }), "The amplifier's slew rate, e.g. `10 V/µs`: a sine needs 2π·f·V_peak."),
        'gain-bandwidth': optional(
          quantity({ kind: 'frequency', min: 0, minExclusive: true, max: MAX_FREQUENCY_HZ }),
          "The amplifier's gain-bandwidth product, e.g. `10 MHz`; its closed-loop bandwidth is this over the gain.",
        ),
        'output-swing': optional(
          z.strictObject({
            min: required(quantity({ kind: 'voltage', min: -1000, max: 1000 }), "Lowest voltage the amplifier's output reaches, e.g. `-12 V`."),
            max: required(quantity({ kind: 'voltage', min: -1000, max: 1000 }), "Highest voltage the amplifier's output reaches, e.g. `12 V`."),
          }),
          "The amplifier's output range; the output is checked to stay inside it after the gain.",
        ),
        coupling: optional(
          z.strictObject({
            resistance: required(quantity({ kind: 'resistance', min: 0, minExclusive: true, max: 1e12 }), 'R of the AC coupling: the load resistance the capacitor feeds, e.g. `10 kΩ`.'),
            capacitance: required(quantity({ kind: 'capacitance', min: 0, minExclusive: true, max: 1e3 }), 'C of the AC coupling, e.g. `100 µF`.'),
          }),
          'A series coupling capacitor into the load after the amplifier: a high-pass with corner 1/(2πRC), which tilts square waves.',
        ),
        load: optional(
          z.enum(['line', 'transducer', 'power-stage', 'mains']),
          '`line`: a signal input; `transducer`, `power-stage` or `mains` (mains-powered gear): the chain can hurt someone or something, so every output gets a caution that defers to the datasheet and qualified practice.',
          'line',
        ),
      }),
      'What follows the DAC: an amplifier (gain, slew rate, gain-bandwidth, output swing) and AC coupling. Checked for each output; never planned on.',
    ),
  })
  .describe('A waveplan clock file: the system clock, the sample-clock divider, the DAC and the memory for tables.');

export type ClockFile = z.infer<typeof clockSchema>;
