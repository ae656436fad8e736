// Fixes for what people mistype, over stdio on specs written with typing slips (test/protocol/
// mistypes/): a misspelt key is one finding with a rename fix, a mistyped unit gets the unit it
// was close to, a missing key is added with a placeholder that stays a finding until replaced,
// and "every such finding" fixes them all at once. Each fix is applied and the result re-checked
// by the checker's analyze(); the YAML library reads the edited text back to find what was added.

import * as fs from 'node:fs';
import * as os from 'node:os';
import * as path from 'node:path';
import { parseDocument } from 'yaml';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { analyze } from '../../server/src/spec/analyze';
import type { Analysis } from '../../server/src/spec/types';
import { applyEdits, ensureBuilt, LspClient, ROOT, uriOf, type LspDiagnostic } from '../support/lsp-client';

interface CodeAction {
  title: string;
  isPreferred?: boolean;
  edit: { changes: Record<string, { range: LspDiagnostic['range']; newText: string }[]> };
}

const host = { readFile: (p: string) => (fs.existsSync(p) ? fs.readFileSync(p, 'utf8') : undefined) };
let dir: string;
let client: LspClient;
let version = 1;

beforeAll(async () => {
  ensureBuilt();
  dir = fs.mkdtempSync(path.join(os.tmpdir(), 'waveplan-mistypes-'));
  const source = path.join(ROOT, 'test/protocol/mistypes');
  for (const name of fs.readdirSync(source)) fs.copyFileSync(path.join(source, name), path.join(dir, name));
  client = await LspClient.start({ folders: [dir] });
});

afterAll(async () => {
  await client?.stop();
  if (dir) fs.rmSync(dir, { recursive: true, force: true });
});

async function openAndFix(name: string, text: string): Promise<{ uri: string; diagnostics: LspDiagnostic[]; fixes: (d: LspDiagnostic) => Promise<CodeAction[]> }> {
  const file = path.join(dir, name);
  const uri = uriOf(file);
  const v = ++version;
  client.open(uri, text, v);
  const published = await client.diagnosticsFor(uri, (p) => p.version === v);
  const fixes = (d: LspDiagnostic) => client.request<CodeAction[]>('textDocument/codeAction', { textDocument: { uri }, range: d.range, context: { diagnostics: [d], only: ['quickfix'] } });
  return { uri, diagnostics: published.diagnostics, fixes };
}

const read = (name: string) => fs.readFileSync(path.join(dir, name), 'utf8');
const check = (name: string, text: string): Analysis => analyze(path.join(dir, name), text, host);
const codes = (a: Analysis, output?: string) => a.diagnostics.filter((d) => output === undefined || d.output === output).map((d) => d.code);

