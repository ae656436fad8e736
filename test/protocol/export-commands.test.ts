// C export and the HTML plan report through the built server (LSP 3.17 over stdio): the code
// lens on `outputs:`, workspace/executeCommand waveplan.exportC / waveplan.htmlReport. The files
// are checked against the CLI (`waveplan export --c`, `waveplan report --html`, run as users run
// it), against sha256 computed by node:crypto (FIPS 180-4), and against f_out = f_sys·M/(D·N).

import { createHash } from 'node:crypto';
import * as fs from 'node:fs';
import * as os from 'node:os';
import * as path from 'node:path';
import { parse } from 'yaml';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { hashTree, runCli } from '../support/cli';
import { ensureBuilt, LspClient, ROOT, uriOf } from '../support/lsp-client';
import { lineOf } from './workspace';

const EXPORT_FIXTURES = path.join(ROOT, 'test', 'export', 'fixtures');
const PROTOCOL_FIXTURES = path.join(ROOT, 'test', 'protocol', 'fixtures');

/** A scratch workspace: the tone-lab pair (no errors) and the lab pair (errors on purpose). */
function workspace(): string {
  const dir = fs.mkdtempSync(path.join(os.tmpdir(), 'waveplan-export-lsp-'));
  for (const name of ['tone-lab.wave.yaml', 'tone-lab.clock.yaml']) fs.copyFileSync(path.join(EXPORT_FIXTURES, name), path.join(dir, name));
  for (const name of ['lab.wave.yaml', 'lab.clock.yaml']) fs.copyFileSync(path.join(PROTOCOL_FIXTURES, name), path.join(dir, name));
  return dir;
}

interface CodeLens {
  range: { start: { line: number; character: number }; end: { line: number; character: number } };
  command?: { title: string; command: string; arguments?: unknown[] };
}

let client: LspClient;
let ws: string;
const scratch: string[] = [];
const file = (name: string) => path.join(ws, name);
const read = (name: string) => fs.readFileSync(file(name), 'utf8');

const lenses = (uri: string) => client.request<CodeLens[]>('textDocument/codeLens', { textDocument: { uri } });
const command = <R>(name: string, ...args: unknown[]) => client.request<R>('workspace/executeCommand', { command: name, arguments: args });

/** Runs the CLI in a fresh copy of the workspace whose disk holds `texts` (name → text). */
function cliCopy(texts: Record<string, string>): string {
  const dir = fs.mkdtempSync(path.join(os.tmpdir(), 'waveplan-export-cli-'));
  scratch.push(dir);
  for (const [name, text] of Object.entries(texts)) fs.writeFileSync(path.join(dir, name), text);
  return dir;
}

beforeAll(async () => {
  ensureBuilt();
  ws = workspace();
  client = await LspClient.start({ folders: [ws] });
  for (const name of ['tone-lab.wave.yaml', 'lab.wave.yaml', 'lab.clock.yaml']) client.open(uriOf(file(name)), read(name));
  await client.diagnosticsFor(uriOf(file('tone-lab.wave.yaml')));
});

afterAll(async () => {
  await client?.stop();
  for (const dir of [ws, ...scratch]) if (dir) fs.rmSync(dir, { recursive: true, force: true });
});

