/**
 * A least-recently-used map bounded by the bytes its values hold (as the caller counts them), not by their
 * number: for caching values of very different sizes within a fixed memory budget. A value larger than the
 * whole budget is not kept. Map iteration order is insertion order, so re-inserting on every hit keeps the
 * least recently used entry first, and eviction takes from the front.
 */
export class ByteLru<V> {
  private readonly entries = new Map<string, { value: V; bytes: number }>();
  private held = 0;

  constructor(private readonly maxBytes: number) {}

  get(key: string): V | undefined {
    const entry = this.entries.get(key);
    if (!entry) return undefined;
    this.entries.delete(key);
    this.entries.set(key, entry);
    return entry.value;
  }

  set(key: string, value: V, bytes: number): void {
    this.delete(key);
    if (bytes > this.maxBytes) return;
    this.entries.set(key, { value, bytes });
    this.held += bytes;
    for (const [oldest, entry] of this.entries) {
      if (this.held <= this.maxBytes) break;
      this.entries.delete(oldest);
      this.held -= entry.bytes;
    }
  }

  delete(key: string): void {
    const entry = this.entries.get(key);
    if (!entry) return;
    this.entries.delete(key);
    this.held -= entry.bytes;
  }

  /** Bytes held now (never more than the budget). */
  get bytes(): number {
    return this.held;
  }

  get size(): number {
    return this.entries.size;
  }
}
