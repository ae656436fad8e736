// `sample-file:` through the checker as CI runs it: the file is read as the `clock:` reference is
// (regular files inside the workspace after resolving links, size checked before reading), its
// problems are findings on the `sample-file:` value, and a good file gives a plan whose table
// plays the file sample for sample (N = the file's K values, M = 1).

import { spawnSync } from 'node:child_process';
import * as fs from 'node:fs';
import * as path from 'node:path';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { buildChecker, ROOT, runCli, scratchDir } from '../support/cli';

const CLOCK = fs.readFileSync(path.join(ROOT, 'test', 'export', 'fixtures', 'tone-lab.clock.yaml'), 'utf8');
const scratch: string[] = [];

beforeAll(() => buildChecker(), 60_000);
afterAll(() => {
  for (const dir of scratch) fs.rmSync(dir, { recursive: true, force: true });
});

/** 64 values of one cycle: a sine with a third harmonic, as text. */
const cycle = (format: (i: number, v: number) => string, eol = '\n'): string =>
  Array.from({ length: 64 }, (_, i) => format(i, Math.sin((2 * Math.PI * i) / 64) + 0.25 * Math.sin((6 * Math.PI * i) / 64))).join(eol) + eol;

/** A workspace `ws/` (inside `top/`) with the tone-lab clock and a spec whose output reads `file`. */
function workspace(file: string): { top: string; ws: string } {
  const top = scratchDir('samples');
  scratch.push(top);
  const ws = path.join(top, 'ws');
  fs.mkdirSync(ws);
  fs.writeFileSync(path.join(ws, 'tone-lab.clock.yaml'), CLOCK);
  // 96 MHz / 16 = 6 MHz, 64 samples of one cycle: 93.75 kHz exactly.
  fs.writeFileSync(path.join(ws, 'probe.wave.yaml'), `clock: ./tone-lab.clock.yaml\noutputs:\n  tone:\n    shape: sine\n    frequency: 93.75 kHz\n    sample-file: ${file}\n`);
  return { top, ws };
}

interface Finding {
  code: string;
  message: string;
  line: number;
  column: number;
}

function check(ws: string) {
  const run = runCli(['check', ws, '--format', 'json'], ws);
  const report = JSON.parse(run.stdout) as { files: Array<{ path: string; diagnostics: Finding[]; outputs: Array<{ plan?: { tableLength: number; cycles: string | number; thdPercent?: number } }> }> };
  const probe = report.files.find((f) => f.path.endsWith('probe.wave.yaml'))!;
  return { run, probe };
}

// `    sample-file: ` is 17 characters: the value starts in column 18 (1-based) of line 6.
const AT_VALUE = { line: 6, column: 18 };

describe('sample-file: in waveplan check', () => {
  it.each([
    ['one value a line, comments and blank lines', (ws: string) => fs.writeFileSync(path.join(ws, 'c.txt'), `# one cycle\n\n${cycle((_, v) => v.toFixed(6))}\n# end\n`), './c.txt'],
    ['CSV with a header and CRLF line ends', (ws: string) => fs.writeFileSync(path.join(ws, 'c.csv'), `index,volts\r\n${cycle((i, v) => `${i},${v.toFixed(6)}`, '\r\n')}`), './c.csv'],
    ['semicolon columns in a subfolder', (ws: string) => {
      fs.mkdirSync(path.join(ws, 'cycles'));
      fs.writeFileSync(path.join(ws, 'cycles', 'c.csv'), cycle((i, v) => `${i};${v.toFixed(6)}`));
    }, './cycles/c.csv'],
  ])('%s: passes, N = 64 values, M = 1, THD 25 % (derived: the third harmonic at 0.25)', (_name, write, file) => {
    const { ws } = workspace(file);
    write(ws);
    const { run, probe } = check(ws);
    expect(probe.diagnostics).toEqual([]);
    expect(run.code).toBe(0);
    const plan = probe.outputs[0]!.plan!;
    expect(plan.tableLength).toBe(64);
    expect(Number(plan.cycles)).toBe(1);
    expect(Math.abs(plan.thdPercent! - 25)).toBeLessThan(0.5);
  });

  it('a value that is not a number: sample-file-invalid on the value, naming the line of the file', () => {
    const { ws } = workspace('./c.csv');
    fs.writeFileSync(path.join(ws, 'c.csv'), 'v\n0\n1\n0\n-1\n1,5\nlow\n');
    const { run, probe } = check(ws);
    expect(run.code).toBe(1);
    expect(probe.diagnostics).toHaveLength(1);
    expect(probe.diagnostics[0]).toMatchObject({ code: 'sample-file-invalid', ...AT_VALUE });
    expect(probe.diagnostics[0]!.message).toContain('line 7 is not a number: "low"');
  });

  it('a cycle whose last value repeats its first: seam-glitch on the value, planned all the same', () => {
    const { ws } = workspace('./c.txt');
    fs.writeFileSync(path.join(ws, 'c.txt'), `${cycle((_, v) => v.toFixed(6))}0\n`);
    const { probe } = check(ws);
    expect(probe.diagnostics.map((d) => d.code)).toEqual(['seam-glitch']);
    expect(probe.diagnostics[0]).toMatchObject(AT_VALUE);
    expect(probe.diagnostics[0]!.message).toContain('repeats its first');
  });
});

