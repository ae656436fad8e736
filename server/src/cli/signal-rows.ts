// The signal figures of a plan as label/value rows, for the hover card and the HTML report:
// the spectrum's figures (and which method gave them), the hold, the shape's fidelity and the
// analog chain. Every number is computed from the plan (signal/).

import { fromNumber, toNumber } from '../../../shared-schema/src/rational';
import { formatSeconds, formatVolts } from '../../../shared-schema/src/quantity-format';
import type { Hardware, OutputRequest, PlanFigures } from '../planning/types';
import { lsbVolts } from '../planning/table';
import { chainFigures, chainSignal, imageAttenuationNeededDb } from '../signal/analog-chain';
import type { SpectrumOptions } from '../signal/lines';
import { outputFigures, outputSignal } from '../signal/output-signal';
import { defaultFloorDb } from '../signal/quality-floor';
import { shapeFidelity } from '../signal/shape-fidelity';
import type { OutputAnalysis } from '../spec/types';
import { formatHz } from './units';

const dB = (x: number | null, what = 'dB'): string => (x === null ? 'unbounded' : `${x.toFixed(1)} ${what}`);
const hz = (x: number): string => formatHz(fromNumber(Number(x.toPrecision(6))));

/** Samples per cycle up to which a hover or report reconstructs a cycle for its fidelity figures. */
export const FIDELITY_MAX_S = 1024;

export interface Floor {
  snrDb: number;
  sfdrDb: number;
}

/** The output's floor, or the default of its DAC when the analysis carries none. */
export function floorOf(output: OutputAnalysis, hw: Hardware): Floor {
  const fallback = defaultFloorDb(hw.dac.bits);
  return output.qualityFloor ?? { snrDb: fallback, sfdrDb: fallback };
}

export function signalRows(hw: Hardware, req: OutputRequest, plan: PlanFigures, floor: Floor, options: SpectrumOptions = {}): string[][] {
  const f = outputFigures(hw, req, plan, options);
  const rows: string[][] = [
    [
      `signal (${f.method})`,
      `SNR ${dB(f.snrDb)}, SINAD ${dB(f.sinadDb)}, ENOB ${f.enob === null ? 'unbounded' : f.enob.toFixed(2)}, SFDR ${dB(f.sfdrDb)}` +
        `${f.worstSpurHz !== null ? ` (worst spur at ${hz(f.worstSpurHz)})` : ''}; floor: SNR ${floor.snrDb.toFixed(1)} dB, SFDR ${floor.sfdrDb.toFixed(1)} dB`,
    ],
    [req.waveform.shape === 'sine' ? 'THD' : 'harmonic content', `${Number(f.thdPercent.toPrecision(4))} % of the fundamental`],
    [
      'hold',
      `droop ${f.droopDb.toFixed(3)} dB at f_out; first image at ${hz(f.firstImageHz)}, ${f.firstImageDbc.toFixed(1)} dBc; ` +
        `the reconstruction filter needs ${imageAttenuationNeededDb(floor.sfdrDb, f.firstImageDbc).toFixed(1)} dB there for the floor`,
    ],
  ];
  const s = plan.tableLength / toNumber(plan.cycles);
  // Fidelity sums every harmonic below f_s/2 at each point of an edge: up to 1024 samples per cycle
  // (a few milliseconds); longer cycles have edges one sample period wide, and the row says so.
  if (req.waveform.shape !== 'sine' && Number.isInteger(s) && s > FIDELITY_MAX_S) {
    rows.push(['shape', `S = ${s}: edges and corners resolve to one sample period (${formatSeconds(1 / toNumber(plan.sampleRateHz))})`]);
  } else if (req.waveform.shape !== 'sine' && Number.isInteger(s)) {
    const a = outputSignal(hw, req, plan, options);
    // With S whole the table's own period is one cycle (N/gcd(M, N) = S).
    const cycle = a && a.model.tableLength === s ? a.model.codes : null;
    const fid = cycle ? shapeFidelity(cycle, req.waveform.shape, req.waveform.duty, toNumber(plan.sampleRateHz)) : null;
    if (fid) {
      const edge =
        fid.riseTimeS !== null || fid.fallTimeS !== null
          ? `; after an ideal low-pass at f_s/2: rise ${fid.riseTimeS === null ? '-' : formatSeconds(fid.riseTimeS)}, fall ${fid.fallTimeS === null ? '-' : formatSeconds(fid.fallTimeS)}, overshoot ${fid.overshootPercent!.toFixed(1)} %`
          : fid.cornerErrorPercent !== null
            ? `; corners rounded by ${fid.cornerErrorPercent.toFixed(2)} % of peak-to-peak after an ideal low-pass at f_s/2`
            : '';
      rows.push(['shape', `S = ${s}: THD ${fid.tableThdPercent.toFixed(2)} % against the ideal ${req.waveform.shape}'s ${fid.idealThdPercent.toFixed(2)} %${edge}; edges on a ${formatSeconds(fid.edgeResolutionS)} grid`]);
    }
  }
  if (hw.analog) rows.push(...chainRows(hw, req, plan));
  return rows;
}

function chainRows(hw: Hardware, req: OutputRequest, plan: PlanFigures): string[][] {
  const chain = hw.analog!;
  const c = chainFigures(chain, chainSignal(req, plan, lsbVolts(hw.dac)));
  const parts = [`gain ${chain.gain}: ${formatVolts(c.peakLowV)} to ${formatVolts(c.peakHighV)}${c.clips ? ' (clips)' : ''}`];
  parts.push(`slew needed ${Number((c.slewNeededVPerS / 1e6).toPrecision(3))} V/µs${chain.slewRateVPerS ? ` of ${Number((chain.slewRateVPerS / 1e6).toPrecision(3))}` : ''}`);
  if (c.closedLoopBandwidthHz !== null) parts.push(`closed loop ${hz(c.closedLoopBandwidthHz)} (${c.amplifierLossDb!.toFixed(2)} dB at f_out)`);
  if (c.highPassCornerHz !== null) parts.push(`coupling corner ${hz(c.highPassCornerHz)} (${c.couplingLossDb!.toFixed(2)} dB at f_out)`);
  if (c.tiltExact !== null) parts.push(`tilt ${(100 * c.tiltExact).toFixed(2)} % exact, ${(100 * c.tiltApprox!).toPrecision(3)} % by pi·f_c/f`);
  const rows = [['analog chain', parts.join('; ')]];
  for (const caution of c.cautions) rows.push(['caution', caution]);
  return rows;
}
