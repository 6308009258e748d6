import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import {
  alwaysGuard,
  cubesToExpr,
  evalExpr,
  exprCover,
  GUARD_CUBE_LIMIT,
  GUARD_DEPTH_LIMIT,
  parseGuard,
  printCubes,
  printExpr,
  readExpr,
} from '../../../src/core/forms/expr.js';
import { assignments, coverHolds } from '../../../src/core/model/cube.js';
import type { Expr } from '../../../src/core/model/machine.js';

const ins = ['a', 'b', 'c', 'd'];
const at = { line: 3, column: 10 };

function cover(text: string, inputs = ins): readonly string[] {
  const r = parseGuard(text, inputs, at);
  expect(r.diagnostics).toEqual([]);
  return r.guard!.cubes;
}

/** Arbitrary expression trees over the first n inputs. */
function exprArb(n: number): fc.Arbitrary<Expr> {
  const leaf: fc.Arbitrary<Expr> = fc.oneof(
    fc.integer({ min: 0, max: n - 1 }).map((i): Expr => ({ kind: 'input', name: ins[i], index: i })),
    fc.constantFrom<Expr>({ kind: 'const', value: 0 }, { kind: 'const', value: 1 }),
  );
  return fc.letrec<{ e: Expr }>((tie) => ({
    e: fc.oneof(
      { depthSize: 'small', withCrossShrink: true },
      leaf,
      tie('e').map((arg): Expr => ({ kind: 'not', arg })),
      fc
        .tuple(
          fc.constantFrom('and' as const, 'or' as const, 'xor' as const),
          fc.array(tie('e'), { minLength: 2, maxLength: 3 }),
        )
        .map(([kind, args]): Expr => ({ kind, args })),
    ),
  })).e;
}

