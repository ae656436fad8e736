// What the status bar says about the waveplan diagnostics of every file (status.ts shows it):
// plain data in, plain text out, so it is tested without an editor. The all-clear mark is shown
// only when no waveplan error is left anywhere: a file that does not parse is never called good.

export const OUT_OF_TOLERANCE_CODE = 'out-of-tolerance';
export const DIAGNOSTIC_SOURCE = 'waveplan';

export interface StatusCounts {
  outOfTolerance: number;
  /** Files with an error other than out-of-tolerance. */
  filesWithErrors: number;
}

/** One diagnostic as the summary needs it. */
export interface Finding {
  source?: string;
  code?: string;
  error: boolean;
}

/** Counts over the diagnostics of every file (one list per file). */
export function countStatus(files: ReadonlyArray<readonly Finding[]>): StatusCounts {
  const counts: StatusCounts = { outOfTolerance: 0, filesWithErrors: 0 };
  for (const diagnostics of files) {
    let otherError = false;
    for (const d of diagnostics) {
      if (d.source !== DIAGNOSTIC_SOURCE) continue;
      if (d.code === OUT_OF_TOLERANCE_CODE) counts.outOfTolerance++;
      else if (d.error) otherError = true;
    }
    if (otherError) counts.filesWithErrors++;
  }
  return counts;
}

/** The item's text and tooltip for the counts (no vscode objects, so it reads plainly). */
export function statusText(counts: StatusCounts): { text: string; tooltip: string; level: 'ok' | 'warning' | 'error' } {
  const { outOfTolerance: oot, filesWithErrors: files } = counts;
  if (oot === 0 && files === 0) return { text: '$(pass) waveplan', tooltip: 'waveplan: no errors, and every checked output is within its tolerance', level: 'ok' };
  const parts: string[] = [];
  if (oot > 0) parts.push(`${oot} ${oot === 1 ? 'output' : 'outputs'} out of tolerance`);
  if (files > 0) parts.push(`${files} ${files === 1 ? 'file' : 'files'} with errors`);
  const text = `${files > 0 ? '$(error)' : '$(warning)'} waveplan: ${parts.join(' · ')}`;
  const tooltip = `${parts.join('; ')}${files > 0 ? ' (a file with errors is not fully checked)' : ''}; click to list them in Problems`;
  return { text, tooltip, level: files > 0 ? 'error' : 'warning' };
}

