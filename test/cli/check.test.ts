// `waveplan check` end to end: the bundled checker spawned as `node bin/waveplan.js`, on the demo
// (examples/) and on the fixtures under test/cli/fixtures/.
// Golden files live in test/cli/golden/; regenerate them with
//   UPDATE_GOLDEN=1 npx vitest run test/cli
// and review the diff before committing; then `node scripts/update-readme-demo.mjs` refreshes the
// README's demo block. test/cli/golden-figures.test.ts checks the golden plans independently.

import * as fs from 'node:fs';
import * as path from 'node:path';
import Fraction from 'fraction.js';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { BIN, buildChecker, golden, hashTree, initializeOverStdio, ROOT, runCli, scratchDir, validateSarif } from '../support/cli';

const EXAMPLES = path.join(ROOT, 'examples');
const FIXTURES = path.join(ROOT, 'test/cli/fixtures');
const scratch: string[] = [];
let before: Record<string, string>;

/** No stack trace reached the user: no "    at " frames, no "Error:" dumps. */
function expectNoStackTrace(text: string): void {
  expect(text).not.toMatch(/^\s+at\s/m);
  expect(text).not.toMatch(/\b(TypeError|RangeError|ReferenceError|SyntaxError)\b/);
}

beforeAll(async () => {
  await buildChecker();
  before = { ...hashTree(EXAMPLES), ...hashTree(FIXTURES) };
});

afterAll(() => {
  for (const dir of scratch) fs.rmSync(dir, { recursive: true, force: true });
});

