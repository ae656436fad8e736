// The export's part for an output with frequency steps: the table is the output's own (shared by
// every step), and the dividers come as arrays indexed by step — the whole part, the fraction and
// the raw fixed-point value, each counter stage's register when the divider is built of stages,
// and the frequency each step gets. Firmware steps the output by writing element i.

import { toNumber } from '../../../shared-schema/src/rational';
import { formatHz } from '../../../shared-schema/src/quantity-format';
import { formatPpm } from '../cli/units';
import { block, cDouble, cUnsigned, defines, lineComment } from './c-text';
import type { OutputIdentifiers } from './identifiers';
import type { ExportedOutput } from './model';

const rawOf = (p: { dividerInteger: number; dividerFraction: number; fractionBits: number }): bigint =>
  (BigInt(p.dividerInteger) << BigInt(p.fractionBits)) + BigInt(p.dividerFraction);

/** One array per quantity: [C type, name suffix, values, what it holds]. */
function arrays(o: ExportedOutput): Array<[string, string, string[], string]> {
  const steps = o.analysis.planning.steps ?? [];
  const out: Array<[string, string, string[], string]> = [
    ['uint32_t', 'step_divider_int', steps.map((p) => cUnsigned(p.dividerInteger)), 'I of each step'],
    ['uint32_t', 'step_divider_frac', steps.map((p) => cUnsigned(p.dividerFraction)), `F of each step, over 2^${steps[0]?.fractionBits ?? 0}`],
    ['uint64_t', 'step_divider_raw', steps.map((p) => `${rawOf(p)}ULL`), 'I * 2^k + F of each step'],
  ];
  for (const [s, stage] of (steps[0]?.dividerStages ?? []).entries()) {
    const lower = stage.name.toLowerCase();
    out.push(['uint32_t', `step_stage_${lower}_value`, steps.map((p) => cUnsigned(p.dividerStages?.[s]?.value ?? 0)), `${stage.name}: the stage divides by this`]);
    out.push(['uint32_t', `step_stage_${lower}_register`, steps.map((p) => cUnsigned(p.dividerStages?.[s]?.register ?? 0)), `${stage.name}: write this to its register`]);
  }
  out.push(['double', 'step_frequency_hz', steps.map((p) => cDouble(toNumber(p.achievedHz))), 'what each step gets, Hz']);
  return out;
}

/** Header lines: the step table in a comment, the count, and the arrays' declarations. */
export function stepsHeader(o: ExportedOutput, ids: OutputIdentifiers): string[] {
  const steps = o.analysis.planning.steps;
  if (steps === undefined) return [];
  const targets = o.analysis.request.steps ?? [];
  const rows = steps.map((p, i) => {
    const divider = p.dividerFraction === 0 ? `${p.dividerInteger}` : `${p.dividerInteger} + ${p.dividerFraction}/${2 ** p.fractionBits}`;
    return `step ${i}: target ${formatHz(targets[i]!.targetHz)}, achieved ${formatHz(p.achievedHz)} (${formatPpm(p.errorPpm)}), divider ${divider}`;
  });
  const count = `${ids.upper}_STEP_COUNT`;
  return [
    block([`${o.analysis.name}: ${steps.length} frequency steps on this one table; write step i's divider to step the output`, ...rows]),
    defines([[count, cUnsigned(steps.length)]]),
    ...arrays(o).map(([type, suffix, , what]) => `extern const ${type} ${ids.lower}_${suffix}[${count}]; ${lineComment(what)}`),
  ];
}

/** Source lines: the arrays' definitions. */
export function stepsSource(o: ExportedOutput, ids: OutputIdentifiers): string[] {
  if (o.analysis.planning.steps === undefined) return [];
  return arrays(o).flatMap(([type, suffix, values]) => [`const ${type} ${ids.lower}_${suffix}[${ids.upper}_STEP_COUNT] = { ${values.join(', ')} };`]).concat(['']);
}
