// What a spectrum picture draws, reduced from a line spectrum: the strongest line per frequency
// column over 0 … f_s (so the first image shows), the fundamental, the worst spur and the floor.
// Levels are dBc at the hold's output: the band's lines times the hold's sin(x)/x against the
// fundamental's own droop, and the images of the band's lines mirrored about f_s.

import { sinc } from './hold';
import type { SignalAnalysis } from './signal-figures';

export interface PictureLine {
  hz: number;
  dbc: number;
}

export interface SpectrumPicture {
  sampleRateHz: number;
  fOutHz: number;
  method: 'exact' | 'analytic';
  /** Lines in (0, f_s/2], one per column at most. */
  lines: PictureLine[];
  /** Their images in (f_s/2, f_s). */
  images: PictureLine[];
  worstSpur: PictureLine | null;
  firstImage: PictureLine;
  /** −floor in dBc (spurs above it break the SFDR floor). */
  floorDbc: number;
  sfdrDb: number | null;
}

/** Columns across 0 … f_s/2 the lines are reduced to. */
export const PICTURE_COLUMNS = 240;
/** Lines below this are not drawn (they are below any DAC's resolution). */
const BOTTOM_DBC = -200;

export function spectrumPicture(a: SignalAnalysis, floorDb: number): SpectrumPicture {
  const { spectrum, figures } = a;
  const P = spectrum.period;
  const fs = figures.sampleRateHz;
  const fundamentalLine = Math.max(1, Math.round(a.cyclesPerSample * P));
  const p1 = spectrum.power(fundamentalLine);
  const droop1 = sinc(fundamentalLine / P) ** 2;
  const bestLine = new Array<number>(PICTURE_COLUMNS).fill(-1);
  const bestPower = new Array<number>(PICTURE_COLUMNS).fill(0);
  for (const m of spectrum.candidates()) {
    const p = spectrum.power(m);
    const col = Math.min(PICTURE_COLUMNS - 1, Math.floor((m / P) * 2 * PICTURE_COLUMNS));
    if (p > bestPower[col]) {
      bestPower[col] = p;
      bestLine[col] = m;
    }
  }
  const level = (m: number, nu: number) => 10 * Math.log10((spectrum.power(m) * sinc(nu) ** 2) / (p1 * droop1));
  const lines: PictureLine[] = [];
  const images: PictureLine[] = [];
  for (let c = 0; c < PICTURE_COLUMNS; c++) {
    const m = bestLine[c];
    if (m < 0 || p1 <= 0) continue;
    const nu = m / P;
    const dbc = level(m, nu);
    if (dbc >= BOTTOM_DBC) lines.push({ hz: nu * fs, dbc });
    const image = level(m, 1 - nu);
    if (image >= BOTTOM_DBC) images.push({ hz: (1 - nu) * fs, dbc: image });
  }
  const worst = figures.worstSpurHz;
  return {
    sampleRateHz: fs,
    fOutHz: figures.achievedHz,
    method: figures.method,
    lines,
    images,
    worstSpur: worst === null || figures.sfdrDb === null ? null : { hz: worst, dbc: -figures.sfdrDb + 20 * Math.log10(sinc(worst / fs) / sinc(figures.achievedHz / fs)) },
    firstImage: { hz: figures.firstImageHz, dbc: figures.firstImageDbc },
    floorDbc: -floorDb,
    sfdrDb: figures.sfdrDb,
  };
}
