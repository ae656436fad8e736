// Where a range may point: inside the text, lines counted as LSP counts them (LSP 3.17, "Position":
// CR LF, a lone CR and LF each end one), start before end. Shared by the analysis robustness tests
// and the fuzz harness, which report problems as text instead of stopping at the first.

import { CODES } from '../../server/src/spec/codes';
import type { Position, Range } from '../../server/src/spec/types';

export type { Position, Range };

export const linesOf = (text: string): string[] => text.split(/\r\n|\r|\n/);

const ordered = (a: Position, b: Position): boolean => a.line < b.line || (a.line === b.line && a.character <= b.character);

/** Why `p` is not a position of the text whose lines are `lines`, or undefined when it is. */
export function positionProblem(p: Position, lines: readonly string[]): string | undefined {
  if (!Number.isInteger(p.line) || !Number.isInteger(p.character)) return `position ${JSON.stringify(p)} is not whole numbers`;
  if (p.line < 0 || p.line >= lines.length) return `line ${p.line} outside the text's ${lines.length} lines`;
  if (p.character < 0 || p.character > lines[p.line].length) return `character ${p.character} outside line ${p.line} (${lines[p.line].length} long)`;
  return undefined;
}

/** Why `r` is not a range of the text, or undefined when it is. */
export function rangeProblem(r: Range, lines: readonly string[]): string | undefined {
  const bad = positionProblem(r.start, lines) ?? positionProblem(r.end, lines);
  if (bad) return bad;
  return ordered(r.start, r.end) ? undefined : `range ends before it starts: ${JSON.stringify(r)}`;
}

/** True when `inner` lies inside `outer` (VS Code drops a symbol whose selectionRange does not). */
export const contains = (outer: Range, inner: Range): boolean => ordered(outer.start, inner.start) && ordered(inner.end, outer.end);

interface Finding {
  code?: string | number;
  message: string;
  range: Range;
}

/** Problems of a list of diagnostics on `text`: unknown code, empty message, range off the text, an internal error. */
export function diagnosticProblems(diagnostics: readonly Finding[], text: string): string[] {
  const lines = linesOf(text);
  const problems: string[] = [];
  for (const d of diagnostics) {
    const code = String(d.code);
    if (!Object.hasOwn(CODES, code)) problems.push(`unknown code ${code}`);
    if (code === 'internal-error') problems.push(`internal-error: ${d.message}`);
    if (d.message.length <= 10) problems.push(`${code}: message too short: ${JSON.stringify(d.message)}`);
    const bad = rangeProblem(d.range, lines);
    if (bad) problems.push(`${code}: ${bad}`);
  }
  return problems;
}
