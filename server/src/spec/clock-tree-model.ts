// The clock tree of a clock file → ClockTree: the system clock's tolerance, the PLL's ranges or
// the candidate list, the peripherals; with the checks that span keys (min ≤ max, one source,
// a PLL small enough to enumerate) and what the clock in use breaks (a clock the tree cannot
// make, a peripheral it cannot feed).

import type { Document } from 'yaml';
import type { ClockFile } from '../../../shared-schema/src/clock-schema';
import { parseQuantity, toleranceHz } from '../../../shared-schema/src/quantity';
import { formatHz } from '../../../shared-schema/src/quantity-format';
import { type Rational, ZERO, cmp, div, rat, toNumber } from '../../../shared-schema/src/rational';
import { type ClockTree, FIXED_CLOCK, MAX_PLL_SETTINGS, type PeripheralClock, type PllRanges, pllSettingCount } from '../planning/clock-source';
import { bestSettingFor, nearestReachable } from '../planning/pll-setting';
import { peripheralAchieved } from '../planning/peripherals';
import { MAX_POST_DIVIDER_STAGES } from '../../../shared-schema/src/clock-tree-schema';
import { type Code } from './codes';
import { locate, rangeFor, scalarText, valueRange } from './nodes';
import type { Quantities } from './quantities';
import { diagnostic, type LineIndex } from './source';
import type { Range, SpecDiagnostic } from './types';

/** A system clock more than 10 % off is not a clock a plan can be checked against. */
const MAX_CLOCK_TOLERANCE = rat(1n, 10n);

/** "+0.4723 %" / "-40.69 ppm": ASCII signs, four significant digits. */
export function relativeText(ratio: number): string {
  const [scale, unit] = Math.abs(ratio) >= 1e-3 ? [100, '%'] : [1e6, 'ppm'];
  const shown = Number((Math.abs(ratio) * scale).toPrecision(4));
  return `${ratio > 0 ? '+' : ratio < 0 ? '-' : ''}${shown} ${unit}`;
}

export function buildClockTree(
  data: ClockFile,
  q: Quantities,
  doc: Document.Parsed,
  lines: LineIndex,
  systemClock: Rational,
): { tree: ClockTree; diagnostics: SpecDiagnostic[] } {
  const diagnostics: SpecDiagnostic[] = [];
  const at = (...path: (string | number)[]): Range => valueRange(doc, lines, path) ?? rangeFor(doc, lines, path);
  const push = (code: Code, range: Range, message: string) => diagnostics.push(diagnostic(code, range, message));

  let toleranceRatio = ZERO;
  const tol = q.get(['system-clock-tolerance']);
  if (tol && tol.base !== 'ratio') {
    push('bad-unit', at('system-clock-tolerance'), 'Write the system clock\'s tolerance relative to it, in ppm, ppb or %, such as `50 ppm` (a crystal\'s tolerance is given that way).');
  } else if (tol && cmp(tol.value, MAX_CLOCK_TOLERANCE) > 0) {
    push('out-of-range', at('system-clock-tolerance'), `\`system-clock-tolerance\` must be at most 10 %: change \`${tol.text}\`.`);
  } else if (tol) {
    toleranceRatio = tol.value;
  }

  const rated = q.get(['rated-system-clock'])?.value ?? null;
  const base: ClockTree = { ...FIXED_CLOCK, toleranceRatio, ratedHz: rated };
  const hasPll = data.pll !== undefined;
  const hasList = data['system-clock-candidates'] !== undefined;
  if (hasPll && hasList) {
    push('out-of-range', at('system-clock-candidates'), 'Give the system clock\'s source once: a `pll` or a list of `system-clock-candidates`, not both.');
    return { tree: base, diagnostics };
  }
  let tree: ClockTree = base;
  if (hasPll) {
    const pll = readPll(data, q, at, push);
    if (!pll) return { tree: base, diagnostics };
    tree = { ...base, source: 'pll', pll };
  } else if (hasList) {
    const list = readCandidates(doc, lines, push);
    if (!list) return { tree: base, diagnostics };
    tree = { ...base, source: 'list', candidatesHz: list };
  }
  const peripherals = readPeripherals(data, q, tree, at, push);
  if (!peripherals) return { tree: base, diagnostics };
  tree = { ...tree, peripherals };
  if (diagnostics.some((d) => d.severity === 'error')) return { tree: base, diagnostics };
  checkInUse(tree, systemClock, at, push);
  return { tree, diagnostics };
}

