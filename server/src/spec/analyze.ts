// The one entry every face uses (LSP features, the checker, exporters): a spec's text → plain
// Analysis with diagnostics, hardware and a plan per output. Never throws; never writes files.

import * as nodePath from 'node:path';
import type { ClockFile } from '../../../shared-schema/src/clock-schema';
import type { FileKind } from '../../../shared-schema/src/keys';
import { outputSchema, type OutputEntry, type WaveFile } from '../../../shared-schema/src/wave-schema';
import type { Hardware } from '../planning/types';
import { stepsPerOutput } from '../planning/work';
import { fitToBudget } from './board-budget';
import { buildHardware } from './clock-model';
import { applyGroups } from './group-model';
import { keyRange, valueRange } from './nodes';
import { Memo } from './memo';
import { planEntry } from './output-plan';
import { readQuantities } from './quantities';
import { validate } from './schema-issues';
import { readReferenced, resolveSampleFile, type SampleSource } from './sample-file';
import { type Source, WAVE_OUTPUTS, diagnostic, readSource } from './source';
import { documentTree, setSyntax } from './syntax';
import type { Analysis, Range, SpecDiagnostic, SpecHost } from './types';
import { type Progress, type WaveSteps, analyzeWaveFastSteps, finish } from './wave-fast';
import { outputNames } from './wave-model';

/** More outputs than this in one file are not planned (each plan is a search). */
export const MAX_OUTPUTS = 500;

export const kindOf = (path: string): FileKind => (/\.clock\.ya?ml$/i.test(path) ? 'clock' : 'wave');

export function analyze(path: string, text: string, host: SpecHost): Analysis {
  return finish(run(newAnalysis(path, text), host, true));
}

/** An analysis being made: `steps` yields after each output it plans, `analysis` is filled so far. */
export interface AnalysisRun {
  analysis: Analysis;
  steps: Generator<Progress, Analysis>;
}

/**
 * The same analysis in steps, for a server that answers other requests while a large file is
 * planned: between steps the analysis holds every diagnostic found before planning and the
 * outputs planned so far; the last step returns it whole.
 */
export function analyzeInSteps(path: string, text: string, host: SpecHost): AnalysisRun {
  const analysis = newAnalysis(path, text);
  return { analysis, steps: run(analysis, host, true) };
}

/**
 * The same analysis with a wave spec always read whole, never output by output: the reference
 * the split reading (wave-fast.ts) must match, and a way to rule it out when chasing a problem.
 */
export function analyzeWhole(path: string, text: string, host: SpecHost): Analysis {
  return finish(run(newAnalysis(path, text), host, false));
}

const newAnalysis = (path: string, text: string): Analysis => ({ path, kind: kindOf(path), text, diagnostics: [], outputs: [], hardware: null, clockPath: null, memory: null });

function* run(analysis: Analysis, host: SpecHost, split: boolean): Generator<Progress, Analysis> {
  try {
    if (analysis.kind === 'clock') {
      const clock = readClock(analysis.text);
      analysis.diagnostics = clock.diagnostics;
      analysis.hardware = clock.hardware;
    } else {
      yield* analyzeWave(analysis, host, split);
    }
  } catch (e) {
    analysis.diagnostics.push(diagnostic('internal-error', { start: { line: 0, character: 0 }, end: { line: 0, character: 0 } }, `waveplan failed while checking this file (${String((e as Error)?.message ?? e).slice(0, 120)}): please report the input.`));
  }
  return analysis;
}

interface Read {
  src: Source;
  diagnostics: SpecDiagnostic[];
}

type Reading = Read & { quantities?: ReturnType<typeof readQuantities>['quantities'] };

function read(kind: FileKind, text: string): Reading {
  return readParsed(kind, readSource(text, kind === 'wave' ? WAVE_OUTPUTS : undefined));
}

