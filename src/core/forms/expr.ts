/**
 * Guard expressions: parsing, printing, and conversion to a cover (sum of products) over the
 * machine's inputs.
 *
 * Grammar (precedence `!` over `&` over `^` over `|`, all binary operators associative):
 *   or   := xor ('|' xor)*
 *   xor  := and ('^' and)*
 *   and  := not ('&' not)*
 *   not  := '!' not | atom
 *   atom := name | '0' | '1' | '(' or ')'
 * Parsed by recursive descent; chains of one operator become one n-ary node, so printing and
 * re-parsing give the same tree. Nesting (open parentheses plus the `!`s over them) is limited
 * to GUARD_DEPTH_LIMIT levels (LW404), so neither the reader nor anything that walks the tree
 * later (the cover, the printer) can run out of stack.
 *
 * Cover conversion never enumerates input combinations: negations are pushed to the literals
 * (De Morgan), AND is the pairwise intersection of covers, OR is concatenation with
 * single-cube absorption, XOR folds a running pair (odd cover, even cover). Every step counts
 * its cube operations against a budget, so a guard whose cover explodes (an XOR chain over
 * many inputs) is reported as LW403 instead of hanging.
 */
import { literalCount, contains, intersect, universe, type Cube } from '../model/cube.js';
import { diag, didYouMean, printable, type Diagnostic } from '../model/diagnostics.js';
import type { Expr, Guard, SourceLoc } from '../model/machine.js';

/** Largest cover a guard may expand to. */
export const GUARD_CUBE_LIMIT = 4096;
/** Largest number of pairwise cube operations spent converting one guard. */
export const GUARD_WORK_LIMIT = 4_000_000;
/** Deepest nesting of parentheses and `!` a guard may have (each level is a level of the tree). */
export const GUARD_DEPTH_LIMIT = 256;

type Tok = { kind: 'name' | 'op' | 'const' | 'end'; text: string; pos: number };

const NAME_START = /[A-Za-z_]/;
const NAME_CHAR = /[A-Za-z0-9_]/;

function tokenize(text: string): { toks: Tok[]; bad?: { pos: number; msg: string } } {
  const toks: Tok[] = [];
  // A bad token ends the token list; the parser reports it only if it reads that far.
  const stop = (pos: number, msg: string) => {
    toks.push({ kind: 'end', text: '', pos });
    return { toks, bad: { pos, msg } };
  };
  let i = 0;
  while (i < text.length) {
    const ch = text[i];
    if (/\s/.test(ch)) {
      i++;
    } else if ('!&|^()'.includes(ch)) {
      toks.push({ kind: 'op', text: ch, pos: i++ });
    } else if (NAME_CHAR.test(ch)) {
      const start = i;
      while (i < text.length && NAME_CHAR.test(text[i])) i++;
      const word = text.slice(start, i);
      if (NAME_START.test(word[0])) toks.push({ kind: 'name', text: word, pos: start });
      else if (word === '0' || word === '1') toks.push({ kind: 'const', text: word, pos: start });
      else return stop(start, `'${printable(word)}' is neither an input name nor 0 or 1`);
    } else {
      return stop(i, `unexpected character '${printable(String.fromCodePoint(text.codePointAt(i) ?? 0))}'`);
    }
  }
  toks.push({ kind: 'end', text: '', pos: text.length });
  return { toks };
}

/** A syntax error at offset `pos`; caught inside this module and turned into LW102 (LW404 for nesting). */
class SyntaxProblem extends Error {
  constructor(
    readonly pos: number,
    readonly msg: string,
    readonly code: 'LW102' | 'LW404' = 'LW102',
  ) {
    super(msg);
    this.name = 'SyntaxProblem';
  }
}

/** Result of reading an expression from the front of a text. */
export interface ExprPrefix {
  readonly expr?: Expr;
  /** Offset just past the expression (where reading stopped). */
  readonly end: number;
  readonly diagnostics: Diagnostic[];
}

/** Location of character `offset` of an expression whose first character is at `loc`. */
export function locAt(loc: SourceLoc, offset: number): SourceLoc {
  return loc.line !== undefined ? { ...loc, column: (loc.column ?? 1) + offset } : loc;
}

function where(loc: SourceLoc, offset: number): string {
  return loc.line !== undefined ? '' : ` (at character ${offset + 1})`;
}

function describeToken(t: Tok): string {
  return t.kind === 'end' ? 'the end of the expression' : `'${printable(t.text)}'`;
}

