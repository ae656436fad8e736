// A clock spec → Hardware, with the checks that span several keys (min ≤ max, sample bytes wide
// enough for the DAC, a power of two within the table-length range) and the overclock caution.

import type { Document } from 'yaml';
import type { ClockFile } from '../../../shared-schema/src/clock-schema';
import { DEFAULT_FRACTION_BITS, DEFAULT_POWER_OF_TWO } from '../../../shared-schema/src/defaults';
import { cmp, toNumber } from '../../../shared-schema/src/rational';
import { formatHz } from '../../../shared-schema/src/quantity-format';
import type { Hardware } from '../planning/types';
import { buildClockTree } from './clock-tree-model';
import { diagnostic, type LineIndex } from './source';
import { valueRange, rangeFor } from './nodes';
import type { Quantities } from './quantities';
import type { SpecDiagnostic } from './types';

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

  const { min: iMin, max: iMax } = data.divider.integer;
  if (iMin > iMax) {
    diagnostics.push(diagnostic('out-of-range', at('divider', 'integer', 'min'), `The divider's integer min ${iMin} is above its max ${iMax}: swap them or fix one.`));
  }
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

  if (diagnostics.some((d) => d.severity === 'error')) return { hardware: null, diagnostics };
  const hardware: Hardware = {
    systemClockHz: systemClock.value,
    systemClockTolerance: clock.tree.toleranceRatio,
    clockTree: clock.tree,
    divider: { integerMin: iMin, integerMax: iMax, fractionBits: data.divider['fraction-bits'] ?? DEFAULT_FRACTION_BITS },
    dac: { bits, sampleBytes, fullScaleV: toNumber(fullScale.value), maxSampleRateHz: maxRate.value },
    memory: { budgetBytes: toNumber(budget.value), tableLengthMin: nMin, tableLengthMax: nMax, powerOfTwo },
  };
  return { hardware, diagnostics };
}

function hasPowerOfTwo(min: number, max: number): boolean {
  for (let p = 1; p <= max; p *= 2) if (p >= min) return true;
  return false;
}
