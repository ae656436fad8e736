// The npm package as a firmware repository gets it: `npm pack` in a copy of the repository (its
// `prepack` builds the bundle), then `npm install ./waveplan-<version>.tgz` into an empty folder
// with no registry at all (an unreachable registry, an empty cache, --offline), and every command
// run from there: check (text, JSON, SARIF — the last through the standard's validator), export
// (the C compiles), report, and serve --stdio (the initialize handshake).

import { spawnSync } from 'node:child_process';
import * as fs from 'node:fs';
import * as path from 'node:path';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { initializeOverStdio, ROOT, scratchDir, validateSarif } from '../support/cli';

/** What the package may hold: the CLI's entry, its bundle, the JSON Schemas and npm's own three. */
const EXPECTED_FILES = [
  'LICENSE',
  'README.md',
  'bin/waveplan.js',
  'dist/waveplan.js',
  'package.json',
  'shared-schema/clock.schema.json',
  'shared-schema/wave.schema.json',
];
/** The sources a build needs; everything else of the repository stays out of the copy. */
const BUILD_INPUTS = ['package.json', 'README.md', 'LICENSE', 'tsconfig.json', 'bin', 'scripts', 'server', 'shared-schema', 'client'];

const work = scratchDir('pack');
const pkg = JSON.parse(fs.readFileSync(path.join(ROOT, 'package.json'), 'utf8'));
let tarball = '';
let packed: { files: { path: string }[]; size: number; unpackedSize: number };
let consumer = '';

/** npm with a clean environment: none of the npm_config_* settings of the `npm test` around us. */
function npm(args: string[], cwd: string, extra: Record<string, string> = {}) {
  const env: Record<string, string> = {};
  for (const [k, v] of Object.entries(process.env)) if (!/^npm_/i.test(k) && v !== undefined) env[k] = v;
  return spawnSync('npm', args, { cwd, encoding: 'utf8', env: { ...env, ...extra }, timeout: 240_000 });
}

function waveplan(args: string[]) {
  return spawnSync(path.join(consumer, 'node_modules', '.bin', 'waveplan'), args, { cwd: consumer, encoding: 'utf8', timeout: 60_000 });
}

beforeAll(() => {
  const copy = path.join(work, 'repo');
  for (const entry of BUILD_INPUTS) fs.cpSync(path.join(ROOT, entry), path.join(copy, entry), { recursive: true });
  fs.symlinkSync(path.join(ROOT, 'node_modules'), path.join(copy, 'node_modules'));
  const out = path.join(work, 'out');
  fs.mkdirSync(out);
  const run = npm(['pack', '--json', '--pack-destination', out], copy);
  expect(run.status, run.stderr).toBe(0);
  // npm prints the prepack build's output before the JSON.
  packed = JSON.parse(run.stdout.slice(run.stdout.indexOf('[')))[0];
  tarball = path.join(out, `waveplan-${pkg.version}.tgz`);

  consumer = path.join(work, 'firmware');
  fs.mkdirSync(consumer);
  fs.writeFileSync(path.join(consumer, 'package.json'), '{ "name": "firmware", "private": true }\n');
  fs.cpSync(path.join(ROOT, 'examples'), path.join(consumer, 'specs'), { recursive: true });
  fs.cpSync(path.join(ROOT, 'test/cli/fixtures/trade-fact'), path.join(consumer, 'lab'), { recursive: true });
  const cache = path.join(work, 'empty-cache');
  const install = npm(['install', tarball, '--no-audit', '--no-fund', '--offline'], consumer, {
    npm_config_registry: 'http://127.0.0.1:9/',
    npm_config_cache: cache,
  });
  expect(install.status, install.stdout + install.stderr).toBe(0);
}, 240_000);

afterAll(() => fs.rmSync(work, { recursive: true, force: true }));