describe('capabilities and manifest', () => {
  it('advertises code lenses and both commands; the lens commands are the client’s, contributed in package.json', async () => {
    // LSP 3.17 §initialize: a second initialize is still answered with the capabilities object. It
    // resets what the server knows of its client, so it goes to a server of its own.
    const other = await LspClient.start();
    const result = await other
      .request<{ capabilities: Record<string, any> }>('initialize', { processId: null, rootUri: null, capabilities: {} })
      .finally(() => other.stop());
    expect(result.capabilities.codeLensProvider).toBeTruthy();
    expect(result.capabilities.executeCommandProvider.commands).toEqual(expect.arrayContaining(['waveplan.exportC', 'waveplan.htmlReport']));
    // VS Code extension manifest, contributes.commands: palette commands are declared with a category.
    const manifest = JSON.parse(fs.readFileSync(path.join(ROOT, 'package.json'), 'utf8'));
    const declared = manifest.contributes.commands as Array<{ command: string; category: string; title: string }>;
    for (const id of ['waveplan.exportCForFile', 'waveplan.openReport'])
      expect(declared.find((c) => c.command === id)).toMatchObject({ category: 'waveplan' });
    expect(declared.find((c) => c.command === 'waveplan.openReport')?.title).toBe('Open plan report');
    // vscode-languageclient registers every server command under the server's id, so the client's
    // own UI commands (which the lenses run) must have other ids.
    const serverIds: string[] = result.capabilities.executeCommandProvider.commands;
    for (const id of ['waveplan.exportCForFile', 'waveplan.openReport']) expect(serverIds).not.toContain(id);
  });
});

describe('code lens', () => {
  it('puts "Export C to generated/" and "Open plan report" on the outputs: line of a wave spec', async () => {
    const uri = uriOf(file('tone-lab.wave.yaml'));
    const got = await lenses(uri);
    // LSP 3.17 §textDocument/codeLens: a CodeLens is a range plus a Command { title, command, arguments }.
    const line = lineOf(read('tone-lab.wave.yaml'), 'outputs:');
    expect(got.map((l) => [l.range.start.line, l.range.start.character, l.range.end.character])).toEqual([
      [line, 0, 'outputs'.length],
      [line, 0, 'outputs'.length],
    ]);
    expect(got.map((l) => l.command)).toEqual([
      { title: 'Export C to generated/', command: 'waveplan.exportCForFile', arguments: [uri] },
      { title: 'Open plan report', command: 'waveplan.openReport', arguments: [uri] },
    ]);
  });

  it('gives none for a clock file, nor for a wave spec without an outputs: key', async () => {
    expect(await lenses(uriOf(file('lab.clock.yaml')))).toEqual([]);
    const bare = uriOf(file('bare.wave.yaml'));
    client.open(bare, 'clock: ./lab.clock.yaml\n# outputs: not yet written\n');
    expect(await lenses(bare)).toEqual([]);
    client.close(bare);
  });

  it('names the folder of the waveplan.export.directory setting, re-read after a configuration change', async () => {
    client.settings = { export: { directory: 'firmware/waves/' } };
    client.notify('workspace/didChangeConfiguration', { settings: null });
    const got = await lenses(uriOf(file('tone-lab.wave.yaml')));
    expect(got[0].command?.title).toBe('Export C to firmware/waves/');
  });
});

