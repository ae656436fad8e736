// One compact line after each output's name: what the plan achieves, read off the analysis.
// e.g. "≈99.998 kHz · -19.5 ppm · ÷3 · seam ok". No planning happens here.
// The verdict shows in the text itself, not only in the colour of a squiggle: the label starts with
// ERROR_MARK when the output has an error finding (out of tolerance, no plan, …) and with
// WARNING_MARK when its worst finding is a warning; a clean output carries no mark.

import { InlayHintKind, type InlayHint, type Range } from 'vscode-languageserver/node';
import type { TextDocument } from 'vscode-languageserver-textdocument';
import type { PlanFigures } from '../planning/types';
import type { Analysis, OutputAnalysis } from '../spec/types';
import { cmp, mul, rat } from '../../../shared-schema/src/rational';
import { compactHz, formatDivider, formatLsb, formatPpm, formatSeconds, significantText } from '../cli/units';
import { clockShareHint } from './clock-views';
import { stepsHint } from './divider-views';
import { VERDICT_WORDS } from './plan-card';

const ERROR_MARK = '✗';
const WARNING_MARK = '⚠';

/** Each output's worst finding in this analysis (one pass over the diagnostics). */
function worstFindings(analysis: Analysis): Map<string, 'error' | 'warning'> {
  const worst = new Map<string, 'error' | 'warning'>();
  for (const d of analysis.diagnostics) {
    if (d.output === undefined || worst.get(d.output) === 'error') continue;
    if (d.severity === 'error' || d.severity === 'warning') worst.set(d.output, d.severity);
  }
  return worst;
}

/** The mark for an output's worst finding, or '' when it has none. */
function verdictMark(output: OutputAnalysis, worst: Map<string, 'error' | 'warning'>): string {
  if (output.planning.plan === null || output.planning.verdict === 'out-of-tolerance') return ERROR_MARK;
  const finding = worst.get(output.name);
  return finding === 'error' ? ERROR_MARK : finding === 'warning' ? WARNING_MARK : '';
}

export function hintText(plan: PlanFigures): string {
  const parts = [compactHz(plan.achievedHz), formatPpm(plan.errorPpm), formatDivider(plan)];
  // RMS sample-period jitter; the hover card gives the peak-to-peak and TIE figures.
  if (!plan.jitterFree) parts.push(`jitter ${formatSeconds(plan.jitter.samplePeriodJitterRmsS)}`);
  parts.push(plan.seam.ok ? 'seam ok' : `seam jump ${formatLsb(plan.seam.jumpLsb)}`);
  // A square's duty when the table's whole samples cannot hold the asked one exactly.
  if (plan.dutyAchieved && plan.dutyAsked && cmp(plan.dutyAchieved, plan.dutyAsked) !== 0) parts.push(`duty ${significantText(mul(plan.dutyAchieved, rat(100)), 4)} %`);
  return parts.join(' · ');
}

/** Just after the colon that ends the output's key, or after the name when there is none. */
function anchor(doc: TextDocument, output: OutputAnalysis): { line: number; character: number } {
  const end = output.nameRange.end;
  const line = doc.getText({ start: end, end: { line: end.line, character: end.character + 200 } });
  const colon = /^\s*:/.exec(line);
  return colon ? { line: end.line, character: end.character + colon[0].length } : end;
}

export function inlayHints(doc: TextDocument, analysis: Analysis, range: Range): InlayHint[] {
  const hints: InlayHint[] = [];
  const worst = worstFindings(analysis);
  for (const output of analysis.outputs) {
    const line = output.nameRange.end.line;
    if (line < range.start.line || line > range.end.line) continue;
    const plan = output.planning.plan;
    const text = plan ? hintText(plan) + clockShareHint(output, analysis.hardware) + stepsHint(output) : 'no plan';
    const mark = verdictMark(output, worst);
    const label = mark ? `${mark} ${text}` : text;
    hints.push({
      position: anchor(doc, output),
      label,
      kind: InlayHintKind.Type,
      paddingLeft: true,
      // The whole annotation again: the editor may have truncated the label.
      tooltip: `${output.name}: ${VERDICT_WORDS[output.planning.verdict]} — ${label}`,
    });
  }
  return hints;
}
