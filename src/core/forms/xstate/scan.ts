/**
 * Reading an xstate v5 configuration (a decoded JSON value) into a checked, flat RawConfig:
 * the shapes, names and values are checked here; targets are resolved later (targets.ts).
 *
 * Preconditions: none — any value (not only JSON) gives diagnostics, never an exception; keys
 * are read as own properties only, so `__proto__` and friends in the input change nothing.
 * Postconditions: every feature a lever machine cannot have is reported as LW500 naming the
 * feature and the state (with the JSON path in the location); malformed shapes are LW501;
 * names that cannot become levers, outputs or states are LW205; bad output values LW106;
 * fields we do not know are LW105 warnings. Empty feature values (`entry: []`,
 * `context: {}`) are accepted and ignored: they do nothing in xstate either.
 */
import { diag, didYouMean, printable, type Diagnostic, type DiagnosticCode } from '../../model/diagnostics.js';
import { LIMITS } from '../../model/limits.js';
import type { OutBit } from '../../model/machine.js';
import { isPrimitive, jsonKey } from '../json.js';
import { featureNote, type Feature } from './features.js';
import type { RawConfig, RawState, RawTransition } from './types.js';
import { isJsonObject, ownValue as own } from '../../model/records.js';

type Obj = Record<string, unknown>;
const has = (o: Obj, k: string): boolean => Object.prototype.hasOwnProperty.call(o, k);
/** Nothing there: absent, an empty list or an empty object (does nothing in xstate either). */
const isBlank = (v: unknown): boolean =>
  v === undefined || (Array.isArray(v) && v.length === 0) || (isJsonObject(v) && Object.keys(v).length === 0);

const IDENT = /^[A-Za-z_][A-Za-z0-9_]*$/;
const STATE_NAME = /^[A-Za-z0-9_]+$/;
/** A name usable as a lever or an output: an identifier that is not a built-in property of every JS object. */
export function isLeverName(s: string): boolean {
  return IDENT.test(s) && !(s in Object.prototype);
}
/** A name usable as a state: letters, digits and _, and not a built-in property of every JS object. */
export function isStateName(s: string): boolean {
  return STATE_NAME.test(s) && !(s in Object.prototype);
}
/** The machine's name from the xstate id: characters other than letters, digits, _ and - become _. */
export function machineName(id: string): string {
  const n = id.replace(/[^A-Za-z0-9_-]/g, '_').replace(/^-/, '_');
  return n === '' ? 'machine' : n;
}

/** Fields read by the root, by states and by transitions; anything else is LW105 (or a feature). */
const ROOT_KEYS = ['id', 'initial', 'states', 'on', 'description', 'tags', 'meta', 'version', 'context', 'type'];
const STATE_KEYS = ['on', 'meta', 'tags', 'type', 'id', 'description', 'states', 'initial'];
const TRANSITION_KEYS = ['target', 'meta', 'description', 'reenter'];

/** Fields that are features a lever machine cannot have, on the root or on a state. */
const NODE_FEATURES: Readonly<Record<string, Feature>> = {
  entry: 'entry',
  exit: 'exit',
  onEntry: 'entry',
  onExit: 'exit',
  invoke: 'invoke',
  always: 'always',
  after: 'after',
  onDone: 'onDone',
  output: 'output',
  history: 'history',
  target: 'history',
  route: 'route',
  activities: 'activities',
  data: 'output',
};
/** Fields of a transition that are features. */
const TRANSITION_FEATURES: Readonly<Record<string, Feature>> = {
  guard: 'guard',
  cond: 'cond',
  in: 'in',
  actions: 'actions',
};

function describe(v: unknown): string {
  if (v === null) return 'null';
  if (Array.isArray(v)) return 'a list';
  if (typeof v === 'object') return 'an object';
  if (typeof v === 'string') return `the string ${JSON.stringify(v.length > 30 ? v.slice(0, 27) + '...' : v)}`;
  if (typeof v === 'function') return 'a function';
  return isPrimitive(v) ? `${typeof v} ${String(v)}` : typeof v;
}

type Warning = 'warning';

/** The diagnostics of one reading, and the helpers that add to them. */
class Scan {
  readonly ds: Diagnostic[] = [];

  constructor(private readonly file: string | undefined) {}