describe('npm pack', () => {
  it('writes the tarball with exactly the allow-listed files, the bundle built by prepack', () => {
    expect(fs.existsSync(tarball)).toBe(true);
    expect(packed.files.map((f) => f.path).sort()).toEqual(EXPECTED_FILES);
    expect(pkg.scripts.prepack).toBe('npm run build');
    // The bundle carries the engine, the checker and the server: about 2 MB unpacked, well under 1 MB packed.
    expect(packed.size).toBeLessThan(1024 * 1024);
    // The README quotes the size ("about N KB"): keep it within a quarter of the truth.
    const quoted = /writes `waveplan-[\d.]+\.tgz`[\s\S]*?about (\d+) KB/.exec(fs.readFileSync(path.join(ROOT, 'README.md'), 'utf8'));
    expect(quoted, 'README names the tarball and its size').not.toBeNull();
    expect(Math.abs(Number(quoted![1]) * 1000 - packed.size) / packed.size).toBeLessThan(0.25);
  });

  it('declares no runtime dependencies: the bundle holds them, so installing needs no registry', () => {
    expect(pkg.dependencies ?? {}).toEqual({});
    expect(fs.readdirSync(path.join(consumer, 'node_modules')).filter((d) => !d.startsWith('.'))).toEqual(['waveplan']);
  });
});

describe('the installed command, from an empty folder', () => {
  it('--version and npx', () => {
    expect(waveplan(['--version']).stdout).toBe(`${pkg.version}\n`);
    const npx = npm(['exec', '--offline', '--', 'waveplan', '--version'], consumer, { npm_config_registry: 'http://127.0.0.1:9/' });
    expect(npx.stdout.trim()).toBe(pkg.version);
  });

  it('check as text: the demo specs report their deliberate error and exit 1', () => {
    const run = waveplan(['check', 'specs']);
    expect(run.stderr).toBe('');
    expect(run.status).toBe(1);
    expect(run.stdout).toMatch(/^specs\/bench-rig\.wave\.yaml:\d+:\d+: error out-of-tolerance /m);
  });

  it('check as JSON: one error, the documented shape', () => {
    const run = waveplan(['check', 'specs', '--format', 'json']);
    const report = JSON.parse(run.stdout);
    expect(report.summary.errors).toBe(1);
    expect(report.files.map((f: { path: string }) => f.path)).toEqual([
      'specs/bench-rig.clock.yaml',
      'specs/bench-rig.wave.yaml',
      'specs/tone-bench.clock.yaml',
      'specs/tone-bench.wave.yaml',
    ]);
  });

  it('check as SARIF: a file the standard validator passes (OASIS SARIF 2.1.0, sarif-multitool)', () => {
    const run = waveplan(['check', 'specs', '--format', 'sarif', '--output', 'waveplan.sarif']);
    expect(run.status).toBe(1);
    const file = path.join(consumer, 'waveplan.sarif');
    expect(JSON.parse(fs.readFileSync(file, 'utf8')).version).toBe('2.1.0');
    expect(validateSarif(file, work)).toEqual([]);
  });

  it('export: a spec without errors writes C that gcc compiles as C99 with warnings as errors', () => {
    const run = waveplan(['export', 'lab/tone.wave.yaml', '--c', 'generated']);
    expect(run.status, run.stdout + run.stderr).toBe(0);
    const written = fs.readdirSync(path.join(consumer, 'generated')).sort();
    expect(written).toEqual(['tone.c', 'tone.h']);
    const cc = spawnSync('gcc', ['-std=c99', '-Wall', '-Wextra', '-Werror', '-pedantic', '-c', 'tone.c', '-o', 'tone.o'], {
      cwd: path.join(consumer, 'generated'),
      encoding: 'utf8',
    });
    expect(cc.error, 'gcc is needed (scripts/test-setup.sh installs it)').toBeUndefined();
    expect(cc.status, cc.stderr).toBe(0);
  });

  it('report: one self-contained HTML page', () => {
    const run = waveplan(['report', 'lab/tone.wave.yaml', '--html', 'plan-report.html']);
    expect(run.status, run.stdout + run.stderr).toBe(0);
    const html = fs.readFileSync(path.join(consumer, 'plan-report.html'), 'utf8');
    expect(html).toMatch(/^<!doctype html>/i);
    expect(html).toContain('tone');
  });

  it('serve --stdio answers initialize (LSP 3.17 base protocol framing)', async () => {
    const reply = await initializeOverStdio(path.join(consumer, 'node_modules', '.bin', 'waveplan'), ['serve', '--stdio'], consumer);
    expect(reply).toMatch(/^Content-Length: \d+\r\n/);
    expect(reply).toContain('"capabilities"');
  });
});
