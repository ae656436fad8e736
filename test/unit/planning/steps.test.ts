// Frequency steps on one table against the exhaustive oracle (test/support/steps-oracle.ts: every
// table, every divider, exact rationals) on seeded small domains, plus a worked example.

import { describe, expect, it } from 'vitest';
import { planSteps } from '../../../server/src/planning/steps';
import { exhaustiveSteps, randomStepsCase, stepsKey } from '../../support/steps-oracle';
import { seededRandom } from '../../support/seeded';

describe('steps on one table = exhaustive search over every table and divider (oracle: test/support/steps-oracle.ts)', () => {
  it('identical tables and dividers on 500 seeded small domains', () => {
    const rnd = seededRandom(0x57e95);
    const mismatches: string[] = [];
    let within = 0, fractional = 0, outside = 0;
    for (let i = 0; i < 500; i++) {
      const { hw, q } = randomStepsCase(rnd);
      const oracle = exhaustiveSteps(hw, q);
      const got = planSteps(hw, q);
      const plan = got === null ? null : { tableLength: got.steps[0]!.tableLength, cycles: got.steps[0]!.cycles, steps: got.steps };
      if (stepsKey(plan) !== stepsKey(oracle)) mismatches.push(`#${i}: ${stepsKey(plan)}\n   vs oracle ${stepsKey(oracle)}`);
      if (oracle?.within) within++;
      else if (oracle) outside++;
      if (oracle?.steps.some((s) => s.dividerFraction !== 0)) fractional++;
      if (got !== null && got.steps.some((s) => s.searchLimited)) mismatches.push(`#${i}: search limited on a small domain`);
    }
    console.log(`steps planner vs exhaustive: 500 domains, ${within} within tolerance, ${outside} outside, ${fractional} with fractional steps, ${mismatches.length} mismatches`);
    expect(mismatches.slice(0, 6)).toEqual([]);
    expect(within).toBeGreaterThan(50);
    expect(outside).toBeGreaterThan(25);
  });
});
