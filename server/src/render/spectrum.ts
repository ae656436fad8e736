// The spectrum of what an output emits, on a log-magnitude axis: every line of the band
// (0 … f_s/2) and its images up to f_s as the DAC's hold shapes them, the fundamental, the worst
// spur and the first image marked, and the quality floor drawn. The lines come from the signal
// engine (signal/spectrum-picture.ts); this file only draws them.

import type { SpectrumPicture } from '../signal/spectrum-picture';
import { frame, type Box } from './frame';
import { palette } from './palette';
import { siText } from './scale';
import { el, num, svgDocument, text } from './svg';

const WIDTH = 560;
const HEIGHT = 250;
const PLOT: Box = { left: 58, top: 30, width: 488, height: 168 };

export function spectrumSvg(pic: SpectrumPicture): string {
  const lowest = Math.min(pic.floorDbc - 20, ...pic.lines.map((l) => l.dbc), pic.firstImage.dbc);
  const bottom = Math.max(-200, Math.floor(lowest / 20) * 20);
  const f = frame(
    PLOT,
    { min: 0, max: pic.sampleRateHz, unit: 'Hz', title: 'frequency', tickCount: 8, exact: true },
    { min: bottom, max: 10, unit: '', title: 'dBc', tickCount: 5 },
  );
  const y0 = f.y(f.y.domain[0]);
  const stem = (l: { hz: number; dbc: number }) => `M${num(f.x(l.hz))} ${num(y0)}V${num(f.y(Math.max(l.dbc, f.y.domain[0])))}`;
  const lines = el('path', { class: 'wp-lines', d: pic.lines.map(stem).join(''), stroke: palette.samples, 'stroke-width': 1, fill: 'none' });
  const images = el('path', { class: 'wp-images', d: pic.images.map(stem).join(''), stroke: palette.samplesFill, 'stroke-width': 1, fill: 'none' });
  const nyquist = el('path', { d: `M${num(f.x(pic.sampleRateHz / 2))} ${num(PLOT.top)}V${num(PLOT.top + PLOT.height)}`, stroke: palette.rail, 'stroke-dasharray': '2 3', fill: 'none' });
  const floorY = f.y(pic.floorDbc);
  const floor =
    el('path', { class: 'wp-floor', d: `M${num(PLOT.left)} ${num(floorY)}H${num(PLOT.left + PLOT.width)}`, stroke: palette.ideal, 'stroke-dasharray': '6 3', fill: 'none' }) +
    text(PLOT.left + PLOT.width - 4, floorY - 4, `floor ${pic.floorDbc.toFixed(1)} dBc`, { 'text-anchor': 'end', fill: palette.ideal, 'font-size': 10 });
  const mark = (l: { hz: number; dbc: number }, label: string, colour: string, cls: string) =>
    el('circle', { class: cls, cx: f.x(l.hz), cy: f.y(Math.max(l.dbc, f.y.domain[0])), r: 3, fill: 'none', stroke: colour, 'stroke-width': 1.5 }) +
    // Labels right of the mark, or left of it in the right third, so they stay inside the picture.
    (f.x(l.hz) > PLOT.left + (2 * PLOT.width) / 3
      ? text(f.x(l.hz) - 5, f.y(Math.max(l.dbc, f.y.domain[0])) - 5, label, { fill: colour, 'font-size': 10, 'text-anchor': 'end' })
      : text(f.x(l.hz) + 5, f.y(Math.max(l.dbc, f.y.domain[0])) - 5, label, { fill: colour, 'font-size': 10 }));
  let marks = mark({ hz: pic.fOutHz, dbc: 0 }, `f_out ${siText(pic.fOutHz, 'Hz')}`, palette.ok, 'wp-fundamental');
  if (pic.worstSpur) marks += mark(pic.worstSpur, `worst spur, SFDR ${pic.sfdrDb!.toFixed(1)} dB`, palette.fault, 'wp-spur');
  marks += mark(pic.firstImage, `first image ${pic.firstImage.dbc.toFixed(1)} dBc`, palette.muted, 'wp-image');
  const head = text(
    PLOT.left,
    18,
    `spectrum at the DAC (${pic.method === 'exact' ? 'exact: the whole period transformed' : 'analytic: the strongest lines evaluated'}) · f_s ${siText(pic.sampleRateHz, 'Hz')}`,
    { fill: palette.label },
  );
  const legend = text(PLOT.left, HEIGHT - 8, 'dark: lines below f_s/2 · light: their images · dashed: quality floor', { fill: palette.muted, 'font-size': 10 });
  const body = f.svg + nyquist + images + lines + floor + marks + head + legend;
  return svgDocument(WIDTH, HEIGHT, `Spectrum: SFDR ${pic.sfdrDb === null ? 'unbounded' : `${pic.sfdrDb.toFixed(1)} dB`}, first image ${pic.firstImage.dbc.toFixed(1)} dBc`, body, palette.paper);
}