/** The schema and the quantities of a parsed file. */
function readParsed(kind: FileKind, src: ReturnType<typeof readSource>): Reading {
  const diagnostics = [...src.diagnostics];
  if (!src.doc) return { src, diagnostics };
  diagnostics.push(...validate(kind, src.doc, src.lines, src.data));
  const q = readQuantities(kind, src.doc, src.lines, src.data);
  diagnostics.push(...q.diagnostics);
  return { src, diagnostics, quantities: q.quantities };
}

/** A clock spec → its hardware (null while it has errors) and its diagnostics. */
export function readClock(text: string): { hardware: Hardware | null; diagnostics: SpecDiagnostic[] } {
  const { src, diagnostics, quantities } = read('clock', text);
  if (!src.doc || !quantities || diagnostics.some((d) => d.severity === 'error')) return { hardware: null, diagnostics };
  const built = buildHardware(src.data as ClockFile, quantities, src.doc, src.lines);
  return { hardware: built.hardware, diagnostics: [...diagnostics, ...built.diagnostics] };
}

function* analyzeWave(analysis: Analysis, host: SpecHost, split: boolean): Generator<Progress, void> {
  const steps: WaveSteps = {
    maxOutputs: MAX_OUTPUTS,
    resolveClock: (a, clock, range) => resolveClock(a, clock, range, host),
    resolveSamples: (a, written) => resolveSamples(a, written, host),
    overBudget,
  };
  if (split && (yield* splitReading(analysis, steps))) return;
  yield* analyzeWaveWhole(analysis, host);
}

/** The split reading, or false (with the analysis left empty) so the file is read whole. */
function* splitReading(analysis: Analysis, steps: WaveSteps): Generator<Progress, boolean> {
  try {
    if (yield* analyzeWaveFastSteps(analysis, steps)) return true;
  } catch {
    // Whatever failed here, reading the file whole gives the analysis or reports the failure.
  }
  Object.assign(analysis, { diagnostics: [], outputs: [], hardware: null, clockPath: null, memory: null });
  return false;
}

/** The whole file read at once: every wave spec gives this analysis, however it is laid out. */
function* analyzeWaveWhole(analysis: Analysis, host: SpecHost): Generator<Progress, void> {
  // A large file's parse and its schema and quantity checks each take a while: other messages
  // are let in between them (the editor's requests answer from the analysis so far).
  // The tree and the findings so far are set before each pause, so a request meanwhile reads them
  // (and never parses the text again for a cursor).
  const parsed = readSource(analysis.text, WAVE_OUTPUTS);
  setSyntax(analysis, documentTree(parsed.tree, analysis.text));
  analysis.diagnostics = [...parsed.diagnostics];
  yield { planned: 0, total: 0 };
  const { src, diagnostics, quantities } = readParsed('wave', parsed);
  analysis.diagnostics = diagnostics;
  yield { planned: 0, total: 0 };
  const doc = src.doc;
  if (!doc || !quantities) return;
  const data = (src.data ?? {}) as Partial<WaveFile>;

  if (typeof data.clock !== 'string' || data.clock.length === 0) return;
  const hardware = resolveClock(analysis, data.clock, valueRange(doc, src.lines, ['clock']) ?? src.lines.firstLine(), host);
  if (!hardware) return;
  analysis.hardware = hardware;

  const names = outputNames(doc);
  const outputsKey = keyRange(doc, src.lines, ['outputs']) ?? src.lines.firstLine();
  if (names.length > MAX_OUTPUTS) {
    diagnostics.push(diagnostic('too-many-outputs', outputsKey, `This file lists ${names.length} outputs, more than the ${MAX_OUTPUTS} waveplan plans in one file: split it into several wave files.`));
  }
  let usedBytes = 0;
  const steps = stepsPerOutput(Math.min(names.length, MAX_OUTPUTS));
  const planning = names.slice(0, MAX_OUTPUTS);
  // Outputs with an error of their own are not planned (one pass over the findings, not one per output).
  const blocked = new Set(diagnostics.filter((d) => d.severity === 'error' && d.code !== 'duplicate-output').map((d) => d.output));
  for (const [index, name] of planning.entries()) {
    const entry = (data.outputs as Record<string, unknown> | undefined)?.[name];
    if (blocked.has(name) || !outputSchema.safeParse(entry).success) continue;
    const samples = resolveSamples(analysis, (entry as OutputEntry)['sample-file'], host);
    const planned = planEntry(name, entry as OutputEntry, quantities, hardware, doc, src.lines, steps, samples);
    diagnostics.push(...planned.diagnostics);
    if (planned.output) analysis.outputs.push(planned.output);
    usedBytes += planned.tableBytes;
    yield { planned: index + 1, total: planning.length };
  }
  const grouped = applyGroups(analysis, data.groups, hardware, doc, src.lines);
  overBudget(analysis, grouped ?? usedBytes, hardware, outputsKey);
}

