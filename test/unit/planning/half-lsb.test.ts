// Table codes at exact half-LSB values. The rule (docs/DESIGN.md, "Unit waveforms"): the code
// nearest to x = volts / LSB, and exactly half-way takes the upper code, floor(x + 1/2). Doubles
// cannot hold most half-way voltages (0.0100975341796875 V on a 0.101 V, 12-bit DAC is exactly
// 409.5 LSB; in doubles it comes out as 409.49999999999994), so the decision must be exact.
// Oracles: fraction.js (exact rationals) for every rational sample, mathjs BigNumber (64
// significant digits) for sines between them; both general-purpose libraries.

import Fraction from 'fraction.js';
import { all, create } from 'mathjs';
import { describe, expect, it } from 'vitest';
import { buildTable, tableWaveform } from '../../../server/src/planning/table';
import type { Hardware, Shape, Waveform } from '../../../server/src/planning/types';
import { analyze } from '../../../server/src/spec/analyze';
import { rat, type Rational } from '../../../shared-schema/src/rational';
import { seededRandom } from '../../support/seeded';

const big = create(all, { number: 'BigNumber', precision: 64 });

const dacOf = (bits: number, fullScale: string): Hardware['dac'] => ({ bits, sampleBytes: 4, fullScaleV: Number(fullScale), maxSampleRateHz: rat(1n) });

/** A waveform given exactly, as the spec layer gives it. */
function waveform(shape: Shape, amplitude: Fraction, offset: Fraction, duty = 0.5): Waveform {
  const r = (f: Fraction): Rational => rat(BigInt(f.s) * BigInt(f.n), BigInt(f.d));
  return { shape, duty, amplitudeVpp: amplitude.valueOf(), offsetV: offset.valueOf(), exact: { amplitudeVpp: r(amplitude), offsetV: r(offset) } };
}

/** floor(x + 1/2) of an exact fraction (the rule, computed by the oracle). */
const roundHalfUp = (x: Fraction): number => Number(x.add(new Fraction(1, 2)).floor().valueOf());

describe('constant levels on every half-LSB point (exhaustive on 8, 10 and 12 bits)', () => {
  it.each(['0.101', '1.8', '3.3', '2.5', '1.2', '5', '0.9', '2.048'])('full scale %s V: (k + 1/2) LSB becomes code k + 1 for every k', (fullScale) => {
    let checked = 0;
    for (const bits of [8, 10, 12]) {
      const lsb = new Fraction(fullScale).div(2 ** bits);
      const dac = dacOf(bits, fullScale);
      for (let k = 0; k < 2 ** bits - 1; k++) {
        const table = buildTable(waveform('sine', new Fraction(0), lsb.mul(k + 0.5)), dac, 1, rat(1n), 'open');
        if (table[0] !== k + 1) throw new Error(`${bits}-bit, ${fullScale} V: ${k}.5 LSB gave ${table[0]}`);
        checked++;
      }
    }
    expect(checked).toBe(255 + 1023 + 4095);
  });

  it('the example: 0.0100975341796875 V on a 0.101 V 12-bit DAC (409.5 LSB, derived) is code 410, through the spec layer', () => {
    const clock = [
      'system-clock: 96 MHz',
      'divider: { integer: { min: 2, max: 4095 } }',
      'dac: { bits: 12, sample-bytes: 2, full-scale: 0.101 V, max-sample-rate: 12 MHz }',
      'memory: { budget: 32 KiB, table-length: { min: 16, max: 4096 } }',
      '',
    ].join('\n');
    const wave = 'clock: ./x.clock.yaml\noutputs:\n  level:\n    shape: square\n    frequency: 93.75 kHz\n    amplitude: 0 Vpp\n    offset: 0.0100975341796875 V\n';
    const a = analyze('/virtual/x.wave.yaml', wave, { readFile: (p) => (p === '/virtual/x.clock.yaml' ? clock : undefined) });
    expect(a.diagnostics.filter((d) => d.severity === 'error')).toEqual([]);
    const o = a.outputs[0];
    const table = buildTable(o.request.waveform, a.hardware!.dac, o.planning.plan!.tableLength, o.planning.plan!.cycles, 'open');
    expect(new Set(table)).toEqual(new Set([410]));
    // The doubles alone would have said 409 (the defect this guards against).
    expect(Math.round(0.0100975341796875 / (0.101 / 4096))).toBe(409);
  });
});

