/**
 * The text form: our own line-oriented notation, one statement per line, mapping 1:1 onto
 * the JSON form (DESIGN.md §7). See docs/notation.md for the reference.
 *
 *   # header comment lines become the description
 *   machine marble_bell
 *   inputs marble, lid                  (commas or spaces; optional when there are none)
 *   outputs bell
 *   start empty
 *   unspecified dont-care               (optional; the default is hold)
 *   never marble & lid                  (one expression per line)
 *   load bell 120 g                     (an output that lifts a load: an actuator; g or kg)
 *   state empty code 00 with bell=0     (code, final and with are optional, in any order)
 *     when marble go one with bell=1    (guarded transition, Mealy outputs optional)
 *     go empty                          (a transition that always fires)
 *
 * Method: hand-written line scanner; guards are read by the expression reader in prefix mode,
 * which stops at the name after a complete expression, so `go` is found without reserving
 * it (an input may even be called `go`).
 * Preconditions: none — any text gives diagnostics, never an exception.
 * Postconditions: a Machine exactly when no error was found; every diagnostic has a line and
 * column; states, transitions, guards and named parts carry their line/column.
 */
import { diag, didYouMean, printable, type Diagnostic } from '../model/diagnostics.js';
import type { Guard, Machine, OutBit, SourceLoc, State, Transition } from '../model/machine.js';
import { nameRecord } from '../model/records.js';
import { alwaysGuard, guardFromExpr, parseGuard, printExpr, readExpr } from './expr.js';
import { isAlways, orderedLoads, type MachineResult } from './json.js';

const KEYWORDS = ['machine', 'inputs', 'outputs', 'start', 'unspecified', 'never', 'load', 'state', 'when', 'go'];

interface Word {
  readonly text: string;
  /** 0-based offset in the line. */
  readonly at: number;
}

/** Split `line` from `from` into words, with ',' and '=' as words of their own. */
function words(line: string, from: number): Word[] {
  const out: Word[] = [];
  let i = from;
  while (i < line.length) {
    const ch = line[i];
    if (/\s/.test(ch)) i++;
    else if (ch === ',' || ch === '=') out.push({ text: ch, at: i++ });
    else {
      const s = i;
      while (i < line.length && !/[\s,=]/.test(line[i])) i++;
      out.push({ text: line.slice(s, i), at: s });
    }
  }
  return out;
}

function stripComment(line: string): string {
  const k = line.indexOf('#');
  return k < 0 ? line : line.slice(0, k);
}

type TextCode = 'LW101' | 'LW103' | 'LW104' | 'LW106' | 'LW107';

/** A state being read: its transitions follow it, up to the next `state` line. */
interface OpenState {
  readonly state: Omit<State, 'transitions'>;
  readonly transitions: Transition[];
}

/** True when `w` is missing or is one of the punctuation words ',' and '='. */
function isGap(w: Word | undefined): boolean {
  return !w || w.text === ',' || w.text === '=';
}

/** Offset of the first non-blank character of `line` at or after `from`. */
function skipBlanks(line: string, from: number): number {
  return from + (line.slice(from).length - line.slice(from).trimStart().length);
}

/** The header comment block (after any leading blank lines): the machine's description. */
function headerOf(lines: readonly string[]): { first: number; header: string[] } {
  let first = 0;
  while (first < lines.length && lines[first].trim() === '') first++;
  const header: string[] = [];
  for (let i = first; i < lines.length && lines[i].trimStart().startsWith('#'); i++) {
    header.push(lines[i].trimStart().slice(1).replace(/^ /, '').trimEnd());
  }
  return { first, header };
}

/** What the line reader has found so far, and the diagnostics. */
class TextReader {
  readonly ds: Diagnostic[] = [];
  readonly inputs: string[] = [];
  readonly partLocs: Record<string, SourceLoc> = {};
  readonly outputs: string[] = [];
  readonly never: Guard[] = [];
  readonly states: State[] = [];
  /** Output loads in grams, by output name, in the order written. */
  readonly loads: Record<string, number> = Object.create(null) as Record<string, number>;
  name: string | undefined;
  start: string | undefined;
  unspecified: Machine['unspecified'] | undefined;
  current: OpenState | undefined;

  constructor(private readonly file: string | undefined) {}

  /** Location of 0-based `offset` on 0-based line `line`. */
  at(line: number, offset: number): SourceLoc {
    return { ...(this.file !== undefined ? { file: this.file } : {}), line: line + 1, column: offset + 1 };
  }

  err(code: TextCode, msg: string, line: number, offset: number, hint: string): void {
    this.ds.push(diag(code, msg, this.at(line, offset), hint));
  }

