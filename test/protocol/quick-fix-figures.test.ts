// Every quick fix the server offers on a corpus of invented specs is applied to the text and the
// result is re-checked by the checker's own analyze(); each title's figures (frequency, error,
// divider, N, M, jitter, and a retarget's move from the user's target) must be what the checker
// reports after the edit, and the diagnostic the fix was offered for must be gone — unless the
// title says plainly that it stays. Figures are compared in exact rationals with fraction.js
// (test/support/fix-titles.ts), never with the project's own formatting.

import * as fs from 'node:fs';
import * as os from 'node:os';
import * as path from 'node:path';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { analyze } from '../../server/src/spec/analyze';
import type { Analysis, OutputAnalysis } from '../../server/src/spec/types';
import { floatFraction, fraction, shownPlan, shows, showsSigned, type ShownPlan } from '../support/fix-titles';
import { applyEdits, ensureBuilt, LspClient, ROOT, uriOf, type LspDiagnostic } from '../support/lsp-client';

interface CodeAction {
  title: string;
  isPreferred?: boolean;
  diagnostics?: LspDiagnostic[];
  edit: { changes: Record<string, { range: LspDiagnostic['range']; newText: string }[]> };
}

const host = { readFile: (p: string) => (fs.existsSync(p) && fs.statSync(p).isFile() ? fs.readFileSync(p, 'utf8') : undefined) };

let dir: string;
let client: LspClient;
const waves: string[] = [];

beforeAll(async () => {
  ensureBuilt();
  dir = fs.mkdtempSync(path.join(os.tmpdir(), 'waveplan-fixes-'));
  // The corpus: four invented boards of this folder's corpus/, the protocol fixture and the demo.
  const sources = [path.join(ROOT, 'test/protocol/corpus'), path.join(ROOT, 'test/protocol/fixtures'), path.join(ROOT, 'examples')];
  for (const [i, source] of sources.entries()) {
    const into = path.join(dir, String(i));
    fs.mkdirSync(into);
    for (const name of fs.readdirSync(source).filter((n) => n.endsWith('.yaml'))) {
      fs.copyFileSync(path.join(source, name), path.join(into, name));
      if (name.endsWith('.wave.yaml')) waves.push(path.join(into, name));
    }
  }
  client = await LspClient.start({ folders: [dir] });
});

afterAll(async () => {
  await client?.stop();
  if (dir) fs.rmSync(dir, { recursive: true, force: true });
});

const errorCodes = (a: Analysis): Set<string> => new Set(a.diagnostics.filter((d) => d.severity === 'error').map((d) => d.code));
const countOf = (a: Analysis, code: unknown, output: string | undefined) => a.diagnostics.filter((d) => d.code === code && d.output === output).length;

/** Checks the result clause of a title against the output as the checker sees it after the fix. */
function checkResult(title: string, shown: ShownPlan, after: OutputAnalysis | undefined, problems: string[]): void {
  const p = after?.planning.plan;
  if (!after || !p) {
    problems.push(`${title}: the output has no plan after the fix`);
    return;
  }
  const achieved = fraction(p.achievedHz);
  const error = fraction(p.errorHz).div(fraction(after.targetHz));
  const standing = !after.planning.withinTolerance ? 'out of tolerance' : error.equals(0) ? 'exact' : 'within tolerance';
  const wrong = (what: string, claimed: string, actual: string) => problems.push(`${title}: ${what} says ${claimed}, the checker has ${actual}`);
  if (shown.standing !== standing) wrong('standing', shown.standing, standing);
  if (!shows(shown.frequency, achieved, true)) wrong('frequency', shown.frequency, achieved.toString(9));
  if (!showsSigned(shown.error, error)) wrong('error', shown.error, `${error.mul(1e6).valueOf()} ppm`);
  const d = shown.divider;
  if (d.integer !== p.dividerInteger || d.fraction !== p.dividerFraction || d.steps !== (p.dividerFraction === 0 ? 1 : 2 ** p.fractionBits)) {
    wrong('divider', `${d.integer}+${d.fraction}/${d.steps}`, `${p.dividerInteger}+${p.dividerFraction}/${2 ** p.fractionBits}`);
  }
  if (shown.tableLength !== p.tableLength) wrong('N', String(shown.tableLength), String(p.tableLength));
  if (!shows(`${shown.cycles} Hz`, fraction(p.cycles), true)) wrong('M', shown.cycles, fraction(p.cycles).toString(9));
  if (p.jitterFree !== (shown.jitterRms === undefined)) wrong('jitter', shown.jitterRms ?? 'none', p.jitterFree ? 'none' : String(p.jitter.samplePeriodJitterRmsS));
  if (shown.jitterRms && !shows(shown.jitterRms, floatFraction(p.jitter.samplePeriodJitterRmsS), false)) wrong('rms jitter', shown.jitterRms, String(p.jitter.samplePeriodJitterRmsS));
}