describe('code lens when the export would refuse', () => {
  // The lens and waveplan.exportC read one decision (server/src/export/refusal.ts): what the
  // command refuses, the lens names instead of offering it.
  it('names the error count and the first finding on a spec with errors, and runs nothing', async () => {
    const uri = uriOf(file('lab.wave.yaml'));
    const published = await client.diagnosticsFor(uri);
    const errors = published.diagnostics.filter((d) => d.severity === 1);
    expect(errors.length).toBeGreaterThan(0);
    const got = await lenses(uri);
    const first = errors.sort((a, b) => a.range.start.line - b.range.start.line || a.range.start.character - b.range.start.character)[0];
    expect(got[0].command?.command).toBe('');
    expect(got[0].command?.title).toMatch(/^C export blocked: \d+ errors? — first: line \d+, [a-z-]+$/);
    const [, count, line, code] = /blocked: (\d+) errors? — first: line (\d+), ([a-z-]+)$/.exec(got[0].command!.title)!;
    expect(Number(count)).toBe(errors.length);
    // The command's refusal names the same first finding (path:line:col: error code …).
    const answer = await command<{ error: string }>('waveplan.exportC', uri);
    expect(answer.error).toContain(`lab.wave.yaml:${line}:`);
    expect(answer.error).toContain(` error ${code} `);
    expect(got[1].command).toEqual({ title: 'Open plan report', command: 'waveplan.openReport', arguments: [uri] });
  });

  it('turns back into the export action once the edit clears the errors, and blocked again when one returns', async () => {
    const uri = uriOf(file('tone-lab.wave.yaml'));
    const good = read('tone-lab.wave.yaml');
    const broken = good.replace(/frequency: 93\.75 kHz/, 'frequency: 93.75 parsecs');
    expect(broken).not.toBe(good);
    client.change(uri, 50, broken);
    await client.diagnosticsFor(uri, (p) => p.version === 50);
    expect((await lenses(uri))[0].command).toMatchObject({ command: '', title: expect.stringMatching(/^C export blocked: 1 error — first: line \d+, /) });
    client.change(uri, 51, good);
    await client.diagnosticsFor(uri, (p) => p.version === 51);
    expect((await lenses(uri))[0].command).toEqual({ title: expect.stringMatching(/^Export C to /), command: 'waveplan.exportCForFile', arguments: [uri] });
  });

  it('names the unreadable clock file as the first finding when `clock:` leads nowhere', async () => {
    const uri = uriOf(file('orphan.wave.yaml'));
    client.open(uri, 'clock: ./missing.clock.yaml\noutputs:\n  tone:\n    frequency: 1 kHz\n');
    const published = await client.diagnosticsFor(uri);
    // Two errors: the clock file cannot be read (line 1) and the output has no shape (line 3).
    expect(published.diagnostics.filter((d) => d.severity === 1).map((d) => [d.range.start.line, d.code]).sort()).toEqual([
      [0, 'clock-unreadable'],
      [2, 'missing-key'],
    ]);
    const got = await lenses(uri);
    expect(got[0].command).toEqual({ title: 'C export blocked: 2 errors — first: line 1, clock-unreadable', command: '' });
    client.close(uri);
  });
});

