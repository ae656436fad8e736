// The golden files of the demo checked by something other than regenerating them: every plan in
// test/cli/golden/examples.json is recomputed from the demo's YAML (read by the `yaml` package)
// with fraction.js as the exact oracle — f_s = f_sys/D, f_out = f_sys·M/(D·N), error, bytes
// (docs/DESIGN.md "Quantities"; derived) and the jitter closed forms (docs/DESIGN.md "Divider
// jitter"; derived) — every plan keeps the clock file's limits, the outputs that miss their target
// are proved nearest by exhaustive search over their small domains, and the exported header
// (test/export/golden/bench-rig/bench_rig.h) holds the same registers.

import * as fs from 'node:fs';
import * as path from 'node:path';
import Fraction from 'fraction.js';
import { parse } from 'yaml';
import { describe, expect, it } from 'vitest';
import { ROOT } from '../support/cli';

const json = JSON.parse(fs.readFileSync(path.join(ROOT, 'test/cli/golden/examples.json'), 'utf8'));
const header = fs.readFileSync(path.join(ROOT, 'test/export/golden/bench-rig/bench_rig.h'), 'utf8');
const wave = parse(fs.readFileSync(path.join(ROOT, 'examples/bench-rig.wave.yaml'), 'utf8'));
const clock = parse(fs.readFileSync(path.join(ROOT, 'examples/bench-rig.clock.yaml'), 'utf8'));

const PREFIX: Record<string, string> = { G: '1000000000', M: '1000000', k: '1000', '': '1', m: '0.001' };
/** "184.32 MHz" → exact hertz; decimal text read as decimal (SI Brochure prefixes). */
function hertz(text: string): Fraction {
  const m = /^\s*(\d+(?:\.\d+)?)\s*(G|M|k|m|)Hz\s*$/.exec(text);
  if (!m) throw new Error(`not a frequency: ${text}`);
  return new Fraction(m[1]!).mul(new Fraction(PREFIX[m[2]!]!));
}
/** Tolerance in Hz of a target: "10 ppm", "1 ppb"; 50 ppm when not given (the documented default). */
function toleranceHz(text: string | undefined, target: Fraction): Fraction {
  const m = /^\s*(\d+(?:\.\d+)?)\s*(ppm|ppb)\s*$/.exec(text ?? '50 ppm');
  if (!m) throw new Error(`tolerance not read here: ${text}`);
  return target.mul(new Fraction(m[1]!)).div(m[2] === 'ppm' ? 1e6 : 1e9);
}
const sizeBytes = (text: string): number => {
  const m = /^\s*(\d+)\s*(KiB|B)\s*$/.exec(text)!;
  return Number(m[1]) * (m[2] === 'KiB' ? 1024 : 1);
};
/** The documented S floors by shape (README file reference: sine 8, square 16, triangle 32, sawtooth 32). */
const S_FLOOR: Record<string, number> = { sine: 8, square: 16, triangle: 32, sawtooth: 32 };

const fSys = hertz(clock['system-clock']);
const k = Number(clock.divider['fraction-bits'] ?? 0);
const fsMax = hertz(clock.dac['max-sample-rate']);
const nMin = Number(clock.memory['table-length'].min);
const nMax = Number(clock.memory['table-length'].max);
const sampleBytes = Number(clock.dac['sample-bytes']);
const waveFile = json.files.find((f: { path: string }) => f.path.endsWith('.wave.yaml'));
const outputs: { name: string; verdict: string; plan: Plan | null; nearestJitterFree: Plan | null }[] = waveFile.outputs;

interface Plan {
  dividerInteger: number;
  dividerFraction: number;
  fractionBits: number;
  tableLength: number;
  cycles: number;
  sampleRateHzExact: string;
  achievedHzExact: string;
  errorHzExact: string;
  errorPpm: number;
  jitterFree: boolean;
  samplePeriodJitterRmsS: number;
  samplePeriodJitterPkPkS: number;
  tieRmsS: number;
  tiePkPkS: number;
  tableBytes: number;
}

const dividerOf = (p: Plan): Fraction => new Fraction(p.dividerInteger).add(new Fraction(p.dividerFraction, 2 ** p.fractionBits));

