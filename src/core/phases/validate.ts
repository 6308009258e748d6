/**
 * Validate phase: checks a parsed Machine and, when it has no errors, returns its flat table.
 *
 * Checks, in order: size limits (LW400–LW402, at once, before any other work); names
 * (LW405 length, LW205 form, LW203 repeats, LW204 start, LW300 no states); pinned codes (LW206);
 * references (LW200 target states, LW202 output names, of values and of loads); guards (LW304
 * constant 0, LW305 a `never` that excludes everything). Then, on the flat table
 * (src/core/model/flat.ts): transitions that get no row (LW301), states where the unspecified
 * rule applies (LW302, not for a state marked final; the input combinations it names are
 * simplified with the `never` set as don't-cares), states not reachable from the start
 * (LW303), and traps among the reachable states: a state with no way out that is not marked
 * final (LW306), an output that is never 1 or never 0 (LW307).
 *
 * Method: everything works on cubes — the flat table comes from the disjoint sharp of each
 * guard against the earlier ones (Hong, Cain & Ostapko, IBM J. Res. Dev. 1974), and
 * reachability is a breadth-first search over the table's rows — so no input combination is
 * ever enumerated and a machine with 24 inputs validates fast.
 * Preconditions: a Machine from a parser (guards' cubes are over `m.inputs`).
 * Postconditions: `flat` is present exactly when no diagnostic is an error; every diagnostic
 * carries the location of the state, transition, guard or name it is about.
 */
import { contains, coverContains, isTautology, overlaps, type Cube } from '../model/cube.js';
import { diag, didYouMean, hasErrors, type Diagnostic } from '../model/diagnostics.js';
import { DONT_CARE, flatten, type FlatMachine } from '../model/flat.js';
import { LIMITS, NAME_MAX } from '../model/limits.js';
import type { Machine, SourceLoc, State, Transition } from '../model/machine.js';
import { printCubes, printExpr } from '../forms/expr.js';

/** The largest machine the tool takes (defined in the model, so the readers can check it too). */
export { LIMITS } from '../model/limits.js';

/** Result of the validate phase. */
export interface Validated {
  /** The flat table, present only when there are no errors. */
  readonly flat?: FlatMachine;
  readonly diagnostics: Diagnostic[];
}

const IDENTIFIER = /^[A-Za-z_][A-Za-z0-9_]*$/;
const STATE_NAME = /^[A-Za-z0-9_]+$/;
const MACHINE_NAME = /^[A-Za-z0-9_][A-Za-z0-9_-]*$/;

type Located = { readonly loc?: SourceLoc; readonly partLocs?: Readonly<Record<string, SourceLoc>> };

/** Where a part was written: its own location, else its owner's path extended, else the owner. */
function partLoc(owner: Located, key: string, suffix: string, fallback: SourceLoc = {}): SourceLoc {
  const own = owner.partLocs?.[key];
  if (own) return own;
  const base = owner.loc ?? fallback;
  return base.path !== undefined && base.line === undefined ? { ...base, path: base.path + suffix } : base;
}

