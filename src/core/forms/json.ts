/**
 * The machine's JSON form (DESIGN.md §7, the stable interchange form) read into the canonical
 * Machine, and the canonical JSON written back.
 *
 * Fields: name, inputs, outputs, start, unspecified ("hold" | "dont-care", default "hold"),
 * never (expression strings), states: [{ name, code?, outputs?, transitions: [{ when?, to,
 * outputs? }] }]. Two additive extensions: `code` on a state (a pinned state code of 0/1
 * digits) and `description` on the machine (the text form's header comment, so that
 * text → JSON → text keeps it).
 *
 * Preconditions: none — any value of any type gives diagnostics, never an exception.
 * Postconditions: a Machine is returned exactly when no error was found; every part carries
 * its JSON path (`$.states[2].transitions[0].to`) in `loc`/`partLocs`. Names are taken as
 * given: whether they exist, repeat or are well formed is the validate phase's job.
 */
import { diag, didYouMean, type Diagnostic } from '../model/diagnostics.js';
import type { Guard, Machine, OutBit, SourceLoc, State, Transition } from '../model/machine.js';
import { alwaysGuard, parseGuard, printExpr } from './expr.js';
import { lineColumn, locateJsonError } from './json-syntax.js';

/** The JSON form of a transition. */
export interface JsonTransition {
  when?: string;
  to: string;
  outputs?: Record<string, OutBit>;
}
/** The JSON form of a state. */
export interface JsonState {
  name: string;
  code?: string;
  outputs?: Record<string, OutBit>;
  transitions: JsonTransition[];
}
/** The JSON form of a machine. */
export interface JsonMachine {
  name: string;
  description?: string;
  inputs: string[];
  outputs: string[];
  start: string;
  unspecified: 'hold' | 'dont-care';
  never?: string[];
  states: JsonState[];
}

/** Result of reading a machine in any form. */
export interface MachineResult {
  readonly machine?: Machine;
  readonly diagnostics: Diagnostic[];
}

const TOP_KEYS = ['name', 'description', 'inputs', 'outputs', 'start', 'unspecified', 'never', 'states'];
const STATE_KEYS = ['name', 'code', 'outputs', 'transitions'];
const TRANSITION_KEYS = ['when', 'to', 'outputs'];

type Obj = Record<string, unknown>;
const isObj = (v: unknown): v is Obj => typeof v === 'object' && v !== null && !Array.isArray(v);
const own = (o: Obj, k: string): unknown => (Object.prototype.hasOwnProperty.call(o, k) ? o[k] : undefined);

/** `$.a.b` for plain keys, `$.a["odd key"]` otherwise. */
export function jsonKey(path: string, key: string): string {
  return /^[A-Za-z_][A-Za-z0-9_]*$/.test(key) ? `${path}.${key}` : `${path}[${JSON.stringify(key)}]`;
}

function typeName(v: unknown): string {
  if (v === null) return 'null';
  if (Array.isArray(v)) return 'a list';
  if (typeof v === 'object') return 'an object';
  return typeof v === 'string'
    ? `the string ${JSON.stringify(v.length > 30 ? v.slice(0, 27) + '...' : v)}`
    : `${typeof v} ${String(v)}`;
}

/** Parse JSON text into a Machine. */
export function parseJsonMachine(text: string, file?: string): MachineResult {
  const src = text.charCodeAt(0) === 0xfeff ? text.slice(1) : text;
  let value: unknown;
  try {
    value = JSON.parse(src);
  } catch (e) {
    const found = locateJsonError(src) ?? { pos: 0, msg: e instanceof Error ? e.message : 'not valid JSON' };
    const { line, column } = lineColumn(src, found.pos);
    return {
      diagnostics: [
        diag(
          'LW100',
          `not valid JSON: ${found.msg}`,
          { file, line, column },
          'check brackets, commas and quotes near this position',
        ),
      ],
    };
  }
  return machineFromJson(value, file);
}