/** Binary operators by precedence level, loosest first. */
const LEVELS = [
  ['|', 'or'],
  ['^', 'xor'],
  ['&', 'and'],
] as const;

/** Recursive descent over the tokens, one method per grammar rule; unknown inputs go to `diagnostics`. */
class ExprReader {
  readonly diagnostics: Diagnostic[] = [];
  private k = 0;
  /** Open parentheses and the `!`s over them, at the read position. */
  private level = 0;
  private readonly index: Map<string, number>;

  constructor(
    private readonly toks: readonly Tok[],
    private readonly inputs: readonly string[],
    private readonly loc: SourceLoc,
    private readonly stopWord: string | undefined,
  ) {
    this.index = new Map(inputs.map((n, i) => [n, i]));
  }

  peek(): Tok {
    return this.toks[this.k];
  }

  or(): Expr {
    return this.chain(0);
  }

  /**
   * `sub (op sub)*` at one precedence level (0 '|', 1 '^', 2 '&') as one n-ary node; nested
   * nodes of the same kind are flattened into it. The next level is called directly, so that a
   * level of parentheses costs few stack frames.
   */
  private chain(level: 0 | 1 | 2): Expr {
    const op = LEVELS[level][0];
    const kind = LEVELS[level][1];
    const args: Expr[] = [];
    const push = (e: Expr): void => {
      if (e.kind === kind) args.push(...e.args);
      else args.push(e);
    };
    push(level < 2 ? this.chain((level + 1) as 1 | 2) : this.operand());
    while (this.peek().kind === 'op' && this.peek().text === op) {
      this.k++;
      push(level < 2 ? this.chain((level + 1) as 1 | 2) : this.operand());
    }
    return args.length === 1 ? args[0] : { kind, args };
  }

  /** One more level of nesting at token `t`; LW404 past GUARD_DEPTH_LIMIT. */
  private deeper(t: Tok): void {
    if (++this.level > GUARD_DEPTH_LIMIT)
      throw new SyntaxProblem(
        t.pos,
        `the guard nests parentheses and '!' more than ${GUARD_DEPTH_LIMIT} levels deep`,
        'LW404',
      );
  }

  /** `not` and `atom` of the grammar: the `!`s are counted rather than recursed into. */
  private operand(): Expr {
    const outer = this.level;
    let nots = 0;
    while (this.peek().kind === 'op' && this.peek().text === '!') {
      this.deeper(this.peek());
      this.k++;
      nots++;
    }
    let e: Expr;
    const t = this.peek();
    if (t.kind === 'const') {
      this.k++;
      e = { kind: 'const', value: t.text === '1' ? 1 : 0 };
    } else if (t.kind === 'name') e = this.input(t);
    else if (t.kind === 'op' && t.text === '(') {
      this.deeper(t);
      this.k++;
      e = this.chain(0);
      const c = this.peek();
      if (!(c.kind === 'op' && c.text === ')'))
        throw new SyntaxProblem(c.pos, `expected ')' but found ${describeToken(c)}`);
      this.k++;
    } else throw new SyntaxProblem(t.pos, `expected an input name, 0, 1, '!' or '(' but found ${describeToken(t)}`);
    for (; nots > 0; nots--) e = { kind: 'not', arg: e };
    this.level = outer;
    return e;
  }

  /** A name in operand position: an input, or LW201 (reading goes on, to find more problems). */
  private input(t: Tok): Expr {
    const i = this.index.get(t.text);
    if (i === undefined && t.text === this.stopWord)
      throw new SyntaxProblem(t.pos, `the guard is incomplete before '${t.text}'`);
    this.k++;
    if (i === undefined) {
      const guess = didYouMean(t.text, this.inputs);
      this.diagnostics.push(
        diag(
          'LW201',
          `unknown input '${printable(t.text)}'${where(this.loc, t.pos)}`,
          locAt(this.loc, t.pos),
          guess
            ? `did you mean '${guess}'?`
            : this.inputs.length
              ? `declared inputs: ${this.inputs.join(', ')}`
              : 'the machine declares no inputs',
        ),
      );
    }
    return { kind: 'input', name: t.text, index: i ?? -1 };
  }
}

/**
 * Read an expression. With `stopWord` the expression may end before a name that cannot
 * continue it (the text form uses this to find its keyword after a guard); `stopWord` itself
 * in operand position, when it is not an input, means the guard is incomplete.
 */
