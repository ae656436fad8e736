// The true optimum plan of one output: minimal |f_out − f_target| exactly, ties broken as
// rank.ts documents. The search walks the smaller of the two dimensions (dividers J or table
// lengths N) over the span where a plan can still matter, and asks the Farey kernel for the best
// partner of each value (scan.ts). Doubles carry the walk; near-ties are settled exactly.

import { type Rational, rat, sub } from '../../../shared-schema/src/rational';
import { fareyNeighbours } from './farey';
import { type Domain, jitterFreeDomain, fractionalDomain, achievedHz } from './domain';
import { type Candidate, Leader } from './rank';
import { type Cap, ScanJ, ScanN } from './scan';
import type { Hardware, Plan, PlanRequest } from './types';

/** The best plan with an integer divider (F = 0): no divider jitter. Null when none exists. */
export function nearestJitterFree(hw: Hardware, req: PlanRequest): Plan | null {
  const d = jitterFreeDomain(hw, req);
  if (d === null) return null;
  const c = solve(d, null);
  return c === null ? null : toPlan(hw, d, c);
}

/**
 * The best plan over every divider I + F/2^k (F = 0 included). Null when no plan exists.
 * An exact jitter-free plan is already the best fractional plan (error 0, p(1−p) = 0, and the
 * remaining keys agree), so the wider search runs only when the integer divider misses.
 */
export function bestFractional(hw: Hardware, req: PlanRequest): Plan | null {
  const whole = jitterFreeDomain(hw, req);
  const wholeBest = whole === null ? null : solve(whole, null);
  if (hw.divider.fractionBits === 0 || (wholeBest !== null && sub(achieved(whole!, wholeBest), req.targetHz).num === 0n)) {
    return wholeBest === null ? null : toPlan(hw, whole!, wholeBest);
  }
  const d = fractionalDomain(hw, req);
  if (d === null) return null;
  const seed = wholeBest === null ? null : { ...wholeBest, j: wholeBest.j * d.scale };
  const c = solve(d, seed);
  return c === null ? null : toPlan(hw, d, c);
}

function achieved(d: Domain, c: Candidate): Rational {
  return achievedHz(d, c.j, c.n, c.m);
}

function toPlan(hw: Hardware, d: Domain, c: Candidate): Plan {
  const achievedHz = achieved(d, c);
  return {
    dividerInteger: Math.floor(c.j / d.scale),
    dividerFraction: c.j % d.scale,
    fractionBits: hw.divider.fractionBits,
    tableLength: c.n,
    cycles: rat(BigInt(c.m)),
    achievedHz,
    errorHz: sub(achievedHz, d.target),
  };
}

/** Relative margin on the float bounds of the walked span, so exact ties at its edge stay in. */
const EDGE = 1e-9;

/** The exact best candidate of a domain, starting from an optional known plan. */
export function solve(d: Domain, seed: Candidate | null): Candidate | null {
  const lead = new Leader(d);
  if (seed !== null) lead.offer(seed.j, seed.n, seed.m);
  const byJ = new ScanJ(d, lead, capOf(d));
  const byN = new ScanN(d, lead);
  const C = d.clockF;
  const T = d.targetF;
  const clampJ = (j: number): number => Math.min(d.jMax, Math.max(d.jMin, j));

  // Two cheap probes give an error bound before the span is fixed: the dividers where the
  // longest table holds one cycle and where the S floor is met exactly.
  byJ.run(clampJ(Math.ceil(C / (d.nMax * T))));
  byJ.run(clampJ(Math.floor(C / (d.sFloorF * T))));

  // f_out ≥ C/(J·N max) and f_out ≤ C/(J·S floor): outside these J can only do worse.
  const jLow = (e: number): number => Math.max(d.jMin, Math.floor((C / (d.nMax * (T + e))) * (1 - EDGE)));
  const jHigh = (e: number): number =>
    T - e > 0 ? Math.min(d.jMax, Math.ceil((C / (d.sFloorF * (T - e))) * (1 + EDGE))) : d.jMax;
  // f_out ≥ C/(J max·N): short tables can only do worse below this N.
  const nLow = Math.max(d.nMin, Math.floor((C / (d.jMax * (T + lead.errF))) * (1 - EDGE)));

  const j0 = jLow(lead.errF);
  let j1 = jHigh(lead.errF);
  const lengths = d.powerOfTwo ? d.lengths.filter((n) => n >= nLow) : null;
  const countN = lengths !== null ? lengths.length : d.nMax - nLow + 1;

  if (j1 - j0 + 1 <= countN) {
    // Ascending J: once the leader is exact (and jitter-free in fractional mode) at a J already
    // passed, no later J can beat it — a larger J means a smaller S for the same f_out.
    for (let j = j0; j <= j1; j++) {
      const before = lead.errF;
      byJ.run(j);
      if (lead.errF !== before) {
        j1 = Math.min(j1, jHigh(lead.errF));
        if (lead.errF <= 1e-9 * T && lead.j <= j && lead.j % d.scale === 0 && lead.exact()) break;
      }
    }
  } else if (lengths !== null) {
    for (const n of lengths) byN.run(n);
  } else {
    for (let n = nLow; n <= d.nMax; n++) byN.run(n);
  }
  return lead.result();
}

/** The largest positive M/N ≤ 1/S floor with N ≤ N max; null when there is none. */
function capOf(d: Domain): Cap | null {
  const { lower } = fareyNeighbours(rat(d.sDen, d.sNum), BigInt(d.nMax));
  if (lower.num < 1n) return null;
  return { m: Number(lower.num), n: Number(lower.den), valueF: Number(lower.num) / Number(lower.den) };
}
