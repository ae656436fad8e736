// The whole-samples-per-cycle walk (whole.ts) on a divider of two counter stages. For each S the
// best dividers are the members of the stage set nearest the ideal C/(T·S) on either side — but
// f_out = C/K depends on K = J·S alone, and the best plan has the largest K ≤ K* = C/T or the
// smallest K ≥ K*. So once products close to K* are known on both sides, a divider whose product
// falls outside them cannot win (nor tie) and is not looked for: most S then cost no member query.

import type { Rational } from '../../../shared-schema/src/rational';
import type { StageProducts } from './stages';

export class StageNeighbours {
  /** The largest product J·S ≤ K* offered so far (0: none). */
  private below = 0;
  /** The smallest product J·S ≥ K* offered so far. */
  private above = Infinity;
  /** K* = kStarNum / kStarDen exactly. */
  private readonly kStarNum: bigint;
  private readonly kStarDen: bigint;

  constructor(
    private readonly set: StageProducts,
    private readonly jLo: number,
    private readonly jHi: number,
    clock: Rational,
    target: Rational,
  ) {
    this.kStarNum = clock.num * target.den;
    this.kStarDen = clock.den * target.num;
  }

  /** Sign of k − K*, exactly. */
  private side(k: number): number {
    const l = BigInt(k) * this.kStarDen;
    return l < this.kStarNum ? -1 : l > this.kStarNum ? 1 : 0;
  }

  private note(k: number): void {
    const side = this.side(k);
    if (side <= 0) this.below = Math.max(this.below, k);
    if (side >= 0) this.above = Math.min(this.above, k);
  }

  /**
   * Offers the dividers with S = s samples per cycle that could still beat or tie the best: the
   * nearest member at or below the ideal and the nearest above it, among those whose product lies
   * between the nearest products offered so far below and above K*. (The ideal is a double: a
   * member it puts on the wrong side by rounding is then within rounding of K*, so the member
   * passed over beyond it is far worse.)
   */
  visit(s: number, ideal: number, offer: (j: number) => void): void {
    const lo = Math.max(this.jLo, Math.ceil(this.below / s));
    if (lo > Math.min(this.jHi, Math.floor(this.above / s))) return;
    const mid = Math.min(this.jHi, Math.max(lo, Math.floor(ideal)));
    const a = this.set.prev(lo, mid);
    if (a !== 0) {
      offer(a);
      this.note(a * s);
    }
    const hi = Math.min(this.jHi, Math.floor(this.above / s));
    const b = mid + 1 <= hi ? this.set.next(mid + 1, hi) : 0;
    if (b !== 0) {
      offer(b);
      this.note(b * s);
    }
  }
}
