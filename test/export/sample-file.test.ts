// An output whose table comes from a sample file, exported to C and built like every export
// (C99, warnings as errors): the compiled table holds the file's cycle sample for sample, scaled
// to the codes (derived: a linear map of the values onto the codes, within 1 LSB), and the
// banner's sha256 covers the sample file (node:crypto recomputes it).

import { createHash } from 'node:crypto';
import * as fs from 'node:fs';
import * as path from 'node:path';
import { beforeAll, describe, expect, it } from 'vitest';
import { compile, FIXTURES, requireTool, run, runBinary, scratch, STRICT } from './support';

const CLOCK = fs.readFileSync(path.join(FIXTURES, 'tone-lab.clock.yaml'), 'utf8');
// 96 MHz / 16 = 6 MHz, 64 samples of one cycle: 93.75 kHz exactly.
const SPEC = 'clock: ./tone-lab.clock.yaml\noutputs:\n  pulse:\n    shape: sine\n    frequency: 93.75 kHz\n    amplitude: 2 Vpp\n    offset: 1.25 V\n    sample-file: ./pulse.csv\n';
// A cycle of our own: a narrow pulse on a slow sine, as time,value columns with CRLF line ends.
const VALUES = Array.from({ length: 64 }, (_, i) => 0.4 * Math.sin((2 * Math.PI * i) / 64) + (i >= 10 && i < 14 ? 1 : 0));
const CSV = `time,value\r\n${VALUES.map((v, i) => `${(i / 6e6).toExponential(6)},${v.toFixed(9)}`).join('\r\n')}\r\n`;

let dir = '';
let out = '';
let prefix = '';
let header = '';

beforeAll(async () => {
  requireTool('gcc');
  dir = scratch('samples-export');
  fs.writeFileSync(path.join(dir, 'tone-lab.clock.yaml'), CLOCK);
  fs.writeFileSync(path.join(dir, 'pulse-lab.wave.yaml'), SPEC);
  fs.writeFileSync(path.join(dir, 'pulse.csv'), CSV);
  out = path.join(dir, 'out');
  const r = await run('export', [path.join(dir, 'pulse-lab.wave.yaml'), '--c', out], dir);
  expect(r.code, r.stderr).toBe(0);
  const h = fs.readdirSync(out).find((f) => f.endsWith('.h'))!;
  prefix = h.slice(0, -2);
  header = fs.readFileSync(path.join(out, h), 'utf8');
});

describe('export of a sample-file output', () => {
  it('compiles as C99 with -Wall -Wextra -Werror -pedantic and its table is the file, scaled to the codes', () => {
    fs.writeFileSync(
      path.join(out, 'dump.c'),
      `#include <stdio.h>\n#include "${prefix}.h"\n#define DUMP(lower, UPPER) { unsigned i; for (i = 0; i < UPPER##_TABLE_LENGTH; i++) printf("%u\\n", (unsigned)lower##_table[i]); }\nint main(void) { ${prefix.toUpperCase()}_OUTPUTS(DUMP) return 0; }\n`,
    );
    const c = compile('gcc', ['-std=c99', ...STRICT, `${prefix}.c`, 'dump.c', '-o', 'dump'], out);
    expect(c.output).toBe('');
    expect(c.ok).toBe(true);
    const codes = runBinary(path.join(out, 'dump')).trim().split('\n').map(Number);
    expect(codes).toHaveLength(64);
    // 2 Vpp around 1.25 V on 2.5 V full scale, 12 bits: 0.25 V … 2.25 V is codes 409.6 … 3686.4.
    const [clo, chi] = [Math.min(...codes), Math.max(...codes)];
    expect(Math.abs(clo - 409.6)).toBeLessThanOrEqual(1);
    expect(Math.abs(chi - 3686.4)).toBeLessThanOrEqual(1);
    const [vlo, vhi] = [Math.min(...VALUES), Math.max(...VALUES)];
    for (let i = 0; i < 64; i++) expect(Math.abs(codes[i]! - (409.6 + ((VALUES[i]! - vlo) / (vhi - vlo)) * (3686.4 - 409.6))), `sample ${i}`).toBeLessThanOrEqual(1);
  });

  it('the banner sha256 covers the spec, the clock and the sample file', () => {
    const lf = (t: string) => t.replace(/\r\n?/g, '\n');
    const sampleHash = createHash('sha256').update(CSV, 'utf8').digest('hex');
    const expected = createHash('sha256').update(lf(SPEC)).update('\0').update(lf(CLOCK)).update(`\0${sampleHash}`).digest('hex');
    expect(header).toContain(`sha256: ${expected}`);
    expect(header).toContain('for each of the 1 sample file read');
    // The path as the spec writes it is not copied into the generated text.
    expect(header).not.toContain('pulse.csv');
  });

  it('a changed sample file changes the exported table and the hash', async () => {
    fs.writeFileSync(path.join(dir, 'pulse.csv'), VALUES.map((v, i) => String(i >= 40 && i < 44 ? v + 1 : v)).join('\n'));
    const again = path.join(dir, 'again');
    const r = await run('export', [path.join(dir, 'pulse-lab.wave.yaml'), '--c', again], dir);
    expect(r.code, r.stderr).toBe(0);
    const second = fs.readFileSync(path.join(again, `${prefix}.h`), 'utf8');
    expect(second.match(/sha256: (\w+)/)![1]).not.toBe(header.match(/sha256: (\w+)/)![1]);
    expect(fs.readFileSync(path.join(again, `${prefix}.c`), 'utf8')).not.toBe(fs.readFileSync(path.join(out, `${prefix}.c`), 'utf8'));
  });
});
