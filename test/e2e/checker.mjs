// The headless checker's findings for the workspace copy. It runs the very bundle the editor runs
// (the installed extension's dist/waveplan.js), so editor and checker must agree to the diagnostic.

import { spawnSync } from 'node:child_process';
import fs from 'node:fs';
import path from 'node:path';

function installedBundle(extensionsDir) {
  const dir = fs.readdirSync(extensionsDir).find((d) => d.startsWith('waveplan.waveplan-'));
  if (!dir) throw new Error(`the waveplan extension is not installed in ${extensionsDir}`);
  return path.join(extensionsDir, dir, 'dist/waveplan.js');
}

/** The checker's JSON report over every spec of the workspace, plus the counts the editor shows. */
export function checkerReport(state) {
  const run = spawnSync(process.execPath, [installedBundle(state.extensions), 'check', state.workspace, '--format', 'json'], {
    encoding: 'utf8',
  });
  // Exit 1 means "findings with errors", which the demo has on purpose; 2 is misuse.
  if (run.status !== 0 && run.status !== 1) throw new Error(`waveplan check failed (${run.status}): ${run.stderr.trim()}`);
  const report = JSON.parse(run.stdout);
  const diagnostics = report.files.flatMap((f) => f.diagnostics.map((d) => ({ ...d, file: path.basename(f.path) })));
  return {
    diagnostics,
    outputs: report.files.flatMap((f) => f.outputs),
    errors: diagnostics.filter((d) => d.severity === 'error').length,
    warnings: diagnostics.filter((d) => d.severity === 'warning').length,
    outOfTolerance: diagnostics.filter((d) => d.code === 'out-of-tolerance').length,
  };
}