describe('the golden plans recomputed from the demo YAML (fraction.js)', () => {
  it('the golden file covers every output of the demo, in order', () => {
    expect(outputs.map((o) => o.name)).toEqual(Object.keys(wave.outputs));
  });

  for (const o of outputs) {
    const spec = wave.outputs[o.name];
    const target = hertz(spec.frequency);
    const plans = [o.plan, o.nearestJitterFree].filter((p): p is Plan => p !== null);
    it(`${o.name}: exact figures, limits and jitter`, () => {
      expect(plans.length).toBeGreaterThan(0);
      for (const p of plans) {
        const d = dividerOf(p);
        expect(p.fractionBits).toBe(k);
        expect(p.dividerFraction).toBeLessThan(2 ** k);
        expect(p.dividerInteger).toBeGreaterThanOrEqual(Number(clock.divider.integer.min));
        expect(p.dividerInteger).toBeLessThanOrEqual(Number(clock.divider.integer.max));
        const fS = fSys.div(d);
        const fOut = fS.mul(p.cycles).div(p.tableLength);
        expect(new Fraction(p.sampleRateHzExact).equals(fS)).toBe(true);
        expect(new Fraction(p.achievedHzExact).equals(fOut)).toBe(true);
        expect(new Fraction(p.errorHzExact).equals(fOut.sub(target))).toBe(true);
        expect(p.errorPpm).toBeCloseTo(fOut.sub(target).div(target).mul(1e6).valueOf(), 9);
        expect(p.tableBytes).toBe(p.tableLength * sampleBytes);
        expect(p.tableLength).toBeGreaterThanOrEqual(nMin);
        expect(p.tableLength).toBeLessThanOrEqual(nMax);
        expect(fS.compare(fsMax)).toBeLessThanOrEqual(0);
        if (!spec.plan) expect(p.tableLength / p.cycles).toBeGreaterThanOrEqual(spec['min-samples-per-cycle'] ?? S_FLOOR[spec.shape]!);
        // First-order accumulator (docs/DESIGN.md "Divider jitter"; derived).
        const tSys = 1 / fSys.valueOf();
        const F = p.dividerFraction;
        const L = F === 0 ? 1 : 2 ** k / gcd(F, 2 ** k);
        const share = F / 2 ** k;
        expect(p.jitterFree).toBe(F === 0);
        expect(p.samplePeriodJitterPkPkS).toBeCloseTo(F === 0 ? 0 : tSys, 18);
        expect(p.samplePeriodJitterRmsS).toBeCloseTo(tSys * Math.sqrt(share * (1 - share)), 18);
        expect(p.tiePkPkS).toBeCloseTo((tSys * (L - 1)) / L, 18);
        expect(p.tieRmsS).toBeCloseTo((tSys * Math.sqrt(L * L - 1)) / (L * Math.sqrt(12)), 18);
      }
      if (spec.plan) {
        expect(o.verdict).toBe('pinned');
        expect(dividerOf(o.plan!).equals(new Fraction(String(spec.plan.divider)))).toBe(true);
        expect([o.plan!.tableLength, o.plan!.cycles]).toEqual([spec.plan['table-length'], spec.plan.cycles]);
      }
    });

    it(`${o.name}: the verdict follows from the error and the tolerance`, () => {
      const tol = toleranceHz(spec.tolerance, target);
      const within = (p: Plan | null): boolean => p !== null && new Fraction(p.errorHzExact).abs().compare(tol) <= 0;
      const expected = spec.plan
        ? 'pinned'
        : within(o.nearestJitterFree)
          ? new Fraction(o.nearestJitterFree!.errorHzExact).equals(0) ? 'exact' : 'within-tolerance'
          : spec.jitter === 'allow' && within(o.plan) ? 'fractional' : 'out-of-tolerance';
      expect(o.verdict).toBe(expected);
    });
  }

  it('the memory line is the sum of the tables against the budget', () => {
    const used = outputs.reduce((a, o) => a + (o.plan?.tableBytes ?? 0), 0);
    expect(used).toBeLessThanOrEqual(sizeBytes(clock.memory.budget));
    expect(fs.readFileSync(path.join(ROOT, 'test/cli/golden/examples.txt'), 'utf8')).toContain(`tables ${used} B of ${clock.memory.budget}`);
  });

  it('the demo keeps its promise: exactly one error and at least two warnings', () => {
    expect(json.summary).toMatchObject({ errors: 1 });
    expect(json.summary.warnings).toBeGreaterThanOrEqual(2);
  });
});

function gcd(a: number, b: number): number {
  while (b) [a, b] = [b, a % b];
  return a;
}

