/**
 * The machine's JSON form (DESIGN.md §7, the stable interchange form) read into the canonical
 * Machine, and the canonical JSON written back.
 *
 * Fields: name, inputs, outputs, start, unspecified ("hold" | "dont-care", default "hold"),
 * never (expression strings), states: [{ name, code?, outputs?, transitions: [{ when?, to,
 * outputs? }] }]. Additive extensions: `code` on a state (a pinned state code of 0/1
 * digits), `final` on a state (true: meant to stay there until reset), `loadsG` on the machine
 * (output name → grams the output lifts: those outputs are actuators) and `description` on the
 * machine (the text form's header comment, so that text → JSON → text keeps it).
 *
 * Preconditions: none — any value of any type gives diagnostics, never an exception.
 * Postconditions: a Machine is returned exactly when no error was found; every part carries
 * its JSON path (`$.states[2].transitions[0].to`) in `loc`/`partLocs`. Names are taken as
 * given: whether they exist, repeat or are well formed is the validate phase's job.
 */
import { diag, didYouMean, printable, type Diagnostic } from '../model/diagnostics.js';
import type { Guard, Machine, OutBit, SourceLoc, State, Transition } from '../model/machine.js';
import { alwaysGuard, parseGuard, printExpr } from './expr.js';
import { jsonKey } from './json-path.js';
import { locateJsonPaths, readJsonText } from './json-file.js';
import { isJsonObject, ownValue as own } from '../model/records.js';

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
  final?: true;
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
  loadsG?: Record<string, number>;
  states: JsonState[];
}

/** Result of reading a machine in any form. */
export interface MachineResult {
  readonly machine?: Machine;
  readonly diagnostics: Diagnostic[];
}

const TOP_KEYS = ['name', 'description', 'inputs', 'outputs', 'start', 'unspecified', 'never', 'loadsG', 'states'];
const STATE_KEYS = ['name', 'code', 'final', 'outputs', 'transitions'];
const TRANSITION_KEYS = ['when', 'to', 'outputs'];

type Obj = Record<string, unknown>;

export { jsonKey };

function typeName(v: unknown): string {
  if (v === null) return 'null';
  if (Array.isArray(v)) return 'a list';
  if (typeof v === 'object') return 'an object';
  if (typeof v === 'string') return `the string ${JSON.stringify(v.length > 30 ? v.slice(0, 27) + '...' : v)}`;
  if (typeof v === 'function') return `function ${String(v)}`;
  return isPrimitive(v) ? `${typeof v} ${String(v)}` : typeof v;
}

/** A value that is neither a string, an object nor a function (those are described by kind). */
export function isPrimitive(v: unknown): v is number | boolean | bigint | symbol | undefined {
  const t = typeof v;
  return t === 'number' || t === 'boolean' || t === 'bigint' || t === 'symbol' || t === 'undefined';
}

/** Parse JSON text into a Machine (a byte order mark is skipped; diagnostics carry line and column). */
export function parseJsonMachine(text: string, file?: string): MachineResult {
  const read = readJsonText(text, file);
  if (!read.ok) return { diagnostics: read.diagnostics };
  const r = machineFromJson(read.value, file);
  return r.diagnostics.length === 0 ? r : { ...r, diagnostics: locateJsonPaths(read.text, r.diagnostics, file) };
}

/** The diagnostics of one reading, and the helpers that add to them. */
class JsonReader {
  readonly ds: Diagnostic[] = [];

  constructor(private readonly file: string | undefined) {}

  at(path: string): SourceLoc {
    return this.file === undefined ? { path } : { file: this.file, path };
  }

  wrongType(path: string, want: string, v: unknown): void {
    const msg = `${path} should be ${want}, not ${typeName(v)}`;
    this.ds.push(diag('LW103', msg, this.at(path), `see schemas/machine.schema.json`));
  }

  unknownKeys(o: Obj, path: string, known: readonly string[]): void {
    for (const k of Object.keys(o)) {
      if (known.includes(k)) continue;
      const guess = didYouMean(k, known);
      const hint = guess ? `did you mean '${guess}'?` : `known fields: ${known.join(', ')}`;
      this.ds.push(diag('LW105', `unknown field '${printable(k)}' ignored`, this.at(jsonKey(path, k)), hint));
    }
  }

