// Key lookups for hover and completion read the zod schemas. Expected defaults are the documented
// ones: 50 ppm (about a common crystal's tolerance — common practice); sine 8 samples per cycle
// (ZOH droop sin(x)/x at f/fs = 1/8 is 0.22 dB, ADI MT-017 formula, computed below).
import { describe, expect, it } from 'vitest';
import { childKeys, listKeys, lookupKey } from '../../../shared-schema/src/keys';
import { closest, editDistance } from '../../../shared-schema/src/did-you-mean';

describe('lookupKey', () => {
  it('an output key resolves through the output-name map', () => {
    const k = lookupKey('wave', ['outputs', 'any-name', 'tolerance'])!;
    expect(k.path).toBe('outputs.*.tolerance');
    expect(k.default).toBe('50 ppm');
    expect(k.quantity?.units).toContain('ppm');
    expect(k.required).toBe(false);
  });
  it('choices list their values', () => {
    expect(lookupKey('wave', ['outputs', 'x', 'shape'])?.values).toEqual(['sine', 'square', 'triangle', 'sawtooth']);
    expect(lookupKey('wave', ['outputs', 'x', 'plan', 'table-span'])?.values).toEqual(['open', 'closed']);
  });
  it('derived defaults are given in words', () => {
    expect(lookupKey('wave', ['outputs', 'x', 'amplitude'])?.default).toMatch(/full scale/);
    expect(lookupKey('wave', ['outputs', 'x', 'min-samples-per-cycle'])?.default).toContain('sine 8');
  });
  it('unknown paths are undefined; objects list their children', () => {
    expect(lookupKey('clock', ['dac', 'nope'])).toBeUndefined();
    expect(childKeys('clock', ['dac'])).toEqual(['bits', 'sample-bytes', 'full-scale', 'max-sample-rate']);
    expect(childKeys('clock', [])).toContain('rated-system-clock');
  });
  it('whole numbers carry their bounds', () => {
    const k = lookupKey('clock', ['divider', 'fraction-bits'])!;
    expect([k.min, k.max, k.default]).toEqual([0, 16, '0']);
  });
  it('every listed key resolves back to itself', () => {
    for (const kind of ['clock', 'wave'] as const) {
      for (const k of listKeys(kind)) expect(lookupKey(kind, k.path.split('.'))?.path).toBe(k.path);
    }
  });
  it('the sine floor reason holds: ZOH droop at f/fs = 1/8 is 0.22 dB (ADI MT-017, sin(x)/x)', () => {
    const x = Math.PI / 8;
    expect(-20 * Math.log10(Math.sin(x) / x)).toBeCloseTo(0.2244, 4);
    expect(lookupKey('wave', ['outputs', 'x', 'min-samples-per-cycle'])?.description).toContain('0.22 dB');
  });
});

describe('did you mean (Levenshtein distance, textbook examples)', () => {
  it('kitten → sitting is 3; flaw → lawn is 2 (the standard worked examples)', () => {
    expect(editDistance('kitten', 'sitting')).toBe(3);
    expect(editDistance('flaw', 'lawn')).toBe(2);
    expect(editDistance('', 'abc')).toBe(3);
  });
  it('suggests the nearest key, and nothing for a far one', () => {
    expect(closest('frquency', ['frequency', 'tolerance'])).toEqual(['frequency']);
    expect(closest('zzzzzz', ['frequency', 'tolerance'])).toEqual([]);
    expect(closest('mhz', ['Hz', 'mHz', 'kHz', 'MHz'])).toEqual(['mHz', 'MHz']);
  });
});
