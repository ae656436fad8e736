// The vocabulary of the planning engine (see docs/DESIGN.md, "Quantities").
// Pure data: no editor, LSP, YAML or file-system types ever appear here.

import type { Rational } from '../../../shared-schema/src/rational';
import type { ClockTree } from './clock-source';
import type { DividerStage, StageValue } from './stages';
import type { CustomWave } from './custom-wave';
import type { StepTarget } from './steps';

export type LoadKind = 'line' | 'transducer' | 'power-stage' | 'mains';

/** The amplifier and AC coupling after the DAC (server/src/signal/analog-chain.ts checks them). */
export interface AnalogChain {
  /** Voltage gain (V/V); 1 when there is no amplifier. */
  gain: number;
  slewRateVPerS?: number;
  gainBandwidthHz?: number;
  /** The amplifier's output range, V. */
  swingMinV?: number;
  swingMaxV?: number;
  /** AC coupling after the amplifier: series capacitor into the load's resistance. */
  couplingResistanceOhm?: number;
  couplingCapacitanceF?: number;
  load?: LoadKind;
}

/** The hardware of a clock file, resolved to exact values. */
export interface Hardware {
  /** f_sys */
  systemClockHz: Rational;
  /** e, the system clock's relative tolerance (`system-clock-tolerance`); absent = exact. */
  systemClockTolerance?: Rational;
  /** Where f_sys can come from (a PLL, a list); absent = fixed. */
  clockTree?: ClockTree;
  divider: {
    /** Range of the integer part I of D = I + F/2^k. */
    integerMin: number;
    integerMax: number;
    /** k; 0 = integer-only divider. */
    fractionBits: number;
    /**
     * A divider built of counter stages (one or two): D is the product of one value from each,
     * integerMin/integerMax are the products of their bounds and fractionBits is 0.
     */
    stages?: DividerStage[];
  };
  dac: {
    bits: number;
    /** Bytes one sample takes in RAM (the DMA transfer width). */
    sampleBytes: number;
    /** Full-scale output voltage; one LSB = fullScaleV / 2^bits. */
    fullScaleV: number;
    /** Highest sample rate f_s the converter/DMA sustains. */
    maxSampleRateHz: Rational;
  };
  memory: {
    /** RAM set aside for all tables together. */
    budgetBytes: number;
    tableLengthMin: number;
    tableLengthMax: number;
    /** Tables must be a power of two long (DMA ring buffers). */
    powerOfTwo: boolean;
  };
  /** What follows the DAC (the clock file's `analog`), when described: checked, never planned on. */
  analog?: AnalogChain;
}

export type Shape = 'sine' | 'square' | 'triangle' | 'sawtooth';

/** What one output asks of the planner. */
export interface PlanRequest {
  /** f_target */
  targetHz: Rational;
  /** S floor: every plan keeps N/M ≥ this (a sine must stay above 2). */
  minSamplesPerCycle: Rational;
  /** Only tables whose length is a multiple of their cycles (square, triangle, sawtooth). */
  wholeSamplesPerCycle?: boolean;
}

/**
 * One plan: D = dividerInteger + dividerFraction / 2^fractionBits, f_s = f_sys / D,
 * f_out = f_s · cycles / tableLength. achievedHz is exact.
 */
export interface Plan {
  dividerInteger: number;
  /** F, the fraction's numerator. 0 = jitter-free. */
  dividerFraction: number;
  fractionBits: number;
  tableLength: number;
  /** M, whole cycles in the table (a pinned plan may hold a non-integer value to be flagged). */
  cycles: Rational;
  achievedHz: Rational;
  /** achievedHz − targetHz, signed. */
  errorHz: Rational;
  /** With a divider of counter stages: each stage's value (their product is dividerInteger) and register content. */
  dividerStages?: StageValue[];
  /**
   * Set when the search stopped at its work limit before proving this plan the nearest (only on
   * absurdly large divider × table domains): the best found, reported as such.
   */
  searchLimited?: true;
}

/** Divider jitter of a first-order accumulator fractional divider. All zero for F = 0. */
export interface Jitter {
  /** Long-period share p = F / 2^k. */
  longShare: number;
  samplePeriodJitterPkPkS: number;
  samplePeriodJitterRmsS: number;
  /** Time-interval error against the ideal grid aligned to the mean. */
  tiePkPkS: number;
  tieRmsS: number;
  /** Sample periods before the period pattern repeats: 2^k / gcd(F, 2^k). 1 when jitter-free. */
  patternLength: number;
  /** −20·log10(2π·f_out·TIE_rms); null when jitter-free (unbounded). */
  jitterSnrDb: number | null;
  /** Spur offsets around each spectral line: multiples of f_s · gcd(F, 2^k) / 2^k (first few). */
  spurOffsetsHz: number[];
}

