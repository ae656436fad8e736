// `waveplan check`: find the specs, analyse each once through the shared analysis, print one
// report. Exit 0 when no errors (warnings allowed), 1 when any error; misuse and unreadable input
// surface as UsageError / CliInputError for the entry to turn into exit 2.

import * as path from 'node:path';
import { analyze, kindOf } from '../spec/analyze';
import { diagnostic, tooLargeMessage } from '../spec/source';
import type { Analysis } from '../spec/types';
import { parseCheckArgs } from './args';
import { tally, type CheckedFile } from './checked';
import { CliInputError, collectSpecFiles, DiskHost, workspaceRoots, writeOutputs } from './disk';
import { formatJson } from './format-json';
import { formatSarif } from './format-sarif';
import { formatText, summaryLine } from './format-text';
import { catalogueRules } from './rules';
import { CHECK_USAGE } from './usage';

export interface CliIo {
  cwd: string;
  stdout(text: string): void;
  stderr(text: string): void;
}

export interface ToolInfo {
  version: string;
  informationUri: string;
}

/** Stable, machine-independent path for reports: relative to the working directory, `/`-separated. */
export function relativeTo(cwd: string): (abs: string) => string {
  return (abs) => path.relative(cwd, abs).split(path.sep).join('/') || '.';
}

export function runCheck(argv: readonly string[], io: CliIo, tool: ToolInfo): number {
  const options = parseCheckArgs(argv);
  if (options.help) {
    io.stdout(CHECK_USAGE);
    return 0;
  }
  const files = collectSpecFiles(options.paths, io.cwd);
  if (files.length === 0) {
    throw new CliInputError(`no *.wave.yaml or *.clock.yaml files in ${options.paths.join(', ')}`);
  }
  const outputPath = options.output === null ? null : path.resolve(io.cwd, options.output);

  const relative = relativeTo(io.cwd);
  const host = new DiskHost(workspaceRoots(options.paths, io.cwd, options.root));
  const checked: CheckedFile[] = files.map((file) => ({ path: relative(file), analysis: readAndAnalyze(file, host, relative) }));

  const report =
    options.format === 'json'
      ? formatJson(checked, tool.version)
      : options.format === 'sarif'
        ? formatSarif(checked, catalogueRules(), tool)
        : formatText(checked, relative);

  const counts = tally(checked);
  if (outputPath === null) {
    io.stdout(report);
  } else {
    // Every file the run read is an input: the checked specs and the clock files they name.
    writeOutputs([{ file: outputPath, folder: path.dirname(outputPath), text: report }], { inputs: host.inputs(), force: options.force, anchor: io.cwd, show: relative });
    // CI logs still show the outcome when the report goes to a file.
    io.stdout(`${summaryLine(counts, checked)} (report in ${options.output})\n`);
  }
  return counts.errors > 0 ? 1 : 0;
}

/**
 * The analysis of one named spec. A file too large to be a spec is a finding with a range (its
 * real size, never read); any other refusal (a link leading out of the workspace) stops the run.
 */
function readAndAnalyze(file: string, host: DiskHost, relative: (abs: string) => string): Analysis {
  const text = host.readFile(file);
  if (text !== undefined) return analyze(file, text, host);
  const refusal = host.refusal(file);
  if (refusal?.code !== 'too-large') throw new CliInputError(`cannot read ${relative(file)}: ${refusal?.reason ?? 'unreadable'}`);
  const start = { line: 0, character: 0 };
  const d = diagnostic('file-too-large', { start, end: start }, tooLargeMessage(refusal.size ?? 0));
  return { path: file, kind: kindOf(file), text: '', diagnostics: [d], outputs: [], hardware: null, clockPath: null, memory: null };
}
