// A clock spec → Hardware, with the checks that span several keys (min ≤ max, sample bytes wide
// enough for the DAC, a power of two within the table-length range, one form of divider: an
// integer range or counter stages) and the overclock caution.

import type { Document } from 'yaml';
import { type ClockFile, MAX_DIVIDER_INTEGER, MAX_DIVIDER_STAGES } from '../../../shared-schema/src/clock-schema';
import { DEFAULT_FRACTION_BITS, DEFAULT_POWER_OF_TWO, DEFAULT_REGISTER_OFFSET } from '../../../shared-schema/src/defaults';
import { cmp, toNumber } from '../../../shared-schema/src/rational';
import { formatHz } from '../../../shared-schema/src/quantity-format';
import type { DividerStage } from '../planning/stages';
import type { Hardware } from '../planning/types';
import { analogChainOf } from './analog-model';
import { buildClockTree } from './clock-tree-model';
import { diagnostic, type LineIndex } from './source';
import { valueRange, rangeFor } from './nodes';
import type { Quantities } from './quantities';
import { placeholderFor } from './schema-issues';
import type { Range, SpecDiagnostic } from './types';

export function buildHardware(
  data: ClockFile,
  q: Quantities,
  doc: Document.Parsed,
  lines: LineIndex,
): { hardware: Hardware | null; diagnostics: SpecDiagnostic[] } {
  const diagnostics: SpecDiagnostic[] = [];
  const at = (...path: string[]) => valueRange(doc, lines, path) ?? rangeFor(doc, lines, path);

  const systemClock = q.get(['system-clock']);
  const maxRate = q.get(['dac', 'max-sample-rate']);
  const fullScale = q.get(['dac', 'full-scale']);
  const budget = q.get(['memory', 'budget']);
  // Unparsed quantities already have their own diagnostics.
  if (!systemClock || !maxRate || !fullScale || !budget) return { hardware: null, diagnostics };

  const divider = dividerOf(data.divider, at, diagnostics);
  const { min: nMin, max: nMax } = data.memory['table-length'];
  if (nMin > nMax) {
    diagnostics.push(diagnostic('out-of-range', at('memory', 'table-length', 'min'), `The table-length min ${nMin} is above its max ${nMax}: swap them or fix one.`));
  }
  const powerOfTwo = data.memory['power-of-two'] ?? DEFAULT_POWER_OF_TWO;
  if (powerOfTwo && nMin <= nMax && !hasPowerOfTwo(nMin, nMax)) {
    diagnostics.push(diagnostic('out-of-range', at('memory', 'power-of-two'), `No power of two lies between table-length ${nMin} and ${nMax}: widen the range or set power-of-two to false.`));
  }
  const bits = data.dac.bits;
  const sampleBytes = data.dac['sample-bytes'];
  if (sampleBytes * 8 < bits) {
    diagnostics.push(diagnostic('out-of-range', at('dac', 'sample-bytes'), `${sampleBytes} byte${sampleBytes > 1 ? 's' : ''} cannot hold a ${bits}-bit sample: use at least ${Math.ceil(bits / 8)}.`));
  }

  const rated = q.get(['rated-system-clock']);
  if (rated && cmp(systemClock.value, rated.value) > 0) {
    diagnostics.push(
      diagnostic(
        'overclock',
        at('system-clock'),
        `Caution: ${formatHz(systemClock.value)} is above the rated ${formatHz(rated.value)}, so the part runs outside its datasheet — confirm with the datasheet and qualified practice before running hardware this way.`,
      ),
    );
  }

  const clock = buildClockTree(data, q, doc, lines, systemClock.value);
  diagnostics.push(...clock.diagnostics);

  if (divider === null || diagnostics.some((d) => d.severity === 'error')) return { hardware: null, diagnostics };
  const hardware: Hardware = {
    systemClockHz: systemClock.value,
    systemClockTolerance: clock.tree.toleranceRatio,
    clockTree: clock.tree,
    divider,
    dac: { bits, sampleBytes, fullScaleV: toNumber(fullScale.value), maxSampleRateHz: maxRate.value },
    memory: { budgetBytes: toNumber(budget.value), tableLengthMin: nMin, tableLengthMax: nMax, powerOfTwo },
  };
  const analog = analogChainOf(data, q);
  if (analog) hardware.analog = analog;
  return { hardware, diagnostics };
}

