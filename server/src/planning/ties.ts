// Every plan at one given error, ranked by an output's preferences: the nearest plan of the
// search breaks its ties towards larger S, but the output's ranking (ranking.ts) counts S only up
// to S max and then prefers the shorter table. Plans at error e have f_out = f_target ± e, and
// with f_out/C = a/b in lowest terms (C = f_sys·2^k) a plan (J, N) has that f_out exactly when b
// divides J·N (M = a·J·N/b), with S = b/(a·J) ≥ S floor bounding J from above.
//
// For each divisor n of b that an allowed N is a multiple of, the shortest such N and the best J
// for it (the multiples of b/gcd(b, N): the quietest F, then the smallest J at or above the J of
// S max, or the smallest of all) are candidates; the best plan of the ranking is among them,
// since any plan's N can be shortened to its class's shortest without losing a divider.

import { type Rational, div, gcdNumber, rat } from '../../../shared-schema/src/rational';
import { divisorsInRange } from './divisors';
import { type Domain, achievedHz, maxCycles } from './domain';
import { lengthMultiple, quietestMultiple } from './exact';
import { type Preference, bestRanked, frequenciesAt } from './ranking';
import type { Plan } from './types';

const divisors: number[] = [];

/**
 * The best plan of the ranking among every plan of the domain with |error| = e; `fallback` (a
 * plan at that error, marked as not proven) when the number theory is out of reach.
 */
export function bestAtError(d: Domain, e: Rational, pref: Preference, fractionBits: number, fallback: Plan): Plan {
  const plans: Plan[] = [];
  for (const f of frequenciesAt(d.target, e)) {
    const r = div(f, d.clock);
    if (r.num <= 0n) continue;
    if (r.den > BigInt(d.jMax) * BigInt(d.nMax)) continue;
    if (r.den >= 2n ** 52n || r.num >= 2n ** 52n) return { ...fallback, searchLimited: true };
    plansOfRatio(d, Number(r.num), Number(r.den), pref, fractionBits, plans);
  }
  const fractional = d.mode === 'fractional';
  return bestRanked(plans, pref, fractional) ?? fallback;
}

function plansOfRatio(d: Domain, a: number, b: number, pref: Preference, fractionBits: number, out: Plan[]): void {
  // S = b/(a·J) ≥ S floor  ⇔  J ≤ b·sDen/(a·sNum); S ≤ S max  ⇔  J ≥ b·cDen'/(a·cNum').
  const jHi = Math.min(d.jMax, Number((BigInt(b) * d.sDen) / (BigInt(a) * d.sNum)));
  if (jHi < d.jMin) return;
  const cap = pref.maxSamplesPerCycle;
  const jCap = cap === null ? d.jMin : Math.max(d.jMin, Number((BigInt(b) * cap.den + BigInt(a) * cap.num - 1n) / (BigInt(a) * cap.num)));
  divisorsInRange(b, Math.ceil(b / jHi), d.nMax, divisors);
  for (const n of divisors) {
    const len = lengthMultiple(d, n);
    if (len === 0) continue;
    const g = b / gcdNumber(b, len);
    for (const lo of jCap > d.jMin ? [jCap, d.jMin] : [d.jMin]) {
      if (lo > jHi) continue;
      const t = d.scale > 1 ? quietestMultiple(d.scale, g, Math.ceil(lo / g), Math.floor(jHi / g)) : Math.ceil(lo / g);
      const j = g * t;
      if (t === 0 || j > jHi) continue;
      // b divides J·N by construction; the products may pass 2^53, so in bigints.
      const m = BigInt(a) * ((BigInt(j) * BigInt(len)) / BigInt(b));
      if (m < 1n || m > BigInt(maxCycles(d, len))) continue;
      const f = achievedHz(d, j, len, Number(m));
      out.push({
        dividerInteger: Math.floor(j / d.scale),
        dividerFraction: j % d.scale,
        fractionBits,
        tableLength: len,
        cycles: rat(m),
        achievedHz: f,
        errorHz: rat(f.num * d.target.den - d.target.num * f.den, f.den * d.target.den),
      });
    }
  }
}
