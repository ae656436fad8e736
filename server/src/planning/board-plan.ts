// One wave spec's outputs planned at one hardware the way the checker plans them: each output's
// own plan, then its groups planned together (groups.ts), then the board's memory budget fit
// (board.ts). The checker (spec/analyze.ts and spec/board-budget.ts) and the joint search over
// system clocks (joint-search.ts) both go through these steps, so a candidate clock's figures are
// the checker's figures once the clock file is set to it.
//
// Members of a group keep their group's plans in the budget fit (shrinking one member alone
// would break the shared divider or the phase lock), and members that share one table through
// DMA start offsets count its bytes once.

import { div, rat } from '../../../shared-schema/src/rational';
import { type BoardFit, type BoardOutput, fitBoard } from './board';
import { planOutputUncached, preferenceOf } from './choose';
import { realisesDuty } from './duty';
import { describePlan } from './figures';
import { type GroupPlanning, planPhaseGroup, planSharedClock } from './groups';
import { ShrinkMenu } from './shrink';
import type { Hardware, OutputPlanning, OutputRequest, Plan, PlanFigures } from './types';
import { StepAccount, stepsPerOutput, withAccount } from './work';

/** A group of a spec's outputs, by their indices in the spec's requests. */
export interface GroupSpec {
  lock: 'sample-clock' | 'phase';
  /** Indices of the members; the first is the phase reference. */
  members: readonly number[];
  /** Phase-locked groups: each member's offset ahead of the first, degrees. */
  offsetsDeg: readonly number[];
  /** The members share one table through DMA start offsets (its bytes count once). */
  sharedTable: boolean;
}

/** What a wave spec asks of the planner: its outputs in file order and its groups. */
export interface SpecBoard {
  requests: readonly OutputRequest[];
  groups: readonly GroupSpec[];
  /** Search steps each output's own plan may take (work.ts; the checker shares a file's budget). */
  stepsPerOutput?: number;
}

/** The planning steps, so callers can memoise each (the language server does; proofs need not). */
export interface BoardSteps {
  planAt(hw: Hardware, req: OutputRequest, steps: number): OutputPlanning;
  groupAt(hw: Hardware, group: GroupSpec, reqs: readonly OutputRequest[], base: readonly OutputPlanning[]): GroupPlanning;
  menuAt(hw: Hardware, req: OutputRequest, own: Plan): ShrinkMenu | null;
}

/** A spec of plain outputs, no groups. */
export const plainSpec = (requests: readonly OutputRequest[]): SpecBoard => ({ requests, groups: [] });

/** A group planned together. */
export function planGroup(hw: Hardware, group: GroupSpec, reqs: readonly OutputRequest[], base: readonly OutputPlanning[]): GroupPlanning {
  return group.lock === 'phase'
    ? planPhaseGroup(hw, reqs, base, group.offsetsDeg, group.sharedTable ? 1 : reqs.length)
    : planSharedClock(hw, reqs, base);
}

/**
 * An output may take a smaller plan in the budget fit: planned within tolerance, not pinned, one
 * frequency (a stepped output's table serves every step: it keeps its own).
 */
export const shrinkable = (req: OutputRequest, planning: OutputPlanning): boolean =>
  req.pinned === undefined && req.steps === undefined && planning.plan !== null && planning.withinTolerance && planning.verdict !== 'pinned';

/** The smaller plans an output could take instead of `own` (null when it keeps its plan). */
export function newMenu(hw: Hardware, req: OutputRequest, own: Plan): ShrinkMenu {
  const pref = preferenceOf(req, hw);
  const s = div(rat(BigInt(own.tableLength)), own.cycles);
  const dutyKept = pref.duty !== null && realisesDuty(pref.duty, s) ? pref.duty : null;
  return new ShrinkMenu(hw, req.targetHz, req.minSamplesPerCycle, pref, own, req.wholeSamplesPerCycle === true, dutyKept);
}

/** An output's own plan within `steps` search steps, as the checker's memo plans it (cache.ts). */
export const planWithin = (hw: Hardware, req: OutputRequest, steps: number): OutputPlanning => withAccount(new StepAccount(steps), () => planOutputUncached(hw, req));

export const UNCACHED_STEPS: BoardSteps = { planAt: planWithin, groupAt: planGroup, menuAt: newMenu };

/** The steps each of the spec's outputs may take. */
export const stepsOf = (spec: SpecBoard): number => spec.stepsPerOutput ?? stepsPerOutput(spec.requests.length);

