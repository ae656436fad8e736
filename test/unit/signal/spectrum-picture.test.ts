// The spectrum picture: well-formed SVG (sax, strict XML 1.0), the same bytes for the same plan,
// and its marks where the figures put them.

import { describe, expect, it } from 'vitest';
import { spectrumSvg } from '../../../server/src/render/spectrum';
import { spectrumPicture } from '../../../server/src/signal/spectrum-picture';
import { parseXml } from '../render/xml';
import { analyse, fullScale } from './support';

describe('spectrum picture', () => {
  const jittery = analyse({ waveform: fullScale('sine', 14), bits: 14, N: 32, M: 1, I: 2, F: 5461, k: 16, fSysHz: 100e6 });

  it('is well-formed and deterministic', () => {
    const a = spectrumSvg(spectrumPicture(jittery, 80.02));
    expect(parseXml(a).root).toBe('svg');
    expect(spectrumSvg(spectrumPicture(jittery, 80.02))).toBe(a);
  });

  it('marks the worst spur at −SFDR and draws the floor at −80.0 dBc; the first image at its level', () => {
    const pic = spectrumPicture(jittery, 80.02);
    expect(pic.floorDbc).toBeCloseTo(-80.02, 9);
    // At 1.5 MHz of 48 MHz the hold tilts the band by well under 0.1 dB between f_out and the spur.
    expect(Math.abs(pic.worstSpur!.dbc + jittery.figures.sfdrDb!)).toBeLessThan(0.1);
    expect(pic.firstImage.dbc).toBeCloseTo(jittery.figures.firstImageDbc, 9);
    const svg = spectrumSvg(pic);
    for (const cls of ['wp-lines', 'wp-images', 'wp-floor', 'wp-fundamental', 'wp-spur', 'wp-image']) expect(svg).toContain(`class="${cls}"`);
    expect(svg).toContain('floor -80.0 dBc');
  });

  it('a one-cycle table without jitter has no spur to mark', () => {
    const pic = spectrumPicture(analyse({ waveform: fullScale('square', 12), bits: 12, N: 64, M: 1 }), 68);
    expect(pic.worstSpur).toBeNull();
    expect(spectrumSvg(pic)).not.toContain('class="wp-spur"');
  });
});
