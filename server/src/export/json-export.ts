// `--json`: the exported plans machine-readable — the checker's plan fields (cli/format-json) plus
// what the firmware files hold: the C names, the sample type, the ring alignment and the table.

import { toNumber } from '../../../shared-schema/src/rational';
import { exactText, planJson, stepsJson } from '../cli/format-json';
import { sampleType } from './c-export';
import type { OutputIdentifiers } from './identifiers';
import type { LoadedSpec } from './load';
import { ringAlignment, type ExportModel } from './model';
import type { Waveform } from '../planning/types';

export interface ExportedSpec {
  spec: LoadedSpec;
  model: ExportModel;
  ids: Map<string, OutputIdentifiers> | null;
  forced: boolean;
}

export function exportJson(specs: readonly ExportedSpec[]): string {
  // Tables go in as placeholders and come back as one-line arrays: indented JSON would put every
  // sample on its own line.
  const tables: string[] = [];
  const placeholder = (codes: Int32Array): string => `\u0000table${tables.push(`[${codes.join(',')}]`) - 1}`;
  const doc = {
    generator: 'waveplan export',
    specs: specs.map(({ spec, model, ids, forced }) => ({
      path: spec.path,
      clock: spec.clockPath,
      sha256: spec.contentHash,
      checked: !forced,
      errors: spec.errors.length,
      sampleType: sampleType(model.hardware.dac.sampleBytes),
      dacBits: model.hardware.dac.bits,
      fullScaleV: model.hardware.dac.fullScaleV,
      ring: model.hardware.memory.powerOfTwo,
      outputs: model.outputs.map((o) => ({
        name: o.analysis.name,
        identifier: ids?.get(o.analysis.name)?.lower ?? null,
        shape: o.analysis.request.waveform.shape,
        waveform: waveformJson(o.analysis.request.waveform),
        targetHz: toNumber(o.analysis.targetHz),
        targetHzExact: exactText(o.analysis.targetHz),
        toleranceHz: toNumber(o.analysis.request.toleranceHz),
        toleranceHzExact: exactText(o.analysis.request.toleranceHz),
        verdict: o.analysis.planning.verdict,
        tableSpan: o.span,
        plan: planJson(o.plan),
        ...(o.analysis.planning.steps ? { steps: stepsJson(o.analysis) } : {}),
        alignBytes: model.hardware.memory.powerOfTwo ? ringAlignment(o.plan.tableBytes) : null,
        clippedSamples: o.clipped,
        clippedByLsb: o.clipLsb,
        ...(o.phase ? { phase: o.phase } : {}),
        table: placeholder(o.codes),
      })),
      unplanned: model.unplanned,
    })),
  };
  const text = JSON.stringify(doc, null, 2).replace(/"\\u0000table(\d+)"/g, (_, i: string) => tables[Number(i)]);
  return `${text}\n`;
}

/** The waveform as JSON numbers (the exact duty stays in the engine; `plan.dutyAchieved` has the table's). */
function waveformJson(w: Waveform): Pick<Waveform, 'shape' | 'duty' | 'amplitudeVpp' | 'offsetV'> {
  return { shape: w.shape, duty: w.duty, amplitudeVpp: w.amplitudeVpp, offsetV: w.offsetV };
}
