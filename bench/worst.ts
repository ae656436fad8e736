// The worst cases found for planning time, each timed through analyze() as the checker runs it:
//   - a 499-output wave spec (~34 KB) on a clock with a 32-bit divider, 16 fraction bits and
//     64 Mi-sample tables (every output a different low target);
//   - one square, one triangle, one sawtooth on that clock (whole samples per cycle);
//   - an exact target on a 2^32 divider (the search should end at once, proven).
// Run: npx tsx bench/worst.ts   (each case once: they are long; compare within one run)

import * as fs from 'node:fs';
import * as os from 'node:os';
import * as path from 'node:path';
import { analyze } from '../server/src/spec/analyze';
import { planningCache } from '../server/src/planning/choose';

const dir = fs.mkdtempSync(path.join(os.tmpdir(), 'waveplan-worst-'));
const clock = `# An invented absurd board: a 32-bit divider with 16 fraction bits and 64 Mi-sample tables.
system-clock: 3999999999 Hz
divider:
  integer: { min: 1, max: 4294967296 }
  fraction-bits: 16
dac:
  bits: 24
  sample-bytes: 4
  full-scale: 3.3 V
  max-sample-rate: 4 GHz
memory:
  budget: 1024 MiB
  table-length: { min: 1, max: 67108864 }
`;
fs.writeFileSync(path.join(dir, 'big.clock.yaml'), clock);
const host = { readFile: (p: string) => (fs.existsSync(p) ? fs.readFileSync(p, 'utf8') : undefined) };

function spec(outputs: string[]): string {
  return `clock: ./big.clock.yaml\noutputs:\n${outputs.join('')}`;
}
const output = (name: string, shape: string, hz: string, extra = ''): string => `  ${name}:\n    shape: ${shape}\n    frequency: ${hz}\n${extra}`;

const ONLY = process.env.ONLY;
const cases: [string, string][] = [];
const many: string[] = [];
const COUNT = Number(process.env.COUNT ?? 499);
for (let i = 0; i < COUNT; i++) many.push(output(`tone-${i}`, 'sine', `${(0.001 + i * 0.0137).toFixed(7)} Hz`, i % 2 ? '    jitter: allow\n' : ''));
cases.push([`${COUNT} sines at low targets`, spec(many)]);
// Targets with more digits than the clock resolves exactly: every search runs to its limit.
const awkward: string[] = [];
for (let i = 0; i < COUNT; i++) awkward.push(output(`odd-${i}`, 'sine', `${(0.0012345678901 * (1 + i / 7)).toPrecision(14)} Hz`, '    tolerance: 0.000001 ppm\n'));
cases.push([`${COUNT} sines at awkward low targets`, spec(awkward)]);
for (const shape of ['square', 'triangle', 'sawtooth']) cases.push([`one ${shape} at 1.2345 Hz`, spec([output('x', shape, '1.2345 Hz')])]);
cases.push(['an exact target on the 2^32 divider', spec([output('x', 'sine', '1 Hz', '    tolerance: 0 ppm\n')])]);

for (const [label, text] of cases.filter(([l]) => !ONLY || l.includes(ONLY))) {
  planningCache.clear();
  const file = path.join(dir, 'case.wave.yaml');
  const t0 = performance.now();
  const a = analyze(file, text, host);
  const ms = performance.now() - t0;
  const limited = a.diagnostics.filter((d) => d.code === 'search-limit').length;
  const errors = a.diagnostics.filter((d) => d.severity === 'error').length;
  console.log(`${label.padEnd(40)} ${(ms / 1000).toFixed(2)} s  (${(text.length / 1024).toFixed(1)} KB, ${a.outputs.length} outputs planned, ${limited} search-limit, ${errors} errors)`);
}
fs.rmSync(dir, { recursive: true, force: true });
