// `npm run demo`: checks examples/ as text, exactly as `waveplan check examples` does, then says
// what the run showed. The demo contains findings on purpose; the header comment of each wave spec
// in examples/ lists its own (`#   <output> → error|warning: why`, one line per finding). The demo succeeds
// (exit 0) when the checker finds exactly those, and fails when it finds anything else or misses
// one — so "FAILED" from the checker is the intended result here, and the last line says so.
import { spawnSync } from 'node:child_process';
import { readdirSync, readFileSync } from 'node:fs';
import { dirname, join } from 'node:path';
import { fileURLToPath } from 'node:url';

const ROOT = join(dirname(fileURLToPath(import.meta.url)), '..');
const BIN = join(ROOT, 'bin', 'waveplan.js');
const EXAMPLES = join(ROOT, 'examples');

const check = (...args) => spawnSync(process.execPath, [BIN, 'check', 'examples', ...args], { cwd: ROOT, encoding: 'utf8' });

const text = check('--format', 'text');
process.stdout.write(text.stdout);
process.stderr.write(text.stderr);
const json = check('--format', 'json');
if (text.status === 2 || json.status === 2 || json.stdout === '') {
  console.log(`demo: the checker could not run (exit ${text.status}); see the message above.`);
  process.exit(1);
}

/** The findings the demo's wave specs promise, from their header comments. */
const intended = readdirSync(EXAMPLES)
  .filter((name) => name.endsWith('.wave.yaml'))
  .flatMap((name) => [...readFileSync(join(EXAMPLES, name), 'utf8').matchAll(/^#\s+([A-Za-z_][\w-]*)\s+→\s+(error|warning):/gm)])
  .map((m) => `${m[2]} ${m[1]}`);
const report = JSON.parse(json.stdout);
const found = report.files
  .flatMap((f) => f.diagnostics)
  .filter((d) => d.severity === 'error' || d.severity === 'warning')
  .map((d) => ({ key: `${d.severity} ${d.output ?? '(file)'}`, code: d.code }));

const foundKeys = found.map((f) => f.key).sort();
const same = JSON.stringify(foundKeys) === JSON.stringify([...intended].sort());
const list = (severity) =>
  found
    .filter((f) => f.key.startsWith(severity))
    .map((f) => `${f.key.slice(severity.length + 1)} (${f.code})`)
    .join(', ');
const errors = found.filter((f) => f.key.startsWith('error')).length;
const warnings = found.length - errors;
const flagged = new Set(found.map((f) => f.key.split(' ')[1]));
const others = report.files.flatMap((f) => f.outputs).filter((o) => !flagged.has(o.name));
const othersMeet = others.filter((o) => o.withinTolerance).length;

if (same) {
  console.log(
    `demo: as intended — the demo's deliberate findings: ${errors} ${errors === 1 ? 'error' : 'errors'} [${list('error')}] and ${warnings} ` +
      `${warnings === 1 ? 'warning' : 'warnings'} [${list('warning')}]; ${othersMeet} of the other ${others.length} outputs meet their targets. ` +
      'See examples/README.md.',
  );
  process.exit(0);
}
console.log(`demo: NOT as intended — expected ${intended.join(', ') || 'no findings'}; found ${foundKeys.join(', ') || 'none'}.`);
process.exit(1);
