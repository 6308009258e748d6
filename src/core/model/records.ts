/**
 * Records keyed by names the user gave (states, inputs, outputs). A plain object literal
 * inherits from Object.prototype, so a name such as `__proto__`, `constructor` or `toString`
 * would read an inherited member, or (for `__proto__`) replace the prototype when written.
 * Records made here have no prototype: every name is an ordinary key. Reading a record that
 * came from elsewhere (a JSON file), use `ownValue`.
 */

/** An empty record without a prototype. */
export function nameRecord<T>(): Record<string, T> {
  return Object.create(null) as Record<string, T>;
}

/** A record without a prototype holding `entries` (a later entry for a key wins). */
export function nameRecordOf<T>(entries: Iterable<readonly [string, T]>): Record<string, T> {
  const r = nameRecord<T>();
  for (const [k, v] of entries) r[k] = v;
  return r;
}

/** The value stored under `key` itself, never an inherited member of Object.prototype. */
export function ownValue<T>(rec: Readonly<Record<string, T>> | undefined, key: string): T | undefined {
  return rec !== undefined && Object.prototype.hasOwnProperty.call(rec, key) ? rec[key] : undefined;
}

/** True for a JSON object (not null, not an array): a record whose keys came from a file. */
export function isJsonObject(v: unknown): v is Record<string, unknown> {
  return typeof v === 'object' && v !== null && !Array.isArray(v);
}
