// The quick fix "use a larger coupling capacitor" for coupling-corner: the AC coupling's high-pass
// (corner 1/(2πRC)) costs an output's fundamental more than the chain check allows. The capacitor
// is in the clock file, so the fix is a WorkspaceEdit on that file (as the clock retune is). It is
// checked before it is offered: this spec is analysed again against the edited clock text, and the
// title states what that analysis reports. The value is the first E12 value (IEC 60063, common
// practice) at or above the smallest C that keeps every output of this spec within the limit.

import { CodeActionKind, type CodeAction, type Diagnostic } from 'vscode-languageserver/node';
import { lsbVolts } from '../planning/table';
import { chainFigures, chainSignal, highPassCornerHz } from '../signal/analog-chain';
import { analyze } from '../spec/analyze';
import { COUPLING_LOSS_LIMIT_DB } from '../spec/signal-diagnostics';
import type { Analysis, OutputAnalysis } from '../spec/types';
import { fromNumber, toNumber } from '../../../shared-schema/src/rational';
import { formatHz } from '../cli/units';
import { clockValueRange } from './clock-edits';
import type { DiagnosticData } from './diagnostics';
import { pathToUri } from './documents';

const E12 = [1.0, 1.2, 1.5, 1.8, 2.2, 2.7, 3.3, 3.9, 4.7, 5.6, 6.8, 8.2];

/** The smallest C (farads) whose corner costs a tone at fOutHz at most lossDb: |H| = f/√(f² + f_c²). */
export function smallestCapacitance(rOhm: number, fOutHz: number, lossDb: number): number {
  const g = 10 ** (-lossDb / 20);
  const cornerHz = fOutHz * Math.sqrt(1 / (g * g) - 1);
  return 1 / (2 * Math.PI * rOhm * cornerHz);
}

/** The first E12 value at or above `c`. */
export function e12AtLeast(c: number): number {
  const decade = 10 ** Math.floor(Math.log10(c));
  for (const m of [...E12, 10]) {
    const v = Number((m * decade).toPrecision(2));
    if (v >= c * (1 - 1e-12)) return v;
  }
  return 10 * decade;
}

const UNITS: Array<[number, string]> = [
  [1, 'F'],
  [1e-3, 'mF'],
  [1e-6, 'µF'],
  [1e-9, 'nF'],
  [1e-12, 'pF'],
];

/** `2.2 µF`: the unit that puts the value at 1 or more, two significant digits (E12 has two). */
export function capacitanceText(c: number): string {
  const [scale, unit] = UNITS.find(([s]) => c >= s * (1 - 1e-9)) ?? UNITS[UNITS.length - 1];
  return `${Number((c / scale).toPrecision(2))} ${unit}`;
}

function couplingLoss(analysis: Analysis, output: OutputAnalysis): number | null {
  const hw = analysis.hardware;
  const plan = output.planning.plan;
  if (!hw?.analog || !plan) return null;
  return chainFigures(hw.analog, chainSignal(output.request, plan, lsbVolts(hw.dac))).couplingLossDb;
}

const count = (analysis: Analysis) => analysis.diagnostics.filter((x) => x.code === 'coupling-corner').length;

/** One fix: the E12 capacitor that clears coupling-corner on every output of this spec. */
export function couplingActions(analysis: Analysis, d: Diagnostic, readFile: (path: string) => string | undefined): CodeAction[] {
  const chain = analysis.hardware?.analog;
  const r = chain?.couplingResistanceOhm;
  if (d.code !== 'coupling-corner' || !chain || r === undefined || !analysis.clockPath) return [];
  const lowest = Math.min(...analysis.outputs.flatMap((o) => (o.planning.plan ? [toNumber(o.planning.plan.achievedHz)] : [])));
  if (!Number.isFinite(lowest) || lowest <= 0) return [];
  const c = e12AtLeast(smallestCapacitance(r, lowest, COUPLING_LOSS_LIMIT_DB));
  if (c > 1e3) return [];
  const clockPath = analysis.clockPath;
  const clockText = readFile(clockPath);
  const range = clockText === undefined ? undefined : clockValueRange(clockText, ['analog', 'coupling', 'capacitance']);
  if (clockText === undefined || !range) return [];
  const newText = capacitanceText(c);
  const edited = clockText.slice(0, range.offsets[0]) + newText + clockText.slice(range.offsets[1]);
  // The preview: this spec against the edited clock file, read as the checker reads it.
  const after = analyze(analysis.path, analysis.text, { readFile: (p) => (p === clockPath ? edited : readFile(p)) });
  const name = after.outputs.find((o) => o.name === (d.data as DiagnosticData | undefined)?.output) ?? after.outputs[0];
  const loss = name ? couplingLoss(after, name) : null;
  if (count(after) >= count(analysis) || loss === null || !after.hardware?.analog?.couplingCapacitanceF) return [];
  const corner = highPassCornerHz(r, after.hardware.analog.couplingCapacitanceF);
  const hz = (x: number) => formatHz(fromNumber(Number(x.toPrecision(4))));
  const left = count(after);
  return [
    {
      title:
        `Use a ${newText} coupling capacitor (corner ${hz(corner)}): ${name.name} loses ${Math.abs(loss).toFixed(3)} dB at ${hz(toNumber(name.planning.plan!.achievedHz))}` +
        (left === 0 ? '' : `; ${left} output${left === 1 ? '' : 's'} still below the corner's limit`),
      kind: CodeActionKind.QuickFix,
      diagnostics: [d],
      isPreferred: left === 0 || undefined,
      edit: { changes: { [pathToUri(clockPath)]: [{ range: range.range, newText }] } },
    },
  ];
}
