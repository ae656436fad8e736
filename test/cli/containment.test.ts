// Containment end to end, as CI runs the tool on a pull request: what a spec may read (regular
// files inside the workspace, size checked first) and what the writers may write (never through
// a link, never over an input of the run or a file waveplan did not write, never outside the
// chosen folder). Each case plants the hazard a hostile spec or repository could plant.

import { spawnSync } from 'node:child_process';
import * as fs from 'node:fs';
import * as path from 'node:path';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { BIN, buildChecker, ROOT, runCli, scratchDir } from '../support/cli';

const FIXTURES = path.join(ROOT, 'test', 'export', 'fixtures');
const CLOCK = fs.readFileSync(path.join(FIXTURES, 'tone-lab.clock.yaml'), 'utf8');
const WAVE = fs.readFileSync(path.join(FIXTURES, 'tone-lab.wave.yaml'), 'utf8');
const scratch: string[] = [];
/** `../` eight times, then etc/passwd: far enough up to leave any scratch folder. */
const PASSWD = `${'../'.repeat(8)}etc/passwd`;

beforeAll(() => buildChecker(), 60_000);
afterAll(() => {
  for (const dir of scratch) fs.rmSync(dir, { recursive: true, force: true });
});

/** A fresh workspace folder holding the tone-lab pair (no errors) under `ws/`. */
function workspace(): { top: string; ws: string } {
  const top = scratchDir('contain');
  scratch.push(top);
  const ws = path.join(top, 'ws');
  fs.mkdirSync(ws);
  fs.writeFileSync(path.join(ws, 'tone-lab.clock.yaml'), CLOCK);
  fs.writeFileSync(path.join(ws, 'tone-lab.wave.yaml'), WAVE);
  return { top, ws };
}

function waveReading(ws: string, clock: string, name = 'probe.wave.yaml'): string {
  const file = path.join(ws, name);
  fs.writeFileSync(file, `clock: ${clock}\noutputs:\n  tone:\n    shape: sine\n    frequency: 1 kHz\n`);
  return file;
}

function checkJson(ws: string, ...args: string[]) {
  const run = runCli(['check', ws, '--format', 'json', ...args], ws);
  return { run, report: run.stdout ? JSON.parse(run.stdout) : null };
}

function diagnosticsOf(report: { files: Array<{ path: string; diagnostics: Array<{ code: string; message: string; line: number; column: number }> }> }, name: string) {
  return report.files.find((f) => f.path.endsWith(name))!.diagnostics;
}

describe('a spec reads only regular files inside its workspace', () => {
  it('refuses clock: <up and out>/etc/passwd with a ranged finding on the clock: value', () => {
    const { ws } = workspace();
    waveReading(ws, PASSWD);
    const { run, report } = checkJson(ws);
    expect(run.code).toBe(1);
    const [d] = diagnosticsOf(report, 'probe.wave.yaml');
    expect(d).toMatchObject({ code: 'clock-unreadable', line: 1, column: 8 });
    expect(d.message).toContain('outside the workspace folder');
    // Nothing of the file's content is quoted back (a parsed file would be "clock-invalid").
    expect(run.stdout).not.toContain('root:');
  });

  it('refuses a symbolic link in the workspace that leads out of it, and says where it leads', () => {
    const { top, ws } = workspace();
    fs.writeFileSync(path.join(top, 'secret.clock.yaml'), CLOCK);
    fs.symlinkSync(path.join(top, 'secret.clock.yaml'), path.join(ws, 'linked.clock.yaml'));
    waveReading(ws, './linked.clock.yaml');
    const [d] = diagnosticsOf(checkJson(ws).report, 'probe.wave.yaml');
    expect(d.code).toBe('clock-unreadable');
    expect(d.message).toContain(`it resolves to ${fs.realpathSync(path.join(top, 'secret.clock.yaml'))}`);
  });

  it('follows a link that stays inside the workspace', () => {
    const { ws } = workspace();
    fs.symlinkSync('tone-lab.clock.yaml', path.join(ws, 'alias.clock.yaml'));
    waveReading(ws, './alias.clock.yaml');
    expect(diagnosticsOf(checkJson(ws).report, 'probe.wave.yaml')).toEqual([]);
  });

  it('answers at once for a clock: that names a FIFO, instead of waiting for a writer', () => {
    const { ws } = workspace();
    expect(spawnSync('mkfifo', [path.join(ws, 'pipe.clock.yaml')]).status).toBe(0);
    waveReading(ws, './pipe.clock.yaml');
    const started = Date.now();
    const { run, report } = checkJson(ws);
    expect(Date.now() - started).toBeLessThan(15_000);
    expect(run.code).toBe(1);
    const [d] = diagnosticsOf(report, 'probe.wave.yaml');
    expect(d.code).toBe('clock-unreadable');
    expect(d.message).toContain('FIFO (named pipe), not a regular file');
  });

  it('refuses a folder and a device named as the clock file', () => {
    const { ws } = workspace();
    fs.mkdirSync(path.join(ws, 'dir.clock.yaml'));
    waveReading(ws, './dir.clock.yaml', 'a.wave.yaml');
    waveReading(ws, '/dev/zero', 'b.wave.yaml');
    const { report } = checkJson(ws);
    expect(diagnosticsOf(report, 'a.wave.yaml')[0].message).toContain('it is a directory, not a regular file');
    expect(diagnosticsOf(report, 'b.wave.yaml')[0].message).toContain('outside the workspace folder');
  });

  it('names the real size of a 1 GiB file without reading it (a sparse file, 2^30 bytes)', () => {
    const { ws } = workspace();
    const big = path.join(ws, 'big.wave.yaml');
    fs.closeSync(fs.openSync(big, 'w'));
    fs.truncateSync(big, 2 ** 30);
    const { run, report } = checkJson(ws);
    expect(run.code).toBe(1);
    const [d] = diagnosticsOf(report, 'big.wave.yaml');
    expect(d).toMatchObject({ code: 'file-too-large', line: 1, column: 1 });
    expect(d.message).toContain('1.0 GiB (1073741824 bytes)');
  });

  it('reads a clock in a sibling folder only when --root names a workspace holding both', () => {
    const { top, ws } = workspace();
    const boards = path.join(top, 'boards');
    fs.mkdirSync(boards);
    waveReading(boards, '../ws/tone-lab.clock.yaml');
    expect(checkJson(boards).report.files[0].diagnostics[0].code).toBe('clock-unreadable');
    expect(checkJson(boards, '--root', top).report.files[0].diagnostics).toEqual([]);
  });
});