/** Check a machine; return its flat table when it has no errors. */
export function validate(m: Machine): Validated {
  const ds: Diagnostic[] = [];
  const mloc = m.loc ?? {};

  // Limits first: a machine past them is refused before any heavy work.
  // Point at the first name past the limit (the declaration that overflows), else at the machine.
  const limit = (code: 'LW400' | 'LW401' | 'LW402', what: string, count: number, max: number, at?: SourceLoc): void => {
    if (count > max)
      ds.push(
        diag(
          code,
          `the machine has ${count} ${what}; the tool handles at most ${max}`,
          at ?? mloc,
          code === 'LW401' ? 'split the machine or combine inputs' : 'split the machine',
        ),
      );
  };
  limit('LW400', 'states', m.states.length, LIMITS.states, m.states[LIMITS.states]?.loc);
  limit('LW401', 'inputs', m.inputs.length, LIMITS.inputs, m.partLocs?.[`input:${LIMITS.inputs}`]);
  limit('LW402', 'outputs', m.outputs.length, LIMITS.outputs, m.partLocs?.[`output:${LIMITS.outputs}`]);
  if (ds.length) return { diagnostics: ds };

  checkNames(m, ds);
  checkCodes(m, ds);
  checkReferences(m, ds);
  const neverCubes = m.never.flatMap((g) => g.cubes);
  const neverAll = m.never.length > 0 && isTautology(neverCubes, m.inputs.length);
  if (neverAll) {
    ds.push(
      diag(
        'LW305',
        'the never constraints exclude every input combination, so no transition can ever fire',
        m.never[0].loc ?? mloc,
        'check the never expressions; each should describe combinations that cannot happen',
      ),
    );
  }
  m.states.forEach((s) =>
    s.transitions.forEach((t, ti) => {
      if (t.when.cubes.length === 0) {
        ds.push(
          diag(
            'LW304',
            `the guard '${printExpr(t.when.expr)}' of transition ${ti + 1} in state '${s.name}' is never true`,
            t.when.loc ?? t.loc ?? s.loc ?? mloc,
            'check the expression; a transition that never fires can be removed',
          ),
        );
      }
    }),
  );
  if (hasErrors(ds)) return { diagnostics: ds };

  const flat = flatten(m);
  if (!neverAll) checkBehaviour(m, flat, neverCubes, ds);
  return { flat, diagnostics: ds };
}

/** LW405 for a name longer than NAME_MAX; true when it is that long. */
function tooLong(name: string, what: string, where: SourceLoc, ds: Diagnostic[]): boolean {
  if (name.length <= NAME_MAX) return false;
  ds.push(
    diag(
      'LW405',
      `the ${what} name '${name.slice(0, 40)}…' is ${name.length} characters long; the tool takes names of up to ${NAME_MAX}`,
      where,
      'shorten the name',
    ),
  );
  return true;
}

/** Names (LW405 length, LW205 form, LW203 repeats), then LW300 no states and LW204 the start state. */
function checkNames(m: Machine, ds: Diagnostic[]): void {
  const mloc = m.loc ?? {};
  if (!tooLong(m.name, 'machine', partLoc(m, 'name', '.name', mloc), ds) && !MACHINE_NAME.test(m.name)) {
    ds.push(
      diag(
        'LW205',
        m.name === '' ? 'the machine name is empty' : `the machine name '${m.name}' is not a valid name`,
        partLoc(m, 'name', '.name', mloc),
        'use letters, digits, _ and -; start with a letter, digit or _',
      ),
    );
  }
  const declared = new Map<string, string>();
  checkSignalNames(m, m.inputs, 'input', declared, ds);
  checkSignalNames(m, m.outputs, 'output', declared, ds);
  const seen = checkStateNames(m, ds);
  if (m.states.length === 0) {
    ds.push(diag('LW300', 'the machine has no states', mloc, 'declare at least one state'));
    return;
  }
  checkStart(m, seen, ds);
}

/** Input or output names: identifiers, each declared once across both lists (`declared`: name → kind). */
function checkSignalNames(
  m: Machine,
  list: readonly string[],
  kind: 'input' | 'output',
  declared: Map<string, string>,
  ds: Diagnostic[],
): void {
  list.forEach((n, i) => {
    const where = partLoc(m, `${kind}:${i}`, `.${kind}s[${i}]`, m.loc ?? {});
    if (!tooLong(n, kind, where, ds) && !IDENTIFIER.test(n)) {
      ds.push(
        diag(
          'LW205',
          `the ${kind} name '${n}' is not a valid identifier`,
          where,
          'use letters, digits and _; start with a letter or _',
        ),
      );
    }
    const prior = declared.get(n);
    if (prior !== undefined) {
      ds.push(
        diag(
          'LW203',
          prior === kind ? `the ${kind} '${n}' is declared twice` : `'${n}' is both an input and an output`,
          where,
          'rename one of them',
        ),
      );
    } else declared.set(n, kind);
  });
}

