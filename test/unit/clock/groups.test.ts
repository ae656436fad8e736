// Outputs planned together, proven by exhaustive search on small domains: a shared sample clock
// (every divider tried, each member's table by the plain exhaustive oracle of the planner), a
// phase-locked group (every divider, table length and fundamental cycle count), and the
// whole-sample rotation that realises a phase offset (every rotation tried).
import { describe, expect, it } from 'vitest';
import { type Rational, ZERO, abs, add, cmp, div, mul, rat, sub } from '../../../shared-schema/src/rational';
import { planOutputUncached } from '../../../server/src/planning/choose';
import { fundamentalOf, phaseRotation, planPhaseGroup, planSharedClock } from '../../../server/src/planning/groups';
import type { Hardware, OutputRequest } from '../../../server/src/planning/types';
import { exhaustivePlan, planKey } from '../../support/exhaustive';
import { seededRandom } from '../../support/seeded';

const sine = { shape: 'sine' as const, duty: 0.5, amplitudeVpp: 1, offsetV: 1 };

function smallBoard(random: () => number) {
  const pick = (lo: number, hi: number) => lo + Math.floor(random() * (hi - lo + 1));
  const e = [ZERO, rat(100n, 1_000_000n)][pick(0, 1)]!;
  const hw: Hardware = {
    systemClockHz: rat(pick(1000, 20000)),
    systemClockTolerance: e,
    divider: { integerMin: pick(1, 3), integerMax: pick(4, 40), fractionBits: 0 },
    dac: { bits: 10, sampleBytes: 2, fullScaleV: 3.3, maxSampleRateHz: rat(pick(500, 20000)) },
    memory: { budgetBytes: 2 * pick(32, 256), tableLengthMin: pick(2, 8), tableLengthMax: pick(16, 64), powerOfTwo: random() < 0.3 },
  };
  return { hw, pick };
}

const request = (target: Rational, ppm: number, sFloor: number, whole = false): OutputRequest => ({
  targetHz: target,
  minSamplesPerCycle: rat(sFloor),
  wholeSamplesPerCycle: whole,
  waveform: sine,
  toleranceHz: { num: target.num * BigInt(ppm), den: target.den * 1_000_000n },
  jitter: 'forbid',
});

/** |error| + e·f_achieved over the tolerance, or Infinity (derived: the worst case with the clock's tolerance). */
function share(p: { achievedHz: Rational; errorHz: Rational } | null, req: OutputRequest, e: Rational): Rational | null {
  if (!p) return null;
  const worst = add(abs(p.errorHz), mul(e, p.achievedHz));
  if (req.toleranceHz.num === 0n) return worst.num === 0n ? ZERO : null;
  return div(worst, req.toleranceHz);
}

describe('a shared sample clock = the best divider for all members, tried one by one (exhaustive oracle per member)', () => {
  it('identical plans on 150 seeded small boards of 2–3 members', () => {
    const random = seededRandom(4242);
    let groups = 0;
    for (let k = 0; k < 150; k++) {
      const { hw, pick } = smallBoard(random);
      const reqs = Array.from({ length: pick(2, 3) }, () => request(rat(pick(1, 2000), pick(1, 7)), [10, 1000, 20000, 100000][pick(0, 3)]!, pick(3, 8), random() < 0.3));
      const e = hw.systemClockTolerance!;
      // Oracle: every divider, each member's best table for it, ranked by the stated keys.
      let best: { key: (number | Rational | null)[]; plans: string[] } | null = null;
      for (let d = hw.divider.integerMin; d <= hw.divider.integerMax; d++) {
        const fixed: Hardware = { ...hw, divider: { integerMin: d, integerMax: d, fractionBits: 0 } };
        const plans = reqs.map((r) => exhaustivePlan(fixed, r, false, r.wholeSamplesPerCycle));
        const shares = plans.map((p, i) => share(p, reqs[i]!, e));
        const within = shares.filter((s) => s !== null && cmp(s, rat(1)) <= 0).length;
        const exact = plans.filter((p) => p !== null && p.errorHz.num === 0n).length;
        const worst = shares.some((s) => s === null) ? null : shares.reduce<Rational>((m, s) => (cmp(s!, m) > 0 ? s! : m), ZERO);
        const bytes = plans.reduce((n, p) => n + (p ? p.tableLength * hw.dac.sampleBytes : 0), 0);
        const better = (): boolean => {
          if (!best) return true;
          const [bw, be, bs, bb] = best.key as [number, number, Rational | null, number];
          if (within !== bw) return within > bw;
          if (exact !== be) return exact > be;
          if ((worst === null) !== (bs === null)) return bs === null;
          if (worst && bs && cmp(worst, bs) !== 0) return cmp(worst, bs) < 0;
          return bytes < bb;
        };
        if (better()) best = { key: [within, exact, worst, bytes], plans: plans.map(planKey) };
      }
      const got = planSharedClock(hw, reqs, reqs.map((r) => planOutputUncached(hw, r)));
      expect(got.plans.map((p) => planKey(p.plan)), `board ${k}`).toEqual(best!.plans);
      groups++;
    }
    console.log(`shared sample clock vs exhaustive: ${groups} groups, 0 mismatches`);
  });
});

