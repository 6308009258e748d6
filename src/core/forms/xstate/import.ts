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
 * A final state answers to nothing: xstate stops the machine there, so every clock holds; it is
 * marked final in the Machine. The root's `meta.loadsG` gives the loads of actuator outputs.
 *
 * Preconditions: none — any value gives diagnostics, never an exception.
 * Postconditions: a Machine is returned exactly when no error was found; its inputs are the
 * event types in order of first appearance (the states in order, then the machine's `on`),
 * its outputs likewise (tags and meta.outputs of each state and its transitions); every part
 * carries its JSON path in `loc`.
 */
import { diag, didYouMean, hasErrors, printable, type Diagnostic } from '../../model/diagnostics.js';
import type { Guard, Machine, OutBit, SourceLoc, State, Transition } from '../../model/machine.js';
import { parseGuard } from '../expr.js';
import { jsonKey, type MachineResult } from '../json.js';
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
  const r = Object.create(null) as Record<string, OutBit>;
  for (const [k, v] of entries) r[k] = v;
  return r;
}

/** One import: the configuration as scanned, its levers, and the diagnostics so far. */
class Importer {
  constructor(
    readonly raw: RawConfig,
    readonly inputs: readonly string[],
    readonly ds: Diagnostic[],
    private readonly file: string | undefined,
  ) {}

  at(path: string): SourceLoc {
    return this.file === undefined ? { path } : { file: this.file, path };
  }

  /** The guard of lever `ev`. */
  lever(ev: string, loc: SourceLoc): Guard | undefined {
    const r = parseGuard(ev, this.inputs, loc);
    this.ds.push(...r.diagnostics);
    return r.guard;
  }

  /** One candidate's target state; null: targetless (stay); undefined: not resolved (reported). */
  resolve(c: RawTransition, from: RawState | undefined): string | null | undefined {
    if (c.target === undefined) return null;
    const r = resolveTarget(c.target, from, this.raw);
    if (r.ok) return r.state;
    if (r.feature) {
      const n = featureNote(r.feature);
      const msg = `unsupported xstate feature: ${n.name} (${c.targetPath}): ${r.message}`;
      this.ds.push(diag('LW500', msg, this.at(c.targetPath), n.hint));
    } else this.ds.push(diag('LW200', r.message, this.at(c.targetPath), r.hint));
    return undefined;
  }
}

/** False (reported) when there are more levers than the tool handles; also reports names used twice. */
function checkNames(im: Importer, outputs: readonly string[]): boolean {
  const { inputs } = im;
  if (inputs.length > MAX_LEVERS) {
    const msg = `the configuration has ${inputs.length} event types; a lever machine handles at most ${MAX_LEVERS} levers`;
    im.ds.push(diag('LW401', msg, im.at('$'), 'split the machine'));
    return false;
  }
  const outSet = new Set(outputs);
  for (const i of inputs) {
    if (outSet.has(i)) {
      const msg = `'${i}' is both an event type (a lever) and an output (a tag or meta.outputs name)`;
      im.ds.push(diag('LW203', msg, im.at('$'), 'rename one of them'));
    }
  }
  return true;
}

/** The start state: `initial`, when it names a state ('' otherwise, reported). */
function startState(im: Importer): string {
  const { raw } = im;
  if (raw.initial === undefined) return '';
  if (raw.states.some((s) => s.name === raw.initial)) return raw.initial;
  const g = didYouMean(
    raw.initial,
    raw.states.map((s) => s.name),
  );
  im.ds.push(
    diag(
      'LW204',
      `the initial state '${printable(raw.initial)}' is not a state of the machine`,
      im.at('$.initial'),
      g ? `did you mean '${g}'?` : 'name one of the states under "states"',
    ),
  );
  return '';
}

