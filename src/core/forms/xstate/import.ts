/**
 * Import a flat xstate v5 configuration as a Machine (the mapping is documented in
 * docs/xstate.md).
 *
 * Method: each event type becomes one operator lever (an input); a state's transitions for
 * event E become transitions guarded by the lever E; "at most one lever per clock" becomes a
 * `never` constraint `a & b` for every pair of levers; a clock with no lever pulled (or a
 * lever the state does not answer to) holds (`unspecified: hold`), as xstate ignores an event
 * no state handles. Machine-level `on` transitions apply in every state that does not handle
 * the event itself, as xstate v5 lets an unhandled event bubble from a state to the root.
 * Outputs come from `meta.outputs` on states (Moore), `meta.outputs` on transitions (Mealy,
 * overriding the state's for that clock) and tags (1 in a tagged state, 0 elsewhere).
 * A final state answers to nothing: xstate stops the machine there, so every clock holds.
 *
 * Preconditions: none — any value gives diagnostics, never an exception.
 * Postconditions: a Machine is returned exactly when no error was found; its inputs are the
 * event types in order of first appearance (the states in order, then the machine's `on`),
 * its outputs likewise (tags and meta.outputs of each state and its transitions); every part
 * carries its JSON path in `loc`.
 */
import { diag, didYouMean, hasErrors, type Diagnostic } from '../../model/diagnostics.js';
import type { Guard, Machine, OutBit, SourceLoc, State, Transition } from '../../model/machine.js';
import { parseGuard } from '../expr.js';
import type { MachineResult } from '../json.js';
import { featureNote } from './features.js';
import { scanConfig } from './scan.js';
import { resolveTarget } from './targets.js';
import type { RawConfig, RawState, RawTransition } from './types.js';

/** Most levers an imported machine may have (the tool's input limit, LW401). */
const MAX_LEVERS = 32;

/** Import a flat xstate configuration (a decoded JSON value) as a Machine. */
export function importXstate(config: unknown, file?: string): MachineResult {
  try {
    return importChecked(config, file);
  } catch (e) {
    // Only exotic values get here (a getter that throws, a revoked proxy): plain data never does.
    const why = e instanceof Error ? e.message : String(e);
    return {
      diagnostics: [
        diag(
          'LW501',
          `the configuration could not be read: ${why}`,
          file === undefined ? { path: '$' } : { file, path: '$' },
          'pass plain JSON data',
        ),
      ],
    };
  }
}

/** A record without a prototype, so that output names never meet Object.prototype. */
function record(entries: Iterable<readonly [string, OutBit]>): Record<string, OutBit> {
  const r: Record<string, OutBit> = Object.create(null);
  for (const [k, v] of entries) r[k] = v;
  return r;
}

