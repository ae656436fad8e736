// Quantity parsing: exact values from decimal text, checked against unit definitions of the SI
// Brochure (BIPM, 9th ed., prefixes k = 10^3, M = 10^6, m = 10^-3) and IEC 80000-13 (binary
// prefix Ki = 2^10, Mi = 2^20), with fraction.js (a general-purpose exact rational library) as
// the oracle for the decimal arithmetic.
import Fraction from 'fraction.js';
import { describe, expect, it } from 'vitest';
import { parseQuantity, quantityPattern, toleranceHz, type QuantityKind } from '../../../shared-schema/src/quantity';
import { formatBytes, formatHz } from '../../../shared-schema/src/quantity-format';
import { type Rational, rat } from '../../../shared-schema/src/rational';

const value = (kind: QuantityKind, text: string): Rational => {
  const r = parseQuantity(kind, text);
  if (!r.ok) throw new Error(`${text}: ${r.message}`);
  return r.value;
};
const same = (r: Rational, f: Fraction) => expect(`${r.num}/${r.den}`).toBe(`${f.s * f.n}/${f.d}`);

describe('exact values (SI Brochure prefixes; fraction.js oracle)', () => {
  it('3.997802734375 MHz is exactly 3997802734375/1000000 Hz', () => {
    same(value('frequency', '3.997802734375 MHz'), new Fraction('3.997802734375').mul(1_000_000));
    expect(value('frequency', '3.997802734375 MHz')).toEqual(rat(3997802734375n, 1_000_000n));
  });
  it('125 MHz and the plain number 125000000 are the same 125e6 Hz', () => {
    expect(value('frequency', '125 MHz')).toEqual(rat(125_000_000n));
    expect(value('frequency', '125000000')).toEqual(rat(125_000_000n));
    expect(value('frequency', '125MHz')).toEqual(rat(125_000_000n));
  });
  it('mHz is millihertz, MHz megahertz (SI: m = 10^-3, M = 10^6)', () => {
    expect(value('frequency', '250 mHz')).toEqual(rat(1n, 4n));
    expect(value('frequency', '1.5 kHz')).toEqual(rat(1500n));
    expect(value('frequency', '2 GHz')).toEqual(rat(2_000_000_000n));
  });
  it('a value no binary double holds stays exact: 0.1 Hz + 0.2 Hz digits', () => {
    same(value('frequency', '0.3 Hz'), new Fraction(3, 10));
    same(value('frequency', '1234567.8901234567 Hz'), new Fraction('1234567.8901234567'));
  });
  it('64 KiB = 65536 B and 48 kB = 48000 B (IEC 80000-13 binary prefixes)', () => {
    expect(value('bytes', '64 KiB')).toEqual(rat(65536n));
    expect(value('bytes', '48 kB')).toEqual(rat(48000n));
    expect(value('bytes', '1 MiB')).toEqual(rat(1_048_576n));
    expect(value('bytes', '4096')).toEqual(rat(4096n));
  });
  it('0.01 % = 1/10000; 50 ppm = 1/20000; 5 ppb = 1/200000000 (definitions of %, ppm, ppb)', () => {
    expect(value('tolerance', '0.01 %')).toEqual(rat(1n, 10_000n));
    expect(value('tolerance', '50 ppm')).toEqual(rat(1n, 20_000n));
    expect(value('tolerance', '5 ppb')).toEqual(rat(1n, 200_000_000n));
  });
  it('2 Vpp, 500 mVpp, 1.65 V, 3300 mV', () => {
    expect(value('voltage-pp', '2 Vpp')).toEqual(rat(2n));
    expect(value('voltage-pp', '500 mVpp')).toEqual(rat(1n, 2n));
    expect(value('voltage', '1.65 V')).toEqual(rat(33n, 20n));
    expect(value('voltage', '3300 mV')).toEqual(rat(33n, 10n));
  });
  it('duty as 50 % or 0.5 is one half', () => {
    expect(value('duty', '50 %')).toEqual(rat(1n, 2n));
    expect(value('duty', '0.5')).toEqual(rat(1n, 2n));
  });
  it('exponent notation is exact: 1e6 Hz, 2.5E-3 V', () => {
    expect(value('frequency', '1e6 Hz')).toEqual(rat(1_000_000n));
    expect(value('voltage', '2.5E-3 V')).toEqual(rat(1n, 400n));
  });
});

