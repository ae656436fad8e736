// Tables that are not one of the plain shapes: a sum of harmonics (a band-limited square,
// triangle or sawtooth, or the engineer's own amplitude/phase list) or one cycle read from a
// sample file. The spec layer builds the description (server/src/signal/custom-tables.ts); the
// table code evaluates it here, so the exporter, the seam check and the pictures all see the
// same samples.
//
// Every custom waveform is scaled so that one cycle spans exactly −1 … +1, like the plain shapes:
// amplitude and offset then mean what they mean for a sine.

/** One harmonic of a unit waveform: cos·cos(2π·order·φ) + sin·sin(2π·order·φ). */
export interface FourierTerm {
  order: number;
  cos: number;
  sin: number;
}

export interface CustomWave {
  /** Text identifying the waveform, for memo keys. */
  key: string;
  /** A sum of harmonics; with `belowNyquist` only the orders below S/2 of each plan are kept. */
  terms?: readonly FourierTerm[];
  belowNyquist?: boolean;
  /** One cycle of values, read from a sample file, already scaled to −1 … +1; linearly interpolated. */
  samples?: Float64Array;
}

interface Scaled {
  terms: readonly FourierTerm[];
  mid: number;
  half: number;
}

const scaledMemo = new WeakMap<CustomWave, Map<number, Scaled>>();

/** Σ terms at a phase in cycles. */
export function evaluateTerms(terms: readonly FourierTerm[], phase: number): number {
  let v = 0;
  if (terms.length <= 16) {
    for (const t of terms) {
      const a = 2 * Math.PI * t.order * phase;
      v += t.cos * Math.cos(a) + t.sin * Math.sin(a);
    }
    return v;
  }
  // Many terms (a band-limited shape): cos(hθ), sin(hθ) by the angle-addition recurrence, one
  // pair of trigonometric calls per sample instead of one per term; terms are in rising order.
  const theta = 2 * Math.PI * phase;
  const c1 = Math.cos(theta);
  const s1 = Math.sin(theta);
  let ch = 1;
  let sh = 0;
  let h = 0;
  for (const t of terms) {
    if (t.order - h > 64) {
      // A far jump: seed from the exact angle rather than step through the gap.
      h = t.order;
      ch = Math.cos(theta * h);
      sh = Math.sin(theta * h);
    }
    while (h < t.order) {
      const c = ch * c1 - sh * s1;
      sh = sh * c1 + ch * s1;
      ch = c;
      h++;
    }
    v += t.cos * ch + t.sin * sh;
  }
  return v;
}

/** The terms a plan of S samples per cycle keeps, with the scale that maps one cycle to −1 … +1. */
function scaledTerms(wave: CustomWave, samplesPerCycle: number): Scaled {
  const limit = wave.belowNyquist ? samplesPerCycle / 2 : Infinity;
  const key = Number.isFinite(limit) ? limit : -1;
  let perWave = scaledMemo.get(wave);
  if (!perWave) scaledMemo.set(wave, (perWave = new Map()));
  const found = perWave.get(key);
  if (found) return found;
  const terms = (wave.terms ?? []).filter((t) => t.order < limit).sort((a, b) => a.order - b.order);
  // The extremes on a grid fine against the highest order (32 points per its cycle), then
  // refined by golden-section search around the best grid points.
  const top = terms.reduce((m, t) => Math.max(m, t.order), 1);
  const points = Math.min(1 << 16, Math.max(1024, 32 * top));
  let iMax = 0;
  let iMin = 0;
  let vMax = -Infinity;
  let vMin = Infinity;
  for (let i = 0; i < points; i++) {
    const v = evaluateTerms(terms, i / points);
    if (v > vMax) [vMax, iMax] = [v, i];
    if (v < vMin) [vMin, iMin] = [v, i];
  }
  const refine = (i: number, sign: 1 | -1): number => {
    let lo = (i - 1) / points;
    let hi = (i + 1) / points;
    const g = (Math.sqrt(5) - 1) / 2;
    for (let k = 0; k < 40; k++) {
      const a = hi - g * (hi - lo);
      const b = lo + g * (hi - lo);
      if (sign * evaluateTerms(terms, a) > sign * evaluateTerms(terms, b)) hi = b;
      else lo = a;
    }
    return evaluateTerms(terms, (lo + hi) / 2);
  };
  vMax = Math.max(vMax, refine(iMax, 1));
  vMin = Math.min(vMin, refine(iMin, -1));
  const half = (vMax - vMin) / 2;
  const scaled = { terms, mid: (vMax + vMin) / 2, half: half > 0 ? half : 1 };
  perWave.set(key, scaled);
  return scaled;
}

/** The custom unit waveform in −1 … +1 at a phase in cycles (0 ≤ phase < 1). */
export function customUnit(wave: CustomWave, phase: number, samplesPerCycle: number): number {
  if (wave.samples && wave.samples.length > 0) {
    const s = wave.samples;
    const x = phase * s.length;
    const i = Math.floor(x);
    const f = x - i;
    const a = s[i % s.length];
    const b = s[(i + 1) % s.length];
    return a + (b - a) * f;
  }
  const { terms, mid, half } = scaledTerms(wave, samplesPerCycle);
  return Math.max(-1, Math.min(1, (evaluateTerms(terms, phase) - mid) / half));
}