describe('sample-file: reads only regular files inside the workspace', () => {
  const refused = (ws: string): Finding => {
    const started = Date.now();
    const { run, probe } = check(ws);
    // A FIFO must not hang the checker until something writes to it.
    expect(Date.now() - started).toBeLessThan(15_000);
    expect(run.code).toBe(1);
    expect(probe.diagnostics).toHaveLength(1);
    expect(probe.diagnostics[0]).toMatchObject({ code: 'sample-file-unreadable', ...AT_VALUE });
    return probe.diagnostics[0]!;
  };

  it('../ out of the workspace, though the file exists there', () => {
    const { top, ws } = workspace('../outside.csv');
    fs.writeFileSync(path.join(top, 'outside.csv'), cycle((_, v) => String(v)));
    expect(refused(ws).message).toContain('outside the workspace folder');
  });

  it('an absolute path outside it', () => {
    const { ws } = workspace('/etc/hostname');
    const d = refused(ws);
    expect(d.message).toContain('outside the workspace folder');
  });

  it('a symbolic link inside that leads out, with where it leads', () => {
    const { top, ws } = workspace('./linked.csv');
    fs.writeFileSync(path.join(top, 'secret.csv'), cycle((_, v) => String(v)));
    fs.symlinkSync(path.join(top, 'secret.csv'), path.join(ws, 'linked.csv'));
    expect(refused(ws).message).toContain(`it resolves to ${fs.realpathSync(path.join(top, 'secret.csv'))}`);
  });

  it('a link that stays inside is followed', () => {
    const { ws } = workspace('./alias.csv');
    fs.writeFileSync(path.join(ws, 'real.csv'), cycle((_, v) => String(v)));
    fs.symlinkSync('real.csv', path.join(ws, 'alias.csv'));
    expect(check(ws).probe.diagnostics).toEqual([]);
  });

  it('a FIFO answers at once', () => {
    const { ws } = workspace('./pipe.csv');
    expect(spawnSync('mkfifo', [path.join(ws, 'pipe.csv')]).status).toBe(0);
    expect(refused(ws).message).toContain('FIFO (named pipe), not a regular file');
  });

  it('a directory', () => {
    const { ws } = workspace('./cycles');
    fs.mkdirSync(path.join(ws, 'cycles'));
    expect(refused(ws).message).toContain('it is a directory, not a regular file');
  });

  it('a file above the limit, by its size, without reading it (a sparse 1 GiB file)', () => {
    const { ws } = workspace('./big.csv');
    const big = path.join(ws, 'big.csv');
    fs.closeSync(fs.openSync(big, 'w'));
    fs.truncateSync(big, 2 ** 30);
    expect(refused(ws).message).toContain('1.0 GiB (1073741824 bytes), more than waveplan reads from one file');
  });

  it('a missing file', () => {
    const { ws } = workspace('./none.csv');
    expect(refused(ws).message).toBe('Cannot read the sample file ./none.csv: no such file.');
  });
});