  /** Guards need the inputs, which may be declared anywhere: collect them before anything else. */
  collectInputs(lines: readonly string[]): void {
    lines.forEach((raw, li) => {
      const ws = words(stripComment(raw), 0);
      if (ws[0]?.text !== 'inputs') return;
      for (const w of ws.slice(1)) {
        if (w.text === ',' || w.text === '=') continue;
        this.partLocs[`input:${this.inputs.length}`] = this.at(li, w.at);
        this.inputs.push(w.text);
      }
    });
  }

  /** Finish the open state, if any. */
  close(): void {
    if (this.current) this.states.push({ ...this.current.state, transitions: this.current.transitions });
    this.current = undefined;
  }

  /** Report a word after the end of a statement. */
  trailing(ws: readonly Word[], k: number, li: number, after: string): void {
    if (k < ws.length)
      this.err(
        'LW101',
        `unexpected '${printable(ws[k].text)}' after ${after}`,
        li,
        ws[k].at,
        'remove it, or check the statement against the notation reference',
      );
  }

  /** The one name after the keyword, or undefined (reported) when it is missing. */
  oneName(ws: readonly Word[], li: number, what: string, example: string): string | undefined {
    const w = ws[1];
    if (isGap(w)) {
      const offset = w ? w.at : ws[0].at + ws[0].text.length;
      this.err('LW104', `'${printable(ws[0].text)}' needs ${what}`, li, offset, `write ${example}`);
      return undefined;
    }
    // `what` is written for "needs a name"; after it the thing is "the name", never "the a name".
    this.trailing(ws, 2, li, what.replace(/^an? /, 'the '));
    return w.text;
  }

  /** True for the first line of a once-only statement; reports any later one. */
  once(seen: unknown, ws: readonly Word[], li: number): boolean {
    if (seen === undefined) return true;
    const kw = ws[0].text;
    this.err('LW101', `a second '${kw}' line`, li, ws[0].at, `a machine has one '${kw}' line; remove one`);
    return false;
  }

  /** The machine, or only the diagnostics when there is an error. */
  result(lineCount: number, first: number, header: readonly string[]): MachineResult {
    if (this.name === undefined)
      this.err(
        'LW104',
        `the machine has no 'machine' line`,
        first < lineCount ? first : 0,
        0,
        'add a line: machine NAME',
      );
    if (this.ds.some((d) => d.severity === 'error')) return { diagnostics: this.ds };
    const machine: Machine = {
      name: this.name ?? '',
      inputs: this.inputs,
      outputs: this.outputs,
      start: this.start ?? '',
      unspecified: this.unspecified ?? 'hold',
      never: this.never,
      states: this.states,
      ...(Object.keys(this.loads).length > 0 ? { loadsG: { ...this.loads } } : {}),
      ...(header.length ? { description: header.join('\n') } : {}),
      loc: this.at(0, 0),
      partLocs: this.partLocs,
    };
    return { machine, diagnostics: this.ds };
  }
}

/** Read `NAME=V[,] …` pairs from ws[k]; stops at a word not followed by '='. */
function readOutputs(
  r: TextReader,
  ws: readonly Word[],
  k: number,
  li: number,
  locs: Record<string, SourceLoc>,
): { outs: Record<string, OutBit>; k: number } {
  const outs = nameRecord<OutBit>();
  let any = false;
  while (k < ws.length) {
    if (ws[k].text === ',' && any) {
      k++;
      continue;
    }
    if (ws[k + 1]?.text !== '=') break;
    const key = ws[k];
    const val = ws[k + 2];
    if (key.text === ',' || key.text === '=') break;
    any = true;
    if (isGap(val)) {
      const hint = `write ${key.text}=1, ${key.text}=0 or ${key.text}=- (don't care)`;
      r.err('LW106', `output '${printable(key.text)}' has no value`, li, ws[k + 1].at + 1, hint);
      k += 2;
      continue;
    }
    if (key.text in outs)
      // A second value would silently replace the first: the user meant one of them.
      r.err(
        'LW106',
        `output '${printable(key.text)}' is given a second value`,
        li,
        key.at,
        `give each output one value: keep ${printable(key.text)}=${outs[key.text]} or ${printable(key.text)}=${printable(val.text)}`,
      );
    else if (val.text === '0' || val.text === '1' || val.text === '-')
      outs[key.text] = val.text === '-' ? '-' : val.text === '1' ? 1 : 0;
    else
      r.err(
        'LW106',
        `output '${printable(key.text)}' has the value '${printable(val.text)}'`,
        li,
        val.at,
        `write 0, 1 or - (don't care)`,
      );
    locs[`out:${key.text}`] = r.at(li, key.at);
    k += 3;
  }
  if (!any) {
    const w = ws[k];
    r.err(
      'LW101',
      w
        ? `expected output values like bell=1 after 'with', found '${printable(w.text)}'`
        : `'with' needs output values, like bell=1`,
      li,
      w ? w.at : ws[k - 1].at + ws[k - 1].text.length,
      'write with NAME=VALUE, NAME=VALUE … (values 0, 1 or -)',
    );
  }
  return { outs, k };
}

