// The text of one output's plan as markdown: the same figures the checker prints, read off the
// analysis. Used by the hover card and by the `waveplan.planReport` command.

import { fromNumber, toNumber } from '../../../shared-schema/src/rational';
import type { PlanFigures, Verdict } from '../planning/types';
import type { Analysis, OutputAnalysis } from '../spec/types';
import { formatBytes, formatCycles, formatDivider, formatHz, formatPpm, formatSeconds } from '../cli/units';
import { stageRows, stepsTable } from './divider-views';

export const VERDICT_WORDS: Record<Verdict, string> = {
  exact: 'exact, jitter-free',
  'within-tolerance': 'within tolerance, jitter-free',
  fractional: 'fractional divider (adds jitter)',
  'out-of-tolerance': 'out of tolerance',
  pinned: 'pinned plan, checked as written',
  'no-plan': 'no plan fits this hardware',
};

/** Markdown table cells must not break the row. */
const cell = (text: string): string => text.replace(/\|/g, '\\|').replace(/\n/g, ' ');

function jitterRows(plan: PlanFigures): string[][] {
  if (plan.jitterFree) return [['jitter', 'none (integer divider)']];
  const j = plan.jitter;
  const rows = [
    [
      'sample-period jitter',
      `${formatSeconds(j.samplePeriodJitterRmsS)} rms, ${formatSeconds(j.samplePeriodJitterPkPkS)} pk-pk ` +
        `(long periods ${(j.longShare * 100).toPrecision(3)} % of the time)`,
    ],
    ['TIE', `${formatSeconds(j.tieRmsS)} rms, ${formatSeconds(j.tiePkPkS)} pk-pk; pattern repeats every ${j.patternLength} samples`],
  ];
  if (j.jitterSnrDb !== null) rows.push(['jitter-limited SNR', `${j.jitterSnrDb.toFixed(1)} dB`]);
  if (j.spurOffsetsHz.length > 0) {
    rows.push(['spurs at ±', j.spurOffsetsHz.slice(0, 3).map((hz) => formatHz(fromNumber(hz))).join(', ') + ' around each line']);
  }
  return rows;
}

export function planRows(plan: PlanFigures, targetHz: OutputAnalysis['targetHz']): string[][] {
  const samplesPerCycle = toNumber(plan.cycles) > 0 ? plan.tableLength / toNumber(plan.cycles) : Infinity;
  return [
    ['target', formatHz(targetHz)],
    ['achieved', `${formatHz(plan.achievedHz)} (${formatHz(plan.errorHz, true)}, ${formatPpm(plan.errorPpm)})`],
    ['sample clock', `${formatHz(plan.systemClockHz)} ${formatDivider(plan)} = ${formatHz(plan.sampleRateHz)}`],
    ...stageRows(plan),
    [
      'table',
      `N = ${plan.tableLength} samples, M = ${formatCycles(plan.cycles)} cycle(s), S = ${Number(samplesPerCycle.toPrecision(6))} samples per cycle`,
    ],
    ...jitterRows(plan),
    ['seam', plan.seam.ok ? 'ok (the wrap continues the waveform)' : `jump of ${Number(plan.seam.jumpLsb.toPrecision(3))} LSB (${plan.seam.cause ?? 'see diagnostics'})`],
    ['memory', formatBytes(plan.tableBytes)],
  ];
}

export function table(rows: string[][]): string {
  return ['| | |', '|---|---|', ...rows.map(([k, v]) => `| ${cell(k)} | ${cell(v)} |`)].join('\n');
}

/**
 * The card's first line: name, verdict and, when given, the one-line summary the annotation
 * carries (so the hover opens with the answer before any table).
 */
export function cardHeading(output: OutputAnalysis, summary?: string): string {
  return `**${output.name}** — ${VERDICT_WORDS[output.planning.verdict]}${summary ? `: ${summary}` : ''}`;
}

export function outputCard(output: OutputAnalysis): string {
  return `${cardHeading(output)}\n\n${cardBody(output)}`;
}

/** The plan table and what follows it, without the heading. */
export function cardBody(output: OutputAnalysis): string {
  const { planning } = output;
  const lines: string[] = [];
  if (planning.plan) lines.push(table(planRows(planning.plan, output.targetHz)));
  else lines.push(`No plan: target ${formatHz(output.targetHz)}; see the diagnostics for what blocks it.`);
  const alt = planning.nearestJitterFree;
  if (alt && planning.plan && !planning.plan.jitterFree) {
    lines.push('', `Nearest jitter-free plan: ${formatHz(alt.achievedHz)} (${formatPpm(alt.errorPpm)}), ${formatDivider(alt)}, N = ${alt.tableLength}, M = ${formatCycles(alt.cycles)}.`);
  }
  const fromFile = sampleFileLine(output);
  if (fromFile) lines.push('', fromFile);
  lines.push(...stepsTable(output));
  return lines.join('\n');
}

/** Whether the table plays an output's sample file sample for sample (S = K) or resampled. */
function sampleFileLine(output: OutputAnalysis): string | undefined {
  const values = output.request.waveform.custom?.samples?.length;
  const plan = output.planning.plan;
  if (!values || !plan) return undefined;
  const s = plan.tableLength / toNumber(plan.cycles);
  const how = s === values ? 'the table plays it sample for sample (S = K)' : `the table resamples it at S = ${Number(s.toPrecision(6))} by linear interpolation (no plan with S = K meets the tolerance, or max-samples-per-cycle rules it out)`;
  return `Waveform from its sample file: one cycle of K = ${values} values; ${how}.`;
}

export function memoryLine(analysis: Analysis): string | undefined {
  if (!analysis.memory) return undefined;
  const { usedBytes, budgetBytes } = analysis.memory;
  const share = budgetBytes > 0 ? ` (${((usedBytes / budgetBytes) * 100).toPrecision(3)} %)` : '';
  return `Tables use ${formatBytes(usedBytes)} of ${formatBytes(budgetBytes)}${share}.`;
}
