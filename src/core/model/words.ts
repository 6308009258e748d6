/**
 * Counts in words, for the reports a person reads: `1 state`, `2 states`. English plurals
 * only; a noun whose plural is not its singular with an `s` gives its plural.
 */

/** `k` with its noun: the singular for exactly one, else the plural (default: the noun with an `s`). */
export function counted(k: number, noun: string, plural = `${noun}s`): string {
  return `${k} ${k === 1 ? noun : plural}`;
}
