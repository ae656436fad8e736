// A quantity under the cursor, said again in other units: "125 MHz = 125 000 000 Hz, period 8 ns".
// Parsing is the schema's own (parseQuantity), so the hover never disagrees with the checker.

import { div, mul, rat, toNumber, type Rational } from '../../../shared-schema/src/rational';
import { parseQuantity, type QuantityKind } from '../../../shared-schema/src/quantity';
import type { Hardware } from '../planning/types';
import { exactOrRounded, formatBytes, formatHz, formatSeconds } from '../cli/units';

/** Thousands grouped with thin spaces, as engineers print long numbers. */
function grouped(decimal: string): string {
  const [whole, frac] = decimal.replace(/^≈/, '').split('.');
  const sign = whole.startsWith('-') ? '-' : '';
  const digits = whole.replace('-', '').replace(/\B(?=(\d{3})+(?!\d))/g, '\u2009');
  return `${decimal.startsWith('≈') ? '≈' : ''}${sign}${digits}${frac ? `.${frac}` : ''}`;
}

const exactText = (r: Rational): string => grouped(exactOrRounded(r));

function frequencyViews(hz: Rational): string[] {
  const views = [`${exactText(hz)} Hz`, formatHz(hz)];
  if (hz.num > 0n) views.push(`${formatSeconds(toNumber(div(rat(1), hz)))} period`);
  return views;
}

function toleranceViews(value: Rational, base: string, toleranceHz: Rational | undefined): string[] {
  if (base !== 'ratio') return [`${exactText(value)} Hz`];
  const views = [
    `${exactText(mul(value, rat(1_000_000)))} ppm`,
    `${exactText(mul(value, rat(100)))} %`,
    `${exactText(mul(value, rat(1_000_000_000)))} ppb`,
  ];
  if (toleranceHz) views.push(`± ${formatHz(toleranceHz)} at this output's frequency`);
  return views;
}

function voltageViews(volts: Rational, dac: Hardware['dac'] | undefined, peakToPeak: boolean): string[] {
  const v = toNumber(volts);
  const views = [`${exactText(volts)} ${peakToPeak ? 'Vpp' : 'V'}`, `${exactText(mul(volts, rat(1000)))} ${peakToPeak ? 'mVpp' : 'mV'}`];
  if (peakToPeak) views.push(`${Number((v / 2).toPrecision(6))} V peak`, `${Number((v / (2 * Math.SQRT2)).toPrecision(4))} V rms for a sine`);
  if (dac && dac.fullScaleV > 0) {
    const lsb = dac.fullScaleV / 2 ** dac.bits;
    views.push(`${Number((v / lsb).toPrecision(6))} LSB of the ${dac.bits}-bit DAC (1 LSB = ${Number((lsb * 1000).toPrecision(4))} mV)`);
  }
  return views;
}

export interface QuantityContext {
  hardware: Hardware | null;
  /** The output's tolerance in Hz, when the cursor is on an output's `tolerance`. */
  toleranceHz?: Rational;
}

/** Other units for a quantity's source text; undefined when the text does not parse. */
export function quantityViews(kind: QuantityKind, source: string, context: QuantityContext): string[] | undefined {
  const parsed = parseQuantity(kind, source.replace(/^['"]|['"]$/g, ''));
  if (!parsed.ok) return undefined;
  const { value, base } = parsed;
  const dac = context.hardware?.dac;
  switch (kind) {
    case 'frequency':
      return frequencyViews(value);
    case 'tolerance':
      return toleranceViews(value, base, context.toleranceHz);
    case 'bytes': {
      const bytes = toNumber(value);
      const views = [`${exactText(value)} B`, formatBytes(bytes)];
      if (dac && dac.sampleBytes > 0) views.push(`${Math.floor(bytes / dac.sampleBytes)} samples of ${dac.sampleBytes} B`);
      return views;
    }
    case 'voltage':
      return voltageViews(value, dac, false);
    case 'voltage-pp':
      return voltageViews(value, dac, true);
    case 'duty':
      return [`${exactText(mul(value, rat(100)))} %`, `${exactText(value)} of each cycle`];
    default:
      return [exactText(value)];
  }
}
