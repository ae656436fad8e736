// One quick fix applied to a fuzzed spec with the general-purpose TextDocument.applyEdits: every
// comment and every output it does not target stay byte-identical, the file's line breaks stay,
// and the diagnostic it was offered for is cleared — or its title says " — does not clear "
// (the rule of test/protocol/quick-fix-figures.test.ts).

import { TextDocument } from 'vscode-languageserver-textdocument';
import { DiskHost } from '../../../server/src/cli/disk';
import { analyze } from '../../../server/src/spec/analyze';
import type { Analysis } from '../../../server/src/spec/types';
import { breaksIn, insertedBreakProblems } from '../line-breaks';
import { linesOf, rangeProblem, type Range } from '../ranges';
import { lostComments, outputTexts } from './spans';

export interface Fix {
  title: string;
  edits: { range: Range; newText: string }[];
}

export interface Target {
  code: string;
  output: string | undefined;
}

const count = (a: Analysis, t: Target) => a.diagnostics.filter((d) => d.code === t.code && d.output === t.output).length;

/** Outputs a fix may change: its diagnostic's, the one its title names, or every shrunk output for the budget pin. */
function targets(fix: Fix, target: Target, before: Analysis): Set<string> {
  const names = new Set<string>(target.output ? [target.output] : []);
  const named = /^Use fewer samples for (\S+) /.exec(fix.title);
  if (named) names.add(named[1]);
  if (fix.title.startsWith('Pin the plans that fit the budget')) for (const o of before.outputs) if (o.planning.shrunkFrom) names.add(o.name);
  return names;
}

export function checkFix(doc: TextDocument, fix: Fix, target: Target, before: Analysis, file: string, root: string): string[] {
  const problems: string[] = [];
  const say = (p: string) => problems.push(`fix "${fix.title}" for ${target.code} of ${target.output ?? 'the file'}: ${p}`);
  const text = doc.getText();
  const lines = linesOf(text);
  for (const e of fix.edits) {
    const bad = rangeProblem(e.range, lines);
    if (bad) say(`edit range ${bad}`);
  }
  if (problems.length) return problems;
  const after = TextDocument.applyEdits(doc, fix.edits);
  for (const p of insertedBreakProblems(doc, fix.edits)) say(p);
  const kinds = new Set(breaksIn(text));
  if (kinds.size === 1) for (const b of new Set(breaksIn(after))) if (!kinds.has(b)) say(`leaves a ${JSON.stringify(b)} in a file of ${JSON.stringify([...kinds][0])} breaks`);
  for (const c of lostComments(text, after)) say(`loses the comment ${JSON.stringify(c)}`);
  const outputsBefore = outputTexts(text);
  if (outputsBefore) {
    const outputsAfter = outputTexts(after);
    if (!outputsAfter) say('turns clean YAML into YAML with errors');
    else {
      const mine = targets(fix, target, before);
      for (const [name, entry] of outputsBefore) {
        if (mine.has(name)) continue;
        if (outputsAfter.get(name) !== entry) say(`changes output ${name}: ${JSON.stringify(entry.slice(0, 200))} → ${JSON.stringify(outputsAfter.get(name)?.slice(0, 200))}`);
      }
    }
  }
  const afterAnalysis = analyze(file, after, new DiskHost([root]));
  if (afterAnalysis.diagnostics.some((d) => d.code === 'internal-error')) say('leads to an internal-error');
  if (count(afterAnalysis, target) >= count(before, target) && !fix.title.includes(' — does not clear ')) {
    say(`leaves ${target.code} in place (${count(before, target)} → ${count(afterAnalysis, target)}) without saying so`);
  }
  return problems;
}
