// The one entry every face uses (LSP features, the checker, exporters): a spec's text → plain
// Analysis with diagnostics, hardware and a plan per output. Never throws; never writes files.

import * as nodePath from 'node:path';
import type { ClockFile } from '../../../shared-schema/src/clock-schema';
import { DEFAULT_TOLERANCE } from '../../../shared-schema/src/defaults';
import type { FileKind } from '../../../shared-schema/src/keys';
import { outputSchema, type OutputEntry, type WaveFile } from '../../../shared-schema/src/wave-schema';
import { formatBytes } from '../../../shared-schema/src/quantity-format';
import { planOutput } from '../planning/choose';
import type { Hardware } from '../planning/types';
import { buildHardware } from './clock-model';
import { keyRange, valueRange } from './nodes';
import { planningDiagnostics } from './planning-diagnostics';
import { readQuantities } from './quantities';
import { validate } from './schema-issues';
import { type Source, diagnostic, readSource } from './source';
import type { Analysis, OutputAnalysis, SpecDiagnostic, SpecHost } from './types';
import { buildOutput, outputNames } from './wave-model';

/** More outputs than this in one file are not planned (each plan is a search). */
export const MAX_OUTPUTS = 500;

export const kindOf = (path: string): FileKind => (/\.clock\.ya?ml$/i.test(path) ? 'clock' : 'wave');

export function analyze(path: string, text: string, host: SpecHost): Analysis {
  const analysis: Analysis = { path, kind: kindOf(path), text, diagnostics: [], outputs: [], hardware: null, clockPath: null, memory: null };
  try {
    if (analysis.kind === 'clock') {
      const clock = readClock(text);
      analysis.diagnostics = clock.diagnostics;
      analysis.hardware = clock.hardware;
    } else {
      analyzeWave(analysis, host);
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

function read(kind: FileKind, text: string): Read & { quantities?: ReturnType<typeof readQuantities>['quantities'] } {
  const src = readSource(text, (p) => kind === 'wave' && p.length === 1 && p[0] === 'outputs');
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

function analyzeWave(analysis: Analysis, host: SpecHost): void {
  const { src, diagnostics, quantities } = read('wave', analysis.text);
  analysis.diagnostics = diagnostics;
  const doc = src.doc;
  if (!doc || !quantities) return;
  const data = (src.data ?? {}) as Partial<WaveFile>;

  const hardware = resolveClock(analysis, data, src, host);
  if (!hardware) return;
  analysis.hardware = hardware;

  const names = outputNames(doc);
  if (names.length > MAX_OUTPUTS) {
    const r = keyRange(doc, src.lines, ['outputs']) ?? src.lines.firstLine();
    diagnostics.push(diagnostic('too-many-outputs', r, `This file lists ${names.length} outputs, more than the ${MAX_OUTPUTS} waveplan plans in one file: split it into several wave files.`));
  }
  let usedBytes = 0;
  for (const name of names.slice(0, MAX_OUTPUTS)) {
    const entry = (data.outputs as Record<string, unknown> | undefined)?.[name];
    const blocked = diagnostics.some((d) => d.output === name && d.severity === 'error' && d.code !== 'duplicate-output');
    if (blocked || !outputSchema.safeParse(entry).success) continue;
    const built = buildOutput(name, entry as OutputEntry, quantities, hardware, doc, src.lines);
    diagnostics.push(...built.diagnostics);
    const draft = built.draft;
    if (!draft) continue;
    try {
      const planning = planOutput(hardware, draft.request);
      const toleranceText = quantities.get(['outputs', name, 'tolerance'])?.text ?? DEFAULT_TOLERANCE;
      diagnostics.push(...planningDiagnostics(draft, planning, hardware, toleranceText));
      const out: OutputAnalysis = { ...draft, planning };
      analysis.outputs.push(out);
      usedBytes += planning.plan?.tableBytes ?? 0;
    } catch (e) {
      diagnostics.push(diagnostic('internal-error', draft.nameRange, `Planning this output failed (${String((e as Error)?.message ?? e).slice(0, 120)}): please report the input.`, name));
    }
  }
  const budgetBytes = hardware.memory.budgetBytes;
  analysis.memory = { usedBytes, budgetBytes };
  if (usedBytes > budgetBytes) {
    const r = keyRange(doc, src.lines, ['outputs']) ?? src.lines.firstLine();
    diagnostics.push(diagnostic('over-budget', r, `All tables together take ${formatBytes(usedBytes)}, more than the ${formatBytes(budgetBytes)} memory budget: shorten tables, drop an output, or raise the budget.`));
  }
}

/** Reads the clock file `clock:` names, relative to the wave file; problems land on the `clock:` value. */
function resolveClock(analysis: Analysis, data: Partial<WaveFile>, src: Source, host: SpecHost): Hardware | null {
  if (typeof data.clock !== 'string' || data.clock.length === 0 || !src.doc) return null;
  const clockPath = nodePath.resolve(nodePath.dirname(analysis.path), data.clock);
  analysis.clockPath = clockPath;
  const range = valueRange(src.doc, src.lines, ['clock']) ?? src.lines.firstLine();
  let text: string | undefined;
  try {
    text = host.readFile(clockPath);
  } catch {
    text = undefined;
  }
  if (text === undefined) {
    analysis.diagnostics.push(diagnostic('clock-unreadable', range, `Cannot read the clock file ${data.clock} (looked for ${clockPath}): check the path, which is relative to this file.`));
    return null;
  }
  const clock = readClock(text);
  const errors = clock.diagnostics.filter((d) => d.severity === 'error');
  if (errors.length > 0 || !clock.hardware) {
    const first = errors[0];
    const where = first ? ` (line ${first.range.start.line + 1}: ${first.message.replace(/\.$/, '')})` : '';
    const count = errors.length === 1 ? '1 error' : `${errors.length} errors`;
    analysis.diagnostics.push(diagnostic('clock-invalid', range, `The clock file ${data.clock} has ${count}${where} — fix it there first.`));
    return null;
  }
  return clock.hardware;
}
