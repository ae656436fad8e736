// The wrap from the last table sample back to the first, compared with the step the waveform
// itself would take there on a continuous phase.
//
// A seam is ok only when the table holds whole cycles over an open span and the wrap step
// differs from the waveform's own step by at most 1 LSB. Whole cycles and an open span are
// required outright: with M = 10.5 a sine wraps at a zero crossing with the same code but the
// opposite slope (a phase flip every table), and a closed span plays its first sample twice
// (one sample period of dwell per table) even when the codes happen to match.

import { type Rational, isInteger } from '../../../shared-schema/src/rational';
import { sampleCode } from './table';
import type { Hardware, Seam, TableSpan, Waveform } from './types';

/** Samples after the wrap compared with the continuous waveform. */
const SEAM_WINDOW = 4;

export function seamCheck(
  waveform: Waveform,
  dac: Hardware['dac'],
  tableLength: number,
  cycles: Rational,
  span: TableSpan,
): Seam {
  const n = Math.floor(tableLength);
  if (n < 1) return { ok: false, jumpLsb: 0, cause: null };
  // The samples that follow the wrap against the ones a continuous phase would give there, over
  // a few samples: half a sine cycle (M = 2.5) wraps to the right code with the wrong slope, which
  // only the second sample after the wrap shows.
  let jumpLsb = 0;
  for (let k = 0; k < Math.min(n, SEAM_WINDOW); k++) {
    const played = sampleCode(waveform, dac, k, n, cycles, span);
    const continued = sampleCode(waveform, dac, n + k, n, cycles, span);
    jumpLsb = Math.max(jumpLsb, Math.abs(played - continued));
  }
  const whole = isInteger(cycles);
  const cause: Seam['cause'] = !whole
    ? 'fractional-cycles'
    : span === 'closed'
      ? 'repeated-sample'
      : jumpLsb > 1
        ? 'quantisation'
        : null;
  return { ok: cause === null, jumpLsb, cause };
}
