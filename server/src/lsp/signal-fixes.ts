// Quick fixes for the signal-quality floor and the analog chain, keyed on their codes. Each is a
// candidate the code-action module previews (fix-preview.ts): its title's figures are what the
// checker reports after the edit. The cause comes from the same estimate the diagnostic used.

import { lsbVolts } from '../planning/table';
import { chainFigures, chainSignal } from '../signal/analog-chain';
import { estimateOfPlan } from '../signal/output-signal';
import { setKey } from './entry-edits';
import type { Candidate, Context } from './code-actions';

/** A voltage written with 4 significant digits, rounded down so the fix stays on the safe side. */
const vppDown = (v: number): string => `${Math.floor(Number(v.toPrecision(6)) * 1000) / 1000} Vpp`;

function qualityFixes(c: Context): Candidate[] {
  const plan = c.output.planning.plan;
  if (!plan) return [];
  const e = estimateOfPlan(c.hw, c.output.request, plan);
  const out: Candidate[] = [];
  if (!plan.jitterFree && c.output.request.jitter === 'allow') {
    out.push({ head: 'Forbid jitter (integer dividers only)', edits: [setKey(c.doc, c.output, 'jitter', 'forbid')], mustClear: true, preferred: true });
  }
  if (c.output.request.waveform.shape !== 'sine' && !c.output.request.waveform.custom) {
    out.push({ head: 'Band-limit the table (only harmonics below f_s/2)', edits: [setKey(c.doc, c.output, 'band-limit', 'nyquist')], mustClear: true });
  }
  if (e.snrCause === 'quantisation') {
    // Full scale less one LSB around mid-scale: the default swing, the most SNR the DAC has.
    const full = c.hw.dac.fullScaleV - lsbVolts(c.hw.dac);
    const amp = vppDown(full);
    const offset = `${Number((full / 2).toPrecision(6))} V`;
    out.push({
      head: `Raise the amplitude to ${amp} around ${offset}`,
      edits: [setKey(c.doc, c.output, 'amplitude', amp), setKey(c.doc, c.output, 'offset', offset)],
      mustClear: true,
    });
  }
  return out;
}

/** Lower the amplitude to what the chain can carry: within the swing after the gain, within the slew rate. */
function amplitudeFixes(c: Context): Candidate[] {
  const plan = c.output.planning.plan;
  const chain = c.hw.analog;
  if (!plan || !chain) return [];
  const w = c.output.request.waveform;
  const f = chainFigures(chain, chainSignal(c.output.request, plan, lsbVolts(c.hw.dac)));
  let amp = w.amplitudeVpp;
  if (f.clips && chain.gain !== 0) {
    const lo = Math.min((chain.swingMinV ?? -Infinity) / chain.gain, (chain.swingMaxV ?? Infinity) / chain.gain);
    const hi = Math.max((chain.swingMinV ?? -Infinity) / chain.gain, (chain.swingMaxV ?? Infinity) / chain.gain);
    amp = Math.min(amp, 2 * Math.min(hi - w.offsetV, w.offsetV - lo));
  }
  // The slew rate a table needs is proportional to its amplitude.
  if (f.slewLimited && chain.slewRateVPerS) amp = Math.min(amp, (w.amplitudeVpp * chain.slewRateVPerS) / f.slewNeededVPerS);
  if (!(amp > 0) || amp >= w.amplitudeVpp) return [];
  return [{ head: `Lower the amplitude to ${vppDown(amp)}`, edits: [setKey(c.doc, c.output, 'amplitude', vppDown(amp))], mustClear: true, preferred: true }];
}

export function signalFixes(c: Context): Candidate[] {
  switch (c.d.code) {
    case 'signal-quality':
      return qualityFixes(c);
    case 'chain-clipping':
    case 'slew-rate':
      return amplitudeFixes(c);
    default:
      return [];
  }
}
