// Quick fixes keyed on the diagnostic code (never its wording). Every fix is previewed before it
// is offered (fix-preview.ts): its title's figures are the checker's after the edit, and a fix
// that would leave its diagnostic in place is dropped or says so. The preferred fix is the one
// that clears the diagnostic and moves the output the least.

import type { CancellationToken, CodeAction, Diagnostic, TextEdit } from 'vscode-languageserver/node';
import type { TextDocument } from 'vscode-languageserver-textdocument';
import type { Document } from 'yaml';
import { abs, cmp, div, isExactDecimal, isInteger, mul, rat, sub, toDecimal, toNumber, type Rational } from '../../../shared-schema/src/rational';
import { planOutput } from '../planning/choose';
import type { Hardware, PlanFigures } from '../planning/types';
import type { Analysis, OutputAnalysis } from '../spec/types';
import { formatPpm } from '../cli/units';
import { budgetFixes } from './budget-fixes';
import { SOURCE, type DiagnosticData } from './diagnostics';
import { setKey } from './entry-edits';
import { leavesInPlace, previewFix, quickFix, resultClause, type Recheck } from './fix-preview';
import { jitterFreeNeighbours } from './retarget';
import { SCHEMA_FIX_CODES, schemaFixes } from './schema-fixes';
import { signalFixes } from './signal-fixes';
import { checkCancelled } from './safe';
import { couplingActions } from './coupling-fix';
import { retuneActions } from './retune';

const PREFIXES: ReadonlyArray<[string, bigint]> = [
  ['GHz', 1_000_000_000n],
  ['MHz', 1_000_000n],
  ['kHz', 1_000n],
  ['Hz', 1n],
];

/**
 * Frequency text for the spec: exact when a decimal of up to 24 places holds it (then the plan is
 * exact after the edit), else rounded to 12 places of its unit (then the title shows the tiny error).
 */
export function frequencyText(hz: Rational): string {
  const [unit, scale] = PREFIXES.find(([, s]) => hz.num >= s * hz.den) ?? PREFIXES[PREFIXES.length - 1];
  const value = rat(hz.num, hz.den * scale);
  const exact = toDecimal(value, 24);
  return `${isExactDecimal(value) && exact.split('.')[1]?.length !== 24 ? exact : toDecimal(value, 12)} ${unit}`;
}

/** `{ divider: 3, table-length: 500, cycles: 1 }`, the pinned-plan form of the spec. */
export function planText(plan: Pick<PlanFigures, 'dividerInteger' | 'dividerFraction' | 'fractionBits' | 'tableLength' | 'cycles'>, span: 'open' | 'closed' = 'open'): string {
  const divider = toDecimal(rat(BigInt(plan.dividerInteger) * 2n ** BigInt(plan.fractionBits) + BigInt(plan.dividerFraction), 2n ** BigInt(plan.fractionBits)), 20);
  const spanText = span === 'closed' ? ', table-span: closed' : '';
  return `{ divider: ${divider}, table-length: ${plan.tableLength}, cycles: ${toDecimal(plan.cycles, 20)}${spanText} }`;
}

/** A fix before its preview: the head of its title, its edits, and how it may be offered. */
export interface Candidate {
  head: string;
  edits: (TextEdit | undefined)[];
  /** Fixes that only help when they clear the diagnostic are dropped when they would not. */
  mustClear: boolean;
  /** Preferred when it clears the diagnostic (at most one per diagnostic is kept). */
  preferred?: boolean;
  /** Builds the title from what the checker reports after the edit (default: head + result). */
  title?: (after: OutputAnalysis | undefined) => string;
}

export interface Context {
  doc: TextDocument;
  analysis: Analysis;
  output: OutputAnalysis;
  hw: Hardware;
  d: Diagnostic;
  token: CancellationToken;
}

const pinnedEdit = (c: Context, plan: PlanFigures): TextEdit | undefined => (c.output.request.pinned ? setKey(c.doc, c.output, 'plan', planText(plan)) : undefined);

/** Retarget to the nearest jitter-free frequency below or above; a pinned plan is re-pinned to it. */
function retargets(c: Context): Candidate[] {
  const { output, hw, token } = c;
  const { below, above } = jitterFreeNeighbours(hw, output.request, () => token.isCancellationRequested);
  checkCancelled(token);
  const gap = (p: PlanFigures | null) => (p ? abs(sub(p.achievedHz, output.targetHz)) : undefined);
  const [gb, ga] = [gap(below), gap(above)];
  const closer = gb && (!ga || cmp(gb, ga) <= 0) ? below : above;
  const pin = output.request.pinned ? ' and pin its plan' : '';
  const out: Candidate[] = [];
  for (const [p, side] of [[below, 'below'], [above, 'above']] as const) {
    if (!p) continue;
    out.push({
      head: '',
      edits: [setKey(c.doc, output, 'frequency', frequencyText(p.achievedHz)), pinnedEdit(c, p)],
      mustClear: true,
      preferred: p === closer,
      // The move is from the user's target to the frequency the edit writes, as the checker reads it back.
      title: (after) => {
        const move = after ? toNumber(div(sub(after.targetHz, output.targetHz), output.targetHz)) * 1e6 : NaN;
        return `Retarget ${formatPpm(move)} to the nearest jitter-free frequency ${side}${pin}: ${resultClause(after)}`;
      },
    });
  }
  return out;
}

