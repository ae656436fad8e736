// Quick fixes applied to the text and re-checked by the server. The expected neighbours of the
// target come from plain enumeration of every (divider, table length, cycles) on the small
// fixture board — the oracle of record for plan search (docs/REFERENCES.md, "Best rational approximation").

import * as fs from 'node:fs';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { applyEdits, ensureBuilt, LspClient, uriOf, type LspDiagnostic } from '../support/lsp-client';
import { lineOf, scratchCopy } from './workspace';

interface CodeAction {
  title: string;
  isPreferred?: boolean;
  diagnostics?: LspDiagnostic[];
  edit: { changes: Record<string, { range: LspDiagnostic['range']; newText: string }[]> };
}

let client: LspClient;
let ws: ReturnType<typeof scratchCopy>;
let uri: string;
let original: string;
let version = 1;

beforeAll(async () => {
  ensureBuilt();
  ws = scratchCopy();
  client = await LspClient.start({ folders: [ws.dir] });
  uri = uriOf(ws.lab);
  original = fs.readFileSync(ws.lab, 'utf8');
  client.open(uri, original, version);
});

afterAll(async () => {
  await client?.stop();
  ws?.remove();
});

/** Every jitter-free frequency of the fixture board (lab.clock.yaml), as exact fractions num/den. */
function reachable(): { num: number; den: number; d: number; n: number; m: number }[] {
  const out = [];
  // f_sys 120 MHz; I 1..16 with f_s ≤ 20 MHz → I ≥ 6; N 64..512 (8 KiB / 2 B allows all);
  // sine: N/M ≥ 8. All products stay below 2^53, so the comparisons below are exact.
  for (let d = 6; d <= 16; d++) for (let n = 64; n <= 512; n++) for (let m = 1; m * 8 <= n; m++) out.push({ num: 120e6 * m, den: d * n, d, n, m });
  return out;
}
const less = (a: { num: number; den: number }, b: { num: number; den: number }) => a.num * b.den < b.num * a.den;

async function fixesFor(text: string, code: string): Promise<{ diagnostic: LspDiagnostic; actions: CodeAction[] }> {
  const published = await client.diagnosticsFor(uri, (p) => p.version === version);
  const diagnostic = published.diagnostics.find((d) => d.code === code);
  expect(diagnostic, `${code} in ${JSON.stringify(published.diagnostics.map((d) => d.code))}`).toBeDefined();
  const actions = await client.request<CodeAction[]>('textDocument/codeAction', {
    textDocument: { uri },
    range: diagnostic!.range,
    context: { diagnostics: [diagnostic], only: ['quickfix'] },
  });
  return { diagnostic: diagnostic!, actions };
}

async function applyAndRecheck(text: string, action: CodeAction): Promise<{ text: string; codes: string[] }> {
  const next = applyEdits(text, action.edit.changes[uri]);
  version++;
  client.change(uri, version, next);
  const published = await client.diagnosticsFor(uri, (p) => p.version === version);
  return { text: next, codes: published.diagnostics.map((d) => String(d.code)) };
}

describe('quick fixes', () => {
  it('retargets an out-of-tolerance output to the nearest jitter-free frequency below, preferred', async () => {
    const { actions } = await fixesFor(original, 'out-of-tolerance');
    const all = reachable();
    const target = { num: 37000, den: 1 };
    let below: (typeof all)[number] | undefined;
    let above: (typeof all)[number] | undefined;
    for (const f of all) {
      if (less(f, target) && (!below || less(below, f))) below = f;
      if (less(target, f) && (!above || less(f, above))) above = f;
    }
    // Enumeration: below = 120 MHz × 2 / (13 × 499) ≈ 36 997.07 Hz (−79 ppm), above ≈ 37 025.6 Hz (+692 ppm).
    expect([below!.d, below!.n, below!.m]).toEqual([13, 499, 2]);
    const preferred = actions.filter((a) => a.isPreferred);
    expect(preferred).toHaveLength(1);
    expect(preferred[0].title).toContain('below');
    expect(preferred[0].title).toContain('÷13, N = 499, M = 2');
    const upward = actions.find((a) => a.title.includes('above'))!;
    expect(upward.title).toContain(`÷${above!.d}, N = ${above!.n}, M = ${above!.m}`);

    const edits = preferred[0].edit.changes[uri];
    expect(edits).toHaveLength(1);
    // Minimal: only the value of `frequency:` changes; the line's comment stays.
    expect(edits[0].range.start.line).toBe(lineOf(original, 'frequency: 37 kHz'));
    const { text, codes } = await applyAndRecheck(original, preferred[0]);
    expect(text).toContain('# keep this comment');
    const written = /frequency: ([\d.]+) kHz/.exec(text.split('\n')[lineOf(original, 'frequency: 37 kHz')])![1];
    // The written decimal is within 1e-12 kHz of 240 000 000 / 6487 Hz (derived), far inside 20 ppm.
    expect(Math.abs(Number(written) * 1000 - 240e6 / 6487)).toBeLessThan(1e-6);
    expect(codes).not.toContain('out-of-tolerance');
    // Put the original back for the next case.
    version++;
    client.change(uri, version, original);
  });

  it('offers a fractional divider with its jitter in the title', async () => {
    const { actions } = await fixesFor(original, 'out-of-tolerance');
    const fractional = actions.find((a) => a.title.startsWith('Allow a fractional divider'));
    // Enumeration with 4 fraction bits (D = J/16): the best plan is −11.7 ppm, inside 20 ppm.
    expect(fractional).toBeDefined();
    expect(fractional!.title).toMatch(/÷\d+\+\d+\/16, N = \d+, M = \d+, [\d.]+ ns rms period jitter$/);
    const { text, codes } = await applyAndRecheck(original, fractional!);
    expect(text.split('\n')[lineOf(original, 'jitter: forbid')]).toBe('    jitter: allow');
    expect(codes).not.toContain('out-of-tolerance');
    expect(codes).toContain('fractional-plan');
    version++;
    client.change(uri, version, original);
  });

  it('lengthens a pinned table with half a cycle too many so the seam closes', async () => {
    const { actions } = await fixesFor(original, 'seam-glitch');
    const lengthen = actions.find((a) => a.title.startsWith('Lengthen the table'))!;
    expect(lengthen.isPreferred).toBe(true);
    // derived: 2.5 cycles in 100 samples → ×2 → 5 whole cycles in 200; f = 12 MHz × 5 / 200 = 300 kHz.
    expect(lengthen.edit.changes[uri][0].newText).toBe('{ divider: 10, table-length: 200, cycles: 5 }');
    const { codes } = await applyAndRecheck(original, lengthen);
    expect(codes).not.toContain('seam-glitch');
    version++;
    client.change(uri, version, original);
  });

  it('pins the nearest jitter-free plan into an entry that has none, keeping the indentation', async () => {
    const { actions } = await fixesFor(original, 'out-of-tolerance');
    const pin = actions.find((a) => a.title.startsWith('Pin the nearest jitter-free plan'))!;
    const { text } = await applyAndRecheck(original, pin);
    const lines = text.split('\n');
    const at = lineOf(text, 'jitter: forbid') + 1;
    expect(lines[at]).toBe('    plan: { divider: 13, table-length: 499, cycles: 2 }');
    // Everything else is byte-for-byte the original.
    expect([...lines.slice(0, at), ...lines.slice(at + 1)].join('\n')).toBe(original);
    version++;
    client.change(uri, version, original);
  });
});