/** The wrap from the last table sample to the first. */
export interface Seam {
  ok: boolean;
  /** |actual wrap step − the waveform's own step at that phase|, in LSB. */
  jumpLsb: number;
  /** Why the seam is broken, when it is. */
  cause: 'fractional-cycles' | 'repeated-sample' | 'quantisation' | null;
}

/** Everything reported about one plan: the plan plus its derived figures. */
export interface PlanFigures extends Plan {
  systemClockHz: Rational;
  sampleRateHz: Rational;
  errorPpm: number;
  jitterFree: boolean;
  jitter: Jitter;
  seam: Seam;
  tableBytes: number;
  /** Square waves: the duty asked for and the duty the table really has (planning/duty.ts); null for other shapes. */
  dutyAsked?: Rational | null;
  dutyAchieved?: Rational | null;
  /**
   * Edges and corners (every shape but the sine): how far they wander from cycle to cycle, in
   * seconds — 0 with a whole number of samples per cycle; null for a sine.
   */
  edgeWanderS?: number | null;
}

/** The signal an output's table holds. Voltages in volts. */
export interface Waveform {
  shape: Shape;
  /** Share of the cycle a square wave spends high, 0 < duty < 1; ignored by other shapes. */
  duty: number;
  /** The same duty exactly, as written (the table rounds its high samples from it). */
  dutyExact?: Rational;
  amplitudeVpp: number;
  offsetV: number;
  /** A table that is not the plain shape: a sum of harmonics or a sample file's cycle. */
  custom?: CustomWave;
  /**
   * The same amplitude and offset exactly as the spec gives them, so the rounding of a sample
   * that falls exactly between two codes is decided exactly (table.ts); absent, the doubles above
   * are read back as the decimals they print as.
   */
  exact?: { amplitudeVpp: Rational; offsetV: Rational };
}

/**
 * How the table's samples are spaced over its cycles: `open` spans N intervals (sample i at
 * phase M·i/N — the wrap is seamless); `closed` spans N − 1 intervals (the last sample repeats
 * the first — the classic off-by-one of tables made with an inclusive end point).
 */
export type TableSpan = 'open' | 'closed';

/** A plan written into the spec by hand: checked, not searched. */
export interface PinnedPlan {
  dividerInteger: number;
  dividerFraction: number;
  tableLength: number;
  cycles: Rational;
  span: TableSpan;
}

/** Everything the engine needs to plan one output. */
export interface OutputRequest extends PlanRequest {
  waveform: Waveform;
  /** Allowed |achieved − target| in Hz (ppm, % and Hz are resolved before planning). */
  toleranceHz: Rational;
  /** forbid = integer divider only. */
  jitter: 'forbid' | 'allow';
  pinned?: PinnedPlan;
  /**
   * S max: the samples per cycle beyond which more buy nothing on this DAC (a preference, not a
   * limit: plans above it are chosen only when none at or below it meets the tolerance).
   */
  maxSamplesPerCycle?: Rational;
  /** Frequency steps on one table (steps.ts): targetHz and toleranceHz are then the first step's. */
  steps?: StepTarget[];
  /** Square waves: the asked duty exactly and duty-tolerance (both as shares of the cycle). */
  duty?: { asked: Rational; tolerance: Rational };
}

/**
 * The engine's verdict on one output.
 * - exact / within-tolerance: a jitter-free plan meets the tolerance.
 * - fractional: none does, jitter is allowed and a fractional plan does (warn with its jitter).
 * - out-of-tolerance: nothing allowed meets the tolerance; `plan` is the best available.
 * - pinned: the plan was written in the spec; `plan` is it, checked.
 * - no-plan: the hardware admits no plan at all (e.g. every table is over budget).
 */
export type Verdict = 'exact' | 'within-tolerance' | 'fractional' | 'out-of-tolerance' | 'pinned' | 'no-plan';

export interface OutputPlanning {
  verdict: Verdict;
  /** The plan the output's ranking chooses (planning/ranking.ts). */
  plan: PlanFigures | null;
  /** The nearest jitter-free plan over the whole domain (the alternative an error names). */
  nearestJitterFree: PlanFigures | null;
  /**
   * The nearest plan over every divider I + F/2^k, when the hardware has fraction bits. Computed
   * when first read (a lazy, memoised property): read it only where its value is used.
   */
  readonly bestFractional: PlanFigures | null;
  /** |errorHz| of `plan` ≤ toleranceHz (with steps: every step within its own). */
  withinTolerance: boolean;
  /** Set when the board's memory budget made the output take `plan` instead of this, its own plan. */
  shrunkFrom?: PlanFigures;
  /**
   * Set for a square whose plan (within the frequency tolerance, whole S) misses the asked duty by
   * more than duty-tolerance: the plan within tolerance with the nearest duty, and the nearest
   * plan that holds the duty exactly (null when none exists).
   */
  dutyMiss?: { nearestDuty: PlanFigures | null; exactDuty: PlanFigures | null };
  /** Frequency steps: each step's plan on the shared table, in order (`plan` is the first). */
  steps?: PlanFigures[];
}