describe('waveplan.exportC', () => {
  it('writes the header and C file into the configured folder, byte for byte what `waveplan export --c` writes', async () => {
    client.settings = { export: { directory: 'firmware/waves' } };
    client.notify('workspace/didChangeConfiguration', { settings: null });
    const uri = uriOf(file('tone-lab.wave.yaml'));
    const answer = await command<{ written: string[] }>('waveplan.exportC', uri);
    const folder = file('firmware/waves');
    expect(answer).toEqual({ written: [path.join(folder, 'tone_lab.h'), path.join(folder, 'tone_lab.c')] });

    // The oracle: the CLI run in a copy of the workspace, from the workspace folder.
    const cli = cliCopy({ 'tone-lab.wave.yaml': read('tone-lab.wave.yaml'), 'tone-lab.clock.yaml': read('tone-lab.clock.yaml') });
    const run = runCli(['export', 'tone-lab.wave.yaml', '--c', 'firmware/waves'], cli);
    expect(run.stderr).toBe('');
    expect(run.code).toBe(0);
    for (const name of ['tone_lab.h', 'tone_lab.c'])
      expect(fs.readFileSync(path.join(folder, name)).equals(fs.readFileSync(path.join(cli, 'firmware/waves', name))), name).toBe(true);
  });

  it('uses the unsaved text of the spec and of its clock file, and leaves both files on disk alone', async () => {
    client.settings = {};
    client.notify('workspace/didChangeConfiguration', { settings: null });
    const waveUri = uriOf(file('tone-lab.wave.yaml'));
    const clockUri = uriOf(file('tone-lab.clock.yaml'));
    const spec = read('tone-lab.wave.yaml').replace('frequency: 93.75 kHz', 'frequency: 187.5 kHz');
    const clock = read('tone-lab.clock.yaml').replace('system-clock: 96 MHz', 'system-clock: 192 MHz');
    expect(spec).not.toBe(read('tone-lab.wave.yaml'));
    expect(clock).not.toBe(read('tone-lab.clock.yaml'));
    const before = hashTree(ws);
    client.change(waveUri, 2, spec);
    client.open(clockUri, clock);
    const answer = await command<{ written: string[] }>('waveplan.exportC', waveUri).finally(() => client.close(clockUri));
    expect(answer.written).toEqual([file('generated/tone_lab.h'), file('generated/tone_lab.c')]);
    const after = hashTree(ws);
    for (const name of ['tone-lab.wave.yaml', 'tone-lab.clock.yaml']) expect(after[name], name).toBe(before[name]);

    const header = fs.readFileSync(file('generated/tone_lab.h'), 'utf8');
    // FIPS 180-4 sha256 by node:crypto, over spec text, a NUL byte and clock text (the header's own wording).
    const expected = createHash('sha256').update(spec).update('\0').update(clock).digest('hex');
    expect(header).toContain(`sha256: ${expected}`);
    // f_out = f_sys·M/(D·N) (docs/DESIGN.md "Quantities"; the table-playback relation, derived): with the
    // edited 192 MHz clock and 187.5 kHz target, the header's I, N, M must satisfy it exactly.
    // (derived by hand: 192 MHz / 187.5 kHz = 1024 = D·N/M, so e.g. D = 16, N = 64, M = 1.)
    const define = (name: string) => BigInt(new RegExp(`#define TONE_LAB_PILOT_${name}\\s+(\\d+)u`).exec(header)![1]);
    expect(define('DIVIDER_FRAC')).toBe(0n);
    expect(192_000_000n * define('CYCLES') * 2n).toBe(define('DIVIDER_INT') * define('TABLE_LENGTH') * 375_000n);

    // And byte for byte what the CLI writes when the edited texts are on disk.
    const cli = cliCopy({ 'tone-lab.wave.yaml': spec, 'tone-lab.clock.yaml': clock });
    const run = runCli(['export', 'tone-lab.wave.yaml', '--c', 'generated'], cli);
    expect(run.code, run.stderr).toBe(0);
    for (const name of ['tone_lab.h', 'tone_lab.c'])
      expect(fs.readFileSync(file(`generated/${name}`)).equals(fs.readFileSync(path.join(cli, 'generated', name))), name).toBe(true);
  });

  it('refuses a spec with errors and writes nothing, as the CLI does', async () => {
    const before = hashTree(ws);
    const answer = await command<{ error: string }>('waveplan.exportC', uriOf(file('lab.wave.yaml')));
    expect(answer.error).toMatch(/^nothing exported: lab\.wave\.yaml has \d+ errors?; fix them first\. First: lab\.wave\.yaml:\d+:\d+: error /);
    expect(hashTree(ws)).toEqual(before);
    // The CLI on the same spec: exit 1 and no files (`waveplan export --help`: 1 = the specs have errors).
    const cli = cliCopy({ 'lab.wave.yaml': read('lab.wave.yaml'), 'lab.clock.yaml': read('lab.clock.yaml') });
    const run = runCli(['export', 'lab.wave.yaml', '--c', 'generated'], cli);
    expect(run.code).toBe(1);
    expect(fs.existsSync(path.join(cli, 'generated'))).toBe(false);
  });

  it('answers a write failure as an error: the configured folder is a file', async () => {
    client.settings = { export: { directory: 'tone-lab.clock.yaml' } };
    client.notify('workspace/didChangeConfiguration', { settings: null });
    const before = hashTree(ws);
    const answer = await command<{ error: string }>('waveplan.exportC', uriOf(file('tone-lab.wave.yaml')));
    expect(answer.error).toBe('nothing exported: tone-lab.clock.yaml is a file, not a folder');
    expect(hashTree(ws)).toEqual(before);
    client.settings = {};
    client.notify('workspace/didChangeConfiguration', { settings: null });
  });

  it('refuses a folder setting that leads out of the workspace, and a link planted in the folder', async () => {
    const outside = fs.mkdtempSync(path.join(os.tmpdir(), 'waveplan-outside-'));
    scratch.push(outside);
    const before = hashTree(ws);
    const uri = uriOf(file('tone-lab.wave.yaml'));
    client.settings = { export: { directory: path.relative(ws, outside) } };
    client.notify('workspace/didChangeConfiguration', { settings: null });
    const away = await command<{ error: string }>('waveplan.exportC', uri);
    expect(away.error).toMatch(/^nothing exported: the folder .* is outside the workspace folder \.; waveplan writes only inside it$/);
    expect(fs.readdirSync(outside)).toEqual([]);

    const victim = path.join(outside, 'victim.h');
    fs.writeFileSync(victim, 'precious\n');
    fs.mkdirSync(file('planted'));
    fs.symlinkSync(victim, file('planted/tone_lab.h'));
    client.settings = { export: { directory: 'planted' } };
    client.notify('workspace/didChangeConfiguration', { settings: null });
    const linked = await command<{ error: string }>('waveplan.exportC', uri);
    expect(linked.error).toBe('nothing exported: planted/tone_lab.h is a symbolic link; waveplan never writes through links');
    expect(fs.readFileSync(victim, 'utf8')).toBe('precious\n');
    fs.rmSync(file('planted'), { recursive: true });
    expect(hashTree(ws)).toEqual(before);
    client.settings = {};
    client.notify('workspace/didChangeConfiguration', { settings: null });
  });

  it('answers a clear error, never a crash, for a clock file, a non-file URI, a missing file or no argument', async () => {
    const cases: Array<[unknown[], RegExp]> = [
      [[uriOf(file('lab.clock.yaml'))], /lab\.clock\.yaml is not a wave spec/],
      [['untitled:Untitled-1'], /is not a file on disk/],
      [[uriOf(file('gone.wave.yaml'))], /cannot read .*gone\.wave\.yaml/],
      [[], /needs the URI of a wave spec/],
      [[42], /needs the URI of a wave spec/],
    ];
    for (const [args, message] of cases) {
      const answer = await command<{ error: string }>('waveplan.exportC', ...args);
      expect(answer.error, JSON.stringify(args)).toMatch(message);
    }
    expect(client.alive).toBe(true);
  });
});

