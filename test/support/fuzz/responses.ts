// Checks of what the server answers, against the text of the version the request was sent for:
// every range and position inside it, symbols' selection ranges inside their ranges, hover
// markdown under VS Code's limit.

import { contains, linesOf, positionProblem, rangeProblem, type Position, type Range } from '../ranges';

interface Symbol {
  name?: string;
  range?: Range;
  selectionRange?: Range;
  location?: { range: Range };
  children?: Symbol[];
}

type Edit = { range?: Range; insert?: Range; replace?: Range; newText: string };

/** Problems of the answer to `method` on a document whose text was `text` (uri `uri`). */
export function answerProblems(method: string, answer: unknown, text: string, uri: string): string[] {
  const lines = linesOf(text);
  const problems: string[] = [];
  const range = (what: string, r: Range | undefined) => {
    if (!r) return problems.push(`${method}: ${what} has no range`);
    const bad = rangeProblem(r, lines);
    if (bad) problems.push(`${method}: ${what}: ${bad}`);
  };
  const position = (what: string, p: Position) => {
    const bad = positionProblem(p, lines);
    if (bad) problems.push(`${method}: ${what}: ${bad}`);
  };
  const edits = (what: string, list: Edit[] | undefined) => {
    for (const e of list ?? []) {
      if (e.range) range(what, e.range);
      if (e.insert) range(`${what} (insert)`, e.insert);
      if (e.replace) range(`${what} (replace)`, e.replace);
    }
  };
  if (answer === null || answer === undefined) {
    if (method !== 'textDocument/hover') problems.push(`${method}: answered ${answer} instead of a list`);
    return problems;
  }
  switch (method) {
    case 'textDocument/hover': {
      const h = answer as { contents: unknown; range?: Range };
      if (h.range) range('hover', h.range);
      const size = JSON.stringify(h.contents).length;
      if (size > 100_000) problems.push(`hover: ${size} characters of contents, over VS Code's 100 000`);
      break;
    }
    case 'textDocument/inlayHint':
      for (const h of answer as { position: Position; label: unknown }[]) position(`hint ${JSON.stringify(h.label).slice(0, 60)}`, h.position);
      break;
    case 'textDocument/codeAction':
      for (const a of answer as { title: string; edit?: { changes?: Record<string, Edit[]> } }[]) edits(`action "${a.title}"`, a.edit?.changes?.[uri]);
      break;
    case 'textDocument/codeLens':
      for (const l of answer as { range: Range }[]) range('lens', l.range);
      break;
    case 'textDocument/completion': {
      const items = Array.isArray(answer) ? answer : (answer as { items: unknown[] }).items;
      if (!Array.isArray(items)) problems.push('completion: no items');
      for (const item of (items ?? []) as { label: string; textEdit?: Edit; additionalTextEdits?: Edit[] }[]) {
        if (item.textEdit) edits(`item ${item.label}`, [item.textEdit]);
        edits(`item ${item.label} (additional)`, item.additionalTextEdits);
      }
      break;
    }
    case 'textDocument/documentSymbol': {
      const walk = (s: Symbol) => {
        if (s.location) return range(`symbol ${s.name}`, s.location.range);
        range(`symbol ${s.name}`, s.range);
        range(`symbol ${s.name} selection`, s.selectionRange);
        if (s.range && s.selectionRange && !contains(s.range, s.selectionRange)) problems.push(`documentSymbol: ${s.name}'s selectionRange ${JSON.stringify(s.selectionRange)} is outside its range ${JSON.stringify(s.range)}`);
        for (const c of s.children ?? []) walk(c);
      };
      for (const s of answer as Symbol[]) walk(s);
      break;
    }
  }
  return problems;
}
