// `waveplan export`: analyse the wave specs, refuse to write anything while any has errors (unless
// --force), then write per spec <prefix>.h and <prefix>.c (--c) and/or one JSON file (--json).
// Exit 0 written, 1 the specs have errors (also after a forced export), 2 misuse or I/O failure.

import * as path from 'node:path';
import { CliInputError, nodeFileSystem, writeOutputs } from '../cli/disk';
import type { WriteTarget } from '../spec/containment';
import type { SpecDiagnostic } from '../spec/types';
import { EXPORT_USAGE, parseExportArgs } from './args';
import { cFiles } from './c-export';
import { specPrefix } from './identifiers';
import { exportJson, type ExportedSpec } from './json-export';
import { diagnosticLine, loadSpecs, type LoadedSpec } from './load';
import { exportModel } from './model';
import { exportProblems } from './refusal';
import { folderClashes, type GeneratedHeader } from './symbols';
import { relativeTo } from '../cli/check';
import { guarded, processIo, type CommandIo } from './io';

export async function runExport(argv: string[], io: CommandIo = processIo()): Promise<number> {
  return guarded('export', EXPORT_USAGE, io, () => {
    const options = parseExportArgs(argv);
    if (options.help) {
      io.stdout(EXPORT_USAGE);
      return 0;
    }
    const { specs, inputs } = loadSpecs(options.specs, io.cwd, options.root);
    const prepared: ExportedSpec[] = [];
    let errors = 0;
    let blocking = 0;
    for (const spec of specs) {
      const { ids, problems } = exportProblems(spec, options.cDir !== null);
      for (const d of spec.errors) io.stderr(`${diagnosticLine(spec, d)}\n`);
      for (const d of problems) io.stderr(`${diagnosticLine(spec, d)}\n`);
      errors += spec.errors.length + problems.length;
      // Export problems (identifiers, sample width) make files that cannot compile: --force does not override them.
      blocking += problems.length;
      const model = exportModel(spec);
      if (!model) {
        blocking++;
        io.stderr(`${spec.path}: no hardware could be read from its clock file; nothing to export\n`);
        continue;
      }
      for (const o of model.outputs)
        if (o.clipped > 0)
          io.stderr(
            `${spec.path}: ${o.clipLsb > 1 ? 'warning' : 'note'} ${o.analysis.name}: ${o.clipped} of ${o.plan.tableLength} samples clipped to the DAC range, by up to ${o.clipLsb} LSB\n`,
          );
      prepared.push({ spec, model, ids, forced: spec.errors.length > 0 });
    }
    if (blocking > 0 || (errors > 0 && !options.force)) {
      io.stderr(
        blocking > 0
          ? 'nothing exported: the findings above make the export impossible\n'
          : `nothing exported: ${errors} error${errors === 1 ? '' : 's'} (fix them, or pass --force to export unchecked plans)\n`,
      );
      return 1;
    }

    const writes: WriteTarget[] = [];
    if (options.cDir !== null) {
      const dir = path.resolve(io.cwd, options.cDir);
      const seen = new Map<string, string>();
      const headers: GeneratedHeader[] = [];
      for (const p of prepared) {
        const prefix = specPrefix(p.spec.file);
        const other = seen.get(prefix);
        if (other) throw new CliInputError(`${other} and ${p.spec.path} would both write ${prefix}.h; rename one of them`);
        seen.set(prefix, p.spec.path);
        for (const f of cFiles(p.spec, p.model, p.ids!, p.forced)) {
          writes.push({ file: path.join(dir, f.name), folder: dir, text: f.text });
          if (f.name.endsWith('.h')) headers.push({ name: f.name, spec: p.spec.path, text: f.text });
        }
      }
      const clashes = folderClashes(nodeFileSystem, dir, headers);
      if (clashes.length > 0) throw new CliInputError(`nothing exported: ${clashes.join('; ')}`);
    }
    if (options.json !== null) {
      const file = path.resolve(io.cwd, options.json);
      writes.push({ file, folder: path.dirname(file), text: exportJson(prepared) });
    }
    writeOutputs(writes, { inputs, force: options.force, anchor: io.cwd, show: relativeTo(io.cwd) });
    if (errors > 0) io.stderr(`!!! exported UNCHECKED plans with --force despite ${errors} error${errors === 1 ? '' : 's'}\n`);
    io.stdout(`exported ${prepared.reduce((n, p) => n + p.model.outputs.length, 0)} output(s) from ${prepared.length} spec(s): ${writes.map((w) => path.relative(io.cwd, w.file).split(path.sep).join('/')).join(', ')}\n`);
    return errors > 0 ? 1 : 0;
  });
}
