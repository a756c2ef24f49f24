/**
 * Fits kept by the key of the day they were made for, at most `capacity` of them (the oldest kept goes
 * first). A fit depends only on the days before its day, so a kept one is the same as a new one: the
 * store only saves time.
 */
export class KeptFits<K, V> {
  private readonly kept = new Map<K, V>();

  constructor(private readonly capacity = 16) {}

  get(key: K): V | undefined {
    return this.kept.get(key);
  }

  set(key: K, fit: V): void {
    if (this.kept.size >= this.capacity) this.kept.delete(this.kept.keys().next().value as K);
    this.kept.set(key, fit);
  }
}
