// Quantities as engineers write them ("125 MHz", "50 ppm", "64 KiB", "2 Vpp") parsed exactly from
// their decimal text into Rationals in base units. Units are case-exact: MHz and mHz differ.

import { type Rational, abs, cmp, mul, parseDecimal, rat, isInteger } from './rational';
import { didYouMean } from './did-you-mean';

export type QuantityKind =
  | 'frequency'
  | 'tolerance'
  | 'bytes'
  | 'voltage'
  | 'voltage-pp'
  | 'duty'
  | 'number'
  | 'decibel'
  | 'resistance'
  | 'capacitance'
  | 'slew-rate';

/** What a parsed value is measured in: hertz, bytes, volts, volts peak-to-peak, a pure ratio. */
export type BaseUnit = 'Hz' | 'B' | 'V' | 'Vpp' | 'ratio' | 'dB' | 'ohm' | 'F' | 'V/s' | '';

interface UnitDef {
  unit: string;
  scale: Rational;
  base: BaseUnit;
}

interface KindDef {
  /** Read by people in messages: "a frequency". */
  what: string;
  units: UnitDef[];
  /** What a bare number means; null when a unit is required. */
  plain: BaseUnit | null;
  /** Whole numbers only (bytes). */
  whole?: boolean;
}

const u = (unit: string, num: bigint, den: bigint, base: BaseUnit): UnitDef => ({ unit, scale: rat(num, den), base });

const FREQUENCY_UNITS: UnitDef[] = [
  u('Hz', 1n, 1n, 'Hz'),
  u('mHz', 1n, 1000n, 'Hz'),
  u('kHz', 1000n, 1n, 'Hz'),
  u('MHz', 1_000_000n, 1n, 'Hz'),
  u('GHz', 1_000_000_000n, 1n, 'Hz'),
];

const KINDS: Record<QuantityKind, KindDef> = {
  frequency: { what: 'a frequency', units: FREQUENCY_UNITS, plain: 'Hz' },
  tolerance: {
    what: 'a tolerance',
    units: [u('ppm', 1n, 1_000_000n, 'ratio'), u('ppb', 1n, 1_000_000_000n, 'ratio'), u('%', 1n, 100n, 'ratio'), ...FREQUENCY_UNITS],
    plain: null,
  },
  bytes: {
    what: 'a size in bytes',
    units: [u('B', 1n, 1n, 'B'), u('kB', 1000n, 1n, 'B'), u('KiB', 1024n, 1n, 'B'), u('MB', 1_000_000n, 1n, 'B'), u('MiB', 1_048_576n, 1n, 'B')],
    plain: 'B',
    whole: true,
  },
  voltage: { what: 'a voltage', units: [u('V', 1n, 1n, 'V'), u('mV', 1n, 1000n, 'V')], plain: 'V' },
  'voltage-pp': { what: 'a peak-to-peak voltage', units: [u('Vpp', 1n, 1n, 'Vpp'), u('mVpp', 1n, 1000n, 'Vpp')], plain: 'Vpp' },
  duty: { what: 'a duty cycle', units: [u('%', 1n, 100n, 'ratio')], plain: 'ratio' },
  number: { what: 'a number', units: [], plain: '' },
  decibel: { what: 'a level in decibels', units: [u('dB', 1n, 1n, 'dB')], plain: 'dB' },
  resistance: {
    what: 'a resistance',
    units: [u('Ω', 1n, 1n, 'ohm'), u('kΩ', 1000n, 1n, 'ohm'), u('MΩ', 1_000_000n, 1n, 'ohm'), u('\u2126', 1n, 1n, 'ohm'), u('k\u2126', 1000n, 1n, 'ohm'), u('ohm', 1n, 1n, 'ohm'), u('kohm', 1000n, 1n, 'ohm'), u('Mohm', 1_000_000n, 1n, 'ohm')],
    plain: 'ohm',
  },
  capacitance: {
    what: 'a capacitance',
    units: [u('F', 1n, 1n, 'F'), u('mF', 1n, 1000n, 'F'), u('µF', 1n, 1_000_000n, 'F'), u('\u03bcF', 1n, 1_000_000n, 'F'), u('uF', 1n, 1_000_000n, 'F'), u('nF', 1n, 1_000_000_000n, 'F'), u('pF', 1n, 1_000_000_000_000n, 'F')],
    plain: 'F',
  },
  'slew-rate': {
    what: 'a slew rate',
    units: [u('V/µs', 1_000_000n, 1n, 'V/s'), u('V/\u03bcs', 1_000_000n, 1n, 'V/s'), u('V/us', 1_000_000n, 1n, 'V/s'), u('V/ns', 1_000_000_000n, 1n, 'V/s'), u('V/ms', 1000n, 1n, 'V/s'), u('V/s', 1n, 1n, 'V/s')],
    plain: 'V/s',
  },
};