describe('waveplan.htmlReport', () => {
  it('returns the page `waveplan report --html` writes, naming every output, with SVG pictures as data: images', async () => {
    const uri = uriOf(file('tone-lab.wave.yaml'));
    const disk = read('tone-lab.wave.yaml');
    client.change(uri, 3, disk);
    const answer = await command<{ html: string }>('waveplan.htmlReport', uri);
    // The output names, read from the fixture by the yaml library (YAML 1.2 parser) rather than by us.
    const names = Object.keys(parse(disk).outputs);
    expect(names).toEqual(['pilot', 'gate', 'ramp', 'tri', 'odd-tone']);
    for (const name of names) expect(answer.html).toContain(name);
    // RFC 2397 data: URLs carrying image/svg+xml, base64.
    expect(answer.html).toMatch(/src="data:image\/svg\+xml;base64,/);
    expect(answer.html).toContain(`default-src 'none'`);

    const cli = cliCopy({ 'tone-lab.wave.yaml': disk, 'tone-lab.clock.yaml': read('tone-lab.clock.yaml') });
    const run = runCli(['report', 'tone-lab.wave.yaml', '--html', 'report.html'], cli);
    expect(run.code, run.stderr).toBe(0);
    expect(answer.html).toBe(fs.readFileSync(path.join(cli, 'report.html'), 'utf8'));
  });

  it('shows a spec with errors too (its findings are the point), and refuses a clock file', async () => {
    const answer = await command<{ html: string }>('waveplan.htmlReport', uriOf(file('lab.wave.yaml')));
    for (const name of Object.keys(parse(read('lab.wave.yaml')).outputs)) expect(answer.html).toContain(name);
    expect(answer.html).toContain('<b>error</b>');
    const clock = await command<{ error: string }>('waveplan.htmlReport', uriOf(file('lab.clock.yaml')));
    expect(clock.error).toMatch(/not a wave spec/);
  });
});
