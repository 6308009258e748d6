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
 *   state empty code 00 with bell=0     (code and with are optional, in either order)
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
import { diag, didYouMean, type Diagnostic } from '../model/diagnostics.js';
import type { Guard, Machine, OutBit, SourceLoc, State, Transition } from '../model/machine.js';
import { alwaysGuard, guardFromExpr, parseGuard, printExpr, readExpr } from './expr.js';
import { isAlways, type MachineResult } from './json.js';

const KEYWORDS = ['machine', 'inputs', 'outputs', 'start', 'unspecified', 'never', 'state', 'when', 'go'];

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

/** Parse the text form into a Machine. */
export function parseTextMachine(text: string, file?: string): MachineResult {
  const lines = text.replace(/^\uFEFF/, '').split(/\r\n|\n|\r/);
  const ds: Diagnostic[] = [];
  const at = (line: number, offset: number): SourceLoc => ({
    ...(file !== undefined ? { file } : {}),
    line: line + 1,
    column: offset + 1,
  });
  const err = (
    code: 'LW101' | 'LW103' | 'LW104' | 'LW106',
    msg: string,
    line: number,
    offset: number,
    hint: string,
  ): void => {
    ds.push(diag(code, msg, at(line, offset), hint));
  };

  // The header comment block (after any leading blank lines) is the description.
  let first = 0;
  while (first < lines.length && lines[first].trim() === '') first++;
  const header: string[] = [];
  for (let i = first; i < lines.length && lines[i].trimStart().startsWith('#'); i++) {
    header.push(lines[i].trimStart().slice(1).replace(/^ /, '').trimEnd());
  }

  // Guards need the inputs, which may be declared anywhere: collect them first.
  const inputs: string[] = [];
  const partLocs: Record<string, SourceLoc> = {};
  lines.forEach((raw, li) => {
    const ws = words(stripComment(raw), 0);
    if (ws[0]?.text !== 'inputs') return;
    for (const w of ws.slice(1)) {
      if (w.text === ',' || w.text === '=') continue;
      partLocs[`input:${inputs.length}`] = at(li, w.at);
      inputs.push(w.text);
    }
  });

  let name: string | undefined;
  let start: string | undefined;
  let unspecified: Machine['unspecified'] | undefined;
  const outputs: string[] = [];
  const never: Guard[] = [];
  const states: State[] = [];
  interface Open {
    state: Omit<State, 'transitions'>;
    transitions: Transition[];
  }
  let current: Open | undefined;
  const close = (): void => {
    if (current) states.push({ ...current.state, transitions: current.transitions });
    current = undefined;
  };

  /** Read `NAME=V[,] …` pairs from ws[k]; stops at a word not followed by '='. */
  const readOutputs = (
    ws: Word[],
    k: number,
    li: number,
    locs: Record<string, SourceLoc>,
  ): { outs: Record<string, OutBit>; k: number } => {
    const outs: Record<string, OutBit> = Object.create(null);
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
      if (!val || val.text === ',' || val.text === '=') {
        err(
          'LW106',
          `output '${key.text}' has no value`,
          li,
          ws[k + 1].at + 1,
          `write ${key.text}=1, ${key.text}=0 or ${key.text}=- (don't care)`,
        );
        k += 2;
        any = true;
        continue;
      }
      if (val.text === '0' || val.text === '1' || val.text === '-')
        outs[key.text] = val.text === '-' ? '-' : val.text === '1' ? 1 : 0;
      else err('LW106', `output '${key.text}' has the value '${val.text}'`, li, val.at, `write 0, 1 or - (don't care)`);
      locs[`out:${key.text}`] = at(li, key.at);
      any = true;
      k += 3;
    }
    if (!any) {
      const w = ws[k];
      err(
        'LW101',
        w
          ? `expected output values like bell=1 after 'with', found '${w.text}'`
          : `'with' needs output values, like bell=1`,
        li,
        w ? w.at : ws[k - 1].at + ws[k - 1].text.length,
        'write with NAME=VALUE, NAME=VALUE … (values 0, 1 or -)',
      );
    }
    return { outs, k };
  };
  const trailing = (ws: Word[], k: number, li: number, after: string): void => {
    if (k < ws.length)
      err(
        'LW101',
        `unexpected '${ws[k].text}' after ${after}`,
        li,
        ws[k].at,
        'remove it, or check the statement against the notation reference',
      );
  };
  const oneName = (ws: Word[], li: number, what: string, example: string): string | undefined => {
    const w = ws[1];
    if (!w || w.text === ',' || w.text === '=') {
      err('LW104', `'${ws[0].text}' needs ${what}`, li, w ? w.at : ws[0].at + ws[0].text.length, `write ${example}`);
      return undefined;
    }
    trailing(ws, 2, li, `the ${what}`);
    return w.text;
  };
  const once = (seen: unknown, ws: Word[], li: number): boolean => {
    if (seen === undefined) return true;
    err('LW101', `a second '${ws[0].text}' line`, li, ws[0].at, `a machine has one '${ws[0].text}' line; remove one`);
    return false;
  };
  // Transition after `when GUARD` or `go`: `go TARGET [with …]`, from word list ws at k.
  const transitionTail = (line: string, li: number, goAt: number, when: Guard | undefined, stmtAt: number): void => {
    const ws = words(line, goAt);
    if (ws[0]?.text !== 'go') {
      const w = ws[0];
      err(
        'LW101',
        w ? `expected 'go' after the guard, found '${w.text}'` : `expected 'go' and a state after the guard`,
        li,
        w ? w.at : line.trimEnd().length,
        `write when GUARD go STATE`,
      );
      return;
    }
    const target = ws[1];
    if (!target || target.text === ',' || target.text === '=') {
      err('LW104', `'go' needs a state to go to`, li, target ? target.at : ws[0].at + 2, 'write go STATE');
      return;
    }
    const locs: Record<string, SourceLoc> = { to: at(li, target.at) };
    let k = 2;
    let outs: Record<string, OutBit> = Object.create(null);
    if (ws[k]?.text === 'with') ({ outs, k } = readOutputs(ws, k + 1, li, locs));
    trailing(ws, k, li, `the target state`);
    if (!current) {
      err(
        'LW101',
        'a transition before any state',
        li,
        stmtAt,
        "write 'state NAME' first; transitions belong to the state above them",
      );
      return;
    }
    const loc = at(li, stmtAt);
    current.transitions.push({
      when: when ?? alwaysGuard(inputs.length, loc),
      to: target.text,
      outputs: outs,
      loc,
      partLocs: locs,
    });
  };

  lines.forEach((raw, li) => {
    const line = stripComment(raw);
    const ws = words(line, 0);
    if (ws.length === 0) return;
    const kw = ws[0];
    switch (kw.text) {
      case 'machine':
        if (once(name, ws, li)) {
          name = oneName(ws, li, 'a name', 'machine NAME') ?? '';
          partLocs.name = at(li, ws[1]?.at ?? kw.at);
        }
        return;
      case 'inputs':
      case 'outputs': {
        for (let k = 1; k < ws.length; k++) {
          if (ws[k].text === '=')
            err(
              'LW101',
              `unexpected '=' in the ${kw.text} list`,
              li,
              ws[k].at,
              `list names separated by commas or spaces`,
            );
          else if (ws[k].text !== ',' && kw.text === 'outputs') {
            partLocs[`output:${outputs.length}`] = at(li, ws[k].at);
            outputs.push(ws[k].text);
          }
        }
        return;
      }
      case 'start':
        if (once(start, ws, li)) {
          start = oneName(ws, li, 'a state name', 'start STATE') ?? '';
          partLocs.start = at(li, ws[1]?.at ?? kw.at);
        }
        return;
      case 'unspecified': {
        if (!once(unspecified, ws, li)) return;
        const v = oneName(ws, li, 'a rule', 'unspecified hold, or unspecified dont-care');
        if (v === 'hold' || v === 'dont-care') unspecified = v;
        else if (v !== undefined) {
          const guess = didYouMean(v, ['hold', 'dont-care']);
          err(
            'LW103',
            `unknown unspecified rule '${v}'`,
            li,
            ws[1].at,
            guess ? `did you mean '${guess}'?` : 'write hold or dont-care',
          );
        }
        return;
      }
      case 'never': {
        const from = kw.at + kw.text.length;
        const exprAt = from + (line.slice(from).length - line.slice(from).trimStart().length);
        const r = parseGuard(line.slice(exprAt), inputs, at(li, exprAt));
        ds.push(...r.diagnostics);
        if (r.guard) never.push(r.guard);
        return;
      }
      case 'state': {
        close();
        const nm = ws[1];
        if (!nm || nm.text === ',' || nm.text === '=') {
          err('LW104', `'state' needs a name`, li, nm ? nm.at : kw.at + 5, 'write state NAME');
          return;
        }
        const locs: Record<string, SourceLoc> = { name: at(li, nm.at) };
        let outs: Record<string, OutBit> = Object.create(null);
        let code: string | undefined;
        let k = 2;
        while (k < ws.length) {
          if (ws[k].text === 'with' && ws[k + 1]?.text !== '=') {
            ({ outs, k } = readOutputs(ws, k + 1, li, locs));
          } else if (ws[k].text === 'code' && code === undefined) {
            const c = ws[k + 1];
            if (!c || c.text === ',' || c.text === '=') {
              err('LW104', `'code' needs a state code of 0/1 digits`, li, c ? c.at : ws[k].at + 4, 'write code 0101');
              return;
            }
            code = c.text;
            locs.code = at(li, c.at);
            k += 2;
          } else break;
        }
        trailing(ws, k, li, `state '${nm.text}'`);
        current = {
          state: {
            name: nm.text,
            outputs: outs,
            ...(code !== undefined ? { code } : {}),
            loc: at(li, kw.at),
            partLocs: locs,
          },
          transitions: [],
        };
        return;
      }
      case 'go':
        transitionTail(line, li, kw.at, undefined, kw.at);
        return;
      case 'when': {
        const from = kw.at + 4;
        const exprAt = from + (line.slice(from).length - line.slice(from).trimStart().length);
        const r = readExpr(line.slice(exprAt), inputs, at(li, exprAt), 'go');
        ds.push(...r.diagnostics);
        if (!r.expr) return;
        const g = guardFromExpr(r.expr, line.slice(exprAt, exprAt + r.end).trim(), inputs.length, at(li, exprAt));
        ds.push(...g.diagnostics);
        if (g.guard) transitionTail(line, li, exprAt + r.end, g.guard, kw.at);
        return;
      }
      default: {
        const guess = didYouMean(kw.text, KEYWORDS);
        err(
          'LW101',
          `unknown statement '${kw.text}'`,
          li,
          kw.at,
          guess
            ? `did you mean '${guess}'?`
            : `a line starts with one of: ${KEYWORDS.join(', ')} (transitions: when GUARD go STATE, or go STATE)`,
        );
      }
    }
  });
  close();

  if (name === undefined)
    err('LW104', `the machine has no 'machine' line`, first < lines.length ? first : 0, 0, 'add a line: machine NAME');
  if (ds.some((d) => d.severity === 'error')) return { diagnostics: ds };
  const machine: Machine = {
    name: name ?? '',
    inputs,
    outputs,
    start: start ?? '',
    unspecified: unspecified ?? 'hold',
    never,
    states,
    ...(header.length ? { description: header.join('\n') } : {}),
    loc: at(0, 0),
    partLocs,
  };
  return { machine, diagnostics: ds };
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
  for (const s of m.states) {
    out.push('');
    out.push(`state ${s.name}${s.code !== undefined ? ` code ${s.code}` : ''}${printOutputs(m, s.outputs)}`);
    for (const t of s.transitions) {
      const guard = isAlways(t.when) ? '' : `when ${printExpr(t.when.expr)} `;
      out.push(`  ${guard}go ${t.to}${printOutputs(m, t.outputs)}`);
    }
  }
  return out.join('\n') + '\n';
}
