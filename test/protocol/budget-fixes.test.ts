// The board-budget quick fixes (server/src/lsp/budget-fixes.ts) on an invented board whose own
// plans exceed its memory budget, applied to the text and re-checked by the checker's analyze().
// Figures in the titles are checked against the plan after the fix: table bytes = N · sample bytes
// and S = N/M (docs/DESIGN.md, "Quantities"), with fraction.js as the exact-rational oracle.

import Fraction from 'fraction.js';
import * as fs from 'node:fs';
import * as os from 'node:os';
import * as path from 'node:path';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { analyze } from '../../server/src/spec/analyze';
import { applyEdits, ensureBuilt, LspClient, ROOT, uriOf, type LspDiagnostic } from '../support/lsp-client';

interface CodeAction {
  title: string;
  isPreferred?: boolean;
  edit: { changes: Record<string, { range: LspDiagnostic['range']; newText: string }[]> };
}

const host = { readFile: (p: string) => (fs.existsSync(p) && fs.statSync(p).isFile() ? fs.readFileSync(p, 'utf8') : undefined) };
let dir: string;
let client: LspClient;
let file: string;
let text: string;

beforeAll(async () => {
  ensureBuilt();
  dir = fs.mkdtempSync(path.join(os.tmpdir(), 'waveplan-budget-'));
  for (const name of ['audio.clock.yaml', 'audio.wave.yaml']) fs.copyFileSync(path.join(ROOT, 'test/fixtures/boards', name), path.join(dir, name));
  file = path.join(dir, 'audio.wave.yaml');
  text = fs.readFileSync(file, 'utf8');
  client = await LspClient.start({ folders: [dir] });
  client.open(uriOf(file), text, 1);
});

afterAll(async () => {
  await client?.stop();
  if (dir) fs.rmSync(dir, { recursive: true, force: true });
});

async function fixesOn(code: string): Promise<{ d: LspDiagnostic; actions: CodeAction[] }> {
  const uri = uriOf(file);
  const published = await client.diagnosticsFor(uri, (p) => p.version === 1);
  const d = published.diagnostics.find((x) => x.code === code)!;
  expect(d, code).toBeDefined();
  const actions = await client.request<CodeAction[]>('textDocument/codeAction', { textDocument: { uri }, range: d.range, context: { diagnostics: [d], only: ['quickfix'] } });
  return { d, actions };
}

describe('board-budget quick fixes', () => {
  it('"Pin the plans that fit the budget" writes the shrunk plans: nothing moves, the tables fit, the title states their total', async () => {
    const { actions } = await fixesOn('fitted-to-budget');
    const pin = actions.find((a) => a.title.startsWith('Pin the plans that fit the budget'))!;
    expect(pin).toBeDefined();
    const before = analyze(file, text, host);
    const after = analyze(file, applyEdits(text, pin.edit.changes[uriOf(file)]), host);
    expect(after.diagnostics.filter((x) => x.code === 'fitted-to-budget' || x.severity === 'error')).toEqual([]);
    let bytes = 0;
    for (const o of after.outputs) {
      const p = o.planning.plan!;
      bytes += p.tableLength * 2;
      const was = before.outputs.find((x) => x.name === o.name)!.planning.plan!;
      expect([p.dividerInteger, p.tableLength, p.cycles.num], o.name).toEqual([was.dividerInteger, was.tableLength, was.cycles.num]);
    }
    expect(bytes).toBeLessThanOrEqual(48 * 1024);
    expect(pin.title).toContain(`${bytes} B of 48 KiB`);
  });

  it('"Use fewer samples" pins a smaller plan within tolerance, its S and bytes in the title', async () => {
    const { actions } = await fixesOn('fitted-to-budget');
    const fewer = actions.find((a) => a.title.startsWith('Use fewer samples for '))!;
    if (process.env.WAVEPLAN_SHOW_FIXES) console.log(actions.map((a) => a.title).join("\n"));
    expect(fewer).toBeDefined();
    const m = /^Use fewer samples for (\S+) \(S = ([\d.]+), (\d+) B\): (exact|within tolerance) at /.exec(fewer.title)!;
    expect(m, fewer.title).not.toBeNull();
    const before = analyze(file, text, host).outputs.find((o) => o.name === m[1])!;
    const after = analyze(file, applyEdits(text, fewer.edit.changes[uriOf(file)]), host).outputs.find((o) => o.name === m[1])!;
    const p = after.planning.plan!;
    expect(after.planning.verdict).toBe('pinned');
    expect(after.planning.withinTolerance).toBe(true);
    expect(p.tableLength * 2).toBe(Number(m[3]));
    expect(p.tableLength).toBeLessThan(before.planning.plan!.tableLength);
    expect(new Fraction(p.tableLength).div(new Fraction(p.cycles.num, p.cycles.den)).equals(new Fraction(m[2]))).toBe(true);
  });
});

describe('over-budget quick fixes', () => {
  let overDir: string;
  let overClient: LspClient;
  let overFile: string;
  const overText = `clock: ./rig.clock.yaml
outputs:
  capture:
    shape: sine
    frequency: 1017.25260416667 Hz
    tolerance: 1 %
    plan: { divider: 10, table-length: 12288, cycles: 1 }   # 24576 B: the whole 24 KiB budget
  probe:
    shape: sine
    frequency: 1 kHz
`;

  beforeAll(async () => {
    overDir = fs.mkdtempSync(path.join(os.tmpdir(), 'waveplan-over-'));
    fs.copyFileSync(path.join(ROOT, 'test/fixtures/bad/rig.clock.yaml'), path.join(overDir, 'rig.clock.yaml'));
    overFile = path.join(overDir, 'board.wave.yaml');
    fs.writeFileSync(overFile, overText);
    overClient = await LspClient.start({ folders: [overDir] });
    overClient.open(uriOf(overFile), overText, 1);
  });

  afterAll(async () => {
    await overClient?.stop();
    if (overDir) fs.rmSync(overDir, { recursive: true, force: true });
  });

  it('offers "Use fewer samples" for the largest output that can shrink, saying when the error stays', async () => {
    const uri = uriOf(overFile);
    const published = await overClient.diagnosticsFor(uri, (p) => p.version === 1);
    const d = published.diagnostics.find((x) => x.code === 'over-budget')!;
    expect(d, JSON.stringify(published.diagnostics.map((x) => x.code))).toBeDefined();
    // derived: the pinned table alone fills 12288 · 2 B = 24576 B = 24 KiB, so nothing else fits.
    expect(d.message).toContain('capture 24 KiB');
    const actions = await overClient.request<CodeAction[]>('textDocument/codeAction', { textDocument: { uri }, range: d.range, context: { diagnostics: [d], only: ['quickfix'] } });
    const fewer = actions.find((a) => a.title.startsWith('Use fewer samples for probe'))!;
    expect(fewer, actions.map((a) => a.title).join('\n')).toBeDefined();
    expect(fewer.title).toContain(' — does not clear over-budget');
    const after = analyze(overFile, applyEdits(overText, fewer.edit.changes[uri]), host).outputs.find((o) => o.name === 'probe')!;
    const m = /\(S = ([\d.]+), (\d+) B\)/.exec(fewer.title)!;
    expect(after.planning.plan!.tableLength * 2).toBe(Number(m[2]));
    expect(after.planning.withinTolerance).toBe(true);
  });
});
