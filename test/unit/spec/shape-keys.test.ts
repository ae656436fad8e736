// The keys that apply to some shapes only are named once, in the schema (appliesTo in
// shared-schema/src/wave-schema.ts); completion reads them through childKeys and the check warns
// with `unused-key` on a key the output's shape does not read. Which key a shape reads is derived
// from the model (server/src/spec/wave-model.ts, custom-model.ts): the duty is a square's, a
// band-limited table is the harmonic series of a square, triangle or sawtooth, and `harmonics` or
// `sample-file` defines a sine's table.
import { join } from 'node:path';
import { describe, expect, it } from 'vitest';
import { childKeys, lookupKey, shapeLimitedKeys } from '../../../shared-schema/src/keys';
import { SHAPES } from '../../../shared-schema/src/shape';
import { analyze } from '../../../server/src/spec/analyze';
import type { SpecHost } from '../../../server/src/spec/types';
import { FIXTURES, diskHost } from './fixture-host';

const VALUES: Record<string, string> = {
  duty: '25 %',
  'duty-tolerance': '1 %',
  'band-limit': 'nyquist',
  harmonics: '[{ order: 1, amplitude: 1 }, { order: 3, amplitude: 0.2 }]',
  'sample-file': './cycle.csv',
};

// One cycle of a triangle-like wave in four values (its wrap, -1 → 0, is no larger than its steps).
const host: SpecHost = { readFile: (p) => (p.endsWith('cycle.csv') ? '0\n1\n0\n-1\n' : diskHost.readFile(p)) };

describe('keys that apply to some shapes only', () => {
  it('are the duty, the band limit, the harmonics and the sample file, with the shapes the model reads them for', () => {
    expect(Object.fromEntries(shapeLimitedKeys())).toStrictEqual({
      duty: ['square'],
      'duty-tolerance': ['square'],
      'band-limit': ['square', 'triangle', 'sawtooth'],
      harmonics: ['sine'],
      'sample-file': ['sine'],
    });
    // The reference text says the same as the registry.
    expect(lookupKey('wave', ['outputs', 'x', 'duty'])!.description).toMatch(/^Square waves only/);
    expect(lookupKey('wave', ['outputs', 'x', 'band-limit'])!.description).toMatch(/^Square, triangle and sawtooth/);
    expect(lookupKey('wave', ['outputs', 'x', 'harmonics'])!.description).toContain('shape: sine');
  });

  it('are offered only under their shapes, every other key under all', () => {
    const all = childKeys('wave', ['outputs', 'x']);
    for (const shape of SHAPES) {
      const offered = childKeys('wave', ['outputs', 'x'], shape);
      const left = all.filter((k) => !offered.includes(k));
      expect(left.sort(), shape).toStrictEqual([...shapeLimitedKeys()].filter(([, s]) => !s.includes(shape)).map(([k]) => k).sort());
    }
    expect(childKeys('wave', ['outputs', 'x'], 'sinus')).toStrictEqual(all.filter((k) => ![...shapeLimitedKeys().keys()].includes(k)));
  });

  it('get an unused-key warning under any other shape, and none under theirs', () => {
    const file = join(FIXTURES, 'bad', 'shape-keys.wave.yaml');
    let cases = 0;
    for (const [key, shapes] of shapeLimitedKeys()) {
      for (const shape of SHAPES) {
        const text = `clock: ./rig.clock.yaml\noutputs:\n  tone:\n    shape: ${shape}\n    frequency: 1 kHz\n    ${key}: ${VALUES[key]}\n`;
        const a = analyze(file, text, host);
        const unused = a.diagnostics.filter((d) => d.code === 'unused-key' && d.range.start.line === 5);
        expect(unused.length, `${key} on a ${shape}: ${unused.map((d) => d.message).join('; ')}`).toBe(shapes.includes(shape) ? 0 : 1);
        if (!shapes.includes(shape)) expect(unused[0].severity).toBe('warning');
        expect(a.diagnostics.filter((d) => d.severity === 'error'), `${key} on a ${shape}`).toStrictEqual([]);
        cases++;
      }
    }
    expect(cases).toBe(20);
  });
});