export const QUANTITY_KINDS = Object.keys(KINDS) as QuantityKind[];

/** The units a kind accepts, in the order the docs list them. */
export const unitsOf = (kind: QuantityKind): string[] => KINDS[kind].units.map((d) => d.unit);
/** What a bare number means for this kind, or null when a unit must be written. */
export const plainUnitOf = (kind: QuantityKind): BaseUnit | null => KINDS[kind].plain;
export const describeKind = (kind: QuantityKind): string => KINDS[kind].what;

const ALL_UNITS = [...new Set(Object.values(KINDS).flatMap((k) => k.units.map((d) => d.unit)))];

export type QuantityResult =
  | { ok: true; value: Rational; unit: string; base: BaseUnit }
  | { ok: false; code: 'bad-unit' | 'bad-quantity'; message: string };

/**
 * The smallest frequency any key takes, 1 µHz (a period of about 11.6 days). Below it the
 * figures derived in floating point — the error in ppm, the period, the jitter — stop being
 * meaningful or finite long before the exact rationals would notice.
 */
export const MIN_FREQUENCY_HZ = 1e-6;

/**
 * Whatever a key's own bounds, a non-zero value must lie within this window of magnitudes in
 * base units (hertz, bytes, volts, a ratio, a plain number): every figure derived from it then
 * stays a finite, non-zero double (doubles reach about 1e-308 to 1e308), so no view shows
 * "Infinity", "null" or a division by zero.
 */
export const MAGNITUDE = { min: rat(1n, 10n ** 12n), max: rat(10n ** 15n), text: '1e-12 and 1e15' } as const;

/** Why a value of this kind lies outside MAGNITUDE (completes "… must be …"), or null. */
export function magnitudeProblem(kind: QuantityKind, value: Rational, base: BaseUnit): string | null {
  const size = abs(value);
  if (size.num === 0n || (cmp(size, MAGNITUDE.min) >= 0 && cmp(size, MAGNITUDE.max) <= 0)) return null;
  const unit = base === '' || base === 'ratio' ? '' : ` ${base}`;
  const which = cmp(size, MAGNITUDE.min) < 0 ? 'small' : 'large';
  return `0 or between ${MAGNITUDE.text}${unit} in size (this is too ${which} to compute with), such as \`${quantityExample(kind)}\``;
}

const NUMBER = String.raw`[+-]?(?:\d+(?:\.\d*)?|\.\d+)(?:[eE][+-]?\d+)?`;
const SPLIT = new RegExp(`^(${NUMBER})\\s*(.*)$`, 's');

const escapeRe = (s: string): string => s.replace(/[.*+?^${}()|[\]\\]/g, '\\$&');

/**
 * The text pattern a quoted or plain string of this kind must match. The JSON Schema carries it
 * so that any YAML-aware editor checks units too; the messages come from parseQuantity.
 */
export function quantityPattern(kind: QuantityKind): string {
  const def = KINDS[kind];
  const units = def.units.map((d) => escapeRe(d.unit)).join('|');
  if (units === '') return `^\\s*${NUMBER}\\s*$`;
  const optional = def.plain === null ? '' : '?';
  return `^\\s*${NUMBER}\\s*(?:${units})${optional}\\s*$`;
}

