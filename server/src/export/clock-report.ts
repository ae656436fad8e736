// The report's clock tree: where the system clock comes from, its tolerance, the setting in use
// and the ranked system clocks for the spec's outputs (the joint search), the overclocked ones
// marked with the usual caution.

import { cmp } from '../../../shared-schema/src/rational';
import { formatBytes, formatHz, formatPpm } from '../cli/units';
import { bestSettingFor } from '../planning/pll-setting';
import type { Hardware } from '../planning/types';
import { escapeXml as esc } from '../render/svg';
import { aboveRated, clockCandidatesOf, worstErrorPpm } from '../spec/clock-candidates';
import type { Analysis } from '../spec/types';

function sourceText(hw: Hardware): string {
  const tree = hw.clockTree;
  if (!tree || tree.source === 'fixed') return `fixed at ${formatHz(hw.systemClockHz)}`;
  if (tree.source === 'list') return `one of ${tree.candidatesHz.length} listed clocks (${tree.candidatesHz.map((hz) => formatHz(hz)).join(', ')})`;
  const p = tree.pll!;
  const s = bestSettingFor(tree, hw.systemClockHz);
  const inUse = s ? `; in use: ÷${s.referenceDivider} ×${s.feedbackMultiplier} ${s.postDividers.map((v) => `÷${v}`).join(' ')}, f_pfd ${formatHz(s.pfdHz)}, f_vco ${formatHz(s.vcoHz)}` : '; the clock in use is not one it makes';
  return `crystal ${formatHz(p.crystalHz)} through a PLL: R ${p.referenceDivider.min}…${p.referenceDivider.max}, N ${p.feedbackMultiplier.min}…${p.feedbackMultiplier.max}, VCO ${formatHz(p.vcoHz.min)}…${formatHz(p.vcoHz.max)}${inUse}`;
}

/** The ranked clocks' columns; each cell repeats its column's name (data-label) for the stacked narrow layout. */
const CANDIDATE_COLUMNS = ['system clock', 'exact', 'within tolerance', 'worst error', 'tables'];

/** The section, or '' for a clock file with nothing but `system-clock`. */
export function clockTreeSection(a: Analysis): string {
  const hw = a.hardware;
  const tree = hw?.clockTree;
  if (!hw || !tree || (tree.source === 'fixed' && tree.toleranceRatio.num === 0n && tree.peripherals.length === 0)) return '';
  const facts = [
    ['source', sourceText(hw)],
    ['tolerance', tree.toleranceRatio.num === 0n ? 'not given (taken as exact)' : `±${formatPpm(Number(tree.toleranceRatio.num) / Number(tree.toleranceRatio.den) * 1e6).replace(/^\+/, '')}, counted in every output's worst case`],
    ['rated maximum', tree.ratedHz ? formatHz(tree.ratedHz) : 'not given'],
    ...tree.peripherals.map((p) => [`peripheral ${p.name}`, `${formatHz(p.targetHz)} ± ${formatHz(p.toleranceHz)} from the ${p.source === 'vco' ? 'VCO' : 'system clock'}`]),
  ];
  const parts = ['<h3>Clock tree</h3>', `<ul class="hardware">${facts.map(([k, v]) => `<li><b>${esc(k!)}</b>${esc(v!)}</li>`).join('')}</ul>`];
  const result = clockCandidatesOf(a);
  if (result && result.candidates.length > 0) {
    const requests = a.outputs.map((o) => o.request);
    const n = requests.length;
    const rows = result.candidates.map((c) => {
      const hz = c.clock.systemClockHz;
      const worst = worstErrorPpm(c, requests, hw);
      const cells = [
        `${formatHz(hz)}${cmp(hz, hw.systemClockHz) === 0 ? ' (in use)' : ''}${aboveRated(hw, hz) ? ' — above the rated maximum: an overclocked part can be unstable or damaged; follow the datasheet' : ''}`,
        `${c.score.exact}/${n}`,
        `${c.score.within}/${n}`,
        worst === null ? 'no plan' : formatPpm(worst).replace(/^\+/, ''),
        formatBytes(c.score.bytes),
      ];
      return `<tr>${cells.map((t, k) => `<td data-label="${esc(CANDIDATE_COLUMNS[k]!)}">${esc(t)}</td>`).join('')}</tr>`;
    });
    parts.push(
      `<p class="meta">The best system clocks for these outputs, of ${result.reachable} the tree reaches:</p>`,
      `<div class="scroll"><table class="plans"><thead><tr>${CANDIDATE_COLUMNS.map((h) => `<th>${h}</th>`).join('')}</tr></thead><tbody>${rows.join('')}</tbody></table></div>`,
    );
  }
  return parts.join('\n');
}
