// Reads and analyses the wave specs an export or report names. Everything written later derives
// from these analyses; nothing here writes. Paths shown in generated files are relative to the
// repository root (the nearest folder holding .git), so the bytes do not depend on where the
// command runs or on whose machine.

import { createHash } from 'node:crypto';
import * as fs from 'node:fs';
import * as path from 'node:path';
import { CliInputError, collectSpecFiles, DiskHost, workspaceRoots } from '../cli/disk';
import type { FileFacts } from '../spec/containment';
import { analyze } from '../spec/analyze';
import type { Analysis, SpecDiagnostic } from '../spec/types';

export interface LoadedSpec {
  /** Absolute path of the wave spec. */
  file: string;
  /** Repository-relative path, `/`-separated. */
  path: string;
  /** Repository-relative path of its clock file, when `clock:` resolved. */
  clockPath: string | null;
  analysis: Analysis;
  /** sha256 (hex) of the spec text, a NUL, and the clock text, line endings normalised to LF. */
  contentHash: string;
  errors: SpecDiagnostic[];
}

/** The folder holding `.git` above `start`, or null outside a repository. */
export function repoRoot(start: string): string | null {
  let dir = path.resolve(start);
  for (;;) {
    if (fs.existsSync(path.join(dir, '.git'))) return dir;
    const up = path.dirname(dir);
    if (up === dir) return null;
    dir = up;
  }
}

function shownPath(abs: string, cwd: string): string {
  const base = repoRoot(path.dirname(abs)) ?? cwd;
  return path.relative(base, abs).split(path.sep).join('/');
}

const lf = (text: string): string => text.replace(/\r\n?/g, '\n');

/** sha256 of the spec and its clock file, and of the sample files its outputs read, when they read any. */
export function contentHash(specText: string, clockText: string | undefined, sampleFiles: Analysis['sampleFiles'] = []): string {
  const hash = createHash('sha256')
    .update(lf(specText), 'utf8')
    .update('\0')
    .update(lf(clockText ?? ''), 'utf8');
  for (const f of sampleFiles) hash.update(`\0${f.sha256 ?? 'unread'}`);
  return hash.digest('hex');
}

export interface LoadedRun {
  specs: LoadedSpec[];
  /** Identities of every file read (specs and clock files): what the run's writers must never overwrite. */
  inputs: FileFacts[];
}

/**
 * Analyses every wave spec named (folders: their *.wave.yaml files), reading only inside the
 * workspace (`root`, else the folders named and those of the files named). Unreadable input
 * throws CliInputError.
 */
export function loadSpecs(inputs: readonly string[], cwd: string, root: string | null = null): LoadedRun {
  const files = collectSpecFiles(inputs, cwd);
  const given = new Set(inputs.map((i) => path.resolve(cwd, i)));
  const waves = files.filter((f) => {
    if (!f.endsWith('.clock.yaml')) return true;
    if (given.has(f)) throw new CliInputError(`${shownPath(f, cwd)} is a clock file; name the wave specs that use it`);
    return false;
  });
  if (waves.length === 0) throw new CliInputError(`no *.wave.yaml files in ${inputs.join(', ')}`);
  const host = new DiskHost(workspaceRoots(inputs, cwd, root));
  const specs = waves.map((file) => {
    const text = host.readFile(file);
    if (text === undefined) throw new CliInputError(`cannot read ${shownPath(file, cwd)}: ${host.whyUnreadable(file) ?? 'unreadable'}`);
    const analysis = analyze(file, text, host);
    const clockText = analysis.clockPath ? host.readFile(analysis.clockPath) : undefined;
    return describeSpec(file, text, analysis, clockText, cwd);
  });
  return { specs, inputs: host.inputs() };
}

/**
 * A LoadedSpec from an analysis made elsewhere (the language server analyses editor buffers);
 * `text` and `clockText` must be the texts that analysis read.
 */
export function describeSpec(file: string, text: string, analysis: Analysis, clockText: string | undefined, cwd: string): LoadedSpec {
  return {
    file,
    path: shownPath(file, cwd),
    clockPath: analysis.clockPath ? shownPath(analysis.clockPath, cwd) : null,
    analysis,
    contentHash: contentHash(text, clockText, analysis.sampleFiles),
    errors: analysis.diagnostics.filter((d) => d.severity === 'error'),
  };
}

/** `path:line:col: severity code message`, 1-based, as the checker prints findings. */
export function diagnosticLine(spec: LoadedSpec, d: SpecDiagnostic): string {
  return `${spec.path}:${d.range.start.line + 1}:${d.range.start.character + 1}: ${d.severity} ${d.code} ${d.message}`;
}