function importChecked(config: unknown, file?: string): MachineResult {
  const { raw, diagnostics: ds } = scanConfig(config, file);
  if (!raw) return { diagnostics: ds };
  const at = (path: string): SourceLoc => (file === undefined ? { path } : { file, path });

  const inputs = uniqueInOrder([...raw.states.flatMap((s) => [...s.on.keys()]), ...raw.rootOn.keys()]);
  const outputs = uniqueInOrder(outputNamesInOrder(raw));
  if (inputs.length > MAX_LEVERS) {
    ds.push(
      diag(
        'LW401',
        `the configuration has ${inputs.length} event types; a lever machine handles at most ${MAX_LEVERS} levers`,
        at('$'),
        'split the machine',
      ),
    );
    return { diagnostics: ds };
  }
  const outSet = new Set(outputs);
  for (const i of inputs) {
    if (outSet.has(i))
      ds.push(
        diag(
          'LW203',
          `'${i}' is both an event type (a lever) and an output (a tag or meta.outputs name)`,
          at('$'),
          'rename one of them',
        ),
      );
  }

  let start = raw.initial ?? '';
  if (raw.initial !== undefined && !raw.states.some((s) => s.name === raw.initial)) {
    const g = didYouMean(
      raw.initial,
      raw.states.map((s) => s.name),
    );
    ds.push(
      diag(
        'LW204',
        `the initial state '${raw.initial}' is not a state of the machine`,
        at('$.initial'),
        g ? `did you mean '${g}'?` : 'name one of the states under "states"',
      ),
    );
    start = '';
  }

  const lever = (ev: string, loc: SourceLoc): Guard | undefined => {
    const r = parseGuard(ev, inputs, loc);
    ds.push(...r.diagnostics);
    return r.guard;
  };
  // Resolve one candidate; root candidates are resolved once, with `stay` standing for "this state".
  const resolve = (c: RawTransition, from: RawState | undefined): string | null | undefined => {
    if (c.target === undefined) return null; // targetless: stay
    const r = resolveTarget(c.target, from, raw);
    if (r.ok) return r.state;
    if (r.feature) {
      const n = featureNote(r.feature);
      ds.push(
        diag(
          'LW500',
          `unsupported xstate feature: ${n.name} (${c.targetPath}): ${r.message}`,
          at(c.targetPath),
          n.hint,
        ),
      );
    } else ds.push(diag('LW200', r.message, at(c.targetPath), r.hint));
    return undefined;
  };
  const rootTargets = new Map([...raw.rootOn].map(([ev, cs]) => [ev, cs.map((c) => resolve(c, undefined))]));

  const rootTags = new Set(raw.rootTags);
  const states: State[] = raw.states.map((s) => {
    const tagged = new Set([...rootTags, ...s.tags]);
    for (const [o, v] of s.outputs) {
      if (tagged.has(o) && v !== 1) {
        ds.push(
          diag(
            'LW501',
            `state '${s.name}' carries the tag '${o}' (output 1) but meta.outputs gives '${o}' the value ${JSON.stringify(v)}`,
            at(`${s.path}.meta.outputs`),
            `drop one of the two, or make meta.outputs.${o} 1`,
          ),
        );
      }
    }
    const moore = record([...[...tagged].map((t) => [t, 1] as const), ...s.outputs]);
    const transitions: Transition[] = [];
    const add = (ev: string, c: RawTransition, to: string | null | undefined): void => {
      if (to === undefined) return;
      const when = lever(ev, at(c.path));
      if (when) transitions.push({ when, to: to ?? s.name, outputs: record(c.outputs), loc: at(c.path) });
    };
    for (const [ev, cs] of s.on) for (const c of cs) add(ev, c, resolve(c, s));
    if (!s.final) {
      // An event whose candidate list in the state is empty bubbles to the root, as in xstate.
      for (const [ev, cs] of raw.rootOn) {
        if ((s.on.get(ev)?.length ?? 0) > 0) continue;
        const tos = rootTargets.get(ev) ?? [];
        cs.forEach((c, k) => add(ev, c, tos[k]));
      }
    }
    return { name: s.name, outputs: moore, transitions, loc: at(s.path) };
  });

  const never: Guard[] = [];
  for (let a = 0; a < inputs.length; a++) {
    for (let b = a + 1; b < inputs.length; b++) {
      const r = parseGuard(`${inputs[a]} & ${inputs[b]}`, inputs, at('$'));
      ds.push(...r.diagnostics);
      if (r.guard) never.push(r.guard);
    }
  }

  if (hasErrors(ds)) return { diagnostics: ds };
  const machine: Machine = {
    name: raw.name,
    inputs,
    outputs,
    start,
    unspecified: 'hold',
    never,
    states,
    ...(raw.description !== undefined ? { description: raw.description } : {}),
    loc: at('$'),
  };
  return { machine, diagnostics: ds };
}

function uniqueInOrder(xs: Iterable<string>): string[] {
  return [...new Set(xs)];
}

/** Output names as they first appear: root tags, then per state its tags, meta.outputs, transitions' outputs; then the root's transitions. */
function outputNamesInOrder(raw: RawConfig): string[] {
  const names: string[] = [...raw.rootTags];
  const fromOn = (on: ReadonlyMap<string, readonly RawTransition[]>): void => {
    for (const cs of on.values()) for (const c of cs) names.push(...c.outputs.keys());
  };
  for (const s of raw.states) {
    names.push(...s.tags, ...s.outputs.keys());
    fromOn(s.on);
  }
  fromOn(raw.rootOn);
  return names;
}
