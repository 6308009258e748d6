/** A Storage held in a Map, for the controllers' tests: the Web Storage interface as far as keep.ts uses it; `refuse` makes every write throw, as a full or private-window storage does. */
export class MemoryStorage {
  readonly items = new Map<string, string>();
  refuse = false;
  getItem(k: string): string | null {
    return this.items.get(k) ?? null;
  }
  setItem(k: string, v: string): void {
    if (this.refuse) throw new Error('QuotaExceededError');
    this.items.set(k, v);
  }
  removeItem(k: string): void {
    if (this.refuse) throw new Error('QuotaExceededError');
    this.items.delete(k);
  }
}
