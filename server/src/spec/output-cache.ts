// One output of a wave spec read on its own, from its piece of the text (segments.ts), and kept
// in a bounded memo keyed by that text: an edit elsewhere in the file leaves the piece's text,
// and so its reading, unchanged. The piece is read as a small spec of its own, `outputs:` and the
// piece, so every key path and message is the one the whole file gives; positions come back
// relative to the piece and are moved to the file's lines when used (mapPiece). While the file as a
// whole does not parse, a piece that does not parse alone yields its own syntax errors (pieceSyntax).

import type { Document } from 'yaml';
import { type OutputEntry, outputSchema, waveSchema } from '../../../shared-schema/src/wave-schema';
import type { Hardware } from '../planning/types';
import { Memo } from './memo';
import { type PlannedOutput, planEntry } from './output-plan';
import { Quantities, readOutputQuantities } from './quantities';
import type { SampleSource } from './sample-file';
import { schemaDiagnostics } from './schema-issues';
import { endsWithLineBreak, lineBreakCount } from './line-breaks';
import type { OutputPiece } from './segments';
import { type LineIndex, WAVE_OUTPUTS, readSource } from './source';
import type { OutputAnalysis, Position, Range, SpecDiagnostic } from './types';
import { outputNames } from './wave-model';

/** What an output's text alone decides: the diagnostics before planning, and whether it can be planned. */
export interface PieceReading {
  /** False when the piece does not read on its own as it does in the file; the file is then read whole. */
  ok: boolean;
  /** Schema diagnostics about this output, in the schema's order. */
  schema: SpecDiagnostic[];
  /** Quantity diagnostics per quantity key (index into `quantityKeys('wave')`). */
  quantities: SpecDiagnostic[][];
  /** No error blocks planning and the entry matches the output schema. */
  plannable: boolean;
  /**
   * Planned results per hardware (a clock file's text gives one Hardware object: see analyze.ts),
   * per step share of the file's planning work (planning/work.ts) and per sample file read.
   */
  planned: WeakMap<Hardware, Map<string, PlannedOutput | null>>;
  /** The `sample-file:` value as written, when the entry has one: planning depends on that file's text too. */
  sampleFile?: string;
  /** The parse, kept only until the first planning so a new output is not parsed twice. */
  parsed?: Parsed;
  /** The diagnostics and output moved to the file's lines, for the line the piece was last on. */
  placed?: { line: number; schema: SpecDiagnostic[]; quantities: SpecDiagnostic[][]; planned?: PlannedOutput; atLine?: PlacedPlan };
}

/** A planned output at the file's lines. */
export interface PlacedPlan {
  diagnostics: SpecDiagnostic[];
  output?: OutputAnalysis;
}

const NOT_READABLE: PieceReading = { ok: false, schema: [], quantities: [], plannable: false, planned: new WeakMap() };

/** Where the piece's own text starts in its standalone form. */
export const STANDALONE_PREFIX = 'outputs:\n';

/** The piece as a spec of its own: line 0 is `outputs:`, the piece starts on line 1. */
export function standalone(piece: OutputPiece): string {
  const sibling = piece.keyed ? `${piece.name}-0` : 'next-0';
  const after = piece.follower === 'sibling' ? `${' '.repeat(piece.column)}${sibling}:\n` : piece.follower === 'top-level' ? 'next:\n' : '';
  return `${STANDALONE_PREFIX}${piece.text}${after}`;
}

const isOutputs = WAVE_OUTPUTS;

interface Parsed {
  doc: Document.Parsed;
  lines: LineIndex;
  data: { outputs: Record<string, unknown> };
  quantities: Quantities;
}

function parse(piece: OutputPiece): Parsed | null {
  if (!piece.keyed) return null;
  const src = readSource(standalone(piece), isOutputs);
  if (!src.doc || src.diagnostics.length > 0) return null;
  const outputs = (src.data as { outputs?: unknown } | null)?.outputs;
  if (!outputs || typeof outputs !== 'object' || !Object.hasOwn(outputs, piece.name)) return null;
  if (outputNames(src.doc)[0] !== piece.name) return null;
  return { doc: src.doc, lines: src.lines, data: src.data as Parsed['data'], quantities: new Quantities() };
}

