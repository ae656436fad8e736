// Runs the bundled checker the way users and CI do: `node bin/waveplan.js …` as a child process.

import { spawnSync } from 'node:child_process';
import { createHash } from 'node:crypto';
import * as fs from 'node:fs';
import * as os from 'node:os';
import * as path from 'node:path';
import { fileURLToPath } from 'node:url';
import { build } from 'esbuild';

export const ROOT = fileURLToPath(new URL('../..', import.meta.url)).replace(/[\\/]$/, '');
export const BIN = path.join(ROOT, 'bin', 'waveplan.js');

/**
 * Bundles server/src/main.ts into dist/waveplan.js with the options of scripts/build.mjs (only
 * the server entry, so a half-written client does not block these tests). Files are written to a
 * temporary name and renamed, so another process reading the bundle never sees half a file.
 */
export async function buildChecker(): Promise<void> {
  const result = await build({
    entryPoints: [path.join(ROOT, 'server/src/main.ts')],
    outfile: path.join(ROOT, 'dist/waveplan.js'),
    bundle: true,
    platform: 'node',
    format: 'cjs',
    target: 'node20',
    sourcemap: true,
    logLevel: 'silent',
    write: false,
  });
  fs.mkdirSync(path.join(ROOT, 'dist'), { recursive: true });
  for (const file of result.outputFiles) {
    const temp = `${file.path}.${process.pid}.tmp`;
    fs.writeFileSync(temp, file.contents);
    fs.renameSync(temp, file.path);
  }
}

export interface CliRun {
  code: number | null;
  stdout: string;
  stderr: string;
}

export function runCli(args: readonly string[], cwd: string = ROOT): CliRun {
  const r = spawnSync(process.execPath, [BIN, ...args], { cwd, encoding: 'utf8', timeout: 60_000 });
  return { code: r.status, stdout: r.stdout, stderr: r.stderr };
}

/** sha256 of every file under `dir`, by relative path; for "the checker never writes" checks. */
export function hashTree(dir: string): Record<string, string> {
  const out: Record<string, string> = {};
  const walk = (d: string) => {
    for (const e of fs.readdirSync(d, { withFileTypes: true })) {
      const full = path.join(d, e.name);
      if (e.isDirectory()) walk(full);
      else out[path.relative(dir, full)] = createHash('sha256').update(fs.readFileSync(full)).digest('hex');
    }
  };
  walk(dir);
  return out;
}

/**
 * Compares `actual` with the golden file; `UPDATE_GOLDEN=1 npx vitest run test/cli` rewrites the
 * golden files instead (review the diff before committing them).
 */
export function golden(name: string, actual: string): { expected: string; actual: string } {
  const file = path.join(ROOT, 'test/cli/golden', name);
  if (process.env.UPDATE_GOLDEN === '1') {
    fs.mkdirSync(path.dirname(file), { recursive: true });
    fs.writeFileSync(file, actual);
  }
  const expected = fs.existsSync(file) ? fs.readFileSync(file, 'utf8') : `(golden file ${name} missing: run with UPDATE_GOLDEN=1)`;
  return { expected, actual };
}

/** A scratch folder under the system temp dir, removed by the caller. */
export function scratchDir(prefix: string): string {
  return fs.mkdtempSync(path.join(os.tmpdir(), `waveplan-${prefix}-`));
}

/**
 * Starts a language server command over stdio, sends `initialize` (LSP 3.17 base protocol:
 * Content-Length framing) and resolves with the raw reply once it carries the capabilities.
 */
export async function initializeOverStdio(command: string, args: readonly string[], cwd: string): Promise<string> {
  const { spawn } = await import('node:child_process');
  const child = spawn(command, [...args], { cwd });
  const body = JSON.stringify({ jsonrpc: '2.0', id: 1, method: 'initialize', params: { processId: process.pid, rootUri: null, capabilities: {} } });
  child.stdin.write(`Content-Length: ${Buffer.byteLength(body)}\r\n\r\n${body}`);
  try {
    return await new Promise<string>((resolve, reject) => {
      let seen = '';
      let errors = '';
      const timer = setTimeout(() => reject(new Error(`no initialize reply; got ${seen} ${errors}`)), 20_000);
      child.stderr.on('data', (chunk: Buffer) => (errors += chunk.toString('utf8')));
      child.on('exit', (code) => {
        clearTimeout(timer);
        reject(new Error(`server exited with ${code}: ${errors}`));
      });
      child.stdout.on('data', (chunk: Buffer) => {
        seen += chunk.toString('utf8');
        if (seen.includes('"capabilities"')) {
          clearTimeout(timer);
          resolve(seen);
        }
      });
    });
  } finally {
    child.kill();
  }
}

/**
 * Runs the SARIF standard's own validator (`@microsoft/sarif-multitool`, OASIS SARIF 2.1.0) on a
 * log and returns its error- and warning-level findings ([] when the log is clean); writes its
 * report into `dir`. Throws when the validator itself fails.
 */
export function validateSarif(file: string, dir: string): { level: string; rule: string; message: string }[] {
  const tool = path.join(ROOT, 'node_modules/@microsoft/sarif-multitool-linux/Sarif.Multitool');
  // Its install script is skipped by npm 11; the run bit is all it would have set (DEVELOPERS.md, "Toolchain notes").
  fs.chmodSync(tool, fs.statSync(tool).mode | 0o100);
  const reportFile = path.join(dir, 'validator-report.sarif');
  const validate = spawnSync(tool, ['validate', file, '-o', reportFile], { encoding: 'utf8', timeout: 120_000 });
  if (validate.status !== 0) throw new Error(`sarif-multitool failed (${validate.status}): ${validate.stdout}${validate.stderr}`);
  const report = JSON.parse(fs.readFileSync(reportFile, 'utf8'));
  const rules = report.runs[0].tool.driver.rules ?? [];
  return (report.runs[0].results ?? [])
    .map((r: { level?: string; ruleIndex?: number; ruleId: string; message: unknown }) => ({
      level: r.level ?? rules[r.ruleIndex ?? -1]?.defaultConfiguration?.level ?? 'warning',
      rule: r.ruleId,
      message: JSON.stringify(r.message),
    }))
    .filter((r: { level: string }) => r.level === 'error' || r.level === 'warning');
}
