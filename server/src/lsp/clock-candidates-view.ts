// The ranked system clocks as the editor shows them: the hover on `system-clock` and the titles of
// the retune quick fix. Every figure is read off the joint search's result; nothing is planned here.

import { cmp } from '../../../shared-schema/src/rational';
import type { ClockCandidate, JointResult } from '../planning/joint-search';
import type { Hardware, OutputRequest } from '../planning/types';
import { aboveRated, worstErrorPpm } from '../spec/clock-candidates';
import { formatBytes, formatHz, formatPpm } from '../cli/units';

/** The usual caution for a clock above the part's rating. */
export function overclockCaution(hw: Hardware): string {
  const rated = hw.clockTree?.ratedHz;
  return `caution: above the rated ${rated ? formatHz(rated) : 'maximum'} — an overclocked part can be unstable or damaged; follow the datasheet and qualified practice`;
}

/** "PLL 25 MHz ÷1 ×24 ÷5 (VCO 600 MHz)", or '' for a listed clock. */
export function settingText(hw: Hardware, c: ClockCandidate): string {
  const s = c.clock.setting;
  const pll = hw.clockTree?.pll;
  if (!s || !pll) return '';
  return `PLL ${formatHz(pll.crystalHz)} ÷${s.referenceDivider} ×${s.feedbackMultiplier} ${s.postDividers.map((p) => `÷${p}`).join(' ')} (VCO ${formatHz(s.vcoHz)})`;
}

const cell = (t: string): string => t.replace(/\|/g, '\\|');

/** Markdown: the ranked clocks for `requests`, best first, the one in use and any overclock marked. */
export function candidatesMarkdown(hw: Hardware, result: JointResult, requests: readonly OutputRequest[], title: string): string {
  const n = requests.length;
  const lines = [
    `**${title}** — the best system clocks for ${n} output${n === 1 ? '' : 's'} (of ${result.reachable} the clock tree reaches${result.ruledOut ? `; ${result.ruledOut} ruled out by a peripheral clock` : ''}${result.complete ? '' : '; the nearest ranked'})`,
    '',
    '| system clock | setting | exact | within tolerance | worst error | tables | VCO margin |',
    '|---|---|---|---|---|---|---|',
  ];
  const cautions: string[] = [];
  for (const c of result.candidates) {
    const hz = c.clock.systemClockHz;
    const inUse = cmp(hz, hw.systemClockHz) === 0 ? ' (in use)' : '';
    const over = aboveRated(hw, hz);
    if (over) cautions.push(`${formatHz(hz)}: ${overclockCaution(hw)}.`);
    const worst = worstErrorPpm(c, requests, hw);
    const margin = c.clock.setting ? `${(c.clock.vcoMargin * 100).toFixed(1)} %` : '—';
    lines.push(
      `| ${cell(formatHz(hz))}${inUse}${over ? ' ⚠' : ''} | ${cell(settingText(hw, c) || 'listed')} | ${c.score.exact}/${n} | ${c.score.within}/${n} | ${worst === null ? 'no plan' : formatPpm(worst).replace(/^\+/, '')} | ${formatBytes(c.score.bytes)}${c.score.fits ? '' : ' (over budget)'} | ${margin} |`,
    );
  }
  if (cautions.length > 0) lines.push('', ...cautions.map((t) => `⚠ ${t}`));
  return lines.join('\n');
}
