// What the language server lets a spec read (spec/containment.ts): regular files inside the
// workspace folders, after resolving symbolic links. A repository opened in the editor is as
// untrusted as a pull request in CI; its specs must not read the rest of the machine.

import { spawnSync } from 'node:child_process';
import * as fs from 'node:fs';
import * as path from 'node:path';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { ensureBuilt, LspClient, uriOf } from '../support/lsp-client';
import { scratchCopy } from './workspace';

let client: LspClient;
let ws: ReturnType<typeof scratchCopy>;
let outside: string;
/** `../` eight times, then etc/passwd: far enough up to leave any scratch folder. */
const PASSWD = `${'../'.repeat(8)}etc/passwd`;

beforeAll(async () => {
  ensureBuilt();
  ws = scratchCopy();
  outside = fs.mkdtempSync(path.join(path.dirname(ws.dir), 'waveplan-outside-'));
  fs.copyFileSync(path.join(ws.dir, 'lab.clock.yaml'), path.join(outside, 'lab.clock.yaml'));
  client = await LspClient.start({ folders: [ws.dir] });
});

afterAll(async () => {
  await client?.stop();
  ws?.remove();
  fs.rmSync(outside, { recursive: true, force: true });
});

const wave = (clock: string) => `clock: ${clock}\noutputs:\n  tone:\n    shape: sine\n    frequency: 1 kHz\n`;

async function clockFinding(name: string, clock: string) {
  const uri = uriOf(path.join(ws.dir, name));
  client.open(uri, wave(clock));
  const published = await client.diagnosticsFor(uri);
  client.close(uri);
  return published.diagnostics;
}

describe('reads inside the workspace only', () => {
  it('refuses clock: <up and out>/etc/passwd on the clock: value', async () => {
    const [d, ...rest] = await clockFinding('passwd.wave.yaml', PASSWD);
    expect(rest).toEqual([]);
    expect(d.code).toBe('clock-unreadable');
    expect(d.range).toEqual({ start: { line: 0, character: 7 }, end: { line: 0, character: 7 + PASSWD.length } });
    expect(d.message).toContain('outside the workspace folder');
  });

  it('refuses a valid clock file outside the workspace, directly and through a link inside it', async () => {
    const direct = await clockFinding('direct.wave.yaml', path.join(outside, 'lab.clock.yaml'));
    expect(direct.map((d) => d.code)).toEqual(['clock-unreadable']);
    fs.symlinkSync(path.join(outside, 'lab.clock.yaml'), path.join(ws.dir, 'linked.clock.yaml'));
    const linked = await clockFinding('linked.wave.yaml', './linked.clock.yaml');
    expect(linked.map((d) => d.code)).toEqual(['clock-unreadable']);
    expect(linked[0].message).toContain('it resolves to');
  });

  it('answers a clock: naming a FIFO at once, and keeps serving', async () => {
    expect(spawnSync('mkfifo', [path.join(ws.dir, 'pipe.clock.yaml')]).status).toBe(0);
    const [d] = await clockFinding('pipe.wave.yaml', './pipe.clock.yaml');
    expect(d.message).toContain('FIFO (named pipe), not a regular file');
    // The clock file beside it still reads (the 1 kHz tone is below what the small lab box plans).
    const fine = await clockFinding('fine.wave.yaml', './lab.clock.yaml');
    expect(fine.map((d) => String(d.code)).filter((c) => c.startsWith('clock-'))).toEqual([]);
  });
});
