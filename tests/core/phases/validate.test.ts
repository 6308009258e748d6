import { readdirSync, readFileSync } from 'node:fs';
import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { evalExpr } from '../../../src/core/forms/expr.js';
import { machineFromJson, parseJsonMachine } from '../../../src/core/forms/json.js';
import { parseTextMachine } from '../../../src/core/forms/text.js';
import { validate } from '../../../src/core/phases/validate.js';
import { assignments, disjointSize, overlaps } from '../../../src/core/model/cube.js';
import { formatDiagnostic } from '../../../src/core/model/diagnostics.js';
import type { Machine } from '../../../src/core/model/machine.js';
import { seededRandom } from '../../../src/core/model/random.js';
import { jsonMachineArb } from '../forms/machine-arb.js';

function text(src: string): Machine {
  const r = parseTextMachine(src, 't.lw');
  expect(r.diagnostics.map(formatDiagnostic)).toEqual([]);
  return r.machine!;
}

const head = 'machine m\ninputs a, b\noutputs z\nstart s\n';

describe('core/phases/validate', () => {
  it('returns the flat table of a clean machine with no diagnostics', () => {
    const v = validate(text(head + 'state s\n  when a go t with z=1\n  go s\nstate t\n  go s\n'));
    expect(v.diagnostics).toEqual([]);
    expect(v.flat!.states).toEqual(['s', 't']);
    expect(v.flat!.rows[0].map((r) => [r.cube, r.next, r.out, r.transition])).toEqual([
      ['1-', 1, [1], 0],
      ['0-', 0, [0], 1],
    ]);
  });

  // Each row: the machine text, the code, its line and column in t.lw, and a fragment of the message.
  const errorKinds: [string, string, string, number, number, RegExp][] = [
    ['unknown target', head + 'state s\n  go tow\nstate two\n  go s\n', 'LW200', 6, 6, /unknown state 'tow'/],
    ['undeclared output', head + 'state s with zz=1\n  go s\n', 'LW202', 5, 14, /undeclared output 'zz'/],
    ['undeclared Mealy output', head + 'state s\n  go s with y=1\n', 'LW202', 6, 13, /undeclared output 'y'/],
    ['repeated input', 'machine m\ninputs a, a\nstart s\nstate s\n', 'LW203', 2, 11, /input 'a' is declared twice/],
    [
      'input and output share a name',
      'machine m\ninputs a\noutputs a\nstart s\nstate s\n',
      'LW203',
      3,
      9,
      /both an input and an output/,
    ],
    ['repeated state', head + 'state s\nstate s\n', 'LW203', 6, 7, /state 's' is declared twice/],
    ['no start', 'machine m\nstate s\n', 'LW204', 1, 1, /names no start state/],
    ['unknown start', 'machine m\nstart idel\nstate idle\n', 'LW204', 2, 7, /start state 'idel' does not exist/],
    ['bad input name', 'machine m\ninputs 2a\nstart s\nstate s\n', 'LW205', 2, 8, /input name '2a'/],
    ['bad state name', head + 'state s\nstate s.t\n', 'LW205', 6, 7, /state name 's\.t'/],
    ['bad machine name', 'machine -m\nstart s\nstate s\n', 'LW205', 1, 9, /machine name '-m'/],
    [
      'code of another length',
      head + 'state s code 01\nstate t code 10\nstate u code 1\n',
      'LW206',
      7,
      14,
      /has 1 digits/,
    ],
    ['code with bad digits', head + 'state s code 0x\n', 'LW206', 5, 14, /not a string of 0\/1 digits/],
    ['repeated code', head + 'state s code 01\nstate t code 01\n', 'LW206', 6, 14, /repeats the code 01 of state 's'/],
    ['no states', 'machine m\nstart s\n', 'LW300', 1, 1, /no states/],
  ];
  it.each(errorKinds)('reports %s', (_name, src, code, line, column, msg) => {
    const v = validate(text(src));
    expect(v.flat).toBeUndefined();
    const d = v.diagnostics.find((x) => x.code === code);
    expect(d, v.diagnostics.map(formatDiagnostic).join('\n')).toBeDefined();
    expect(d!.severity).toBe('error');
    expect(d!.location).toEqual({ file: 't.lw', line, column });
    expect(d!.message).toMatch(msg);
    expect(d!.hint).toBeTruthy();
  });

  it('gives did-you-mean hints for unknown states and outputs', () => {
    const v = validate(text(head + 'state s with zz=1\n  go tow\nstate two\n'));
    expect(v.diagnostics.find((d) => d.code === 'LW200')!.hint).toBe("did you mean 'two'?");
    expect(v.diagnostics.find((d) => d.code === 'LW202')!.hint).toBe("did you mean 'z'?");
  });

  // Warnings and notes: the machine still validates (flat present).
  const noteKinds: [string, string, string, number, number, RegExp][] = [
    [
      'a shadowed transition',
      head + 'state s\n  when a go s\n  when a & b go s\n',
      'LW301',
      7,
      3,
      /transition 2 of state 's' \(a & b → s\) can never fire: transition 1 already takes/,
    ],
    [
      'a transition excluded by never',
      head + 'never a\nstate s\n  when a & b go s\n  go s\n',
      'LW301',
      7,
      3,
      /never constraints exclude/,
    ],
    [
      'an input combination without a transition',
      head + 'state s\n  when a go s\n',
      'LW302',
      5,
      1,
      /some input combinations \(!a\); the unspecified rule 'hold' applies/,
    ],
    [
      'a state without transitions (dont-care)',
      'machine m\nstart s\nunspecified dont-care\nstate s\n',
      'LW302',
      4,
      1,
      /has no transition; the unspecified rule 'dont-care' applies/,
    ],
    [
      'an unreachable state',
      head + 'state s\n  go s\nstate t\n  go s\n',
      'LW303',
      7,
      1,
      /state 't' cannot be reached from the start state 's'/,
    ],
    [
      'a guard that is constant 0',
      head + 'state s\n  when a & !a go s\n  go s\n',
      'LW304',
      6,
      8,
      /guard 'a & !a' of transition 1 in state 's' is never true/,
    ],
    [
      'never excluding everything',
      head + 'never a\nnever !a\nstate s\n  go s\n',
      'LW305',
      5,
      7,
      /exclude every input combination/,
    ],
    [
      'a state with no way out',
      head + 'state s\n  when a go t\nstate t with z=1\n  when b go t\n',
      'LW306',
      7,
      1,
      /state 't' has no way out: no transition leads to another state/,
    ],
    ['an output never 1', head + 'state s\n  when a go t\nstate t\n  go s\n', 'LW307', 3, 9, /output 'z' is never 1/],
    [
      'an output never 0',
      head + 'state s with z=1\n  when a go t\nstate t with z=1\n  go s\n',
      'LW307',
      3,
      9,
      /output 'z' is 1 in every reachable state and transition, never 0/,
    ],
  ];
  it.each(noteKinds)('notes %s', (_name, src, code, line, column, msg) => {
    const v = validate(text(src));
    expect(v.flat).toBeDefined();
    const d = v.diagnostics.find((x) => x.code === code);
    expect(d, v.diagnostics.map(formatDiagnostic).join('\n')).toBeDefined();
    expect(d!.location).toEqual({ file: 't.lw', line, column });
    expect(d!.message).toMatch(msg);
    expect(d!.severity).not.toBe('error');
  });

  it('warns about a trap only when the state is reachable, not final, and truly closed (LW306)', () => {
    const trap = head + 'state s\n  when a go t\nstate t with z=1\n  when b go t\n';
    expect(validate(text(trap)).diagnostics.map((d) => d.code)).toContain('LW306');
    // Marked final: intended, so neither the trap warning nor the "no transition" note.
    const final = validate(text(trap.replace('state t with z=1', 'state t final with z=1')));
    expect(final.diagnostics.map((d) => [d.code, d.message.includes("'t'")])).not.toContainEqual(['LW306', true]);
    expect(final.diagnostics.map((d) => [d.code, d.message.includes("'t'")])).not.toContainEqual(['LW302', true]);
    // A way out on some input is enough; a one-state machine is combinational and never traps.
    expect(validate(text(trap + '  when a go s\n')).diagnostics.map((d) => d.code)).not.toContain('LW306');
    expect(validate(text(head + 'state s with z=1\n  when a go s with z=0\n')).diagnostics.map((d) => d.code)).toEqual([
      'LW302',
    ]);
    // JSON form: the location is the state's path, and "final": true silences it.
    const j = (final: boolean) =>
      machineFromJson({
        name: 'm',
        inputs: ['a'],
        outputs: ['z'],
        start: 's',
        states: [
          { name: 's', transitions: [{ when: 'a', to: 't' }] },
          { name: 't', ...(final ? { final: true } : {}), outputs: { z: 1 }, transitions: [] },
        ],
      }).machine!;
    const w = validate(j(false)).diagnostics.find((d) => d.code === 'LW306');
    expect(w?.location.path).toBe('$.states[1]');
    expect(w?.hint).toContain('"final": true');
    expect(validate(j(true)).diagnostics.map((d) => d.code)).not.toContain('LW306');
  });

  it('prints the LW302 input combinations simplified by the never constraints', () => {
    // !up & !full | !up & full & !empty is !up once full & empty cannot happen.
    const src =
      'machine lock\ninputs up, full, empty\noutputs z\nstart s\nnever full & empty\nstate s\n  when up go t with z=1\nstate t\n  go s\n';
    const d = validate(text(src)).diagnostics.find((x) => x.code === 'LW302');
    expect(d?.message).toContain('some input combinations (!up);');
    // Without the never constraint there is nothing to widen into.
    const plain = validate(text(src.replace('never full & empty\n', ''))).diagnostics.find((x) => x.code === 'LW302');
    expect(plain?.message).toContain('some input combinations (!up);');
    const two = src.replace('when up go t', 'when up & full go t');
    // up & full taken: the rest, !up | up & !full, is read as !up | !full (with or without never).
    expect(validate(text(two)).diagnostics.find((x) => x.code === 'LW302')?.message).toMatch(
      /\((!up \| !full|!full \| !up)\);/,
    );
    const twoPlain = two.replace('never full & empty\n', '');
    expect(validate(text(twoPlain)).diagnostics.find((x) => x.code === 'LW302')?.message).toContain('(!up | !full);');
  });

  it('names an undeclared output in a load (LW202)', () => {
    const v = validate(text(head + 'load zz 100 g\nstate s\n  when a go s with z=1\n  go s\n'));
    expect(v.diagnostics.map((d) => [d.code, d.location.line, d.location.column, d.hint])).toEqual([
      ['LW202', 5, 6, "did you mean 'z'?"],
    ]);
    expect(v.diagnostics[0].message).toBe("a load is given for 'zz', which is not a declared output");
  });

  it('does not call a constant-0 guard shadowed too (LW304 only)', () => {
    const v = validate(text(head + 'state s\n  when 0 go s\n  go s\n'));
    // LW307 too: the machine never sets its output.
    expect(v.diagnostics.map((d) => d.code).filter((c) => c !== 'LW307')).toEqual(['LW304']);
  });

  it('locates JSON-form problems by JSON path', () => {
    const j = {
      name: 'm',
      inputs: ['a'],
      outputs: ['z'],
      start: 's',
      states: [{ name: 's', transitions: [{ when: 'a', to: 'x', outputs: { q: 1 } }, { to: 's' }, { to: 's' }] }],
    };
    const v = validate(machineFromJson(j, 'm.json').machine!);
    expect(v.diagnostics.map((d) => [d.code, d.location.path])).toEqual([
      ['LW202', '$.states[0].transitions[0].outputs.q'],
      ['LW200', '$.states[0].transitions[0].to'],
    ]);
    const w = validate(
      machineFromJson({ ...j, states: [{ name: 's', transitions: [{ to: 's' }, { when: 'a', to: 's' }] }] }).machine!,
    );
    expect(w.diagnostics.map((d) => [d.code, d.location.path])).toEqual([
      ['LW301', '$.states[0].transitions[1]'],
      ['LW307', '$.outputs[0]'],
    ]);
  });

  it('refuses machines past the limits at once (LW400, LW401, LW402)', () => {
    const big = (inputs: number, outputs: number, states: number): Machine =>
      machineFromJson({
        name: 'big',
        inputs: Array.from({ length: inputs }, (_, i) => `x${i}`),
        outputs: Array.from({ length: outputs }, (_, i) => `z${i}`),
        start: 's0',
        states: Array.from({ length: states }, (_, i) => ({ name: `s${i}`, transitions: [] })),
      }).machine!;
    expect(validate(big(33, 1, 1)).diagnostics.map((d) => d.code)).toEqual(['LW401']);
    expect(validate(big(1, 257, 1)).diagnostics.map((d) => d.code)).toEqual(['LW402']);
    const v = validate(big(33, 257, 4097));
    expect(v.diagnostics.map((d) => d.code)).toEqual(['LW400', 'LW401', 'LW402']);
    expect(v.diagnostics[0].message).toBe('the machine has 4097 states; the tool handles at most 4096');
    expect(v.flat).toBeUndefined();
    expect(validate(big(32, 256, 4)).diagnostics.filter((d) => d.severity === 'error')).toEqual([]);
  });

  it('validates a 24-input machine on cubes: rows disjoint, covering the space outside never', () => {
    const rnd = seededRandom(7);
    const inputs = Array.from({ length: 24 }, (_, i) => `x${i}`);
    const lit = (): string => `${rnd.int(2) ? '!' : ''}x${rnd.int(24)}`;
    const states = Array.from({ length: 8 }, (_, i) => ({
      name: `s${i}`,
      transitions: Array.from({ length: 6 }, () => ({
        when: `${lit()} & ${lit()} | ${lit()} ^ ${lit()}`,
        to: `s${rnd.int(8)}`,
      })),
    }));
    const m = machineFromJson({
      name: 'wide',
      inputs,
      outputs: [],
      start: 's0',
      never: ['x0 & x1 & x2'],
      states,
    }).machine!;
    const v = validate(m);
    expect(v.diagnostics.filter((d) => d.severity === 'error')).toEqual([]);
    for (const rows of v.flat!.rows) {
      let clashes = 0;
      for (let i = 0; i < rows.length; i++)
        for (let j = i + 1; j < rows.length; j++) if (overlaps(rows[i].cube, rows[j].cube)) clashes++;
      expect(clashes).toBe(0);
      expect(disjointSize(rows.map((r) => r.cube)) + disjointSize(v.flat!.never)).toBe(2 ** 24);
    }
  });

  it('every example validates with no errors or warnings', () => {
    for (const f of readdirSync('examples').filter((x) => x.endsWith('.lw'))) {
      const m = text(readFileSync(`examples/${f}`, 'utf8'));
      const v = validate(m);
      expect(v.diagnostics.filter((d) => d.severity !== 'info').map(formatDiagnostic), f).toEqual([]);
      expect(v.flat, f).toBeDefined();
      expect(m.states.length, f).toBeGreaterThanOrEqual(1);
      expect(m.states.length, f).toBeLessThanOrEqual(8);
      expect(m.inputs.length, f).toBeLessThanOrEqual(4);
    }
  });

  it('reachable states agree with the "reachable" column of tests/fixtures/lgsynth91/TABLE.md (MCNC/LGSynth\'91 benchmark set)', () => {
    const rows = readFileSync('tests/fixtures/lgsynth91/TABLE.md', 'utf8')
      .split('\n')
      .map((l) => l.split('|').map((c) => c.trim()))
      .filter((c) => c.length > 6 && /^\d+$/.test(c[4] ?? '') && /^\d+$/.test(c[5] ?? ''));
    expect(rows.length).toBeGreaterThan(40);
    for (const c of rows) {
      const m = parseJsonMachine(readFileSync(`tests/fixtures/lgsynth91/${c[1]}.json`, 'utf8')).machine!;
      const v = validate(m);
      expect(v.flat, c[1]).toBeDefined();
      expect(m.states.length, c[1]).toBe(Number(c[4]));
      expect(m.states.length - v.diagnostics.filter((d) => d.code === 'LW303').length, c[1]).toBe(Number(c[5]));
    }
  });

  it('LW301, LW304 and LW303 agree with brute-force enumeration on small generated machines (property)', () => {
    fc.assert(
      fc.property(jsonMachineArb, (j) => {
        const m = machineFromJson(j).machine!;
        const v = validate(m);
        expect(v.flat).toBeDefined();
        const n = m.inputs.length;
        const all = [...assignments(n)].filter((a) => !m.never.some((g) => evalExpr(g.expr, a)));
        const index = new Map(m.states.map((s, i) => [s.name, i]));
        const at = (code: string): Set<string> =>
          new Set(v.diagnostics.filter((d) => d.code === code).map((d) => d.location.path!));
        const shadowed = at('LW301');
        const zero = at('LW304');
        const next: Set<number>[] = m.states.map(() => new Set());
        m.states.forEach((s, si) => {
          const fires = s.transitions.map(() => false);
          for (const a of all) {
            const ti = s.transitions.findIndex((t) => evalExpr(t.when.expr, a));
            if (ti >= 0) {
              fires[ti] = true;
              next[si].add(index.get(s.transitions[ti].to)!);
            } else if (m.unspecified === 'hold') next[si].add(si);
          }
          s.transitions.forEach((t, ti) => {
            const p = `$.states[${si}].transitions[${ti}]`;
            const never = ![...assignments(n)].some((a) => evalExpr(t.when.expr, a));
            expect(zero.has(`${p}.when`) || (never && zero.has(p))).toBe(never);
            const neverAll = v.diagnostics.some((d) => d.code === 'LW305');
            if (!neverAll) expect(shadowed.has(p)).toBe(!fires[ti] && !never);
          });
        });
        const reached = new Set([index.get(m.start)!]);
        for (let grew = true; grew;) {
          grew = false;
          for (const s of [...reached])
            for (const t of next[s]) if (!reached.has(t)) grew = reached.add(t) !== undefined;
        }
        const unreachable = new Set(v.diagnostics.filter((d) => d.code === 'LW303').map((d) => d.location.path));
        m.states.forEach((_, si) =>
          expect(unreachable.has(`$.states[${si}]`)).toBe(!reached.has(si) && all.length > 0),
        );
      }),
      { seed: 42, numRuns: 300 },
    );
  });
});