/** A transition after `when GUARD` or as `go …`: `go TARGET [with …]`, read from offset goAt. */
function transitionTail(
  r: TextReader,
  line: string,
  li: number,
  goAt: number,
  when: Guard | undefined,
  stmtAt: number,
): void {
  const ws = words(line, goAt);
  if (ws[0]?.text !== 'go') {
    const w = ws[0];
    r.err(
      'LW101',
      w ? `expected 'go' after the guard, found '${printable(w.text)}'` : `expected 'go' and a state after the guard`,
      li,
      w ? w.at : line.trimEnd().length,
      `write when GUARD go STATE`,
    );
    return;
  }
  const target = ws[1];
  if (isGap(target)) {
    r.err('LW104', `'go' needs a state to go to`, li, target ? target.at : ws[0].at + 2, 'write go STATE');
    return;
  }
  const locs: Record<string, SourceLoc> = { to: r.at(li, target.at) };
  let k = 2;
  let outs = nameRecord<OutBit>();
  if (ws[k]?.text === 'with') ({ outs, k } = readOutputs(r, ws, k + 1, li, locs));
  r.trailing(ws, k, li, `the target state`);
  if (!r.current) {
    const hint = "write 'state NAME' first; transitions belong to the state above them";
    r.err('LW101', 'a transition before any state', li, stmtAt, hint);
    return;
  }
  const loc = r.at(li, stmtAt);
  const guard = when ?? alwaysGuard(r.inputs.length, loc);
  r.current.transitions.push({ when: guard, to: target.text, outputs: outs, loc, partLocs: locs });
}

/** `inputs …` or `outputs …`: names separated by commas or spaces (inputs were collected already). */
function nameList(r: TextReader, ws: readonly Word[], li: number): void {
  const kw = ws[0];
  for (let k = 1; k < ws.length; k++) {
    if (ws[k].text === '=')
      r.err('LW101', `unexpected '=' in the ${kw.text} list`, li, ws[k].at, `list names separated by commas or spaces`);
    else if (ws[k].text !== ',' && kw.text === 'outputs') {
      r.partLocs[`output:${r.outputs.length}`] = r.at(li, ws[k].at);
      r.outputs.push(ws[k].text);
    }
  }
}

/** `unspecified hold` or `unspecified dont-care`. */
function unspecifiedRule(r: TextReader, ws: readonly Word[], li: number): void {
  if (!r.once(r.unspecified, ws, li)) return;
  const v = r.oneName(ws, li, 'a rule', 'unspecified hold, or unspecified dont-care');
  if (v === 'hold' || v === 'dont-care') r.unspecified = v;
  else if (v !== undefined) {
    const guess = didYouMean(v, ['hold', 'dont-care']);
    const hint = guess ? `did you mean '${guess}'?` : 'write hold or dont-care';
    r.err('LW103', `unknown unspecified rule '${printable(v)}'`, li, ws[1].at, hint);
  }
}

/** `never EXPR`: one input combination that cannot occur. */
function neverLine(r: TextReader, line: string, kw: Word, li: number): void {
  const exprAt = skipBlanks(line, kw.at + kw.text.length);
  const g = parseGuard(line.slice(exprAt), r.inputs, r.at(li, exprAt));
  r.ds.push(...g.diagnostics);
  if (g.guard) r.never.push(g.guard);
}

/** Grams per unit of mass the text form takes. */
const MASS_UNITS: Readonly<Record<string, number>> = { g: 1, kg: 1000 };

