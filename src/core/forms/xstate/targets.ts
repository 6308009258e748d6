/**
 * Resolving xstate transition targets in a flat machine, by the rules of xstate v5's
 * `resolveTarget` (read from its source, version 5.33): `#id` and `#id.path` look a node up
 * by id and walk the path below it; `.name` is a child of the node the transition is written
 * on; a plain `name` is a sibling (a child of the parent). In a flat machine the only nodes
 * are the root and its states, so exactly these resolve:
 *   - from a state: `name`, `#<state id>`, `#<machine id>.name`;
 *   - from the root `on`: `.name`, `#<state id>`, `#<machine id>.name`.
 * Anything else is LW200 (a target to the root itself is LW500). We accept a subset of what
 * xstate accepts and never read a target differently from it (tests compare with xstate).
 */
import { didYouMean, printable } from '../../model/diagnostics.js';
import type { Feature } from './features.js';
import type { RawConfig, RawState } from './types.js';

/** A resolved target (a state name) or why it does not resolve. */
export type Resolution =
  | { readonly ok: true; readonly state: string }
  | { readonly ok: false; readonly message: string; readonly hint?: string; readonly feature?: Feature };

/** Split a state path at '.', with '\' escaping the next character (xstate's `toStatePath`). */
export function toStatePath(id: string): string[] {
  const out: string[] = [];
  let seg = '';
  for (let i = 0; i < id.length; i++) {
    const ch = id[i];
    if (ch === '\\') {
      seg += String(id[i + 1]); // as xstate does, a trailing '\' reads the missing character as "undefined"
      i++;
    } else if (ch === '.') {
      out.push(seg);
      seg = '';
    } else seg += ch;
  }
  out.push(seg);
  return out;
}

/** The states of a configuration by name and by id, made once per configuration (not once per target). */
interface StateIndex {
  readonly names: readonly string[];
  readonly byName: ReadonlySet<string>;
  readonly byId: ReadonlyMap<string, string>;
}

const indexes = new WeakMap<RawConfig, StateIndex>();

function indexOf(raw: RawConfig): StateIndex {
  let ix = indexes.get(raw);
  if (ix === undefined) {
    const names = raw.states.map((s) => s.name);
    ix = { names, byName: new Set(names), byId: new Map(raw.states.map((s) => [s.id, s.name])) };
    indexes.set(raw, ix);
  }
  return ix;
}

/** Resolve `target`, written on state `from` (undefined: on the machine root). */
export function resolveTarget(target: string, from: RawState | undefined, raw: RawConfig): Resolution {
  const { names, byName, byId } = indexOf(raw);
  const unknown = (hint?: string): Resolution => ({
    ok: false,
    message: `the target '${printable(target)}' names no state of this flat machine`,
    ...(hint ? { hint } : {}),
  });
  const guessName = (n: string, prefix: string): string | undefined => {
    const g = didYouMean(n, names);
    return g === undefined ? undefined : `did you mean '${prefix}${g}'?`;
  };
  const single = (path: string): string | undefined => {
    const segs = toStatePath(path);
    return segs.length === 1 && byName.has(segs[0]) ? segs[0] : undefined;
  };

  if (target.startsWith('#')) {
    const segs = toStatePath(target);
    const head = segs[0].slice(1);
    const rest = segs.slice(1);
    if (head === raw.rootId) {
      if (rest.length === 0 || (rest.length === 1 && rest[0] === ''))
        return { ok: false, message: `the target '${printable(target)}' is the machine root`, feature: 'rootTarget' };
      if (rest.length === 1 && byName.has(rest[0])) return { ok: true, state: rest[0] };
      return unknown(
        rest.length === 1 ? guessName(rest[0], `#${raw.rootId}.`) : 'a flat machine has no states inside states',
      );
    }
    const hit = byId.get(head);
    if (hit !== undefined && rest.length === 0) return { ok: true, state: hit };
    if (hit !== undefined) return unknown(`state '${hit}' has no child states; write '#${head}'`);
    const g = didYouMean(head, [...byId.keys(), raw.rootId]);
    return unknown(
      g !== undefined
        ? `did you mean '#${g}'?`
        : `ids here: ${[raw.rootId, ...byId.keys()].map((i) => '#' + i).join(', ')}`,
    );
  }
  if (from === undefined) {
    if (target === '.') return { ok: false, message: `the target '.' is the machine root`, feature: 'rootTarget' };
    if (target.startsWith('.')) {
      const s = single(target.slice(1));
      return s !== undefined ? { ok: true, state: s } : unknown(guessName(target.slice(1), '.'));
    }
    // xstate rejects a plain name on the root too: the root has no siblings.
    return unknown(byName.has(target) ? `on the machine root a state is written '.${target}'` : guessName(target, '.'));
  }
  if (target.startsWith('.')) {
    const child = target.slice(1);
    return unknown(
      `'${printable(target)}' names a child of state '${from.name}', and states of a flat machine have none${byName.has(child) ? `; write '${child}' for the state '${child}'` : ''}`,
    );
  }
  const s = single(target);
  return s !== undefined ? { ok: true, state: s } : unknown(guessName(target, ''));
}
