/**
 * The browser's local storage, guarded. Private windows and full disks throw, and losing the
 * autosave must never stop the designer. Every entry is read defensively: a value that does
 * not have the shape its reader expects (broken JSON, an unknown name, another program's
 * leftovers) is never used and never overwritten — it is moved aside under
 * `latchwright.aside.<key>` (or `.2`, `.3`, …), and the page says so once at start-up. Only
 * then is the entry free to be written again.
 */

const PREFIX = 'latchwright.';
/** How many set-aside copies of one entry are kept before the page stops setting more aside. */
const ASIDE_SLOTS = 9;

/** Every entry the designer keeps, and what it holds, in words (for the notice). */
export const KEPT_ENTRIES = {
  text: "the machine's text",
  file: 'the file name',
  'file-named': 'whether the file name was chosen by hand',
  dirty: 'whether the text was saved to a file',
  previous: 'the earlier machine',
  view: 'the view shown',
  theme: 'the colour theme',
  encoding: 'the codes chosen for the build',
  unused: 'where unused codes go',
  profile: "the workshop's technology profile",
  pins: 'the parts kept in a bay',
  places: 'where states were moved in the sketch',
  shakedown: 'how far the commissioning sheet was walked, and what was seen',
  written: "the page's own links",
} as const;

export type KeptKey = keyof typeof KEPT_ENTRIES;

/** An entry that could not be read, and where its value now is. */
export interface SetAside {
  readonly key: KeptKey;
  /** The storage key holding the value now (with the prefix), or undefined when storage refused the copy. */
  readonly aside: string | undefined;
}

const setAside: SetAside[] = [];
/** Entries holding a value that could not be set aside: never written over. */
const held = new Set<KeptKey>();

function storage(): Storage | undefined {
  try {
    return globalThis.localStorage ?? undefined;
  } catch {
    return undefined;
  }
}

/** The raw value of an entry, or undefined (absent, or storage unreadable). */
export function keepGet(key: KeptKey): string | undefined {
  try {
    return storage()?.getItem(PREFIX + key) ?? undefined;
  } catch {
    return undefined;
  }
}

/**
 * The value of an entry as `parse` reads it; undefined when absent. A value `parse` refuses
 * (returns undefined or throws) is set aside (see the file comment) and undefined returned.
 */
export function keepRead<T>(key: KeptKey, parse: (raw: string) => T | undefined): T | undefined {
  const raw = keepGet(key);
  if (raw === undefined) return undefined;
  let value: T | undefined;
  try {
    value = parse(raw);
  } catch {
    value = undefined;
  }
  if (value !== undefined) return value;
  putAside(key, raw);
  return undefined;
}

/** A JSON entry's value, or undefined when it is not JSON. */
export function parseJson(raw: string): unknown {
  try {
    return JSON.parse(raw) as unknown;
  } catch {
    return undefined;
  }
}

function putAside(key: KeptKey, raw: string): void {
  const s = storage();
  for (let n = 1; s && n <= ASIDE_SLOTS; n++) {
    const name = `${PREFIX}aside.${key}${n === 1 ? '' : `.${n}`}`;
    try {
      const there = s.getItem(name);
      if (there !== null && there !== raw) continue;
      s.setItem(name, raw);
      s.removeItem(PREFIX + key);
      setAside.push({ key, aside: name });
      return;
    } catch {
      break;
    }
  }
  held.add(key);
  setAside.push({ key, aside: undefined });
}

/** The entries set aside since the last call (the page shows them once). */
export function takeSetAside(): SetAside[] {
  return setAside.splice(0);
}

/** Store a value; false when the browser refused (or the entry holds a value that could not be set aside). */
export function keepSet(key: KeptKey, value: string): boolean {
  if (held.has(key)) return false;
  try {
    const s = storage();
    if (!s) return false;
    s.setItem(PREFIX + key, value);
    return true;
  } catch {
    return false;
  }
}

export function keepDrop(key: KeptKey): void {
  if (held.has(key)) return;
  try {
    storage()?.removeItem(PREFIX + key);
  } catch {
    // nothing to drop
  }
}

/** A bounded, plain file name: no folders, no control characters. */
export function isFileName(v: unknown): v is string {
  return (
    typeof v === 'string' &&
    v.length > 0 &&
    v.length <= 120 &&
    v !== '.' &&
    v !== '..' &&
    // eslint-disable-next-line no-control-regex -- control characters are exactly what is refused
    !/[/\\\u0000-\u001f\u007f]/.test(v)
  );
}

/** '1' or '0' as a flag. */
export function parseFlag(raw: string): boolean | undefined {
  return raw === '1' ? true : raw === '0' ? false : undefined;
}
