// `npm run package`: writes waveplan.vsix. The npm package and the VS Code extension ship different
// files — package.json's `files` allow-list is the npm package (the CLI and server), .vscodeignore
// the extension's — and vsce refuses a folder that has both. So the extension is staged in a temp
// folder holding the manifest without `files`, .vscodeignore and exactly the paths .vscodeignore
// lets back in, and vsce packages it from there. Run after `npm run build`.
import { execFileSync } from 'node:child_process';
import { cpSync, existsSync, mkdtempSync, readFileSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { dirname, join } from 'node:path';
import { fileURLToPath } from 'node:url';

const ROOT = join(dirname(fileURLToPath(import.meta.url)), '..');
const OUT = join(ROOT, 'waveplan.vsix');
const stage = mkdtempSync(join(tmpdir(), 'waveplan-vsix-'));
try {
  const manifest = JSON.parse(readFileSync(join(ROOT, 'package.json'), 'utf8'));
  delete manifest.files;
  writeFileSync(join(stage, 'package.json'), `${JSON.stringify(manifest, null, 2)}\n`);
  const ignore = readFileSync(join(ROOT, '.vscodeignore'), 'utf8');
  cpSync(join(ROOT, '.vscodeignore'), join(stage, '.vscodeignore'));
  // The allow-list: every `!path` or `!folder/**` line.
  for (const line of ignore.split('\n').map((l) => l.trim()).filter((l) => l.startsWith('!'))) {
    const rel = line.slice(1).replace(/\/\*\*$/, '');
    if (rel === 'package.json') continue;
    if (!existsSync(join(ROOT, rel))) throw new Error(`.vscodeignore lets back in ${rel}, which does not exist (run npm run build first)`);
    cpSync(join(ROOT, rel), join(stage, rel), { recursive: true });
  }
  const vsce = join(ROOT, 'node_modules', '@vscode', 'vsce', 'vsce');
  execFileSync(
    process.execPath,
    [vsce, 'package', '--no-dependencies', '--allow-missing-repository', '--no-rewrite-relative-links', '--out', OUT],
    { cwd: stage, stdio: ['ignore', 'inherit', 'inherit'] },
  );
} finally {
  rmSync(stage, { recursive: true, force: true });
}