/**
 * Smallest |f_out − f_target| over every divider step J/2^s (s = 0 jitter-free, s = k fractional),
 * table length N and cycle count M the clock admits with S ≥ floor: doubles to shortlist, exact to decide.
 */
function exhaustiveBest(target: Fraction, floor: number, fractional: boolean): Fraction {
  const scale = fractional ? 2 ** k : 1;
  const c = fSys.mul(scale).valueOf();
  const t = target.valueOf();
  const jMin = Math.max(Number(clock.divider.integer.min) * scale, Math.ceil(c / fsMax.valueOf()));
  const jMax = Math.floor(c / (floor * t * (1 - 1e-6)));
  const shortlist: [number, number, number][] = [];
  let best = Infinity;
  for (let j = jMin; j <= jMax; j++) {
    for (let n = nMin; n <= nMax; n++) {
      const x = (t * j * n) / c;
      for (const m of [Math.floor(x), Math.ceil(x)]) {
        if (m < 1 || n / m < floor) continue;
        const err = Math.abs((c * m) / (j * n) - t);
        if (err < best * (1 + 1e-6)) {
          if (err < best) best = err;
          shortlist.push([j, n, m]);
        }
      }
    }
  }
  let exact: Fraction | null = null;
  for (const [j, n, m] of shortlist) {
    if (Math.abs((c * m) / (j * n) - t) > best * (1 + 1e-6)) continue;
    const e = fSys.mul(scale).mul(m).div(j * n).sub(target).abs();
    if (exact === null || e.compare(exact) < 0) exact = e;
  }
  return exact!;
}

describe('outputs that miss their target are the nearest the clock allows (exhaustive search)', () => {
  const missed = outputs.filter((o) => !wave.outputs[o.name].plan && o.nearestJitterFree && !new Fraction(o.nearestJitterFree.errorHzExact).equals(0));
  it('there are such outputs (within tolerance, out of tolerance, fractional)', () => {
    expect(missed.map((o) => o.verdict)).toEqual(expect.arrayContaining(['within-tolerance', 'out-of-tolerance', 'fractional']));
  });
  for (const o of missed) {
    const spec = wave.outputs[o.name];
    const floor = Number(spec['min-samples-per-cycle'] ?? S_FLOOR[spec.shape]);
    it(`${o.name}: nearest jitter-free error = the exhaustive minimum`, () => {
      const best = exhaustiveBest(hertz(spec.frequency), floor, false);
      expect(new Fraction(o.nearestJitterFree!.errorHzExact).abs().equals(best)).toBe(true);
    });
    if (o.verdict === 'fractional') {
      it(`${o.name}: fractional plan error = the exhaustive minimum on steps of 1/2^k`, () => {
        const best = exhaustiveBest(hertz(spec.frequency), floor, true);
        expect(new Fraction(o.plan!.errorHzExact).abs().equals(best)).toBe(true);
      });
    }
  }
});

describe('the exported header holds the golden plans', () => {
  const define = (name: string): string => {
    const m = new RegExp(`^#define BENCH_RIG_${name}\\s+(\\S+)`, 'm').exec(header);
    if (!m) throw new Error(`no #define BENCH_RIG_${name}`);
    return m[1]!;
  };
  for (const o of outputs.filter((x) => x.plan !== null)) {
    it(`${o.name}: divider, table and cycles; raw divider I·2^k + F; frequency f_sys·M/(D·N)`, () => {
      const id = o.name.toUpperCase().replace(/-/g, '_');
      const p = o.plan!;
      const u = (s: string): number => Number(s.replace(/u$/, ''));
      expect(u(define(`${id}_DIVIDER_INT`))).toBe(p.dividerInteger);
      expect(u(define(`${id}_DIVIDER_FRAC`))).toBe(p.dividerFraction);
      expect(u(define(`${id}_DIVIDER_RAW`))).toBe(p.dividerInteger * 2 ** k + p.dividerFraction);
      expect(u(define(`${id}_TABLE_LENGTH`))).toBe(p.tableLength);
      expect(u(define(`${id}_CYCLES`))).toBe(p.cycles);
      const fOut = fSys.mul(p.cycles).div(dividerOf(p).mul(p.tableLength)).valueOf();
      expect(Number(define(`${id}_FREQUENCY_HZ`)) / fOut).toBeCloseTo(1, 12);
    });
  }
  it('the system clock constant is the clock file\'s', () => {
    expect(Number(define('SYSTEM_CLOCK_HZ'))).toBe(fSys.valueOf());
  });
});
