/**
 * A small least-recently-used map. Analyses are keyed by run, reading count and exclusion count:
 * readings are never changed or deleted, so those counts move whenever the inputs do.
 */
export class LruCache<V> {
  private readonly entries = new Map<string, V>();

  constructor(private readonly capacity: number) {}

  get(key: string): V | undefined {
    const value = this.entries.get(key);
    if (value !== undefined) {
      this.entries.delete(key);
      this.entries.set(key, value);
    }
    return value;
  }

  set(key: string, value: V): void {
    this.entries.delete(key);
    this.entries.set(key, value);
    while (this.entries.size > this.capacity) this.entries.delete(this.entries.keys().next().value!);
  }

  /** Whether any key starts with `prefix` (no reordering). */
  hasPrefix(prefix: string): boolean {
    for (const key of this.entries.keys()) if (key.startsWith(prefix)) return true;
    return false;
  }

  clear(): void {
    this.entries.clear();
  }
}
