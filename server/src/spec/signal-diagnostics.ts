// The signal-quality floor and the analog chain → diagnostics. These run on every edit, so they
// read the cheap estimate (signal/quality-floor.ts) and the chain's closed forms, never the full
// spectrum (that is computed where it is shown: hover, report, the checker's JSON).

import { formatHz, formatSeconds, formatVolts } from '../../../shared-schema/src/quantity-format';
import { fromNumber } from '../../../shared-schema/src/rational';
import { lsbVolts } from '../planning/table';
import type { Hardware, OutputPlanning, PlanFigures } from '../planning/types';
import { chainFigures, chainSignal } from '../signal/analog-chain';
import { estimateOfPlan } from '../signal/output-signal';
import { defaultFloorDb, type QualityCause, type QualityEstimate } from '../signal/quality-floor';
import { toNumber } from '../../../shared-schema/src/rational';
import { type Code } from './codes';
import { planText } from './planning-diagnostics';
import { diagnostic } from './source';
import type { Range, SpecDiagnostic } from './types';
import type { OutputDraft } from './wave-model';

/** The floor an output's figures must clear, in dB; `given` when the spec wrote it. */
export interface QualityFloor {
  snrDb: number;
  sfdrDb: number;
  snrGiven: boolean;
  sfdrGiven: boolean;
}

export function qualityFloor(hw: Hardware, minSnrDb: number | undefined, minSfdrDb: number | undefined): QualityFloor {
  const fallback = defaultFloorDb(hw.dac.bits);
  return { snrDb: minSnrDb ?? fallback, sfdrDb: minSfdrDb ?? fallback, snrGiven: minSnrDb !== undefined, sfdrGiven: minSfdrDb !== undefined };
}

/** The most the AC coupling's high-pass may cost an output's fundamental before coupling-corner (common practice). */
export const COUPLING_LOSS_LIMIT_DB = 0.1;

const dB = (x: number): string => `${x.toFixed(1)} dB`;

function causeText(cause: QualityCause, draft: OutputDraft, plan: PlanFigures, hw: Hardware): string {
  const w = draft.request.waveform;
  switch (cause) {
    case 'jitter':
      return `the fractional divider's jitter (${formatSeconds(plan.jitter.tieRmsS)} RMS time-interval error at ${formatHz(plan.achievedHz)})`;
    case 'quantisation':
      return `quantisation: ${hw.dac.bits} bits at ${formatVolts(w.amplitudeVpp, 'Vpp')} (${Math.round(w.amplitudeVpp / lsbVolts(hw.dac))} LSB peak-to-peak)`;
    case 'table': {
      const s = plan.tableLength / toNumber(plan.cycles);
      return `the table: a ${w.shape} at ${Number(s.toPrecision(6))} samples per cycle folds its harmonics above f_s/2 between its own`;
    }
  }
}

/** What would meet the floor: the nearest jitter-free plan, a band-limited table, or nothing on this DAC. */
function remedyText(cause: QualityCause, floorDb: number, figure: 'snr' | 'sfdr', draft: OutputDraft, planning: OutputPlanning, hw: Hardware): string {
  if (cause === 'jitter') {
    const alt = planning.nearestJitterFree;
    if (!alt) return 'no jitter-free plan exists on this clock: forbid jitter only with another clock';
    const e = estimateOfPlan(hw, draft.request, alt);
    const v = figure === 'snr' ? e.snrDb : e.sfdrDb;
    const meets = v >= floorDb ? 'meets it' : 'does not meet it either';
    return `the nearest jitter-free plan, ${planText(alt)}, gives ${Number.isFinite(v) ? `about ${dB(v)}` : 'no spur'} and ${meets} (jitter: forbid)`;
  }
  if (cause === 'table') return 'set band-limit: nyquist (only the harmonics below f_s/2) or keep the samples per cycle whole';
  const full = hw.dac.fullScaleV * (1 - 2 ** -hw.dac.bits);
  const gain = 20 * Math.log10(full / draft.request.waveform.amplitudeVpp);
  return gain > 0.5
    ? `no plan meets it at this amplitude; full scale (${formatVolts(full, 'Vpp')}) gains ${dB(gain)}, or lower the floor`
    : `no plan on a ${hw.dac.bits}-bit DAC meets it: lower the floor or use a finer DAC`;
}

