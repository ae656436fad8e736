// Quick fixes keyed on the diagnostic code (never its wording). The preferred fix is the one that
// clears the diagnostic and moves the output the least.

import { CodeActionKind, type CancellationToken, type CodeAction, type Diagnostic, type TextEdit } from 'vscode-languageserver/node';
import type { TextDocument } from 'vscode-languageserver-textdocument';
import { abs, cmp, isInteger, mul, rat, sub, toDecimal, type Rational } from '../../../shared-schema/src/rational';
import { planOutput } from '../planning/choose';
import type { Hardware, PlanFigures } from '../planning/types';
import type { Analysis, OutputAnalysis } from '../spec/types';
import { formatSeconds } from '../cli/units';
import { SOURCE, type DiagnosticData } from './diagnostics';
import { setKey } from './entry-edits';
import { compactHz, compactPpm } from './inlay-hints';
import { jitterFreeNeighbours } from './retarget';
import { checkCancelled } from './safe';

const PREFIXES: ReadonlyArray<[string, bigint]> = [
  ['GHz', 1_000_000_000n],
  ['MHz', 1_000_000n],
  ['kHz', 1_000n],
  ['Hz', 1n],
];

/** Frequency text for the spec: exact when 12 decimals hold it, else within 1e-12 of it in its unit. */
export function frequencyText(hz: Rational): string {
  const [unit, scale] = PREFIXES.find(([, s]) => hz.num >= s * hz.den) ?? PREFIXES[PREFIXES.length - 1];
  return `${toDecimal(rat(hz.num, hz.den * scale), 12)} ${unit}`;
}

/** `{ divider: 3, table-length: 500, cycles: 1 }`, the pinned-plan form of the spec. */
export function planText(plan: PlanFigures, span: 'open' | 'closed' = 'open'): string {
  const divider = toDecimal(rat(BigInt(plan.dividerInteger) * 2n ** BigInt(plan.fractionBits) + BigInt(plan.dividerFraction), 2n ** BigInt(plan.fractionBits)), 20);
  const spanText = span === 'closed' ? ', table-span: closed' : '';
  return `{ divider: ${divider}, table-length: ${plan.tableLength}, cycles: ${toDecimal(plan.cycles, 20)}${spanText} }`;
}

function action(title: string, doc: TextDocument, edit: TextEdit | undefined, diagnostic: Diagnostic, preferred = false): CodeAction | undefined {
  if (!edit) return undefined;
  return {
    title,
    kind: CodeActionKind.QuickFix,
    diagnostics: [diagnostic],
    isPreferred: preferred || undefined,
    edit: { changes: { [doc.uri]: [edit] } },
  };
}

const within = (p: PlanFigures, output: OutputAnalysis): boolean => cmp(abs(p.errorHz), output.request.toleranceHz) <= 0;
const describe = (p: PlanFigures): string => `${compactHz(p.achievedHz)}, ÷${p.dividerInteger}, N = ${p.tableLength}, M = ${toDecimal(p.cycles, 6)}`;

function retargets(doc: TextDocument, output: OutputAnalysis, hw: Hardware, d: Diagnostic, token: CancellationToken): CodeAction[] {
  const { below, above } = jitterFreeNeighbours(hw, output.request, () => token.isCancellationRequested);
  checkCancelled(token);
  const gap = (p: PlanFigures | null) => (p ? abs(sub(p.achievedHz, output.targetHz)) : undefined);
  const [gb, ga] = [gap(below), gap(above)];
  const closer = gb && (!ga || cmp(gb, ga) <= 0) ? below : above;
  const out: (CodeAction | undefined)[] = [];
  for (const [p, side] of [[below, 'below'], [above, 'above']] as const) {
    if (!p) continue;
    out.push(
      action(
        `Retarget to ${compactHz(p.achievedHz)}, the nearest jitter-free frequency ${side} (${compactPpm(p.errorPpm)}; ÷${p.dividerInteger}, N = ${p.tableLength}, M = ${toDecimal(p.cycles, 6)})`,
        doc,
        setKey(doc, output, 'frequency', frequencyText(p.achievedHz)),
        d,
        p === closer,
      ),
    );
  }
  return out.filter((a): a is CodeAction => !!a);
}

function allowFractional(doc: TextDocument, output: OutputAnalysis, hw: Hardware, d: Diagnostic): CodeAction[] {
  const frac = output.planning.bestFractional;
  if (output.request.jitter !== 'forbid' || hw.divider.fractionBits === 0 || !frac || frac.jitterFree || !within(frac, output)) return [];
  const title = `Allow a fractional divider: ÷${frac.dividerInteger}+${frac.dividerFraction}/${2 ** frac.fractionBits} reaches ${compactHz(frac.achievedHz)} (${compactPpm(frac.errorPpm)}) with ${formatSeconds(frac.jitter.samplePeriodJitterRmsS)} rms period jitter`;
  const a = action(title, doc, setKey(doc, output, 'jitter', 'allow'), d);
  return a ? [a] : [];
}

