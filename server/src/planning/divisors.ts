// Divisors of a whole number that fall inside a window, for the searches that ask "which table
// lengths N divide this product K = J·N?". Only divisors up to the window's top matter, so trial
// division never goes past it: a prime factor above the top can never be part of such a divisor.
//
// All values are doubles holding integers below 2^52. For such k and n, k/n rounds to an integer
// only when n divides k (a quotient that misses an integer misses it by at least 1/n, more than
// the rounding can move it), so one division is an exact divisibility test.

/**
 * The largest window top (table length) the searches factor up to: the prime table grows to it,
 * so it bounds that table's memory. Domains with longer tables are left to the walk.
 */
export const DIVISOR_REACH = 1 << 22;

/** n divides k, for integers 0 < n and 0 ≤ k < 2^52. */
function divides(k: number, n: number): boolean {
  return Number.isInteger(k / n);
}

let primes = new Int32Array(0);
/** 1/p for each prime: a product tells "cannot divide" faster than a quotient. */
let reciprocals = new Float64Array(0);
let primesLimit = 1;

/** The primes up to limit (at least), ascending; a shared table grown on demand. */
export function primesUpTo(limit: number): Int32Array {
  if (limit <= primesLimit) return primes;
  const top = Math.max(limit, 2 * primesLimit, 1024);
  const composite = new Uint8Array(top + 1);
  const found: number[] = [];
  for (let p = 2; p <= top; p++) {
    if (composite[p] === 1) continue;
    found.push(p);
    for (let q = p * p; q <= top; q += p) composite[q] = 1;
  }
  primes = Int32Array.from(found);
  reciprocals = Float64Array.from(found, (p) => 1 / p);
  primesLimit = top;
  return primes;
}

// Scratch space reused from call to call: the hot loops allocate nothing.
const factorPrimes: number[] = [];
const factorPowers: number[] = [];
const built: number[] = [];

/**
 * Writes every divisor n of k with lo ≤ n ≤ hi into out (cleared first, not sorted) and returns
 * their count. Whichever is cheapest: testing each n in the window, each cofactor k/n, or
 * factoring k over the primes up to hi.
 */
export function divisorsInRange(k: number, lo: number, hi: number, out: number[]): number {
  out.length = 0;
  if (lo < 1) lo = 1;
  if (hi > k) hi = k;
  if (lo > hi) return 0;
  const width = hi - lo + 1;
  const coLo = Math.ceil(k / hi);
  const coHi = Math.floor(k / lo);
  const coWidth = coHi - coLo + 1;
  // Trial division costs about one step per prime up to min(hi, √k): x / ln x of them.
  const reach = Math.min(hi, Math.sqrt(k));
  const primeCost = reach / Math.log(reach + 2);
  if (width <= coWidth && width <= primeCost) {
    for (let n = lo; n <= hi; n++) if (divides(k, n)) out.push(n);
    return out.length;
  }
  if (coWidth <= primeCost) {
    for (let c = coLo; c <= coHi; c++) if (divides(k, c)) out.push(k / c);
    return out.length;
  }
  factorBelow(k, hi);
  built.length = 0;
  built.push(1);
  for (let f = 0; f < factorPrimes.length; f++) {
    const p = factorPrimes[f]!;
    const e = factorPowers[f]!;
    const size = built.length;
    for (let i = 0; i < size; i++) {
      let v = built[i]!;
      for (let t = 1; t <= e; t++) {
        v *= p;
        if (v > hi) break;
        built.push(v);
      }
    }
  }
  for (const n of built) if (n >= lo) out.push(n);
  return out.length;
}

/** Fills factorPrimes/factorPowers with the prime powers of k whose prime is ≤ hi. */
function factorBelow(k: number, hi: number): void {
  factorPrimes.length = 0;
  factorPowers.length = 0;
  // Past the prime table's reach, trial division by 2, 3 and the numbers 6t ± 1 (a few tens of
  // milliseconds at most for k < 2^52): it keeps the table, and so the memory, bounded.
  if (Math.min(hi, Math.sqrt(k)) > DIVISOR_REACH) return factorByWheel(k, hi);
  const table = primesUpTo(Math.min(hi, Math.ceil(Math.sqrt(k))));
  const inverse = reciprocals;
  // For p | rest, rest·(1/p) misses rest/p by under rest·2^-52/p, so below 2^50 a miss of
  // 0.5/p or more proves p does not divide; what passes is confirmed by an exact quotient.
  const quick = k < 2 ** 50;
  let rest = k;
  for (let i = 0; i < table.length; i++) {
    const p = table[i]!;
    if (p > hi) return;
    if (p * p > rest) break;
    if (quick) {
      const t = rest * inverse[i]!;
      if (Math.abs(t - Math.round(t)) * p >= 0.5) continue;
    }
    if (!divides(rest, p)) continue;
    let e = 0;
    do {
      rest /= p;
      e++;
    } while (divides(rest, p));
    factorPrimes.push(p);
    factorPowers.push(e);
  }
  // The walk stopped at a prime above √rest (or ran past √k): what remains is 1 or a prime.
  if (rest > 1 && rest <= hi) {
    factorPrimes.push(rest);
    factorPowers.push(1);
  }
}

function factorByWheel(k: number, hi: number): void {
  let rest = k;
  const take = (p: number): void => {
    if (!divides(rest, p)) return;
    let e = 0;
    do {
      rest /= p;
      e++;
    } while (divides(rest, p));
    factorPrimes.push(p);
    factorPowers.push(e);
  };
  take(2);
  take(3);
  for (let p = 5; p <= hi && p * p <= rest; p += 6) {
    take(p);
    if (p + 2 <= hi) take(p + 2);
  }
  if (rest > 1 && rest <= hi) {
    factorPrimes.push(rest);
    factorPowers.push(1);
  }
}
