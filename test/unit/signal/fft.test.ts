// The spectrum's own FFT against general-purpose FFTs from the npm registry: mathjs `fft`
// (radix-2 and chirp-z, any length) and fft.js (radix-4, powers of two, fast enough for the
// largest transform a spectrum takes). Lengths: every n up to 160 (both code paths, every small
// factorisation), lengths around powers of two, the demo's table lengths, and each power-of-two
// size the radix-2 and the Bluestein paths run at up to the 2^18-point limit.

import { describe, expect, it } from 'vitest';
import { complex, fft as mathFft } from 'mathjs';
import FFT from 'fft.js';
import { dftBin, fft, nextPowerOfTwo, transformPoints } from '../../../server/src/signal/fft';
import { MAX_TRANSFORM_POINTS } from '../../../server/src/signal/lines';

/** A deterministic test signal with content at every bin: tones, a ramp and a pseudo-random part. */
function signal(n: number, seed = 1): { re: Float64Array; im: Float64Array } {
  const re = new Float64Array(n);
  const im = new Float64Array(n);
  let s = seed;
  for (let i = 0; i < n; i++) {
    s = (s * 1103515245 + 12345) % 2147483648;
    re[i] = Math.sin(0.37 * i) + (i % 7) - (2 * i) / n + s / 2147483648;
    im[i] = Math.cos(1.91 * i) * 0.5 - (s % 1000) / 1000;
  }
  return { re, im };
}

/** Largest |ours − theirs| relative to the largest |X_k|. */
function relativeError(re: Float64Array, im: Float64Array, theirs: { re: number; im: number }[]): number {
  let err = 0;
  let scale = 0;
  for (let k = 0; k < re.length; k++) {
    err = Math.max(err, Math.hypot(re[k]! - theirs[k]!.re, im[k]! - theirs[k]!.im));
    scale = Math.max(scale, Math.hypot(theirs[k]!.re, theirs[k]!.im));
  }
  return err / scale;
}

function againstMathjs(n: number): number {
  const { re, im } = signal(n, n);
  const input = Array.from(re, (r, i) => ({ re: r, im: im[i]! }));
  // mathjs takes its own Complex values; plain {re, im} objects are not read as complex.
  const theirs = mathFft(input.map((c) => complex(c.re, c.im))) as unknown as { re: number; im: number }[];
  fft(re, im);
  return relativeError(re, im, theirs);
}


// mathjs's chirp-z carries rounding of up to ~5e-11 of the largest line at a few thousand points
// (measured against the direct sum, which ours meets to 1e-15): the bound is set above that.
describe('FFT against mathjs fft (oracle)', () => {
  it('every length 1…160 agrees to 1e-11 of the largest line', () => {
    let worst = 0;
    for (let n = 1; n <= 160; n++) worst = Math.max(worst, againstMathjs(n));
    expect(worst).toBeLessThan(1e-11);
  });

  it.each([255, 257, 511, 1000, 1023, 1025, 2047, 3000, 4095, 4097])('length %i (around powers of two) agrees to 1e-9', (n) => {
    expect(againstMathjs(n)).toBeLessThan(1e-9);
  });

  it.each([5000, 7279])('a demo table length, %i, agrees to 1e-9', (n) => {
    expect(againstMathjs(n)).toBeLessThan(1e-9);
  });
});

describe('radix-2 sizes against fft.js (oracle), up to the spectrum limit', () => {
  it('every power of two from 2 to 2^18 agrees to 1e-11 of the largest line', () => {
    expect(MAX_TRANSFORM_POINTS).toBe(2 ** 18);
    for (let n = 2; n <= MAX_TRANSFORM_POINTS; n *= 2) {
      const { re, im } = signal(n, 7);
      const f = new FFT(n);
      const data = f.createComplexArray() as number[];
      for (let i = 0; i < n; i++) {
        data[2 * i] = re[i]!;
        data[2 * i + 1] = im[i]!;
      }
      const out = f.createComplexArray() as number[];
      f.transform(out, data);
      const theirs = Array.from({ length: n }, (_, k) => ({ re: out[2 * k]!, im: out[2 * k + 1]! }));
      fft(re, im);
      expect(relativeError(re, im, theirs)).toBeLessThan(1e-11);
    }
  });
});

describe('Bluestein at every padded size it uses, against the DFT definition (direct sum)', () => {
  // The largest non-power-of-two lengths per padded size: 2n − 1 ≤ 2^p. mathjs takes seconds
  // beyond ~10^4 points, so these are checked against X_k = Σ x_n e^(−j2πkn/N) summed directly
  // at 24 bins spread over the spectrum.
  it.each([2 ** 10 + 3, 2 ** 13 - 1, 2 ** 15 + 1, 2 ** 16 + 1, MAX_TRANSFORM_POINTS / 2 - 1])('length %i', (n) => {
    expect(transformPoints(n)).toBe(nextPowerOfTwo(2 * n - 1));
    expect(transformPoints(n)).toBeLessThanOrEqual(MAX_TRANSFORM_POINTS);
    const { re, im } = signal(n, 3);
    const x = { re: Float64Array.from(re), im: Float64Array.from(im) };
    fft(re, im);
    let worst = 0;
    let scale = 0;
    for (let j = 0; j < 24; j++) {
      const k = Math.floor((j * n) / 24) + j;
      let sr = 0;
      let si = 0;
      for (let t = 0; t < n; t++) {
        const a = (-2 * Math.PI * ((k * t) % n)) / n;
        sr += x.re[t]! * Math.cos(a) - x.im[t]! * Math.sin(a);
        si += x.re[t]! * Math.sin(a) + x.im[t]! * Math.cos(a);
      }
      worst = Math.max(worst, Math.hypot(re[k]! - sr, im[k]! - si));
      scale = Math.max(scale, Math.hypot(sr, si));
    }
    expect(worst / scale).toBeLessThan(1e-12);
  });
});

describe('single bins (dftBin) against mathjs', () => {
  it('bins of a 3001-sample real sequence agree to 1e-11', () => {
    const { re } = signal(3001, 5);
    const theirs = mathFft(Array.from(re)) as unknown as { re: number; im: number }[];
    for (const q of [0, 1, 17, 1500, 3000, -4]) {
      const ours = dftBin(re, q);
      const t = theirs[((q % 3001) + 3001) % 3001]!;
      expect(Math.hypot(ours.re - t.re, ours.im - t.im) / 3001).toBeLessThan(1e-11);
    }
  });
});
