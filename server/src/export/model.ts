// The outputs an export writes: each planned output with its table built once by the planning
// engine's own buildTable (the same samples the pictures show), and how many samples the DAC
// range clipped.

import { buildTable, sampleRawCode } from '../planning/table';
import type { Hardware, PlanFigures, TableSpan } from '../planning/types';
import type { OutputAnalysis } from '../spec/types';
import type { LoadedSpec } from './load';

export interface ExportedOutput {
  analysis: OutputAnalysis;
  plan: PlanFigures;
  span: TableSpan;
  codes: Int32Array;
  /** Samples whose ideal value fell outside the DAC's codes and were held at the rail. */
  clipped: number;
  /** The largest distance, in LSB, between a clipped sample's ideal code and its rail. */
  clipLsb: number;
  /** A member of a phase-locked group: its offset as realised (tables are rotated by it, or shared). */
  phase?: MemberPhase;
}

export interface MemberPhase {
  group: string;
  /** Samples the table is rotated by (table-rotation) or the DMA channel starts in (start-offset). */
  rotation: number;
  offsetDeg: number;
  realisedDeg: number;
  errorDeg: number;
  errorS: number;
  /** start-offset: the member whose table this one plays; null when it has its own. */
  sharesTableOf: string | null;
}

export interface ExportModel {
  hardware: Hardware;
  outputs: ExportedOutput[];
  /** Outputs with no plan at all (only possible in a spec with errors). */
  unplanned: string[];
}

/**
 * The alignment of a table that feeds a DMA ring: its own size, which a ring needs to be a power
 * of two. A forced export of a table that is not (the spec then has an error saying so) gets the
 * next power of two, still a valid alignment, so the file builds and the ring's limit stays visible.
 */
export function ringAlignment(tableBytes: number): number {
  let align = 1;
  while (align < tableBytes) align *= 2;
  return align;
}

export function spanOf(o: OutputAnalysis): TableSpan {
  return o.request.pinned?.span ?? 'open';
}

export function exportModel(spec: LoadedSpec): ExportModel | null {
  const hardware = spec.analysis.hardware;
  if (!hardware) return null;
  const outputs: ExportedOutput[] = [];
  const unplanned: string[] = [];
  for (const o of spec.analysis.outputs) {
    const plan = o.planning.plan;
    if (!plan) {
      unplanned.push(o.name);
      continue;
    }
    const span = spanOf(o);
    const phase = memberPhase(spec, o.name);
    const built = buildTable(o.request.waveform, hardware.dac, plan.tableLength, plan.cycles, span);
    const codes = phase && phase.sharesTableOf === null && phase.rotation !== 0 ? rotated(built, phase.rotation) : built;
    outputs.push({ analysis: o, plan, span, codes, ...clipping(o, hardware.dac, plan, span), ...(phase ? { phase } : {}) });
  }
  return { hardware, outputs, unplanned };
}

/** The member's offset in its phase-locked group, if it is in one. */
function memberPhase(spec: LoadedSpec, name: string): MemberPhase | undefined {
  for (const g of spec.analysis.groups ?? []) {
    const i = g.members.indexOf(name);
    if (i < 0 || !g.phases) continue;
    const p = g.phases[i]!;
    const sharesTableOf = g.offsetsAs === 'start-offset' && i > 0 ? g.members[0]! : null;
    return { group: g.name, rotation: p.rotation, offsetDeg: p.offsetDeg, realisedDeg: p.realisedDeg, errorDeg: p.errorDeg, errorS: p.errorS, sharesTableOf };
  }
  return undefined;
}

/** table[(i + k) mod N]: the waveform k samples ahead, so the member leads by k·M/N cycles. */
function rotated(codes: Int32Array, k: number): Int32Array {
  const n = codes.length;
  const out = new Int32Array(n);
  for (let i = 0; i < n; i++) out[i] = codes[(i + k) % n]!;
  return out;
}

/**
 * How far the table's ideal codes reach past the DAC's rails. A waveform that spans exactly the
 * full scale reaches code 2^bits, one above the top code — clipped by one LSB, which the messages
 * tell apart from real clipping.
 */
function clipping(o: OutputAnalysis, dac: Hardware['dac'], plan: PlanFigures, span: TableSpan): { clipped: number; clipLsb: number } {
  const top = 2 ** dac.bits - 1;
  let clipped = 0;
  let clipLsb = 0;
  for (let i = 0; i < plan.tableLength; i++) {
    const raw = sampleRawCode(o.request.waveform, dac, i, plan.tableLength, plan.cycles, span);
    const excess = raw > top ? raw - top : raw < 0 ? -raw : 0;
    if (excess > 0) {
      clipped++;
      clipLsb = Math.max(clipLsb, excess);
    }
  }
  return { clipped, clipLsb };
}