  /** The top-level list `key` of names. */
  stringList(o: Obj, key: string): string[] {
    const v = own(o, key);
    const path = `$.${key}`;
    if (v === undefined) {
      this.ds.push(
        diag('LW104', `the machine has no '${key}' list`, this.at('$'), `add "${key}": [] (a list of names)`),
      );
      return [];
    }
    if (!Array.isArray(v)) {
      this.wrongType(path, 'a list of names', v);
      return [];
    }
    const out: string[] = [];
    v.forEach((x: unknown, i) => {
      if (typeof x === 'string') out.push(x);
      else this.wrongType(`${path}[${i}]`, 'a name (a string)', x);
    });
    return out;
  }

  /** An `outputs` object of a state or transition; records where each value was written in `locs`. */
  outputsMap(v: unknown, path: string, locs: Record<string, SourceLoc>): Record<string, OutBit> {
    const rec = Object.create(null) as Record<string, OutBit>;
    if (v === undefined) return rec;
    if (!isJsonObject(v)) {
      this.wrongType(path, 'an object of output values, like {"bell": 1}', v);
      return rec;
    }
    for (const k of Object.keys(v)) {
      const x = v[k];
      const p = jsonKey(path, k);
      if (x === 0 || x === 1 || x === '-') {
        rec[k] = x;
        locs[`out:${k}`] = this.at(p);
      } else
        this.ds.push(
          diag(
            'LW106',
            `output '${printable(k)}' has the value ${typeName(x)}`,
            this.at(p),
            `write 0, 1 or "-" (don't care)`,
          ),
        );
    }
    return rec;
  }

  /** A guard expression string over `inputs`. */
  guard(v: unknown, path: string, inputs: readonly string[]): Guard | undefined {
    if (typeof v !== 'string') {
      this.wrongType(path, 'an expression (a string)', v);
      return undefined;
    }
    const r = parseGuard(v, inputs, this.at(path));
    this.ds.push(...r.diagnostics);
    return r.guard;
  }
}

/** `name`: a string, required. */
function readName(r: JsonReader, value: Obj): string {
  const rawName = own(value, 'name');
  if (rawName === undefined) r.ds.push(diag('LW104', `the machine has no 'name'`, r.at('$'), 'add "name": "…"'));
  else if (typeof rawName !== 'string') r.wrongType('$.name', 'a string', rawName);
  else return rawName;
  return '';
}

/** `start`: a state name; an absent start is the validate phase's to report. */
function readStart(r: JsonReader, value: Obj): string {
  const rawStart = own(value, 'start');
  if (rawStart !== undefined && typeof rawStart !== 'string')
    r.wrongType('$.start', 'a state name (a string)', rawStart);
  else if (typeof rawStart === 'string') return rawStart;
  return '';
}

/** `unspecified`: "hold" (the default) or "dont-care". */
function readUnspecified(r: JsonReader, value: Obj): Machine['unspecified'] {
  const raw = own(value, 'unspecified');
  if (raw === 'hold' || raw === 'dont-care') return raw;
  if (raw !== undefined) {
    const guess = typeof raw === 'string' ? didYouMean(raw, ['hold', 'dont-care']) : undefined;
    r.ds.push(
      diag(
        'LW103',
        `$.unspecified should be "hold" or "dont-care", not ${typeName(raw)}`,
        r.at('$.unspecified'),
        guess ? `did you mean "${guess}"?` : 'write "hold" or "dont-care"',
      ),
    );
  }
  return 'hold';
}

/** `never`: a list of expressions. */
function readNever(r: JsonReader, value: Obj, inputs: readonly string[]): Guard[] {
  const never: Guard[] = [];
  const rawNever = own(value, 'never');
  if (rawNever !== undefined && !Array.isArray(rawNever)) r.wrongType('$.never', 'a list of expressions', rawNever);
  else if (Array.isArray(rawNever))
    rawNever.forEach((x: unknown, i) => {
      const g = r.guard(x, `$.never[${i}]`, inputs);
      if (g) never.push(g);
    });
  return never;
}

