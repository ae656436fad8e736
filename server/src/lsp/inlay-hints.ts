// One compact line after each output's name: what the plan achieves, read off the analysis.
// e.g. "≈99.998 kHz · -19.5 ppm · ÷3 · seam ok". No planning happens here.
// The verdict shows in the text itself, not only in the colour of a squiggle: the label starts with
// ERROR_MARK when the output has an error finding (out of tolerance, no plan, …) and with
// WARNING_MARK when its worst finding is a warning; a clean output carries no mark.
// VS Code cuts an inlay hint's label at `editor.inlayHints.maximumLength` characters (43 by
// default, from memory), so the label holds the parts that fit in order of importance and ends
// with "…" when one is left out; the tooltip always carries every part.

import { InlayHintKind, type InlayHint, type Range } from 'vscode-languageserver/node';
import type { TextDocument } from 'vscode-languageserver-textdocument';
import type { PlanFigures } from '../planning/types';
import { outputFigures, QUICK_SPECTRUM } from '../signal/output-signal';
import type { Analysis, OutputAnalysis } from '../spec/types';
import { cmp, mul, rat } from '../../../shared-schema/src/rational';
import { compactHz, formatDivider, formatLsb, formatPpm, formatSeconds, significantText } from '../cli/units';
import { clockShareHint } from './clock-views';
import { stepsHint } from './divider-views';
import { VERDICT_WORDS } from './plan-card';

const ERROR_MARK = '✗';
const WARNING_MARK = '⚠';
/** The label's length budget: VS Code's default `editor.inlayHints.maximumLength`. */
export const LABEL_LIMIT = 43;
const SEPARATOR = ' · ';
const MORE = ' …';

/** One piece of an annotation: its place in the line and its rank when space is short (0 first). */
interface Part {
  text: string;
  rank: number;
}

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

/** The plan's parts in reading order, each ranked: frequency and error first, then what is wrong. */
function planParts(plan: PlanFigures): Part[] {
  const parts: Part[] = [
    { text: compactHz(plan.achievedHz), rank: 0 },
    { text: formatPpm(plan.errorPpm), rank: 0 },
    { text: formatDivider(plan), rank: 3 },
  ];
  // RMS sample-period jitter; the hover card gives the peak-to-peak and TIE figures.
  if (!plan.jitterFree) parts.push({ text: `jitter ${formatSeconds(plan.jitter.samplePeriodJitterRmsS)}`, rank: 2 });
  parts.push(plan.seam.ok ? { text: 'seam ok', rank: 4 } : { text: `seam jump ${formatLsb(plan.seam.jumpLsb)}`, rank: 1 });
  // A square's duty when the table's whole samples cannot hold the asked one exactly.
  if (plan.dutyAchieved && plan.dutyAsked && cmp(plan.dutyAchieved, plan.dutyAsked) !== 0)
    parts.push({ text: `duty ${significantText(mul(plan.dutyAchieved, rat(100)), 4)} %`, rank: 2 });
  return parts;
}

/** Every part of the annotation, in one line: what the symbol outline and the tooltip show. */
export function hintText(plan: PlanFigures): string {
  return planParts(plan)
    .map((p) => p.text)
    .join(SEPARATOR);
}

/** The parts that fit `limit` (rank 0 always), in reading order, with "…" when any is left out. */
export function fitLabel(parts: readonly Part[], limit: number): string {
  const kept = new Set<Part>(parts.filter((p) => p.rank === 0));
  const length = (set: Set<Part>) => parts.filter((p) => set.has(p)).map((p) => p.text).join(SEPARATOR).length + (set.size < parts.length ? MORE.length : 0);
  for (const part of [...parts].filter((p) => p.rank > 0).sort((a, b) => a.rank - b.rank)) {
    kept.add(part);
    if (length(kept) > limit) kept.delete(part);
  }
  const text = parts.filter((p) => kept.has(p)).map((p) => p.text).join(SEPARATOR);
  return kept.size < parts.length ? text + MORE : text;
}

/** Just after the colon that ends the output's key, or after the name when there is none. */
function anchor(doc: TextDocument, output: OutputAnalysis): { line: number; character: number } {
  const end = output.nameRange.end;
  const line = doc.getText({ start: end, end: { line: end.line, character: end.character + 200 } });
  const colon = /^\s*:/.exec(line);
  return colon ? { line: end.line, character: end.character + colon[0].length } : end;
}

export interface HintOptions {
  /** Add the emitted signal's SFDR (a spectrum per output shown; the `waveplan.annotations.sfdr` setting). */
  sfdr: boolean;
}

/** The SFDR part, from the same lazily computed, memoised figures the hover reads, in its words. */
function sfdrPart(output: OutputAnalysis, analysis: Analysis): Part | null {
  const plan = output.planning.plan;
  if (!plan || !analysis.hardware) return null;
  const sfdr = outputFigures(analysis.hardware, output.request, plan, QUICK_SPECTRUM).sfdrDb;
  return { text: sfdr === null ? 'SFDR unbounded' : `SFDR ${sfdr.toFixed(1)} dB`, rank: 2 };
}

function outputParts(output: OutputAnalysis, analysis: Analysis, options: HintOptions): Part[] {
  const plan = output.planning.plan;
  if (!plan) return [{ text: 'no plan', rank: 0 }];
  const parts = planParts(plan);
  const sfdr = options.sfdr ? sfdrPart(output, analysis) : null;
  if (sfdr) parts.push(sfdr);
  // The worst case with the clock's own tolerance, and frequency steps: the tooltip's, when space is short.
  const share = clockShareHint(output, analysis.hardware).replace(/^ · /, '');
  if (share) parts.push({ text: share, rank: 5 });
  const steps = stepsHint(output).replace(/^ · /, '');
  if (steps) parts.push({ text: steps, rank: 5 });
  return parts;
}

export function inlayHints(doc: TextDocument, analysis: Analysis, range: Range, options: HintOptions = { sfdr: false }): InlayHint[] {
  const hints: InlayHint[] = [];
  const worst = worstFindings(analysis);
  for (const output of analysis.outputs) {
    const line = output.nameRange.end.line;
    if (line < range.start.line || line > range.end.line) continue;
    const parts = outputParts(output, analysis, options);
    const mark = verdictMark(output, worst);
    const lead = mark ? `${mark} ` : '';
    const label = lead + fitLabel(parts, LABEL_LIMIT - lead.length);
    hints.push({
      position: anchor(doc, output),
      label,
      kind: InlayHintKind.Type,
      paddingLeft: true,
      // Every part: the label may hold only those that fit.
      tooltip: `${output.name}: ${VERDICT_WORDS[output.planning.verdict]} — ${lead}${parts.map((p) => p.text).join(SEPARATOR)}`,
    });
  }
  return hints;
}