type At = (...path: (string | number)[]) => Range;
type Push = (code: Code, range: Range, message: string) => void;

function readPll(data: ClockFile, q: Quantities, at: At, push: Push): PllRanges | null {
  const entry = data.pll!;
  const crystal = q.get(['pll', 'crystal']);
  const vcoMin = q.get(['pll', 'vco', 'min']);
  const vcoMax = q.get(['pll', 'vco', 'max']);
  const pdMin = q.get(['pll', 'phase-detector', 'min']);
  const pdMax = q.get(['pll', 'phase-detector', 'max']);
  if (!crystal || !vcoMin || !vcoMax || (entry['phase-detector'] && (!pdMin || !pdMax))) return null;
  let ok = true;
  const ordered = (lo: Rational | number, hi: Rational | number, path: string[], what: string) => {
    const bad = typeof lo === 'number' ? lo > (hi as number) : cmp(lo, hi as Rational) > 0;
    if (bad) {
      push('out-of-range', at(...path, 'min'), `The ${what} min is above its max: swap them or fix one.`);
      ok = false;
    }
  };
  ordered(entry['reference-divider'].min, entry['reference-divider'].max, ['pll', 'reference-divider'], 'reference divider R');
  ordered(entry['feedback-multiplier'].min, entry['feedback-multiplier'].max, ['pll', 'feedback-multiplier'], 'feedback multiplier N');
  ordered(vcoMin.value, vcoMax.value, ['pll', 'vco'], 'VCO range');
  if (pdMin && pdMax) ordered(pdMin.value, pdMax.value, ['pll', 'phase-detector'], 'phase-detector range');
  const stages: PllRanges['postStages'] = [];
  const names = Object.keys(entry['post-dividers']);
  if (names.length > MAX_POST_DIVIDER_STAGES) {
    push('out-of-range', at('pll', 'post-dividers'), `A PLL here has at most ${MAX_POST_DIVIDER_STAGES} post-divider stages; this one lists ${names.length}: merge stages whose values multiply.`);
    ok = false;
  }
  for (const name of names) {
    const stage = entry['post-dividers'][name]!;
    const hasRange = stage.min !== undefined || stage.max !== undefined;
    if (hasRange === (stage.values !== undefined) || (hasRange && (stage.min === undefined || stage.max === undefined))) {
      push('out-of-range', at('pll', 'post-dividers', name), `Post divider \`${name}\` needs either \`min\` and \`max\` or \`values\`, such as \`{ min: 1, max: 8 }\` or \`{ values: [2, 4, 6, 8] }\`.`);
      ok = false;
      continue;
    }
    if (hasRange && stage.min! > stage.max!) {
      push('out-of-range', at('pll', 'post-dividers', name, 'min'), `Post divider \`${name}\`: min is above max: swap them or fix one.`);
      ok = false;
      continue;
    }
    const values = stage.values ? [...new Set(stage.values)].sort((a, b) => a - b) : Array.from({ length: stage.max! - stage.min! + 1 }, (_, i) => stage.min! + i);
    stages.push({ name, values });
  }
  if (!ok) return null;
  const pll: PllRanges = {
    crystalHz: crystal.value,
    referenceDivider: { ...entry['reference-divider'] },
    feedbackMultiplier: { ...entry['feedback-multiplier'] },
    phaseDetectorHz: pdMin && pdMax ? { min: pdMin.value, max: pdMax.value } : null,
    vcoHz: { min: vcoMin.value, max: vcoMax.value },
    postStages: stages,
  };
  const count = pllSettingCount(pll);
  if (count === null || count > MAX_PLL_SETTINGS) {
    push('out-of-range', at('pll'), `This PLL has ${count === null ? 'too many post-divider products' : `${count} settings`} to rank, more than the ${MAX_PLL_SETTINGS} waveplan enumerates: narrow the reference divider, the feedback multiplier or the post dividers to the ranges the firmware uses.`);
    return null;
  }
  if (count === 0) {
    push('out-of-range', at('pll'), 'No reference divider and feedback multiplier keep both the phase-detector and the VCO frequency in range: check the crystal and the ranges against the datasheet.');
    return null;
  }
  return pll;
}