/** Family-specific figures in the head of the title. */
function checkHead(title: string, before: OutputAnalysis, after: OutputAnalysis | undefined, sampleBytes: number, problems: string[]): void {
  const retarget = /^Retarget (\S+ \S+) to the nearest jitter-free frequency (below|above)( and pin its plan)?: /.exec(title);
  if (retarget) {
    if (!after) return;
    // The move is from the user's target to the new one, both as the checker reads them.
    const move = fraction(after.targetHz).sub(fraction(before.targetHz)).div(fraction(before.targetHz));
    if (!showsSigned(retarget[1], move)) problems.push(`${title}: says it moves the target ${retarget[1]}, the edit moves it ${move.mul(1e6).valueOf()} ppm`);
    if ((retarget[2] === 'below') !== move.compare(0) < 0) problems.push(`${title}: the new frequency is not ${retarget[2]} the target`);
    if (!!retarget[3] !== !!before.request.pinned) problems.push(`${title}: pins a plan only when one was pinned`);
    return;
  }
  const lengthen = /^Lengthen the table to (\d+) samples holding (\d+) whole cycles \(\+(\d+) B\): /.exec(title);
  if (lengthen) {
    const p = after?.planning.plan;
    const old = before.planning.plan!;
    if (!p || p.tableLength !== Number(lengthen[1]) || !fraction(p.cycles).equals(Number(lengthen[2]))) problems.push(`${title}: the table after the fix differs`);
    if (p && Number(lengthen[3]) !== (p.tableLength - old.tableLength) * sampleBytes) problems.push(`${title}: the extra bytes differ`);
    return;
  }
  if (/^(Allow a fractional divider( and pin its plan)?|Pin the nearest jitter-free plan): /.test(title)) return;
  // The signal-quality and analog-chain fixes: what the head says the edit sets, the checker reads back.
  if (/^Forbid jitter \(integer dividers only\): /.test(title)) {
    if (after && (after.request.jitter !== 'forbid' || !after.planning.plan?.jitterFree)) problems.push(`${title}: the plan after the fix is not jitter-free`);
    return;
  }
  if (/^Band-limit the table \(only harmonics below f_s\/2\): /.test(title)) {
    if (after && !after.request.waveform.custom) problems.push(`${title}: the table after the fix is not band-limited`);
    return;
  }
  const amplitude = /^(?:Raise|Lower) the amplitude to ([\d.]+) Vpp(?: around ([\d.]+) V)?: /.exec(title);
  if (amplitude) {
    const w = after?.request.waveform;
    if (w && Math.abs(w.amplitudeVpp - Number(amplitude[1])) > 1e-9) problems.push(`${title}: the amplitude after the fix is ${w.amplitudeVpp} Vpp`);
    if (w && amplitude[2] && Math.abs(w.offsetV - Number(amplitude[2])) > 1e-9) problems.push(`${title}: the offset after the fix is ${w.offsetV} V`);
    return;
  }
  problems.push(`${title}: not a title form this test reads`);
}

describe('quick-fix titles state what the checker reports after the fix', () => {
  it('on every fix offered for every diagnostic of the corpus', async () => {
    const problems: string[] = [];
    const verdicts = new Set<string>();
    const shapes = new Set<string>();
    let outputs = 0;
    let fixes = 0;
    for (const file of waves) {
      const text = fs.readFileSync(file, 'utf8');
      const uri = uriOf(file);
      const before = analyze(file, text, host);
      outputs += before.outputs.length;
      for (const o of before.outputs) {
        verdicts.add(o.planning.verdict);
        shapes.add(o.request.waveform.shape);
      }
      client.open(uri, text, 1);
      const published = await client.diagnosticsFor(uri, (p) => p.version === 1);
      for (const d of published.diagnostics) {
        const actions = await client.request<CodeAction[]>('textDocument/codeAction', { textDocument: { uri }, range: d.range, context: { diagnostics: [d], only: ['quickfix'] } });
        const owner = (d.data as { output?: string } | undefined)?.output;
        for (const action of actions) {
          fixes++;
          const title = action.title;
          if (process.env.WAVEPLAN_SHOW_FIXES) console.log(`${owner} ${String(d.code)}${action.isPreferred ? ' (preferred)' : ''}: ${title}`);
          const edited = applyEdits(text, action.edit.changes[uri]);
          const after = analyze(file, edited, host);
          const beforeOutput = before.outputs.find((o) => o.name === owner);
          const afterOutput = after.outputs.find((o) => o.name === owner);
          if (countOf(after, d.code, owner) >= countOf(before, d.code, owner) && !/ — does not clear /.test(title)) {
            problems.push(`${title}: leaves ${String(d.code)} of ${owner} in place without saying so`);
          }
          for (const code of errorCodes(after)) if (!errorCodes(before).has(code)) problems.push(`${title}: brings a new error ${code}`);
          if (/[\u2212]/.test(title)) problems.push(`${title}: uses U+2212 instead of an ASCII sign`);
          const shown = shownPlan(title);
          if (!shown) {
            problems.push(`${title}: does not end with the plan it leads to`);
            continue;
          }
          if (beforeOutput) checkHead(title, beforeOutput, afterOutput, before.hardware!.dac.sampleBytes, problems);
          checkResult(title, shown, afterOutput, problems);
        }
      }
      client.close(uri);
    }
    // The corpus covers what the fixes act on (and so what a figure could be wrong about).
    expect(outputs).toBeGreaterThanOrEqual(30);
    expect([...verdicts].sort()).toEqual(expect.arrayContaining(['exact', 'fractional', 'out-of-tolerance', 'pinned', 'within-tolerance']));
    expect([...shapes]).toEqual(expect.arrayContaining(['sine', 'square', 'triangle', 'sawtooth']));
    expect(fixes).toBeGreaterThanOrEqual(40);
    console.log(`quick-fix figures: ${outputs} outputs, ${fixes} fixes applied, ${problems.length} problems`);
    expect(problems).toEqual([]);
  }, 120_000);
});