describe('fixes for mistyped keys, units and missing keys', () => {
  it('reports every slip of the file in one pass, a misspelt required key once', () => {
    const a = check('desk.wave.yaml', read('desk.wave.yaml'));
    // A misspelt `frequency` is one unknown-key finding, not also a missing-key one.
    for (const output of ['tone', '1st-harmonic']) expect(codes(a, output).sort()).toEqual(output === 'tone' ? ['unknown-key'] : ['bad-name', 'unknown-key']);
    expect(codes(a, 'pinned')).toEqual(['unknown-key']);
    // Under a name the schema rejects, the keys are still checked in the same pass.
    expect(codes(a, '1st-harmonic')).toContain('unknown-key');
    const clock = check('desk.clock.yaml', read('desk.clock.yaml'));
    expect(codes(clock).sort()).toEqual(['bad-unit', 'unknown-key', 'unknown-key']);
  });

  it('renames a misspelt key to the known key it is close to, and the finding is gone', async () => {
    const text = read('desk.wave.yaml');
    const { uri, diagnostics, fixes } = await openAndFix('desk.wave.yaml', text);
    const unknown = diagnostics.filter((d) => d.code === 'unknown-key');
    expect(unknown).toHaveLength(4);
    for (const d of unknown) {
      const actions = await fixes(d);
      const rename = actions.find((a) => a.title.startsWith('Rename'));
      expect(rename, d.message).toBeDefined();
      expect(rename!.isPreferred).toBe(true);
      const after = check('desk.wave.yaml', applyEdits(text, rename!.edit.changes[uri]));
      const owner = (d.data as { output?: string }).output;
      expect(codes(after, owner)).not.toContain('unknown-key');
      expect(codes(after, owner)).not.toContain('missing-key');
    }
    // Four single-match misspellings: one fix renames them all; the comment after one stays.
    const all = (await fixes(unknown[0])).find((a) => a.title.startsWith('Rename every misspelt key'));
    expect(all?.title).toContain('(4 in this file)');
    const fixed = applyEdits(text, all!.edit.changes[uri]);
    expect(codes(check('desk.wave.yaml', fixed))).not.toContain('unknown-key');
    expect(fixed).toContain('frequency: 1 kHz   # the key is misspelt');
  });

  it('changes a mistyped unit to the units it was close to (SI: kHz, not khz; Vpp for a peak-to-peak key)', async () => {
    const text = read('desk.wave.yaml');
    const { uri, diagnostics, fixes } = await openAndFix('desk.wave.yaml', text);
    const titles: string[] = [];
    for (const d of diagnostics.filter((x) => x.code === 'bad-unit')) {
      for (const action of (await fixes(d)).filter((a) => a.title.startsWith('Change the unit `'))) {
        titles.push(action.title);
        const edited = applyEdits(text, action.edit.changes[uri]);
        const after = check('desk.wave.yaml', edited);
        expect(after.diagnostics.filter((x) => x.code === 'bad-unit').length).toBe(2);
        expect(edited.split('\n')[d.range.start.line]).toMatch(/(kHz|ppm|ppb|Vpp)$/);
      }
    }
    // `ppn` is one letter from both ppm and ppb: both are offered (edit distance 1, derived).
    expect(titles.sort()).toEqual(['Change the unit `V` to `Vpp`', 'Change the unit `khz` to `kHz`', 'Change the unit `ppn` to `ppb`', 'Change the unit `ppn` to `ppm`']);
  });

  it('adds a missing key with a placeholder that stays an error until it is replaced', async () => {
    const text = read('desk.wave.yaml');
    const { uri, diagnostics, fixes } = await openAndFix('desk.wave.yaml', text);
    const missing = diagnostics.filter((d) => d.code === 'missing-key');
    expect(missing).toHaveLength(2);
    for (const d of missing) {
      const add = (await fixes(d)).find((a) => a.title.startsWith('Add `'));
      expect(add, d.message).toBeDefined();
      expect(add!.isPreferred).toBeFalsy();
      const edited = applyEdits(text, add!.edit.changes[uri]);
      const owner = (d.data as { output: string }).output;
      const key = owner === 'bare' ? 'shape' : 'frequency';
      // The YAML library finds the key under the output it belongs to, holding a `<…>` placeholder.
      const value = parseDocument(edited).getIn(['outputs', owner, key]);
      expect(String(value)).toMatch(/^<.+>$/);
      const after = check('desk.wave.yaml', edited);
      expect(codes(after, owner)).not.toContain('missing-key');
      expect(after.diagnostics.some((x) => x.output === owner && x.severity === 'error' && ['bad-choice', 'bad-quantity', 'wrong-type'].includes(x.code))).toBe(true);
    }
  });

  it('keeps CRLF line endings when it adds a line', async () => {
    const text = read('desk.wave.yaml').replace(/\n/g, '\r\n');
    const { uri, diagnostics, fixes } = await openAndFix('desk.wave.yaml', text);
    const d = diagnostics.find((x) => x.code === 'missing-key' && (x.data as { output: string }).output === 'bare')!;
    const add = (await fixes(d)).find((a) => a.title.startsWith('Add `'))!;
    const inserted = add.edit.changes[uri].map((e) => e.newText).join('');
    expect(inserted.startsWith('\r\n')).toBe(true);
    expect(inserted.replace(/\r\n/g, '')).not.toMatch(/[\r\n]/);
  });

  it('fixes a clock file the same way', async () => {
    const text = read('desk.clock.yaml');
    const { uri, diagnostics, fixes } = await openAndFix('desk.clock.yaml', text);
    let edited = text;
    for (const d of diagnostics) {
      const first = (await fixes(d)).find((a) => a.isPreferred);
      expect(first, `${d.code}: ${d.message}`).toBeDefined();
      edited = applyEdits(edited, first!.edit.changes[uri]);
    }
    // All three slips fixed, the clock reads as the correctly written one does.
    expect(edited.split('\n').slice(1)).toEqual(read('good.clock.yaml').split('\n').slice(1));
    expect(check('desk.clock.yaml', edited).diagnostics).toEqual([]);
  });
});