/** The listed clocks, each read exactly from its text. */
function readCandidates(doc: Document.Parsed, lines: LineIndex, push: Push): Rational[] | null {
  const node = locate(doc, ['system-clock-candidates'])?.value as { items?: unknown[] } | undefined;
  const items = node?.items ?? [];
  const out: Rational[] = [];
  let ok = true;
  items.forEach((item, i) => {
    const range = valueRange(doc, lines, ['system-clock-candidates', i]) ?? rangeFor(doc, lines, ['system-clock-candidates']);
    const text = scalarText(doc, item);
    const parsed = text === undefined ? undefined : parseQuantity('frequency', text);
    if (!parsed || !parsed.ok) {
      push(parsed && !parsed.ok ? parsed.code : 'wrong-type', range, parsed && !parsed.ok ? parsed.message : 'Each candidate is a frequency, such as `120 MHz`.');
      ok = false;
    } else if (parsed.value.num <= 0n) {
      push('out-of-range', range, `A system clock must be more than 0 Hz: change \`${text}\`.`);
      ok = false;
    } else {
      out.push(parsed.value);
    }
  });
  return ok ? out : null;
}

function readPeripherals(data: ClockFile, q: Quantities, tree: ClockTree, at: At, push: Push): PeripheralClock[] | null {
  const out: PeripheralClock[] = [];
  let ok = true;
  for (const [name, entry] of Object.entries(data['peripheral-clocks'] ?? {})) {
    const frequency = q.get(['peripheral-clocks', name, 'frequency']);
    const tolerance = q.get(['peripheral-clocks', name, 'tolerance']);
    if (!frequency || !tolerance) {
      ok = false;
      continue;
    }
    const source = entry.source ?? 'system-clock';
    if (source === 'vco' && tree.source !== 'pll') {
      push('out-of-range', at('peripheral-clocks', name, 'source'), `\`${name}\` takes its clock from the VCO, but this clock file describes no \`pll\`: add one or use \`source: system-clock\`.`);
      ok = false;
      continue;
    }
    if (entry.divider.min > entry.divider.max) {
      push('out-of-range', at('peripheral-clocks', name, 'divider', 'min'), `\`${name}\`: the divider min is above its max: swap them or fix one.`);
      ok = false;
      continue;
    }
    out.push({ name, targetHz: frequency.value, toleranceHz: toleranceHz(tolerance, frequency.value), source, dividerMin: entry.divider.min, dividerMax: entry.divider.max });
  }
  return ok ? out : null;
}

/** What the clock in use breaks: a clock the tree cannot make, a peripheral it cannot feed. */
function checkInUse(tree: ClockTree, systemClock: Rational, at: At, push: Push): void {
  let vcoHz: Rational | null = null;
  if (tree.source === 'pll') {
    const setting = bestSettingFor(tree, systemClock);
    if (!setting) {
      const near = nearestReachable(tree.pll!, systemClock);
      push('clock-unreachable', at('system-clock'), `The PLL cannot make ${formatHz(systemClock)} from its ${formatHz(tree.pll!.crystalHz)} crystal within its ranges${near ? `; the nearest it makes is ${formatHz(near)}` : ''}: pick a clock it can make (the hover lists the best ones).`);
      return;
    }
    vcoHz = setting.vcoHz;
  } else if (tree.source === 'list' && !tree.candidatesHz.some((c) => cmp(c, systemClock) === 0)) {
    push('clock-unreachable', at('system-clock'), `${formatHz(systemClock)} is not one of \`system-clock-candidates\`: add it there or pick one of them.`);
  }
  for (const p of tree.peripherals) {
    const sourceHz = p.source === 'vco' ? vcoHz : systemClock;
    if (!sourceHz) continue;
    const got = peripheralAchieved(p, sourceHz, tree.toleranceRatio);
    if (got.withinTolerance) continue;
    const relative = toNumber(div(got.errorHz, p.targetHz));
    const clock = tree.toleranceRatio.num !== 0n ? ` and the clock's own ±${relativeText(toNumber(tree.toleranceRatio)).slice(1)}` : '';
    push(
      'peripheral-clock',
      at('peripheral-clocks', p.name, 'frequency'),
      `\`${p.name}\` gets ${formatHz(got.achievedHz)} (${relativeText(relative)}${clock}) from ${formatHz(sourceHz)} ÷ ${got.divider}, outside its ±${formatHz(p.toleranceHz)}: pick another system clock or widen the divider range.`,
    );
  }
}