describe('the demo (examples/)', () => {
  it('text report matches the golden file and exits 1 for the deliberate error', () => {
    const run = runCli(['check', 'examples']);
    expect(run.stderr).toBe('');
    const g = golden('examples.txt', run.stdout);
    expect(g.actual).toBe(g.expected);
    expect(run.code).toBe(1);
  });

  it('has exactly one error and some warnings, as the demo promises', () => {
    const run = runCli(['check', 'examples', '--format', 'json']);
    const report = JSON.parse(run.stdout);
    expect(report.summary.errors).toBe(1);
    expect(report.summary.warnings).toBeGreaterThanOrEqual(2);
    expect(report.files.map((f: { path: string }) => f.path)).toEqual([
      'examples/bench-rig.clock.yaml',
      'examples/bench-rig.wave.yaml',
      'examples/tone-bench.clock.yaml',
      'examples/tone-bench.wave.yaml',
    ]);
  });

  it('JSON report matches the golden file', () => {
    const run = runCli(['check', 'examples', '--format=json']);
    expect(run.code).toBe(1);
    const g = golden('examples.json', run.stdout);
    expect(g.actual).toBe(g.expected);
  });

  it('JSON carries every documented field with its type', () => {
    const report = JSON.parse(runCli(['check', 'examples', '--format', 'json']).stdout);
    for (const file of report.files) {
      expect(typeof file.path).toBe('string');
      for (const d of file.diagnostics) {
        expect(['error', 'warning', 'information']).toContain(d.severity);
        expect(typeof d.code).toBe('string');
        expect(typeof d.message).toBe('string');
        expect(Number.isInteger(d.line) && d.line >= 1).toBe(true);
        expect(Number.isInteger(d.column) && d.column >= 1).toBe(true);
      }
    }
    const outputs = report.files.flatMap((f: { outputs: unknown[] }) => f.outputs);
    expect(outputs.length).toBeGreaterThanOrEqual(6);
    const numeric = ['systemClockHz', 'dividerInteger', 'dividerFraction', 'fractionBits', 'sampleRateHz', 'tableLength', 'cycles',
      'achievedHz', 'errorHz', 'errorPpm', 'samplePeriodJitterRmsS', 'samplePeriodJitterPkPkS', 'tieRmsS', 'seamJumpLsb', 'tableBytes'];
    for (const o of outputs) {
      expect(typeof o.name).toBe('string');
      expect(typeof o.targetHz).toBe('number');
      for (const plan of [o.plan, o.nearestJitterFree]) {
        if (plan === null) continue;
        for (const key of numeric) expect(typeof plan[key], `${o.name}.${key}`).toBe('number');
        for (const key of ['jitterFree', 'seamOk']) expect(typeof plan[key], `${o.name}.${key}`).toBe('boolean');
        // f_out = f_sys·M/(D·N) with D = I + F/2^k (docs/DESIGN.md "Quantities"; the definition of a divided clock).
        const d = plan.dividerInteger + plan.dividerFraction / 2 ** plan.fractionBits;
        expect(plan.achievedHz).toBeCloseTo((plan.systemClockHz * plan.cycles) / (d * plan.tableLength), 6);
        // Exact text agrees with the number; fraction.js is the outside oracle for exact parsing.
        expect(new Fraction(plan.achievedHzExact).valueOf()).toBe(plan.achievedHz);
      }
    }
  });

  it('SARIF passes the standard validator with no errors and no warnings (sarif-multitool, OASIS SARIF 2.1.0)', () => {
    const dir = scratchDir('sarif');
    scratch.push(dir);
    const out = path.join(dir, 'out.sarif');
    const run = runCli(['check', 'examples', '--format', 'sarif', '--output', out]);
    expect(run.code).toBe(1);
    expect(run.stdout).toMatch(/^waveplan check FAILED: 4 files, \d+ outputs, 1 error, \d+ warnings \(report in /);
    const problems = validateSarif(out, dir);
    expect(problems).toEqual([]);

    const log = JSON.parse(fs.readFileSync(out, 'utf8'));
    const results = log.runs[0].results;
    expect(results.some((r: { level: string }) => r.level === 'error')).toBe(true);
    for (const r of results) {
      const loc = r.locations[0].physicalLocation;
      expect(loc.artifactLocation.uri).toMatch(/^examples\/bench-rig\.(wave|clock)\.yaml$/);
      expect(loc.region.startLine).toBeGreaterThanOrEqual(1);
      expect(loc.region.startColumn).toBeGreaterThanOrEqual(1);
    }
  });
});

describe('figures in the JSON report', () => {
  it('125 MHz ÷ 1 with N = 4096 and M = 131 gives 3997802734375/1000000 Hz exactly (common practice)', () => {
    const run = runCli(['check', 'test/cli/fixtures/trade-fact', '--format', 'json']);
    expect(run.stderr).toBe('');
    expect(run.code).toBe(0);
    const report = JSON.parse(run.stdout);
    const wave = report.files.find((f: { path: string }) => f.path.endsWith('tone.wave.yaml'));
    expect(wave.diagnostics.filter((d: { severity: string }) => d.severity === 'error')).toEqual([]);
    const plan = wave.outputs[0].plan;
    expect(new Fraction(plan.achievedHzExact).equals(new Fraction('3997802734375/1000000'))).toBe(true);
    expect(plan.achievedHz).toBe(3997802.734375);
    expect(plan).toMatchObject({ systemClockHz: 125e6, dividerInteger: 1, dividerFraction: 0, tableLength: 4096, cycles: 131, sampleRateHz: 125e6 });
    // 4096 samples of 2 bytes (the clock's sample-bytes): 8192 B (derived).
    expect(plan.tableBytes).toBe(8192);
    // (3997802.734375 − 4e6)/4e6 · 1e6 = −549.31640625 ppm (derived).
    expect(plan.errorHz).toBe(-2197.265625);
    expect(plan.errorPpm).toBeCloseTo(-549.31640625, 9);
    expect(plan.jitterFree).toBe(true);
    expect(plan.samplePeriodJitterRmsS).toBe(0);
    // 131 whole cycles in an open table: the wrap is seamless (docs/DESIGN.md, "Seam").
    expect(plan.seamOk).toBe(true);
  });
});

describe('exit codes', () => {
  it('0 for a spec with no errors', () => {
    expect(runCli(['check', 'test/cli/fixtures/trade-fact']).code).toBe(0);
  });

  it('1 for a spec with an error, with the finding as path:line:col', () => {
    // Its clock file is in a sibling folder: --root names the workspace that holds both.
    const run = runCli(['check', 'test/cli/fixtures/clipping/loud.wave.yaml', '--root', 'test/cli/fixtures']);
    expect(run.code).toBe(1);
    expect(run.stdout).toMatch(/^test\/cli\/fixtures\/clipping\/loud\.wave\.yaml:\d+:\d+: error clipping /m);
  });

  it('2 with one line for a path that does not exist', () => {
    const run = runCli(['check', 'examples', 'no/such/place']);
    expect(run.code).toBe(2);
    expect(run.stdout).toBe('');
    expect(run.stderr).toBe('waveplan: no such file or folder: no/such/place\n');
  });

  it('2 with the usage for an unknown flag, a bad format, a missing value or an unknown command', () => {
    for (const args of [['check', 'examples', '--colour'], ['check', 'examples', '--format', 'xml'], ['check', 'examples', '--output'], ['verify', 'examples'], ['--frobnicate'], ['check']]) {
      const run = runCli(args);
      expect(run.code, args.join(' ')).toBe(2);
      expect(run.stderr, args.join(' ')).toMatch(/^waveplan: .+\nusage:\n/);
      expectNoStackTrace(run.stderr);
    }
  });

  it('2 for a folder without specs, and when --output would overwrite a checked spec', () => {
    const empty = scratchDir('empty');
    scratch.push(empty);
    expect(runCli(['check', empty]).code).toBe(2);
    const run = runCli(['check', 'examples', '--output', 'examples/bench-rig.wave.yaml']);
    expect(run.code).toBe(2);
    expect(run.stderr).toBe('waveplan: nothing written: examples/bench-rig.wave.yaml has the name of a spec file; waveplan never writes one\n');
  });

  it('--version prints the package version; --help prints the usage and exits 0', () => {
    const pkg = JSON.parse(fs.readFileSync(path.join(ROOT, 'package.json'), 'utf8'));
    expect(runCli(['--version'])).toMatchObject({ code: 0, stdout: `${pkg.version}\n` });
    const help = runCli(['--help']);
    expect(help.code).toBe(0);
    expect(help.stdout).toContain('waveplan check <files or folders…>');
    expect(runCli(['check', '--help']).code).toBe(0);
  });
});

describe('serve', () => {
  it('starts the language server with the arguments an editor client passes and answers initialize (LSP 3.17 base protocol framing)', async () => {
    const reply = await initializeOverStdio(process.execPath, [BIN, 'serve', '--stdio', `--clientProcessId=${process.pid}`], ROOT);
    expect(reply).toMatch(/^Content-Length: \d+\r\n/);
    expect(reply).toContain('"id":1');
  });

  it('exits 2 without a transport', () => {
    const run = runCli(['serve']);
    expect(run.code).toBe(2);
    expect(run.stderr).toMatch(/^waveplan: serve needs a transport, e.g. --stdio\n/);
  });
});

describe('hostile input', () => {
  it('a broken YAML file gives a ranged diagnostic and no stack trace', () => {
    const run = runCli(['check', 'test/cli/fixtures/broken', '--format', 'json']);
    expect(run.code).toBe(1);
    expect(run.stderr).toBe('');
    const wave = JSON.parse(run.stdout).files.find((f: { path: string }) => f.path.endsWith('torn.wave.yaml'));
    const syntax = wave.diagnostics.find((d: { code: string }) => d.code === 'yaml-syntax');
    expect(syntax).toBeDefined();
    expect(syntax.line).toBeGreaterThanOrEqual(5);
    expect(syntax.column).toBeGreaterThanOrEqual(1);
    expectNoStackTrace(run.stdout);
  });

  it('a wave spec whose clock file is missing gets a diagnostic on clock:', () => {
    const dir = scratchDir('orphan');
    scratch.push(dir);
    fs.writeFileSync(path.join(dir, 'orphan.wave.yaml'), 'clock: ./gone.clock.yaml\noutputs:\n  a: { shape: sine, frequency: 1 kHz }\n');
    const run = runCli(['check', dir, '--format', 'json']);
    expect(run.code).toBe(1);
    const [file] = JSON.parse(run.stdout).files;
    expect(file.diagnostics.map((d: { code: string; line: number }) => [d.code, d.line])).toContainEqual(['clock-unreadable', 1]);
  });

  it('random bytes and a 20 MB file give diagnostics, not crashes, within seconds', () => {
    const dir = scratchDir('hostile');
    scratch.push(dir);
    let seed = 12345;
    const bytes = Buffer.alloc(4096, 0).map(() => ((seed = (seed * 1103515245 + 12345) % 2 ** 31), seed >> 16) & 0xff);
    fs.writeFileSync(path.join(dir, 'noise.wave.yaml'), bytes);
    fs.writeFileSync(path.join(dir, 'huge.clock.yaml'), `description: "${'x'.repeat(20 * 1024 * 1024)}"\n`);
    const started = Date.now();
    const run = runCli(['check', dir, '--format', 'json']);
    expect(Date.now() - started).toBeLessThan(20_000);
    expect(run.code).toBe(1);
    expect(run.stderr).toBe('');
    const report = JSON.parse(run.stdout);
    const huge = report.files.find((f: { path: string }) => f.path.endsWith('huge.clock.yaml'));
    expect(huge.diagnostics.map((d: { code: string }) => d.code)).toContain('file-too-large');
    const noise = report.files.find((f: { path: string }) => f.path.endsWith('noise.wave.yaml'));
    expect(noise.diagnostics.length).toBeGreaterThan(0);
  });
});

describe('checking never writes', () => {
  it('examples/ and the fixtures are byte-identical after every run above', () => {
    expect({ ...hashTree(EXAMPLES), ...hashTree(FIXTURES) }).toEqual(before);
  });
});
