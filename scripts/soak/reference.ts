/**
 * A reference interpreter of the JSON form, written straight from the semantics of the
 * machine (DESIGN.md §7, docs/notation.md "Meaning") and sharing no code with the core:
 * transitions are tried in order, the first whose `when` holds fires (a missing `when` always
 * holds); when none fires, `unspecified` applies (`hold`: stay, showing the state's own
 * outputs; `dont-care`: the next state and every output the state does not name are free).
 * The outputs while a transition is taken are the state's overridden by the transition's; an
 * output named by neither is 0; "-" is free.
 *
 * Guards are read by a parser of their own: `!` over `&` over `^` over `|`, parentheses,
 * `0`, `1` and input names.
 */

/** A parsed guard: evaluate it on input values (name → true when pulled). */
export type Guard = (v: ReadonlyMap<string, boolean>) => boolean;

const TOKEN = /\s*([A-Za-z_][A-Za-z0-9_]*|[01]|[!&^|()])/y;

/** Parse a guard of the notation; throws on text the grammar does not allow. */
export function parseGuard(text: string): Guard {
  const tokens: string[] = [];
  TOKEN.lastIndex = 0;
  let at = 0;
  while (at < text.length) {
    if (/^\s*$/.test(text.slice(at))) break;
    TOKEN.lastIndex = at;
    const m = TOKEN.exec(text);
    if (!m) throw new Error(`reference: cannot read guard '${text}' at ${at}`);
    tokens.push(m[1]);
    at = TOKEN.lastIndex;
  }
  let i = 0;
  const peek = (): string | undefined => tokens[i];
  const binary = (op: string, sub: () => Guard, fold: (a: boolean, b: boolean) => boolean) => (): Guard => {
    let g = sub();
    while (peek() === op) {
      i++;
      const l = g;
      const r = sub();
      g = (v) => fold(l(v), r(v));
    }
    return g;
  };
  const atom = (): Guard => {
    const t = tokens[i++];
    if (t === '!') {
      const g = atom();
      return (v) => !g(v);
    }
    if (t === '(') {
      const g = or();
      if (tokens[i++] !== ')') throw new Error(`reference: ')' missing in '${text}'`);
      return g;
    }
    if (t === '0') return () => false;
    if (t === '1') return () => true;
    if (t === undefined || !/^[A-Za-z_]/.test(t)) throw new Error(`reference: unexpected '${t}' in '${text}'`);
    return (v) => v.get(t) === true;
  };
  const and = binary('&', atom, (a, b) => a && b);
  const xor = binary('^', and, (a, b) => a !== b);
  const or: () => Guard = binary('|', xor, (a, b) => a || b);
  const g = or();
  if (i !== tokens.length) throw new Error(`reference: trailing '${tokens[i]}' in '${text}'`);
  return g;
}

/** The JSON form as the campaign writes it (docs/notation.md). */
export interface SpecJson {
  readonly name: string;
  readonly inputs: readonly string[];
  readonly outputs: readonly string[];
  readonly start: string;
  readonly unspecified?: 'hold' | 'dont-care';
  readonly never?: readonly string[];
  /** Actuator loads in grams (the reference ignores them: they change no behaviour). */
  readonly loadsG?: Readonly<Record<string, number>>;
  readonly states: readonly {
    readonly name: string;
    readonly code?: string;
    readonly final?: boolean;
    readonly outputs?: Readonly<Record<string, 0 | 1 | '-'>>;
    readonly transitions: readonly {
      readonly when?: string;
      readonly to: string;
      readonly outputs?: Readonly<Record<string, 0 | 1 | '-'>>;
    }[];
  }[];
}

/** One clock of the specification: the next state (null: free) and each output (null: free). */
export interface RefStep {
  readonly next: string | null;
  readonly outputs: readonly (0 | 1 | null)[];
}

const own = <T>(r: Readonly<Record<string, T>> | undefined, k: string): T | undefined =>
  r !== undefined && Object.prototype.hasOwnProperty.call(r, k) ? r[k] : undefined;

/** The specification as a step function, guards parsed once. */
export class Reference {
  private readonly guards = new Map<string, Guard>();
  private readonly never: Guard[];
  readonly assignments: readonly string[];
  constructor(readonly spec: SpecJson) {
    this.never = (spec.never ?? []).map((t) => this.guard(t));
    const n = spec.inputs.length;
    this.assignments = Array.from({ length: 2 ** n }, (_, k) => (n === 0 ? '' : k.toString(2).padStart(n, '0')));
  }
  private guard(text: string): Guard {
    let g = this.guards.get(text);
    if (!g) {
      g = parseGuard(text);
      this.guards.set(text, g);
    }
    return g;
  }
  values(assignment: string): Map<string, boolean> {
    return new Map(this.spec.inputs.map((n, k) => [n, assignment[k] === '1']));
  }
  /** Whether the combination is one the spec says never occurs. */
  isNever(assignment: string): boolean {
    const v = this.values(assignment);
    return this.never.some((g) => g(v));
  }
  step(state: string, assignment: string): RefStep {
    const s = this.spec.states.find((x) => x.name === state);
    if (!s) throw new Error(`reference: no state '${state}'`);
    const v = this.values(assignment);
    const bit = (x: 0 | 1 | '-' | undefined, free: boolean): 0 | 1 | null =>
      x === '-' ? null : x === undefined ? (free ? null : 0) : x;
    for (const t of s.transitions) {
      if (t.when !== undefined && !this.guard(t.when)(v)) continue;
      const outputs = this.spec.outputs.map((o) => bit(own(t.outputs, o) ?? own(s.outputs, o), false));
      return { next: t.to, outputs };
    }
    const free = this.spec.unspecified === 'dont-care';
    return { next: free ? null : s.name, outputs: this.spec.outputs.map((o) => bit(own(s.outputs, o), free)) };
  }
}
