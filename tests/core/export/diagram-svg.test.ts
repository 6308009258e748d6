import { describe, expect, it } from 'vitest';
import type { Build } from '../../../src/core/model/build.js';
import { DONT_CARE, type FlatMachine } from '../../../src/core/model/flat.js';
import { coverContains, type Cube } from '../../../src/core/model/cube.js';
import { parseGuard } from '../../../src/core/forms/expr.js';
import { diagramLayout, diagramSvg } from '../../../src/core/export/diagram-svg.js';
import { example, exampleNames, xmlProblems } from './support.js';

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
});
