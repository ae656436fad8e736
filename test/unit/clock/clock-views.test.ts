// The clock tree in the editor: the retune quick fix edits the clock file and counts what happens
// to the outputs; the hover on system-clock ranks the clocks and marks an overclocked one with the
// usual caution. Figures come from the board of the clock-tree brief (invented), derived there.
import { describe, expect, it } from 'vitest';
import { analyze } from '../../../server/src/spec/analyze';
import { retuneActions } from '../../../server/src/lsp/retune';
import { systemClockHover } from '../../../server/src/lsp/clock-hover';

type Diagnostic = Parameters<typeof retuneActions>[1];
const asLsp = (d: { code: string; message: string; range: Diagnostic['range'] }): Diagnostic => ({ range: d.range, message: d.message, code: d.code, source: 'waveplan' });

const clockText = (rated: string, tolerance = '') => `system-clock: 100 MHz
rated-system-clock: ${rated}
${tolerance}
pll:
  crystal: 25 MHz
  reference-divider: { min: 1, max: 4 }
  feedback-multiplier: { min: 8, max: 64 }
  phase-detector: { min: 5 MHz, max: 25 MHz }
  vco: { min: 400 MHz, max: 800 MHz }
  post-dividers:
    p: { values: [2, 4, 5, 6, 8] }
divider:
  integer: { min: 1, max: 65535 }
dac:
  bits: 14
  sample-bytes: 2
  full-scale: 2 V
  max-sample-rate: 20 MHz
memory:
  budget: 64 KiB
  table-length: { min: 16, max: 16384 }
  power-of-two: true
`;
const waveText = 'clock: ./board.clock.yaml\noutputs:\n  tone: { shape: sine, frequency: 40 kHz }\n  fast: { shape: sine, frequency: 1.5 MHz }\n';
const analyseWith = (clock: string) => {
  const host = { readFile: (p: string) => (p.endsWith('board.clock.yaml') ? clock : undefined) };
  return { wave: analyze('/b/board.wave.yaml', waveText, host), clock: analyze('/b/board.clock.yaml', clock, host) };
};

describe('retune the system clock', () => {
  it('with a ±50 ppm crystal: to 120 MHz, both outputs exact and within tolerance (0 → 2), an edit of system-clock in the clock file', () => {
    const text = clockText('125 MHz', 'system-clock-tolerance: 50 ppm');
    const { wave } = analyseWith(text);
    const d = wave.diagnostics.find((x) => x.code === 'out-of-tolerance')!;
    const [first] = retuneActions(wave, asLsp(d), () => text);
    expect(first!.title).toBe('Retune the system clock to 120 MHz (PLL 25 MHz ÷1 ×24 ÷5 (VCO 600 MHz)): exact 0 → 2, within tolerance 0 → 2 of 2 outputs');
    const [uri, edits] = Object.entries(first!.edit!.changes!)[0]!;
    expect(uri).toBe('file:///b/board.clock.yaml');
    expect(edits).toEqual([{ range: { start: { line: 0, character: 14 }, end: { line: 0, character: 21 } }, newText: '120 MHz' }]);
  });

  it('a clock above the rated maximum is listed after every rated one, with the caution in its hover row and its retune title', () => {
    // Rated 52 MHz: the VCO's 400 MHz ÷ 8 = 50 MHz is the only clock of ÷8 at or below it (derived), so overclocked ones make the list.
    const text = clockText('52 MHz', 'system-clock-tolerance: 50 ppm');
    const { wave, clock } = analyseWith(text);
    const hover = systemClockHover(clock, [wave])!;
    expect(hover).toContain('| system clock | setting | exact | within tolerance | worst error | tables | VCO margin |');
    const rows = hover.split('\n').filter((l) => l.startsWith('| ') && !l.startsWith('| system clock'));
    const marked = rows.findIndex((l) => l.includes('⚠'));
    expect(marked).toBeGreaterThan(0);
    expect(rows.slice(marked).every((l) => l.includes('⚠'))).toBe(true);
    expect(hover).toContain('caution: above the rated 52 MHz — an overclocked part can be unstable or damaged; follow the datasheet and qualified practice.');
    const d = wave.diagnostics.find((x) => x.code === 'out-of-tolerance')!;
    const titles = retuneActions(wave, asLsp(d), () => text).map((a) => a.title);
    expect(titles.length).toBeGreaterThan(0);
    for (const t of titles) {
      const mhz = Number(/to ([\d.]+) MHz/.exec(t)![1]);
      expect(t.includes('caution: above the rated 52 MHz'), t).toBe(mhz > 52);
    }
  });
});

describe('the report gains the clock tree', () => {
  it('source, tolerance, the setting in use and the ranked clocks with 120 MHz first', async () => {
    const { clockTreeSection } = await import('../../../server/src/export/clock-report');
    const { wave } = analyseWith(clockText('125 MHz', 'system-clock-tolerance: 50 ppm'));
    const html = clockTreeSection(wave);
    expect(html).toContain('crystal 25 MHz through a PLL: R 1…4, N 8…64, VCO 400 MHz…800 MHz; in use: ÷1 ×24 ÷6, f_pfd 25 MHz, f_vco 600 MHz'); // 600 MHz sits mid-VCO, 400 MHz ÷ 4 at its edge (derived)
    expect(html).toContain('±50 ppm, counted in every output&apos;s worst case');
    expect(html.indexOf('<td data-label="system clock">120 MHz</td>')).toBeGreaterThan(0);
    expect(html.indexOf('<td data-label="system clock">120 MHz</td>')).toBeLessThan(html.indexOf('<td data-label="system clock">80 MHz</td>'));
  });
});
