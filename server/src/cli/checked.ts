// What one run of the checker produced, shared by the text, JSON and SARIF formatters.

import type { Analysis, SpecDiagnostic } from '../spec/types';

export interface CheckedFile {
  /** Path relative to the working directory, with forward slashes (stable across machines). */
  path: string;
  analysis: Analysis;
}

export interface Tally {
  files: number;
  outputs: number;
  errors: number;
  warnings: number;
  information: number;
}

export function tally(files: readonly CheckedFile[]): Tally {
  const all: SpecDiagnostic[] = files.flatMap((f) => f.analysis.diagnostics);
  return {
    files: files.length,
    outputs: files.reduce((n, f) => n + f.analysis.outputs.length, 0),
    errors: all.filter((d) => d.severity === 'error').length,
    warnings: all.filter((d) => d.severity === 'warning').length,
    information: all.filter((d) => d.severity === 'information').length,
  };
}

/** Diagnostics in reading order: by line, then column, then code (stable output for CI diffs). */
export function sortedDiagnostics(diagnostics: readonly SpecDiagnostic[]): SpecDiagnostic[] {
  return [...diagnostics].sort(
    (a, b) =>
      a.range.start.line - b.range.start.line ||
      a.range.start.character - b.range.start.character ||
      (a.code < b.code ? -1 : a.code > b.code ? 1 : 0),
  );
}