/** State names: well formed, each declared once. Returns the names seen. */
function checkStateNames(m: Machine, ds: Diagnostic[]): Set<string> {
  const seen = new Set<string>();
  for (const s of m.states) {
    const where = partLoc(s, 'name', '.name', m.loc ?? {});
    if (!tooLong(s.name, 'state', where, ds) && !STATE_NAME.test(s.name)) {
      ds.push(
        diag(
          'LW205',
          s.name === '' ? 'a state has an empty name' : `the state name '${s.name}' is not a valid name`,
          where,
          'use letters, digits and _',
        ),
      );
    }
    if (seen.has(s.name))
      ds.push(
        diag(
          'LW203',
          `the state '${s.name}' is declared twice`,
          where,
          'rename one of them, or merge their transitions',
        ),
      );
    seen.add(s.name);
  }
  return seen;
}

/** LW204: the start state is named and exists. */
function checkStart(m: Machine, states: ReadonlySet<string>, ds: Diagnostic[]): void {
  const startLoc = partLoc(m, 'start', '.start', m.loc ?? {});
  if (m.start === '') {
    ds.push(
      diag(
        'LW204',
        'the machine names no start state',
        startLoc,
        `name the state it starts in, for example '${m.states[0].name}'`,
      ),
    );
  } else if (!states.has(m.start)) {
    const guess = didYouMean(
      m.start,
      m.states.map((s) => s.name),
    );
    ds.push(
      diag(
        'LW204',
        `the start state '${m.start}' does not exist`,
        startLoc,
        guess ? `did you mean '${guess}'?` : 'name an existing state as the start',
      ),
    );
  }
}

function checkCodes(m: Machine, ds: Diagnostic[]): void {
  const pinned = m.states.filter((s) => s.code !== undefined);
  if (pinned.length === 0) return;
  // The most common length is taken as the intended one, so the odd one out is blamed.
  const counts = new Map<number, number>();
  for (const s of pinned) counts.set(s.code!.length, (counts.get(s.code!.length) ?? 0) + 1);
  const width = [...counts.entries()].sort((a, b) => b[1] - a[1] || b[0] - a[0])[0][0];
  const owner = new Map<string, string>();
  for (const s of pinned) {
    const code = s.code!;
    const where = partLoc(s, 'code', '.code', m.loc);
    if (!/^[01]+$/.test(code)) {
      ds.push(
        diag(
          'LW206',
          `the code '${code}' of state '${s.name}' is not a string of 0/1 digits`,
          where,
          'write the code with the digits 0 and 1 only, most significant bit first',
        ),
      );
    } else if (code.length !== width) {
      ds.push(
        diag(
          'LW206',
          `the code '${code}' of state '${s.name}' has ${code.length} digits; the other pinned codes have ${width}`,
          where,
          'give every pinned code the same number of digits',
        ),
      );
    } else if (owner.has(code)) {
      ds.push(
        diag(
          'LW206',
          `state '${s.name}' repeats the code ${code} of state '${owner.get(code)}'`,
          where,
          'give every state a different code',
        ),
      );
    } else owner.set(code, s.name);
  }
}

function checkReferences(m: Machine, ds: Diagnostic[]): void {
  const states = m.states.map((s) => s.name);
  const known = new Set(states);
  const outputs = new Set(m.outputs);
  const outNames = (owner: Located, rec: Readonly<Record<string, unknown>>, what: string): void => {
    for (const k of Object.keys(rec)) {
      if (outputs.has(k)) continue;
      const guess = didYouMean(k, m.outputs);
      ds.push(
        diag(
          'LW202',
          `${what} sets the undeclared output '${k}'`,
          partLoc(owner, `out:${k}`, `.outputs.${k}`, m.loc),
          guess ? `did you mean '${guess}'?` : 'declare it among the outputs, or correct its name',
        ),
      );
    }
  };
  for (const k of Object.keys(m.loadsG ?? {})) {
    if (outputs.has(k)) continue;
    const guess = didYouMean(k, m.outputs);
    ds.push(
      diag(
        'LW202',
        `a load is given for '${k}', which is not a declared output`,
        partLoc(m, `load:${k}`, `.loadsG.${k}`, m.loc),
        guess ? `did you mean '${guess}'?` : 'declare it among the outputs, or correct its name',
      ),
    );
  }
  for (const s of m.states) {
    outNames(s, s.outputs, `state '${s.name}'`);
    s.transitions.forEach((t, ti) => {
      outNames(t, t.outputs, `transition ${ti + 1} of state '${s.name}'`);
      if (!known.has(t.to)) {
        const guess = didYouMean(t.to, states);
        ds.push(
          diag(
            'LW200',
            `transition ${ti + 1} of state '${s.name}' goes to the unknown state '${t.to}'`,
            partLoc(t, 'to', '.to', s.loc),
            guess ? `did you mean '${guess}'?` : 'declare the state, or correct the name',
          ),
        );
      }
    });
  }
}

