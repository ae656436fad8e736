// `waveplan report`: analyse the wave specs and write one self-contained HTML page. The page is
// written even when the specs have errors (it shows them); the exit code says whether they do:
// 0 none, 1 errors, 2 misuse or I/O failure.

import * as path from 'node:path';
import { writeOutputs } from '../cli/disk';
import { parseReportArgs, REPORT_USAGE } from './args';
import { reportHtml } from './html-report';
import { relativeTo } from '../cli/check';
import { guarded, processIo, type CommandIo } from './io';
import { loadSpecs } from './load';

export async function runReport(argv: string[], io: CommandIo = processIo()): Promise<number> {
  return guarded('report', REPORT_USAGE, io, () => {
    const options = parseReportArgs(argv);
    if (options.help) {
      io.stdout(REPORT_USAGE);
      return 0;
    }
    const { specs, inputs } = loadSpecs(options.specs, io.cwd, options.root);
    const target = path.resolve(io.cwd, options.html!);
    writeOutputs([{ file: target, folder: path.dirname(target), text: reportHtml(specs) }], { inputs, force: options.force, anchor: io.cwd, show: relativeTo(io.cwd) });
    const errors = specs.reduce((n, s) => n + s.errors.length, 0);
    io.stdout(`report written to ${options.html} (${specs.length} spec(s), ${errors} error(s))\n`);
    return errors > 0 ? 1 : 0;
  });
}