export function readExpr(text: string, inputs: readonly string[], loc: SourceLoc, stopWord?: string): ExprPrefix {
  const prefix = stopWord !== undefined;
  const { toks, bad } = tokenize(text);
  const reader = new ExprReader(toks, inputs, loc, stopWord);
  const diagnostics = reader.diagnostics;
  try {
    if (toks.length === 1 && !bad) throw new SyntaxProblem(0, 'the expression is empty');
    const expr = reader.or();
    const t = reader.peek();
    if (t.kind !== 'end') {
      if (!(prefix && t.kind === 'name')) {
        const msg =
          t.kind === 'op' && t.text === ')'
            ? `unmatched ')'`
            : `expected an operator (&, |, ^) but found ${describeToken(t)}`;
        throw new SyntaxProblem(t.pos, msg);
      }
    } else if (bad && !prefix) {
      throw new SyntaxProblem(bad.pos, bad.msg);
    }
    const end = t.kind === 'end' ? (bad ? bad.pos : text.length) : t.pos;
    return { expr: diagnostics.length ? undefined : expr, end, diagnostics };
  } catch (e) {
    if (!(e instanceof SyntaxProblem)) throw e;
    // Running into the bad token: its own message says more than "expected …".
    const p = bad && e.pos >= bad.pos ? new SyntaxProblem(bad.pos, bad.msg) : e;
    diagnostics.push(
      p.code === 'LW404'
        ? diag(
            'LW404',
            `${p.msg}${where(loc, p.pos)}`,
            locAt(loc, p.pos),
            "write it flatter: '!!x' is x, and parentheses around a single term group nothing",
          )
        : diag(
            'LW102',
            `guard syntax: ${p.msg}${where(loc, p.pos)}`,
            locAt(loc, p.pos),
            "use input names, '!', '&', '^', '|', parentheses, 0 and 1",
          ),
    );
    return { end: p.pos, diagnostics };
  }
}

/** Parse a whole guard expression and compute its cover over `inputs`. */
export function parseGuard(
  text: string,
  inputs: readonly string[],
  loc: SourceLoc,
): { guard?: Guard; diagnostics: Diagnostic[] } {
  const r = readExpr(text, inputs, loc);
  if (!r.expr) return { diagnostics: r.diagnostics };
  return guardFromExpr(r.expr, text.trim(), inputs.length, loc);
}

/** Build a guard from a tree, computing its cover; LW403 when the cover is too large. */
export function guardFromExpr(
  expr: Expr,
  text: string,
  inputCount: number,
  loc?: SourceLoc,
): { guard?: Guard; diagnostics: Diagnostic[] } {
  const cubes = exprCover(expr, inputCount);
  if (cubes === undefined) {
    return {
      diagnostics: [
        diag(
          'LW403',
          `the guard '${clip(text)}' expands into more than ${GUARD_CUBE_LIMIT} product terms`,
          loc ?? {},
          'split the transition into several, or simplify the expression (long ^ chains grow fastest)',
        ),
      ],
    };
  }
  return { guard: { text, expr, cubes, ...(loc ? { loc } : {}) }, diagnostics: [] };
}

/** The guard that always holds (an absent `when`). */
export function alwaysGuard(inputCount: number, loc?: SourceLoc): Guard {
  return { text: '1', expr: { kind: 'const', value: 1 }, cubes: [universe(inputCount)], ...(loc ? { loc } : {}) };
}

function clip(s: string): string {
  return s.length > 60 ? s.slice(0, 57) + '...' : s;
}

/** The cover grew past a limit; caught inside exprCover, which then returns undefined. */
class TooBig extends Error {
  constructor() {
    super('the cover exceeds its limits');
    this.name = 'TooBig';
  }
}

