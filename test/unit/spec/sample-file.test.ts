// `sample-file:` in the spec layer: the file's text through the host into the table, the same
// analysis whether the spec is read output by output or whole, and a new plan when only the
// sample file's text changes (the per-output memo must not serve the old one).

import { describe, expect, it } from 'vitest';
import { exportModel } from '../../../server/src/export/model';
import { outputCard } from '../../../server/src/lsp/plan-card';
import { analyze, analyzeWhole } from '../../../server/src/spec/analyze';

const clock = 'system-clock: 125 MHz\ndivider:\n  integer: { min: 1, max: 65535 }\ndac:\n  bits: 12\n  sample-bytes: 2\n  full-scale: 3.3 V\n  max-sample-rate: 12.5 MHz\nmemory:\n  budget: 24 KiB\n  table-length: { min: 16, max: 16384 }\n';

function hostWith(files: Record<string, string>) {
  const read: string[] = [];
  return {
    read,
    host: {
      readFile: (p: string) => {
        read.push(p);
        return p.endsWith('.clock.yaml') ? clock : files[p];
      },
    },
  };
}

// 125 MHz / 125 = 1 MHz, so 100 values at S = 100 play 10 kHz.
const spec = (extra = '') => `clock: ./r.clock.yaml\noutputs:\n  shaped:\n    shape: sine\n    frequency: 10 kHz\n    sample-file: ./cycle.csv\n${extra}  plain:\n    shape: sine\n    frequency: 1 kHz\n`;
const ramp = (n: number, eol = '\n') => Array.from({ length: n }, (_, i) => String(Math.sin((2 * Math.PI * i) / n) + 0.5 * Math.cos((4 * Math.PI * i) / n))).join(eol) + eol;

const codesOf = (a: ReturnType<typeof analyze>) => Array.from(exportModel({ analysis: a } as Parameters<typeof exportModel>[0])!.outputs[0]!.codes!);

