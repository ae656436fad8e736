// One compact line after each output's name: what the plan achieves, read off the analysis.
// e.g. "≈99.998 kHz · -19.5 ppm · ÷3 · seam ok". No planning happens here.

import { InlayHintKind, type InlayHint, type Range } from 'vscode-languageserver/node';
import type { TextDocument } from 'vscode-languageserver-textdocument';
import type { PlanFigures } from '../planning/types';
import type { Analysis, OutputAnalysis } from '../spec/types';
import { cmp, mul, rat } from '../../../shared-schema/src/rational';
import { compactHz, formatDivider, formatLsb, formatPpm, formatSeconds, significantText } from '../cli/units';
import { clockShareHint } from './clock-views';
import { stepsHint } from './divider-views';
import { VERDICT_WORDS } from './plan-card';

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
  for (const output of analysis.outputs) {
    const line = output.nameRange.end.line;
    if (line < range.start.line || line > range.end.line) continue;
    const plan = output.planning.plan;
    const label = plan ? hintText(plan) + clockShareHint(output, analysis.hardware) + stepsHint(output) : 'no plan';
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
