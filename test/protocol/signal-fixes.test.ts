// Quick fixes for the quality floor and the analog chain, through the built server: each fix's
// edit, applied and re-checked, clears its diagnostic, and its title states the figures the
// checker reports after it.

import * as fs from 'node:fs';
import * as os from 'node:os';
import * as path from 'node:path';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { applyEdits, ensureBuilt, LspClient, uriOf, type LspDiagnostic } from '../support/lsp-client';

interface CodeAction {
  title: string;
  isPreferred?: boolean;
  edit: { changes: Record<string, { range: LspDiagnostic['range']; newText: string }[]> };
}

// The jittery board of the fixtures (100 MHz, 16-bit fraction, 14-bit DAC, 32-sample tables) with
// an amplifier: gain 4, 1 V/µs, output +-10 V (invented).
const CLOCK = `system-clock: 100 MHz
divider:
  integer: { min: 1, max: 65535 }
  fraction-bits: 16
dac:
  bits: 14
  sample-bytes: 2
  full-scale: 3.3 V
  max-sample-rate: 50 MHz
memory:
  budget: 4 KiB
  table-length: { min: 32, max: 32 }
analog:
  gain: 4
  slew-rate: 1 V/µs
  output-swing: { min: -10 V, max: 10 V }
`;

let client: LspClient;
let dir: string;
let version = 1;

beforeAll(async () => {
  ensureBuilt();
  dir = fs.mkdtempSync(path.join(os.tmpdir(), 'waveplan-signal-'));
  fs.writeFileSync(path.join(dir, 'amp.clock.yaml'), CLOCK);
  client = await LspClient.start({ folders: [dir] });
});

afterAll(async () => {
  await client?.stop();
  if (dir) fs.rmSync(dir, { recursive: true, force: true });
});

async function fixes(file: string, text: string, code: string) {
  const uri = uriOf(path.join(dir, file));
  fs.writeFileSync(path.join(dir, file), text);
  const v = version++;
  client.open(uri, text, v);
  const published = await client.diagnosticsFor(uri, (p) => p.version === v);
  const diagnostic = published.diagnostics.find((d) => d.code === code);
  expect(diagnostic, `${code} in ${JSON.stringify(published.diagnostics.map((d) => d.code))}`).toBeDefined();
  const actions = await client.request<CodeAction[]>('textDocument/codeAction', {
    textDocument: { uri },
    range: diagnostic!.range,
    context: { diagnostics: [diagnostic], only: ['quickfix'] },
  });
  const recheck = async (a: CodeAction) => {
    const next = applyEdits(text, a.edit.changes[uri]!);
    const w = version++;
    client.change(uri, w, next);
    const after = await client.diagnosticsFor(uri, (p) => p.version === w);
    client.change(uri, version++, text);
    return { text: next, codes: after.diagnostics.map((d) => d.code) };
  };
  return { actions, recheck };
}

