// The emitted signal of one planned output, computed on first use and kept with the plan object
// (plans are memoised by the planning cache, so an untouched output is never recomputed).
// Views that show figures read them here: hover, report, the checker's JSON.

import { lsbVolts, buildTable } from '../planning/table';
import { toNumber } from '../../../shared-schema/src/rational';
import type { Hardware, OutputRequest, PlanFigures } from '../planning/types';
import { holdFigures } from './hold';
import { idealThd } from './ideal-shapes';
import { type SpectrumOptions } from './lines';
import { estimateQuality, type QualityEstimate } from './quality-floor';
import { type SignalFigures, analyseSignal, type SignalAnalysis } from './signal-figures';

/** Tables longer than this are not built for a spectrum (2^22 samples: 32 MiB of codes and a second's work). */
export const MAX_SPECTRUM_TABLE = 2 ** 22;

/**
 * What a hover may transform (2^13 points, well under a millisecond); longer tables and periods go
 * analytic, line by line, and say so. The report and the checker's JSON take the full limit.
 */
export const QUICK_SPECTRUM: SpectrumOptions = { maxTransformPoints: 2 ** 13 };

const memo = new WeakMap<PlanFigures, Map<string, SignalAnalysis>>();

/** The quality estimate's inputs for a plan (cheap: no table is built). */
export function estimateOfPlan(hw: Hardware, req: OutputRequest, plan: PlanFigures): QualityEstimate {
  const s = plan.tableLength / toNumber(plan.cycles);
  return estimateQuality({
    shape: req.waveform.shape,
    duty: req.waveform.duty,
    amplitudeLsb: req.waveform.amplitudeVpp / 2 / lsbVolts(hw.dac),
    samplesPerCycle: s,
    wholeSamplesPerCycle: Number.isInteger(s),
    bandLimited: req.waveform.custom !== undefined,
    tieRmsS: plan.jitter.tieRmsS,
    sampleRateHz: toNumber(plan.sampleRateHz),
    fOutHz: toNumber(plan.achievedHz),
    systemClockHz: toNumber(hw.systemClockHz),
    jitterFree: plan.jitterFree,
  });
}

/** Figures from the estimate alone, for tables too long to build. */
function estimatedFigures(hw: Hardware, req: OutputRequest, plan: PlanFigures): SignalFigures {
  const e = estimateOfPlan(hw, req, plan);
  const fs = toNumber(plan.sampleRateHz);
  const fOut = toNumber(plan.achievedHz);
  const snr = Number.isFinite(e.snrDb) ? e.snrDb : null;
  return {
    method: 'analytic',
    snrDb: snr,
    sinadDb: snr,
    enob: snr === null ? null : (snr - 1.76) / 6.02,
    sfdrDb: Number.isFinite(e.sfdrDb) ? e.sfdrDb : null,
    worstSpurHz: e.sfdrCause === 'jitter' ? fOut + fs / plan.jitter.patternLength : null,
    thdPercent: 100 * idealThd(req.waveform.shape, req.waveform.duty),
    fundamentalPower: 0,
    harmonicPower: 0,
    noisePower: 0,
    jitterNoisePower: 0,
    ...holdFigures(fOut, fs),
    sampleRateHz: fs,
    achievedHz: fOut,
  };
}

/** The spectrum and figures of what this plan emits (memoised per plan and options). */
export function outputSignal(hw: Hardware, req: OutputRequest, plan: PlanFigures, options: SpectrumOptions = {}): SignalAnalysis | null {
  if (plan.tableLength > MAX_SPECTRUM_TABLE || toNumber(plan.cycles) <= 0) return null;
  const key = `${options.maxTransformPoints ?? '-'}|${options.withoutJitter === true}`;
  let perPlan = memo.get(plan);
  if (!perPlan) memo.set(plan, (perPlan = new Map()));
  const found = perPlan.get(key);
  if (found) return found;
  // The pinned span applies to the pinned plan only; every searched plan spans N intervals.
  const p = req.pinned;
  const isPinned = p !== undefined && p.tableLength === plan.tableLength && p.dividerInteger === plan.dividerInteger && p.dividerFraction === plan.dividerFraction;
  const span = isPinned ? p.span : 'open';
  const codes = buildTable(req.waveform, hw.dac, plan.tableLength, plan.cycles, span);
  const analysis = analyseSignal(
    {
      codes,
      cycles: plan.cycles,
      span,
      dividerInteger: plan.dividerInteger,
      dividerFraction: plan.dividerFraction,
      fractionBits: plan.fractionBits,
      shape: req.waveform.shape,
      sampleRateHz: toNumber(plan.sampleRateHz),
      achievedHz: toNumber(plan.achievedHz),
    },
    options,
  );
  perPlan.set(key, analysis);
  return analysis;
}

/** The figures of a plan: from its spectrum, or the estimate for a table too long to build. */
export function outputFigures(hw: Hardware, req: OutputRequest, plan: PlanFigures, options: SpectrumOptions = {}): SignalFigures {
  return outputSignal(hw, req, plan, options)?.figures ?? estimatedFigures(hw, req, plan);
}
