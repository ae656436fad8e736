// A sample file's change on disk re-checks the wave specs that read it: the server asks the client
// to watch the file once an analysis has read it (or the startup scan found it named), and a
// reported change refreshes the diagnostics of the open spec and of closed ones.

import * as fs from 'node:fs';
import * as path from 'node:path';
import { describe, expect, it } from 'vitest';
import { uriOf } from '../support/lsp-client';
import { lineOf, serverOnScratch } from './workspace';

// 120 MHz / 6 = 20 MHz, 200 samples of one cycle: 100 kHz (the lab box of lab.clock.yaml).
const SPEC = 'clock: ./lab.clock.yaml\noutputs:\n  shaped:\n    shape: sine\n    frequency: 100 kHz\n    tolerance: 10 ppm\n    sample-file: ./cycle.csv\n';
const GOOD = Array.from({ length: 200 }, (_, i) => (Math.sin((2 * Math.PI * i) / 200) + 0.2 * Math.sin((10 * Math.PI * i) / 200)).toFixed(6)).join('\n') + '\n';
const BROKEN = GOOD.replace(/\n([^\n]*)\n([^\n]*)\n/, '\n$1\nsix\n');

const s = serverOnScratch({}, (dir) => {
  fs.writeFileSync(path.join(dir, 'shaped.wave.yaml'), SPEC);
  fs.writeFileSync(path.join(dir, 'cycle.csv'), GOOD);
  // A spec that stays closed and is never analysed before its sample file changes.
  fs.writeFileSync(path.join(dir, 'quiet.wave.yaml'), SPEC.replace('./cycle.csv', './quiet.csv'));
  fs.writeFileSync(path.join(dir, 'quiet.csv'), GOOD);
});

const codesOf = (p: { diagnostics: { code?: string | number }[] }) => p.diagnostics.map((d) => String(d.code));

describe('sample file dependencies', () => {
  it('watches the sample file and re-checks the open spec when it changes on disk', async () => {
    const { client, ws } = s;
    const spec = path.join(ws.dir, 'shaped.wave.yaml');
    const csv = path.join(ws.dir, 'cycle.csv');
    const uri = uriOf(spec);
    client.open(uri, SPEC);
    const first = await client.diagnosticsFor(uri);
    expect(first.diagnostics).toEqual([]);
    // The server asked for a watcher on the sample file by its name.
    await client.waitFor(() => (JSON.stringify(client.registrations).includes('cycle.csv') ? true : undefined), 'sample file watcher');

    const mark = client.published.length;
    fs.writeFileSync(csv, BROKEN);
    client.notify('workspace/didChangeWatchedFiles', { changes: [{ uri: uriOf(csv), type: 2 }] });
    const broken = await client.diagnosticsFor(uri, (p) => codesOf(p).includes('sample-file-invalid'), mark);
    const d = broken.diagnostics.find((x) => x.code === 'sample-file-invalid')!;
    expect(d.range.start.line).toBe(lineOf(SPEC, 'sample-file:'));
    expect(d.range.start.character).toBe('    sample-file: '.length);
    expect(d.message).toContain('line 3 is not a number: "six"');

    const healed = client.published.length;
    fs.writeFileSync(csv, GOOD);
    client.notify('workspace/didChangeWatchedFiles', { changes: [{ uri: uriOf(csv), type: 2 }] });
    await client.diagnosticsFor(uri, (p) => p.diagnostics.length === 0, healed);

    // Deleted: the spec says it cannot read the file.
    const gone = client.published.length;
    fs.rmSync(csv);
    client.notify('workspace/didChangeWatchedFiles', { changes: [{ uri: uriOf(csv), type: 3 }] });
    await client.diagnosticsFor(uri, (p) => codesOf(p).includes('sample-file-unreadable'), gone);
    fs.writeFileSync(csv, GOOD);
    client.notify('workspace/didChangeWatchedFiles', { changes: [{ uri: uriOf(csv), type: 1 }] });
    client.close(uri);
  });

  it('re-checks a closed spec that reads it', async () => {
    const { client, ws } = s;
    const spec = path.join(ws.dir, 'shaped.wave.yaml');
    const csv = path.join(ws.dir, 'cycle.csv');
    // Closing published the disk analysis of the spec (so the server knows what it reads).
    await client.diagnosticsFor(uriOf(spec), (p) => p.version === undefined && p.diagnostics.length === 0);
    const mark = client.published.length;
    fs.writeFileSync(csv, BROKEN);
    client.notify('workspace/didChangeWatchedFiles', { changes: [{ uri: uriOf(csv), type: 2 }] });
    const closed = await client.diagnosticsFor(uriOf(spec), (p) => codesOf(p).includes('sample-file-invalid'), mark);
    expect(closed.version).toBeUndefined();
  });

  it('re-checks a closed spec never analysed: the startup scan found its sample-file', async () => {
    const { client, ws } = s;
    const spec = path.join(ws.dir, 'quiet.wave.yaml');
    const csv = path.join(ws.dir, 'quiet.csv');
    await client.waitFor(() => (JSON.stringify(client.registrations).includes('quiet.csv') ? true : undefined), 'watcher of the scanned sample file');
    const mark = client.published.length;
    fs.writeFileSync(csv, BROKEN);
    client.notify('workspace/didChangeWatchedFiles', { changes: [{ uri: uriOf(csv), type: 2 }] });
    const closed = await client.diagnosticsFor(uriOf(spec), (p) => codesOf(p).includes('sample-file-invalid'), mark);
    expect(closed.version).toBeUndefined();
  });
});