/** A mass in grams from a number and its unit, or why not (a message and a hint). */
function gramsOf(num: string, unit: string | undefined, output: string): number | { msg: string; hint: string } {
  const example = `write load ${output} 300 g, or load ${output} 0.3 kg`;
  if (!/^[0-9]*\.?[0-9]+(e[+-]?[0-9]+)?$/i.test(num))
    return { msg: `the load of '${output}' is '${num}', not a number`, hint: example };
  if (unit === undefined) return { msg: `the load of '${output}' (${num}) has no unit`, hint: example };
  const per = Object.hasOwn(MASS_UNITS, unit) ? MASS_UNITS[unit] : undefined;
  if (per === undefined) {
    const force = unit === 'N' ? '; a force in newtons divided by 9.81 is a mass in kg' : '';
    return { msg: `the load of '${output}' is given in '${unit}'`, hint: `give a mass in g or kg${force}: ${example}` };
  }
  const grams = per === 1 ? Number(num) : Math.round(Number(num) * per * 1e6) / 1e6;
  if (!(grams > 0) || !Number.isFinite(grams))
    return {
      msg: `the load of '${output}' is ${num} ${unit}`,
      hint: 'a load is a mass above 0; leave an output without a load to show it by a flag',
    };
  return grams;
}

/** `load NAME MASS UNIT[, NAME MASS UNIT …]`: the masses outputs lift (the outputs become actuators). */
function loadLine(r: TextReader, ws: readonly Word[], li: number): void {
  let k = 1;
  for (;;) {
    const nm = ws[k];
    if (isGap(nm)) {
      const at = nm ? nm.at : ws[k - 1].at + ws[k - 1].text.length;
      r.err('LW104', `'load' needs an output name and a mass`, li, at, 'write load NAME 300 g');
      return;
    }
    const m = /^([0-9.eE+-]+)(g|kg)?$/.exec(ws[k + 1]?.text ?? '');
    const num = m ? m[1] : (ws[k + 1]?.text ?? '');
    const unitWord = m?.[2] ?? (isGap(ws[k + 2]) ? undefined : ws[k + 2].text);
    const used = m?.[2] !== undefined ? 2 : unitWord !== undefined ? 3 : 2;
    if (isGap(ws[k + 1])) {
      r.err('LW107', `the load of '${nm.text}' has no mass`, li, nm.at + nm.text.length, `write load ${nm.text} 300 g`);
      return;
    }
    const g = gramsOf(num, unitWord, nm.text);
    if (typeof g !== 'number') {
      r.err('LW107', g.msg, li, ws[k + 1].at, g.hint);
      return;
    }
    if (Object.hasOwn(r.loads, nm.text)) {
      r.err('LW107', `'${nm.text}' is given a second load`, li, nm.at, 'give each output one load');
      return;
    }
    r.loads[nm.text] = g;
    r.partLocs[`load:${nm.text}`] = r.at(li, nm.at);
    k += used;
    if (k >= ws.length) return;
    if (ws[k].text !== ',') return r.trailing(ws, k, li, `the load of '${nm.text}'`);
    k++;
  }
}

/** `state NAME [code BITS] [final] [with NAME=V, …]`: opens a state (closing the one above). */
function stateLine(r: TextReader, ws: readonly Word[], li: number): void {
  r.close();
  const kw = ws[0];
  const nm = ws[1];
  if (isGap(nm)) {
    r.err('LW104', `'state' needs a name`, li, nm ? nm.at : kw.at + 5, 'write state NAME');
    return;
  }
  const locs: Record<string, SourceLoc> = { name: r.at(li, nm.at) };
  let outs: Record<string, OutBit> | undefined;
  let code: string | undefined;
  let final = false;
  let k = 2;
  while (k < ws.length) {
    // One `with` list, like one `code` and one `final`: a second is reported as trailing, never read over the first.
    if (ws[k].text === 'with' && ws[k + 1]?.text !== '=' && outs === undefined) {
      ({ outs, k } = readOutputs(r, ws, k + 1, li, locs));
    } else if (ws[k].text === 'final' && ws[k + 1]?.text !== '=' && !final) {
      final = true;
      locs.final = r.at(li, ws[k].at);
      k++;
    } else if (ws[k].text === 'code' && code === undefined) {
      const c = ws[k + 1];
      if (isGap(c)) {
        r.err('LW104', `'code' needs a state code of 0/1 digits`, li, c ? c.at : ws[k].at + 4, 'write code 0101');
        return;
      }
      code = c.text;
      locs.code = r.at(li, c.at);
      k += 2;
    } else break;
  }
  r.trailing(ws, k, li, `state '${printable(nm.text)}'`);
  const state = {
    name: nm.text,
    outputs: outs ?? nameRecord<OutBit>(),
    ...(code !== undefined ? { code } : {}),
    ...(final ? { final } : {}),
  };
  r.current = { state: { ...state, loc: r.at(li, kw.at), partLocs: locs }, transitions: [] };
}