function describe(t: Transition): string {
  return `(${printExpr(t.when.expr)} → ${t.to})`;
}

function checkBehaviour(m: Machine, flat: FlatMachine, never: readonly Cube[], ds: Diagnostic[]): void {
  const mloc = m.loc ?? {};
  m.states.forEach((s, si) => {
    const fired = new Set(flat.rows[si].map((r) => r.transition));
    s.transitions.forEach((t, ti) => {
      if (fired.has(ti) || t.when.cubes.length === 0) return;
      ds.push(
        diag(
          'LW301',
          `transition ${ti + 1} of state '${s.name}' ${describe(t)} can never fire: ${shadowedBy(s, ti, never)}`,
          t.loc ?? s.loc ?? mloc,
          'remove it, reorder the transitions, or narrow the earlier guards',
        ),
      );
    });
    const rest = flat.rows[si].filter((r) => r.transition === -1).map((r) => r.cube);
    if (rest.length && s.final !== true) ds.push(unspecifiedNote(m, s, rest, never));
  });

  // Reachability: breadth-first over the rows' next states.
  const reached = new Set<number>([flat.start]);
  const queue = [flat.start];
  while (queue.length) {
    const si = queue.shift()!;
    for (const r of flat.rows[si]) {
      if (r.next >= 0 && !reached.has(r.next)) {
        reached.add(r.next);
        queue.push(r.next);
      }
    }
  }
  m.states.forEach((s, si) => {
    if (!reached.has(si))
      ds.push(
        diag(
          'LW303',
          `state '${s.name}' cannot be reached from the start state '${m.start}'`,
          s.loc ?? mloc,
          'add a transition into it, or remove it; it is dropped from the build',
        ),
      );
  });
  checkTraps(m, flat, reached, ds);
}

/**
 * LW306: a reachable state (of a machine with more than one) whose every row stays in it — no
 * transition leads out, so only the reset lever does — unless it is marked final. A row whose
 * next state is free is no way out: the build may choose to stay. LW307: an output that no
 * reachable row sets to 1, or none to 0 (free values aside).
 */
function checkTraps(m: Machine, flat: FlatMachine, reached: ReadonlySet<number>, ds: Diagnostic[]): void {
  const mloc = m.loc ?? {};
  if (m.states.length > 1)
    m.states.forEach((s, si) => {
      if (!reached.has(si) || s.final === true) return;
      if (flat.rows[si].some((r) => r.next !== si && r.next !== DONT_CARE)) return;
      ds.push(
        diag(
          'LW306',
          `state '${s.name}' has no way out: no transition leads to another state, so once there the machine stays until the reset lever is pulled`,
          s.loc ?? mloc,
          `add a transition out of it, or mark it final if the machine is meant to stop there (text form: state ${s.name} final; JSON form: "final": true)`,
        ),
      );
    });
  m.outputs.forEach((o, k) => {
    const values = new Set<string>();
    for (const si of reached) for (const r of flat.rows[si]) values.add(String(r.out[k]));
    const never = !values.has('1') ? 1 : !values.has('0') ? 0 : undefined;
    if (never === undefined || (!values.has('0') && !values.has('1'))) return;
    const actuator = m.loadsG !== undefined && Object.hasOwn(m.loadsG, o);
    const moves = actuator ? 'its actuator never moves its load' : 'its flag never moves';
    ds.push(
      diag(
        'LW307',
        never === 1
          ? `output '${o}' is never 1 in any reachable state or transition: ${moves}`
          : `output '${o}' is 1 in every reachable state and transition, never 0: ${moves}`,
        partLoc(m, `output:${k}`, `.outputs[${k}]`, mloc),
        never === 1
          ? `set it where it should show (with ${o}=1 on a state or transition), or remove the output`
          : `set it to 0 where it should drop (with ${o}=0), or remove the output`,
      ),
    );
  });
}

