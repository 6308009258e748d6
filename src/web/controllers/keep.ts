/**
 * The browser's local storage, guarded: private windows and full disks throw, and losing the
 * autosave must never stop the designer.
 */

const PREFIX = 'latchwright.';

export function keepGet(key: string): string | undefined {
  try {
    return globalThis.localStorage?.getItem(PREFIX + key) ?? undefined;
  } catch {
    return undefined;
  }
}

/** Store a value; false when the browser refused. */
export function keepSet(key: string, value: string): boolean {
  try {
    globalThis.localStorage?.setItem(PREFIX + key, value);
    return true;
  } catch {
    return false;
  }
}

export function keepDrop(key: string): void {
  try {
    globalThis.localStorage?.removeItem(PREFIX + key);
  } catch {
    // nothing to drop
  }
}
