/**
 * A technology profile as a file names it (docs/profile.md: "a profile file names only what you
 * change"): the fields that differ from the shipped defaults, with the sources and the
 * description. The designer saves it from the workshop form and puts it in the archive of every
 * document, so the documents can be made again with `latchwright build FILE --profile NAME`.
 */
import { DEFAULT_PROFILE, isJsonObject } from '../../core/index.js';
import type { ProfileSetting } from './protocol.js';

type Value = Readonly<Record<string, unknown>>;

/** The value at a dotted path (`mu`, `frame.longestDrumM`) of a profile value. */
export function valueAt(v: unknown, path: string): unknown {
  return path.split('.').reduce<unknown>((x, k) => (isJsonObject(x) && Object.hasOwn(x, k) ? x[k] : undefined), v);
}

/** True when `x` equals the shipped default at `path` (a group compared field by field). */
function isDefaultAt(path: string, x: unknown): boolean {
  return JSON.stringify(x) === JSON.stringify(valueAt(DEFAULT_PROFILE, path));
}

/**
 * The profile value as a file names it: the fields that differ from the shipped defaults (groups
 * field by field), `cordRouting` when it has entries, the non-empty `sources` and the description.
 */
export function savedValue(v: Value): Record<string, unknown> {
  const out: Record<string, unknown> = {};
  for (const [k, x] of Object.entries(v)) {
    if (k === '$schema') continue;
    if (k === 'sources' && isJsonObject(x)) {
      const given = Object.entries(x).filter(([, s]) => typeof s === 'string' && s.trim() !== '');
      if (given.length > 0) out.sources = Object.fromEntries(given);
    } else if (k === 'cordRouting' && isJsonObject(x)) {
      if (Object.keys(x).length > 0) out.cordRouting = x;
    } else if (k !== 'description' && k !== 'cordRouting' && isJsonObject(x)) {
      const changed = Object.entries(x).filter(([f, y]) => !isDefaultAt(`${k}.${f}`, y));
      if (changed.length > 0) out[k] = Object.fromEntries(changed);
    } else if (k === 'description' || !isDefaultAt(k, x)) out[k] = x;
  }
  return out;
}

/** The text of the profile file to save: JSON, two-space indented, ending in a newline. */
export function profileFileText(s: ProfileSetting): string {
  return `${JSON.stringify(savedValue(s.value), null, 2)}\n`;
}
