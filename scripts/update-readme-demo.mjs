// Rewrites the README's demo block from the checker's own output: the header row and the rows of
// the outputs the block already shows (from test/cli/golden/examples.txt — regenerate that first,
// `UPDATE_GOLDEN=1 npx vitest run test/cli`), the first error finding, and the demo's last line
// (a run of scripts/demo.mjs on the built bundle). test/docs/readme.test.ts fails when they differ.
import { spawnSync } from 'node:child_process';
import { readFileSync, writeFileSync } from 'node:fs';
import { dirname, join } from 'node:path';
import { fileURLToPath } from 'node:url';

const ROOT = join(dirname(fileURLToPath(import.meta.url)), '..');
const readmePath = join(ROOT, 'README.md');
const readme = readFileSync(readmePath, 'utf8');
const golden = readFileSync(join(ROOT, 'test/cli/golden/examples.txt'), 'utf8').split('\n');

const block = /```\n( {2}output .*\n[\s\S]*?)```/.exec(readme);
if (!block) throw new Error('README.md: no demo block (a fenced block starting with the "  output" header row)');
const shownNames = block[1].split('\n').map((l) => /^ {2}([A-Za-z_][\w-]*)\s/.exec(l)?.[1]).filter((n) => n && n !== 'output');
const rows = golden.filter((l) => l.startsWith('  '));
const row = (name) => rows.find((l) => l.trimStart().startsWith(`${name} `)) ?? `  ${name} (not in the demo any more)`;
const firstError = golden.find((l) => / error /.test(l) && /^[\w./-]+:\d+:\d+: /.test(l));
const demo = spawnSync(process.execPath, [join(ROOT, 'scripts/demo.mjs')], { cwd: ROOT, encoding: 'utf8' });
const lastLine = demo.stdout.trimEnd().split('\n').pop();

// The block keeps its shape: the rows it showed, "…" where it elided some.
const lines = [rows[0]];
let previous = -1;
for (const name of shownNames) {
  const at = rows.findIndex((l) => l.trimStart().startsWith(`${name} `));
  if (previous >= 0 && at > previous + 1) lines.push('  …');
  lines.push(row(name));
  previous = at;
}
lines.push(firstError, lastLine);
writeFileSync(readmePath, readme.replace(block[0], '```\n' + lines.join('\n') + '\n```'));
console.log(`README.md: demo block rewritten (${shownNames.length} rows)`);