  report(code: DiagnosticCode, msg: string, path: string, hint?: string, sev?: Warning): void {
    this.ds.push(diag(code, msg, this.file === undefined ? { path } : { file: this.file, path }, hint, sev));
  }

  /** LW500: a feature a lever machine cannot have, in `where` (a state or the root). */
  feature(f: Feature, where: string, path: string): void {
    const n = featureNote(f);
    this.report('LW500', `unsupported xstate feature: ${n.name} in ${where} (${path})`, path, n.hint);
  }

  /** LW105: a field `k` of the object at `path` that is not read. */
  unknown(k: string, path: string, known: readonly string[]): void {
    const guess = didYouMean(k, known);
    const hint = guess ? `did you mean '${guess}'?` : `fields read here: ${known.join(', ')}`;
    this.report('LW105', `unknown field '${printable(k)}' ignored`, jsonKey(path, k), hint, 'warning');
  }

  /** True when `s` can name a `what` ('state', or a lever or output); LW205 otherwise. */
  name(s: string, what: string, path: string): boolean {
    const isState = what === 'state';
    if (isState ? isStateName(s) : isLeverName(s)) return true;
    const fixed = s.replace(/[^A-Za-z0-9_]/g, '_').replace(/^(?=[0-9])/, isState ? '' : '_');
    const example = fixed === '' ? 'x' : isLeverName(fixed) || isState ? fixed : 'x_' + fixed;
    const hint = (isState ? STATE_NAME : IDENT).test(s)
      ? `'${printable(s)}' is a property of every JavaScript object; choose another name`
      : `use letters, digits and _${isState ? '' : ' (starting with a letter or _)'}, for example '${printable(example)}'`;
    this.report('LW205', `${what} '${printable(s)}' is not a valid name`, path, hint);
    return false;
  }
}

/** `tags`: one name or a list of names, each an output. */
function readTags(sc: Scan, v: unknown, path: string): string[] {
  if (v === undefined) return [];
  const list: unknown[] = Array.isArray(v) ? v : [v];
  const out: string[] = [];
  list.forEach((t, i) => {
    const p = Array.isArray(v) ? `${path}[${i}]` : path;
    if (typeof t !== 'string')
      sc.report('LW501', `a tag should be a string, not ${describe(t)}`, p, 'tags: "name" or ["name", …]');
    else if (sc.name(t, 'tag (output)', p)) out.push(t);
  });
  return out;
}

/** `meta.outputs`: output name → 0, 1 or "-"; the rest of `meta` is free-form in xstate. */
function readMetaOutputs(sc: Scan, meta: unknown, path: string): Map<string, OutBit> {
  const out = new Map<string, OutBit>();
  if (!isJsonObject(meta) || !has(meta, 'outputs')) return out;
  const o = own(meta, 'outputs');
  const op = `${path}.outputs`;
  if (!isJsonObject(o)) {
    sc.report(
      'LW501',
      `meta.outputs should be an object of output name → 0, 1 or "-", not ${describe(o)}`,
      op,
      'for example "meta": { "outputs": { "bell": 1 } }',
    );
    return out;
  }
  for (const k of Object.keys(o)) {
    const kp = jsonKey(op, k);
    if (!sc.name(k, 'output', kp)) continue;
    const v = o[k];
    if (v === 0 || v === 1 || v === '-') out.set(k, v);
    else
      sc.report(
        'LW106',
        `output '${printable(k)}' has the value ${describe(v)}`,
        kp,
        'write 0, 1 or "-" (don\'t care)',
      );
  }
  return out;
}

/** What one field of a transition object says about it. */
interface TargetRead {
  target: string | undefined;
  ok: boolean;
}

/** A transition's `target`: one state reference (a string, or a list of one). */
function readTarget(sc: Scan, x: unknown, kp: string, where: string, into: TargetRead): void {
  if (typeof x === 'string') into.target = x;
  else if (x === undefined) into.target = undefined;
  else if (Array.isArray(x) && x.length === 1 && typeof x[0] === 'string') into.target = x[0];
  else if (Array.isArray(x) && x.length > 1) {
    sc.feature('multipleTargets', where, kp);
    into.ok = false;
  } else {
    const msg = `target should be a state reference (a string), not ${describe(x)}`;
    sc.report('LW501', msg, kp, 'omit target to stay in the state');
    into.ok = false;
  }
}

