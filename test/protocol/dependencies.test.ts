// A clock file's change re-checks every wave spec that reads it: an edit in its open buffer
// (unsaved text wins over the disk), and a change on disk reported by the file watcher — for open
// wave specs and for closed ones.

import * as fs from 'node:fs';
import * as path from 'node:path';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { ensureBuilt, LspClient, uriOf } from '../support/lsp-client';
import { scratchCopy } from './workspace';

let client: LspClient;
let ws: ReturnType<typeof scratchCopy>;
let clockText: string;
let closedWave: string;

beforeAll(async () => {
  ensureBuilt();
  ws = scratchCopy();
  clockText = fs.readFileSync(ws.labClock, 'utf8');
  // A second wave spec on the same clock that stays closed throughout.
  closedWave = path.join(ws.dir, 'idle.wave.yaml');
  fs.writeFileSync(closedWave, 'clock: ./lab.clock.yaml\noutputs:\n  idle-tone:\n    shape: sine\n    frequency: 100 kHz\n');
  client = await LspClient.start({ folders: [ws.dir] });
});

afterAll(async () => {
  await client?.stop();
  ws?.remove();
});

const codesOf = (p: { diagnostics: { code?: string | number }[] }) => p.diagnostics.map((d) => String(d.code));
// A DAC with 0 bits is outside the schema's range: the clock file no longer describes hardware.
const brokenClock = () => clockText.replace('bits: 10', 'bits: 0');

describe('clock file dependencies', () => {
  it('re-checks open and closed wave specs when the open clock buffer changes, before it is saved', async () => {
    const waveUri = uriOf(ws.lab);
    const clockUri = uriOf(ws.labClock);
    client.open(waveUri, fs.readFileSync(ws.lab, 'utf8'));
    const first = await client.diagnosticsFor(waveUri);
    expect(codesOf(first)).not.toContain('clock-invalid');
    // The startup scan learnt that the closed spec reads this clock file too.
    await client.waitFor(() => (client.serverRequests.includes('client/registerCapability') ? true : undefined), 'watcher registration');

    client.open(clockUri, clockText, 1);
    const mark = client.published.length;
    client.change(clockUri, 2, brokenClock());
    const open = await client.diagnosticsFor(waveUri, (p) => codesOf(p).includes('clock-invalid'), mark);
    const clockValueLine = 1; // `clock: ./lab.clock.yaml` in lab.wave.yaml (0-based)
    expect(open.diagnostics.find((d) => d.code === 'clock-invalid')!.range.start.line).toBe(clockValueLine);
    const closed = await client.diagnosticsFor(uriOf(closedWave), (p) => codesOf(p).includes('clock-invalid'), mark);
    expect(closed.version).toBeUndefined();
    // The disk still holds the good clock: the buffer is what the server read.
    expect(fs.readFileSync(ws.labClock, 'utf8')).toBe(clockText);

    const healed = client.published.length;
    client.change(clockUri, 3, clockText);
    await client.diagnosticsFor(waveUri, (p) => !codesOf(p).includes('clock-invalid'), healed);
    await client.diagnosticsFor(uriOf(closedWave), (p) => !codesOf(p).includes('clock-invalid'), healed);
    client.close(clockUri);
  });

  it('re-checks when the clock file changes on disk and the watcher reports it', async () => {
    const waveUri = uriOf(ws.lab);
    const mark = client.published.length;
    fs.writeFileSync(ws.labClock, brokenClock());
    client.notify('workspace/didChangeWatchedFiles', { changes: [{ uri: uriOf(ws.labClock), type: 2 }] });
    await client.diagnosticsFor(waveUri, (p) => codesOf(p).includes('clock-invalid'), mark);
    await client.diagnosticsFor(uriOf(closedWave), (p) => codesOf(p).includes('clock-invalid'), mark);

    const healed = client.published.length;
    fs.writeFileSync(ws.labClock, clockText);
    client.notify('workspace/didChangeWatchedFiles', { changes: [{ uri: uriOf(ws.labClock), type: 2 }] });
    await client.diagnosticsFor(waveUri, (p) => !codesOf(p).includes('clock-invalid'), healed);
  });

  it('re-checks the whole workspace on command, with work-done progress', async () => {
    const before = client.progress.length;
    const summary = await client.request<{ files: number; errors: number }>('workspace/executeCommand', { command: 'waveplan.recheckWorkspace', arguments: [] });
    // lab.wave.yaml, lab.clock.yaml, idle.wave.yaml and the demo's two files.
    expect(summary.files).toBeGreaterThanOrEqual(3);
    const kinds = client.progress.slice(before).map((p) => (p as { value: { kind: string } }).value.kind);
    expect(kinds[0]).toBe('begin');
    expect(kinds[kinds.length - 1]).toBe('end');
  });
});
