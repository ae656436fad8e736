// What the DAC's zero-order hold does to the stream: each code is held for a sample period, so
// the output's spectrum is the samples' spectrum times sin(πf/f_s)/(πf/f_s) (ADI MT-017), with
// images of every line at k·f_s ± f.

/** sin(πx)/(πx), 1 at x = 0. */
export function sinc(x: number): number {
  if (x === 0) return 1;
  const a = Math.PI * x;
  return Math.sin(a) / a;
}

/** The hold's gain at fHz for a sample rate fsHz, in dB (−3.92 dB at f_s/2). */
export function holdGainDb(fHz: number, fsHz: number): number {
  return 20 * Math.log10(Math.abs(sinc(fHz / fsHz)));
}

export interface HoldFigures {
  /** Droop at f_out: 20·log10(sinc(f_out/f_s)), ≤ 0. */
  droopDb: number;
  /** The lowest image of the fundamental, f_s − f_out. */
  firstImageHz: number;
  /**
   * Its level against the fundamental at the hold's output: sinc(1 − ν)/sinc(ν) = ν/(1 − ν)
   * with ν = f_out/f_s (derived: sin(π(1 − ν)) = sin(πν)).
   */
  firstImageDbc: number;
}

export function holdFigures(fOutHz: number, fsHz: number): HoldFigures {
  const nu = fOutHz / fsHz;
  return {
    droopDb: holdGainDb(fOutHz, fsHz),
    firstImageHz: fsHz - fOutHz,
    firstImageDbc: 20 * Math.log10(nu / (1 - nu)),
  };
}
