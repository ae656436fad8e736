// The output as the DAC emits it: the held samples (zero-order hold) over a few cycles, the ideal
// signal at the achieved frequency over them, and the DAC's range. When the steps would be
// narrower than two pixels the staircase becomes its min/max envelope per pixel column — every
// held value stays inside the band and the band holds nothing the DAC does not emit.

import type { Hardware, PlanFigures, TableSpan, Waveform } from '../planning/types';
import { frame, type Box } from './frame';
import { palette } from './palette';
import { siText } from './scale';
import { sampleAt, signalOf, type Signal } from './signal';
import { el, num, svgDocument, text } from './svg';

const WIDTH = 560;
const HEIGHT = 222;
const BOX: Box = { left: 58, top: 30, width: 488, height: 148 };
/** Streams longer than this are drawn as an envelope (two pixels per step at least). */
const MAX_STEPS = BOX.width / 2;
/** Upper bound on samples walked for one picture, whatever the plan (keeps a hover fast). */
const MAX_WALK = 1 << 16;

/** How many stream samples the picture covers: 3 cycles of short cycles, 2 of long ones. */
export function shownSamples(sig: Signal): { samples: number; cycles: string } {
  const perCycle = sig.cycles > 0 ? sig.tableLength / sig.cycles : sig.tableLength;
  const wanted = perCycle < 16 ? 3 : 2;
  const samples = Math.max(2, Math.min(Math.ceil(wanted * perCycle), 4 * sig.tableLength, MAX_WALK));
  // A very long table shows only its first part; the caption says how much.
  const cycles = samples >= Math.ceil(wanted * perCycle) ? String(wanted) : String(Number((samples / perCycle).toPrecision(3)));
  return { samples, cycles };
}

function staircase(sig: Signal, count: number, x: (t: number) => number, y: (v: number) => number, ts: number): string {
  let d = `M${num(x(0))} ${num(y(sampleAt(sig, 0) * sig.lsbV))}`;
  for (let i = 0; i < count; i++) {
    d += `H${num(x((i + 1) * ts))}`;
    if (i + 1 < count) d += `V${num(y(sampleAt(sig, i + 1) * sig.lsbV))}`;
  }
  return el('path', { class: 'wp-samples', d, fill: 'none', stroke: palette.samples, 'stroke-width': 1.5 });
}

function envelope(sig: Signal, count: number, box: Box, y: (v: number) => number): string {
  const cols = Math.round(box.width);
  const lo = new Float64Array(cols);
  const hi = new Float64Array(cols);
  for (let c = 0; c < cols; c++) {
    // Samples whose hold interval [i, i + 1) overlaps this column's slice of the stream.
    const a = Math.floor((c * count) / cols);
    const b = Math.max(a + 1, Math.ceil(((c + 1) * count) / cols));
    let mn = Infinity;
    let mx = -Infinity;
    for (let i = a; i < b && i < count; i++) {
      const v = sampleAt(sig, i);
      if (v < mn) mn = v;
      if (v > mx) mx = v;
    }
    lo[c] = mn * sig.lsbV;
    hi[c] = mx * sig.lsbV;
  }
  let d = '';
  for (let c = 0; c < cols; c++) d += `${c === 0 ? 'M' : 'L'}${num(box.left + c + 0.5)} ${num(y(hi[c]) - 0.5)}`;
  for (let c = cols - 1; c >= 0; c--) d += `L${num(box.left + c + 0.5)} ${num(y(lo[c]) + 0.5)}`;
  return el('path', {
    class: 'wp-envelope',
    d: d + 'Z',
    fill: palette.samplesFill,
    stroke: palette.samples,
    'stroke-width': 0.8,
    'stroke-linejoin': 'round',
  });
}

export function waveformSvg(figures: PlanFigures, waveform: Waveform, dac: Hardware['dac'], span: TableSpan): string {
  const sig = signalOf(figures, waveform, dac, span);
  const { samples, cycles } = shownSamples(sig);
  const ts = sig.sampleRateHz > 0 ? 1 / sig.sampleRateHz : 1;
  const duration = samples * ts;

  // The ideal at the achieved frequency, one point per pixel column.
  const cols = Math.round(BOX.width);
  const ideal = new Float64Array(cols + 1);
  let vMin = 0;
  let vMax = dac.fullScaleV;
  for (let c = 0; c <= cols; c++) {
    const u = (c / cols) * samples;
    ideal[c] = sig.idealV((u * sig.cycles) / sig.tableLength);
    vMin = Math.min(vMin, ideal[c]);
    vMax = Math.max(vMax, ideal[c]);
  }
  const f = frame(
    BOX,
    { min: 0, max: duration, unit: 's', title: 'time', tickCount: 6, exact: true },
    { min: vMin, max: vMax, unit: 'V', title: 'output', tickCount: 4 },
  );

  const rails =
    el('path', {
      d: `M${num(BOX.left)} ${num(f.y(0))}H${num(BOX.left + BOX.width)}M${num(BOX.left)} ${num(f.y(dac.fullScaleV))}H${num(BOX.left + BOX.width)}`,
      stroke: palette.rail,
      'stroke-dasharray': '2 3',
      fill: 'none',
    }) + text(BOX.left + BOX.width - 4, f.y(dac.fullScaleV) - 3, 'full scale', { 'text-anchor': 'end', fill: palette.muted, 'font-size': 9 });

  let idealD = '';
  for (let c = 0; c <= cols; c++) idealD += `${c === 0 ? 'M' : 'L'}${num(BOX.left + c)} ${num(f.y(ideal[c]))}`;
  const idealPath = el('path', { class: 'wp-ideal', d: idealD, fill: 'none', stroke: palette.ideal, 'stroke-width': 1.2, 'stroke-dasharray': '5 3' });

  const stepped = samples <= MAX_STEPS;
  const held = stepped ? staircase(sig, samples, f.x, f.y, ts) : envelope(sig, samples, BOX, f.y);
  const caption = stepped
    ? `${samples} held samples`
    : `${samples} samples as a min/max band`;
  const head =
    text(BOX.left, 18, `N = ${sig.tableLength}, M = ${fmtCycles(sig.cycles)} · fs = ${siText(sig.sampleRateHz, 'Hz')} · ${cycles} cycles, ${caption}`, {
      fill: palette.label,
      'font-size': 10.5,
    }) + legend();

  const label = `Waveform: ${waveform.shape}, ${cycles} cycles of a ${sig.tableLength}-sample table at ${siText(sig.sampleRateHz, 'Hz')}`;
  return svgDocument(WIDTH, HEIGHT, label, f.svg + rails + held + idealPath + head, palette.paper);
}

function fmtCycles(m: number): string {
  return Number.isInteger(m) ? String(m) : String(Number(m.toPrecision(6)));
}

function legend(): string {
  const y = HEIGHT - 8;
  const x = WIDTH - 196;
  return (
    el('path', { d: `M${x} ${y - 4}h6v-5h6v5h6`, stroke: palette.samples, 'stroke-width': 1.5, fill: 'none' }) +
    text(x + 22, y, 'DAC output', { fill: palette.label, 'font-size': 10 }) +
    el('path', { d: `M${x + 100} ${y - 4}h22`, stroke: palette.ideal, 'stroke-width': 1.2, 'stroke-dasharray': '5 3' }) +
    text(x + 126, y, 'ideal signal', { fill: palette.label, 'font-size': 10 })
  );
}
