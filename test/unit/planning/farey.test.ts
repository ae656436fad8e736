// The best-rational-approximation kernel against published values.

import { describe, expect, it } from 'vitest';
import { type Rational, rat, parseDecimal, sub, abs, cmp, toNumber } from '../../../shared-schema/src/rational';
import { FloatNeighbours, fareyFloat, fareyNeighbours, limitDenominator } from '../../../server/src/planning/farey';

const PI = parseDecimal('3.14159265358979323846264338327950288')!;
const r = (n: number, d = 1): Rational => rat(n, d);

describe('limitDenominator = CPython fractions.Fraction.limit_denominator (documented examples)', () => {
  it.each([
    [1000n, r(355, 113)],
    [10n, r(22, 7)],
    [100n, r(311, 99)],
    [1n, r(3)],
    [5n, r(16, 5)],
    [90n, r(267, 85)],
    [1_000_000n, r(3126535, 995207)],
  ])('π limited to denominator %s', (maxDen, expected) => {
    expect(limitDenominator(PI, maxDen)).toEqual(expected);
  });

  it('4321/8765 stays itself under 10000 (CPython docs)', () => {
    expect(limitDenominator(r(4321, 8765), 10000n)).toEqual(r(4321, 8765));
  });
});

describe('convergents of π (any number-theory text; ProofWiki): 3, 22/7, 333/106, 355/113, 103993/33102', () => {
  // A convergent p/q is the best approximation for every bound in [q, next q − 1].
  it.each([
    [1n, r(3)],
    [7n, r(22, 7)],
    [106n, r(333, 106)],
    [113n, r(355, 113)],
    [33102n, r(103993, 33102)],
  ])('bound %s', (maxDen, expected) => {
    expect(limitDenominator(PI, maxDen)).toEqual(expected);
  });
});

describe('neighbours are the true neighbours (oracle: brute force over every denominator, derived)', () => {
  function bruteNeighbours(y: Rational, maxDen: number, maxNum: number): [Rational, Rational | null] {
    let lower = r(0);
    let upper: Rational | null = null;
    for (let w = 1; w <= maxDen; w++) {
      for (let u = 0; u <= maxNum; u++) {
        const f = r(u, w);
        if (cmp(f, y) <= 0 && cmp(f, lower) > 0) lower = f;
        if (cmp(f, y) >= 0 && (upper === null || cmp(f, upper) < 0)) upper = f;
      }
    }
    return [lower, upper];
  }

  it('on 300 seeded values with numerator and denominator bounds', () => {
    let seed = 12345;
    const next = (): number => (seed = (seed * 1103515245 + 12345) % 2 ** 31) / 2 ** 31;
    for (let i = 0; i < 300; i++) {
      const y = r(Math.floor(next() * 500), 1 + Math.floor(next() * 97));
      const maxDen = 1 + Math.floor(next() * 40);
      const maxNum = 1 + Math.floor(next() * 60);
      const [lower, upper] = bruteNeighbours(y, maxDen, maxNum);
      const got = fareyNeighbours(y, BigInt(maxDen), BigInt(maxNum));
      expect([got.lower, got.upper], `y=${y.num}/${y.den} den≤${maxDen} num≤${maxNum}`).toEqual([lower, upper]);
      // The double walk names the same fractions unless y sits on one (then it flags a near hit).
      const out = new FloatNeighbours();
      fareyFloat(toNumber(y), maxDen, maxNum, out);
      const fl = r(out.lowerNum, out.lowerDen);
      const fu = out.upperDen === 0 ? null : r(out.upperNum, out.upperDen);
      if (out.near === 0) expect([fl, fu]).toEqual([lower, upper]);
      else expect(out.near === 1 ? fl : fu).toEqual(cmp(lower, y) === 0 ? lower : upper);
    }
  });

  it('the double walk finds 355/113 for π and flags nothing (CPython docs value)', () => {
    const out = new FloatNeighbours();
    fareyFloat(Math.PI, 113, Infinity, out);
    const best = [r(out.lowerNum, out.lowerDen), r(out.upperNum, out.upperDen)].sort((a, b) =>
      cmp(abs(sub(a, PI)), abs(sub(b, PI))),
    )[0];
    expect(best).toEqual(r(355, 113));
    expect(out.near).toBe(0);
  });
});