/** `loadsG`: output name → grams above 0 (where each was written goes to `locs` as `load:NAME`). */
function readLoads(r: JsonReader, value: Obj, locs: Record<string, SourceLoc>): Record<string, number> | undefined {
  const raw = own(value, 'loadsG');
  if (raw === undefined) return undefined;
  if (!isJsonObject(raw)) {
    r.wrongType('$.loadsG', 'an object of output name → grams, like {"bell": 120}', raw);
    return undefined;
  }
  const loads = Object.create(null) as Record<string, number>;
  for (const k of Object.keys(raw)) {
    const v = raw[k];
    const p = jsonKey('$.loadsG', k);
    if (typeof v === 'number' && Number.isFinite(v) && v > 0) {
      loads[k] = v;
      locs[`load:${k}`] = r.at(p);
    } else
      r.ds.push(
        diag(
          'LW107',
          `the load of '${k}' is ${typeTextOf(v)}; a load is a number of grams above 0`,
          r.at(p),
          typeof v === 'string' ? `write the grams as a number: "${k}": 300` : `write "${k}": 300 for 300 g`,
        ),
      );
  }
  return loads;
}

/** A value in a message: numbers as they are, anything else by its kind. */
function typeTextOf(v: unknown): string {
  return typeof v === 'number' ? String(v) : typeName(v);
}

/** `states`: the list of states, each read by readState. */
function readStates(r: JsonReader, value: Obj, inputs: readonly string[]): State[] {
  const states: State[] = [];
  const rawStates = own(value, 'states');
  if (rawStates === undefined) {
    const hint = 'add "states": [ { "name": …, "transitions": [ … ] } ]';
    r.ds.push(diag('LW104', `the machine has no 'states' list`, r.at('$'), hint));
  } else if (!Array.isArray(rawStates)) r.wrongType('$.states', 'a list of states', rawStates);
  else
    rawStates.forEach((rs: unknown, si) => {
      const s = readState(r, rs, si, inputs);
      if (s) states.push(s);
    });
  return states;
}

/** State number `si` (0-based); undefined when it has no usable name. */
function readState(r: JsonReader, rs: unknown, si: number, inputs: readonly string[]): State | undefined {
  const sp = `$.states[${si}]`;
  if (!isJsonObject(rs)) {
    r.wrongType(sp, 'a state object', rs);
    return undefined;
  }
  r.unknownKeys(rs, sp, STATE_KEYS);
  const locs: Record<string, SourceLoc> = { name: r.at(`${sp}.name`) };
  const sName = own(rs, 'name');
  if (sName === undefined) r.ds.push(diag('LW104', `state ${si + 1} has no 'name'`, r.at(sp), 'add "name": "…"'));
  else if (typeof sName !== 'string') r.wrongType(`${sp}.name`, 'a string', sName);
  const code = own(rs, 'code');
  if (code !== undefined) {
    if (typeof code !== 'string') r.wrongType(`${sp}.code`, 'a string of 0/1 digits', code);
    locs.code = r.at(`${sp}.code`);
  }
  const final = own(rs, 'final');
  if (final !== undefined) {
    if (typeof final !== 'boolean') r.wrongType(`${sp}.final`, 'true or false', final);
    locs.final = r.at(`${sp}.final`);
  }
  const outputs = r.outputsMap(own(rs, 'outputs'), `${sp}.outputs`, locs);
  // How messages name the state: by its name when it has one, else by its number.
  const label = typeof sName === 'string' ? `'${printable(sName)}'` : String(si + 1);
  const transitions: Transition[] = [];
  const rawTs = own(rs, 'transitions');
  if (rawTs === undefined) {
    const hint = 'add "transitions": [] (a state with none holds)';
    r.ds.push(diag('LW104', `state ${label} has no 'transitions' list`, r.at(sp), hint));
  } else if (!Array.isArray(rawTs)) r.wrongType(`${sp}.transitions`, 'a list of transitions', rawTs);
  else
    rawTs.forEach((rt: unknown, ti) => {
      const t = readTransition(r, rt, `${sp}.transitions[${ti}]`, `transition ${ti + 1} of state ${label}`, inputs);
      if (t) transitions.push(t);
    });
  if (typeof sName !== 'string') return undefined;
  const pinned = typeof code === 'string' ? { code } : {};
  return {
    name: sName,
    outputs,
    transitions,
    ...pinned,
    ...(final === true ? { final } : {}),
    loc: r.at(sp),
    partLocs: locs,
  };
}