/** A state's Moore outputs: 1 for each tag (its own and the root's), then its meta.outputs. */
function mooreOutputs(im: Importer, s: RawState): Record<string, OutBit> {
  const tagged = new Set([...im.raw.rootTags, ...s.tags]);
  for (const [o, v] of s.outputs) {
    if (tagged.has(o) && v !== 1) {
      im.ds.push(
        diag(
          'LW501',
          `state '${s.name}' carries the tag '${o}' (output 1) but meta.outputs gives '${o}' the value ${JSON.stringify(v)}`,
          im.at(`${s.path}.meta.outputs`),
          `drop one of the two, or make meta.outputs.${o} 1`,
        ),
      );
    }
  }
  return record([...[...tagged].map((t) => [t, 1] as const), ...s.outputs]);
}

/**
 * One state with its transitions: its own, then (unless final) the root's for each event whose
 * candidate list in the state is empty, as an unhandled event bubbles to the root in xstate.
 * `rootTargets` holds the root candidates' targets, resolved once.
 */
function importState(
  im: Importer,
  s: RawState,
  rootTargets: ReadonlyMap<string, (string | null | undefined)[]>,
): State {
  const transitions: Transition[] = [];
  const add = (ev: string, c: RawTransition, to: string | null | undefined): void => {
    if (to === undefined) return;
    const when = im.lever(ev, im.at(c.path));
    if (when) transitions.push({ when, to: to ?? s.name, outputs: record(c.outputs), loc: im.at(c.path) });
  };
  const outputs = mooreOutputs(im, s);
  for (const [ev, cs] of s.on) for (const c of cs) add(ev, c, im.resolve(c, s));
  if (!s.final) {
    for (const [ev, cs] of im.raw.rootOn) {
      if ((s.on.get(ev)?.length ?? 0) > 0) continue;
      const tos = rootTargets.get(ev) ?? [];
      cs.forEach((c, k) => add(ev, c, tos[k]));
    }
  }
  return { name: s.name, outputs, transitions, ...(s.final ? { final: true } : {}), loc: im.at(s.path) };
}

/** At most one lever per clock: `a & b` is never pulled, for every pair of levers. */
function oneLeverAtATime(im: Importer): Guard[] {
  const { inputs } = im;
  const never: Guard[] = [];
  for (let a = 0; a < inputs.length; a++) {
    for (let b = a + 1; b < inputs.length; b++) {
      const r = parseGuard(`${inputs[a]} & ${inputs[b]}`, inputs, im.at('$'));
      im.ds.push(...r.diagnostics);
      if (r.guard) never.push(r.guard);
    }
  }
  return never;
}

function importChecked(config: unknown, file?: string): MachineResult {
  const { raw, diagnostics: ds } = scanConfig(config, file);
  if (!raw) return { diagnostics: ds };
  const inputs = uniqueInOrder([...raw.states.flatMap((s) => [...s.on.keys()]), ...raw.rootOn.keys()]);
  const outputs = uniqueInOrder(outputNamesInOrder(raw));
  const im = new Importer(raw, inputs, ds, file);
  if (!checkNames(im, outputs)) return { diagnostics: ds };
  const start = startState(im);
  const rootTargets = new Map([...raw.rootOn].map(([ev, cs]) => [ev, cs.map((c) => im.resolve(c, undefined))]));
  const states = raw.states.map((s) => importState(im, s, rootTargets));
  const never = oneLeverAtATime(im);

  if (hasErrors(ds)) return { diagnostics: ds };
  const machine: Machine = {
    name: raw.name,
    inputs,
    outputs,
    start,
    unspecified: 'hold',
    never,
    states,
    ...(raw.loadsG ? { loadsG: Object.fromEntries(raw.loadsG) } : {}),
    ...(raw.description !== undefined ? { description: raw.description } : {}),
    loc: im.at('$'),
    ...(raw.loadsG
      ? {
          partLocs: Object.fromEntries(
            [...raw.loadsG.keys()].map((o) => [`load:${o}`, im.at(jsonKey('$.meta.loadsG', o))]),
          ),
        }
      : {}),
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