function allowFractional(c: Context): Candidate[] {
  const frac = c.output.planning.bestFractional;
  if (c.output.request.jitter !== 'forbid' || c.hw.divider.fractionBits === 0 || !frac || frac.jitterFree) return [];
  const pin = c.output.request.pinned ? ' and pin its plan' : '';
  return [{ head: `Allow a fractional divider${pin}`, edits: [setKey(c.doc, c.output, 'jitter', 'allow'), pinnedEdit(c, frac)], mustClear: true }];
}

/** The searched plan for the output's own target, to replace a hand-pinned one. */
function pinNearest(c: Context): Candidate[] {
  const { output, hw } = c;
  const searched = output.request.pinned ? planOutput(hw, { ...output.request, pinned: undefined, jitter: 'forbid' }).nearestJitterFree : output.planning.nearestJitterFree;
  if (!searched) return [];
  // Non-sine shapes want a whole number of samples per cycle; a plan without one cures nothing there.
  const wholeS = output.request.waveform.shape === 'sine' || isInteger(rat(BigInt(searched.tableLength) * searched.cycles.den, searched.cycles.num));
  const ok = cmp(abs(searched.errorHz), output.request.toleranceHz) <= 0;
  return [{ head: 'Pin the nearest jitter-free plan', edits: [setKey(c.doc, output, 'plan', planText(searched))], mustClear: false, preferred: ok && wholeS && !!output.request.pinned }];
}

/** A pinned table with a fractional cycle count: scale N and M by M's denominator, if memory allows. */
function lengthenTable(c: Context): Candidate[] {
  const { output, analysis, hw } = c;
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
  return [
    {
      head: `Lengthen the table to ${length} samples holding ${toDecimal(cycles, 0)} whole cycles (+${extraBytes} B)`,
      edits: [setKey(c.doc, output, 'plan', planText(lengthened))],
      mustClear: true,
      preferred: true,
    },
  ];
}

function candidatesFor(c: Context): Candidate[] {
  switch (c.d.code) {
    case 'out-of-tolerance':
      // A pinned output keeps its target when re-pinning is enough, so that fix comes (and is preferred) first.
      return c.output.request.pinned ? [...pinNearest(c), ...retargets(c), ...allowFractional(c)] : [...retargets(c), ...allowFractional(c), ...pinNearest(c)];
    case 'fractional-plan':
      return retargets(c);
    case 'seam-glitch':
      return [...lengthenTable(c), ...pinNearest(c)];
    case 'pinned-plan':
    case 'samples-per-cycle':
    case 'nyquist':
      return c.output.request.pinned ? pinNearest(c) : [];
    default:
      return signalFixes(c);
  }
}

/** Previews a candidate and turns it into an action, or drops it. */
function offer(c: Context, candidate: Candidate, recheck: Recheck): CodeAction | undefined {
  const edits = candidate.edits.filter((e): e is TextEdit => !!e);
  if (edits.length === 0) return undefined;
  checkCancelled(c.token);
  const preview = previewFix(c.doc, c.analysis, edits, c.d, c.output.name, recheck);
  if (!preview || (candidate.mustClear && !preview.cleared)) return undefined;
  const title = candidate.title ? candidate.title(preview.output) : `${candidate.head}: ${resultClause(preview.output)}`;
  return quickFix(preview.cleared ? title : title + leavesInPlace(c.d.code), c.doc, edits, c.d, preview.cleared && candidate.preferred);
}

function outputOf(analysis: Analysis, d: Diagnostic): OutputAnalysis | undefined {
  const name = (d.data as DiagnosticData | undefined)?.output;
  if (name !== undefined) return analysis.outputs.find((o) => o.name === name);
  const line = d.range.start.line;
  return analysis.outputs.find((o) => o.entryRange.start.line <= line && line <= o.entryRange.end.line);
}

export interface FixContext {
  /** Analyses the document's text with a fix applied (the preview). */
  recheck: Recheck;
  /** The document's syntax tree (parsed once per version). */
  tree: () => Document;
  /** Reads another spec file (the clock file a retune edits), as the analysis does. */
  readFile?: (path: string) => string | undefined;
}

export function codeActions(doc: TextDocument, analysis: Analysis, diagnostics: Diagnostic[], token: CancellationToken, context: FixContext): CodeAction[] {
  const { recheck } = context;
  const hw = analysis.hardware;
  const actions: CodeAction[] = [];
  for (const d of diagnostics) {
    if (d.source !== SOURCE) continue;
    checkCancelled(token);
    if (SCHEMA_FIX_CODES.has(String(d.code))) {
      actions.push(...schemaFixes(doc, context.tree(), analysis, d, recheck));
      continue;
    }
    if (!hw || analysis.kind !== 'wave') continue;
    if (context.readFile) actions.push(...retuneActions(analysis, d, context.readFile), ...couplingActions(analysis, d, context.readFile));
    if (d.code === 'over-budget' || d.code === 'fitted-to-budget') {
      actions.push(...budgetFixes(doc, analysis, d, token, recheck));
      continue;
    }
    const output = outputOf(analysis, d);
    if (!output) continue;
    const c: Context = { doc, analysis, output, hw, d, token };
    for (const candidate of candidatesFor(c)) {
      const action = offer(c, candidate, recheck);
      if (action) actions.push(action);
    }
  }
  // One preferred fix per diagnostic: the first offered (lengthening before re-pinning).
  const seen = new Set<Diagnostic>();
  for (const a of actions) {
    const d = a.diagnostics?.[0];
    if (!a.isPreferred || !d) continue;
    if (seen.has(d)) a.isPreferred = undefined;
    seen.add(d);
  }
  return actions;
}
