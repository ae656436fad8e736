// A bounded memo of planned outputs, so an edit to one output re-plans only that one: every
// other output's hardware and request values are unchanged, so their keys hit.

import type { Rational } from '../../../shared-schema/src/rational';
import type { Hardware, OutputPlanning, OutputRequest } from './types';
import { OUTPUT_STEPS, StepAccount, withAccount } from './work';

const q = (r: Rational): string => `${r.num}/${r.den}`;

/** Every value planning reads, in one string. */
export function planningKey(hw: Hardware, req: OutputRequest): string {
  const { divider: dv, dac, memory: mem } = hw;
  const w = req.waveform;
  const p = req.pinned;
  return [
    q(hw.systemClockHz), hw.systemClockTolerance ? q(hw.systemClockTolerance) : '0',
    dv.integerMin, dv.integerMax, dv.fractionBits,
    dv.stages === undefined ? '-' : dv.stages.map((st) => `${st.name}:${st.min}:${st.max}:${st.registerOffset}`).join(','),
    dac.bits, dac.sampleBytes, dac.fullScaleV, q(dac.maxSampleRateHz),
    mem.budgetBytes, mem.tableLengthMin, mem.tableLengthMax, mem.powerOfTwo,
    q(req.targetHz), q(req.minSamplesPerCycle), q(req.toleranceHz), req.jitter, req.wholeSamplesPerCycle === true,
    w.shape, w.duty, w.amplitudeVpp, w.offsetV, w.custom?.key ?? '-', w.exact ? `${q(w.exact.amplitudeVpp)},${q(w.exact.offsetV)}` : '-',
    req.maxSamplesPerCycle ? q(req.maxSamplesPerCycle) : '-',
    req.duty ? `${q(req.duty.asked)},${q(req.duty.tolerance)}` : '-',
    p ? [p.dividerInteger, p.dividerFraction, p.tableLength, q(p.cycles), p.span].join(',') : '-',
    req.steps ? req.steps.map((st) => `${q(st.targetHz)}@${q(st.toleranceHz)}`).join(',') : '-',
  ].join('|');
}

interface Entry {
  value: OutputPlanning;
  /** Steps the planning took, whether it ran dry, and the limit it ran under. */
  used: number;
  limited: boolean;
  limit: number;
}

/**
 * Least-recently-used memo: a Map keeps insertion order, so the first key is the oldest. A result
 * stands for a step limit when it is what planning under that limit gives: a plan that finished
 * within L steps is the plan under every limit ≥ L; one that ran dry only under its own limit.
 */
export class PlanningCache {
  private readonly entries = new Map<string, Entry>();
  hits = 0;
  misses = 0;

  constructor(readonly capacity = 2000) {}

  get size(): number {
    return this.entries.size;
  }

  getOrCompute(key: string, compute: () => OutputPlanning, limit = OUTPUT_STEPS): OutputPlanning {
    const found = this.entries.get(key);
    if (found !== undefined && (found.limited ? found.limit === limit : found.used <= limit)) {
      this.hits++;
      this.entries.delete(key);
      this.entries.set(key, found);
      return found.value;
    }
    this.misses++;
    const account = new StepAccount(limit);
    const value = withAccount(account, compute);
    this.entries.delete(key);
    this.entries.set(key, { value, used: account.used, limited: account.limited, limit });
    if (this.entries.size > this.capacity) this.entries.delete(this.entries.keys().next().value!);
    return value;
  }

  clear(): void {
    this.entries.clear();
  }
}