/** The cover of `expr` over n inputs, or undefined when it exceeds the limits. */
export function exprCover(
  expr: Expr,
  n: number,
  limit = GUARD_CUBE_LIMIT,
  work = GUARD_WORK_LIMIT,
): Cube[] | undefined {
  let spent = 0;
  const charge = (k: number): void => {
    spent += k;
    if (spent > work) throw new TooBig();
  };
  const check = (c: Cube[]): Cube[] => {
    if (c.length > limit) throw new TooBig();
    return c;
  };
  const absorbCounted = (cover: Cube[]): Cube[] => {
    const sorted = [...new Set(cover)].sort((a, b) => literalCount(a) - literalCount(b));
    const out: Cube[] = [];
    for (const c of sorted) {
      charge(out.length + 1);
      if (!out.some((x) => contains(x, c))) out.push(c);
    }
    return check(out);
  };
  const andC = (a: Cube[], b: Cube[]): Cube[] => {
    charge(a.length * b.length);
    const out: Cube[] = [];
    for (const x of a)
      for (const y of b) {
        const z = intersect(x, y);
        if (z !== null) out.push(z);
      }
    if (out.length > limit * 4) throw new TooBig();
    return absorbCounted(out);
  };
  const orC = (a: Cube[], b: Cube[]): Cube[] => absorbCounted(a.concat(b));
  const lit = (i: number, v: '0' | '1'): Cube[] => [universe(n).slice(0, i) + v + universe(n).slice(i + 1)];
  // cover(e, neg) is the cover of e (neg false) or of !e (neg true).
  const cover = (e: Expr, neg: boolean): Cube[] => {
    switch (e.kind) {
      case 'const':
        return (e.value === 1) !== neg ? [universe(n)] : [];
      case 'input':
        return e.index < 0 || e.index >= n ? [] : lit(e.index, neg ? '0' : '1');
      case 'not':
        return cover(e.arg, !neg);
      case 'and':
      case 'or': {
        const conj = (e.kind === 'and') !== neg;
        let acc: Cube[] = conj ? [universe(n)] : [];
        for (const a of e.args) acc = conj ? andC(acc, cover(a, neg)) : orC(acc, cover(a, neg));
        return acc;
      }
      case 'xor': {
        // Running parity: odd = args so far XOR to 1, even = they XOR to 0.
        let odd: Cube[] = [];
        let even: Cube[] = [universe(n)];
        for (const a of e.args) {
          const pos = cover(a, false);
          const negc = cover(a, true);
          const nextOdd = orC(andC(odd, negc), andC(even, pos));
          const nextEven = orC(andC(even, negc), andC(odd, pos));
          odd = nextOdd;
          even = nextEven;
        }
        return neg ? even : odd;
      }
    }
  };
  try {
    return cover(expr, false);
  } catch (e) {
    if (e instanceof TooBig) return undefined;
    throw e;
  }
}

/** Value of an expression for one full assignment ('0'/'1' per input). */
export function evalExpr(e: Expr, assignment: string): boolean {
  switch (e.kind) {
    case 'const':
      return e.value === 1;
    case 'input':
      return assignment[e.index] === '1';
    case 'not':
      return !evalExpr(e.arg, assignment);
    case 'and':
      return e.args.every((a) => evalExpr(a, assignment));
    case 'or':
      return e.args.some((a) => evalExpr(a, assignment));
    case 'xor':
      return e.args.reduce((acc, a) => acc !== evalExpr(a, assignment), false);
  }
}

const RANK = { or: 1, xor: 2, and: 3, not: 4, input: 5, const: 5 } as const;
const SYMBOL = { or: ' | ', xor: ' ^ ', and: ' & ' } as const;

/** Print an expression with the fewest parentheses that keep its tree. */
export function printExpr(e: Expr): string {
  switch (e.kind) {
    case 'const':
      return String(e.value);
    case 'input':
      return e.name;
    case 'not':
      return '!' + wrap(e.arg, RANK.not);
    default:
      // Same-kind children print without parentheses: the operators are associative.
      return e.args.map((a) => wrap(a, RANK[e.kind])).join(SYMBOL[e.kind]);
  }
}

function wrap(e: Expr, parentRank: number): string {
  const s = printExpr(e);
  return RANK[e.kind] < parentRank ? `(${s})` : s;
}

/** The expression tree of a cover: an OR of ANDs of literals ('0' for [], '1' for a free cube). */
export function cubesToExpr(cubes: readonly Cube[], inputs: readonly string[]): Expr {
  const terms: Expr[] = cubes.map((c) => {
    const lits: Expr[] = [];
    for (let i = 0; i < c.length; i++) {
      if (c[i] === '-') continue;
      const input: Expr = { kind: 'input', name: inputs[i], index: i };
      lits.push(c[i] === '1' ? input : { kind: 'not', arg: input });
    }
    if (lits.length === 0) return { kind: 'const', value: 1 };
    return lits.length === 1 ? lits[0] : { kind: 'and', args: lits };
  });
  if (terms.length === 0) return { kind: 'const', value: 0 };
  if (terms.some((t) => t.kind === 'const')) return { kind: 'const', value: 1 };
  return terms.length === 1 ? terms[0] : { kind: 'or', args: terms };
}

/** A cover printed as an expression, e.g. `x & !y | z`, for reports. */
export function printCubes(cubes: readonly Cube[], inputs: readonly string[]): string {
  return printExpr(cubesToExpr(cubes, inputs));
}