/** Per output: member of a group (its plan stays as the group planned it). */
export function tiedOutputs(spec: SpecBoard): boolean[] {
  const tied = spec.requests.map(() => false);
  for (const g of spec.groups) for (const i of g.members) tied[i] = true;
  return tied;
}

/** Per output: the table is another member's (DMA start offsets into one shared table). */
export function sharingOutputs(spec: SpecBoard): boolean[] {
  const sharing = spec.requests.map(() => false);
  for (const g of spec.groups) if (g.sharedTable) for (const i of g.members.slice(1)) sharing[i] = true;
  return sharing;
}

/** Table bytes the outputs take together (a shared table once). */
export function countedBytes(plannings: readonly OutputPlanning[], sharing: readonly boolean[]): number {
  let bytes = 0;
  plannings.forEach((p, i) => {
    if (!sharing[i]) bytes += p.plan?.tableBytes ?? 0;
  });
  return bytes;
}

/** The planning of an output that takes `plan` instead of its own. */
export function shrunkPlanning(old: OutputPlanning, plan: PlanFigures): OutputPlanning {
  const verdict = !plan.jitterFree ? 'fractional' : plan.errorHz.num === 0n ? 'exact' : 'within-tolerance';
  const planning = { verdict, plan, nearestJitterFree: old.nearestJitterFree, withinTolerance: true, shrunkFrom: old.plan! } as OutputPlanning;
  Object.defineProperty(planning, 'bestFractional', { get: () => old.bestFractional, enumerable: true });
  return planning;
}

/** The budget fit of the planned outputs (their plans kept when they fit). */
export function fitSpec(hw: Hardware, spec: SpecBoard, plannings: readonly OutputPlanning[], menuAt: BoardSteps['menuAt']): BoardFit {
  const tied = tiedOutputs(spec);
  const sharing = sharingOutputs(spec);
  const board: BoardOutput[] = plannings.map((p, i) => ({ bytes: sharing[i] ? 0 : p.plan?.tableBytes ?? 0, menu: null, pref: preferenceOf(spec.requests[i]!, hw) }));
  // The menus are built only when the budget is exceeded.
  if (countedBytes(plannings, sharing) > hw.memory.budgetBytes) {
    plannings.forEach((p, i) => {
      const own = p.shrunkFrom ?? p.plan;
      if (!tied[i] && own !== null && shrinkable(spec.requests[i]!, p)) board[i]!.menu = menuAt(hw, spec.requests[i]!, own);
    });
  }
  return fitBoard(board, hw.memory.budgetBytes);
}

/** The plannings after the fit: a shrunk output's planning is that of the plan it takes. */
export function fittedPlannings(hw: Hardware, spec: SpecBoard, plannings: readonly OutputPlanning[], fit: BoardFit): OutputPlanning[] {
  if (!fit.fits) return [...plannings];
  return plannings.map((p, i) => {
    const chosen = fit.plans[i];
    if (!chosen) return p;
    const req = spec.requests[i]!;
    return shrunkPlanning(p, describePlan(hw, req, req.waveform, chosen, 'open'));
  });
}

/** Every group planned over the outputs' own plannings (in place). */
export function planGroupsAt(hw: Hardware, spec: SpecBoard, plannings: OutputPlanning[], steps: BoardSteps): void {
  for (const g of spec.groups) planGroupInto(hw, spec, g, plannings, steps);
}

/** One group planned over its members' own plannings (in place). */
export function planGroupInto(hw: Hardware, spec: SpecBoard, g: GroupSpec, plannings: OutputPlanning[], steps: BoardSteps): void {
  const reqs = g.members.map((i) => spec.requests[i]!);
  const planned = steps.groupAt(hw, g, reqs, g.members.map((i) => plannings[i]!));
  g.members.forEach((i, k) => {
    plannings[i] = planned.plans[k]!;
  });
}

export interface SpecPlanned {
  plannings: OutputPlanning[];
  fit: BoardFit;
}

/** The spec planned at `hw` as the checker plans it. */
export function planSpecAt(hw: Hardware, spec: SpecBoard, steps: BoardSteps = UNCACHED_STEPS): SpecPlanned {
  const plannings = spec.requests.map((r) => steps.planAt(hw, r, stepsOf(spec)));
  planGroupsAt(hw, spec, plannings, steps);
  const fit = fitSpec(hw, spec, plannings, steps.menuAt);
  return { plannings: fittedPlannings(hw, spec, plannings, fit), fit };
}
