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
import { diag, didYouMean, type Diagnostic, type DiagnosticCode } from '../../model/diagnostics.js';
import type { OutBit, SourceLoc } from '../../model/machine.js';
import { jsonKey } from '../json.js';
import { featureNote, type Feature } from './features.js';
import type { RawConfig, RawState, RawTransition } from './types.js';

type Obj = Record<string, unknown>;
const isObj = (v: unknown): v is Obj => typeof v === 'object' && v !== null && !Array.isArray(v);
const own = (o: Obj, k: string): unknown => (Object.prototype.hasOwnProperty.call(o, k) ? o[k] : undefined);
const has = (o: Obj, k: string): boolean => Object.prototype.hasOwnProperty.call(o, k);
/** Nothing there: absent, an empty list or an empty object (does nothing in xstate either). */
const isBlank = (v: unknown): boolean =>
  v === undefined || (Array.isArray(v) && v.length === 0) || (isObj(v) && Object.keys(v).length === 0);

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
  return typeof v === 'function' ? 'a function' : `${typeof v} ${String(v)}`;
}

/** Read and check a configuration; `raw` is present when the root is an object at all. */
export function scanConfig(value: unknown, file?: string): { raw?: RawConfig; diagnostics: Diagnostic[] } {
  const ds: Diagnostic[] = [];
  const at = (path: string): SourceLoc => (file === undefined ? { path } : { file, path });
  const report = (code: DiagnosticCode, msg: string, path: string, hint?: string, sev?: 'warning'): void => {
    ds.push(diag(code, msg, at(path), hint, sev));
  };
  const feature = (f: Feature, where: string, path: string): void => {
    const n = featureNote(f);
    report('LW500', `unsupported xstate feature: ${n.name} in ${where} (${path})`, path, n.hint);
  };
  const unknown = (o: Obj, k: string, path: string, known: readonly string[]): void => {
    const guess = didYouMean(k, known);
    report(
      'LW105',
      `unknown field '${k}' ignored`,
      jsonKey(path, k),
      guess ? `did you mean '${guess}'?` : `fields read here: ${known.join(', ')}`,
      'warning',
    );
  };
  const name = (s: string, what: string, path: string): boolean => {
    const isState = what === 'state';
    if (isState ? isStateName(s) : isLeverName(s)) return true;
    const fixed = s.replace(/[^A-Za-z0-9_]/g, '_').replace(/^(?=[0-9])/, isState ? '' : '_');
    const hint = (isState ? STATE_NAME : IDENT).test(s)
      ? `'${s}' is a property of every JavaScript object; choose another name`
      : `use letters, digits and _${isState ? '' : ' (starting with a letter or _)'}, for example '${fixed === '' ? 'x' : isLeverName(fixed) || isState ? fixed : 'x_' + fixed}'`;
    report('LW205', `${what} '${s}' is not a valid name`, path, hint);
    return false;
  };

  const tags = (v: unknown, path: string): string[] => {
    if (v === undefined) return [];
    const list = Array.isArray(v) ? v : [v];
    const out: string[] = [];
    list.forEach((t, i) => {
      const p = Array.isArray(v) ? `${path}[${i}]` : path;
      if (typeof t !== 'string')
        report('LW501', `a tag should be a string, not ${describe(t)}`, p, 'tags: "name" or ["name", …]');
      else if (name(t, 'tag (output)', p)) out.push(t);
    });
    return out;
  };

  const metaOutputs = (meta: unknown, path: string): Map<string, OutBit> => {
    const out = new Map<string, OutBit>();
    if (!isObj(meta) || !has(meta, 'outputs')) return out; // meta is free-form in xstate
    const o = own(meta, 'outputs');
    const op = `${path}.outputs`;
    if (!isObj(o)) {
      report(
        'LW501',
        `meta.outputs should be an object of output name → 0, 1 or "-", not ${describe(o)}`,
        op,
        'for example "meta": { "outputs": { "bell": 1 } }',
      );
      return out;
    }
    for (const k of Object.keys(o)) {
      const kp = jsonKey(op, k);
      if (!name(k, 'output', kp)) continue;
      const v = o[k];
      if (v === 0 || v === 1 || v === '-') out.set(k, v);
      else report('LW106', `output '${k}' has the value ${describe(v)}`, kp, 'write 0, 1 or "-" (don\'t care)');
    }
    return out;
  };

  const transition = (v: unknown, path: string, where: string): RawTransition | undefined => {
    if (typeof v === 'string') return { target: v, outputs: new Map(), path, targetPath: path };
    if (!isObj(v)) {
      report(
        'LW501',
        `a transition should be a target name, an object or a list of them, not ${describe(v)}`,
        path,
        'for example "COIN": "open" or "COIN": { "target": "open" }',
      );
      return undefined;
    }
    let target: string | undefined;
    let ok = true;
    for (const k of Object.keys(v)) {
      const kp = jsonKey(path, k);
      const x = v[k];
      if (k === 'target') {
        if (typeof x === 'string') target = x;
        else if (x === undefined) target = undefined;
        else if (Array.isArray(x) && x.length === 1 && typeof x[0] === 'string') target = x[0];
        else if (Array.isArray(x) && x.length > 1) {
          feature('multipleTargets', where, kp);
          ok = false;
        } else {
          report(
            'LW501',
            `target should be a state reference (a string), not ${describe(x)}`,
            kp,
            'omit target to stay in the state',
          );
          ok = false;
        }
      } else if (k === 'reenter') {
        if (typeof x !== 'boolean') report('LW501', `reenter should be true or false, not ${describe(x)}`, kp);
      } else if (k === 'meta' || k === 'description') {
        // meta read below; description is free text
      } else if (has(TRANSITION_FEATURES, k)) {
        if (isBlank(x) && k === 'actions') continue;
        feature(TRANSITION_FEATURES[k], where, kp);
        ok = false;
      } else if (k === 'internal') {
        report(
          'LW105',
          `the xstate v4 field 'internal' is ignored`,
          kp,
          'without actions, entering a state again changes nothing',
          'warning',
        );
      } else unknown(v, k, path, TRANSITION_KEYS);
    }
    const outputs = metaOutputs(own(v, 'meta'), `${path}.meta`);
    return ok
      ? { ...(target === undefined ? {} : { target }), outputs, path, targetPath: `${path}.target` }
      : undefined;
  };

  const onBlock = (v: unknown, path: string, where: string): Map<string, RawTransition[]> => {
    const out = new Map<string, RawTransition[]>();
    if (v === undefined) return out;
    if (!isObj(v)) {
      report(
        'LW501',
        `'on' should be an object of event type → transitions, not ${describe(v)}`,
        path,
        'for example "on": { "COIN": "open" }',
      );
      return out;
    }
    for (const ev of Object.keys(v)) {
      const kp = jsonKey(path, ev);
      if (ev === '') feature('eventless', where, kp);
      else if (ev.includes('*')) feature('wildcard', where, kp);
      else if (ev.startsWith('xstate.')) feature('builtinEvent', where, kp);
      else if (name(ev, 'event type (lever)', kp)) {
        const x = v[ev];
        const list = Array.isArray(x)
          ? x.map((c, i) => transition(c, `${kp}[${i}]`, where))
          : [transition(x, kp, where)];
        out.set(
          ev,
          list.filter((c): c is RawTransition => c !== undefined),
        );
      }
    }
    return out;
  };

  const state = (nm: string, v: unknown, path: string, rootId: string): RawState | undefined => {
    const where = `state '${nm}'`;
    if (!isObj(v)) {
      report(
        'LW501',
        `state '${nm}' should be an object, not ${describe(v)}`,
        path,
        'write {} for a state with no transitions',
      );
      return undefined;
    }
    let final = false;
    let shaped = false; // the state's structure (parallel, history, nested) was already reported
    const type = own(v, 'type');
    if (type === 'final') final = true;
    else if (type === 'parallel' || type === 'history' || type === 'compound') {
      feature(type === 'compound' ? 'nested' : type, where, `${path}.type`);
      shaped = true;
    } else if (type !== undefined && type !== 'atomic') {
      report('LW501', `state type should be "atomic" or "final", not ${describe(type)}`, `${path}.type`);
    }
    const children = own(v, 'states');
    if (children !== undefined && !isObj(children))
      report('LW501', `'states' should be an object, not ${describe(children)}`, `${path}.states`);
    else if (!isBlank(children) && !shaped) {
      feature('nested', where, `${path}.states`);
      shaped = true;
    }
    if (has(v, 'initial') && !shaped) feature('nested', where, `${path}.initial`);
    let id = `${rootId}.${nm}`;
    const cid = own(v, 'id');
    if (typeof cid === 'string' && cid !== '') id = cid;
    else if (cid !== undefined && typeof cid !== 'string')
      report('LW501', `a state id should be a string, not ${describe(cid)}`, `${path}.id`);
    for (const k of Object.keys(v)) {
      if (STATE_KEYS.includes(k)) continue;
      if (has(NODE_FEATURES, k)) {
        if (!isBlank(v[k])) feature(NODE_FEATURES[k], where, jsonKey(path, k));
      } else unknown(v, k, path, STATE_KEYS);
    }
    const on = onBlock(own(v, 'on'), `${path}.on`, where);
    if (final && on.size > 0) feature('finalTransitions', where, `${path}.on`);
    const outputs = metaOutputs(own(v, 'meta'), `${path}.meta`);
    return { name: nm, path, id, final, tags: tags(own(v, 'tags'), `${path}.tags`), outputs, on };
  };

  if (!isObj(value)) {
    report(
      'LW501',
      `an xstate configuration is an object, not ${describe(value)}`,
      '$',
      'it needs "initial" and "states"',
    );
    return { diagnostics: ds };
  }
  const root = value;
  const idv = own(root, 'id');
  if (idv !== undefined && typeof idv !== 'string')
    report('LW501', `the machine id should be a string, not ${describe(idv)}`, '$.id');
  const rootId = typeof idv === 'string' && idv !== '' ? idv : '(machine)';
  const type = own(root, 'type');
  if (type === 'parallel') feature('parallel', 'the machine root', '$.type');
  else if (type !== undefined && type !== 'compound')
    report('LW501', `the machine's type should be "compound" (or absent), not ${describe(type)}`, '$.type');
  const context = own(root, 'context');
  if (!isBlank(context)) feature('context', 'the machine root', '$.context');
  const meta = own(root, 'meta');
  if (isObj(meta) && has(meta, 'outputs')) feature('rootOutputs', 'the machine root', '$.meta.outputs');
  const desc = own(root, 'description');
  if (desc !== undefined && typeof desc !== 'string')
    report('LW501', `description should be a string, not ${describe(desc)}`, '$.description');

  let initial: string | undefined;
  const iv = own(root, 'initial');
  if (typeof iv === 'string') initial = iv;
  else if (isObj(iv) && typeof own(iv, 'target') === 'string') {
    initial = own(iv, 'target') as string;
    if (!isBlank(own(iv, 'actions'))) feature('actions', 'the initial transition', '$.initial.actions');
  } else if (iv === undefined)
    report('LW501', `the machine has no 'initial' state`, '$', 'add "initial": "<state name>"');
  else report('LW501', `'initial' should be a state name, not ${describe(iv)}`, '$.initial');

  for (const k of Object.keys(root)) {
    if (ROOT_KEYS.includes(k)) continue;
    if (has(NODE_FEATURES, k)) {
      if (!isBlank(root[k])) feature(NODE_FEATURES[k], 'the machine root', jsonKey('$', k));
    } else unknown(root, k, '$', ROOT_KEYS);
  }

  const statesV = own(root, 'states');
  const states: RawState[] = [];
  if (!isObj(statesV)) {
    report(
      'LW501',
      statesV === undefined ? `the machine has no 'states'` : `'states' should be an object, not ${describe(statesV)}`,
      statesV === undefined ? '$' : '$.states',
      'add "states": { "<name>": { "on": { … } } }',
    );
  } else {
    if (Object.keys(statesV).length === 0)
      report('LW300', 'the machine has no states', '$.states', 'declare at least one state');
    for (const nm of Object.keys(statesV)) {
      const sp = jsonKey('$.states', nm);
      if (!name(nm, 'state', sp)) continue;
      const s = state(nm, statesV[nm], sp, rootId);
      if (s) states.push(s);
    }
  }
  // xstate keeps one node per id; two nodes with one id would make `#id` targets ambiguous.
  const seen = new Map<string, string>([[rootId, '$']]);
  for (const s of states) {
    const first = seen.get(s.id);
    if (first !== undefined)
      report(
        'LW501',
        `state '${s.name}' has the id '${s.id}', already used at ${first}`,
        `${s.path}.id`,
        'give every state its own id',
      );
    else seen.set(s.id, s.path);
  }

  const rootOn = onBlock(own(root, 'on'), '$.on', 'the machine root');
  const raw: RawConfig = {
    rootId,
    name: typeof idv === 'string' && idv !== '' ? machineName(idv) : 'machine',
    ...(typeof desc === 'string' ? { description: desc } : {}),
    ...(initial !== undefined ? { initial } : {}),
    states,
    rootOn,
    rootTags: tags(own(root, 'tags'), '$.tags'),
  };
  return { raw, diagnostics: ds };
}