/** Field `k` (value `x`) of the transition object at `path`. */
function readTransitionField(sc: Scan, k: string, x: unknown, path: string, where: string, into: TargetRead): void {
  const kp = jsonKey(path, k);
  if (k === 'target') readTarget(sc, x, kp, where, into);
  else if (k === 'reenter') {
    if (typeof x !== 'boolean') sc.report('LW501', `reenter should be true or false, not ${describe(x)}`, kp);
  } else if (k === 'meta' || k === 'description') {
    // meta is read by the caller; description is free text
  } else if (has(TRANSITION_FEATURES, k)) {
    if (isBlank(x) && k === 'actions') return;
    sc.feature(TRANSITION_FEATURES[k], where, kp);
    into.ok = false;
  } else if (k === 'internal') {
    const hint = 'without actions, entering a state again changes nothing';
    sc.report('LW105', `the xstate v4 field 'internal' is ignored`, kp, hint, 'warning');
  } else sc.unknown(k, path, TRANSITION_KEYS);
}

/** One transition candidate: a target name or a transition object. */
function readTransition(sc: Scan, v: unknown, path: string, where: string): RawTransition | undefined {
  if (typeof v === 'string') return { target: v, outputs: new Map(), path, targetPath: path };
  if (!isJsonObject(v)) {
    sc.report(
      'LW501',
      `a transition should be a target name, an object or a list of them, not ${describe(v)}`,
      path,
      'for example "COIN": "open" or "COIN": { "target": "open" }',
    );
    return undefined;
  }
  const read: TargetRead = { target: undefined, ok: true };
  for (const k of Object.keys(v)) readTransitionField(sc, k, v[k], path, where, read);
  const outputs = readMetaOutputs(sc, own(v, 'meta'), `${path}.meta`);
  if (!read.ok) return undefined;
  return { ...(read.target === undefined ? {} : { target: read.target }), outputs, path, targetPath: `${path}.target` };
}

/** An `on` block: event type → candidates, in order. */
function readOn(sc: Scan, v: unknown, path: string, where: string): Map<string, RawTransition[]> {
  const out = new Map<string, RawTransition[]>();
  if (v === undefined) return out;
  if (!isJsonObject(v)) {
    sc.report(
      'LW501',
      `'on' should be an object of event type → transitions, not ${describe(v)}`,
      path,
      'for example "on": { "COIN": "open" }',
    );
    return out;
  }
  for (const ev of Object.keys(v)) {
    const kp = jsonKey(path, ev);
    if (ev === '') sc.feature('eventless', where, kp);
    else if (ev.includes('*')) sc.feature('wildcard', where, kp);
    else if (ev.startsWith('xstate.')) sc.feature('builtinEvent', where, kp);
    else if (sc.name(ev, 'event type (lever)', kp)) {
      const x = v[ev];
      const list = Array.isArray(x)
        ? x.map((c: unknown, i) => readTransition(sc, c, `${kp}[${i}]`, where))
        : [readTransition(sc, x, kp, where)];
      out.set(
        ev,
        list.filter((c): c is RawTransition => c !== undefined),
      );
    }
  }
  return out;
}

/** A state's `type`, `states` and `initial`: whether it is final; nesting and parallel are features. */
function readStateShape(sc: Scan, v: Obj, path: string, where: string): boolean {
  let final = false;
  let shaped = false; // the state's structure (parallel, history, nested) was already reported
  const type = own(v, 'type');
  if (type === 'final') final = true;
  else if (type === 'parallel' || type === 'history' || type === 'compound') {
    sc.feature(type === 'compound' ? 'nested' : type, where, `${path}.type`);
    shaped = true;
  } else if (type !== undefined && type !== 'atomic') {
    sc.report('LW501', `state type should be "atomic" or "final", not ${describe(type)}`, `${path}.type`);
  }
  const children = own(v, 'states');
  if (children !== undefined && !isJsonObject(children))
    sc.report('LW501', `'states' should be an object, not ${describe(children)}`, `${path}.states`);
  else if (!isBlank(children) && !shaped) {
    sc.feature('nested', where, `${path}.states`);
    shaped = true;
  }
  if (has(v, 'initial') && !shaped) sc.feature('nested', where, `${path}.initial`);
  return final;
}