describe('core/forms/expr', () => {
  it('gives `!` over `&` over `^` over `|` (DESIGN.md §7)', () => {
    const r = readExpr('a | b & !c ^ d', ins, at);
    expect(r.expr).toEqual({
      kind: 'or',
      args: [
        { kind: 'input', name: 'a', index: 0 },
        {
          kind: 'xor',
          args: [
            {
              kind: 'and',
              args: [
                { kind: 'input', name: 'b', index: 1 },
                { kind: 'not', arg: { kind: 'input', name: 'c', index: 2 } },
              ],
            },
            { kind: 'input', name: 'd', index: 3 },
          ],
        },
      ],
    });
  });

  it('computes exact covers of small guards', () => {
    expect(cover('a')).toEqual(['1---']);
    expect(cover('!b')).toEqual(['-0--']);
    expect(cover('a & !b')).toEqual(['10--']);
    expect([...cover('a | c')].sort()).toEqual(['--1-', '1---']);
    expect([...cover('a ^ b')].sort()).toEqual(['01--', '10--']);
    expect([...cover('!(a ^ b)')].sort()).toEqual(['00--', '11--']);
    expect([...cover('!(a & b)')].sort()).toEqual(['-0--', '0---']);
    expect(cover('1')).toEqual(['----']);
    expect(cover('0')).toEqual([]);
    expect(cover('a & !a')).toEqual([]);
    expect([...cover('a | !a')].sort()).toEqual(['0---', '1---']); // a cover, not necessarily merged
    expect(cover('a | a & b')).toEqual(['1---']); // absorption
  });

  it('works for machines without inputs', () => {
    expect(cover('1', [])).toEqual(['']);
    expect(cover('!1', [])).toEqual([]);
    expect(alwaysGuard(0).cubes).toEqual(['']);
  });

  it('reports syntax errors as LW102 at the column inside the text', () => {
    const cases: [string, number, RegExp][] = [
      ['a & ', 14, /expected an input name/],
      ['a $ b', 12, /unexpected character '\$'/],
      ['', 10, /empty/],
      ['a b', 12, /expected an operator/],
      ['((a)', 14, /expected '\)'/],
      ['a)', 11, /unmatched '\)'/],
      ['a & 2x', 14, /'2x' is neither/],
    ];
    for (const [text, column, msg] of cases) {
      const r = parseGuard(text, ins, at);
      expect(r.guard).toBeUndefined();
      expect(r.diagnostics).toHaveLength(1);
      expect(r.diagnostics[0]).toMatchObject({ code: 'LW102', severity: 'error', location: { line: 3, column } });
      expect(r.diagnostics[0].message).toMatch(msg);
      expect(r.diagnostics[0].hint).toBeDefined();
    }
  });

  it('names the character position in JSON paths, where there is no column', () => {
    const r = parseGuard('a &', ins, { path: '$.never[0]' });
    expect(r.diagnostics[0].location).toEqual({ path: '$.never[0]' });
    expect(r.diagnostics[0].message).toContain('(at character 4)');
  });

  it('reports unknown inputs as LW201 with a did-you-mean hint', () => {
    const r = parseGuard('marbel & lid', ['marble', 'lid'], at);
    expect(r.guard).toBeUndefined();
    expect(r.diagnostics).toEqual([
      {
        code: 'LW201',
        severity: 'error',
        message: "unknown input 'marbel'",
        location: { line: 3, column: 10 },
        hint: "did you mean 'marble'?",
      },
    ]);
    const none = parseGuard('x', [], at);
    expect(none.diagnostics[0].hint).toBe('the machine declares no inputs');
  });

  it('reports a pathological XOR chain over 32 inputs as LW403 instead of hanging', () => {
    const xs = Array.from({ length: 32 }, (_, i) => `x${i}`);
    const r = parseGuard(xs.join(' ^ '), xs, { path: '$.states[0].transitions[0].when' });
    expect(r.guard).toBeUndefined();
    expect(r.diagnostics.map((d) => d.code)).toEqual(['LW403']);
    expect(r.diagnostics[0].location).toEqual({ path: '$.states[0].transitions[0].when' });
    // A product of 16 two-literal sums also has 2^16 products.
    const cnf = Array.from({ length: 16 }, (_, i) => `(x${2 * i} | x${2 * i + 1})`).join(' & ');
    expect(parseGuard(cnf, xs, at).diagnostics.map((d) => d.code)).toEqual(['LW403']);
    // An XOR chain that fits stays exact: 10 inputs → 2^9 products.
    expect(exprCover(readExpr(xs.slice(0, 10).join(' ^ '), xs, at).expr!, 32)).toHaveLength(512);
    expect(GUARD_CUBE_LIMIT).toBe(4096);
  });

  it('refuses nesting past GUARD_DEPTH_LIMIT as LW404 at the character that goes too deep, never a stack overflow', () => {
    const n = GUARD_DEPTH_LIMIT;
    // As deep as allowed: read, covered, printed and evaluated.
    const deep = '('.repeat(n / 2) + '!'.repeat(n / 2) + 'a' + ')'.repeat(n / 2);
    const ok = parseGuard(deep, ins, at);
    expect(ok.diagnostics).toEqual([]);
    expect(ok.guard!.cubes).toEqual(['1---']);
    expect(printExpr(ok.guard!.expr)).toBe('!'.repeat(n / 2) + 'a');
    expect(evalExpr(ok.guard!.expr, '1000')).toBe(true);
    // One level more, and the cases that used to exhaust the stack (2,000 parentheses, 5,000 '!').
    for (const [text, column] of [
      ['('.repeat(n + 1) + 'a' + ')'.repeat(n + 1), 10 + n],
      ['!'.repeat(n + 1) + 'a', 10 + n],
      ['('.repeat(2000) + 'a' + ')'.repeat(2000), 10 + n],
      ['!'.repeat(5000) + 'a', 10 + n],
      ['a & (' + '!('.repeat(3000) + 'b' + ')'.repeat(6000), 14 + n],
    ] as const) {
      const r = parseGuard(text, ins, at);
      expect(r.guard).toBeUndefined();
      expect(r.diagnostics).toHaveLength(1);
      expect(r.diagnostics[0]).toMatchObject({ code: 'LW404', severity: 'error', location: { line: 3, column } });
      expect(r.diagnostics[0].message).toContain(`more than ${n} levels`);
    }
    // Depth is nesting, not length: a long flat chain is fine.
    expect(parseGuard(Array.from({ length: 5000 }, () => '!a').join(' | '), ins, at).diagnostics).toEqual([]);
  });

  it('echoes at most a short, printable piece of a bad token', () => {
    const r = parseGuard('a & 9' + 'x'.repeat(100_000), ins, at);
    expect(r.diagnostics[0].message.length).toBeLessThan(300);
    // A terminal title sequence (ESC ] 0 ; … BEL, ECMA-48 OSC) is spelt out, never passed on.
    const esc = parseGuard('a & \u001b]0;title\u0007', ins, at);
    // eslint-disable-next-line no-control-regex -- looking for control characters is the point
    expect(esc.diagnostics[0].message).not.toMatch(/[\u0000-\u001f]/);
    expect(esc.diagnostics[0].message).toContain('\\u{1b}');
  });

  it('handles 24-input guards on cubes (no enumeration of 2^24 combinations)', () => {
    const xs = Array.from({ length: 24 }, (_, i) => `x${i}`);
    const c = cover('x0 & !x23 | (x5 ^ x6) & x7', xs);
    expect(c).toHaveLength(3);
    expect(c.every((k) => k.length === 24)).toBe(true);
  });

  it('prints with the fewest parentheses', () => {
    const p = (t: string): string => printExpr(readExpr(t, ins, at).expr!);
    expect(p('(a & b) | c')).toBe('a & b | c');
    expect(p('a & (b | c)')).toBe('a & (b | c)');
    expect(p('((a ^ b)) ^ c')).toBe('a ^ b ^ c');
    expect(p('!(a | b)')).toBe('!(a | b)');
    expect(p('!!a')).toBe('!!a');
    expect(p('(a | b) ^ (c & d)')).toBe('(a | b) ^ c & d');
    expect(p('a|b&!c^d')).toBe('a | b & !c ^ d');
  });

  it('prints covers as expressions for reports', () => {
    expect(printCubes(['10--', '--1-'], ins)).toBe('a & !b | c');
    expect(printCubes([], ins)).toBe('0');
    expect(printCubes(['----'], ins)).toBe('1');
    expect(printCubes(['-0--'], ins)).toBe('!b');
    expect(cubesToExpr(['1---'], ins)).toEqual({ kind: 'input', name: 'a', index: 0 });
  });

  it('covers agree with evaluation on every assignment (property, 4 inputs)', () => {
    fc.assert(
      fc.property(exprArb(4), (e) => {
        const c = exprCover(e, 4)!;
        for (const a of assignments(4)) expect(coverHolds(c, a)).toBe(evalExpr(e, a));
      }),
      { seed: 42, numRuns: 300 },
    );
  });

  it('print → parse keeps the meaning and the printed text (property)', () => {
    fc.assert(
      fc.property(exprArb(4), (e) => {
        const text = printExpr(e);
        const back = readExpr(text, ins, at);
        expect(back.diagnostics).toEqual([]);
        expect(printExpr(back.expr!)).toBe(text);
        for (const a of assignments(4)) expect(evalExpr(back.expr!, a)).toBe(evalExpr(e, a));
        // The cover printed back as an expression means the same again.
        const c = exprCover(e, 4)!;
        const flat = readExpr(printCubes(c, ins), ins, at).expr!;
        for (const a of assignments(4)) expect(evalExpr(flat, a)).toBe(evalExpr(e, a));
      }),
      { seed: 42, numRuns: 300 },
    );
  });

  it('never throws on arbitrary text (property)', () => {
    const alphabet = fc.constantFrom('a', 'b', 'zz', '!', '&', '|', '^', '(', ')', '0', '1', ' ', '$', '2', '_');
    fc.assert(
      fc.property(
        fc.oneof(
          fc.string(),
          fc.array(alphabet, { maxLength: 20 }).map((x) => x.join('')),
        ),
        (t) => {
          const r = parseGuard(t, ins, at);
          expect(r.guard !== undefined || r.diagnostics.some((d) => d.severity === 'error')).toBe(true);
          for (const d of r.diagnostics) expect(d.location.column).toBeGreaterThanOrEqual(10);
        },
      ),
      { seed: 42, numRuns: 1000 },
    );
  });
});