function shadowedBy(s: State, ti: number, never: readonly Cube[]): string {
  const t = s.transitions[ti];
  const earlier = s.transitions
    .map((e, i) => ({ e, i }))
    .filter(({ e, i }) => i < ti && e.when.cubes.some((a) => t.when.cubes.some((b) => overlaps(a, b))))
    .map(({ i }) => i + 1);
  const byNever = never.length > 0 && t.when.cubes.some((b) => never.some((a) => overlaps(a, b)));
  if (earlier.length === 0 || (byNever && coverContains(never, t.when.cubes)))
    return 'the never constraints exclude every combination its guard covers';
  const list =
    earlier.length === 1
      ? `transition ${earlier[0]}`
      : `transitions ${earlier.slice(0, -1).join(', ')} and ${earlier[earlier.length - 1]}`;
  const verb = earlier.length === 1 && !byNever ? 'takes' : 'take';
  return `${list}${byNever ? ' and the never constraints' : ''} already ${verb} every combination its guard covers`;
}

function unspecifiedNote(m: Machine, s: State, rest: readonly Cube[], never: readonly Cube[]): Diagnostic {
  const n = m.inputs.length;
  const merged = mergeAdjacent(expandWithin(rest, never, n));
  const shown = printCubes(merged.slice(0, 3), m.inputs) + (merged.length > 3 ? ' | …' : '');
  const what =
    n === 0 || s.transitions.length === 0
      ? 'has no transition'
      : `has no transition for some input combinations (${shown})`;
  const rule =
    m.unspecified === 'hold'
      ? `the unspecified rule 'hold' applies: it stays in '${s.name}' with its own outputs (unnamed outputs 0)`
      : `the unspecified rule 'dont-care' applies: the next state and the outputs the state does not name are left free`;
  return diag(
    'LW302',
    `state '${s.name}' ${what}; ${rule}`,
    s.loc ?? m.loc ?? {},
    'nothing to do if that is intended; otherwise add transitions',
  );
}

/**
 * The cubes widened into the don't-care set (the `never` combinations), for shorter messages:
 * each cube drops every literal it can while it stays inside cubes ∪ dc (the expand step of
 * Espresso-II: R. K. Brayton et al., Logic Minimization Algorithms for VLSI Synthesis, 1984),
 * then cubes inside another one go (absorption), in the order written. `!up & !full | !up &
 * full & !empty` with `never full & empty` becomes `!up`; `!up | up & !full` becomes
 * `!up | !full` with no constraint at all.
 */
function expandWithin(cubes: readonly Cube[], dc: readonly Cube[], n: number): Cube[] {
  if (cubes.length > 64) return [...cubes];
  const allowed = [...cubes, ...dc];
  const wide = cubes.map((c) => {
    let cur = c;
    for (let k = 0; k < n; k++) {
      if (cur[k] === '-') continue;
      const wider = cur.slice(0, k) + '-' + cur.slice(k + 1);
      if (coverContains(allowed, [wider])) cur = wider;
    }
    return cur;
  });
  // Absorption in the order written: a cube goes when another one contains it.
  const unique = [...new Set(wide)];
  return unique.filter((c, i) => !unique.some((k, j) => j !== i && contains(k, c)));
}

/** Merge cubes that differ in one fixed position (x&y | x&!y → x), for shorter messages only. */
function mergeAdjacent(cubes: readonly Cube[]): Cube[] {
  let cur = [...cubes];
  if (cur.length > 64) return cur;
  for (let changed = true; changed;) {
    changed = false;
    search: for (let i = 0; i < cur.length; i++)
      for (let j = i + 1; j < cur.length; j++) {
        const a = cur[i];
        const b = cur[j];
        let diff = -1;
        for (let k = 0; k < a.length; k++) {
          if (a[k] === b[k]) continue;
          if (diff >= 0 || a[k] === '-' || b[k] === '-') {
            diff = -2;
            break;
          }
          diff = k;
        }
        if (diff >= 0) {
          cur = [...cur.filter((_, x) => x !== i && x !== j), a.slice(0, diff) + '-' + a.slice(diff + 1)];
          changed = true;
          break search;
        }
      }
  }
  return cur;
}
