// PLL relations f_pfd = f_ref/R, f_vco = f_pfd·N, f_sys = f_vco/P checked against published worked
// examples, and the enumeration of every reachable system clock against a brute-force triple loop
// in fraction.js (a general-purpose exact-rational library, used as the oracle).
import Fraction from 'fraction.js';
import { describe, expect, it } from 'vitest';
import { type Rational, parseDecimal, rat, toNumber } from '../../../shared-schema/src/rational';
import { type ClockTree, FIXED_CLOCK, type PllRanges, pllSettingCount, postProducts, reachableClocks, vcoMargin } from '../../../server/src/planning/clock-source';
import { bestSettingFor, nearestReachable, settingsFor } from '../../../server/src/planning/pll-setting';
import { seededRandom } from '../../support/seeded';

const hz = (t: string): Rational => parseDecimal(t)!;
const range = (min: number, max: number) => Array.from({ length: max - min + 1 }, (_, i) => min + i);
const pllOf = (crystal: string, r: [number, number], n: [number, number], vco: [string, string], post: number[][], pfd?: [string, string]): PllRanges => ({
  crystalHz: hz(crystal),
  referenceDivider: { min: r[0], max: r[1] },
  feedbackMultiplier: { min: n[0], max: n[1] },
  phaseDetectorHz: pfd ? { min: hz(pfd[0]), max: hz(pfd[1]) } : null,
  vcoHz: { min: hz(vco[0]), max: hz(vco[1]) },
  postStages: post.map((values, i) => ({ name: `p${i}`, values })),
});
const treeOf = (pll: PllRanges): ClockTree => ({ ...FIXED_CLOCK, source: 'pll', pll });

describe('PLL relations against worked examples', () => {
  it('16 MHz → 48 MHz: exactly the six settings of the worked answer (EE Stack Exchange q. 645526, "Selecting optimal PLL frequency for microcontroller peripherals")', () => {
    // The question lists 16/1·12 = 192 ÷ 4, 16/1·15 = 240 ÷ 5, 16/2·18 = 144 ÷ 3, 16/2·24 = 192 ÷ 4,
    // 16/2·30 = 240 ÷ 5 and 16/3·27 = 144 ÷ 3 for R 1…3, VCO 144…240 MHz, P 3…5.
    const pll = pllOf('16e6', [1, 3], [12, 30], ['144e6', '240e6'], [[3, 4, 5]]);
    const found = settingsFor(pll, hz('48e6')).map((s) => [s.referenceDivider, s.feedbackMultiplier, s.postDividers[0], toNumber(s.vcoHz) / 1e6]);
    expect(found).toEqual([
      [1, 12, 4, 192],
      [1, 15, 5, 240],
      [2, 18, 3, 144],
      [2, 24, 4, 192],
      [2, 30, 5, 240],
      [3, 27, 3, 144],
    ]);
    // f_pfd = f_ref/R: 16, 8 and 5.333… MHz.
    expect(settingsFor(pll, hz('48e6')).map((s) => s.pfdHz)).toContainEqual(rat(16_000_000n, 3n));
  });

  it('14.31818 MHz · 352/105 = 47.99999390476 MHz, 6.095238 Hz below 48 MHz; the VCO at 48, 240, 720 or 1008 MHz with R = 105, 21, 7, 5 (EE Stack Exchange, "How does one get the common PC frequencies (33.33 MHz, 48.000 MHz) from 14.318 MHz?")', () => {
    const pll = pllOf('14.31818e6', [1, 105], [352, 352], ['40e6', '1100e6'], [range(1, 21)]);
    const f = nearestReachable(pll, hz('48e6'))!;
    expect(toNumber(f) / 1e6).toBeCloseTo(47.99999390476, 11);
    expect(48e6 - toNumber(f)).toBeCloseTo(6.095238, 5);
    const settings = settingsFor(pll, f);
    const byR = new Map(settings.map((s) => [s.referenceDivider, s]));
    // The answer's four: VCO 48 MHz (÷1), 240 MHz (÷5), 720 MHz (÷15), 1008 MHz (÷21); f_pfd 136.363 kHz, 681.818 kHz, 2.045454 MHz, 2.863636 MHz.
    for (const [r, p, vcoMHz, pfdKHz] of [[105, 1, 48, 136.363], [21, 5, 240, 681.818], [7, 15, 720, 2045.454], [5, 21, 1008, 2863.636]]) {
      const s = byR.get(r)!;
      expect(s.postDividers).toEqual([p]);
      expect(toNumber(s.vcoHz) / 1e6).toBeCloseTo(vcoMHz, 3);
      expect(toNumber(s.pfdHz) / 1e3).toBeCloseTo(pfdKHz, 2); // the answer truncates to its digits
    }
  });

  it('14.318 MHz · 149/16 = 133.34 MHz, ÷4 = 33.3341 MHz (same thread, the older datasheet it quotes)', () => {
    const pll = pllOf('14.318e6', [16, 16], [149, 149], ['100e6', '200e6'], [[4]]);
    const [clock] = reachableClocks(treeOf(pll), hz('1'))!;
    expect(toNumber(clock!.setting!.vcoHz) / 1e6).toBeCloseTo(133.34, 2);
    expect(toNumber(clock!.systemClockHz) / 1e6).toBeCloseTo(33.3341, 4);
  });

  it('the phase-detector range removes a reference divider (f_pfd = f_ref/R, derived)', () => {
    const pll = pllOf('16e6', [1, 3], [12, 30], ['144e6', '240e6'], [[3, 4, 5]], ['6e6', '20e6']);
    expect(settingsFor(pll, hz('48e6')).map((s) => s.referenceDivider)).toEqual([1, 1, 2, 2, 2]);
  });

  it('keeps the setting with the most VCO margin: 192 MHz sits mid-range of 144…240 (derived)', () => {
    const pll = pllOf('16e6', [1, 3], [12, 30], ['144e6', '240e6'], [[3, 4, 5]]);
    const best = bestSettingFor(treeOf(pll), hz('48e6'))!;
    expect([best.referenceDivider, best.feedbackMultiplier]).toEqual([1, 12]);
    expect(vcoMargin(pll, best.vcoHz)).toBe(0.5);
  });
});

