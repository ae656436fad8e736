// One output of a wave spec, from its validated entry to its planned analysis: the request, the
// planner's verdict and the diagnostics about both. The same step for a file read whole and for
// an output read on its own (wave-fast.ts).

import { DEFAULT_TOLERANCE } from '../../../shared-schema/src/defaults';
import type { OutputEntry } from '../../../shared-schema/src/wave-schema';
import type { Document } from 'yaml';
import { planOutput } from '../planning/choose';
import type { Hardware } from '../planning/types';
import { toNumber } from '../../../shared-schema/src/rational';
import { planningDiagnostics } from './planning-diagnostics';
import { qualityFloor, signalDiagnostics } from './signal-diagnostics';
import type { Quantities } from './quantities';
import { type LineIndex, diagnostic } from './source';
import type { OutputAnalysis, SpecDiagnostic } from './types';
import type { SampleSource } from './sample-file';
import { buildOutput } from './wave-model';

export interface PlannedOutput {
  diagnostics: SpecDiagnostic[];
  /** Absent when the entry cannot be planned or planning failed. */
  output?: OutputAnalysis;
  /** Bytes of the chosen table (0 without a plan). */
  tableBytes: number;
}

/**
 * `steps`: the output's share of its file's planning work (planning/work.ts stepsPerOutput);
 * `samples`: the file the entry's `sample-file:` names, read (sample-file.ts).
 */
export function planEntry(name: string, entry: OutputEntry, quantities: Quantities, hardware: Hardware, doc: Document.Parsed, lines: LineIndex, steps?: number, samples?: SampleSource): PlannedOutput {
  const built = buildOutput(name, entry, quantities, hardware, doc, lines, samples);
  const diagnostics = [...built.diagnostics];
  const draft = built.draft;
  if (!draft) return { diagnostics, tableBytes: 0 };
  try {
    const planning = planOutput(hardware, draft.request, steps);
    const toleranceText = draft.toleranceText ?? quantities.get(['outputs', name, 'tolerance'])?.text ?? DEFAULT_TOLERANCE;
    diagnostics.push(...planningDiagnostics(draft, planning, hardware, toleranceText));
    const db = (key: string) => quantities.get(['outputs', name, key]);
    const floor = qualityFloor(hardware, db('min-snr') && toNumber(db('min-snr')!.value), db('min-sfdr') && toNumber(db('min-sfdr')!.value));
    diagnostics.push(...signalDiagnostics(draft, planning, hardware, floor));
    return { diagnostics, output: { ...draft, planning, qualityFloor: { snrDb: floor.snrDb, sfdrDb: floor.sfdrDb } }, tableBytes: planning.plan?.tableBytes ?? 0 };
  } catch (e) {
    diagnostics.push(diagnostic('internal-error', draft.nameRange, `Planning this output failed (${String((e as Error)?.message ?? e).slice(0, 120)}): please report the input.`, name));
    return { diagnostics, tableBytes: 0 };
  }
}
