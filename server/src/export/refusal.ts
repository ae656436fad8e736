// What stops a spec's plans from becoming C: the findings that make the files impossible (a
// sample width C has no type for, output names that give no unique identifiers), the spec's own
// errors, and a clock file with no hardware to read. One decision, read by `waveplan export`, by
// the editor's export command and by the code lens that offers it, so the lens never offers an
// export the command would refuse.

import { sortedDiagnostics } from '../cli/checked';
import type { Analysis, SpecDiagnostic } from '../spec/types';
import { sampleType } from './c-export';
import { outputIdentifiers } from './identifiers';
import type { ExportedSpec } from './json-export';

/** What the decision reads of a loaded spec. */
export interface ExportSubject {
  file: string;
  analysis: Analysis;
}

const TOP = { start: { line: 0, character: 0 }, end: { line: 0, character: 0 } };

/** Findings that make generated files that cannot compile: `--force` does not override them. */
export function exportProblems(spec: ExportSubject, wantC: boolean): { ids: ExportedSpec['ids']; problems: SpecDiagnostic[] } {
  const problems: SpecDiagnostic[] = [];
  const hw = spec.analysis.hardware;
  if (hw && sampleType(hw.dac.sampleBytes) === null)
    problems.push({
      range: spec.analysis.outputs[0]?.nameRange ?? TOP,
      severity: 'error',
      code: 'sample-width',
      message: `The clock's sample-bytes is ${hw.dac.sampleBytes}; exported tables hold 1, 2 or 4 bytes per sample (uint8_t, uint16_t, uint32_t).`,
    });
  if (hw && hw.dac.bits > 8 * hw.dac.sampleBytes)
    problems.push({
      range: TOP,
      severity: 'error',
      code: 'sample-width',
      message: `A ${hw.dac.bits}-bit code does not fit ${hw.dac.sampleBytes} byte(s) per sample; raise sample-bytes in the clock file.`,
    });
  if (!wantC) return { ids: null, problems };
  const { ids, diagnostics } = outputIdentifiers(spec.file, spec.analysis.outputs);
  return { ids, problems: problems.concat(diagnostics) };
}

/** Why an export without --force writes nothing, or null when it may write. */
export type ExportRefusal = { kind: 'findings'; findings: SpecDiagnostic[] } | { kind: 'no-hardware'; findings: [] };

export type ExportDecision = ExportRefusal | { kind: 'ready'; ids: NonNullable<ExportedSpec['ids']> };

/** The C export's decision for one spec, as the editor (which has no --force) takes it. */
export function exportDecision(spec: ExportSubject): ExportDecision {
  const { ids, problems } = exportProblems(spec, true);
  // In reading order (the checker's), so the first named is the first the reader meets.
  const findings = sortedDiagnostics(spec.analysis.diagnostics.filter((d) => d.severity === 'error').concat(problems));
  if (findings.length > 0) return { kind: 'findings', findings };
  if (!spec.analysis.hardware || ids === null) return { kind: 'no-hardware', findings: [] };
  return { kind: 'ready', ids };
}

function plural(n: number, word: string): string {
  return `${n} ${word}${n === 1 ? '' : 's'}`;
}

/** "2 errors" / "no hardware could be read from its clock file": the refusal in a few words. */
export function refusalWords(refusal: ExportRefusal): string {
  return refusal.kind === 'findings' ? plural(refusal.findings.length, 'error') : 'no hardware could be read from its clock file';
}
