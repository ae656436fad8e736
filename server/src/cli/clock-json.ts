// The checker's JSON for the clock tree: a wave spec's ranked system clocks, best first.

import { cmp, toNumber } from '../../../shared-schema/src/rational';
import { aboveRated, clockCandidatesOf, worstErrorPpm } from '../spec/clock-candidates';
import type { Analysis } from '../spec/types';
import { exactText } from './format-json';

export function clockCandidatesJson(analysis: Analysis) {
  const hw = analysis.hardware;
  const result = clockCandidatesOf(analysis);
  if (!hw || !result) return [];
  const requests = analysis.outputs.map((o) => o.request);
  const stages = hw.clockTree?.pll?.postStages ?? [];
  return result.candidates.map((c) => {
    const s = c.clock.setting;
    return {
      systemClockHz: toNumber(c.clock.systemClockHz),
      systemClockHzExact: exactText(c.clock.systemClockHz),
      current: cmp(c.clock.systemClockHz, hw.systemClockHz) === 0,
      aboveRated: aboveRated(hw, c.clock.systemClockHz),
      pll: s && {
        referenceDivider: s.referenceDivider,
        feedbackMultiplier: s.feedbackMultiplier,
        postDividers: Object.fromEntries(stages.map((st, i) => [st.name, s.postDividers[i]])),
        phaseDetectorHz: toNumber(s.pfdHz),
        vcoHz: toNumber(s.vcoHz),
        vcoMargin: c.clock.vcoMargin,
      },
      exactOutputs: c.score.exact,
      withinTolerance: c.score.within,
      jitterFreeOutputs: c.score.jitterFree,
      worstErrorPpm: worstErrorPpm(c, requests, hw),
      tableBytes: c.score.bytes,
      fitsBudget: c.score.fits,
    };
  });
}