describe('sample-file: through the spec layer', () => {
  it('reads the file relative to the spec and records its path; the table is the file scaled to the codes (derived: linear within 1 LSB)', () => {
    const { host, read } = hostWith({ '/w/cycle.csv': ramp(100) });
    const a = analyze('/w/r.wave.yaml', spec(), host);
    expect(a.diagnostics).toEqual([]);
    expect(read).toContain('/w/cycle.csv');
    expect(a.sampleFiles?.map((f) => f.path)).toEqual(['/w/cycle.csv']);
    expect(a.sampleFiles![0]!.sha256).toMatch(/^[0-9a-f]{64}$/);
    const plan = a.outputs[0]!.planning.plan!;
    expect([plan.tableLength, Number(plan.cycles.num)]).toEqual([100, 1]);
    const values = ramp(100).trim().split('\n').map(Number);
    const codes = codesOf(a);
    const [vlo, vhi] = [Math.min(...values), Math.max(...values)];
    const [clo, chi] = [Math.min(...codes), Math.max(...codes)];
    for (let i = 0; i < 100; i++) expect(Math.abs(codes[i]! - (clo + ((values[i]! - vlo) / (vhi - vlo)) * (chi - clo)))).toBeLessThanOrEqual(1);
  });

  it('gives the same analysis read output by output and read whole', () => {
    const { host } = hostWith({ '/w/cycle.csv': ramp(100) });
    const split = analyze('/w/r.wave.yaml', spec(), host);
    const whole = analyzeWhole('/w/r.wave.yaml', spec(), host);
    expect(split.diagnostics).toEqual(whole.diagnostics);
    expect(split.outputs.map((o) => o.planning.plan)).toEqual(whole.outputs.map((o) => o.planning.plan));
    expect(split.sampleFiles).toEqual(whole.sampleFiles);
  });

  it('plans again when only the sample file changes (same spec text), in both readings', () => {
    for (const run of [analyze, analyzeWhole]) {
      const first = run('/w/r.wave.yaml', spec(), hostWith({ '/w/cycle.csv': ramp(100) }).host);
      const longer = run('/w/r.wave.yaml', spec(), hostWith({ '/w/cycle.csv': ramp(125) }).host);
      expect(first.outputs[0]!.planning.plan!.tableLength).toBe(100);
      expect(longer.outputs[0]!.planning.plan!.tableLength).toBe(125);
      const broken = run('/w/r.wave.yaml', spec(), hostWith({ '/w/cycle.csv': 'x\n1\n2\nthree\n' }).host);
      expect(broken.diagnostics.map((d) => d.code)).toEqual(['sample-file-invalid']);
      expect(broken.outputs.map((o) => o.name)).toEqual(['plain']);
      const back = run('/w/r.wave.yaml', spec(), hostWith({ '/w/cycle.csv': ramp(100) }).host);
      expect(back.diagnostics).toEqual([]);
    }
  });

  it('CRLF, lone CR and LF files give the same table', () => {
    const tables = ['\n', '\r\n', '\r'].map((eol) => codesOf(analyze('/w/r.wave.yaml', spec(), hostWith({ '/w/cycle.csv': `# cycle${eol}${eol}value${eol}${ramp(100, eol)}` }).host)));
    expect(tables[1]).toEqual(tables[0]);
    expect(tables[2]).toEqual(tables[0]);
  });

  it('prefers S = K but meets the tolerance first: at 9.9 kHz no plan of S = 100 is within 50 ppm, so the table is resampled', () => {
    const text = spec().replace('frequency: 10 kHz', 'frequency: 9.9 kHz');
    const a = analyze('/w/r.wave.yaml', text, hostWith({ '/w/cycle.csv': ramp(100) }).host);
    const plan = a.outputs[0]!.planning.plan!;
    expect(a.outputs[0]!.planning.withinTolerance).toBe(true);
    expect(Number(plan.tableLength) / Number(plan.cycles.num)).not.toBe(100);
    // A written max-samples-per-cycle rules over the file's count.
    const capped = analyze('/w/r.wave.yaml', spec('    max-samples-per-cycle: 50\n'), hostWith({ '/w/cycle.csv': ramp(100) }).host);
    const p = capped.outputs[0]!.planning.plan!;
    expect(p.tableLength / Number(p.cycles.num)).toBeLessThanOrEqual(50);
    // The plan card says which: the file as it is, or resampled.
    expect(outputCard(capped.outputs[0]!)).toContain('resamples it at S = ');
    const exact = analyze('/w/r.wave.yaml', spec(), hostWith({ '/w/cycle.csv': ramp(100) }).host);
    expect(outputCard(exact.outputs[0]!)).toContain('K = 100 values; the table plays it sample for sample (S = K)');
    expect(outputCard(exact.outputs[1]!)).not.toContain('sample file');
  });

  it('on another shape it is unused-key and the file does not make the table; with harmonics, harmonics is unused-key', () => {
    const files = { '/w/cycle.csv': ramp(100) };
    const square = analyze('/w/r.wave.yaml', spec().replace('shape: sine\n    frequency: 10 kHz', 'shape: square\n    frequency: 10 kHz'), hostWith(files).host);
    expect(square.diagnostics.map((d) => [d.code, d.range.start.line])).toEqual([['unused-key', 5]]);
    expect(square.outputs[0]!.request.waveform.custom).toBeUndefined();
    const both = analyze('/w/r.wave.yaml', spec('    harmonics: [{ order: 1, amplitude: 1 }]\n'), hostWith(files).host);
    expect(both.diagnostics.map((d) => [d.code, d.range.start.line])).toEqual([['unused-key', 6]]);
    expect(both.outputs[0]!.request.waveform.custom!.samples).toBeDefined();
  });

  it('a flat file and a one-value file', () => {
    const flat = analyze('/w/r.wave.yaml', spec(), hostWith({ '/w/cycle.csv': '1\n1\n1\n1\n' }).host);
    expect(flat.diagnostics).toEqual([]);
    expect(new Set(codesOf(flat)).size).toBe(1);
    const one = analyze('/w/r.wave.yaml', spec(), hostWith({ '/w/cycle.csv': '0.5\n' }).host);
    expect(one.diagnostics.map((d) => d.code)).toEqual(['sample-file-invalid']);
    expect(one.diagnostics[0]!.message).toContain('at least 2 values');
  });
});