/** `when GUARD go …`: the guard is read in prefix mode, up to the word after it. */
function whenLine(r: TextReader, line: string, kw: Word, li: number): void {
  const exprAt = skipBlanks(line, kw.at + 4);
  const e = readExpr(line.slice(exprAt), r.inputs, r.at(li, exprAt), 'go');
  r.ds.push(...e.diagnostics);
  if (!e.expr) return;
  const g = guardFromExpr(e.expr, line.slice(exprAt, exprAt + e.end).trim(), r.inputs.length, r.at(li, exprAt));
  r.ds.push(...g.diagnostics);
  if (g.guard) transitionTail(r, line, li, exprAt + e.end, g.guard, kw.at);
}

function unknownStatement(r: TextReader, kw: Word, li: number): void {
  const guess = didYouMean(kw.text, KEYWORDS);
  r.err(
    'LW101',
    `unknown statement '${printable(kw.text)}'`,
    li,
    kw.at,
    guess
      ? `did you mean '${guess}'?`
      : `a line starts with one of: ${KEYWORDS.join(', ')} (transitions: when GUARD go STATE, or go STATE)`,
  );
}

/** Read one line (its comment already stripped) by its first word. */
function statement(r: TextReader, line: string, li: number): void {
  const ws = words(line, 0);
  if (ws.length === 0) return;
  const kw = ws[0];
  switch (kw.text) {
    case 'machine':
      if (r.once(r.name, ws, li)) {
        r.name = r.oneName(ws, li, 'a name', 'machine NAME') ?? '';
        r.partLocs.name = r.at(li, ws[1]?.at ?? kw.at);
      }
      return;
    case 'inputs':
    case 'outputs':
      return nameList(r, ws, li);
    case 'start':
      if (r.once(r.start, ws, li)) {
        r.start = r.oneName(ws, li, 'a state name', 'start STATE') ?? '';
        r.partLocs.start = r.at(li, ws[1]?.at ?? kw.at);
      }
      return;
    case 'unspecified':
      return unspecifiedRule(r, ws, li);
    case 'never':
      return neverLine(r, line, kw, li);
    case 'load':
      return loadLine(r, ws, li);
    case 'state':
      return stateLine(r, ws, li);
    case 'go':
      return transitionTail(r, line, li, kw.at, undefined, kw.at);
    case 'when':
      return whenLine(r, line, kw, li);
    default:
      return unknownStatement(r, kw, li);
  }
}

/** Parse the text form into a Machine. */
export function parseTextMachine(text: string, file?: string): MachineResult {
  const lines = text.replace(/^\uFEFF/, '').split(/\r\n|\n|\r/);
  const { first, header } = headerOf(lines);
  const r = new TextReader(file);
  r.collectInputs(lines);
  lines.forEach((raw, li) => statement(r, stripComment(raw), li));
  r.close();
  return r.result(lines.length, first, header);
}

function printOutputs(m: Machine, rec: Readonly<Record<string, OutBit>>): string {
  const keys = Object.keys(rec);
  const order = [...m.outputs.filter((o) => keys.includes(o)), ...keys.filter((k) => !m.outputs.includes(k))];
  return order.length ? ` with ${order.map((k) => `${k}=${rec[k]}`).join(', ')}` : '';
}

/** Print a machine in the text form (canonical layout; parses back to the same machine). */
export function printTextMachine(m: Machine): string {
  const out: string[] = [];
  if (m.description !== undefined) {
    for (const l of m.description.split(/\r\n|\n|\r/)) out.push(l === '' ? '#' : `# ${l}`);
    out.push('');
  }
  out.push(`machine ${m.name}`);
  if (m.inputs.length) out.push(`inputs ${m.inputs.join(', ')}`);
  if (m.outputs.length) out.push(`outputs ${m.outputs.join(', ')}`);
  out.push(`start ${m.start}`);
  if (m.unspecified !== 'hold') out.push(`unspecified ${m.unspecified}`);
  for (const g of m.never) out.push(`never ${printExpr(g.expr)}`);
  for (const [o, g] of orderedLoads(m)) out.push(`load ${o} ${g} g`);
  for (const s of m.states) {
    out.push('');
    const final = s.final === true ? ' final' : '';
    out.push(`state ${s.name}${s.code !== undefined ? ` code ${s.code}` : ''}${final}${printOutputs(m, s.outputs)}`);
    for (const t of s.transitions) {
      const guard = isAlways(t.when) ? '' : `when ${printExpr(t.when.expr)} `;
      out.push(`  ${guard}go ${t.to}${printOutputs(m, t.outputs)}`);
    }
  }
  return out.join('\n') + '\n';
}