/** One state `nm` at `path`. */
function readState(sc: Scan, nm: string, v: unknown, path: string, rootId: string): RawState | undefined {
  const where = `state '${printable(nm)}'`;
  if (!isJsonObject(v)) {
    const msg = `state '${printable(nm)}' should be an object, not ${describe(v)}`;
    sc.report('LW501', msg, path, 'write {} for a state with no transitions');
    return undefined;
  }
  const final = readStateShape(sc, v, path, where);
  let id = `${rootId}.${nm}`;
  const cid = own(v, 'id');
  if (typeof cid === 'string' && cid !== '') id = cid;
  else if (cid !== undefined && typeof cid !== 'string')
    sc.report('LW501', `a state id should be a string, not ${describe(cid)}`, `${path}.id`);
  for (const k of Object.keys(v)) {
    if (STATE_KEYS.includes(k)) continue;
    if (has(NODE_FEATURES, k)) {
      if (!isBlank(v[k])) sc.feature(NODE_FEATURES[k], where, jsonKey(path, k));
    } else sc.unknown(k, path, STATE_KEYS);
  }
  const on = readOn(sc, own(v, 'on'), `${path}.on`, where);
  if (final && on.size > 0) sc.feature('finalTransitions', where, `${path}.on`);
  const outputs = readMetaOutputs(sc, own(v, 'meta'), `${path}.meta`);
  return { name: nm, path, id, final, tags: readTags(sc, own(v, 'tags'), `${path}.tags`), outputs, on };
}

/**
 * The root's `meta.loadsG`: output name → grams above 0, the loads the outputs lift (the same
 * key as the JSON form's top-level `loadsG`). Absent: every output is a flag.
 */
function readRootLoads(sc: Scan, root: Obj): Map<string, number> | undefined {
  const meta = own(root, 'meta');
  if (!isJsonObject(meta) || !has(meta, 'loadsG')) return undefined;
  const v = own(meta, 'loadsG');
  const path = '$.meta.loadsG';
  if (!isJsonObject(v)) {
    sc.report(
      'LW501',
      `meta.loadsG should be an object of output name → grams, not ${describe(v)}`,
      path,
      'for example "meta": { "loadsG": { "bell": 120 } }',
    );
    return undefined;
  }
  const loads = new Map<string, number>();
  for (const k of Object.keys(v)) {
    const p = jsonKey(path, k);
    if (!sc.name(k, 'output', p)) continue;
    const g = v[k];
    if (typeof g === 'number' && Number.isFinite(g) && g > 0) loads.set(k, g);
    else
      sc.report(
        'LW107',
        `the load of '${k}' is ${typeof g === 'number' ? String(g) : describe(g)}; a load is a number of grams above 0`,
        p,
        `write "${k}": 300 for 300 g`,
      );
  }
  return loads;
}

/** The root's `id`, `type`, `context`, `meta` and `description`; returns the xstate machine id. */
function readRootFields(sc: Scan, root: Obj): string {
  const where = 'the machine root';
  const idv = own(root, 'id');
  if (idv !== undefined && typeof idv !== 'string')
    sc.report('LW501', `the machine id should be a string, not ${describe(idv)}`, '$.id');
  const type = own(root, 'type');
  if (type === 'parallel') sc.feature('parallel', where, '$.type');
  else if (type !== undefined && type !== 'compound')
    sc.report('LW501', `the machine's type should be "compound" (or absent), not ${describe(type)}`, '$.type');
  if (!isBlank(own(root, 'context'))) sc.feature('context', where, '$.context');
  const meta = own(root, 'meta');
  if (isJsonObject(meta) && has(meta, 'outputs')) sc.feature('rootOutputs', where, '$.meta.outputs');
  const desc = own(root, 'description');
  if (desc !== undefined && typeof desc !== 'string')
    sc.report('LW501', `description should be a string, not ${describe(desc)}`, '$.description');
  return typeof idv === 'string' && idv !== '' ? idv : '(machine)';
}

