// Pictures of one output's plan as markdown images with data: URIs (VS Code strips inline <svg>).
// Rendered only when a hover or report asks, never on an edit; each image carries alt text, and
// the caller keeps the card's text, so nothing is lost where images do not show.

import type { Hardware, PlanFigures } from '../planning/types';
import { jitterSvg, seamSvg, svgDataUri, waveformSvg } from '../render/index';
import type { OutputAnalysis } from '../spec/types';
import { floorOf } from '../cli/signal-rows';
import { spectrumSvg } from '../render/spectrum';
import { outputSignal, QUICK_SPECTRUM } from '../signal/output-signal';
import { spectrumPicture } from '../signal/spectrum-picture';

export interface Picture {
  title: string;
  markdown: string;
}

function image(alt: string, svg: string): string {
  return `![${alt.replace(/[[\]]/g, '')}](${svgDataUri(svg)})`;
}

/**
 * The engine's memo hands back the same PlanFigures object while an output's inputs are unchanged
 * (and the planning key covers the waveform, the DAC and the span), so pictures keyed on that
 * object survive edits elsewhere in the file. A few dozen are kept: a card is ~100 kB of text.
 */
const KEPT_CARDS = 32;
const rendered = new Map<PlanFigures, Map<string, Picture[]>>();

export function outputPictures(output: OutputAnalysis, dac: Hardware['dac'], hw?: Hardware): Picture[] {
  const plan = output.planning.plan;
  if (!plan) return [];
  const byName = rendered.get(plan) ?? new Map<string, Picture[]>();
  rendered.delete(plan);
  rendered.set(plan, byName); // Map order is the recency order
  if (rendered.size > KEPT_CARDS) rendered.delete(rendered.keys().next().value!);
  let pictures = byName.get(output.name);
  if (!pictures) byName.set(output.name, (pictures = render(output, plan, dac, hw)));
  return pictures;
}

function render(output: OutputAnalysis, plan: PlanFigures, dac: Hardware['dac'], hw?: Hardware): Picture[] {
  const { waveform } = output.request;
  const span = output.request.pinned?.span ?? 'open';
  const pictures: Picture[] = [
    {
      title: 'waveform',
      markdown: image(`${output.name}: the sample staircase the DAC emits over a few cycles, ideal curve overlaid`, waveformSvg(plan, waveform, dac, span)),
    },
    {
      title: 'seam',
      markdown: image(`${output.name}: the table wrap, last samples then the first ones again`, seamSvg(plan, waveform, dac, span)),
    },
  ];
  const jitter = jitterSvg(plan);
  if (jitter !== null) {
    pictures.push({ title: 'jitter', markdown: image(`${output.name}: sample periods of the fractional divider and their time-interval error`, jitter) });
  }
  const spectrum = hw ? outputSignal(hw, output.request, plan, QUICK_SPECTRUM) : null;
  if (hw && spectrum) {
    const svg = spectrumSvg(spectrumPicture(spectrum, floorOf(output, hw).sfdrDb));
    pictures.push({ title: 'spectrum', markdown: image(`${output.name}: spectrum of the stream, spurs, images and the quality floor`, svg) });
  }
  return pictures;
}

/** Appends pictures while the markdown stays under `limit` characters (VS Code's hover cap is 100 000). */
export function withPictures(text: string, pictures: Picture[], limit: number): string {
  let out = text;
  for (const picture of pictures) {
    const next = `${out}\n\n${picture.markdown}`;
    if (next.length >= limit) {
      out += `\n\n_(${picture.title} picture left out: it would make this card too long)_`;
      continue;
    }
    out = next;
  }
  return out;
}
