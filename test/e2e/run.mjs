// End-to-end suite in a real (browser-hosted) VS Code: packages the extension, installs the .vsix
// into a fresh editor, opens a copy of examples/ and checks through the page what a user sees.
// Run: `npm run test:e2e` (setup + this file). Exits non-zero when any check fails and ends with a
// plain "N passed, M failed" line. Environment: WAVEPLAN_E2E_HEADED=1 shows the browser,
// WAVEPLAN_E2E_KEEP=1 keeps the temp dir, WAVEPLAN_E2E_VSIX=path skips packaging.

import { execFileSync } from 'node:child_process';
import fs from 'node:fs';
import { createRequire } from 'node:module';
import path from 'node:path';
import { Checks } from './checks.mjs';
import { ROOT, TOOLS, extensionHostLogs, prepare, start } from './editor.mjs';
import { checkPackage } from './package-contents.mjs';
import { editorChecks } from './scenario.mjs';
import { typingChecks } from './typing.mjs';

const SHOTS = path.join(ROOT, 'test-results/e2e');
const started = Date.now();
const checks = new Checks();

/** playwright-core from the project, or from the tools folder when the project lacks it. */
function loadPlaywright() {
  for (const base of [ROOT, TOOLS]) {
    try {
      return createRequire(path.join(base, 'package.json'))('playwright-core');
    } catch {
      // try the next place
    }
  }
  throw new Error('playwright-core is not installed (npm ci, or scripts/e2e-setup.sh)');
}

function packageExtension() {
  if (process.env.WAVEPLAN_E2E_VSIX) return path.resolve(process.env.WAVEPLAN_E2E_VSIX);
  execFileSync('npm', ['run', '--silent', 'package'], { cwd: ROOT, stdio: ['ignore', 'pipe', 'inherit'] });
  return path.join(ROOT, 'waveplan.vsix');
}

let state;
let editor;
let browser;
try {
  fs.mkdirSync(SHOTS, { recursive: true });
  let vsix;
  await checks.run('package: npm run package writes waveplan.vsix', async () => {
    vsix = packageExtension();
    return `${(fs.statSync(vsix).size / 1024).toFixed(0)} KiB`;
  });
  await checks.run('package: the .vsix holds only what .vscodeignore lets back in', () => checkPackage(vsix), {
    needs: ['package: npm run package writes waveplan.vsix'],
  });
  await checks.run('editor: install the .vsix into a fresh editor and start it', async () => {
    state = prepare({ vsix, workspaceFrom: path.join(ROOT, 'examples') });
    editor = await start(state);
    return editor.url.replace(/\?.*/, '');
  }, { needs: ['package: npm run package writes waveplan.vsix'] });

  const ready = checks.results.at(-1).ok;
  const { chromium } = loadPlaywright();
  browser = await chromium.launch({
    executablePath: process.env.WAVEPLAN_E2E_CHROMIUM ?? '/usr/bin/chromium',
    headless: process.env.WAVEPLAN_E2E_HEADED !== '1',
    args: ['--no-sandbox', '--disable-gpu', '--disable-background-networking', '--disable-component-update', '--disable-sync', '--no-first-run'],
  });
  const page = await browser.newPage({ viewport: { width: 1500, height: 950 } });
  page.setDefaultTimeout(20_000);
  checks.onFail = (_name, index) => page.screenshot({ path: path.join(SHOTS, `failed-${String(index).padStart(2, '0')}.png`) });
  await editorChecks({ checks, page, url: ready ? editor.url : undefined, shots: SHOTS, state });
  await typingChecks({ checks, page, state });
} catch (error) {
  await checks.run('harness', () => {
    throw error;
  });
} finally {
  await browser?.close().catch(() => undefined);
  editor?.stop();
  if (checks.failed > 0 && state) {
    for (const log of extensionHostLogs(state)) console.log(`log: ${log}`);
  }
  if (state && process.env.WAVEPLAN_E2E_KEEP !== '1' && checks.failed === 0) {
    fs.rmSync(state.dir, { recursive: true, force: true });
  } else if (state) {
    console.log(`kept: ${state.dir}`);
  }
}

console.log(`e2e took ${((Date.now() - started) / 1000).toFixed(1)} s`);
console.log(`${checks.passed} passed, ${checks.failed} failed`);
process.exit(checks.failed === 0 ? 0 : 1);
