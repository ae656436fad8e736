// The README says what happens: its two commands are the package's scripts and the CI entry runs
// the same test command; its demo block is the checker's own output (the golden text) and the
// demo's real last line (scripts/update-readme-demo.mjs rewrites it), and the demo exits 0 on its
// deliberate findings.

import { spawnSync } from 'node:child_process';
import * as path from 'node:path';
import { beforeAll, describe, expect, it } from 'vitest';
import { buildChecker } from '../support/cli';
import { ROOT, read } from './sources';

const readme = read('README.md');
const pkg = JSON.parse(read('package.json'));
const blocks = [...readme.matchAll(/```[a-z]*\n([\s\S]*?)```/g)].map((m) => m[1]!);

describe("the README's two commands", () => {
  const first = blocks[0]!.trim().split('\n').map((l) => l.replace(/\s+#.*$/, '').trim());
  it('are `npm ci && npm run demo` and `npm test`, both scripts of the package', () => {
    expect(first).toEqual(['npm ci && npm run demo', 'npm test']);
    expect(pkg.scripts.demo).toBeDefined();
    expect(pkg.scripts.test).toBeDefined();
  });
  it('the test command runs every tier: the setup of the system, the vitest tiers, the end-to-end suite', () => {
    expect(pkg.scripts.test).toContain('scripts/test-setup.sh');
    expect(pkg.scripts.test).toContain('npm run test:unit');
    expect(pkg.scripts.test).toContain('npm run test:e2e');
    expect(pkg.scripts['test:unit']).toContain('vitest run');
  });
  it('.ci/run installs with npm ci and runs that same npm test', () => {
    const commands = read('.ci/run').split('\n').filter((l) => /^\s*npm /.test(l)).map((l) => l.trim());
    expect(commands.map((c) => c.split(' ').slice(0, 2).join(' '))).toEqual(['npm ci', 'npm test']);
  });
});

describe("the README's demo block", () => {
  const block = blocks.find((b) => b.includes('coil-excitation'))!.trimEnd().split('\n');
  let demo: { status: number | null; stdout: string };
  beforeAll(async () => {
    await buildChecker();
    const run = spawnSync(process.execPath, [path.join(ROOT, 'scripts/demo.mjs')], { cwd: ROOT, encoding: 'utf8', timeout: 60_000 });
    demo = { status: run.status, stdout: run.stdout };
  });

  it('shows rows and findings the checker prints for the demo (test/cli/golden/examples.txt)', () => {
    const goldenLines = read('test/cli/golden/examples.txt').split('\n');
    const shown = block.slice(0, -1).filter((l) => l.trim() !== '…');
    expect(shown.length).toBeGreaterThanOrEqual(4);
    expect(shown.filter((l) => !goldenLines.includes(l)), 'run node scripts/update-readme-demo.mjs').toEqual([]);
  });

  it("ends with the demo's own last line, which names the deliberate findings, and the demo exits 0", () => {
    const lines = demo.stdout.trimEnd().split('\n');
    expect(demo.status).toBe(0);
    expect(lines[lines.length - 1], 'run node scripts/update-readme-demo.mjs').toBe(block[block.length - 1]);
    expect(lines[lines.length - 1]).toMatch(/^demo: as intended — .*1 error.*3 warnings/);
    // The checker's own report comes first, unchanged.
    expect(demo.stdout).toContain(read('test/cli/golden/examples.txt'));
  });
});
