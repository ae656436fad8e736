// Quick fixes for the board's memory budget (spec/board-budget.ts):
// - on `fitted-to-budget`: "Pin the plans that fit the budget" writes every shrunk output's plan
//   as its pinned plan, so the fit no longer moves when another output changes; and "Use fewer
//   samples" pins the output's next smaller plan within tolerance (its menu's frontier);
// - on `over-budget`: "Use fewer samples" for each of the three largest outputs that can shrink,
//   pinning its smallest plan within tolerance.
// Every title's figures are read off the checker's analysis after the edit (fix-preview.ts).

import type { CancellationToken, CodeAction, Diagnostic, TextEdit } from 'vscode-languageserver/node';
import type { TextDocument } from 'vscode-languageserver-textdocument';
import { div, rat } from '../../../shared-schema/src/rational';
import { describePlan } from '../planning/figures';
import type { Plan } from '../planning/types';
import { menuOf } from '../spec/board-budget';
import type { Analysis, OutputAnalysis } from '../spec/types';
import { formatBytes, formatCycles } from '../cli/units';
import { planText } from './code-actions';
import type { DiagnosticData } from './diagnostics';
import { setKey } from './entry-edits';
import { leavesInPlace, previewFix, quickFix, resultClause, type Recheck } from './fix-preview';
import { checkCancelled } from './safe';

/** "S = 5000, 10000 B": what an output's table holds after the fix, as the checker reports it. */
function figures(o: OutputAnalysis | undefined): string {
  const p = o?.planning.plan;
  if (!o || !p) return 'no plan';
  return `S = ${formatCycles(div(rat(BigInt(p.tableLength)), p.cycles))}, ${formatBytes(p.tableBytes)}`;
}

/** The plan an output's own menu offers with fewer bytes than it takes now: the largest S among them. */
function fewerSamples(analysis: Analysis, o: OutputAnalysis, smallest: boolean): Plan | null {
  const hw = analysis.hardware!;
  const own = o.planning.shrunkFrom ?? o.planning.plan;
  if (!own) return null;
  const menu = menuOf(o, hw, own);
  if (menu === null) return null;
  const frontier = menu.frontier();
  const now = o.planning.plan!.tableLength;
  let below = 0;
  while (below < frontier.length && frontier.n(below) < now) below++;
  if (below === 0) return null;
  return menu.planOf(frontier.at(smallest ? 0 : below - 1));
}

function fewerSamplesFix(doc: TextDocument, analysis: Analysis, o: OutputAnalysis, d: Diagnostic, recheck: Recheck, smallest: boolean): CodeAction | undefined {
  const plan = fewerSamples(analysis, o, smallest);
  if (!plan) return undefined;
  const figuresOf = describePlan(analysis.hardware!, o.request, o.request.waveform, plan, 'open');
  const edit = setKey(doc, o, 'plan', planText(figuresOf));
  if (!edit) return undefined;
  const preview = previewFix(doc, analysis, [edit], d, o.name, recheck);
  if (!preview) return undefined;
  const title = `Use fewer samples for ${o.name} (${figures(preview.output)}): ${resultClause(preview.output)}`;
  return quickFix(preview.cleared ? title : title + leavesInPlace(d.code), doc, [edit], d, false);
}

function pinTheFit(doc: TextDocument, analysis: Analysis, d: Diagnostic, recheck: Recheck): CodeAction | undefined {
  const shrunk = analysis.outputs.filter((o) => o.planning.shrunkFrom && o.planning.plan);
  const edits = shrunk.map((o) => setKey(doc, o, 'plan', planText(o.planning.plan!))).filter((e): e is TextEdit => !!e);
  if (edits.length === 0 || edits.length !== shrunk.length) return undefined;
  const preview = previewFix(doc, analysis, edits, d, (d.data as DiagnosticData | undefined)?.output ?? '', recheck);
  if (!preview) return undefined;
  const memory = preview.analysis.memory;
  const total = memory ? `${formatBytes(memory.usedBytes)} of ${formatBytes(memory.budgetBytes)}` : 'no tables';
  const title = `Pin the plans that fit the budget (${shrunk.length} output${shrunk.length === 1 ? '' : 's'}, ${total}): ${resultClause(preview.output)}`;
  return quickFix(preview.cleared ? title : title + leavesInPlace(d.code), doc, edits, d, preview.cleared);
}

export function budgetFixes(doc: TextDocument, analysis: Analysis, d: Diagnostic, token: CancellationToken, recheck: Recheck): CodeAction[] {
  if (!analysis.hardware) return [];
  const out: (CodeAction | undefined)[] = [];
  if (d.code === 'fitted-to-budget') {
    const name = (d.data as DiagnosticData | undefined)?.output;
    const o = analysis.outputs.find((x) => x.name === name);
    out.push(pinTheFit(doc, analysis, d, recheck));
    checkCancelled(token);
    if (o) out.push(fewerSamplesFix(doc, analysis, o, d, recheck, false));
  } else if (d.code === 'over-budget') {
    const largest = analysis.outputs
      .filter((o) => o.planning.plan && !o.request.pinned && o.planning.withinTolerance)
      .sort((a, b) => b.planning.plan!.tableBytes - a.planning.plan!.tableBytes || (a.name < b.name ? -1 : 1))
      .slice(0, 3);
    for (const o of largest) {
      checkCancelled(token);
      out.push(fewerSamplesFix(doc, analysis, o, d, recheck, true));
    }
  }
  return out.filter((a): a is CodeAction => !!a);
}
