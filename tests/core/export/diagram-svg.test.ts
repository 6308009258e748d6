import { describe, expect, it } from 'vitest';
import type { Build } from '../../../src/core/model/build.js';
import { DONT_CARE, type FlatMachine } from '../../../src/core/model/flat.js';
import { coverContains, type Cube } from '../../../src/core/model/cube.js';
import { parseGuard } from '../../../src/core/forms/expr.js';
import { diagramLayout, diagramSvg, LAYERED_MAX_ITEMS } from '../../../src/core/export/diagram-svg.js';
import { example, exampleNames, expectStoredDigests, xmlProblems } from './support.js';

type Box = { readonly x: number; readonly y: number; readonly width: number; readonly height: number };
/** Boxes given by their top-left corner. */
const apart = (a: Box, b: Box): boolean =>
  a.x + a.width <= b.x || b.x + b.width <= a.x || a.y + a.height <= b.y || b.y + b.height <= a.y;

/** Only the fields the diagram reads: a machine with a Moore output z and a Mealy output w, and a free row. */
function handBuild(): Build {
  const machine: FlatMachine = {
    name: 'gate_keeper',
    inputs: ['p', 'q'],
    outputs: ['z', 'w'],
    states: ['idle', 'busy'],
    start: 0,
    never: [],
    rows: [
      [
        { cube: '1-', next: 1, out: [0, 1], transition: 0 },
        { cube: '0-', next: 0, out: [0, 0], transition: -1 },
      ],
      [
        { cube: '-1', next: 0, out: [1, 0], transition: 0 },
        { cube: '-0', next: DONT_CARE, out: [1, '-'], transition: -1 },
      ],
    ],
  };
  return { ...example('marble-bell.lw').build, machine, encoding: { strategy: 'binary', bits: 1, codes: ['0', '1'] } };
}

/**
 * An invented counter of n positions with three buttons (step on, step back, jump to position
 * 3·s mod n), binary codes: n states and 3n arrows; only the fields the diagram reads.
 */
function counterBuild(n: number): Build {
  const machine: FlatMachine = {
    name: 'counter',
    inputs: ['on', 'back', 'jump'],
    outputs: ['lamp'],
    states: Array.from({ length: n }, (_, i) => `pos${i}`),
    start: 0,
    never: ['11-', '1-1', '-11'],
    rows: Array.from({ length: n }, (_, s) => [
      { cube: '100', next: (s + 1) % n, out: [s % 2 === 0 ? 0 : 1], transition: 0 },
      { cube: '010', next: (s + n - 1) % n, out: [0], transition: 1 },
      { cube: '001', next: (3 * s + 2) % n, out: [1], transition: 2 },
      { cube: '000', next: s, out: [0], transition: -1 },
    ]),
  };
  const bits = Math.ceil(Math.log2(n));
  const codes = Array.from({ length: n }, (_, i) => i.toString(2).padStart(bits, '0'));
  return { ...example('marble-bell.lw').build, machine, encoding: { strategy: 'binary', bits, codes } };
}

