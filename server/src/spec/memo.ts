// A bounded least-recently-used memo for the spec layer's per-text results (a clock file's
// hardware, a frame, an output's reading). A Map keeps insertion order, so its first key is the
// one used longest ago.

export class Memo<K, V> {
  private readonly entries = new Map<K, V>();

  constructor(readonly capacity: number) {}

  get size(): number {
    return this.entries.size;
  }

  get(key: K, compute: (key: K) => V): V {
    if (this.entries.has(key)) {
      const found = this.entries.get(key) as V;
      this.entries.delete(key);
      this.entries.set(key, found);
      return found;
    }
    const value = compute(key);
    this.entries.set(key, value);
    if (this.entries.size > this.capacity) this.entries.delete(this.entries.keys().next().value as K);
    return value;
  }

  set(key: K, value: V): void {
    this.entries.delete(key);
    this.entries.set(key, value);
    if (this.entries.size > this.capacity) this.entries.delete(this.entries.keys().next().value as K);
  }

  clear(): void {
    this.entries.clear();
  }
}
