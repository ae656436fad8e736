// What the pictures plot, in one place: the DAC codes of the table (from the planning engine's
// own buildTable, so the picture shows exactly the samples the firmware export writes), and the
// ideal signal the table approximates.

import { toNumber } from '../../../shared-schema/src/rational';
import { lsbVolts, sampleCode, waveVolts } from '../planning/table';
import type { Hardware, PlanFigures, TableSpan, Waveform } from '../planning/types';

export interface Signal {
  /** DAC code of table entry i (0 ≤ i < N), computed on first use. */
  code(i: number): number;
  tableLength: number;
  /** M as a number (a pinned plan may hold a non-integer). */
  cycles: number;
  sampleRateHz: number;
  /** Volts per DAC code. */
  lsbV: number;
  /** Phase in cycles of table position u (u may run past N into the next pass). */
  phaseAt(u: number): number;
  /** Ideal output voltage at a phase in cycles. */
  idealV(phase: number): number;
}

export function signalOf(figures: PlanFigures, waveform: Waveform, dac: Hardware['dac'], span: TableSpan): Signal {
  const n = figures.tableLength;
  const cycles = toNumber(figures.cycles);
  // A closed table spreads its cycles over N − 1 intervals: that is where its samples sit.
  const intervals = span === 'closed' && n > 1 ? n - 1 : n;
  const codes = new Int32Array(n).fill(-1);
  return {
    code: (i) => {
      // Pictures often need a few samples of a long table: compute only those, with the very
      // function buildTable uses, so they equal the exported table's entries.
      if (codes[i] < 0) codes[i] = sampleCode(waveform, dac, i, n, figures.cycles, span);
      return codes[i];
    },
    tableLength: n,
    cycles,
    sampleRateHz: toNumber(figures.sampleRateHz),
    lsbV: lsbVolts(dac),
    phaseAt: (u) => (u * cycles) / intervals,
    idealV: (phase) => waveVolts(waveform, phase - Math.floor(phase)),
  };
}

/** The table entry that plays at stream position i (the DMA wraps the table). */
export function sampleAt(sig: Signal, i: number): number {
  const n = sig.tableLength;
  return sig.code(((i % n) + n) % n);
}
