// workspace/executeCommand: re-check every spec in the workspace folders (with progress), and
// the plan report of one file as markdown for the client to show (C export and the HTML report:
// export-commands.ts).

import type { CancellationToken, WorkDoneProgressServerReporter } from 'vscode-languageserver/node';
import type { Analysis } from '../spec/types';
import { findSpecFiles } from './dependencies';
import { EXPORT_C, HTML_REPORT } from './export-commands';
import { floorOf, signalRows } from '../cli/signal-rows';
import { memoryLine, outputCard, table } from './plan-card';
import { outputPictures, withPictures } from './pictures';
import { checkCancelled, yieldToEvents } from './safe';

export const RECHECK_WORKSPACE = 'waveplan.recheckWorkspace';
export const PLAN_REPORT = 'waveplan.planReport';
export const COMMANDS = [RECHECK_WORKSPACE, PLAN_REPORT, EXPORT_C, HTML_REPORT];

/** The report is a markdown preview, not a hover: it may be longer, but stays bounded. */
const REPORT_LIMIT = 2_000_000;

export interface RecheckSummary {
  files: number;
  errors: number;
  warnings: number;
}

export interface RecheckTarget {
  /** Re-checks one file (open: its buffer; closed: the disk) and returns the analysis. */
  recheck(path: string): Promise<Analysis | undefined>;
}

export async function recheckWorkspace(
  folders: string[],
  target: RecheckTarget,
  progress: WorkDoneProgressServerReporter | undefined,
  token: CancellationToken,
): Promise<RecheckSummary> {
  const files = findSpecFiles(folders);
  progress?.begin('waveplan: re-checking specs', 0, `${files.length} files`, true);
  const summary: RecheckSummary = { files: 0, errors: 0, warnings: 0 };
  try {
    for (const [index, path] of files.entries()) {
      // Between files: let a cancellation or an edit in; one file is never split.
      await yieldToEvents();
      checkCancelled(token);
      if (progress?.token.isCancellationRequested) break;
      const analysis = await target.recheck(path);
      summary.files++;
      for (const d of analysis?.diagnostics ?? []) {
        if (d.severity === 'error') summary.errors++;
        else if (d.severity === 'warning') summary.warnings++;
      }
      progress?.report(Math.round(((index + 1) / files.length) * 100), path);
    }
  } finally {
    progress?.done();
  }
  return summary;
}

export function planReport(analysis: Analysis, title: string): string {
  const lines = [`# Plan report: ${title}`, ''];
  const memory = memoryLine(analysis);
  if (memory) lines.push(memory, '');
  if (analysis.kind === 'clock') lines.push('This is a clock file; its wave specs hold the outputs.', '');
  for (const output of analysis.outputs) {
    const hw = analysis.hardware;
    const plan = output.planning.plan;
    const text = outputCard(output) + (hw && plan ? `\n\n${table(signalRows(hw, output.request, plan, floorOf(output, hw)))}` : '');
    lines.push(`## ${output.name}`, '', hw ? withPictures(text, outputPictures(output, hw.dac, hw), REPORT_LIMIT / 8) : text, '');
  }
  if (analysis.diagnostics.length > 0) {
    lines.push('## Findings', '');
    for (const d of analysis.diagnostics) {
      lines.push(`- line ${d.range.start.line + 1}: ${d.severity} \`${d.code}\` — ${d.message}`);
    }
  } else {
    lines.push('No findings.');
  }
  return lines.join('\n');
}