describe('whole tables against the exact oracle', () => {
  it('square, triangle and sawtooth: every sample of 600 seeded tables whose levels land on halves', () => {
    const rnd = seededRandom(4099);
    let halves = 0;
    for (let t = 0; t < 600; t++) {
      const shape = (['square', 'triangle', 'sawtooth'] as const)[t % 3];
      const bits = 6 + Math.floor(rnd() * 7);
      const fullScale = ['3.3', '1.8', '0.101', '2.5'][Math.floor(rnd() * 4)];
      const lsb = new Fraction(fullScale).div(2 ** bits);
      // Amplitude and offset in quarter LSBs, so many samples fall exactly half-way.
      const amplitude = lsb.mul(Math.floor(rnd() * 4 * 2 ** bits)).div(4);
      const offset = lsb.mul(Math.floor(rnd() * 4 * 2 ** bits)).div(4);
      const n = 4 * (1 + Math.floor(rnd() * 32));
      const m = 1 + Math.floor(rnd() * 3);
      const duty = [0.25, 0.5, 0.75][Math.floor(rnd() * 3)];
      const wave = waveform(shape, amplitude, offset, duty);
      const table = buildTable(wave, dacOf(bits, fullScale), n, rat(BigInt(m)), 'open');
      // Which samples of a square are high is the duty rule's business (duty.ts, tested there):
      // the oracle takes the level the table plays and checks only the rounding.
      const playedDuty = tableWaveform(wave, n, rat(BigInt(m)), 'open').duty;
      for (let i = 0; i < n; i++) {
        const phase = new Fraction((m * i) % n, n);
        const w =
          shape === 'square'
            ? new Fraction(phase.valueOf() < playedDuty ? 1 : -1)
            : shape === 'triangle'
              ? phase.compare(new Fraction(1, 2)) < 0
                ? phase.mul(4).sub(1)
                : new Fraction(3).sub(phase.mul(4))
              : phase.mul(2).sub(1);
        const x = offset.add(amplitude.div(2).mul(w)).div(lsb);
        if (x.sub(x.floor()).equals(new Fraction(1, 2))) halves++;
        const expected = Math.min(Math.max(roundHalfUp(x), 0), 2 ** bits - 1);
        if (table[i] !== expected) throw new Error(`${shape} ${bits}-bit ${fullScale} V, sample ${i}: ${table[i]}, expected ${expected}`);
      }
    }
    expect(halves).toBeGreaterThan(1000);
  });

  it('sine: exact halves at the phases where sin 2πφ is ±1/2 (Niven), and 64-digit sines elsewhere', () => {
    // 12 samples of one cycle: phases j/12. Offset 100 LSB, amplitude 2 LSB: at j = 1, 5 the
    // value is 100.5 LSB (code 101), at j = 7, 11 it is 99.5 LSB (code 100) — derived.
    const fullScale = '3.3';
    const lsb = new Fraction(fullScale).div(4096);
    const dac = dacOf(12, fullScale);
    const twelve = buildTable(waveform('sine', lsb.mul(2), lsb.mul(100)), dac, 12, rat(1n), 'open');
    expect([twelve[1], twelve[5], twelve[7], twelve[11]]).toEqual([101, 101, 100, 100]);

    // Random sines whose values come close to halves: compare with mathjs at 64 digits.
    const rnd = seededRandom(77);
    let samples = 0;
    for (let t = 0; t < 40; t++) {
      const n = 8 + Math.floor(rnd() * 48);
      const m = 1 + Math.floor(rnd() * 5);
      const amplitude = lsb.mul(Math.floor(rnd() * 8000)).div(4);
      const offset = lsb.mul(2048 * 4 + Math.floor(rnd() * 8) - 4).div(4);
      const table = buildTable(waveform('sine', amplitude, offset), dac, n, rat(BigInt(m)), 'open');
      for (let i = 0; i < n; i++) {
        const phase = big.divide(big.bignumber((m * i) % n), big.bignumber(n));
        const s = big.sin(big.multiply(big.multiply(big.bignumber(2), big.pi), phase) as never);
        const x = big.add(big.bignumber(offset.div(lsb).toString()), big.multiply(big.bignumber(amplitude.div(lsb).div(2).toString()), s));
        const expected = Math.min(Math.max(Number(big.floor(big.add(x, 0.5) as never)), 0), 4095);
        if (table[i] !== expected) throw new Error(`sine n=${n} m=${m} sample ${i}: ${table[i]}, expected ${expected} (x = ${x})`);
        samples++;
      }
    }
    expect(samples).toBeGreaterThan(500);
  });
});