describe('core/export/diagram-svg', () => {
  it('draws every example as well-formed SVG, one box per state, nothing overlapping', () => {
    for (const name of exampleNames()) {
      const b = example(name).build;
      expect(xmlProblems(diagramSvg(b)), name).toEqual([]);
      const l = diagramLayout(b);
      expect(l.states).toHaveLength(b.machine.states.length);
      const boxes = [
        ...l.states.map((s) => s.outer),
        ...l.arrows.map((a) => {
          // The label's text: 10 px monospace, about 0.6 em per character; 13 px per line.
          const w = Math.max(...a.label.map((t) => [...t].length)) * 6;
          return { x: a.x - w / 2, y: a.y - (a.label.length * 13) / 2, width: w, height: a.label.length * 13 };
        }),
      ];
      for (let i = 0; i < boxes.length; i++)
        for (let j = i + 1; j < boxes.length; j++)
          expect(apart(boxes[i], boxes[j]), `${name}: box ${i} × box ${j}`).toBe(true);
    }
  });

  it('marks the start state, and shows codes and Moore outputs in the boxes', () => {
    const b = example('marble-bell.lw').build;
    const svg = diagramSvg(b);
    expect(svg.match(/state-start/g)).toHaveLength(2); // the style rule and the one box
    expect(svg).toContain('>START<');
    const l = diagramLayout(b);
    const start = l.states.find((s) => s.start);
    expect(start?.lines[0]).toBe(b.machine.states[b.machine.start]);
    for (const s of l.states) expect(s.lines[1]).toBe(`code ${b.encoding.codes[s.index]}`);
    expect(l.states.find((s) => s.lines[0] === 'rung')?.lines).toContain('bell=1');
  });

  it('labels each arrow and self-loop with guards that read back to its rows', () => {
    for (const name of exampleNames()) {
      const b = example(name).build;
      const f = b.machine;
      const l = diagramLayout(b);
      const guardsOf = (s: number, t: number): readonly string[] =>
        s === t ? l.states[s].loopGuards : (l.arrows.find((a) => a.from === s && a.to === t)?.guards ?? []);
      f.rows.forEach((rows, s) => {
        const targets = new Set(rows.filter((r) => r.next !== DONT_CARE).map((r) => r.next));
        for (const t of targets) {
          const text = guardsOf(s, t)
            .map((g) => (g === 'always' ? '1' : `(${g})`))
            .join(' | ');
          const want = rows.filter((r) => r.next === t).map((r) => r.cube);
          const back = parseGuard(text, f.inputs, {}).guard?.cubes as readonly Cube[];
          expect(coverContains(back, want), `${name} ${s}→${t}: ${text}`).toBe(true);
          expect(coverContains([...want, ...f.never], back), `${name} ${s}→${t}: ${text}`).toBe(true);
        }
      });
    }
  });

  it('puts Mealy outputs on the arrows, Moore outputs in the box, and free rows in the box', () => {
    const l = diagramLayout(handBuild());
    const idle = l.states[0];
    const busy = l.states[1];
    expect(l.arrows.find((a) => a.from === 0 && a.to === 1)?.label).toEqual(['p / w=1']);
    expect(idle.loop).toEqual(['!p / w=0']);
    expect(l.arrows.find((a) => a.from === 1 && a.to === 0)?.label).toEqual(['q / w=0']);
    expect(busy.lines).toEqual(['busy', 'code 1', 'z=1', 'free: !q / w free']);
    expect(idle.lines).toContain('z=0');
  });

  it('escapes names in the drawing', () => {
    const b = handBuild();
    const evil: Build = { ...b, machine: { ...b.machine, states: ['<idle & "x">', 'busy'], name: '=a&b' } };
    const svg = diagramSvg(evil);
    expect(xmlProblems(svg)).toEqual([]);
    expect(svg).toContain('&lt;idle &amp; &quot;x&quot;&gt;');
    expect(svg).not.toContain('<idle');
  });

  // Stored digests of the examples' diagrams (binary codes), reviewed when they change: rewrite with
  // LW_UPDATE_EXPECTED=1 npx vitest run tests/core/export/diagram-svg.test.ts
  it('draws every example exactly as the stored digests say (layered layout)', () => {
    const drawings: Record<string, string> = {};
    for (const name of exampleNames()) {
      const b = example(name).build;
      expect(diagramLayout(b).method, name).toBe('layered');
      drawings[name] = diagramSvg(b);
    }
    expectStoredDigests('tests/fixtures/drawings/diagram-digests.json', drawings);
  });

  it('past the size bound, lays the states out in columns by distance, every state and arrow drawn', () => {
    const b = counterBuild(150);
    const l = diagramLayout(b);
    expect(l.states.length + l.arrows.length).toBeGreaterThan(LAYERED_MAX_ITEMS);
    expect(l.method).toBe('columns');
    expect(l.states).toHaveLength(150);
    // Every pair of different states with a transition between them is one arrow with a route.
    const pairs = new Set(
      b.machine.rows.flatMap((rows, s) => rows.filter((r) => r.next !== s && r.next >= 0).map((r) => `${s}>${r.next}`)),
    );
    expect(l.arrows.map((a) => `${a.from}>${a.to}`).sort()).toEqual([...pairs].sort());
    for (const a of l.arrows) expect(a.points.length, `${a.from}>${a.to}`).toBeGreaterThanOrEqual(2);
    for (let i = 0; i < l.states.length; i++)
      for (let j = i + 1; j < l.states.length; j++)
        expect(apart(l.states[i].outer, l.states[j].outer), `state ${i} × state ${j}`).toBe(true);
    // Columns by the fewest clocks from the start: the start state alone in the first.
    const start = l.states[b.machine.start];
    expect(l.states.every((s) => s === start || s.x > start.x)).toBe(true);
    const svg = diagramSvg(b);
    expect(xmlProblems(svg)).toEqual([]);
    expect(svg).toContain('Laid out in columns by the fewest clocks from the start state');
  });
});
