// The memory budget as one bar: a segment per table in output order, the free remainder, and
// the overflow in the fault colour when the tables exceed the budget.

import { palette } from './palette';
import { el, escapeXml, svgDocument, text } from './svg';

export interface MemorySegment {
  name: string;
  bytes: number;
}

const WIDTH = 560;
const HEIGHT = 74;
const BAR = { left: 10, top: 26, width: 540, height: 22 };
const SEGMENT_COLOURS = ['#1d4e89', '#c46d1c', '#3c7a3a', '#7b4fa0', '#4f8fa0', '#a0714f', '#5b6b2a', '#a04f6e'];

function bytesText(b: number): string {
  return b < 1024 ? `${b} B` : `${Number((b / 1024).toPrecision(4))} KiB`;
}

export function memorySvg(segments: readonly MemorySegment[], budgetBytes: number): string {
  const used = segments.reduce((n, s) => n + s.bytes, 0);
  const scaleTo = Math.max(used, budgetBytes, 1);
  const px = (b: number) => (b / scaleTo) * BAR.width;
  const over = used > budgetBytes;
  let x = BAR.left;
  let body = el('rect', { x: BAR.left, y: BAR.top, width: BAR.width, height: BAR.height, fill: palette.plot, stroke: palette.axis });
  segments.forEach((s, i) => {
    const w = px(s.bytes);
    body += el('rect', { class: 'wp-segment', x, y: BAR.top, width: w, height: BAR.height, fill: SEGMENT_COLOURS[i % SEGMENT_COLOURS.length] }, el('title', {}, escapeXml(`${s.name}: ${bytesText(s.bytes)}`)));
    if (w > 60) body += text(x + 4, BAR.top + 15, s.name, { fill: '#ffffff', 'font-size': 10 });
    x += w;
  });
  const budgetX = BAR.left + px(budgetBytes);
  if (over)
    body +=
      el('rect', { x: budgetX, y: BAR.top - 3, width: BAR.left + BAR.width - budgetX, height: BAR.height + 6, fill: 'none', stroke: palette.fault, 'stroke-width': 2 }) +
      el('path', { d: `M${budgetX} ${BAR.top - 6}V${BAR.top + BAR.height + 6}`, stroke: palette.fault, 'stroke-width': 2 });
  const share = budgetBytes > 0 ? Math.round((used / budgetBytes) * 1000) / 10 : 0;
  const headline = `${bytesText(used)} of ${bytesText(budgetBytes)} table budget (${share} %)${over ? ` — over by ${bytesText(used - budgetBytes)}` : ''}`;
  body += text(BAR.left, 17, headline, { fill: over ? palette.fault : palette.label, 'font-weight': over ? 'bold' : undefined });
  body += text(BAR.left + BAR.width, BAR.top + BAR.height + 16, `free ${bytesText(Math.max(0, budgetBytes - used))}`, { 'text-anchor': 'end', fill: palette.muted, 'font-size': 10 });
  return svgDocument(WIDTH, HEIGHT, `Memory: ${headline}`, body, palette.paper);
}
