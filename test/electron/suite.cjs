// Runs inside a desktop VS Code started by ./run.mjs (the extension tests entry: run() resolves or
// rejects). No test framework: a handful of checks in order, each waiting on an editor event or
// polling the API, never on a fixed sleep. The expectations mirror test/e2e/scenario.mjs.

const assert = require('node:assert/strict');
const path = require('node:path');
const fs = require('node:fs');
const { pathToFileURL } = require('node:url');
const vscode = require('vscode');

const WAVE = 'bench-rig.wave.yaml';

/** Polls `probe` (on diagnostics changes and every 200 ms) until it returns a truthy value. */
function until(probe, what, timeoutMs = 30000) {
  return new Promise((resolve, reject) => {
    let done = false;
    const finish = (fn, value) => {
      if (done) return;
      done = true;
      clearInterval(timer);
      clearTimeout(limit);
      listener.dispose();
      fn(value);
    };
    const attempt = async () => {
      try {
        const value = await probe();
        if (value) finish(resolve, value);
      } catch {
        // not there yet
      }
    };
    const listener = vscode.languages.onDidChangeDiagnostics(attempt);
    const timer = setInterval(attempt, 200);
    const limit = setTimeout(() => finish(reject, new Error(`timed out waiting for ${what}`)), timeoutMs);
    void attempt();
  });
}

async function run() {
  const folder = vscode.workspace.workspaceFolders?.[0];
  assert.ok(folder, 'the runner opens the demo copy as the workspace');
  const uri = vscode.Uri.file(path.join(folder.uri.fsPath, WAVE));
  const doc = await vscode.workspace.openTextDocument(uri);
  await vscode.window.showTextDocument(doc);
  assert.equal(doc.languageId, 'waveplan-wave', '*.wave.yaml opens as waveplan-wave');

  // examples/bench-rig.wave.yaml header: counter-check is an error; chopper-ref and legacy-sweep warn.
  const diagnostics = await until(() => {
    const ours = vscode.languages.getDiagnostics(uri).filter((d) => d.source === 'waveplan');
    return ours.some((d) => d.severity === vscode.DiagnosticSeverity.Error) ? ours : null;
  }, 'waveplan diagnostics');
  assert.ok(diagnostics.filter((d) => d.severity === vscode.DiagnosticSeverity.Warning).length >= 2, 'two warnings or more');

  const commands = await vscode.commands.getCommands(true);
  for (const id of ['waveplan.recheckWorkspace', 'waveplan.showPlanReport']) assert.ok(commands.includes(id), `${id} is registered`);
  // The re-check answers with what it checked: every spec file of the demo copy.
  const specs = fs.readdirSync(folder.uri.fsPath).filter((f) => f.endsWith('.wave.yaml') || f.endsWith('.clock.yaml')).length;
  const summary = await vscode.commands.executeCommand('waveplan.recheckWorkspace');
  assert.equal(summary?.files, specs, `re-check covers all ${specs} demo files: ${JSON.stringify(summary)}`);

  // The demo's pinned plan must show f_out = f_sys · M / (D · N), computed with fraction.js
  // (docs/DESIGN.md "Quantities"; derived) by the same helper the browser suite uses.
  const { pinnedOutput, shownHertz } = await import(pathToFileURL(path.join(__dirname, '../e2e/demo.mjs')).href);
  const pinned = pinnedOutput(folder.uri.fsPath, WAVE);
  const lines = doc.getText().split('\n');
  const pinnedLine = lines.findIndex((l) => l.trim().startsWith(`${pinned.name}:`));
  const hints = await until(async () => {
    const all = await vscode.commands.executeCommand('vscode.executeInlayHintProvider', uri, new vscode.Range(0, 0, doc.lineCount, 0));
    return all && all.length > 0 ? all : null;
  }, 'inlay hints');
  const hint = hints.find((h) => h.position.line === pinnedLine);
  const label = typeof hint?.label === 'string' ? hint.label : (hint?.label ?? []).map((p) => p.value).join('');
  const shown = shownHertz(label);
  const want = pinned.achievedHz.valueOf();
  assert.ok(shown && Math.abs(shown.hz - want) <= want * 5e-6, `${pinned.name} annotation "${label}" vs ${pinned.achievedHz.toFraction()} Hz`);
  assert.ok(label.includes(`÷${pinned.divider}`), `${pinned.name} annotation shows ÷${pinned.divider}: ${label}`);

  const firstName = lines.find((l) => /^ {2}[a-z][\w-]*:\s*$/.test(l)).trim().slice(0, -1);
  const firstLine = lines.findIndex((l) => l.trim() === `${firstName}:`);
  const hovers = await vscode.commands.executeCommand('vscode.executeHoverProvider', uri, new vscode.Position(firstLine, 4));
  const markdown = hovers.flatMap((h) => h.contents).map((c) => (typeof c === 'string' ? c : c.value)).join('\n');
  assert.match(markdown, /!\[[^\]]*\]\(data:image\/svg\+xml;base64,/, 'the hover carries a picture as a data: URI');

  const target = vscode.languages.getDiagnostics(uri).find((d) => d.source === 'waveplan' && codeOf(d) === 'out-of-tolerance');
  assert.ok(target, 'the demo has an output out of tolerance');
  const actions = await vscode.commands.executeCommand('vscode.executeCodeActionProvider', uri, target.range, vscode.CodeActionKind.QuickFix.value);
  const fix = actions.find((a) => a.edit);
  assert.ok(fix, 'a quick fix with an edit is offered for out-of-tolerance');
  assert.ok(await vscode.workspace.applyEdit(fix.edit), 'the quick fix applies');
  await doc.save();
  await until(() => !vscode.languages.getDiagnostics(uri).some((d) => codeOf(d) === 'out-of-tolerance' && d.range.start.line === target.range.start.line), 'the out-of-tolerance finding to go');
}

function codeOf(d) {
  return typeof d.code === 'object' ? String(d.code.value) : String(d.code);
}

module.exports = { run };
