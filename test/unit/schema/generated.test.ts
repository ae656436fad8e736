// The committed JSON Schemas and the README's file reference must match what the zod schemas
// generate (run `npx tsx shared-schema/generate.ts` after changing a schema). The JSON Schema
// documents are checked against the JSON Schema 2020-12 vocabulary they declare.
import { readFileSync } from 'node:fs';
import { join } from 'node:path';
import { describe, expect, it } from 'vitest';
import { README_END, README_START, renderJsonSchema, renderReference } from '../../../shared-schema/src/reference';
import { listKeys } from '../../../shared-schema/src/keys';

const root = join(__dirname, '..', '..', '..');
const read = (p: string) => readFileSync(join(root, p), 'utf8');

describe('generated artefacts are up to date', () => {
  it('shared-schema/clock.schema.json', () => {
    expect(read('shared-schema/clock.schema.json')).toBe(renderJsonSchema('clock'));
  });
  it('shared-schema/wave.schema.json', () => {
    expect(read('shared-schema/wave.schema.json')).toBe(renderJsonSchema('wave'));
  });
  it('README.md file reference between the markers', () => {
    const readme = read('README.md');
    const start = readme.indexOf(README_START);
    const end = readme.indexOf(README_END);
    expect(start).toBeGreaterThanOrEqual(0);
    expect(end).toBeGreaterThan(start);
    expect(readme.slice(start + README_START.length, end)).toBe('\n' + renderReference());
  });
});

describe('the JSON Schemas (JSON Schema 2020-12, json-schema.org)', () => {
  for (const kind of ['clock', 'wave'] as const) {
    const schema = JSON.parse(renderJsonSchema(kind));
    it(`${kind}: declares draft 2020-12 and rejects unknown keys`, () => {
      expect(schema.$schema).toBe('https://json-schema.org/draft/2020-12/schema');
      expect(schema.additionalProperties).toBe(false);
    });
    it(`${kind}: every key has a description and appears in the reference`, () => {
      const reference = renderReference();
      for (const key of listKeys(kind)) {
        expect(key.description, key.path).not.toBe('');
        expect(reference).toContain(`\`${key.path}\``);
      }
    });
  }
  it('the wave schema carries the defaults and the unit patterns', () => {
    const wave = JSON.parse(renderJsonSchema('wave'));
    const output = wave.properties.outputs.additionalProperties;
    expect(output.properties.tolerance.default).toBe('50 ppm');
    expect(output.properties.jitter.default).toBe('forbid');
    // frequency is required unless steps lists the frequencies (checked by the spec layer, not the schema).
    expect(output.required).toEqual(['shape']);
    expect(output.properties.steps.type).toBe('array');
    const pattern = new RegExp(output.properties.frequency.anyOf[1].pattern);
    expect(pattern.test('125 MHz')).toBe(true);
    expect(pattern.test('125 mhz')).toBe(false);
  });
});
