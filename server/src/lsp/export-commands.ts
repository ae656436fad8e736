// workspace/executeCommand for firmware export and the HTML plan report of one wave spec, as the
// editor sees it: open buffers (saved or not) count for the spec and its clock file, the disk for
// the rest. The files and the page come from server/src/export — the same code as
// `waveplan export --c` and `waveplan report --html` — so editor and CLI write the same bytes.

import * as path from 'node:path';
import { CliInputError, nodeFileSystem, writeOutputs } from '../cli/disk';
import { cFiles } from '../export/c-export';
import { reportHtml } from '../export/html-report';
import { describeSpec, diagnosticLine, type LoadedSpec } from '../export/load';
import { exportModel } from '../export/model';
import { exportDecision, refusalWords } from '../export/refusal';
import { folderClashes } from '../export/symbols';
import { analyze } from '../spec/analyze';
import type { FileFacts } from '../spec/containment';
import type { SpecHost } from '../spec/types';
import { uriToPath, type SpecDocuments } from './documents';

export const EXPORT_C = 'waveplan.exportC';
export const HTML_REPORT = 'waveplan.htmlReport';

export type ExportCAnswer = { written: string[] } | { error: string };
export type HtmlReportAnswer = { html: string } | { error: string };

/** How the editor reads files for an analysis of a spec (open buffers first, inside the workspace). */
export interface EditorFiles {
  hostFor(spec: string): SpecHost;
}

/**
 * Paths in generated files are relative to the repository root; outside a repository the CLI
 * falls back to its working folder, which in the editor is the workspace folder holding the spec.
 */
function baseFolder(file: string, folders: readonly string[]): string {
  const holding = folders
    .filter((f) => file === f || file.startsWith(f.endsWith(path.sep) ? f : f + path.sep))
    .sort((a, b) => b.length - a.length);
  return holding[0] ?? path.dirname(file);
}

/** The wave spec behind a command argument, or the reason there is none. */
function specFile(argument: unknown): string | { error: string } {
  if (typeof argument !== 'string' || argument === '') return { error: 'the command needs the URI of a wave spec as its argument' };
  if (!argument.startsWith('file:')) return { error: `${argument} is not a file on disk; save it as a *.wave.yaml file first` };
  const file = uriToPath(argument);
  if (!file.endsWith('.wave.yaml')) return { error: `${path.basename(file)} is not a wave spec (*.wave.yaml); its outputs are in the wave specs that use it` };
  return file;
}

/**
 * Analyses the spec afresh, reading each file once, so the hash written into the files is of
 * exactly the texts the plans came from.
 */
function loadFromEditor(file: string, files: EditorFiles, folders: readonly string[]): LoadedSpec | { error: string } {
  const seen = new Map<string, string | undefined>();
  const inner = files.hostFor(file);
  const host: SpecHost = {
    readFile: (p) => {
      if (!seen.has(p)) seen.set(p, inner.readFile(p));
      return seen.get(p);
    },
    whyUnreadable: inner.whyUnreadable,
  };
  const text = host.readFile(file);
  if (text === undefined) return { error: `cannot read ${file}${reasonOf(host, file)}` };
  const analysis = analyze(file, text, host);
  const clockText = analysis.clockPath ? host.readFile(analysis.clockPath) : undefined;
  return describeSpec(file, text, analysis, clockText, baseFolder(file, folders));
}

function reasonOf(host: SpecHost, file: string): string {
  const why = host.whyUnreadable?.(file);
  return why ? `: ${why}` : '';
}

/** Identities of the files the export read, as they are on disk now (an unsaved buffer's file too). */
function inputFacts(paths: ReadonlyArray<string | null>): FileFacts[] {
  return paths.flatMap((p) => {
    if (!p) return [];
    try {
      return [nodeFileSystem.lstat(nodeFileSystem.realpath(p))];
    } catch {
      return [];
    }
  });
}

/**
 * Writes <prefix>.h and <prefix>.c into `directory` (relative to the spec's folder), or nothing
 * at all when the spec has errors or its outputs cannot become C: the editor has no --force.
 */
export function exportC(argument: unknown, directory: string, files: EditorFiles, folders: readonly string[]): ExportCAnswer {
  const file = specFile(argument);
  if (typeof file !== 'string') return file;
  const spec = loadFromEditor(file, files, folders);
  if ('error' in spec) return spec;
  const decision = exportDecision(spec);
  if (decision.kind === 'no-hardware') return { error: `nothing exported: no hardware could be read from the clock file of ${spec.path}` };
  if (decision.kind === 'findings')
    return { error: `nothing exported: ${spec.path} has ${refusalWords(decision)}; fix them first. First: ${diagnosticLine(spec, decision.findings[0])}` };
  const model = exportModel(spec)!;
  // The folder comes from settings a repository can carry: it must stay inside the workspace
  // folder that holds the spec (with no folder open, inside the spec's own folder).
  const target = path.resolve(path.dirname(file), directory);
  const workspace = folders.find((f) => f === baseFolder(file, folders)) ?? path.dirname(file);
  const writes = cFiles(spec, model, decision.ids, false).map((f) => ({ file: path.join(target, f.name), folder: target, text: f.text }));
  const headers = writes.filter((w) => w.file.endsWith('.h')).map((w) => ({ name: path.basename(w.file), spec: spec.path, text: w.text }));
  const clashes = folderClashes(nodeFileSystem, target, headers);
  if (clashes.length > 0) return { error: `nothing exported: ${clashes.join('; ')}` };
  try {
    writeOutputs(writes, {
      inputs: inputFacts([file, spec.analysis.clockPath]),
      force: false,
      anchor: workspace,
      confine: workspace,
      show: (p) => path.relative(workspace, p).split(path.sep).join('/') || '.',
    });
  } catch (e) {
    return { error: e instanceof CliInputError ? `nothing exported: ${e.message.replace(/^nothing written: /, '')}` : `export failed: ${String(e)}` };
  }
  return { written: writes.map((w) => w.file) };
}

/** The self-contained report page of one wave spec; written even when the spec has errors (it shows them). */
export function htmlReport(argument: unknown, files: EditorFiles, folders: readonly string[]): HtmlReportAnswer {
  const file = specFile(argument);
  if (typeof file !== 'string') return file;
  const spec = loadFromEditor(file, files, folders);
  if ('error' in spec) return spec;
  return { html: reportHtml([spec]) };
}