describe('writers never write through a link, over an input, or over a file they did not write', () => {
  it('check --output onto the clock file the checked spec reads is refused, and the clock is unchanged', () => {
    const { ws } = workspace();
    const other = path.join(ws, 'report.txt');
    fs.symlinkSync('tone-lab.clock.yaml', other);
    for (const target of [path.join(ws, 'tone-lab.clock.yaml'), other]) {
      const run = runCli(['check', path.join(ws, 'tone-lab.wave.yaml'), '--output', target], ws);
      expect(run.code).toBe(2);
      expect(run.stdout).not.toContain('passed');
      expect(run.stderr).toMatch(/^waveplan: nothing written: .*(never writes one|symbolic link)/);
    }
    // A hard link to the clock file under another name: the same file, still an input.
    const hard = path.join(ws, 'hard.txt');
    fs.linkSync(path.join(ws, 'tone-lab.clock.yaml'), hard);
    const run = runCli(['check', path.join(ws, 'tone-lab.wave.yaml'), '--output', hard, '--force'], ws);
    expect(run.stderr).toContain('is a file this run reads');
    expect(fs.readFileSync(path.join(ws, 'tone-lab.clock.yaml'), 'utf8')).toBe(CLOCK);
  });

  it('export --c refuses a link planted in the output folder and leaves its target alone', () => {
    const { top, ws } = workspace();
    const out = path.join(ws, 'generated');
    fs.mkdirSync(out);
    const victim = path.join(top, 'victim.txt');
    fs.writeFileSync(victim, 'precious\n');
    fs.symlinkSync(victim, path.join(out, 'tone_lab.h'));
    for (const force of [[], ['--force']]) {
      const run = runCli(['export', 'tone-lab.wave.yaml', '--c', 'generated', ...force], ws);
      expect(run.code).toBe(2);
      expect(run.stderr).toContain('generated/tone_lab.h is a symbolic link; waveplan never writes through links');
    }
    expect(fs.readFileSync(victim, 'utf8')).toBe('precious\n');
    // Nothing half-written either: the C file beside the refused header was not written.
    expect(fs.existsSync(path.join(out, 'tone_lab.c'))).toBe(false);
  });

  it('export --c refuses when the output folder itself is a planted link', () => {
    const { top, ws } = workspace();
    fs.mkdirSync(path.join(top, 'elsewhere'));
    fs.symlinkSync(path.join(top, 'elsewhere'), path.join(ws, 'generated'));
    const run = runCli(['export', 'tone-lab.wave.yaml', '--c', 'generated/'], ws);
    expect(run.code).toBe(2);
    expect(run.stderr).toContain('generated is a symbolic link');
    expect(fs.readdirSync(path.join(top, 'elsewhere'))).toEqual([]);
  });

  it('report --html and export --json refuse a spec that is not part of the run, even forced', () => {
    const { ws } = workspace();
    const bystander = path.join(ws, 'bystander.wave.yaml');
    fs.writeFileSync(bystander, WAVE);
    for (const args of [
      ['report', 'tone-lab.wave.yaml', '--html', 'bystander.wave.yaml'],
      ['export', 'tone-lab.wave.yaml', '--json', 'bystander.wave.yaml', '--force'],
    ]) {
      const run = runCli(args, ws);
      expect(run.code, args.join(' ')).toBe(2);
      expect(run.stderr).toContain('bystander.wave.yaml has the name of a spec file');
    }
    expect(fs.readFileSync(bystander, 'utf8')).toBe(WAVE);
  });

  it('a hand-written file with an export name is kept unless --force; a generated one is replaced', () => {
    const { ws } = workspace();
    fs.mkdirSync(path.join(ws, 'generated'));
    const header = path.join(ws, 'generated', 'tone_lab.h');
    fs.writeFileSync(header, '/* my own driver header */\n');
    fs.writeFileSync(path.join(ws, 'notes.html'), '<p>my notes</p>\n');
    fs.writeFileSync(path.join(ws, 'plans.json'), '{"mine": true}\n');
    fs.writeFileSync(path.join(ws, 'ci.txt'), 'hand-kept log\n');

    const refused = runCli(['export', 'tone-lab.wave.yaml', '--c', 'generated', '--json', 'plans.json'], ws);
    expect(refused.code).toBe(2);
    expect(refused.stderr).toContain('generated/tone_lab.h exists and was not written by waveplan');
    expect(refused.stderr).toContain('plans.json exists and was not written by waveplan');
    expect(fs.readFileSync(header, 'utf8')).toBe('/* my own driver header */\n');
    expect(runCli(['report', 'tone-lab.wave.yaml', '--html', 'notes.html'], ws).code).toBe(2);
    expect(runCli(['check', 'tone-lab.wave.yaml', '--output', 'ci.txt'], ws).code).toBe(2);
    expect(fs.readFileSync(path.join(ws, 'notes.html'), 'utf8')).toBe('<p>my notes</p>\n');
    expect(fs.readFileSync(path.join(ws, 'ci.txt'), 'utf8')).toBe('hand-kept log\n');

    expect(runCli(['export', 'tone-lab.wave.yaml', '--c', 'generated', '--json', 'plans.json', '--force'], ws).code).toBe(0);
    expect(fs.readFileSync(header, 'utf8')).toMatch(/^\/\*\n \* tone_lab\.h - generated by `waveplan export`/);
    expect(runCli(['report', 'tone-lab.wave.yaml', '--html', 'notes.html', '--force'], ws).code).toBe(0);
    // Each writer recognises its own files by their banner and replaces them without --force.
    expect(runCli(['export', 'tone-lab.wave.yaml', '--c', 'generated', '--json', 'plans.json'], ws).code).toBe(0);
    expect(runCli(['report', 'tone-lab.wave.yaml', '--html', 'notes.html'], ws).code).toBe(0);
    for (const format of ['text', 'json', 'sarif']) {
      const file = `check.${format}`;
      expect(runCli(['check', 'tone-lab.wave.yaml', '--format', format, '--output', file], ws).code, format).toBe(0);
      expect(runCli(['check', 'tone-lab.wave.yaml', '--format', format, '--output', file], ws).code, format).toBe(0);
    }
    // No temporary file is left beside the written ones.
    expect(fs.readdirSync(path.join(ws, 'generated')).sort()).toEqual(['tone_lab.c', 'tone_lab.h']);
  });

  it('refuses to write into a FIFO or a folder named as the output', () => {
    const { ws } = workspace();
    expect(spawnSync('mkfifo', [path.join(ws, 'out.txt')]).status).toBe(0);
    fs.mkdirSync(path.join(ws, 'out.json'));
    const fifo = spawnSync(process.execPath, [BIN, 'check', 'tone-lab.wave.yaml', '--output', 'out.txt', '--force'], { cwd: ws, encoding: 'utf8', timeout: 15_000 });
    expect(fifo.status).toBe(2);
    expect(fifo.stderr).toContain('out.txt is a FIFO (named pipe); waveplan writes only regular files');
    const dir = runCli(['check', 'tone-lab.wave.yaml', '--output', 'out.json', '--force'], ws);
    expect(dir.stderr).toContain('out.json is a directory');
  });
});