describe('a phase-locked group = the best (D, N, M) with every member at m_i·M cycles (brute force)', () => {
  it('identical plans on 200 seeded small boards; every member has the same relative error', () => {
    const random = seededRandom(777);
    for (let k = 0; k < 200; k++) {
      const { hw, pick } = smallBoard(random);
      const base = rat(pick(1, 500), pick(1, 5));
      const reqs = Array.from({ length: pick(2, 3) }, (_, i) => request(mul(base, rat(i === 0 ? 1 : pick(1, 4))), 50, pick(3, 6)));
      const tables = reqs.length;
      const { multiples } = fundamentalOf(reqs);
      const g = div(reqs[0]!.targetHz, rat(multiples[0]!));
      // Brute force: the fundamental's nearest plan, ties larger S, shorter N, lower f (the planner's documented order).
      let best: { err: Rational; s: Rational; n: number; f: Rational; d: number; m: number } | null = null;
      const nMax = Math.min(hw.memory.tableLengthMax, Math.floor(hw.memory.budgetBytes / tables / hw.dac.sampleBytes));
      for (let d = hw.divider.integerMin; d <= hw.divider.integerMax; d++) {
        if (cmp(div(hw.systemClockHz, rat(d)), hw.dac.maxSampleRateHz) > 0) continue;
        for (let n = hw.memory.tableLengthMin; n <= nMax; n++) {
          if (hw.memory.powerOfTwo && (n & (n - 1)) !== 0) continue;
          for (let m = 1; m <= n; m++) {
            if (reqs.some((r, i) => cmp(rat(n), mul(r.minSamplesPerCycle, rat(BigInt(m) * multiples[i]!))) < 0)) continue;
            const f = div(mul(hw.systemClockHz, rat(m)), rat(d * n));
            const err = abs(sub(f, g));
            const s = rat(n, m);
            const c = best === null ? -1 : cmp(err, best.err) || -cmp(s, best.s) || n - best.n || cmp(f, best.f);
            if (c < 0) best = { err, s, n, f, d, m };
          }
        }
      }
      const got = planPhaseGroup(hw, reqs, reqs.map((r) => planOutputUncached(hw, r)), reqs.map(() => 0), tables);
      if (best === null) {
        expect(got.plans.every((p) => p.plan === null), `board ${k}`).toBe(true);
        continue;
      }
      got.plans.forEach((p, i) => {
        expect([p.plan!.dividerInteger, p.plan!.tableLength, Number(p.plan!.cycles.num)], `board ${k} member ${i}`).toEqual([best!.d, best!.n, best!.m * Number(multiples[i]!)]);
        expect(div(p.plan!.errorHz, reqs[i]!.targetHz)).toEqual(div(got.plans[0]!.plan!.errorHz, reqs[0]!.targetHz));
      });
    }
  });
});

describe('phase offsets as whole-sample rotations (every rotation tried)', () => {
  it('the nearest reachable phase and its error, on 500 seeded (offset, M, N)', () => {
    const random = seededRandom(31);
    for (let k = 0; k < 500; k++) {
      const n = 2 + Math.floor(random() * 300);
      const m = 1 + Math.floor(random() * n);
      const offset = Math.round(random() * 7200) / 10 - 360;
      const got = phaseRotation(offset, m, n, 1000);
      let bestErr = Infinity;
      for (let r = 0; r < n; r++) {
        let err = (r * m) / n - offset / 360;
        err -= Math.round(err);
        if (Math.abs(err) < bestErr - 1e-12) bestErr = Math.abs(err);
      }
      expect(Math.abs(got.errorDeg / 360), `case ${k}`).toBeCloseTo(bestErr, 9);
      // The rotation realises what it says: k·M/N cycles (mod 1).
      expect((((got.rotation * m) % n) / n) * 360).toBeCloseTo(got.realisedDeg, 9);
    }
  });
  it('90° on a 3072-sample table of one cycle is a rotation of 768 samples, exactly (derived)', () => {
    expect(phaseRotation(90, 1, 3072, 5000)).toMatchObject({ rotation: 768, realisedDeg: 90, errorDeg: 0, errorS: 0 });
  });
});
