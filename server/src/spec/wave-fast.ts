// A wave spec analysed output by output: the frame (top-level keys) and each output's piece are
// read on their own and memoised by their text, so an edit re-reads one output and the rest hit.
// It gives exactly the analysis of reading the file whole (analyze.ts), or declines whenever the
// frame or a piece has anything the split cannot vouch for (a YAML or schema problem in the frame,
// a piece that does not parse alone): it then returns false, the caller empties the analysis and
// reads the file whole. One exception, so that editing keeps its footing: while the file as a
// whole is not valid YAML (a line half typed), the outputs whose own text reads still get their
// diagnostics and plans, and the syntax errors are shown where they are (frame-tolerant.ts).

import { type WaveFile, waveSchema } from '../../../shared-schema/src/wave-schema';
import type { Hardware } from '../planning/types';
import { stepsPerOutput } from '../planning/work';
import { type FrameReading, frameSyntax } from './frame-tolerant';
import { Memo } from './memo';
import { keyRange, valueRange } from './nodes';
import { type PieceReading, isPlanned, mapPiece, pieceSyntax, placePlan, placeReading, planPiece, readPiece } from './output-cache';
import { quantityKeys } from './quantities';
import type { SampleSource } from './sample-file';
import { type Segments, splitWave } from './segments';
import { WAVE_OUTPUTS, flowDepthBreach, readSource } from './source';
import { splitTree } from './split-tree';
import { setSyntax } from './syntax';
import type { Analysis, Range, SpecDiagnostic } from './types';

function readFrame(text: string): FrameReading | null {
  const src = readSource(text, WAVE_OUTPUTS);
  if (!src.doc || src.diagnostics.length > 0) return null;
  const data = src.data as Partial<WaveFile> | null;
  // Without its pieces `outputs:` must be empty; anything else there (a `- ` line at the margin
  // reads as a list under it) is laid out in a way the split does not cover.
  if (!data || typeof data !== 'object' || Array.isArray(data) || !Object.hasOwn(data, 'outputs') || data.outputs !== null) return null;
  // Groups tie outputs together, so their plans cannot be read piece by piece.
  if (Object.hasOwn(data, 'groups')) return null;
  // The outputs themselves are checked piece by piece; the frame must have no schema issue of its own.
  if (!waveSchema.safeParse({ ...data, outputs: {} }).success) return null;
  const outputsKey = keyRange(src.doc, src.lines, ['outputs']);
  if (!outputsKey) return null;
  return { clock: data.clock, clockRange: valueRange(src.doc, src.lines, ['clock']) ?? src.lines.firstLine(), outputsKey, syntax: [] };
}

const frames = new Memo<string, FrameReading | null>(64);

// Every quantity key of a wave spec sits under an output; were one added at the top level, the
// frame would have quantities of its own and this split would not know where to list them.
const outputQuantitiesOnly = (): boolean => quantityKeys('wave').every((k) => k.parts[0] === 'outputs' && k.parts[1] === '*');

export interface WaveSteps {
  maxOutputs: number;
  /** Resolves `clock:` (the value and its range in the file); pushes its own diagnostics. */
  resolveClock(analysis: Analysis, clock: unknown, range: Range): Hardware | null;
  /** Reads the file an output's `sample-file:` names (`written` as in the spec) and records it. */
  resolveSamples?(analysis: Analysis, written: unknown): SampleSource | undefined;
  overBudget(analysis: Analysis, usedBytes: number, hardware: Hardware, outputsKey: Range): void;
}

/** Frame positions → file positions (the outputs block sits between the frame's head and tail). */
function frameMapper(seg: Segments): (r: Range) => Range {
  const line = (l: number) => (l < seg.headLines ? l : l + seg.pieceLines);
  return (r) => ({ start: { line: line(r.start.line), character: r.start.character }, end: { line: line(r.end.line), character: r.end.character } });
}

/** True when the text as a whole is not valid YAML: only then may the split read past a piece it cannot vouch for. */
function brokenYaml(text: string): SpecDiagnostic[] | undefined {
  const src = readSource(text, WAVE_OUTPUTS);
  if (src.doc) return undefined;
  const syntax = src.diagnostics.filter((d) => d.code === 'yaml-syntax');
  return syntax.length === src.diagnostics.length ? syntax : undefined;
}