describe('enumeration = brute force (fraction.js oracle) on 300 seeded small PLL spaces', () => {
  it('the same set of system clocks, exactly, each once, with the setting a stated rule keeps', () => {
    const random = seededRandom(1010);
    const pick = (lo: number, hi: number) => lo + Math.floor(random() * (hi - lo + 1));
    let clocks = 0;
    for (let k = 0; k < 300; k++) {
      const crystal = [8e6, 12e6, 12.288e6, 14.31818e6, 25e6, 32768][pick(0, 5)]!;
      const r0 = pick(1, 4);
      const n0 = pick(1, 40);
      const stages = Array.from({ length: pick(1, 2) }, () => [...new Set(Array.from({ length: pick(1, 4) }, () => pick(1, 9)))].sort((a, b) => a - b));
      const vmin = crystal * pick(1, 8);
      const pll = pllOf(String(crystal), [r0, r0 + pick(0, 5)], [n0, n0 + pick(0, 60)], [String(vmin), String(vmin * pick(1, 4))], stages);
      const got = reachableClocks(treeOf(pll), hz('1'))!;
      // Oracle: every (R, N, P…) in range with f_vco within range; keep per value the most VCO margin, then the first in R, N, P order.
      const want = new Map<string, { r: number; n: number; post: number[]; margin: Fraction }>();
      const f = (x: number | string) => new Fraction(x);
      const [vlo, vhi] = [f(pll.vcoHz.min.num.toString()).div(pll.vcoHz.min.den.toString()), f(pll.vcoHz.max.num.toString()).div(pll.vcoHz.max.den.toString())];
      const combos = stages.reduce<number[][]>((acc, s) => acc.flatMap((c) => s.map((v) => [...c, v])), [[]]);
      for (let r = pll.referenceDivider.min; r <= pll.referenceDivider.max; r++) {
        for (let n = pll.feedbackMultiplier.min; n <= pll.feedbackMultiplier.max; n++) {
          const vco = f(String(crystal)).mul(n).div(r);
          if (vco.compare(vlo) < 0 || vco.compare(vhi) > 0) continue;
          const width = vhi.sub(vlo);
          const below = vco.sub(vlo);
          const above = vhi.sub(vco);
          const margin = width.equals(0) ? f(0) : (below.compare(above) <= 0 ? below : above);
          const seen = new Set<number>();
          for (const post of combos) {
            const product = post.reduce((a, b) => a * b, 1);
            if (seen.has(product)) continue; // the first stage values of a product stand for it
            seen.add(product);
            const key = vco.div(product).toFraction();
            const held = want.get(key);
            if (!held || margin.compare(held.margin) > 0) want.set(key, { r, n, post, margin });
          }
        }
      }
      expect(got.length, `space ${k}`).toBe(want.size);
      for (const c of got) {
        const w = want.get(new Fraction(c.systemClockHz.num.toString()).div(c.systemClockHz.den.toString()).toFraction());
        expect(w, `space ${k}`).toBeDefined();
        expect([c.setting!.referenceDivider, c.setting!.feedbackMultiplier], `space ${k}`).toEqual([w!.r, w!.n]);
        expect(c.setting!.postDividers.reduce((a, b) => a * b, 1)).toBe(w!.post.reduce((a, b) => a * b, 1));
      }
      for (let i = 1; i < got.length; i++) expect(toNumber(got[i]!.systemClockHz)).toBeGreaterThan(toNumber(got[i - 1]!.systemClockHz));
      clocks += got.length;
    }
    console.log(`enumeration vs brute force: 300 PLL spaces, ${clocks} distinct system clocks, 0 mismatches`);
  });

  it('post-divider products are distinct and counted once', () => {
    expect(postProducts([{ name: 'a', values: [1, 2, 4] }, { name: 'b', values: [2, 4] }])!.map((p) => p.product)).toEqual([2, 4, 8, 16]);
    // f_vco in 144…240 MHz: R = 1 takes N 12…15 (16 MHz · N), R = 2 N 18…30, R = 3 N 27…30; three P each (derived).
    expect(pllSettingCount(pllOf('16e6', [1, 3], [12, 30], ['144e6', '240e6'], [[3, 4, 5]]))).toBe((4 + 13 + 4) * 3);
  });
});
