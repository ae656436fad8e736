// Every documented default in one place: the schema descriptions, the generated reference, the
// hover text and the spec layer all read them from here.

import type { Shape } from './shape';

export const DEFAULT_FRACTION_BITS = 0;
/** A divider stage's register holds its value itself unless the clock file says otherwise. */
export const DEFAULT_REGISTER_OFFSET = 0;
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

/**
 * How far a square's duty may be from the asked one: a duty set to within about a percentage point
 * is what a square from a timer or a table is usually asked for (common practice), and 50 samples
 * per cycle then set any duty (S max of a square = 1/(2·duty-tolerance)).
 */
export const DEFAULT_DUTY_TOLERANCE = '1 %';

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
  qualityFloor:
    "one bit below the ideal quantiser of the clock file's DAC, 6.02·(bits − 1) + 1.76 dB (the ideal b-bit quantiser's SNR is 6.02·b + 1.76 dB, ADI MT-229)",
  maxSamplesPerCycle:
    "by shape, where neighbouring samples come within one LSB of each other (more samples only repeat DAC codes), with A the swing in LSB (amplitude / (full scale / 2^bits)): sine π / asin(1/A) ≈ π·A (its steepest step is A·sin(π/S)), triangle 2·A, sawtooth A; square 1/(2·duty-tolerance), the S that sets any duty to within duty-tolerance (none when it is 0); never below min-samples-per-cycle",
  dutyTolerance:
    'a duty within about a percentage point, what a square wave is usually asked for (common practice); 50 samples per cycle set any duty that closely',
  wholeSamplesPerCycle:
    'true for square, triangle and sawtooth (their edges, corners and resets must land on the same samples every cycle), false for sine',
} as const;

/** The smallest S a sine may have: at 2 samples per cycle or fewer it aliases (Nyquist). */
export const NYQUIST_SAMPLES_PER_CYCLE = 2;
