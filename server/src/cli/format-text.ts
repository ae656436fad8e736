// The checker's report for people and CI logs: per file a header, one aligned row per output,
// then the file's findings as `path:line:col: severity code message` (1-based, the shape editors
// and CI log scrapers already turn into links), and a closing one-line summary.

import type { Hardware, PlanFigures, Seam, Verdict } from '../planning/types';
import { clockProblem } from '../spec/analyze';
import type { Analysis, OutputAnalysis } from '../spec/types';
import { sortedDiagnostics, tally, type CheckedFile, type Tally } from './checked';
import { formatBytes, formatCycles, formatDivider, formatHz, formatPpm, formatSeconds, formatSignedHz } from './units';

const VERDICT_WORDS: Record<Verdict, string> = {
  exact: 'exact',
  'within-tolerance': 'within tol.',
  fractional: 'fractional',
  'out-of-tolerance': 'OUT OF TOL.',
  pinned: 'pinned',
  'no-plan': 'NO PLAN',
};

const SEAM_CAUSES: Record<NonNullable<Seam['cause']>, string> = {
  'fractional-cycles': 'fractional cycles',
  'repeated-sample': 'repeated sample',
  quantisation: 'quantisation',
};

const HEADINGS = ['output', 'status', 'target', 'achieved', 'error', '', 'divider', 'N × M', 'jitter', 'seam', 'table'];
/** Columns whose figures read best right-aligned (so signs and units line up). */
const RIGHT_ALIGNED = new Set([4, 5, 10]);

function jitterCell(p: PlanFigures): string {
  if (p.jitterFree) return 'none';
  return `rms ${formatSeconds(p.jitter.samplePeriodJitterRmsS)}, TIE ${formatSeconds(p.jitter.tieRmsS)}`;
}

function seamCell(seam: Seam): string {
  if (seam.ok) return 'ok';
  const cause = seam.cause ? ` (${SEAM_CAUSES[seam.cause]})` : '';
  return `jump ${Number(seam.jumpLsb.toPrecision(4))} LSB${cause}`;
}

function outputRow(o: OutputAnalysis): string[] {
  const p = o.planning.plan;
  const head = [o.name, VERDICT_WORDS[o.planning.verdict], formatHz(o.targetHz)];
  if (!p) return [...head, 'no plan', '-', '', '-', '-', '-', '-', '-'];
  return [
    ...head,
    formatHz(p.achievedHz),
    formatSignedHz(p.errorHz),
    formatPpm(p.errorPpm),
    formatDivider(p),
    `${p.tableLength} × ${formatCycles(p.cycles)}`,
    jitterCell(p),
    seamCell(p.seam),
    formatBytes(p.tableBytes),
  ];
}

/** Pads every column to its widest cell; trailing spaces are trimmed so logs diff cleanly. */
export function alignColumns(rows: readonly string[][], rightAligned: ReadonlySet<number> = new Set()): string[] {
  const widths: number[] = [];
  for (const row of rows) row.forEach((cell, i) => (widths[i] = Math.max(widths[i] ?? 0, [...cell].length)));
  return rows.map((row) =>
    row
      .map((cell, i) => {
        const pad = ' '.repeat(widths[i] - [...cell].length);
        return rightAligned.has(i) ? pad + cell : cell + pad;
      })
      .join('  ')
      .trimEnd(),
  );
}

function hardwareSummary(hw: Hardware): string {
  const fraction = hw.divider.fractionBits > 0 ? ` + ${hw.divider.fractionBits}-bit fraction` : ', integer only';
  const stages = hw.divider.stages;
  const divider = stages === undefined ? `${hw.divider.integerMin}…${hw.divider.integerMax}${fraction}` : stages.map((st) => `${st.name} ${st.min}…${st.max}`).join(' × ');
  return (
    `system clock ${formatHz(hw.systemClockHz)}, divider ${divider}, ` +
    `${hw.dac.bits}-bit DAC up to ${formatHz(hw.dac.maxSampleRateHz)}, table budget ${formatBytes(hw.memory.budgetBytes)}`
  );
}

function fileHeader(file: CheckedFile, relative: (abs: string) => string): string {
  const a: Analysis = file.analysis;
  if (a.kind === 'clock') return `${file.path}  clock file${a.hardware ? ` — ${hardwareSummary(a.hardware)}` : ''}`;
  const unplanned = clockProblem(a);
  const parts = [unplanned ? `outputs not planned: ${unplanned}` : `${a.outputs.length} output${a.outputs.length === 1 ? '' : 's'}`];
  if (a.clockPath) parts.push(`clock ${relative(a.clockPath)}`);
  if (a.memory) parts.push(`tables ${formatBytes(a.memory.usedBytes)} of ${formatBytes(a.memory.budgetBytes)}`);
  return `${file.path}  wave spec — ${parts.join(', ')}`;
}

const plural = (n: number, word: string): string => `${n} ${word}${n === 1 ? '' : 's'}`;

/** "0 outputs" alone would read as an empty spec when a spec's clock file kept its outputs from being planned. */
function outputsPart(t: Tally, files: readonly CheckedFile[]): string {
  const unplanned = files.filter((f) => f.analysis.kind === 'wave' && clockProblem(f.analysis) !== null).length;
  const planned = plural(t.outputs, 'output');
  return unplanned === 0 ? planned : `${planned} planned (${plural(unplanned, 'wave spec')} not planned: see its clock file)`;
}

export function summaryLine(t: Tally, files: readonly CheckedFile[]): string {
  const verdict = t.errors > 0 ? 'FAILED' : 'passed';
  return `waveplan check ${verdict}: ${plural(t.files, 'file')}, ${outputsPart(t, files)}, ${plural(t.errors, 'error')}, ${plural(t.warnings, 'warning')}`;
}

export function formatText(files: readonly CheckedFile[], relative: (abs: string) => string): string {
  const lines: string[] = [];
  for (const file of files) {
    lines.push(fileHeader(file, relative));
    if (file.analysis.outputs.length > 0) {
      const rows = [HEADINGS, ...file.analysis.outputs.map(outputRow)];
      lines.push(...alignColumns(rows, RIGHT_ALIGNED).map((l) => `  ${l}`));
    }
    for (const d of sortedDiagnostics(file.analysis.diagnostics)) {
      lines.push(`${file.path}:${d.range.start.line + 1}:${d.range.start.character + 1}: ${d.severity} ${d.code} ${d.message}`);
    }
    lines.push('');
  }
  lines.push(summaryLine(tally(files), files));
  return `${lines.join('\n')}\n`;
}
