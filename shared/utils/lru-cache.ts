/**
 * A small least-recently-used cache bounded by total weight (points held, entries...).
 * Per process: every app server keeps its own. Keys are built from row versions or
 * from the content itself, so a change anywhere simply makes a new key and the old
 * entry ages out.
 */
export class LruCache<V> {
  private readonly entries = new Map<string, { value: V, weight: number }>()
  private total = 0

  constructor(private readonly maxWeight: number, private readonly weigh: (value: V) => number = () => 1) {}

  get(key: string): V | undefined {
    const hit = this.entries.get(key)
    if (!hit) return undefined
    this.entries.delete(key)
    this.entries.set(key, hit)
    return hit.value
  }

  /** The value without making it the most recently used. */
  peek(key: string): V | undefined {
    return this.entries.get(key)?.value
  }

  keys(): string[] {
    return [...this.entries.keys()]
  }

  set(key: string, value: V): void {
    const weight = this.weigh(value)
    if (weight > this.maxWeight) return
    this.delete(key)
    this.entries.set(key, { value, weight })
    this.total += weight
    for (const [oldest, entry] of this.entries) {
      if (this.total <= this.maxWeight) break
      this.entries.delete(oldest)
      this.total -= entry.weight
    }
  }

  delete(key: string): void {
    const hit = this.entries.get(key)
    if (!hit) return
    this.entries.delete(key)
    this.total -= hit.weight
  }

  clear(): void {
    this.entries.clear()
    this.total = 0
  }

  get size(): number { return this.entries.size }
}