function overBudget(analysis: Analysis, usedBytes: number, hardware: Hardware, outputsKey: Range): void {
  fitToBudget(analysis, hardware, outputsKey, usedBytes);
}

/**
 * Why a wave spec's outputs were not planned at all, when its clock file is the reason: words
 * for summaries ("the clock file ./x.clock.yaml has errors"), so no summary reads "0 outputs"
 * as if the spec were empty.
 */
export function clockProblem(analysis: Analysis): string | null {
  const d = analysis.diagnostics.find((x) => x.code === 'clock-invalid' || x.code === 'clock-unreadable');
  if (!d || analysis.hardware) return null;
  const name = analysis.clockPath ? nodePath.basename(analysis.clockPath) : 'named by clock:';
  return d.code === 'clock-invalid' ? `the clock file ${name} has errors` : `the clock file ${name} cannot be read`;
}

// A clock file's text gives one Hardware object while it stays in this memo, so the outputs
// planned on it (output-cache.ts) are found again by that object.
const clocks = new Memo<string, ReturnType<typeof readClock>>(32);

/** Reads the clock file `clock:` names, relative to the wave file; problems land on the `clock:` value at `range`. */
function resolveClock(analysis: Analysis, clock: unknown, range: Range, host: SpecHost): Hardware | null {
  if (typeof clock !== 'string' || clock.length === 0) return null;
  const clockPath = nodePath.resolve(nodePath.dirname(analysis.path), clock);
  analysis.clockPath = clockPath;
  const got = readReferenced(host, clockPath);
  if (!('text' in got)) {
    const reason = got.why ?? `no such file (looked for ${clockPath}); check the path, which is relative to this file`;
    analysis.diagnostics.push(diagnostic('clock-unreadable', range, `Cannot read the clock file ${clock}: ${reason}.`));
    return null;
  }
  const read = clocks.get(got.text, readClock);
  const errors = read.diagnostics.filter((d) => d.severity === 'error');
  if (errors.length > 0 || !read.hardware) {
    // The first error in file order: the one a reader meets first when opening the clock file.
    const first = [...errors].sort((a, b) => a.range.start.line - b.range.start.line || a.range.start.character - b.range.start.character)[0];
    const where = first ? ` (line ${first.range.start.line + 1}: ${first.message.replace(/\.$/, '')})` : '';
    const count = errors.length === 1 ? '1 error' : `${errors.length} errors`;
    analysis.diagnostics.push(diagnostic('clock-invalid', range, `The clock file ${clock} has ${count}${where} — fix it there first.`));
    return null;
  }
  return read.hardware;
}

/** Reads the sample file an output's `sample-file:` names (relative to the wave file) and records its path. */
function resolveSamples(analysis: Analysis, written: unknown, host: SpecHost): SampleSource | undefined {
  if (typeof written !== 'string' || written.length === 0) return undefined;
  const source = resolveSampleFile(analysis.path, written, host);
  const files = (analysis.sampleFiles ??= []);
  if (!files.some((f) => f.path === source.path)) files.push({ path: source.path, sha256: source.sha256 });
  return source;
}