export function signalDiagnostics(draft: OutputDraft, planning: OutputPlanning, hw: Hardware, floor: QualityFloor): SpecDiagnostic[] {
  const out: SpecDiagnostic[] = [];
  const plan = planning.plan;
  if (!plan) return out;
  const r = draft.valueRanges;
  const push = (code: Code, range: Range, message: string) => out.push(diagnostic(code, range, message, draft.name));
  const estimate: QualityEstimate = estimateOfPlan(hw, draft.request, plan);
  // A square, triangle or sawtooth of fractional S already has its samples-per-cycle warning,
  // which says the same as a floor broken by the table.
  const S = plan.tableLength / toNumber(plan.cycles);
  const tableAlreadyFlagged = draft.request.wholeSamplesPerCycle === true && !Number.isInteger(S);
  const floorName = (given: boolean, key: string) => (given ? key : `${key}, by default one bit below the ideal ${hw.dac.bits}-bit quantiser`);
  if (estimate.snrDb < floor.snrDb && !(estimate.snrCause === 'table' && tableAlreadyFlagged)) {
    push(
      'signal-quality',
      r['min-snr'] ?? r.jitter ?? draft.nameRange,
      `SNR about ${dB(estimate.snrDb)} is below the floor of ${dB(floor.snrDb)} (${floorName(floor.snrGiven, 'min-snr')}) because of ${causeText(estimate.snrCause, draft, plan, hw)}: ${remedyText(estimate.snrCause, floor.snrDb, 'snr', draft, planning, hw)}.`,
    );
  } else if (estimate.sfdrDb < floor.sfdrDb && estimate.sfdrCause && !(estimate.sfdrCause === 'table' && tableAlreadyFlagged)) {
    push(
      'signal-quality',
      r['min-sfdr'] ?? r.jitter ?? draft.nameRange,
      `SFDR about ${dB(estimate.sfdrDb)} is below the floor of ${dB(floor.sfdrDb)} (${floorName(floor.sfdrGiven, 'min-sfdr')}) because of ${causeText(estimate.sfdrCause, draft, plan, hw)}: ${remedyText(estimate.sfdrCause, floor.sfdrDb, 'sfdr', draft, planning, hw)}.`,
    );
  }
  if (hw.analog) chainDiagnostics(draft, plan, hw, push);
  return out;
}

function chainDiagnostics(draft: OutputDraft, plan: PlanFigures, hw: Hardware, push: (code: Code, range: Range, message: string) => void): void {
  const chain = hw.analog!;
  const w = draft.request.waveform;
  const fOut = toNumber(plan.achievedHz);
  const f = chainFigures(chain, chainSignal(draft.request, plan, lsbVolts(hw.dac)));
  const at = draft.nameRange;
  const hz = (x: number) => formatHz(fromNumber(Number(x.toPrecision(6))));
  if (f.clips) {
    push('chain-clipping', at, `After the gain of ${chain.gain} the output swings ${formatVolts(f.peakLowV)} to ${formatVolts(f.peakHighV)}, outside the amplifier's ${formatVolts(chain.swingMinV ?? -Infinity)} to ${formatVolts(chain.swingMaxV ?? Infinity)}: lower the amplitude or the gain.`);
  }
  if (f.slewLimited) {
    push('slew-rate', at, `The output needs ${Number((f.slewNeededVPerS / 1e6).toPrecision(3))} V/µs, more than the amplifier's ${Number((chain.slewRateVPerS! / 1e6).toPrecision(3))} V/µs${f.fullPowerBandwidthHz ? ` (full-power bandwidth ${hz(f.fullPowerBandwidthHz)})` : ''}: lower the amplitude or the frequency, or use a faster amplifier.`);
  }
  if (f.amplifierLossDb !== null && f.amplifierLossDb < -0.1) {
    push('amplifier-bandwidth', at, `The amplifier's closed-loop bandwidth (${hz(f.closedLoopBandwidthHz!)} = gain-bandwidth / gain) costs the fundamental ${f.amplifierLossDb.toFixed(2)} dB at ${hz(fOut)}${w.shape !== 'sine' ? ` and passes ${f.harmonicsPassed} of its harmonics` : ''}: use a lower gain or a wider amplifier.`);
  }
  if (f.couplingLossDb !== null && f.couplingLossDb < -COUPLING_LOSS_LIMIT_DB) {
    push('coupling-corner', at, `The AC coupling's corner ${hz(f.highPassCornerHz!)} (1/(2πRC)) costs the fundamental ${f.couplingLossDb.toFixed(2)} dB at ${hz(fOut)}: use a larger coupling capacitor.`);
  }
  if (f.tiltExact !== null && f.tiltApprox !== null) {
    push('square-tilt', at, `Through the AC coupling (f_c ${hz(f.highPassCornerHz!)}) this square's flat tops tilt ${(100 * f.tiltExact).toFixed(2)} % (exact, 1 - exp(-t/RC)); the textbook pi·f_c/f gives ${(100 * f.tiltApprox).toPrecision(3)} %.`);
  }
  for (const caution of f.cautions) push('chain-caution', at, caution);
}
