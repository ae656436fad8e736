// An output's state in a few words, for the outline: what its plan achieves and its verdict, or
// why it has none. Read off the analysis (its plans and diagnostics); nothing is planned here.
// "not read" when the entry's own text stops it (a YAML error, a key the schema refuses),
// "no plan" when it was read but cannot be planned (its clock file, a pinned plan, the search).

import type { TextDocument } from 'vscode-languageserver-textdocument';
import { MAX_OUTPUTS, clockProblem } from '../spec/analyze';
import { CODES, type Code } from '../spec/codes';
import type { Analysis, OutputAnalysis, Position, Range, SpecDiagnostic } from '../spec/types';
import { hintText } from './inlay-hints';
import { VERDICT_WORDS } from './plan-card';

export interface Findings {
  errors: number;
  warnings: number;
}

const count = (into: Findings, d: SpecDiagnostic): void => {
  if (d.severity === 'error') into.errors++;
  else if (d.severity === 'warning') into.warnings++;
};

/** Each output's errors and warnings, in one pass over the diagnostics. */
export function findingsByOutput(analysis: Analysis): Map<string, Findings> {
  const by = new Map<string, Findings>();
  for (const d of analysis.diagnostics) {
    // A second output of the same name is its own entry, not a finding of the first.
    if (d.output === undefined || d.code === 'duplicate-output') continue;
    let f = by.get(d.output);
    if (!f) by.set(d.output, (f = { errors: 0, warnings: 0 }));
    count(f, d);
  }
  return by;
}

const onLines = (p: Position, r: Range): boolean => p.line >= r.start.line && p.line <= r.end.line;

/** The errors and warnings that start on the lines of `range` (a clock file's section). */
export function findingsIn(analysis: Analysis, range: Range): Findings {
  const f = { errors: 0, warnings: 0 };
  for (const d of analysis.diagnostics) if (onLines(d.range.start, range)) count(f, d);
  return f;
}

const plural = (n: number, word: string): string => `${n} ${word}${n === 1 ? '' : 's'}`;

/** "1 error, 2 warnings"; '' when there are none. */
export function findingsText(f: Findings | undefined): string {
  if (!f) return '';
  return [f.errors > 0 ? plural(f.errors, 'error') : '', f.warnings > 0 ? plural(f.warnings, 'warning') : ''].filter(Boolean).join(', ');
}

/** A planned output: its verdict, the annotation's figures, and how many findings it has. */
export function plannedState(output: OutputAnalysis, findings: Findings | undefined): string {
  const plan = output.planning.plan;
  const parts = [VERDICT_WORDS[output.planning.verdict]];
  if (plan) parts.push(hintText(plan));
  const found = findingsText(findings);
  if (found) parts.push(found);
  return parts.join(' · ');
}

/** Codes that mean the entry's own text was not read as an output. */
const NOT_READ = new Set<Code>(['yaml-syntax', 'too-complex', 'unknown-key', 'duplicate-key', 'bad-name', 'missing-key', 'wrong-type', 'bad-choice', 'bad-unit', 'bad-quantity', 'out-of-range']);

const byPosition = (a: SpecDiagnostic, b: SpecDiagnostic): number => a.range.start.line - b.range.start.line || a.range.start.character - b.range.start.character;

/** What a diagnostic is about, quoted from the text when it is a short piece of one line. */
function subject(doc: TextDocument, d: SpecDiagnostic): string {
  if (d.fix?.key) return ` "${d.fix.key}"`;
  if (d.code === 'yaml-syntax' || d.range.start.line !== d.range.end.line) return '';
  const text = doc.getText(d.range).trim();
  return text.length > 0 && text.length <= 24 ? ` "${text}"` : '';
}

/**
 * Why the output entry at `range` (named `name` as written) has no plan: the first error on its
 * lines, else its clock file, the file's output limit, or its planning still under way.
 */
export function unplannedState(doc: TextDocument, analysis: Analysis, name: string, range: Range, partial: boolean): string {
  const own = analysis.diagnostics.filter((d) => d.severity === 'error' && (onLines(d.range.start, range) || (d.output === name && d.code !== 'duplicate-output'))).sort(byPosition);
  // A syntax error on the entry's lines says more than the schema issues of a text that does not parse.
  const first = own.find((d) => d.code === 'yaml-syntax') ?? own[0];
  if (first) {
    const title = CODES[first.code as Code]?.title ?? first.code;
    // "Unknown key" → "unknown key"; "YAML syntax error" keeps its capitals.
    const words = /^[A-Z][a-z]/.test(title) ? title.charAt(0).toLowerCase() + title.slice(1) : title;
    return `${NOT_READ.has(first.code as Code) ? 'not read' : 'no plan'}: ${words}${subject(doc, first)}, line ${first.range.start.line + 1}`;
  }
  if (!analysis.hardware) return `no plan: ${clockProblem(analysis) ?? 'no clock file read'}`;
  if (partial) return 'not planned yet';
  if (analysis.diagnostics.some((d) => d.code === 'too-many-outputs')) return `no plan: past the ${MAX_OUTPUTS} outputs planned in one file`;
  return 'no plan';
}