const listUnits = (def: KindDef): string => {
  const names = def.units.map((d) => d.unit);
  return names.length <= 1 ? names.join('') : `${names.slice(0, -1).join(', ')} or ${names[names.length - 1]}`;
};

/** A value of this kind as an engineer writes it, for messages. */
export function quantityExample(kind: QuantityKind): string {
  const examples: Record<QuantityKind, string> = {
    frequency: '125 MHz',
    tolerance: '50 ppm',
    bytes: '64 KiB',
    voltage: '1.65 V',
    'voltage-pp': '2 Vpp',
    duty: '50 %',
    number: '16',
    decibel: '70 dB',
    resistance: '10 kΩ',
    capacitance: '100 µF',
    'slew-rate': '10 V/µs',
  };
  return examples[kind];
}

/** Parses the source text of a quantity exactly; never throws. */
export function parseQuantity(kind: QuantityKind, text: string): QuantityResult {
  const def = KINDS[kind];
  const trimmed = text.trim();
  const m = /^[+-]?0[xXoObB]/.test(trimmed) ? null : SPLIT.exec(trimmed);
  if (!m) {
    return { ok: false, code: 'bad-quantity', message: `\`${clip(trimmed)}\` is not ${def.what}: write a number${def.units.length ? ' and a unit' : ''}, such as \`${quantityExample(kind)}\`.` };
  }
  const number = parseDecimal(m[1]);
  if (!number) {
    return { ok: false, code: 'bad-quantity', message: `\`${clip(m[1])}\` is out of the range of numbers waveplan reads: write it with fewer digits or a smaller exponent.` };
  }
  const unitText = m[2].trim();
  if (unitText === '') {
    if (def.plain === null) {
      return { ok: false, code: 'bad-unit', message: `${capitalise(def.what)} needs a unit: write ${listUnits(def)}, such as \`${quantityExample(kind)}\`.` };
    }
    return finish(kind, def, number, '', def.plain);
  }
  if (!/^[A-Za-z%µ]/.test(unitText)) {
    return { ok: false, code: 'bad-quantity', message: `\`${clip(trimmed)}\` is not ${def.what}: write one number${def.units.length ? ' and a unit' : ''}, such as \`${quantityExample(kind)}\`.` };
  }
  const found = def.units.find((d) => d.unit === unitText);
  if (!found) return { ok: false, code: 'bad-unit', message: unitMessage(kind, def, unitText) };
  return finish(kind, def, mul(number, found.scale), found.unit, found.base);
}

function finish(kind: QuantityKind, def: KindDef, value: Rational, unit: string, base: BaseUnit): QuantityResult {
  if (def.whole && !isInteger(value)) {
    return { ok: false, code: 'bad-quantity', message: `${capitalise(def.what)} must come to a whole number of bytes: round it, such as \`${quantityExample(kind)}\`.` };
  }
  return { ok: true, value, unit, base };
}

function unitMessage(kind: QuantityKind, def: KindDef, unitText: string): string {
  const unit = clip(unitText);
  if (def.units.length === 0) return `Write a plain number here, without the unit \`${unit}\`.`;
  const own = unitsOf(kind);
  const hint = didYouMean(unitText, own);
  if (hint) return `Unknown unit \`${unit}\`${hint} — units are case-sensitive: write ${listUnits(def)}.`;
  if (ALL_UNITS.includes(unitText)) return `\`${unit}\` is not a unit of ${def.what.replace(/^an? /, '')}: write ${listUnits(def)}.`;
  return `Unknown unit \`${unit}\`: write ${listUnits(def)}, such as \`${quantityExample(kind)}\`.`;
}

const capitalise = (s: string): string => s.charAt(0).toUpperCase() + s.slice(1);
const clip = (s: string): string => (s.length > 40 ? `${s.slice(0, 37)}...` : s);

/** Converts a parsed tolerance to hertz at a target frequency: relative units scale with it. */
export function toleranceHz(tolerance: { value: Rational; base: BaseUnit }, targetHz: Rational): Rational {
  return tolerance.base === 'ratio' ? mul(tolerance.value, targetHz) : tolerance.value;
}