const outputsSchema = waveSchema.shape.outputs;

/**
 * The schema diagnostics about this output, as validating the whole file lists them: the outputs
 * mapping is validated here (the standalone text has no `clock:`), and only this output's issues kept.
 */
function schemaOf(piece: OutputPiece, { doc, lines, data }: Parsed): SpecDiagnostic[] {
  const result = outputsSchema.safeParse(data.outputs);
  if (result.success) return [];
  const own = result.error.issues.filter((i) => i.path[0] === piece.name).map((i) => ({ ...i, path: ['outputs', ...i.path] }));
  return schemaDiagnostics('wave', doc, lines, data, own);
}

/** Lines of the standalone text that belong to the piece (the line after it only at its start). */
function inPiece(piece: OutputPiece): (p: Position) => boolean {
  const breaks = lineBreakCount(piece.text);
  const closed = endsWithLineBreak(piece.text);
  return (p) => p.line >= 1 && (p.line < 1 + breaks || (p.line === 1 + breaks && (!closed || p.character === 0)));
}

const rangeIn = (ok: (p: Position) => boolean, r: Range): boolean => ok(r.start) && ok(r.end);

function read(piece: OutputPiece): PieceReading {
  const parsed = parse(piece);
  if (!parsed) return NOT_READABLE;
  const { doc, lines, data } = parsed;
  const schema = schemaOf(piece, parsed);
  const quantities = readOutputQuantities(doc, lines, piece.name, parsed.quantities);
  const own = [...schema, ...quantities.flat()];
  const ok = inPiece(piece);
  if (!own.every((d) => rangeIn(ok, d.range))) return NOT_READABLE;
  const blocked = own.some((d) => d.severity === 'error' && d.code !== 'duplicate-output');
  const plannable = !blocked && outputSchema.safeParse(data.outputs[piece.name]).success;
  const written = (data.outputs[piece.name] as { 'sample-file'?: unknown } | null)?.['sample-file'];
  const sampleFile = typeof written === 'string' ? { sampleFile: written } : {};
  return { ok: true, schema, quantities, plannable, planned: new WeakMap(), parsed: plannable ? parsed : undefined, ...sampleFile };
}

function plan(piece: OutputPiece, reading: PieceReading, hardware: Hardware, steps: number, samples: SampleSource | undefined): PlannedOutput | null {
  let parsed = reading.parsed;
  reading.parsed = undefined;
  if (!parsed) {
    const again = parse(piece);
    if (!again) return null;
    readOutputQuantities(again.doc, again.lines, piece.name, again.quantities);
    parsed = again;
  }
  const { doc, lines, data, quantities } = parsed;
  const planned = planEntry(piece.name, data.outputs[piece.name] as OutputEntry, quantities, hardware, doc, lines, steps, samples);
  const ok = inPiece(piece);
  const o = planned.output;
  const ranges = o ? [o.nameRange, o.entryRange, ...Object.values(o.valueRanges)] : [];
  return [...ranges, ...planned.diagnostics.map((d) => d.range)].every((r) => rangeIn(ok, r)) ? planned : null;
}

// Two files at the 500-output limit, each edited many times, stay within this; a larger memo
// costs the language server resident memory (bench/lsp.ts) for little gain.
// Keyed by the piece's text alone (no key string is built per piece and edit); the follower and
// column, which also shape the reading, are checked on the entry, and a mismatch reads again.
const readings = new Memo<string, { follower: string; column: number; reading: PieceReading }>(1000);

const keyOf = (piece: OutputPiece): string => `${piece.follower}\u0000${piece.column}\u0000${piece.text}`;

export function readPiece(piece: OutputPiece): PieceReading {
  const fresh = () => ({ follower: piece.follower, column: piece.column, reading: read(piece) });
  let entry = readings.get(piece.text, fresh);
  if (entry.follower !== piece.follower || entry.column !== piece.column) {
    entry = fresh();
    readings.set(piece.text, entry);
  }
  return entry.reading;
}

/** Whether the piece is planned on this hardware already (planPiece then costs nothing). */
export const isPlanned = (reading: PieceReading, hardware: Hardware, steps: number, samples?: SampleSource): boolean =>
  reading.planned.get(hardware)?.has(planKey(steps, samples)) === true;