/** How far an analysis has come: outputs planned of those it plans. */
export interface Progress {
  planned: number;
  total: number;
}

/** Runs steps to the end. */
export function finish<T>(steps: Generator<Progress, T>): T {
  let step = steps.next();
  while (!step.done) step = steps.next();
  return step.value;
}

export function analyzeWaveFast(analysis: Analysis, steps: WaveSteps): boolean {
  return finish(analyzeWaveFastSteps(analysis, steps));
}

/**
 * The split reading in steps: it yields after each output it had to plan (not after a memo hit),
 * with the analysis filled so far (every diagnostic before planning, the outputs planned).
 */
export function* analyzeWaveFastSteps(analysis: Analysis, steps: WaveSteps): Generator<Progress, boolean> {
  const text = analysis.text;
  if (!outputQuantitiesOnly()) return false;
  const seg = splitWave(text, steps.maxOutputs);
  if (!seg || flowDepthBreach(text) !== undefined) return false;
  const exactFrame = frames.get(seg.frameText, readFrame);
  // Reading a new file's pieces takes a while too: let other work in between them.
  const readings: PieceReading[] = [];
  for (const piece of seg.pieces) {
    readings.push(readPiece(piece));
    if (readings.length % 8 === 0) yield { planned: 0, total: seg.pieces.length };
  }
  const exact = exactFrame !== null && readings.every((r) => r.ok);
  // Where a piece does not read, the whole file is parsed too: let other work in first.
  if (!exact) yield { planned: 0, total: seg.pieces.length };
  const wholeSyntax = exact ? undefined : brokenYaml(text);
  if (!exact && !wholeSyntax) return false;
  const frame = exactFrame ?? frameSyntax(seg.frameText);
  const toFile = frameMapper(seg);
  setSyntax(analysis, splitTree(seg));

  // The order reading the file whole gives: syntax errors, then schema issues output by output,
  // then quantity problems key by key (outputs in file order within a key).
  const diagnostics: SpecDiagnostic[] = [];
  if (wholeSyntax) {
    const local = [...frame.syntax.map((d) => ({ ...d, range: toFile(d.range) }))];
    readings.forEach((r, i) => {
      if (!r.ok) local.push(...pieceSyntax(seg.pieces[i]).map(mapPiece(seg.pieces[i]).diag));
    });
    // Each part reads alone yet the whole does not (a bracket that spans outputs): the whole's errors.
    diagnostics.push(...(local.length > 0 ? local : wholeSyntax));
  }
  const placed = readings.map((r, i) => (r.ok ? placeReading(seg.pieces[i], r) : undefined));
  for (const p of placed) if (p) diagnostics.push(...p.schema);
  quantityKeys('wave').forEach((_, k) => placed.forEach((p) => p && diagnostics.push(...(p.quantities[k] ?? []))));
  analysis.diagnostics = diagnostics;

  if (frame.clock === undefined || !frame.clockRange) return true;
  const hardware = steps.resolveClock(analysis, frame.clock, toFile(frame.clockRange));
  if (!hardware) return true;

  const share = stepsPerOutput(seg.pieces.length);
  analysis.hardware = hardware;
  const total = readings.filter((r) => r.plannable).length;
  let done = 0;
  let usedBytes = 0;
  for (let i = 0; i < seg.pieces.length; i++) {
    if (!readings[i].plannable) continue;
    const samples = steps.resolveSamples?.(analysis, readings[i].sampleFile);
    const fresh = !isPlanned(readings[i], hardware, share, samples);
    const p = planPiece(seg.pieces[i], readings[i], hardware, share, samples);
    done++;
    if (p === null) {
      if (exact) return false;
      continue;
    }
    const atLine = placePlan(seg.pieces[i], readings[i], p);
    diagnostics.push(...atLine.diagnostics);
    if (atLine.output) analysis.outputs.push(atLine.output);
    usedBytes += p.tableBytes;
    if (fresh) yield { planned: done, total };
  }
  const outputsLine: Range = { start: { line: seg.outputsLine, character: 0 }, end: { line: seg.outputsLine, character: 'outputs'.length } };
  steps.overBudget(analysis, usedBytes, hardware, frame.outputsKey ? toFile(frame.outputsKey) : outputsLine);
  return true;
}
