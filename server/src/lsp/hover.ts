// Hover: on an output's name, its plan card with pictures; on a key, what the schema says about
// it; on a quantity, the same value in other units.

import type { Hover, Position } from 'vscode-languageserver/node';
import type { TextDocument } from 'vscode-languageserver-textdocument';
import { lookupKey, type KeyInfo } from '../../../shared-schema/src/keys';
import type { Analysis } from '../spec/types';
import { clockBudgetLine } from './clock-views';
import { systemClockHover } from './clock-hover';
import { floorOf, signalRows } from '../cli/signal-rows';
import { QUICK_SPECTRUM } from '../signal/output-signal';
import { cardBody, cardHeading, memoryLine, table } from './plan-card';
import { hintText } from './inlay-hints';
import { outputPictures, withPictures } from './pictures';
import { quantityViews } from './quantity-views';
import type { NodeAtCursor, SyntaxTree } from './yaml-path';

/** VS Code drops hover markdown of 100 000 characters or more. */
export const HOVER_LIMIT = 100_000;

function keyDoc(info: KeyInfo): string {
  const lines = [`**${info.key}** — ${info.description || 'no description'}`, ''];
  const facts: string[] = [];
  if (info.quantity) facts.push(`${info.quantity.what} in ${info.quantity.units.join(', ')}`);
  else facts.push(info.type);
  if (info.values) facts.push(`one of ${info.values.map((v) => `\`${v}\``).join(', ')}`);
  if (info.min !== undefined || info.max !== undefined) facts.push(`from ${info.min ?? '…'} to ${info.max ?? '…'}`);
  facts.push(info.required ? 'required' : info.default !== undefined ? `default: ${info.default}` : 'optional');
  lines.push(facts.join(' · '));
  return lines.join('\n');
}

/**
 * An output's card: the heading with the one-line summary, then its first picture (the waveform),
 * so both show within the hover's first ~250 px; then the plan table, the signal figures, and the
 * other pictures.
 */
function outputHover(analysis: Analysis, name: string, pictures: boolean): string | undefined {
  const output = analysis.outputs.find((o) => o.name === name);
  if (!output) return undefined;
  const hw = analysis.hardware;
  const plan = output.planning.plan;
  const heading = cardHeading(output, plan ? hintText(plan) : undefined);
  let text = cardBody(output);
  // The signal figures and the spectrum are computed on the first hover of a plan (memoised with it).
  if (hw && plan) text += `\n\n${table(signalRows(hw, output.request, plan, floorOf(output, hw), QUICK_SPECTRUM))}`;
  const budget = clockBudgetLine(output, analysis.hardware);
  if (budget) text += `\n\n${budget}`;
  const memory = memoryLine(analysis);
  if (memory) text += `\n\n${memory}`;
  if (!pictures || !hw) return `${heading}\n\n${text}`;
  const [first, ...rest] = outputPictures(output, hw.dac, hw);
  return withPictures(`${heading}\n\n${first ? `${first.markdown}\n\n` : ''}${text}`, rest, HOVER_LIMIT);
}

function valueHover(analysis: Analysis, at: NodeAtCursor): string | undefined {
  const info = lookupKey(analysis.kind, at.path);
  if (!info?.quantity) return undefined;
  const output = at.path[0] === 'outputs' ? analysis.outputs.find((o) => o.name === at.path[1]) : undefined;
  const toleranceHz = at.path[2] === 'tolerance' ? output?.request.toleranceHz : undefined;
  const views = quantityViews(info.quantity.kind, at.source, { hardware: analysis.hardware, toleranceHz });
  const written = at.source.trim();
  const others = views?.filter((v) => v !== written);
  return others && others.length > 0 ? `\`${written}\` = ${others.join(' = ')}` : undefined;
}

export function hover(doc: TextDocument, tree: SyntaxTree, analysis: Analysis, position: Position, pictures: boolean, readers?: () => Analysis[]): Hover | null {
  const at = tree.nodeAt(doc.offsetAt(position));
  if (!at) return null;
  let markdown: string | undefined;
  const clockHover = analysis.kind === 'clock' && at.path.length === 1 && at.path[0] === 'system-clock' && readers ? systemClockHover(analysis, readers()) : undefined;
  if (at.role === 'key' && analysis.kind === 'wave' && at.path.length === 2 && at.path[0] === 'outputs') {
    markdown = outputHover(analysis, String(at.path[1]), pictures);
  } else if (at.role === 'key') {
    const info = lookupKey(analysis.kind, at.path);
    markdown = info && keyDoc(info);
  } else {
    markdown = valueHover(analysis, at);
  }
  if (clockHover) markdown = markdown ? `${markdown}\n\n${clockHover}` : clockHover;
  if (!markdown) return null;
  return {
    contents: { kind: 'markdown', value: markdown },
    range: { start: doc.positionAt(at.start), end: doc.positionAt(at.end) },
  };
}
