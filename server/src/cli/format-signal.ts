// The signal figures of a plan as JSON fields (the same names as the signal engine's figures).

import type { Hardware, OutputRequest, PlanFigures } from '../planning/types';
import { outputFigures } from '../signal/output-signal';

export function signalJson(hw: Hardware, req: OutputRequest, plan: PlanFigures) {
  const f = outputFigures(hw, req, plan);
  return {
    /** "exact": one transform of the stream's whole period; "analytic": line by line and Parseval totals. */
    spectrumMethod: f.method,
    /** null when unbounded (every line of the band is signal). */
    snrDb: f.snrDb,
    sinadDb: f.sinadDb,
    enob: f.enob,
    sfdrDb: f.sfdrDb,
    worstSpurHz: f.worstSpurHz,
    thdPercent: f.thdPercent,
    droopDb: f.droopDb,
    firstImageHz: f.firstImageHz,
    firstImageDbc: f.firstImageDbc,
  };
}
