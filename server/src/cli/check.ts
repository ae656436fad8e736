// `waveplan check`: find the specs, analyse each once through the shared analysis, print one
// report. Exit 0 when no errors (warnings allowed), 1 when any error; misuse and unreadable input
// surface as UsageError / CliInputError for the entry to turn into exit 2.

import * as fs from 'node:fs';
import * as path from 'node:path';
import { analyze } from '../spec/analyze';
import { parseCheckArgs } from './args';
import { tally, type CheckedFile } from './checked';
import { CliInputError, collectSpecFiles, DiskHost } from './disk';
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
  if (outputPath !== null && files.includes(outputPath)) {
    throw new CliInputError(`refusing to write the report over a checked spec: ${options.output}`);
  }

  const relative = relativeTo(io.cwd);
  const host = new DiskHost();
  const checked: CheckedFile[] = files.map((file) => {
    const text = host.readFile(file);
    if (text === undefined) throw new CliInputError(`cannot read ${relative(file)}`);
    return { path: relative(file), analysis: analyze(file, text, host) };
  });

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
    try {
      fs.writeFileSync(outputPath, report);
    } catch (e) {
      throw new CliInputError(`cannot write ${options.output}: ${(e as NodeJS.ErrnoException).code ?? 'error'}`);
    }
    // CI logs still show the outcome when the report goes to a file.
    io.stdout(`${summaryLine(counts)} (report in ${options.output})\n`);
  }
  return counts.errors > 0 ? 1 : 0;
}
