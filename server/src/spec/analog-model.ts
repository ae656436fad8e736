// A clock file's `analog` section → the AnalogChain the signal checks read (signal/analog-chain.ts).

import type { ClockFile } from '../../../shared-schema/src/clock-schema';
import { toNumber } from '../../../shared-schema/src/rational';
import type { AnalogChain } from '../planning/types';
import type { Quantities } from './quantities';

export function analogChainOf(data: ClockFile, q: Quantities): AnalogChain | undefined {
  const a = data.analog;
  if (!a) return undefined;
  const num = (...path: string[]): number | undefined => {
    const v = q.get(['analog', ...path]);
    return v ? toNumber(v.value) : undefined;
  };
  const chain: AnalogChain = { gain: num('gain') ?? 1 };
  const set = <K extends keyof AnalogChain>(key: K, value: AnalogChain[K] | undefined) => {
    if (value !== undefined) chain[key] = value;
  };
  set('slewRateVPerS', num('slew-rate'));
  set('gainBandwidthHz', num('gain-bandwidth'));
  set('swingMinV', num('output-swing', 'min'));
  set('swingMaxV', num('output-swing', 'max'));
  set('couplingResistanceOhm', num('coupling', 'resistance'));
  set('couplingCapacitanceF', num('coupling', 'capacitance'));
  set('load', a.load);
  return chain;
}
