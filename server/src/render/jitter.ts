// The sample clock of a fractional plan: which sample periods are I and which I+1 system clocks
// (a first-order accumulator adds F each period and takes the long period on overflow), and the
// time-interval error of each sample edge against the ideal grid aligned to the mean. The
// pattern comes from the engine (planning/jitter.ts); this file only draws it.

import { toNumber } from '../../../shared-schema/src/rational';
import { periodPattern } from '../planning/jitter';
import type { PlanFigures } from '../planning/types';
import { frame, type Box } from './frame';
import { palette } from './palette';
import { siText } from './scale';
import { el, num, svgDocument, text } from './svg';

const WIDTH = 560;
const HEIGHT = 262;
const PERIODS: Box = { left: 58, top: 32, width: 488, height: 44 };
const TIE: Box = { left: 58, top: 96, width: 488, height: 112 };
/** Periods drawn at most; a longer pattern shows its beginning. */
export const JITTER_SHOWN = 64;

export function jitterSvg(figures: PlanFigures): string | null {
  if (figures.jitterFree || figures.dividerFraction === 0 || figures.fractionBits <= 0) return null;
  const pattern = periodPattern(figures.dividerFraction, 2 ** figures.fractionBits, JITTER_SHOWN);
  const count = pattern.long.length;
  const tSys = 1 / toNumber(figures.systemClockHz);
  const tie = pattern.tieClocks.map((c) => c * tSys);
  const f = frame(
    TIE,
    { min: 0, max: count, unit: '', title: 'sample edge', tickCount: 8, exact: true },
    { min: Math.min(...tie, -tSys / 2), max: Math.max(...tie, tSys / 2), unit: 's', title: 'TIE', tickCount: 4 },
  );

  const i = figures.dividerInteger;
  const width = PERIODS.width / count;
  let bars = '';
  for (let n = 0; n < count; n++) {
    const isLong = pattern.long[n];
    const h = isLong ? PERIODS.height : PERIODS.height * 0.55;
    bars += el('rect', {
      class: isLong ? 'wp-long' : 'wp-short',
      x: PERIODS.left + n * width + 0.5,
      y: PERIODS.top + PERIODS.height - h,
      width: Math.max(0.6, width - 1),
      height: h,
      fill: isLong ? palette.longPeriod : palette.shortPeriod,
    });
  }
  const periodsPanel =
    el('rect', { x: PERIODS.left, y: PERIODS.top, width: PERIODS.width, height: PERIODS.height, fill: palette.plot, stroke: palette.axis }) +
    bars +
    text(PERIODS.left - 5, PERIODS.top + 9, `${i + 1}`, { 'text-anchor': 'end', fill: palette.longPeriod }) +
    text(PERIODS.left - 5, PERIODS.top + PERIODS.height - 2, `${i}`, { 'text-anchor': 'end', fill: palette.shortPeriod }) +
    text(12, PERIODS.top + PERIODS.height / 2, 'clocks', {
      'text-anchor': 'middle',
      fill: palette.axis,
      'font-size': 9,
      transform: `rotate(-90 12 ${num(PERIODS.top + PERIODS.height / 2)})`,
    });

  let d = '';
  for (let n = 0; n <= count; n++) d += `${n === 0 ? 'M' : 'L'}${num(f.x(n))} ${num(f.y(tie[n]))}`;
  let dots = '';
  if (count <= 64) for (let n = 0; n <= count; n++) dots += el('circle', { cx: f.x(n), cy: f.y(tie[n]), r: 1.8, fill: palette.samples });
  const zero = el('path', { d: `M${num(TIE.left)} ${num(f.y(0))}H${num(TIE.left + TIE.width)}`, stroke: palette.axis, fill: 'none' });

  const j = figures.jitter;
  const k = figures.fractionBits;
  const shownText = count < pattern.patternLength ? `first ${count} of ${pattern.patternLength}` : `all ${count}`;
  const head = text(
    PERIODS.left,
    20,
    `divider ${i} + ${figures.dividerFraction}/${2 ** k}: ${shownText} periods of the pattern · TIE ${siText(j.tiePkPkS, 's')} pk-pk, ${siText(j.tieRmsS, 's')} rms`,
    { fill: palette.label },
  );
  const legend =
    el('rect', { x: WIDTH - 220, y: HEIGHT - 16, width: 9, height: 9, fill: palette.longPeriod }) +
    text(WIDTH - 207, HEIGHT - 8, `long: ${i + 1} clocks`, { fill: palette.label, 'font-size': 10 }) +
    el('rect', { x: WIDTH - 130, y: HEIGHT - 16, width: 9, height: 9, fill: palette.shortPeriod }) +
    text(WIDTH - 117, HEIGHT - 8, `short: ${i} clock${i === 1 ? '' : 's'}`, { fill: palette.label, 'font-size': 10 });

  const body = f.svg + zero + el('path', { class: 'wp-tie', d, fill: 'none', stroke: palette.samples, 'stroke-width': 1.2 }) + dots + periodsPanel + head + legend;
  return svgDocument(WIDTH, HEIGHT, `Divider jitter: ${shownText} sample periods and their TIE`, body, palette.paper);
}
