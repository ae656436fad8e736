// The planner's verdict on one output → diagnostics: out of tolerance, a fractional divider and
// its jitter, no plan at all, a broken seam, samples per cycle, a table over the budget.

import { NYQUIST_SAMPLES_PER_CYCLE } from '../../../shared-schema/src/defaults';
import { formatBytes, formatHz, formatLsb, formatPpm, formatSeconds, significantText } from '../../../shared-schema/src/quantity-format';
import { type Rational, cmp, div, isInteger, mul, rat, toDecimal } from '../../../shared-schema/src/rational';
import type { Hardware, OutputPlanning, PlanFigures } from '../planning/types';
import { clockAccuracyDiagnostic, clockBudgetText } from './clock-budget';
import { type Code } from './codes';
import { diagnostic } from './source';
import type { Range, SpecDiagnostic } from './types';
import { stepsDiagnostics } from './steps-diagnostics';
import type { OutputDraft } from './wave-model';

/** D = I + F/2^k as exact decimal text: "3", "1.953125". */
export function dividerText(p: { dividerInteger: number; dividerFraction: number; fractionBits: number }): string {
  const steps = 1n << BigInt(p.fractionBits);
  return toDecimal(rat(BigInt(p.dividerInteger) * steps + BigInt(p.dividerFraction), steps), 24);
}

const ratText = (r: Rational): string => (isInteger(r) ? r.num.toString() : toDecimal(r, 6));

/** A duty as a percentage with four significant digits: 13/25 → "52 %". */
export const dutyText = (d: Rational): string => `${significantText(mul(d, rat(100)), 4)} %`;

/**
 * A square's duty as the table plays it, with the asked one when they differ: "52 % duty
 * (50 % asked)", "50 % duty"; null for other shapes (the reports and the export quote it).
 */
export function dutyPhrase(p: PlanFigures): string | null {
  if (!p.dutyAchieved || !p.dutyAsked) return null;
  const asked = cmp(p.dutyAchieved, p.dutyAsked) === 0 ? '' : ` (${dutyText(p.dutyAsked)} asked)`;
  return `${dutyText(p.dutyAchieved)} duty${asked}`;
}

/** "divider 3, 500 samples, 1 cycle → 100 kHz (0 ppm)". */
export function planText(p: PlanFigures): string {
  const cycles = ratText(p.cycles);
  const stages = p.dividerStages !== undefined && p.dividerStages.length > 1 ? ` (${p.dividerStages.map((st) => `${st.name} ${st.value}`).join(' × ')})` : '';
  return `divider ${dividerText(p)}${stages}, ${p.tableLength} samples, ${cycles} cycle${cycles === '1' ? '' : 's'} → ${formatHz(p.achievedHz)} (${formatPpm(p.errorPpm)})`;
}

const jitterText = (p: PlanFigures): string =>
  `${formatSeconds(p.jitter.tieRmsS)} RMS (${formatSeconds(p.jitter.tiePkPkS)} peak-to-peak) time-interval error`;