/**
 * The divider of the clock file: an integer range with fraction bits, or counter stages whose
 * product is D (stages.ts). Null, with diagnostics, when neither form is usable.
 */
function dividerOf(divider: ClockFile['divider'], at: (...path: string[]) => Range, out: SpecDiagnostic[]): Hardware['divider'] | null {
  const fractionBits = divider['fraction-bits'] ?? DEFAULT_FRACTION_BITS;
  const { integer, stages } = divider;
  if (integer === undefined && stages === undefined) {
    const d = diagnostic('missing-key', at('divider'), '`divider` has neither `integer` nor `stages`: add `integer: { min: 1, max: 65535 }`, or the counter stages the divider is built of.');
    d.fix = { key: 'integer', placeholder: placeholderFor('clock', ['divider', 'integer']), parent: ['divider'] };
    out.push(d);
    return null;
  }
  if (integer !== undefined && stages !== undefined) {
    out.push(diagnostic('divider-form', at('divider', 'stages'), '`divider` has both `integer` and `stages`: keep `stages` when the divider is built of counter stages, else `integer`.'));
    return null;
  }
  if (integer !== undefined) {
    if (integer.min > integer.max) {
      out.push(diagnostic('out-of-range', at('divider', 'integer', 'min'), `The divider's integer min ${integer.min} is above its max ${integer.max}: swap them or fix one.`));
      return null;
    }
    return { integerMin: integer.min, integerMax: integer.max, fractionBits };
  }
  const named = Object.entries(stages!);
  if (fractionBits > 0) {
    out.push(diagnostic('divider-form', at('divider', 'fraction-bits'), 'Counter stages divide by whole numbers: remove `fraction-bits` (or set it to 0), or describe the divider by `integer` and `fraction-bits`.'));
    return null;
  }
  if (named.length < 1 || named.length > MAX_DIVIDER_STAGES) {
    out.push(diagnostic('divider-form', at('divider', 'stages'), `waveplan plans dividers of one or two stages, and this one has ${named.length}: fold the stages that always move together into one.`));
    return null;
  }
  const folded = named.map(([name]) => name.toUpperCase());
  const twin = named.find(([name], i) => folded.indexOf(name.toUpperCase()) !== i);
  if (twin !== undefined) {
    out.push(diagnostic('divider-form', at('divider', 'stages', twin[0]), `Two stages are named \`${twin[0]}\` apart from case; exported names would clash: rename one.`));
    return null;
  }
  const built: DividerStage[] = [];
  let ok = true;
  for (const [name, st] of named) {
    const offset = st['register-offset'] ?? DEFAULT_REGISTER_OFFSET;
    if (st.min > st.max) {
      out.push(diagnostic('out-of-range', at('divider', 'stages', name, 'min'), `Stage ${name}'s min ${st.min} is above its max ${st.max}: swap them or fix one.`));
      ok = false;
    } else if (st.min + offset < 0) {
      out.push(diagnostic('out-of-range', at('divider', 'stages', name, 'register-offset'), `With register-offset ${offset}, stage ${name}'s value ${st.min} would need the register value ${st.min + offset}: raise min to ${-offset} or fix the offset.`));
      ok = false;
    }
    built.push({ name, min: st.min, max: st.max, registerOffset: offset });
  }
  if (!ok) return null;
  const integerMin = built.reduce((p, st) => p * st.min, 1);
  const integerMax = built.reduce((p, st) => p * st.max, 1);
  if (integerMax > MAX_DIVIDER_INTEGER) {
    out.push(diagnostic('out-of-range', at('divider', 'stages'), `The stages divide by up to ${integerMax}, more than the ${MAX_DIVIDER_INTEGER} (2^32) waveplan plans with: lower a stage's max.`));
    return null;
  }
  return { integerMin, integerMax, fractionBits: 0, stages: built };
}

function hasPowerOfTwo(min: number, max: number): boolean {
  for (let p = 1; p <= max; p *= 2) if (p >= min) return true;
  return false;
}
