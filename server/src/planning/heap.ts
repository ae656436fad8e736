// A binary min-heap of (key, cycles, product, step) entries in typed arrays: the frontier of the
// best-first search in cycles.ts. One instance is reused across searches, so a search allocates
// only when it needs more room than any search before it.

export class ProductHeap {
  private keys = new Float64Array(64);
  private cyc = new Float64Array(64);
  private prod = new Float64Array(64);
  private steps = new Int8Array(64);
  size = 0;

  clear(): void {
    this.size = 0;
  }

  push(key: number, cycles: number, product: number, step: number): void {
    if (this.size === this.keys.length) this.grow();
    let i = this.size++;
    // Sift up: move parents down until the new key's place is found.
    while (i > 0) {
      const parent = (i - 1) >> 1;
      if (this.keys[parent]! <= key) break;
      this.put(i, parent);
      i = parent;
    }
    this.keys[i] = key;
    this.cyc[i] = cycles;
    this.prod[i] = product;
    this.steps[i] = step;
  }

  /** Smallest key; the heap must not be empty. */
  topKey(): number {
    return this.keys[0]!;
  }
  topCycles(): number {
    return this.cyc[0]!;
  }
  topProduct(): number {
    return this.prod[0]!;
  }
  topStep(): number {
    return this.steps[0]!;
  }

  /** Removes the smallest entry. */
  pop(): void {
    const last = --this.size;
    if (last === 0) return;
    const key = this.keys[last]!;
    let i = 0;
    for (;;) {
      let child = 2 * i + 1;
      if (child >= last) break;
      if (child + 1 < last && this.keys[child + 1]! < this.keys[child]!) child++;
      if (this.keys[child]! >= key) break;
      this.put(i, child);
      i = child;
    }
    this.put(i, last);
  }

  private put(to: number, from: number): void {
    this.keys[to] = this.keys[from]!;
    this.cyc[to] = this.cyc[from]!;
    this.prod[to] = this.prod[from]!;
    this.steps[to] = this.steps[from]!;
  }

  private grow(): void {
    const size = this.keys.length * 2;
    const keys = new Float64Array(size);
    const cyc = new Float64Array(size);
    const prod = new Float64Array(size);
    const steps = new Int8Array(size);
    keys.set(this.keys);
    cyc.set(this.cyc);
    prod.set(this.prod);
    steps.set(this.steps);
    this.keys = keys;
    this.cyc = cyc;
    this.prod = prod;
    this.steps = steps;
  }
}
