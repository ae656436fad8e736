// The `groups:` of a wave spec: checked against the outputs, planned together (planning/groups.ts),
// and written back over the members' own plans with the diagnostics those plans call for.

import type { Document } from 'yaml';
import { DEFAULT_TOLERANCE } from '../../../shared-schema/src/defaults';
import { groupSchema, type GroupEntry } from '../../../shared-schema/src/wave-schema';
import { formatSeconds } from '../../../shared-schema/src/quantity-format';
import { countedBytes, planGroup, sharingOutputs } from '../planning/board-plan';
import { specBoardOf } from './board-budget';
import type { GroupPlanning } from '../planning/groups';
import type { Hardware } from '../planning/types';
import { Memo } from './memo';
import { keyRange, locate, rangeFor, scalarText, valueRange } from './nodes';
import { planningDiagnostics } from './planning-diagnostics';
import { planningKey } from '../planning/cache';
import { diagnostic, type LineIndex } from './source';
import type { Analysis, GroupAnalysis, OutputAnalysis } from './types';

/** The diagnostics planningDiagnostics gives; a member's are replaced by its group's. */
const PLANNING_CODES = new Set(['no-plan', 'out-of-tolerance', 'fractional-plan', 'search-limit', 'seam-glitch', 'samples-per-cycle', 'table-over-budget', 'clock-accuracy']);

const planned = new Memo<string, GroupPlanning>(64);

const waveText = (o: OutputAnalysis): string => JSON.stringify(o.request.waveform, (_, v: unknown) => (typeof v === 'bigint' ? v.toString() : v));
const sameWave = (a: OutputAnalysis, b: OutputAnalysis): boolean =>
  a.request.targetHz.num === b.request.targetHz.num && a.request.targetHz.den === b.request.targetHz.den && waveText(a) === waveText(b);

/** Plans every group and returns the table bytes the outputs then take together. */
export function applyGroups(analysis: Analysis, groups: Record<string, GroupEntry> | undefined, hw: Hardware, doc: Document.Parsed, lines: LineIndex): number | null {
  if (!groups) return null;
  const taken = new Map<string, string>();
  const out: GroupAnalysis[] = [];
  for (const [name, entry] of Object.entries(groups)) {
    // An entry the schema refuses (no `outputs`, say) has its diagnostics already; nothing to plan.
    if (!groupSchema.safeParse(entry).success) continue;
    const at = (...p: (string | number)[]) => valueRange(doc, lines, ['groups', name, ...p]) ?? rangeFor(doc, lines, ['groups', name, ...p]);
    const problem = (range: ReturnType<typeof at>, message: string) => analysis.diagnostics.push(diagnostic('group', range, message));
    const lock = entry.lock ?? 'sample-clock';
    const offsetsAs = entry['offsets-as'] ?? 'table-rotation';
    const members: OutputAnalysis[] = [];
    let ok = true;
    entry.outputs.forEach((member, i) => {
      const o = analysis.outputs.find((x) => x.name === member);
      if (!o) problem(at('outputs', i), `Group \`${name}\` names \`${member}\`, which is not an output of this file (or has errors of its own): fix the name.`);
      else if (taken.has(member)) problem(at('outputs', i), `\`${member}\` is already in group \`${taken.get(member)}\`: an output belongs to one group.`);
      else if (o.request.pinned) problem(at('outputs', i), `\`${member}\` has a pinned plan, which a group cannot change: remove the plan or the output from the group.`);
      else {
        members.push(o);
        taken.set(member, name);
        return;
      }
      ok = false;
    });
    for (const key of Object.keys(entry['phase-offsets'] ?? {})) {
      if (!entry.outputs.includes(key)) {
        problem(keyRange(doc, lines, ['groups', name, 'phase-offsets', key]) ?? at('phase-offsets'), `\`${key}\` has a phase offset but is not in group \`${name}\`: add it to \`outputs\` or remove the offset.`);
        ok = false;
      }
    }
    if (lock !== 'phase' && (entry['phase-offsets'] !== undefined || entry['offsets-as'] !== undefined)) {
      problem(at('lock'), `Group \`${name}\` states phases but shares only the sample clock: set \`lock: phase\` (the members then share the table length too).`);
      ok = false;
    }
    if (offsetsAs === 'start-offset' && members.some((m) => !sameWave(m, members[0]!))) {
      problem(at('offsets-as'), `The members of \`${name}\` differ in waveform or frequency, so they cannot share one table: use \`offsets-as: table-rotation\`.`);
      ok = false;
    }
    if (!ok || members.length < 2) continue;
    const reqs = members.map((m) => m.request);
    const key = [lock, offsetsAs, JSON.stringify(entry['phase-offsets'] ?? {}), ...reqs.map((r) => planningKey(hw, r))].join('\u0001');
    const offsets = members.map((m) => entry['phase-offsets']?.[m.name] ?? 0);
    const group = planned.get(key, () =>
      planGroup(hw, { lock, members: members.map((_, i) => i), offsetsDeg: offsets, sharedTable: offsetsAs === 'start-offset' }, reqs, members.map((m) => m.planning)),
    );
    members.forEach((m, i) => {
      m.planning = group.plans[i]!;
      analysis.diagnostics = analysis.diagnostics.filter((d) => !(d.output === m.name && PLANNING_CODES.has(d.code)));
      const toleranceText = scalarText(doc, locate(doc, ['outputs', m.name, 'tolerance'])?.value)?.trim() ?? DEFAULT_TOLERANCE;
      analysis.diagnostics.push(...planningDiagnostics(m, m.planning, hw, toleranceText));
    });
    group.phases?.forEach((p, i) => {
      if (Math.abs(p.errorDeg) < 1e-9) return;
      const m = members[i]!;
      analysis.diagnostics.push(
        diagnostic(
          'phase-offset',
          keyRange(doc, lines, ['groups', name, 'phase-offsets', m.name]) ?? at('phase-offsets'),
          `\`${m.name}\` runs ${p.realisedDeg.toFixed(3)}° ahead, not ${p.offsetDeg}°: with ${m.planning.plan!.cycles.num} cycle(s) in ${m.planning.plan!.tableLength} samples its table turns in steps of ${(360 * gcdOf(Number(m.planning.plan!.cycles.num), m.planning.plan!.tableLength) / m.planning.plan!.tableLength).toFixed(4)}°, leaving ${p.errorDeg >= 0 ? '+' : '-'}${Math.abs(p.errorDeg).toFixed(4)}° (${formatSeconds(Math.abs(p.errorS))}): accept it, or use a table length whose steps divide the offset.`,
          m.name,
        ),
      );
    });
    out.push({ name, lock, offsetsAs, members: members.map((m) => m.name), offsetsDeg: offsets, phases: group.phases });
  }
  analysis.groups = out;
  // Members sharing one table through start offsets take its bytes once.
  return countedBytes(analysis.outputs.map((o) => o.planning), sharingOutputs(specBoardOf(analysis)));
}

function gcdOf(a: number, b: number): number {
  while (b !== 0) [a, b] = [b, a % b];
  return a;
}
