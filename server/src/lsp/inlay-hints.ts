// One compact line after each output's name: what the plan achieves, read off the analysis.
// e.g. "≈ 99.998 kHz · −19.5 ppm · ÷3 · seam ok". No planning happens here.

import { InlayHintKind, type InlayHint, type Range } from 'vscode-languageserver/node';
import type { TextDocument } from 'vscode-languageserver-textdocument';
import { abs, eq, fromNumber, mul, parseDecimal, toNumber, type Rational } from '../../../shared-schema/src/rational';
import type { PlanFigures } from '../planning/types';
import type { Analysis, OutputAnalysis } from '../spec/types';
import { formatDivider, formatSeconds } from '../cli/units';
import { VERDICT_WORDS } from './plan-card';

const PREFIXES: ReadonlyArray<[string, number]> = [
  ['GHz', 1e9],
  ['MHz', 1e6],
  ['kHz', 1e3],
  ['Hz', 1],
  ['mHz', 1e-3],
];

/** Six significant digits; "≈" marks a figure that rounding changed. */
export function compactHz(hz: Rational): string {
  const value = toNumber(abs(hz));
  const [unit, scale] = PREFIXES.find(([, s]) => value >= s) ?? PREFIXES[PREFIXES.length - 1];
  const shown = Number((value / scale).toPrecision(6));
  const back = parseDecimal(String(shown));
  const exact = back !== undefined && eq(mul(back, fromNumber(scale)), abs(hz));
  return `${exact ? '' : '≈ '}${shown} ${unit}`;
}

/**
 * Signed error with a real minus sign and three significant digits, in ppb below 0.01 ppm so a
 * tiny error stays short (the editor truncates long annotations, 43 characters by default).
 */
export function compactPpm(ppm: number): string {
  if (ppm === 0) return '0 ppm';
  const ppb = Math.abs(ppm) < 0.01;
  const shown = Number((Math.abs(ppm) * (ppb ? 1000 : 1)).toPrecision(3));
  return `${ppm < 0 ? '−' : '+'}${shown} ${ppb ? 'ppb' : 'ppm'}`;
}

export function hintText(plan: PlanFigures): string {
  const parts = [compactHz(plan.achievedHz), compactPpm(plan.errorPpm), formatDivider(plan)];
  // RMS sample-period jitter; the hover card gives the peak-to-peak and TIE figures.
  if (!plan.jitterFree) parts.push(`jitter ${formatSeconds(plan.jitter.samplePeriodJitterRmsS)}`);
  parts.push(plan.seam.ok ? 'seam ok' : `seam jump ${Number(plan.seam.jumpLsb.toPrecision(3))} LSB`);
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
    const label = plan ? hintText(plan) : 'no plan';
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
