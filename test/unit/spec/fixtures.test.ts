// One fixture per diagnostic code: each produces exactly the diagnostics its caret markers name
// (code, severity and exact 0-based range, UTF-16 columns as the LSP specification 3.17 defines).
import { readFileSync, readdirSync } from 'node:fs';
import { join } from 'node:path';
import { describe, expect, it } from 'vitest';
import { analyze } from '../../../server/src/spec/analyze';
import { ALL_CODES } from '../../../server/src/spec/codes';
import { FIXTURES, diskHost, expectations } from './fixture-host';

const BAD = join(FIXTURES, 'bad');
const files = readdirSync(BAD).filter((f) => f.endsWith('.yaml')).sort();

const key = (d: { code: string; severity: string; range: { start: { line: number; character: number }; end: { line: number; character: number } } }) =>
  `${d.code} ${d.severity} ${d.range.start.line}:${d.range.start.character}-${d.range.end.line}:${d.range.end.character}`;

describe('bad fixtures give exactly the marked diagnostics', () => {
  it.each(files)('%s', (file) => {
    const path = join(BAD, file);
    const text = readFileSync(path, 'utf8');
    const analysis = analyze(path, text, diskHost);
    expect(analysis.diagnostics.map(key).sort()).toEqual(expectations(text).map(key).sort());
  });

  it('every code but the generated ones has a fixture named after it', () => {
    const generated = new Set(['file-too-large', 'too-many-outputs', 'internal-error']);
    const shown = new Set(files.flatMap((f) => expectations(readFileSync(join(BAD, f), 'utf8')).map((e) => e.code)));
    for (const code of ALL_CODES) {
      if (generated.has(code)) continue;
      expect(shown.has(code), code).toBe(true);
      expect(files.some((f) => f.startsWith(`${code}.`)), code).toBe(true);
    }
  });

  it('diagnostics about one output name it', () => {
    const path = join(BAD, 'clipping.wave.yaml');
    const [d] = analyze(path, readFileSync(path, 'utf8'), diskHost).diagnostics;
    expect(d.output).toBe('tone');
  });
});