describe('quality-floor and chain quick fixes', () => {
  it('1.5 MHz on the 16-bit fraction: "Forbid jitter" clears signal-quality (and leaves the plan out of tolerance, which its title says)', async () => {
    const wave = 'clock: ./amp.clock.yaml\noutputs:\n  carrier:\n    shape: sine\n    frequency: 1.5 MHz\n    min-samples-per-cycle: 32\n    jitter: allow\n';
    const { actions, recheck } = await fixes('carrier.wave.yaml', wave, 'signal-quality');
    const forbid = actions.find((a) => a.title.startsWith('Forbid jitter'));
    expect(forbid, JSON.stringify(actions.map((a) => a.title))).toBeDefined();
    expect(forbid!.title).toMatch(/out of tolerance at 1\.5625 MHz/);
    const after = await recheck(forbid!);
    expect(after.text).toContain('jitter: forbid');
    expect(after.codes).not.toContain('signal-quality');
  });

  it('a 14-bit tone at 20 mVpp: "Raise the amplitude" to full scale clears the floor', async () => {
    const wave = 'clock: ./amp.clock.yaml\noutputs:\n  quiet:\n    shape: sine\n    frequency: 3.125 MHz\n    amplitude: 20 mVpp\n    offset: 1.65 V\n';
    const { actions, recheck } = await fixes('quiet.wave.yaml', wave, 'signal-quality');
    const raise = actions.find((a) => a.title.startsWith('Raise the amplitude'));
    expect(raise, JSON.stringify(actions.map((a) => a.title))).toBeDefined();
    const after = await recheck(raise!);
    expect(after.codes).not.toContain('signal-quality');
  });

  it('gain 4 clips 3 Vpp around 1.65 V: "Lower the amplitude" to the swing clears chain-clipping', async () => {
    // 12.5 kHz (÷250, 32 samples): slow enough for the 1 V/µs amplifier, so the swing alone limits.
    const wave = 'clock: ./amp.clock.yaml\noutputs:\n  drive:\n    shape: sine\n    frequency: 12.5 kHz\n    amplitude: 3 Vpp\n    offset: 1.65 V\n';
    const { actions, recheck } = await fixes('drive.wave.yaml', wave, 'chain-clipping');
    const lower = actions.find((a) => a.title.startsWith('Lower the amplitude'));
    expect(lower, JSON.stringify(actions.map((a) => a.title))).toBeDefined();
    // derived: +10 V / 4 = 2.5 V is the top; 2·(2.5 − 1.65) = 1.7 Vpp.
    expect(lower!.title).toContain('1.7 Vpp');
    const after = await recheck(lower!);
    expect(after.codes).not.toContain('chain-clipping');
  });
});

describe('the coupling capacitor', () => {
  // An invented AC-coupled rig: 1 µF into 10 kΩ, corner 1/(2π·10 kΩ·1 µF) = 15.9 Hz, under a 50 Hz tone.
  // derived: the loss within 0.1 dB needs f_c ≤ f·√(10^(0.1/10) − 1) = 50 Hz · 0.15262 = 7.631 Hz, so
  // C ≥ 1/(2π·10 kΩ·7.631 Hz) = 2.086 µF; the first E12 value above (IEC 60063) is 2.2 µF, whose
  // corner is 7.234 Hz and whose loss at 50 Hz is 20·log10(50/√(50² + 7.234²)) = −0.090 dB.
  const COUPLED = CLOCK.replace(/analog:[\s\S]*$/, 'analog:\n  coupling: { resistance: 10 kΩ, capacitance: 1 µF }\n');

  it('50 Hz through 1 µF into 10 kΩ: "Use a 2.2 µF coupling capacitor" edits the clock file, and the re-check clears coupling-corner', async () => {
    fs.writeFileSync(path.join(dir, 'coupled.clock.yaml'), COUPLED);
    const wave = 'clock: ./coupled.clock.yaml\noutputs:\n  hum:\n    shape: sine\n    frequency: 50 Hz\n';
    const { actions } = await fixes('hum.wave.yaml', wave, 'coupling-corner');
    const larger = actions.find((a) => a.title.startsWith('Use a '));
    expect(larger, JSON.stringify(actions.map((a) => a.title))).toBeDefined();
    expect(larger!.title).toBe('Use a 2.2 µF coupling capacitor (corner 7.234 Hz): hum loses 0.090 dB at 50 Hz');
    expect(larger!.isPreferred).toBe(true);
    const clockUri = uriOf(path.join(dir, 'coupled.clock.yaml'));
    expect(Object.keys(larger!.edit.changes)).toEqual([clockUri]);
    // Applied as the editor applies a WorkspaceEdit: the clock file's buffer changes; the spec is re-checked.
    const edited = applyEdits(COUPLED, larger!.edit.changes[clockUri]!);
    expect(edited).toBe(COUPLED.replace('capacitance: 1 µF', 'capacitance: 2.2 µF'));
    const waveUri = uriOf(path.join(dir, 'hum.wave.yaml'));
    const since = client.published.length;
    client.open(clockUri, edited, 1);
    const after = await client.diagnosticsFor(waveUri, () => true, since);
    expect(after.diagnostics.map((d) => d.code)).not.toContain('coupling-corner');
    client.close(clockUri);
  });
});