/** The root's `initial`: a state name, or a transition object with a target. */
function readInitial(sc: Scan, root: Obj): string | undefined {
  const iv = own(root, 'initial');
  if (typeof iv === 'string') return iv;
  if (isJsonObject(iv)) {
    const target = own(iv, 'target');
    if (typeof target === 'string') {
      if (!isBlank(own(iv, 'actions'))) sc.feature('actions', 'the initial transition', '$.initial.actions');
      return target;
    }
  }
  if (iv === undefined) sc.report('LW501', `the machine has no 'initial' state`, '$', 'add "initial": "<state name>"');
  else sc.report('LW501', `'initial' should be a state name, not ${describe(iv)}`, '$.initial');
  return undefined;
}

/** The root's `states`, in order; states with unusable names are left out (reported). */
function readStates(sc: Scan, root: Obj, rootId: string): RawState[] {
  const statesV = own(root, 'states');
  const states: RawState[] = [];
  if (!isJsonObject(statesV)) {
    sc.report(
      'LW501',
      statesV === undefined ? `the machine has no 'states'` : `'states' should be an object, not ${describe(statesV)}`,
      statesV === undefined ? '$' : '$.states',
      'add "states": { "<name>": { "on": { … } } }',
    );
    return states;
  }
  const names = Object.keys(statesV);
  if (names.length === 0) sc.report('LW300', 'the machine has no states', '$.states', 'declare at least one state');
  for (const nm of names) {
    const sp = jsonKey('$.states', nm);
    if (!sc.name(nm, 'state', sp)) continue;
    const s = readState(sc, nm, statesV[nm], sp, rootId);
    if (s) states.push(s);
  }
  return states;
}

/** xstate keeps one node per id; two nodes with one id would make `#id` targets ambiguous. */
function checkIds(sc: Scan, states: readonly RawState[], rootId: string): void {
  const seen = new Map<string, string>([[rootId, '$']]);
  for (const s of states) {
    const first = seen.get(s.id);
    if (first !== undefined) {
      const msg = `state '${s.name}' has the id '${printable(s.id)}', already used at ${first}`;
      sc.report('LW501', msg, `${s.path}.id`, 'give every state its own id');
    } else seen.set(s.id, s.path);
  }
}

/** LW400 when `states` holds more states than the tool takes: counted before any state is read. */
function tooManyStates(sc: Scan, root: Obj): boolean {
  const statesV = own(root, 'states');
  if (!isJsonObject(statesV)) return false;
  const names = Object.keys(statesV);
  if (names.length <= LIMITS.states) return false;
  sc.report(
    'LW400',
    `the machine has ${names.length} states; the tool handles at most ${LIMITS.states}`,
    jsonKey('$.states', names[LIMITS.states]),
    'split the machine',
  );
  return true;
}

/** Read and check a configuration; `raw` is present when the root is an object at all and not too large. */
export function scanConfig(value: unknown, file?: string): { raw?: RawConfig; diagnostics: Diagnostic[] } {
  const sc = new Scan(file);
  if (!isJsonObject(value)) {
    const msg = `an xstate configuration is an object, not ${describe(value)}`;
    sc.report('LW501', msg, '$', 'it needs "initial" and "states"');
    return { diagnostics: sc.ds };
  }
  const root = value;
  if (tooManyStates(sc, root)) return { diagnostics: sc.ds };
  const rootId = readRootFields(sc, root);
  const initial = readInitial(sc, root);
  for (const k of Object.keys(root)) {
    if (ROOT_KEYS.includes(k)) continue;
    if (has(NODE_FEATURES, k)) {
      if (!isBlank(root[k])) sc.feature(NODE_FEATURES[k], 'the machine root', jsonKey('$', k));
    } else sc.unknown(k, '$', ROOT_KEYS);
  }
  const states = readStates(sc, root, rootId);
  checkIds(sc, states, rootId);

  const rootOn = readOn(sc, own(root, 'on'), '$.on', 'the machine root');
  const loadsG = readRootLoads(sc, root);
  const idv = own(root, 'id');
  const desc = own(root, 'description');
  const raw: RawConfig = {
    rootId,
    name: typeof idv === 'string' && idv !== '' ? machineName(idv) : 'machine',
    ...(typeof desc === 'string' ? { description: desc } : {}),
    ...(initial !== undefined ? { initial } : {}),
    states,
    rootOn,
    rootTags: readTags(sc, own(root, 'tags'), '$.tags'),
    ...(loadsG && loadsG.size > 0 ? { loadsG } : {}),
  };
  return { raw, diagnostics: sc.ds };
}
