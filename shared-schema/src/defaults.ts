// Every documented default in one place: the schema descriptions, the generated reference, the
// hover text and the spec layer all read them from here.

import type { Shape } from './shape';

export const DEFAULT_FRACTION_BITS = 0;
export const DEFAULT_POWER_OF_TWO = false;
export const DEFAULT_DUTY = '50 %';
/**
 * A common crystal is specified to tens of ppm (common practice), so a plan error below about
 * 50 ppm is lost in the clock's own error.
 */
export const DEFAULT_TOLERANCE = '50 ppm';
export const DEFAULT_JITTER = 'forbid';
export const DEFAULT_TABLE_SPAN = 'open';

/** S floor per shape; the reasons are the documented ones below. */
export const DEFAULT_MIN_SAMPLES_PER_CYCLE: Record<Shape, number> = { sine: 8, square: 16, triangle: 32, sawtooth: 32 };

/**
 * Whether a shape's plans keep a whole number of samples per cycle (N a multiple of M): edges,
 * corners and resets must land on the same samples every cycle, a sine has none.
 */
export const DEFAULT_WHOLE_SAMPLES_PER_CYCLE: Record<Shape, boolean> = { sine: false, square: true, triangle: true, sawtooth: true };

export const DEFAULT_REASONS = {
  tolerance:
    'about the tolerance of a common crystal (tens of ppm, common practice), so a smaller plan error is lost in the clock\'s own error',
  minSamplesPerCycle: {
    sine: 'the first images sit at 7f and 9f, and the zero-order-hold droop at f/fs = 1/8 is only 0.22 dB (sin(x)/x, ADI MT-017)',
    square: 'the duty cycle can then be set in steps of 1/16 of a cycle',
    triangle: 'the corners need their harmonics, which need samples',
    sawtooth: 'the ramp and its reset need their harmonics, which need samples',
  } satisfies Record<Shape, string>,
  amplitude: "the DAC's full scale less one LSB, as Vpp, so the waveform spans codes 0 to 2^bits − 1 (the highest code is one LSB below full scale)",
  offset: 'half the default amplitude, so the default waveform just fits',
  wholeSamplesPerCycle:
    'true for square, triangle and sawtooth (their edges, corners and resets must land on the same samples every cycle), false for sine',
} as const;

/** The smallest S a sine may have: at 2 samples per cycle or fewer it aliases (Nyquist). */
export const NYQUIST_SAMPLES_PER_CYCLE = 2;
