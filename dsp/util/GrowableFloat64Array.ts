/** An append-only float64 list that doubles its storage as it grows (no per-item allocation). */
export class GrowableFloat64Array {
  private storage: Float64Array;
  length = 0;

  /** @param initialCapacity items to reserve up front */
  constructor(initialCapacity = 1024) {
    this.storage = new Float64Array(Math.max(1, initialCapacity));
  }

  push(value: number): void {
    if (this.length === this.storage.length) {
      const larger = new Float64Array(this.storage.length * 2);
      larger.set(this.storage);
      this.storage = larger;
    }
    this.storage[this.length++] = value;
  }

  get(index: number): number {
    return this.storage[index];
  }

  /** A view of the items pushed so far (valid until the next push). */
  view(): Float64Array {
    return this.storage.subarray(0, this.length);
  }
}
