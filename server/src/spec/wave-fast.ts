// A wave spec analysed output by output: the frame (top-level keys) and each output's piece are
// read on their own and memoised by their text, so an edit re-reads one output and the rest hit.
// It gives exactly the analysis of reading the file whole (analyze.ts), or declines whenever the
// frame or a piece has anything the split cannot vouch for (a YAML or schema problem in the frame,
// a piece that does not parse alone): it then returns false, the caller empties the analysis and
// reads the file whole.

import { type WaveFile, waveSchema } from '../../../shared-schema/src/wave-schema';
import type { Hardware } from '../planning/types';
import { Memo } from './memo';
import { keyRange, valueRange } from './nodes';
import { type PieceReading, mapPiece, planPiece, readPiece } from './output-cache';
import type { PlannedOutput } from './output-plan';
import { quantityKeys } from './quantities';
import { splitWave } from './segments';
import { flowDepthBreach, readSource } from './source';
import type { Analysis, OutputAnalysis, Range, SpecDiagnostic } from './types';

/** What the wave spec needs from its frame, with positions on the frame's own lines. */
interface Frame {
  clock: unknown;
  clockRange: Range;
  outputsKey: Range;
}

function readFrame(text: string): Frame | null {
  const src = readSource(text, (p) => p.length === 1 && p[0] === 'outputs');
  if (!src.doc || src.diagnostics.length > 0) return null;
  const data = src.data as Partial<WaveFile> | null;
  // Without its pieces `outputs:` must be empty; anything else there (a `- ` line at the margin
  // reads as a list under it) is laid out in a way the split does not cover.
  if (!data || typeof data !== 'object' || Array.isArray(data) || !Object.hasOwn(data, 'outputs') || data.outputs !== null) return null;
  // The outputs themselves are checked piece by piece; the frame must have no schema issue of its own.
  if (!waveSchema.safeParse({ ...data, outputs: {} }).success) return null;
  const outputsKey = keyRange(src.doc, src.lines, ['outputs']);
  if (!outputsKey) return null;
  return { clock: data.clock, clockRange: valueRange(src.doc, src.lines, ['clock']) ?? src.lines.firstLine(), outputsKey };
}

const frames = new Memo<string, Frame | null>(64);

// Every quantity key of a wave spec sits under an output; were one added at the top level, the
// frame would have quantities of its own and this split would not know where to list them.
const outputQuantitiesOnly = (): boolean => quantityKeys('wave').every((k) => k.parts[0] === 'outputs' && k.parts[1] === '*');

export interface WaveSteps {
  maxOutputs: number;
  /** Resolves `clock:` (the value and its range in the file); pushes its own diagnostics. */
  resolveClock(analysis: Analysis, clock: unknown, range: Range): Hardware | null;
  overBudget(analysis: Analysis, usedBytes: number, hardware: Hardware, outputsKey: Range): void;
}

export function analyzeWaveFast(analysis: Analysis, steps: WaveSteps): boolean {
  const text = analysis.text;
  if (!outputQuantitiesOnly()) return false;
  const seg = splitWave(text, steps.maxOutputs);
  if (!seg || flowDepthBreach(text) !== undefined) return false;
  const frame = frames.get(seg.frameText, readFrame);
  if (!frame) return false;
  const readings: PieceReading[] = [];
  for (const piece of seg.pieces) {
    const reading = readPiece(piece);
    if (!reading.ok) return false;
    readings.push(reading);
  }
  const toFile = (r: Range): Range => ({
    start: { line: seg.frameLines[r.start.line], character: r.start.character },
    end: { line: seg.frameLines[r.end.line], character: r.end.character },
  });
  const maps = seg.pieces.map(mapPiece);

  // The order reading the file whole gives: schema issues output by output, then quantity
  // problems key by key (outputs in file order within a key).
  const diagnostics: SpecDiagnostic[] = [];
  readings.forEach((r, i) => diagnostics.push(...r.schema.map(maps[i].diag)));
  quantityKeys('wave').forEach((_, k) => readings.forEach((r, i) => diagnostics.push(...(r.quantities[k] ?? []).map(maps[i].diag))));
  analysis.diagnostics = diagnostics;

  const hardware = steps.resolveClock(analysis, frame.clock, toFile(frame.clockRange));
  if (!hardware) return true;

  const planned: (PlannedOutput | undefined)[] = [];
  for (let i = 0; i < seg.pieces.length; i++) {
    if (!readings[i].plannable) {
      planned.push(undefined);
      continue;
    }
    const p = planPiece(seg.pieces[i], readings[i], hardware);
    if (!p) return false;
    planned.push(p);
  }
  analysis.hardware = hardware;
  const outputs: OutputAnalysis[] = [];
  let usedBytes = 0;
  planned.forEach((p, i) => {
    if (!p) return;
    diagnostics.push(...p.diagnostics.map(maps[i].diag));
    if (p.output) outputs.push(maps[i].output(p.output));
    usedBytes += p.tableBytes;
  });
  analysis.outputs = outputs;
  steps.overBudget(analysis, usedBytes, hardware, toFile(frame.outputsKey));
  return true;
}
