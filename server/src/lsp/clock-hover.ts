// Hover on `system-clock` in a clock file: the system clocks its tree reaches, ranked for every
// output of the wave specs that read it (one board, one clock), from the joint search.

import { hasAlternatives, rankClocks } from '../spec/clock-candidates';
import { specBoardOf } from '../spec/board-budget';
import type { Analysis } from '../spec/types';
import { candidatesMarkdown } from './clock-candidates-view';

export function systemClockHover(clock: Analysis, readers: readonly Analysis[]): string | undefined {
  const hw = clock.hardware;
  if (clock.kind !== 'clock' || !hasAlternatives(hw)) return undefined;
  const requests = readers.flatMap((r) => r.outputs.map((o) => o.request));
  if (requests.length === 0) return 'No wave spec in the workspace reads this clock file yet, so there are no outputs to rank its system clocks for.';
  const result = rankClocks(hw, readers.map(specBoardOf));
  if (!result) return 'The clock tree is too large to rank here: narrow the PLL ranges.';
  return candidatesMarkdown(hw, result, requests, 'Ranked system clocks');
}
