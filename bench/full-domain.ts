// The invented board every planner benchmark plans on (no real part's defaults): a 245.76 MHz
// system clock (a 12.288 MHz crystal times 20), an 18-bit integer divider with 6 fraction bits,
// a 14-bit DMA transfer counter, a 12-bit DAC and 64 KiB for tables.

import { rat } from '../shared-schema/src/rational';
import type { Hardware } from '../server/src/planning/types';

export const SYSTEM_CLOCK_HZ = 245_760_000;
export const INTEGER_MAX = 2 ** 18 - 1;
export const FRACTION_BITS = 6;
export const TABLE_MIN = 16;
export const TABLE_MAX = 2 ** 14 - 1;

/** The benchmark board with `fractionBits` fraction bits in its divider. */
export const fullDomainBoard = (fractionBits: number): Hardware => ({
  systemClockHz: rat(SYSTEM_CLOCK_HZ),
  divider: { integerMin: 1, integerMax: INTEGER_MAX, fractionBits },
  dac: { bits: 12, sampleBytes: 2, fullScaleV: 3.3, maxSampleRateHz: rat(SYSTEM_CLOCK_HZ) },
  memory: { budgetBytes: 64 * 1024, tableLengthMin: TABLE_MIN, tableLengthMax: TABLE_MAX, powerOfTwo: false },
});

/** "245.76 MHz, I 1…262143 (6 fraction bits), N 16…16383": the board in one line. */
export const fullDomainText = (fractionBits: number): string =>
  `${SYSTEM_CLOCK_HZ / 1e6} MHz, I 1…${INTEGER_MAX}${fractionBits > 0 ? ` (${fractionBits} fraction bits)` : ''}, N ${TABLE_MIN}…${TABLE_MAX}`;