describe('tolerance in hertz (derived: ppm of the target, or absolute)', () => {
  it('50 ppm of 10 MHz is 500 Hz; 0.01 % of 1 kHz is 0.1 Hz; 2 Hz stays 2 Hz', () => {
    const t = (text: string, target: Rational) => {
      const r = parseQuantity('tolerance', text);
      if (!r.ok) throw new Error(r.message);
      return toleranceHz(r, target);
    };
    expect(t('50 ppm', rat(10_000_000n))).toEqual(rat(500n));
    expect(t('0.01 %', rat(1000n))).toEqual(rat(1n, 10n));
    expect(t('2 Hz', rat(1000n))).toEqual(rat(2n));
  });
});

describe('bad units and bad quantities', () => {
  const fail = (kind: QuantityKind, text: string) => {
    const r = parseQuantity(kind, text);
    if (r.ok) throw new Error(`${text} parsed`);
    return r;
  };
  it('mhz is a bad unit that offers both MHz and mHz (units are case-sensitive)', () => {
    const r = fail('frequency', '10 mhz');
    expect(r.code).toBe('bad-unit');
    expect(r.message).toContain('`MHz`');
    expect(r.message).toContain('`mHz`');
  });
  it('khz offers kHz; KHz offers kHz', () => {
    expect(fail('frequency', '10 khz').message).toContain('did you mean `kHz`');
    expect(fail('frequency', '10 KHz').message).toContain('did you mean `kHz`');
  });
  it('a unit of another quantity is named as such', () => {
    const r = fail('frequency', '3.3 V');
    expect(r.code).toBe('bad-unit');
    expect(r.message).toContain('not a unit of frequency');
  });
  it('a tolerance needs a unit', () => {
    const r = fail('tolerance', '50');
    expect(r.code).toBe('bad-unit');
    expect(r.message).toMatch(/needs a unit/);
  });
  it('text that is no number is a bad quantity', () => {
    expect(fail('frequency', 'fast').code).toBe('bad-quantity');
    expect(fail('frequency', '1.2.3 MHz').code).toBe('bad-quantity');
    expect(fail('frequency', '').code).toBe('bad-quantity');
  });
  it('a fraction of a byte is a bad quantity', () => {
    expect(fail('bytes', '10.5 B').code).toBe('bad-quantity');
  });
  it('an absurd exponent is refused, not turned into a huge bigint', () => {
    expect(fail('frequency', '1e999999 Hz').code).toBe('bad-quantity');
  });
  it('an amplitude written in V (not Vpp) is a bad unit', () => {
    expect(fail('voltage-pp', '2 V').code).toBe('bad-unit');
  });
});

describe('the text patterns the JSON Schema carries agree with the parser', () => {
  const cases: [QuantityKind, string][] = [
    ['frequency', '125 MHz'], ['frequency', '10 mhz'], ['frequency', '125000000'], ['tolerance', '50'], ['tolerance', '0.01 %'],
    ['bytes', '64 KiB'], ['bytes', '64 KB'], ['voltage', '1.65 V'], ['voltage-pp', '2 V'], ['duty', '50 %'], ['number', '1.953125'], ['number', '3 x'],
  ];
  it.each(cases)('%s %s', (kind, text) => {
    const matches = new RegExp(quantityPattern(kind)).test(text);
    const r = parseQuantity(kind, text);
    // Whole-byte checks go beyond a pattern; none of these cases involve them.
    expect(matches).toBe(r.ok);
  });
});

describe('formatting back to text', () => {
  it('exact decimals stay exact; others are marked ≈', () => {
    expect(formatHz(rat(3997802734375n, 1_000_000n))).toBe('3.997802734375 MHz');
    expect(formatHz(rat(150_000_000n, 7000n))).toBe('≈21.4285714286 kHz'); // 150 MHz / 7000, 12 significant digits
    expect(formatHz(rat(1n, 2n))).toBe('500 mHz');
    expect(formatBytes(65536)).toBe('64 KiB');
    expect(formatBytes(1000)).toBe('1000 B');
  });
});