/** The searched plan for the output's own target, to replace a hand-pinned one. */
function pinNearest(doc: TextDocument, output: OutputAnalysis, hw: Hardware, d: Diagnostic): CodeAction[] {
  const searched = output.request.pinned ? planOutput(hw, { ...output.request, pinned: undefined, jitter: 'forbid' }).nearestJitterFree : output.planning.nearestJitterFree;
  if (!searched) return [];
  const ok = within(searched, output);
  // Non-sine shapes want a whole number of samples per cycle; a plan without one cures nothing there.
  const wholeS = output.request.waveform.shape === 'sine' || isInteger(rat(BigInt(searched.tableLength) * searched.cycles.den, searched.cycles.num));
  const title = `Pin the nearest jitter-free plan: ${describe(searched)} (${compactPpm(searched.errorPpm)}${ok ? '' : ', still out of tolerance'})`;
  const a = action(title, doc, setKey(doc, output, 'plan', planText(searched)), d, ok && wholeS && !!output.request.pinned);
  return a ? [a] : [];
}

/** A pinned table with a fractional cycle count: scale N and M by M's denominator, if memory allows. */
function lengthenTable(doc: TextDocument, output: OutputAnalysis, analysis: Analysis, hw: Hardware, d: Diagnostic): CodeAction[] {
  const pinned = output.request.pinned;
  const plan = output.planning.plan;
  if (!pinned || !plan || pinned.span !== 'open' || isInteger(pinned.cycles)) return [];
  const k = Number(pinned.cycles.den);
  const length = pinned.tableLength * k;
  const extraBytes = (length - pinned.tableLength) * hw.dac.sampleBytes;
  const used = analysis.memory?.usedBytes ?? plan.tableBytes;
  const fits =
    length <= hw.memory.tableLengthMax &&
    (!hw.memory.powerOfTwo || (length & (length - 1)) === 0) &&
    used + extraBytes <= hw.memory.budgetBytes;
  if (!fits) return [];
  const cycles = mul(pinned.cycles, rat(k));
  const lengthened = { ...plan, tableLength: length, cycles };
  const title = `Lengthen the table to ${length} samples holding ${toDecimal(cycles, 0)} whole cycles (+${extraBytes} B; the frequency stays the same)`;
  const a = action(title, doc, setKey(doc, output, 'plan', planText(lengthened)), d, true);
  return a ? [a] : [];
}

function outputOf(analysis: Analysis, d: Diagnostic): OutputAnalysis | undefined {
  const name = (d.data as DiagnosticData | undefined)?.output;
  if (name !== undefined) return analysis.outputs.find((o) => o.name === name);
  const line = d.range.start.line;
  return analysis.outputs.find((o) => o.entryRange.start.line <= line && line <= o.entryRange.end.line);
}

export function codeActions(doc: TextDocument, analysis: Analysis, diagnostics: Diagnostic[], token: CancellationToken): CodeAction[] {
  const hw = analysis.hardware;
  if (!hw || analysis.kind !== 'wave') return [];
  const actions: CodeAction[] = [];
  for (const d of diagnostics) {
    if (d.source !== SOURCE) continue;
    const output = outputOf(analysis, d);
    if (!output) continue;
    checkCancelled(token);
    switch (d.code) {
      case 'out-of-tolerance':
        actions.push(...retargets(doc, output, hw, d, token), ...allowFractional(doc, output, hw, d), ...pinNearest(doc, output, hw, d));
        break;
      case 'fractional-plan':
        actions.push(...retargets(doc, output, hw, d, token));
        break;
      case 'seam-glitch':
        actions.push(...lengthenTable(doc, output, analysis, hw, d), ...pinNearest(doc, output, hw, d));
        break;
      case 'pinned-plan':
      case 'samples-per-cycle':
      case 'nyquist':
        if (output.request.pinned) actions.push(...pinNearest(doc, output, hw, d));
        break;
    }
  }
  // One preferred fix per diagnostic: lengthening beats re-pinning when both are offered.
  const seen = new Set<Diagnostic>();
  for (const a of actions) {
    const d = a.diagnostics?.[0];
    if (!a.isPreferred || !d) continue;
    if (seen.has(d)) a.isPreferred = undefined;
    seen.add(d);
  }
  return actions;
}
