// A quick fix is checked before it is offered: its edits are applied to a copy of the text, the
// copy is analysed by the same analyze() the checker runs, and the title's figures are read off
// that analysis. So a title can only state what the checker will say after the fix, and a fix
// that leaves its diagnostic in place says so (or is not offered at all).

import type { CodeAction, Diagnostic, TextEdit } from 'vscode-languageserver/node';
import { CodeActionKind } from 'vscode-languageserver/node';
import { TextDocument } from 'vscode-languageserver-textdocument';
import { sign } from '../../../shared-schema/src/rational';
import type { PlanFigures } from '../planning/types';
import type { Analysis, OutputAnalysis } from '../spec/types';
import { compactHz, formatCycles, formatDivider, formatPpm, formatSeconds } from '../cli/units';
import type { DiagnosticData } from './diagnostics';

/** Analyses the open document's text with a fix applied; undefined when it cannot. */
export type Recheck = (text: string) => Analysis | undefined;

export interface Preview {
  /** The whole analysis after the fix. */
  analysis: Analysis;
  /** The fixed output after the fix (undefined when it is no longer planned). */
  output: OutputAnalysis | undefined;
  /** The diagnostic the fix was offered for is gone: fewer of its code for its output. */
  cleared: boolean;
}

const outputOfDiagnostic = (d: Diagnostic): string | undefined => (d.data as DiagnosticData | undefined)?.output;

function count(analysis: Analysis, code: Diagnostic['code'], output: string | undefined): number {
  return analysis.diagnostics.filter((x) => x.code === code && x.output === output).length;
}

export function previewFix(doc: TextDocument, before: Analysis, edits: TextEdit[], d: Diagnostic, name: string, recheck: Recheck): Preview | undefined {
  const after = recheck(TextDocument.applyEdits(doc, edits));
  if (!after) return undefined;
  const owner = outputOfDiagnostic(d);
  return {
    analysis: after,
    output: after.outputs.find((o) => o.name === name),
    cleared: count(after, d.code, owner) < count(before, d.code, owner),
  };
}

/** "exact", "within tolerance" or "out of tolerance": the verdict on a plan against its own target. */
export function standing(output: OutputAnalysis, plan: PlanFigures): string {
  if (!output.planning.withinTolerance) return 'out of tolerance';
  return sign(plan.errorHz) === 0 ? 'exact' : 'within tolerance';
}

/**
 * What the checker will report for the output after the fix, in one fixed form the protocol test
 * reads back: "exact at 5 kHz (0 ppm), ÷6, N = 5000, M = 1[, 2.08 ns rms period jitter]".
 */
export function resultClause(output: OutputAnalysis | undefined): string {
  const plan = output?.planning.plan;
  if (!output || !plan) return 'no plan';
  const jitter = plan.jitterFree ? '' : `, ${formatSeconds(plan.jitter.samplePeriodJitterRmsS)} rms period jitter`;
  return `${standing(output, plan)} at ${compactHz(plan.achievedHz)} (${formatPpm(plan.errorPpm)}), ${formatDivider(plan)}, N = ${plan.tableLength}, M = ${formatCycles(plan.cycles)}${jitter}`;
}

/** The plain words for a diagnostic a fix leaves in place. */
export const leavesInPlace = (code: Diagnostic['code']): string => ` — does not clear ${String(code)}`;

export function quickFix(title: string, doc: TextDocument, edits: TextEdit[], d: Diagnostic, preferred = false): CodeAction {
  return {
    title,
    kind: CodeActionKind.QuickFix,
    diagnostics: [d],
    isPreferred: preferred || undefined,
    edit: { changes: { [doc.uri]: edits } },
  };
}
