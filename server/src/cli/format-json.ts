// The checker's machine-readable report. Field names follow the Quantities of docs/DESIGN.md and the
// planning types; exact rationals become JSON numbers plus an `…Exact` text so a consumer can
// recover the exact value: the full decimal when one exists ("3997802.734375"), else "num/den".

import { isExactDecimal, toDecimal, toNumber, type Rational } from '../../../shared-schema/src/rational';
import type { Hardware, PlanFigures } from '../planning/types';
import type { OutputAnalysis, SpecDiagnostic } from '../spec/types';
import { sortedDiagnostics, tally, type CheckedFile } from './checked';
import { signalJson } from './format-signal';
import { clockCandidatesJson } from './clock-json';

export interface JsonDiagnostic {
  severity: string;
  code: string;
  message: string;
  /** 1-based. */
  line: number;
  /** 1-based, UTF-16 code units. */
  column: number;
  endLine: number;
  endColumn: number;
  output?: string;
}

export type JsonPlan = ReturnType<typeof planJson> & Partial<ReturnType<typeof signalJson>>;

export interface JsonOutput {
  name: string;
  targetHz: number;
  targetHzExact: string;
  verdict: string;
  withinTolerance: boolean;
  plan: JsonPlan | null;
  nearestJitterFree: JsonPlan | null;
  /** Frequency steps on the plan's table (absent for one frequency). */
  steps?: ReturnType<typeof stepsJson>;
  /** S max the ranking used (max-samples-per-cycle or its default); null for none. */
  maxSamplesPerCycle: number | null;
}

export interface JsonFile {
  path: string;
  kind: string;
  diagnostics: JsonDiagnostic[];
  outputs: JsonOutput[];
  memory: { usedBytes: number; budgetBytes: number } | null;
}

export interface JsonReport {
  tool: { name: string; version: string };
  files: JsonFile[];
  summary: ReturnType<typeof tally>;
}

export function exactText(r: Rational): string {
  if (!isExactDecimal(r)) return `${r.num}/${r.den}`;
  // The decimal digits after the point are the larger of the powers of 2 and 5 in den.
  let digits = 0;
  for (let d = r.den; d > 1n; digits++) d = d % 10n === 0n ? d / 10n : d % 2n === 0n ? d / 2n : d / 5n;
  return toDecimal(r, digits);
}

export function planJson(p: PlanFigures) {
  return {
    systemClockHz: toNumber(p.systemClockHz),
    dividerInteger: p.dividerInteger,
    dividerFraction: p.dividerFraction,
    fractionBits: p.fractionBits,
    /** Counter stages only: each stage's value (their product is dividerInteger) and register content. */
    ...(p.dividerStages !== undefined ? { dividerStages: p.dividerStages.map((st) => ({ name: st.name, value: st.value, register: st.register })) } : {}),
    sampleRateHz: toNumber(p.sampleRateHz),
    sampleRateHzExact: exactText(p.sampleRateHz),
    tableLength: p.tableLength,
    cycles: toNumber(p.cycles),
    cyclesExact: exactText(p.cycles),
    achievedHz: toNumber(p.achievedHz),
    achievedHzExact: exactText(p.achievedHz),
    errorHz: toNumber(p.errorHz),
    errorHzExact: exactText(p.errorHz),
    errorPpm: p.errorPpm,
    jitterFree: p.jitterFree,
    samplePeriodJitterRmsS: p.jitter.samplePeriodJitterRmsS,
    samplePeriodJitterPkPkS: p.jitter.samplePeriodJitterPkPkS,
    tieRmsS: p.jitter.tieRmsS,
    tiePkPkS: p.jitter.tiePkPkS,
    jitterPatternLength: p.jitter.patternLength,
    jitterSnrDb: p.jitter.jitterSnrDb,
    seamOk: p.seam.ok,
    seamJumpLsb: p.seam.jumpLsb,
    seamCause: p.seam.cause,
    tableBytes: p.tableBytes,
    /** Square waves: the duty the table really has (whole S: H/S), as a share; null for other shapes. */
    dutyAchieved: p.dutyAchieved ? toNumber(p.dutyAchieved) : null,
    dutyAchievedExact: p.dutyAchieved ? exactText(p.dutyAchieved) : null,
    /** Edges and corners: their wander from cycle to cycle in seconds (0 with whole S); null for a sine. */
    edgeWanderS: p.edgeWanderS ?? null,
    /** False only when the search stopped at its work limit (absurdly large domains). */
    provenNearest: p.searchLimited !== true,
  };
}

/** Frequency steps: each step's divider on the shared table (the plan's table) and what it gets. */
export function stepsJson(o: OutputAnalysis) {
  const targets = o.request.steps ?? [];
  return (o.planning.steps ?? []).map((p, i) => ({
    targetHz: toNumber(targets[i]!.targetHz),
    targetHzExact: exactText(targets[i]!.targetHz),
    toleranceHz: toNumber(targets[i]!.toleranceHz),
    dividerInteger: p.dividerInteger,
    dividerFraction: p.dividerFraction,
    ...(p.dividerStages !== undefined ? { dividerStages: p.dividerStages.map((st) => ({ name: st.name, value: st.value, register: st.register })) } : {}),
    achievedHz: toNumber(p.achievedHz),
    achievedHzExact: exactText(p.achievedHz),
    errorHz: toNumber(p.errorHz),
    errorHzExact: exactText(p.errorHz),
    errorPpm: p.errorPpm,
    jitterFree: p.jitterFree,
  }));
}

function diagnosticJson(d: SpecDiagnostic): JsonDiagnostic {
  return {
    severity: d.severity,
    code: d.code,
    message: d.message,
    line: d.range.start.line + 1,
    column: d.range.start.character + 1,
    endLine: d.range.end.line + 1,
    endColumn: d.range.end.character + 1,
    ...(d.output !== undefined ? { output: d.output } : {}),
  };
}

function outputJson(o: OutputAnalysis, hw: Hardware | null): JsonOutput {
  // The signal figures are computed here, on first use (signal/output-signal.ts memoises them).
  const withSignal = (p: PlanFigures): JsonPlan => ({ ...planJson(p), ...(hw ? signalJson(hw, o.request, p) : {}) });
  return {
    name: o.name,
    targetHz: toNumber(o.targetHz),
    targetHzExact: exactText(o.targetHz),
    verdict: o.planning.verdict,
    withinTolerance: o.planning.withinTolerance,
    plan: o.planning.plan ? withSignal(o.planning.plan) : null,
    nearestJitterFree: o.planning.nearestJitterFree ? withSignal(o.planning.nearestJitterFree) : null,
    ...(o.planning.steps ? { steps: stepsJson(o) } : {}),
    maxSamplesPerCycle: o.request.maxSamplesPerCycle ? toNumber(o.request.maxSamplesPerCycle) : null,
  };
}

export function jsonReport(files: readonly CheckedFile[], version: string): JsonReport {
  return {
    tool: { name: 'waveplan', version },
    files: files.map((f) => ({
      path: f.path,
      kind: f.analysis.kind,
      diagnostics: sortedDiagnostics(f.analysis.diagnostics).map(diagnosticJson),
      outputs: f.analysis.outputs.map((o) => outputJson(o, f.analysis.hardware)),
      memory: f.analysis.memory,
      ...(f.analysis.kind === 'wave' ? { clockCandidates: clockCandidatesJson(f.analysis) } : {}),
    })),
    summary: tally(files),
  };
}

export function formatJson(files: readonly CheckedFile[], version: string): string {
  return `${JSON.stringify(jsonReport(files, version), null, 2)}\n`;
}
