// The plot frame every picture shares: a white plot area on paper, grid lines at nice ticks,
// tick labels with one SI prefix per axis, and axis titles. Returns the scales for the data.

import { palette } from './palette';
import { linear, niceDomain, prefixFor, tickLabel, ticks, type Linear } from './scale';
import { el, num, text } from './svg';

export interface Box {
  left: number;
  top: number;
  width: number;
  height: number;
}

export interface AxisSpec {
  min: number;
  max: number;
  /** Unit symbol ("s", "V"); the axis picks its SI prefix. Empty for plain counts. */
  unit: string;
  title: string;
  /** About how many intervals. */
  tickCount: number;
  /** Keep the domain as given (e.g. sample indices), instead of widening it to whole ticks. */
  exact?: boolean;
}

export interface Frame {
  x: Linear;
  y: Linear;
  box: Box;
  svg: string;
}

function axisTitle(spec: AxisSpec, prefix: string): string {
  return spec.unit ? `${spec.title} (${prefix}${spec.unit})` : spec.title;
}

export function frame(box: Box, xs: AxisSpec, ys: AxisSpec): Frame {
  const [x0, x1] = xs.exact ? [xs.min, xs.max] : niceDomain(xs.min, xs.max, xs.tickCount);
  const [y0, y1] = ys.exact ? [ys.min, ys.max] : niceDomain(ys.min, ys.max, ys.tickCount);
  const x = linear(x0, x1, box.left, box.left + box.width);
  const y = linear(y0, y1, box.top + box.height, box.top);
  const bottom = box.top + box.height;
  const xp = xs.unit ? prefixFor(Math.max(Math.abs(x0), Math.abs(x1))) : { factor: 1, prefix: '' };
  const yp = ys.unit ? prefixFor(Math.max(Math.abs(y0), Math.abs(y1))) : { factor: 1, prefix: '' };

  let grid = '';
  let labels = '';
  for (const t of ticks(x0, x1, xs.tickCount)) {
    const px = num(x(t));
    grid += `M${px} ${num(box.top)}V${num(bottom)}`;
    labels += text(x(t), bottom + 14, tickLabel(t, xp.factor), { 'text-anchor': 'middle' });
  }
  for (const t of ticks(y0, y1, ys.tickCount)) {
    const py = num(y(t));
    grid += `M${num(box.left)} ${py}H${num(box.left + box.width)}`;
    labels += text(box.left - 5, y(t) + 4, tickLabel(t, yp.factor), { 'text-anchor': 'end' });
  }
  const svg =
    el('rect', { x: box.left, y: box.top, width: box.width, height: box.height, fill: palette.plot, stroke: palette.axis }) +
    el('path', { d: grid, stroke: palette.grid, 'stroke-width': 1, fill: 'none' }) +
    el('g', { fill: palette.label }, labels) +
    text(box.left + box.width / 2, bottom + 29, axisTitle(xs, xp.prefix), { 'text-anchor': 'middle', fill: palette.axis }) +
    text(12, box.top + box.height / 2, axisTitle(ys, yp.prefix), {
      'text-anchor': 'middle',
      fill: palette.axis,
      transform: `rotate(-90 12 ${num(box.top + box.height / 2)})`,
    });
  return { x, y, box, svg };
}
