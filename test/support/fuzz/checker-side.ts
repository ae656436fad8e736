// The checker's side of a case: the files written to disk as an editor saves them, analysed by
// analyze() and checked by `waveplan check --format json` in this process (the same entry the
// command line runs). Both must give the same findings, with ranges on the text and no internal error.

import { spawnSync } from 'node:child_process';
import * as fs from 'node:fs';
import * as path from 'node:path';
import { runCheck } from '../../../server/src/cli/check';
import { DiskHost } from '../../../server/src/cli/disk';
import type { JsonDiagnostic, JsonReport } from '../../../server/src/cli/format-json';
import { analyze } from '../../../server/src/spec/analyze';
import type { Analysis, SpecDiagnostic } from '../../../server/src/spec/types';
import { ROOT } from '../lsp-client';
import { diagnosticProblems } from '../ranges';

const BIN = path.join(ROOT, 'bin', 'waveplan.js');

/** A finding as both faces can report it: 1-based, as the checker's JSON has it. */
export type Finding = Omit<JsonDiagnostic, 'output'>;

const BOM = '\ufeff';

/**
 * Writes an editor buffer to disk: a buffer that starts with U+FEFF is saved with a byte order
 * mark before it, as an editor saves "UTF-8 with BOM", so the reader (which drops one mark) sees
 * the buffer's text.
 */
export function saveBuffer(file: string, text: string): void {
  fs.writeFileSync(file, text.startsWith(BOM) ? BOM + text : text);
}

/** The text as it reads back from a UTF-8 file (a lone surrogate becomes U+FFFD). */
export const throughUtf8 = (text: string): string => Buffer.from(text, 'utf8').toString('utf8');

export const findingOf = (d: Pick<SpecDiagnostic, 'severity' | 'code' | 'message' | 'range'>): Finding => ({
  severity: d.severity,
  code: d.code,
  message: throughUtf8(d.message),
  line: d.range.start.line + 1,
  column: d.range.start.character + 1,
  endLine: d.range.end.line + 1,
  endColumn: d.range.end.character + 1,
});

export const findingKey = (f: Finding): string => `${f.line}:${f.column}-${f.endLine}:${f.endColumn} ${f.severity} ${f.code}: ${f.message}`;

/** Problems when two lists of findings differ (as sorted sets of keys, with what each side alone has). */
export function compareFindings(left: string, a: readonly Finding[], right: string, b: readonly Finding[]): string[] {
  const ka = a.map(findingKey).sort();
  const kb = b.map(findingKey).sort();
  if (JSON.stringify(ka) === JSON.stringify(kb)) return [];
  const onlyA = ka.filter((k) => !kb.includes(k));
  const onlyB = kb.filter((k) => !ka.includes(k));
  return [`${left} and ${right} differ (${ka.length} vs ${kb.length}); only ${left}: ${JSON.stringify(onlyA.slice(0, 4))}; only ${right}: ${JSON.stringify(onlyB.slice(0, 4))}`];
}

export interface Checked {
  /** The checker's report, per file in the order given. */
  files: { path: string; findings: Finding[] }[];
  exitCode: number;
  problems: string[];
}

const checkArgs = (files: readonly string[], root: string) => [...files, '--format', 'json', '--root', root];

/** The report's findings, and what is wrong with the run itself (stderr, an exit code that disagrees). */
function readReport(stdout: string, stderr: string, exitCode: number, where: string): Checked {
  let report: JsonReport;
  try {
    report = JSON.parse(stdout) as JsonReport;
  } catch {
    return { files: [], exitCode, problems: [`${where} wrote no JSON report (exit ${exitCode}): ${stdout.slice(0, 200)} ${stderr.slice(0, 300)}`] };
  }
  const problems: string[] = stderr ? [`${where} wrote to stderr: ${stderr.slice(0, 300)}`] : [];
  const errors = report.files.some((f) => f.diagnostics.some((d) => d.severity === 'error'));
  if (exitCode !== (errors ? 1 : 0)) problems.push(`${where}: exit code ${exitCode} with${errors ? '' : 'out'} errors in the report`);
  return {
    files: report.files.map((f) => ({ path: f.path, findings: f.diagnostics.map(({ severity, code, message, line, column, endLine, endColumn }) => ({ severity, code, message, line, column, endLine, endColumn })) })),
    exitCode,
    problems,
  };
}

/** `waveplan check <files> --format json --root <root>`, in process. */
export function runChecker(files: readonly string[], root: string): Checked {
  let stdout = '';
  let stderr = '';
  const io = { cwd: root, stdout: (t: string) => void (stdout += t), stderr: (t: string) => void (stderr += t) };
  let exitCode: number;
  try {
    exitCode = runCheck(checkArgs(files, root), io, { version: '0.0.0-fuzz', informationUri: 'https://example.invalid/waveplan' });
  } catch (e) {
    return { files: [], exitCode: -1, problems: [`the checker threw: ${(e as Error).stack ?? String(e)}`] };
  }
  return readReport(stdout, stderr, exitCode, 'the checker');
}

/** The same through the built bundle, as users run it (`node bin/waveplan.js check …`). */
export function runBundledChecker(files: readonly string[], root: string): Checked {
  const run = spawnSync(process.execPath, [BIN, 'check', ...checkArgs(files, root)], { cwd: root, encoding: 'utf8', timeout: 60_000, maxBuffer: 64 << 20 });
  if (run.status === null) return { files: [], exitCode: -1, problems: [`the bundled checker did not finish: ${run.signal ?? run.error?.message}`] };
  return readReport(run.stdout, run.stderr, run.status, 'the bundled checker');
}

export interface CaseFile {
  file: string;
  text: string;
}

/**
 * Writes the files, analyses each with analyze() on the text the disk gives back and checks them
 * all in one checker run (and, when `bundled`, once more through the built bundle); returns the problems and each analysis with the time it took.
 */
export function checkOnDisk(files: readonly CaseFile[], root: string, bundled = false): { problems: string[]; analyses: { file: string; analysis: Analysis; ms: number }[] } {
  for (const f of files) saveBuffer(f.file, f.text);
  const problems: string[] = [];
  const analyses = files.map((f) => {
    const text = throughUtf8(f.text);
    const started = performance.now();
    let analysis: Analysis;
    try {
      analysis = analyze(f.file, text, new DiskHost([root]));
    } catch (e) {
      problems.push(`analyze() threw on ${f.file}: ${(e as Error).stack ?? String(e)}`);
      return undefined;
    }
    const ms = performance.now() - started;
    problems.push(...diagnosticProblems(analysis.diagnostics, text).map((p) => `analyze(): ${p}`));
    return { file: f.file, analysis, ms };
  });
  const checked = runChecker(files.map((f) => f.file), root);
  problems.push(...checked.problems);
  for (const [i, a] of analyses.entries()) {
    if (!a || !checked.files[i]) continue;
    problems.push(...compareFindings('analyze()', a.analysis.diagnostics.map(findingOf), 'the checker', checked.files[i].findings));
  }
  if (bundled) {
    const spawned = runBundledChecker(files.map((f) => f.file), root);
    problems.push(...spawned.problems);
    if (spawned.exitCode !== checked.exitCode) problems.push(`the bundled checker exits ${spawned.exitCode}, in process ${checked.exitCode}`);
    for (const [i, f] of checked.files.entries()) if (spawned.files[i]) problems.push(...compareFindings('the checker', f.findings, 'the bundled checker', spawned.files[i].findings));
  }
  return { problems, analyses: analyses.filter((a) => a !== undefined) };
}
