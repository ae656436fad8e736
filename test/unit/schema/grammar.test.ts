// The TextMate grammar colours exactly what the checker accepts: its closed-vocabulary words and
// units come from the schemas (shared-schema/src/grammar.ts). The oracle for "accepts" is the
// checker itself: analyze() on a one-key spec, with and without the word.

import { readFileSync } from 'node:fs';
import { join } from 'node:path';
import { describe, expect, it } from 'vitest';
import { analyze } from '../../../server/src/spec/analyze';
import { choiceWords, grammarUnits, renderGrammar } from '../../../shared-schema/src/grammar';

const ROOT = join(__dirname, '..', '..', '..');
const committed = readFileSync(join(ROOT, 'syntaxes', 'waveplan.tmLanguage.json'), 'utf8');
const grammar = JSON.parse(committed) as { repository: Record<string, { match: string }> };

/** The grammar's own regexes (Oniguruma; these use only what JavaScript regexes share with it). */
const rules = Object.entries(grammar.repository).map(([name, r]) => ({ name, re: new RegExp(r.match) }));
const coloured = (line: string): string[] => rules.filter((r) => r.re.test(line)).map((r) => r.name);

const clock = 'system-clock: 96 MHz\ndivider: { integer: { min: 2, max: 4095 } }\ndac: { bits: 12, sample-bytes: 2, full-scale: 2.5 V, max-sample-rate: 12 MHz }\nmemory: { budget: 32 KiB, table-length: { min: 16, max: 4096 } }\n';
const host = { readFile: (p: string) => (p.endsWith('.clock.yaml') ? clock : undefined) };

/** The diagnostics the checker gives on the `key: word` line of a small wave spec. */
function findingsOn(key: string, word: string): string[] {
  const lines: Record<string, string> = {
    jitter: `    jitter: ${word}`,
    shape: `    shape: ${word}`,
    'table-span': `    plan: { divider: 4, table-length: 256, cycles: 1, table-span: ${word} }`,
    'band-limit': `    band-limit: ${word}`,
  };
  const text = `clock: ./x.clock.yaml\noutputs:\n  a:\n${key === 'shape' ? '' : '    shape: sine\n'}    frequency: 93.75 kHz\n${lines[key]}\n`;
  const a = analyze('/virtual/x.wave.yaml', text, host);
  const line = text.split('\n').findIndex((l) => l.includes(`${key}: ${word}`));
  return a.diagnostics.filter((d) => d.range.start.line === line && ['bad-choice', 'wrong-type', 'unknown-key'].includes(d.code)).map((d) => d.code);
}

describe('the TextMate grammar', () => {
  it('is what `npm run schema` writes from the schemas (regenerate it, never edit it)', () => {
    expect(committed).toBe(renderGrammar());
  });

  it('colours every word the checker accepts, and none it rejects — jitter: warn among them', () => {
    const vocab = choiceWords();
    const all = [...new Set(vocab.flatMap((v) => v.words)), 'warn', 'ignore', 'cosine'];
    // Clock-file keys (source, the analog chain's load) and the keys of groups are not on an output's lines.
    for (const { key, words } of vocab.filter((v) => !['source', 'load', 'lock', 'offsets-as'].includes(v.key))) {
      for (const word of all) {
        const accepted = findingsOn(key, word).length === 0;
        expect(accepted, `${key}: ${word} (checker)`).toBe(words.includes(word));
        expect(coloured(`    ${key}: ${word}`).includes(`choice-${key}`), `${key}: ${word} (grammar)`).toBe(accepted);
      }
    }
    expect(coloured('    jitter: warn')).toEqual([]);
  });

  it('colours a number with each unit a quantity key takes, and not with units no key takes', () => {
    for (const unit of grammarUnits()) expect(coloured(`    frequency: 12.5 ${unit}`), unit).toContain('quantity');
    for (const unit of ['ns', 'Vrms', 'bytes', 'kW', 'mA']) expect(coloured(`    x: 12.5 ${unit}`), unit).toEqual([]);
    expect(grammarUnits()).toEqual(expect.arrayContaining(['mHz', 'MHz', 'ppm', 'ppb', '%', 'KiB', 'MB', 'Vpp', 'mVpp', 'V', 'mV']));
  });
});
