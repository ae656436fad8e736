// The quick fix "retune the system clock": edits `system-clock` in the clock file (a WorkspaceEdit
// on that file's URI) to a clock the joint search ranks above the one in use, and says in its
// title what happens to this spec's outputs — exact and within tolerance, before → after.

import { CodeActionKind, type CodeAction, type Diagnostic } from 'vscode-languageserver/node';
import { cmp, isExactDecimal } from '../../../shared-schema/src/rational';
import { aboveRated, clockCandidatesOf, countsOf, countsOfAnalysis } from '../spec/clock-candidates';
import type { Analysis } from '../spec/types';
import { formatHz } from '../cli/units';
import { clockValueRange } from './clock-edits';
import { pathToUri } from './documents';
import { frequencyText } from './code-actions';
import { overclockCaution, settingText } from './clock-candidates-view';

/** Codes whose cure may be another system clock. */
export const RETUNE_CODES = new Set(['out-of-tolerance', 'over-budget', 'fractional-plan']);

/** Up to two retunes that bring more outputs within tolerance, or as many and more exact. */
export function retuneActions(analysis: Analysis, d: Diagnostic, readClock: (path: string) => string | undefined): CodeAction[] {
  const hw = analysis.hardware;
  if (!hw || !analysis.clockPath || !RETUNE_CODES.has(String(d.code))) return [];
  const result = clockCandidatesOf(analysis);
  if (!result) return [];
  const before = countsOfAnalysis(analysis);
  const better = result.candidates.filter((c) => {
    const after = countsOf(c);
    // The edit writes decimal text: a clock it could only round (100/3 MHz) would not be the clock ranked.
    return isExactDecimal(c.clock.systemClockHz) && cmp(c.clock.systemClockHz, hw.systemClockHz) !== 0 && (after.within > before.within || (after.within === before.within && after.exact > before.exact));
  });
  if (better.length === 0) return [];
  const text = readClock(analysis.clockPath);
  const range = text === undefined ? undefined : clockValueRange(text, ['system-clock'])?.range;
  if (!range) return [];
  const uri = pathToUri(analysis.clockPath);
  return better.slice(0, 2).map((c) => {
    const after = countsOf(c);
    const setting = settingText(hw, c);
    const caution = aboveRated(hw, c.clock.systemClockHz) ? ` — ${overclockCaution(hw)}` : '';
    return {
      title: `Retune the system clock to ${formatHz(c.clock.systemClockHz)}${setting ? ` (${setting})` : ''}: exact ${before.exact} → ${after.exact}, within tolerance ${before.within} → ${after.within} of ${after.total} outputs${caution}`,
      kind: CodeActionKind.QuickFix,
      diagnostics: [d],
      edit: { changes: { [uri]: [{ range, newText: frequencyText(c.clock.systemClockHz) }] } },
    };
  });
}