/** Read an already parsed JSON value into a Machine. */
export function machineFromJson(value: unknown, file?: string): MachineResult {
  const ds: Diagnostic[] = [];
  const at = (path: string): SourceLoc => (file === undefined ? { path } : { file, path });
  const wrongType = (path: string, want: string, v: unknown): void => {
    ds.push(
      diag('LW103', `${path} should be ${want}, not ${typeName(v)}`, at(path), `see schemas/machine.schema.json`),
    );
  };
  const unknownKeys = (o: Obj, path: string, known: readonly string[]): void => {
    for (const k of Object.keys(o)) {
      if (known.includes(k)) continue;
      const guess = didYouMean(k, known);
      ds.push(
        diag(
          'LW105',
          `unknown field '${k}' ignored`,
          at(jsonKey(path, k)),
          guess ? `did you mean '${guess}'?` : `known fields: ${known.join(', ')}`,
        ),
      );
    }
  };
  const stringList = (o: Obj, key: string): string[] => {
    const v = own(o, key);
    const path = `$.${key}`;
    if (v === undefined) {
      ds.push(diag('LW104', `the machine has no '${key}' list`, at('$'), `add "${key}": [] (a list of names)`));
      return [];
    }
    if (!Array.isArray(v)) {
      wrongType(path, 'a list of names', v);
      return [];
    }
    const out: string[] = [];
    v.forEach((x, i) => (typeof x === 'string' ? out.push(x) : wrongType(`${path}[${i}]`, 'a name (a string)', x)));
    return out;
  };
  const outputsMap = (v: unknown, path: string, locs: Record<string, SourceLoc>): Record<string, OutBit> => {
    const rec: Record<string, OutBit> = Object.create(null);
    if (v === undefined) return rec;
    if (!isObj(v)) {
      wrongType(path, 'an object of output values, like {"bell": 1}', v);
      return rec;
    }
    for (const k of Object.keys(v)) {
      const x = v[k];
      const p = jsonKey(path, k);
      if (x === 0 || x === 1 || x === '-') {
        rec[k] = x;
        locs[`out:${k}`] = at(p);
      } else
        ds.push(diag('LW106', `output '${k}' has the value ${typeName(x)}`, at(p), `write 0, 1 or "-" (don't care)`));
    }
    return rec;
  };

  if (!isObj(value)) {
    ds.push(
      diag(
        'LW100',
        `a machine must be a JSON object, not ${typeName(value)}`,
        at('$'),
        'start the file with { "name": …, "states": [ … ] }',
      ),
    );
    return { diagnostics: ds };
  }
  unknownKeys(value, '$', TOP_KEYS);

  const partLocs: Record<string, SourceLoc> = { name: at('$.name'), start: at('$.start') };
  const rawName = own(value, 'name');
  let name = '';
  if (rawName === undefined) ds.push(diag('LW104', `the machine has no 'name'`, at('$'), 'add "name": "…"'));
  else if (typeof rawName !== 'string') wrongType('$.name', 'a string', rawName);
  else name = rawName;

  const rawDescription = own(value, 'description');
  if (rawDescription !== undefined && typeof rawDescription !== 'string')
    wrongType('$.description', 'a string', rawDescription);

  const inputs = stringList(value, 'inputs');
  const outputs = stringList(value, 'outputs');
  inputs.forEach((_, i) => (partLocs[`input:${i}`] = at(`$.inputs[${i}]`)));
  outputs.forEach((_, i) => (partLocs[`output:${i}`] = at(`$.outputs[${i}]`)));

  const rawStart = own(value, 'start');
  let start = '';
  if (rawStart !== undefined && typeof rawStart !== 'string') wrongType('$.start', 'a state name (a string)', rawStart);
  else if (typeof rawStart === 'string') start = rawStart;

  const rawUnspecified = own(value, 'unspecified');
  let unspecified: Machine['unspecified'] = 'hold';
  if (rawUnspecified === 'hold' || rawUnspecified === 'dont-care') unspecified = rawUnspecified;
  else if (rawUnspecified !== undefined) {
    const guess = typeof rawUnspecified === 'string' ? didYouMean(rawUnspecified, ['hold', 'dont-care']) : undefined;
    ds.push(
      diag(
        'LW103',
        `$.unspecified should be "hold" or "dont-care", not ${typeName(rawUnspecified)}`,
        at('$.unspecified'),
        guess ? `did you mean "${guess}"?` : 'write "hold" or "dont-care"',
      ),
    );
  }

  const guard = (v: unknown, path: string): Guard | undefined => {
    if (typeof v !== 'string') {
      wrongType(path, 'an expression (a string)', v);
      return undefined;
    }
    const r = parseGuard(v, inputs, at(path));
    ds.push(...r.diagnostics);
    return r.guard;
  };

  const never: Guard[] = [];
  const rawNever = own(value, 'never');
  if (rawNever !== undefined && !Array.isArray(rawNever)) wrongType('$.never', 'a list of expressions', rawNever);
  else if (Array.isArray(rawNever))
    rawNever.forEach((x, i) => {
      const g = guard(x, `$.never[${i}]`);
      if (g) never.push(g);
    });

  const states: State[] = [];
  const rawStates = own(value, 'states');
  if (rawStates === undefined)
    ds.push(
      diag(
        'LW104',
        `the machine has no 'states' list`,
        at('$'),
        'add "states": [ { "name": …, "transitions": [ … ] } ]',
      ),
    );
  else if (!Array.isArray(rawStates)) wrongType('$.states', 'a list of states', rawStates);
  else
    rawStates.forEach((rs, si) => {
      const sp = `$.states[${si}]`;
      if (!isObj(rs)) return wrongType(sp, 'a state object', rs);
      unknownKeys(rs, sp, STATE_KEYS);
      const locs: Record<string, SourceLoc> = { name: at(`${sp}.name`) };
      const sName = own(rs, 'name');
      if (sName === undefined) ds.push(diag('LW104', `state ${si + 1} has no 'name'`, at(sp), 'add "name": "…"'));
      else if (typeof sName !== 'string') wrongType(`${sp}.name`, 'a string', sName);
      const code = own(rs, 'code');
      if (code !== undefined) {
        if (typeof code !== 'string') wrongType(`${sp}.code`, 'a string of 0/1 digits', code);
        locs.code = at(`${sp}.code`);
      }
      const sOutputs = outputsMap(own(rs, 'outputs'), `${sp}.outputs`, locs);
      const transitions: Transition[] = [];
      const rawTs = own(rs, 'transitions');
      if (rawTs === undefined)
        ds.push(
          diag(
            'LW104',
            `state ${typeof sName === 'string' ? `'${sName}'` : si + 1} has no 'transitions' list`,
            at(sp),
            'add "transitions": [] (a state with none holds)',
          ),
        );
      else if (!Array.isArray(rawTs)) wrongType(`${sp}.transitions`, 'a list of transitions', rawTs);
      else
        rawTs.forEach((rt, ti) => {
          const tp = `${sp}.transitions[${ti}]`;
          if (!isObj(rt)) return wrongType(tp, 'a transition object', rt);
          unknownKeys(rt, tp, TRANSITION_KEYS);
          const tLocs: Record<string, SourceLoc> = { to: at(`${tp}.to`) };
          const rawWhen = own(rt, 'when');
          const when = rawWhen === undefined ? alwaysGuard(inputs.length, at(tp)) : guard(rawWhen, `${tp}.when`);
          const to = own(rt, 'to');
          if (to === undefined)
            ds.push(
              diag(
                'LW104',
                `transition ${ti + 1} of state ${typeof sName === 'string' ? `'${sName}'` : si + 1} has no 'to'`,
                at(tp),
                'add "to": "<state name>"',
              ),
            );
          else if (typeof to !== 'string') wrongType(`${tp}.to`, 'a state name (a string)', to);
          const tOutputs = outputsMap(own(rt, 'outputs'), `${tp}.outputs`, tLocs);
          if (when && typeof to === 'string')
            transitions.push({ when, to, outputs: tOutputs, loc: at(tp), partLocs: tLocs });
        });
      if (typeof sName === 'string') {
        states.push({
          name: sName,
          outputs: sOutputs,
          transitions,
          ...(typeof code === 'string' ? { code } : {}),
          loc: at(sp),
          partLocs: locs,
        });
      }
    });

  if (ds.some((d) => d.severity === 'error')) return { diagnostics: ds };
  const machine: Machine = {
    name,
    inputs,
    outputs,
    start,
    unspecified,
    never,
    states,
    ...(typeof rawDescription === 'string' ? { description: rawDescription } : {}),
    loc: at('$'),
    partLocs,
  };
  return { machine, diagnostics: ds };
}

