// Outside references the signal tests share: a general-purpose FFT from the npm registry
// (mathjs `fft`, any length) used as an oracle, and the figures computed from its spectrum of a
// table exactly as a bench engineer would (IEEE Std 1241's definitions: SINAD against every
// other line, SNR without the harmonics, SFDR against the largest other line).

import { fft as mathFft } from 'mathjs';

/** |X_k|² of the DFT of real x, by mathjs. */
export function oraclePowers(x: ArrayLike<number>): number[] {
  const spectrum = mathFft(Array.from(x)) as unknown as ({ re: number; im: number } | number)[];
  return spectrum.map((c) => (typeof c === 'number' ? c * c : c.re * c.re + c.im * c.im));
}

export interface OracleFigures {
  snrDb: number;
  sinadDb: number;
  sfdrDb: number;
  thdPercent: number;
}

/**
 * Figures of a table of N samples with the fundamental in bin m1 (harmonics: bins h·m1 below
 * N/2, not folded), from the oracle's spectrum of the whole table. For a sine the harmonics are
 * distortion; for the other shapes they are the shape's own (signal), as the engine documents.
 */
export function oracleSineFigures(table: ArrayLike<number>, m1: number, sine = true): OracleFigures {
  const n = table.length;
  const p = oraclePowers(table);
  const oneSided = (k: number) => (2 * k === n ? p[k]! : 2 * p[k]!);
  const fundamental = oneSided(m1);
  let harmonics = 0;
  let other = 0;
  let worst = 0;
  for (let k = 1; k <= Math.floor(n / 2); k++) {
    if (k === m1) continue;
    const v = oneSided(k);
    const harmonic = k % m1 === 0;
    if (harmonic) harmonics += v;
    else other += v;
    if (sine || !harmonic) worst = Math.max(worst, v);
  }
  const signal = sine ? fundamental : fundamental + harmonics;
  return {
    snrDb: 10 * Math.log10(signal / other),
    sinadDb: 10 * Math.log10(signal / (other + (sine ? harmonics : 0))),
    sfdrDb: 10 * Math.log10(fundamental / worst),
    thdPercent: 100 * Math.sqrt(harmonics / fundamental),
  };
}
