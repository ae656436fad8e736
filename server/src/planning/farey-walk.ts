// Every fraction a/b with 1 ≤ b ≤ n in a window [lo, hi], in ascending order: the Farey sequence
// of order n walked from the window's left end. Consecutive terms p/q < a/b of that sequence give
// the next one as (k·a − p)/(k·b − q) with k = ⌊(n + q)/b⌋ (the classical recurrence; Hardy &
// Wright, An Introduction to the Theory of Numbers, ch. III), so each step costs a few integer
// operations and nothing between two terms is skipped. All values are whole doubles below 2^53.

import { FloatNeighbours, fareyFloat } from './farey';

const out = new FloatNeighbours();

/** x·y ≡ 1 (mod m) for coprime x, m ≥ 1: the y in [0, m). */
function inverseMod(x: number, m: number): number {
  let [r0, r1] = [m, x % m];
  let [t0, t1] = [0, 1];
  while (r1 !== 0) {
    const q = Math.floor(r0 / r1);
    [r0, r1] = [r1, r0 - q * r1];
    [t0, t1] = [t1, t0 - q * t1];
  }
  return ((t0 % m) + m) % m;
}

/**
 * Calls visit(a, b) for each fraction a/b in [lo, hi] (0 < lo ≤ hi) with b ≤ n, a ≥ 1, lowest
 * terms, ascending; a little more on either side may be visited (the endpoints are doubles). Stops
 * early when visit returns false. Returns the number of fractions visited.
 */
export function walkFractions(lo: number, hi: number, n: number, visit: (a: number, b: number) => boolean): number {
  if (!(lo > 0) || !(hi >= lo) || n < 1) return 0;
  // The first term at or just below lo (a near hit counts as the term itself).
  fareyFloat(lo * (1 - 1e-12), n, Infinity, out);
  if (out.upperDen === 0) return 0;
  let a = out.upperNum;
  let b = out.upperDen;
  // Its predecessor p/q: a·q − b·p = 1 with the largest q ≤ n.
  let q: number, p: number;
  if (b === 1) {
    q = n;
    p = a * n - 1;
  } else {
    const q0 = inverseMod(a % b, b);
    q = q0 + b * Math.floor((n - q0) / b);
    p = (a * q - 1) / b;
  }
  let count = 0;
  while (a <= hi * (1 + 1e-12) * b) {
    count++;
    if (!visit(a, b)) break;
    const k = Math.floor((n + q) / b);
    const na = k * a - p;
    const nb = k * b - q;
    p = a;
    q = b;
    a = na;
    b = nb;
  }
  return count;
}
