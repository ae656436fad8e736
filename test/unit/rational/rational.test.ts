// Exact rationals checked against fraction.js (a general-purpose BigInt rational library) as oracle.
import Fraction from 'fraction.js';
import { describe, expect, it } from 'vitest';
import {
  add, ceil, cmp, div, floor, fromNumber, mul, parseDecimal, rat, sub, toDecimal, toNumber,
} from '../../../shared-schema/src/rational';
import type { Rational } from '../../../shared-schema/src/rational';

const asText = (r: Rational) => `${r.num}/${r.den}`;
const oracleText = (f: Fraction) => `${f.s * f.n}/${f.d}`;

function seeded(seed: number) {
  return () => {
    seed = (seed * 1103515245 + 12345) % 2147483648;
    return seed / 2147483648;
  };
}

describe('rational arithmetic against fraction.js (oracle)', () => {
  const random = seeded(20261202);
  const pick = () => {
    const n = BigInt(Math.floor(random() * 2e9) - 1e9);
    const d = BigInt(Math.floor(random() * 1e9) + 1);
    return { r: rat(n, d), f: new Fraction(n, d) };
  };
  it('add, sub, mul, div, cmp agree on 2000 random pairs', () => {
    for (let i = 0; i < 2000; i++) {
      const a = pick();
      const b = pick();
      expect(asText(add(a.r, b.r))).toBe(oracleText(a.f.add(b.f)));
      expect(asText(sub(a.r, b.r))).toBe(oracleText(a.f.sub(b.f)));
      expect(asText(mul(a.r, b.r))).toBe(oracleText(a.f.mul(b.f)));
      if (b.r.num !== 0n) expect(asText(div(a.r, b.r))).toBe(oracleText(a.f.div(b.f)));
      expect(cmp(a.r, b.r)).toBe(a.f.compare(b.f));
      expect(floor(a.r)).toBe(BigInt(a.f.floor().valueOf()));
      expect(ceil(a.r)).toBe(BigInt(a.f.ceil().valueOf()));
    }
  });
});

describe('decimal text parses exactly', () => {
  it('3.997802734375 MHz is 131/4096 of 125 MHz (trade fact, common practice)', () => {
    const f = parseDecimal('3997802.734375')!;
    expect(asText(div(f, rat(125_000_000n)))).toBe('131/4096');
  });
  it('0.1 is 1/10, not the binary double', () => {
    expect(asText(parseDecimal('0.1')!)).toBe('1/10');
    expect(asText(fromNumber(0.1))).toBe('1/10');
  });
  it('exponents and signs', () => {
    expect(asText(parseDecimal('1e6')!)).toBe('1000000/1');
    expect(asText(parseDecimal('-2.5E-3')!)).toBe('-1/400');
    expect(asText(parseDecimal('.5')!)).toBe('1/2');
  });
  it('rejects what is not a decimal number', () => {
    for (const bad of ['', '.', 'abc', '1.2.3', '1e', '--1', '1e999999']) expect(parseDecimal(bad)).toBeUndefined();
  });
  it('formats with rounding half away from zero', () => {
    expect(toDecimal(rat(131, 4096), 12)).toBe('0.031982421875');
    expect(toDecimal(rat(-1, 3), 4)).toBe('-0.3333');
    expect(toDecimal(rat(2, 3), 2)).toBe('0.67');
    expect(toDecimal(rat(125, 1), 3)).toBe('125');
    expect(toNumber(rat(1n, 3n))).toBeCloseTo(1 / 3, 15);
  });
});
