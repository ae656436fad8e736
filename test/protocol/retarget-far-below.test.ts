// Found by the fuzz harness (seed 20261203, case 3780 of a long run, after the edit "50 kHz" →
// "50mHz"): the quick fixes of a target far below everything the board reaches never came back,
// and the server stopped answering. The retarget fix probes targets down to 2^-40 of the target;
// there the divider scan's M/y reached 2^53, where j++ no longer moves a double, and its loop never
// ended. The board is invented; the expected neighbour is derived: the lowest jitter-free
// frequency is f_sys / (I max × N max) with one cycle, 100 MHz / (1024 × 2048) = 47.6837158203125 Hz.

import * as fs from 'node:fs';
import * as path from 'node:path';
import { describe, expect, it } from 'vitest';
import { uriOf, type LspDiagnostic } from '../support/lsp-client';
import { serverOnScratch } from './workspace';

const CLOCK = `system-clock: 100 MHz
divider:
  integer: { min: 2, max: 1024 }
dac:
  bits: 8
  sample-bytes: 1
  full-scale: 3.3 V
  max-sample-rate: 12.5 MHz
memory:
  budget: 16 KiB
  table-length: { min: 16, max: 2048 }
  power-of-two: true
`;

interface Action {
  title: string;
  edit: { changes: Record<string, { range: LspDiagnostic['range']; newText: string }[]> };
}

const server = serverOnScratch({}, (dir) => fs.writeFileSync(path.join(dir, 'ring.clock.yaml'), CLOCK));

describe('quick fixes for a target far below the board', () => {
  it('come back at once, and retarget up to the lowest reachable frequency', async () => {
    const uri = uriOf(path.join(server.ws.dir, 'slow.wave.yaml'));
    server.client.open(uri, 'clock: ./ring.clock.yaml\noutputs:\n  slow:\n    shape: sine\n    frequency: 50 mHz\n    tolerance: 0.1 %\n');
    const published = await server.client.diagnosticsFor(uri, (p) => p.version === 1);
    const d = published.diagnostics.find((x) => x.code === 'out-of-tolerance');
    expect(d, JSON.stringify(published.diagnostics.map((x) => x.code))).toBeDefined();
    const started = Date.now();
    const answer = server.client.request<Action[]>('textDocument/codeAction', { textDocument: { uri }, range: d!.range, context: { diagnostics: [d], only: ['quickfix'] } });
    const actions = await Promise.race([answer, new Promise<never>((_, reject) => setTimeout(() => reject(new Error('no answer in 20 s')), 20_000))]);
    expect(Date.now() - started).toBeLessThan(20_000);
    const up = actions.find((a) => /^Retarget \S+ \S+ to the nearest jitter-free frequency above/.test(a.title));
    expect(up, actions.map((a) => a.title).join('\n')).toBeDefined();
    expect(up!.edit.changes[uri][0].newText).toBe('47.6837158203125 Hz');
    // Nothing lies below: the board's lowest frequency is above the target.
    expect(actions.some((a) => a.title.includes('frequency below'))).toBe(false);
  }, 60_000);
});
