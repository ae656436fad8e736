// Desktop runner for machines that have (or can download) a desktop VS Code: @vscode/test-electron
// starts it with this repository as the extension under development and runs ./suite.cjs inside it.
// It cannot run on the project's build machine: its network reaches only the npm registry and
// Debian's mirrors, and the download of a desktop VS Code fails there (ENOTFOUND on the update
// server). That is why CI runs test/e2e/ (a browser-hosted VS Code from the npm registry) instead;
// this runner is for developers, via `npm run test:electron`, and is not part of CI.
// Set WAVEPLAN_VSCODE=/path/to/code to use an installed VS Code instead of a download.

import fs from 'node:fs';
import os from 'node:os';
import path from 'node:path';
import { runTests } from '@vscode/test-electron';

const root = path.resolve(path.dirname(new URL(import.meta.url).pathname), '../..');
// A copy, so the quick-fix check may edit the file without touching the demo.
const workspace = fs.mkdtempSync(path.join(os.tmpdir(), 'waveplan-electron-'));
fs.cpSync(path.join(root, 'examples'), workspace, { recursive: true });

try {
  await runTests({
    extensionDevelopmentPath: root,
    extensionTestsPath: path.join(root, 'test/electron/suite.cjs'),
    vscodeExecutablePath: process.env.WAVEPLAN_VSCODE || undefined,
    // Downloads land in the git-ignored tools folder, beside the browser-hosted editor.
    cachePath: path.join(root, '.e2e-tools/vscode-test'),
    launchArgs: [workspace, '--disable-extensions', '--disable-workspace-trust', '--skip-welcome', '--skip-release-notes'],
  });
  console.log('electron suite passed');
} catch (error) {
  const reason = error instanceof Error ? error.message : String(error);
  console.error(`electron suite failed: ${reason}`);
  if (/ENOTFOUND|ECONNREFUSED|ETIMEDOUT/.test(reason)) {
    console.error('no desktop VS Code could be downloaded here; set WAVEPLAN_VSCODE to an installed one, or run npm run test:e2e');
  }
  process.exitCode = 1;
} finally {
  fs.rmSync(workspace, { recursive: true, force: true });
}