export function planningDiagnostics(draft: OutputDraft, planning: OutputPlanning, hw: Hardware, toleranceText: string): SpecDiagnostic[] {
  const out: SpecDiagnostic[] = [];
  const r = draft.valueRanges;
  const pinned = draft.request.pinned !== undefined;
  const push = (code: Code, range: Range, message: string, severity?: SpecDiagnostic['severity']) => {
    const d = diagnostic(code, range, message, draft.name);
    if (severity) d.severity = severity;
    out.push(d);
  };
  const planRange = (key?: string): Range => (key && r[`plan.${key}`]) || r.plan || draft.nameRange;
  const plan = planning.plan;

  if (planning.verdict === 'no-plan' || !plan) {
    push('no-plan', draft.nameRange, `No divider and table length on this clock can make ${formatHz(draft.targetHz)}: check it against the sample-rate, table-length and memory limits of the clock file.`);
    return out;
  }

  const clockAlone = planning.steps ? undefined : clockAccuracyDiagnostic(draft, hw, toleranceText);
  if (planning.steps) {
    out.push(...stepsDiagnostics(draft, planning.steps, hw, planText, jitterText));
  } else if (clockAlone) {
    out.push(clockAlone);
  } else if (!planning.withinTolerance) {
    const alt = planning.nearestJitterFree;
    const nearest = alt && !sameDivider(alt, plan) ? `; the nearest jitter-free plan is ${planText(alt)}` : '';
    const budget = clockBudgetText(plan, draft, hw);
    const fix = pinned ? 'change the pinned plan or widen the tolerance' : 'widen the tolerance, allow jitter, or change the clock';
    push('out-of-tolerance', pinned ? planRange() : (r.frequency ?? draft.nameRange), `${pinned ? 'The pinned plan' : 'The best plan'} is ${planText(plan)}${budget.worst}, outside ±${toleranceText}${budget.share}${nearest}: ${fix}.`);
  } else if (!plan.jitterFree) {
    const why = pinned ? 'The pinned divider is fractional' : `Only a fractional divider meets ±${toleranceText}`;
    const fix = pinned ? 'accept it or pin a whole divider' : 'accept it, or widen the tolerance for a jitter-free plan';
    push('fractional-plan', pinned ? planRange('divider') : (r.jitter ?? r.frequency ?? draft.nameRange), `${why}: ${planText(plan)} with ${jitterText(plan)} — ${fix}.`);
  }

  const dutyMiss = planning.dutyMiss;
  if (dutyMiss && plan.dutyAchieved && plan.dutyAsked && draft.request.duty) {
    const s = div(rat(BigInt(plan.tableLength)), plan.cycles);
    const high = mul(plan.dutyAchieved, s);
    const tol = draft.request.duty.tolerance;
    const near = dutyMiss.nearestDuty;
    const nearText = near && near.dutyAchieved && !sameDivider(near, plan) ? `; the nearest duty within ±${toleranceText} is ${dutyText(near.dutyAchieved)} with ${planText(near)}` : '';
    const exact = dutyMiss.exactDuty;
    const exactText = exact ? `; ${planText(exact)} holds ${dutyText(plan.dutyAsked)} exactly` : `; no plan on this clock holds ${dutyText(plan.dutyAsked)} exactly`;
    const fix = pinned ? 'pin a table whose samples per cycle hold the duty, or widen duty-tolerance' : 'widen duty-tolerance or the frequency tolerance, or accept the duty';
    push('duty-missed', pinned ? planRange('table-length') : (r.duty ?? draft.nameRange), `${ratText(s)} samples per cycle give ${dutyText(plan.dutyAchieved)} duty (${ratText(high)} high), not ${dutyText(plan.dutyAsked)} within ±${dutyText(tol)}, and no plan within ±${toleranceText} holds it${nearText}${exactText}: ${fix}.`);
  }

  if (plan.searchLimited) {
    push('search-limit', draft.nameRange, `The plan search stopped at its work limit (this output's share of the file's planning work) on this clock's very large divider × table-length domain, so ${planText(plan)} is the best found, not proven the nearest: narrow divider.integer or table-length, or plan fewer outputs in this file, for a proven optimum.`);
  }

  if (!plan.seam.ok) {
    const cause =
      plan.seam.cause === 'fractional-cycles'
        ? { why: `the table holds ${ratText(plan.cycles)} cycles, not a whole number`, fix: 'make cycles a whole number', key: 'cycles' }
        : plan.seam.cause === 'repeated-sample'
          ? { why: 'the table spans N − 1 intervals, so its last sample repeats the first', fix: 'set table-span: open and make the table span N intervals', key: 'table-span' }
          : { why: 'the rounded samples at the wrap do not follow the waveform', fix: 'check how the table is rounded', key: 'table-length' };
    const jump = Number(plan.seam.jumpLsb.toPrecision(3));
    // A whole-table fault (fractional cycles, a repeated sample) is a glitch whatever the jump in
    // value: half a sine cycle wraps with no jump in value but turns the waveform back.
    const structural = plan.seam.cause !== 'quantisation';
    push('seam-glitch', pinned ? planRange(cause.key) : draft.nameRange, `The table wrap breaks the waveform (${formatLsb(plan.seam.jumpLsb)} off its own next step) because ${cause.why}: ${cause.fix}.`, structural || jump >= 1 ? 'warning' : 'information');
  }

  const s = div(rat(BigInt(plan.tableLength)), plan.cycles);
  const sText = ratText(s);
  if (pinned && draft.request.waveform.shape === 'sine' && cmp(s, rat(NYQUIST_SAMPLES_PER_CYCLE)) <= 0) {
    push('nyquist', planRange('table-length'), `This plan has ${sText} samples per cycle, at or below the 2 a sine needs (Nyquist): hold fewer cycles or more samples.`);
  } else if (pinned && cmp(s, draft.request.minSamplesPerCycle) < 0) {
    push('samples-per-cycle', planRange('table-length'), `This plan has ${sText} samples per cycle, below min-samples-per-cycle ${ratText(draft.request.minSamplesPerCycle)}: hold fewer cycles or more samples.`);
  }
  if (draft.request.wholeSamplesPerCycle && !isInteger(s)) {
    push('samples-per-cycle', pinned ? planRange('table-length') : draft.nameRange, `This ${draft.request.waveform.shape} has ${sText} samples per cycle, not a whole number, so its edges wander from cycle to cycle: ${pinned ? 'make table-length a multiple of cycles' : 'pin a plan whose table length is a multiple of its cycles'}.`);
  }

  if (plan.tableBytes > hw.memory.budgetBytes) {
    push('table-over-budget', pinned ? planRange('table-length') : draft.nameRange, `This table alone takes ${formatBytes(plan.tableBytes)}, more than the ${formatBytes(hw.memory.budgetBytes)} memory budget: shorten it or raise the budget.`);
  }
  return out;
}

const sameDivider = (a: PlanFigures, b: PlanFigures): boolean =>
  a.dividerInteger === b.dividerInteger && a.dividerFraction === b.dividerFraction && a.tableLength === b.tableLength && cmp(a.cycles, b.cycles) === 0;