/** Output values in the machine's declared output order, then any others as written. */
function orderedOutputs(m: Machine, rec: Readonly<Record<string, OutBit>>): Record<string, OutBit> | undefined {
  const keys = Object.keys(rec);
  if (keys.length === 0) return undefined;
  const order = [...m.outputs.filter((o) => keys.includes(o)), ...keys.filter((k) => !m.outputs.includes(k))];
  return Object.fromEntries(order.map((k) => [k, rec[k]]));
}

/** True when a guard is the literal constant 1 (written as an absent `when`). */
export function isAlways(g: Guard): boolean {
  return g.expr.kind === 'const' && g.expr.value === 1;
}

/** The canonical JSON of a machine (`when` omitted when it is the constant 1, empty maps omitted). */
export function machineToJson(m: Machine): JsonMachine {
  return {
    name: m.name,
    ...(m.description !== undefined ? { description: m.description } : {}),
    inputs: [...m.inputs],
    outputs: [...m.outputs],
    start: m.start,
    unspecified: m.unspecified,
    ...(m.never.length ? { never: m.never.map((g) => printExpr(g.expr)) } : {}),
    states: m.states.map((s) => {
      const outs = orderedOutputs(m, s.outputs);
      return {
        name: s.name,
        ...(s.code !== undefined ? { code: s.code } : {}),
        ...(outs ? { outputs: outs } : {}),
        transitions: s.transitions.map((t) => {
          const tOuts = orderedOutputs(m, t.outputs);
          return {
            ...(isAlways(t.when) ? {} : { when: printExpr(t.when.expr) }),
            to: t.to,
            ...(tOuts ? { outputs: tOuts } : {}),
          };
        }),
      };
    }),
  };
}
