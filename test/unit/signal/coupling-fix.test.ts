// The coupling-capacitor fix's arithmetic: the smallest C for a loss limit, the E12 value above it
// (IEC 60063, from memory: 1.0 1.2 1.5 1.8 2.2 2.7 3.3 3.9 4.7 5.6 6.8 8.2 per decade), the text.

import { describe, expect, it } from 'vitest';
import { capacitanceText, e12AtLeast, smallestCapacitance } from '../../../server/src/lsp/coupling-fix';
import { highPassCornerHz } from '../../../server/src/signal/analog-chain';

describe('the coupling capacitor for a loss limit', () => {
  it('50 Hz into 10 kΩ within 0.1 dB needs 2.086 µF (derived: f_c ≤ f·√(10^(0.1/10) − 1))', () => {
    const c = smallestCapacitance(10_000, 50, 0.1);
    expect(c * 1e6).toBeCloseTo(2.0856, 3);
    // At that C the loss is the limit: |H| = f/√(f² + f_c²) (first-order high-pass, any circuits text).
    const fc = highPassCornerHz(10_000, c);
    expect(20 * Math.log10(50 / Math.hypot(50, fc))).toBeCloseTo(-0.1, 9);
  });

  it('rounds up to the E12 series, never down, across decades', () => {
    expect(e12AtLeast(2.0856e-6)).toBeCloseTo(2.2e-6, 15);
    expect(e12AtLeast(2.2e-6)).toBeCloseTo(2.2e-6, 15);
    expect(e12AtLeast(8.3e-9)).toBeCloseTo(10e-9, 15);
    expect(e12AtLeast(1.01e-3)).toBeCloseTo(1.2e-3, 15);
    for (let c = 1e-12; c < 1; c *= 1.37) {
      const v = e12AtLeast(c);
      expect(v).toBeGreaterThanOrEqual(c * (1 - 1e-12));
      expect(v / c).toBeLessThan(1.23); // the widest E12 step, 1.0 → 1.2 (1.2 over 0.99…)
    }
  });

  it('writes the value in the unit that puts it at 1 or more', () => {
    expect(capacitanceText(2.2e-6)).toBe('2.2 µF');
    expect(capacitanceText(4.7e-9)).toBe('4.7 nF');
    expect(capacitanceText(1e-3)).toBe('1 mF');
    expect(capacitanceText(330e-12)).toBe('330 pF');
    expect(capacitanceText(0.82e-6)).toBe('820 nF');
  });
});
