// The discrete Fourier transform of any length, in place on split real/imaginary arrays:
// X_k = Σ_n x_n · e^(−j2πkn/n_len) (no scaling). Powers of two take the iterative radix-2
// transform; every other length goes through Bluestein's chirp-z identity
// nk = (n² + k² − (k − n)²)/2, which turns the transform into a circular convolution of a
// power-of-two length ≥ 2n − 1 (three radix-2 transforms).

const isPowerOfTwo = (n: number): boolean => n > 0 && (n & (n - 1)) === 0;

/** The smallest power of two ≥ n. */
export function nextPowerOfTwo(n: number): number {
  let p = 1;
  while (p < n) p *= 2;
  return p;
}

/** Points of the radix-2 transform that computing an n-point transform takes. */
export function transformPoints(n: number): number {
  return isPowerOfTwo(n) ? n : nextPowerOfTwo(2 * n - 1);
}

// Twiddles e^(−j2πi/n) for i < n/2, per power-of-two size; a few sizes are live at a time.
const twiddles = new Map<number, { cos: Float64Array; sin: Float64Array }>();

function twiddlesOf(n: number): { cos: Float64Array; sin: Float64Array } {
  let t = twiddles.get(n);
  if (!t) {
    const half = n >> 1;
    t = { cos: new Float64Array(half), sin: new Float64Array(half) };
    for (let i = 0; i < half; i++) {
      // Exact at the quarter points, so the transform of a pure tone has no leakage from them.
      const a = (-2 * Math.PI * i) / n;
      t.cos[i] = Math.cos(a);
      t.sin[i] = Math.sin(a);
    }
    if (twiddles.size >= 4) twiddles.delete(twiddles.keys().next().value!);
    twiddles.set(n, t);
  }
  return t;
}

/** In-place radix-2 decimation-in-time transform; n must be a power of two. */
function radix2(re: Float64Array, im: Float64Array): void {
  const n = re.length;
  if (n <= 1) return;
  for (let i = 1, j = 0; i < n; i++) {
    let bit = n >> 1;
    for (; j & bit; bit >>= 1) j ^= bit;
    j ^= bit;
    if (i < j) {
      let t = re[i]; re[i] = re[j]; re[j] = t;
      t = im[i]; im[i] = im[j]; im[j] = t;
    }
  }
  const { cos, sin } = twiddlesOf(n);
  for (let size = 2; size <= n; size *= 2) {
    const half = size >> 1;
    const step = n / size;
    for (let start = 0; start < n; start += size) {
      for (let k = 0; k < half; k++) {
        const wr = cos[k * step];
        const wi = sin[k * step];
        const a = start + k;
        const b = a + half;
        const xr = re[b] * wr - im[b] * wi;
        const xi = re[b] * wi + im[b] * wr;
        re[b] = re[a] - xr;
        im[b] = im[a] - xi;
        re[a] += xr;
        im[a] += xi;
      }
    }
  }
}

// The chirp's transform per length, for repeated transforms of one length (a spectrum and the
// tests' many checks); small, so only the last few lengths are kept.
const chirps = new Map<number, { wr: Float64Array; wi: Float64Array; br: Float64Array; bi: Float64Array }>();

function chirpOf(n: number, m: number) {
  let c = chirps.get(n);
  if (!c) {
    const wr = new Float64Array(n);
    const wi = new Float64Array(n);
    const twoN = 2 * n;
    for (let k = 0; k < n; k++) {
      // k² mod 2n keeps the angle small and exact for every k < 2^26.
      const k2 = (k * k) % twoN;
      const a = (Math.PI * k2) / n;
      wr[k] = Math.cos(a);
      wi[k] = -Math.sin(a);
    }
    // b_k = conj(w_k) for |k| < n, circularly placed, then transformed once.
    const br = new Float64Array(m);
    const bi = new Float64Array(m);
    br[0] = wr[0];
    bi[0] = -wi[0];
    for (let k = 1; k < n; k++) {
      br[k] = br[m - k] = wr[k];
      bi[k] = bi[m - k] = -wi[k];
    }
    radix2(br, bi);
    c = { wr, wi, br, bi };
    if (chirps.size >= 2) chirps.delete(chirps.keys().next().value!);
    chirps.set(n, c);
  }
  return c;
}

function bluestein(re: Float64Array, im: Float64Array): void {
  const n = re.length;
  const m = nextPowerOfTwo(2 * n - 1);
  const { wr, wi, br, bi } = chirpOf(n, m);
  const ar = new Float64Array(m);
  const ai = new Float64Array(m);
  for (let k = 0; k < n; k++) {
    ar[k] = re[k] * wr[k] - im[k] * wi[k];
    ai[k] = re[k] * wi[k] + im[k] * wr[k];
  }
  radix2(ar, ai);
  for (let k = 0; k < m; k++) {
    const r = ar[k] * br[k] - ai[k] * bi[k];
    ai[k] = ar[k] * bi[k] + ai[k] * br[k];
    ar[k] = r;
  }
  // The inverse transform as a forward one on the conjugate.
  for (let k = 0; k < m; k++) ai[k] = -ai[k];
  radix2(ar, ai);
  for (let k = 0; k < n; k++) {
    const cr = ar[k] / m;
    const ci = -ai[k] / m;
    re[k] = cr * wr[k] - ci * wi[k];
    im[k] = cr * wi[k] + ci * wr[k];
  }
}

/** The n-point DFT of (re, im), in place, for any n ≥ 1. */
export function fft(re: Float64Array, im: Float64Array): void {
  if (re.length !== im.length) throw new RangeError('real and imaginary parts differ in length');
  if (re.length <= 1) return;
  if (isPowerOfTwo(re.length)) radix2(re, im);
  else bluestein(re, im);
}

/**
 * One bin of the DFT of a real sequence, X_q = Σ x_n e^(−j2πqn/len), in O(len): for a line of a
 * table too long to transform whole. The rotation is re-seeded from the exact angle every 1024
 * steps, so its error stays near the rounding of a double.
 */
export function dftBin(x: ArrayLike<number>, q: number): { re: number; im: number } {
  const len = x.length;
  const qq = ((q % len) + len) % len;
  let sr = 0;
  let si = 0;
  const stepR = Math.cos((-2 * Math.PI * qq) / len);
  const stepI = Math.sin((-2 * Math.PI * qq) / len);
  let wr = 1;
  let wi = 0;
  for (let n = 0; n < len; n++) {
    if ((n & 1023) === 0) {
      const a = (-2 * Math.PI * ((qq * n) % len)) / len;
      wr = Math.cos(a);
      wi = Math.sin(a);
    }
    sr += x[n] * wr;
    si += x[n] * wi;
    const t = wr * stepR - wi * stepI;
    wi = wr * stepI + wi * stepR;
    wr = t;
  }
  return { re: sr, im: si };
}
