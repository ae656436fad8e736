// A zoom on the table wrap: the last samples of one pass, the first of the next, the continuation
// the waveform itself would take there (curve and its quantised samples), and the wrap marked.
// The jump label quotes the plan's own seam figures, so picture and checker never disagree.

import type { Hardware, PlanFigures, TableSpan, Waveform } from '../planning/types';
import { sampleCode } from '../planning/table';
import { frame, type Box } from './frame';
import { palette } from './palette';
import { sampleAt, signalOf } from './signal';
import { el, num, svgDocument, text } from './svg';

const WIDTH = 420;
const HEIGHT = 236;
const BOX: Box = { left: 58, top: 30, width: 346, height: 148 };
/** Samples shown on each side of the wrap. */
export const SEAM_SIDE = 8;

const CAUSE_TEXT: Record<NonNullable<PlanFigures['seam']['cause']>, string> = {
  'fractional-cycles': 'a fractional number of cycles',
  'repeated-sample': 'the last sample repeats the first',
  quantisation: 'rounding of the samples',
};

export function seamSvg(figures: PlanFigures, waveform: Waveform, dac: Hardware['dac'], span: TableSpan): string {
  const sig = signalOf(figures, waveform, dac, span);
  const n = sig.tableLength;
  const k = Math.max(1, Math.min(SEAM_SIDE, n));
  // Stream positions −k … k−1 relative to the wrap: −k…−1 are table[N−k…N−1], 0… the next pass.
  const actual: number[] = [];
  const expected: number[] = [];
  for (let j = -k; j < k; j++) {
    actual.push(sampleAt(sig, j));
    expected.push(sampleCode(waveform, dac, n + j, n, figures.cycles, span));
  }
  const curve: number[] = [];
  const steps = 4 * 2 * k;
  for (let s = 0; s <= steps; s++) curve.push(sig.idealV(sig.phaseAt(n - k + (s / steps) * 2 * k)) / sig.lsbV);

  const all = actual.concat(expected, curve);
  const f = frame(
    BOX,
    { min: -k, max: k, unit: '', title: 'samples from the wrap', tickCount: Math.min(8, 2 * k), exact: true },
    { min: Math.min(...all) - 1, max: Math.max(...all) + 1, unit: '', title: 'DAC code (LSB)', tickCount: 4 },
  );

  let held = '';
  let dots = '';
  for (let s = 0; s < 2 * k; s++) {
    const j = s - k;
    const y = f.y(actual[s]);
    held += `${s === 0 ? 'M' : 'V'}${s === 0 ? `${num(f.x(j))} ${num(y)}` : num(y)}H${num(f.x(j + 1))}`;
    dots += el('circle', { cx: f.x(j), cy: y, r: 2.5, fill: palette.samples });
    if (j >= 0)
      dots += el('circle', { class: 'wp-expected', cx: f.x(j), cy: f.y(expected[s]), r: 4, fill: 'none', stroke: palette.ideal, 'stroke-width': 1.2 });
  }
  let curveD = '';
  for (let s = 0; s <= steps; s++) curveD += `${s === 0 ? 'M' : 'L'}${num(f.x(-k + (s / steps) * 2 * k))} ${num(f.y(curve[s]))}`;

  const seam = figures.seam;
  const colour = seam.ok ? palette.ok : palette.fault;
  const x0 = f.x(0);
  const yLast = f.y(actual[k - 1]);
  const yFirst = f.y(actual[k]);
  const marker =
    el('path', { d: `M${num(x0)} ${num(BOX.top)}V${num(BOX.top + BOX.height)}`, stroke: colour, 'stroke-dasharray': '3 3', fill: 'none' }) +
    el('path', {
      class: 'wp-wrap-step',
      d: `M${num(x0 - 5)} ${num(yLast)}H${num(x0 + 5)}M${num(x0)} ${num(yLast)}V${num(yFirst)}M${num(x0 - 5)} ${num(yFirst)}H${num(x0 + 5)}`,
      stroke: colour,
      'stroke-width': 2,
      fill: 'none',
    });
  const verdict = seam.ok ? `seam ok: jump ${fmtLsb(seam.jumpLsb)} LSB` : `seam broken: jump ${fmtLsb(seam.jumpLsb)} LSB`;
  const why = seam.ok ? '' : ` · ${seam.cause ? CAUSE_TEXT[seam.cause] : 'cause unknown'}`;
  const head =
    text(BOX.left, 18, verdict, { fill: colour, 'font-weight': 'bold' }) +
    el('circle', { cx: WIDTH - 90, cy: 14, r: 4, fill: 'none', stroke: palette.ideal, 'stroke-width': 1.2 }) +
    text(WIDTH - 82, 18, 'continuation', { fill: palette.label, 'font-size': 10 });
  const foot = text(BOX.left, HEIGHT - 7, `N = ${n}, ${span} span${why}`, { fill: seam.ok ? palette.muted : palette.fault, 'font-size': 10 });

  const body =
    f.svg +
    el('path', { d: curveD, fill: 'none', stroke: palette.ideal, 'stroke-width': 1.2, 'stroke-dasharray': '5 3' }) +
    el('path', { class: 'wp-samples', d: held, fill: 'none', stroke: palette.samples, 'stroke-width': 1.5 }) +
    dots +
    marker +
    head +
    foot;
  return svgDocument(WIDTH, HEIGHT, `Table wrap: ${verdict}${why}`, body, palette.paper);
}

function fmtLsb(x: number): string {
  return String(Number(x.toPrecision(4)));
}
