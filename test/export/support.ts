// Helpers of the export tests: run the commands in-process with captured output, make scratch
// folders, and run the system compilers — which must be installed (CI installs gcc, g++ and
// chromium); a missing tool fails the test with a message instead of skipping it.

import { execFileSync, spawnSync } from 'node:child_process';
import * as fs from 'node:fs';
import * as os from 'node:os';
import * as path from 'node:path';
import { fileURLToPath } from 'node:url';
import { chromium, type Browser } from 'playwright-core';
import { runExport, runReport } from '../../server/src/export';

export const REPO = fileURLToPath(new URL('../..', import.meta.url)).replace(/[\/]$/, '');
export const FIXTURES = path.join(REPO, 'test/export/fixtures');
export const DEMO = path.join(REPO, 'examples/bench-rig.wave.yaml');

export interface RunResult {
  code: number;
  stdout: string;
  stderr: string;
}

export async function run(command: 'export' | 'report', argv: string[], cwd = REPO): Promise<RunResult> {
  let stdout = '';
  let stderr = '';
  const io = { cwd, stdout: (t: string) => void (stdout += t), stderr: (t: string) => void (stderr += t) };
  const code = await (command === 'export' ? runExport(argv, io) : runReport(argv, io));
  return { code, stdout, stderr };
}

export function scratch(name: string): string {
  return fs.mkdtempSync(path.join(os.tmpdir(), `waveplan-${name}-`));
}

/** Every file under a folder, relative path → bytes. */
export function readTree(dir: string): Map<string, Buffer> {
  const out = new Map<string, Buffer>();
  for (const name of fs.readdirSync(dir).sort()) {
    const full = path.join(dir, name);
    if (fs.statSync(full).isFile()) out.set(name, fs.readFileSync(full));
  }
  return out;
}

export function requireTool(tool: string): string {
  const found = spawnSync('sh', ['-c', `command -v ${tool}`], { encoding: 'utf8' });
  if (found.status !== 0 || !found.stdout.trim())
    throw new Error(`${tool} is not installed: the export tests need it (CI: apt-get install -y gcc g++ chromium)`);
  return found.stdout.trim();
}

export interface CompileResult {
  ok: boolean;
  output: string;
}

export function compile(compiler: 'gcc' | 'g++', args: string[], cwd: string): CompileResult {
  requireTool(compiler);
  const r = spawnSync(compiler, args, { cwd, encoding: 'utf8' });
  return { ok: r.status === 0, output: `${r.stdout}${r.stderr}` };
}

export function runBinary(file: string): string {
  return execFileSync(file, { encoding: 'utf8' });
}

/** The warnings-as-errors flags every generated file must pass (task brief). */
export const STRICT = ['-Wall', '-Wextra', '-Werror', '-pedantic'];

const CHROMIUM = '/usr/bin/chromium';

/** Debian's Chromium, headless, with the flags of test/e2e/README.md; missing, it fails the test with the command that installs it. */
export async function launchChromium(): Promise<Browser> {
  if (!fs.existsSync(CHROMIUM)) throw new Error(`${CHROMIUM} is missing: apt-get install -y chromium (CI installs it)`);
  return chromium.launch({
    executablePath: CHROMIUM,
    args: ['--no-sandbox', '--disable-gpu', '--disable-background-networking', '--disable-component-update', '--disable-sync', '--no-first-run'],
  });
}