const planKey = (steps: number, samples: SampleSource | undefined): string => (samples === undefined ? String(steps) : `${steps}\u0000${samples.key}`);

// A piece with a sample file is planned again when the file's text changes; its older plans go.
const KEPT_PER_PIECE = 4;

/** The planned output; null when it does not read on its own (the file is then read whole). */
export function planPiece(piece: OutputPiece, reading: PieceReading, hardware: Hardware, steps: number, samples?: SampleSource): PlannedOutput | null {
  let byShare = reading.planned.get(hardware);
  if (byShare === undefined) {
    byShare = new Map();
    reading.planned.set(hardware, byShare);
  }
  const key = planKey(steps, samples);
  let planned = byShare.get(key);
  if (planned === undefined) {
    planned = plan(piece, reading, hardware, steps, samples);
    byShare.set(key, planned);
    if (byShare.size > KEPT_PER_PIECE) byShare.delete(byShare.keys().next().value!);
  }
  return planned;
}

/** Moves positions read from a piece on its own to the file's lines. */
export function mapPiece(piece: OutputPiece) {
  const delta = piece.line - 1;
  const range = (r: Range): Range => ({ start: { line: r.start.line + delta, character: r.start.character }, end: { line: r.end.line + delta, character: r.end.character } });
  const diag = (d: SpecDiagnostic): SpecDiagnostic => ({ ...d, range: range(d.range) });
  const output = (o: OutputAnalysis): OutputAnalysis => {
    const valueRanges: Record<string, Range> = {};
    for (const [k, r] of Object.entries(o.valueRanges)) valueRanges[k] = range(r);
    return { ...o, nameRange: range(o.nameRange), entryRange: range(o.entryRange), valueRanges };
  };
  return { range, diag, output };
}

// Placed objects are shared by every analysis in which the piece sits on the same line, so an
// edit that moves no line rebuilds nothing for the untouched outputs (and the language server's
// per-object caches hit). Nothing may change them after placing.

function placedAt(piece: OutputPiece, reading: PieceReading): NonNullable<PieceReading['placed']> {
  if (reading.placed?.line === piece.line) return reading.placed;
  const { diag } = mapPiece(piece);
  reading.placed = { line: piece.line, schema: reading.schema.map(diag), quantities: reading.quantities.map((q) => q.map(diag)) };
  return reading.placed;
}

/** The reading's schema and quantity diagnostics at the file's lines. */
export function placeReading(piece: OutputPiece, reading: PieceReading): { schema: SpecDiagnostic[]; quantities: SpecDiagnostic[][] } {
  return placedAt(piece, reading);
}

/** The planned output at the file's lines. */
export function placePlan(piece: OutputPiece, reading: PieceReading, planned: PlannedOutput): PlacedPlan {
  const placed = placedAt(piece, reading);
  if (placed.planned === planned && placed.atLine) return placed.atLine;
  const { diag, output } = mapPiece(piece);
  placed.planned = planned;
  placed.atLine = { diagnostics: planned.diagnostics.map(diag), output: planned.output && output(planned.output) };
  return placed.atLine;
}

/**
 * The syntax errors of the piece read on its own, at standalone positions (mapPiece moves them);
 * one outside the piece's lines (the parser often points past the end) lands on its first line.
 */
function syntaxOf(piece: OutputPiece): SpecDiagnostic[] {
  const src = readSource(standalone(piece), isOutputs);
  const ok = inPiece(piece);
  const first: Range = { start: { line: 1, character: 0 }, end: { line: 1, character: piece.text.search(/[\r\n]|$/) } };
  return src.diagnostics
    .filter((d) => d.code === 'yaml-syntax')
    .map((d) => (rangeIn(ok, d.range) ? d : { ...d, range: first }));
}

const syntaxErrors = new Memo<string, SpecDiagnostic[]>(64);

export function pieceSyntax(piece: OutputPiece): SpecDiagnostic[] {
  return syntaxErrors.get(keyOf(piece), () => syntaxOf(piece));
}

export const clearPieceMemo = (): void => {
  readings.clear();
  syntaxErrors.clear();
};