/** One transition at JSON path `tp`; `what` names it in messages. */
function readTransition(
  r: JsonReader,
  rt: unknown,
  tp: string,
  what: string,
  inputs: readonly string[],
): Transition | undefined {
  if (!isJsonObject(rt)) {
    r.wrongType(tp, 'a transition object', rt);
    return undefined;
  }
  r.unknownKeys(rt, tp, TRANSITION_KEYS);
  const tLocs: Record<string, SourceLoc> = { to: r.at(`${tp}.to`) };
  const rawWhen = own(rt, 'when');
  const when = rawWhen === undefined ? alwaysGuard(inputs.length, r.at(tp)) : r.guard(rawWhen, `${tp}.when`, inputs);
  const to = own(rt, 'to');
  if (to === undefined) r.ds.push(diag('LW104', `${what} has no 'to'`, r.at(tp), 'add "to": "<state name>"'));
  else if (typeof to !== 'string') r.wrongType(`${tp}.to`, 'a state name (a string)', to);
  const outputs = r.outputsMap(own(rt, 'outputs'), `${tp}.outputs`, tLocs);
  return when && typeof to === 'string' ? { when, to, outputs, loc: r.at(tp), partLocs: tLocs } : undefined;
}

/** Read an already parsed JSON value into a Machine. */
export function machineFromJson(value: unknown, file?: string): MachineResult {
  const r = new JsonReader(file);
  if (!isJsonObject(value)) {
    const msg = `a machine must be a JSON object, not ${typeName(value)}`;
    r.ds.push(diag('LW100', msg, r.at('$'), 'start the file with { "name": …, "states": [ … ] }'));
    return { diagnostics: r.ds };
  }
  r.unknownKeys(value, '$', TOP_KEYS);

  const partLocs: Record<string, SourceLoc> = { name: r.at('$.name'), start: r.at('$.start') };
  const name = readName(r, value);
  const rawDescription = own(value, 'description');
  if (rawDescription !== undefined && typeof rawDescription !== 'string')
    r.wrongType('$.description', 'a string', rawDescription);
  const inputs = r.stringList(value, 'inputs');
  const outputs = r.stringList(value, 'outputs');
  inputs.forEach((_, i) => (partLocs[`input:${i}`] = r.at(`$.inputs[${i}]`)));
  outputs.forEach((_, i) => (partLocs[`output:${i}`] = r.at(`$.outputs[${i}]`)));
  const start = readStart(r, value);
  const unspecified = readUnspecified(r, value);
  const never = readNever(r, value, inputs);
  const loadsG = readLoads(r, value, partLocs);
  const states = readStates(r, value, inputs);

  if (r.ds.some((d) => d.severity === 'error')) return { diagnostics: r.ds };
  const machine: Machine = {
    name,
    inputs,
    outputs,
    start,
    unspecified,
    never,
    states,
    ...(loadsG && Object.keys(loadsG).length > 0 ? { loadsG } : {}),
    ...(typeof rawDescription === 'string' ? { description: rawDescription } : {}),
    loc: r.at('$'),
    partLocs,
  };
  return { machine, diagnostics: r.ds };
}

/** Output values in the machine's declared output order, then any others as written. */
function orderedOutputs(m: Machine, rec: Readonly<Record<string, OutBit>>): Record<string, OutBit> | undefined {
  const keys = Object.keys(rec);
  if (keys.length === 0) return undefined;
  const order = [...m.outputs.filter((o) => keys.includes(o)), ...keys.filter((k) => !m.outputs.includes(k))];
  return Object.fromEntries(order.map((k) => [k, rec[k]]));
}

/** The loads in the machine's output order, then any others as written. */
export function orderedLoads(m: Machine): [string, number][] {
  const loads = m.loadsG ?? {};
  const keys = Object.keys(loads);
  return [...m.outputs.filter((o) => keys.includes(o)), ...keys.filter((k) => !m.outputs.includes(k))].map((k) => [
    k,
    loads[k],
  ]);
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
    ...(m.loadsG && Object.keys(m.loadsG).length > 0 ? { loadsG: Object.fromEntries(orderedLoads(m)) } : {}),
    states: m.states.map((s) => {
      const outs = orderedOutputs(m, s.outputs);
      return {
        name: s.name,
        ...(s.code !== undefined ? { code: s.code } : {}),
        ...(s.final === true ? { final: true as const } : {}),
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
