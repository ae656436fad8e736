// RAM the sample tables take, against the budget of the clock file.

import type { Hardware } from './types';

/** Bytes one table of n samples takes: N · sample bytes. */
export function tableBytes(hw: Hardware, tableLength: number): number {
  return tableLength * hw.dac.sampleBytes;
}

export interface MemoryTotals {
  usedBytes: number;
  budgetBytes: number;
  /** usedBytes − budgetBytes when positive, else 0. */
  overBytes: number;
}

/** Total of several tables (given as lengths N) against the budget. */
export function memoryTotals(hw: Hardware, tableLengths: readonly number[]): MemoryTotals {
  let usedBytes = 0;
  for (const n of tableLengths) usedBytes += tableBytes(hw, n);
  const budgetBytes = hw.memory.budgetBytes;
  return { usedBytes, budgetBytes, overBytes: Math.max(0, usedBytes - budgetBytes) };
}
