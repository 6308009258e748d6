import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import { parseTextMachine } from '../../../src/core/forms/text.js';
import { layoutDiagram, type DiagramLayout, type LaidNode, type Point } from '../../../src/web/diagram/layout.js';
import { arranged, extent, follow, meanShift, route } from '../../../src/web/diagram/arrange.js';
import { NEW_MACHINE } from '../../../src/web/examples.js';

function laid(text: string): DiagramLayout {
  const r = parseTextMachine(text);
  if (!r.machine) throw new Error(r.diagnostics.map((d) => d.message).join('; '));
  return layoutDiagram(r.machine);
}

const node = (l: DiagramLayout, id: string): LaidNode => {
  const n = l.nodes.find((x) => x.id === id);
  if (!n) throw new Error(`no state ${id}`);
  return n;
};

/** A point is on a card's outline: on one of its four sides (plane geometry of an axis-aligned rectangle). */
function onOutline(p: Point, n: LaidNode): boolean {
  const dx = Math.abs(p.x - n.x);
  const dy = Math.abs(p.y - n.y);
  const e = 1e-6;
  const w = n.width / 2;
  const h = n.height / 2;
  return (Math.abs(dx - w) < e && dy <= h + e) || (Math.abs(dy - h) < e && dx <= w + e);
}

// A self-loop on `dark` and transitions both ways between dark and lit.
const LOOPED = NEW_MACHINE.replace('  when button go lit #', '  when !button go dark\n  when button go lit #');

describe('src/web/diagram/arrange', () => {
  const l = laid(LOOPED);

  it('draws an unarranged layout exactly as laid out (the same object), and its extent is the layout’s box', () => {
    expect(arranged(l, new Map())).toBe(l);
    expect(arranged(l, new Map([['gone', { x: 1, y: 2 }]]))).toBe(l);
    expect(extent(l, l)).toEqual({ x: 0, y: 0, width: l.width, height: l.height });
  });

  it('puts a moved state where it was put; its transitions run from outline to outline, bent apart when both ways', () => {
    const at = { x: node(l, 'lit').x + 200, y: node(l, 'lit').y + 150 };
    const shown = arranged(l, new Map([['lit', at]]));
    const lit = node(shown, 'lit');
    const dark = node(shown, 'dark');
    expect([lit.x, lit.y]).toEqual([at.x, at.y]);
    expect(node(shown, 'dark')).toBe(node(l, 'dark'));
    const there = shown.edges.find((e) => e.from === 'dark' && e.to === 'lit');
    const back = shown.edges.find((e) => e.from === 'lit' && e.to === 'dark');
    if (!there || !back) throw new Error('no transitions');
    expect(onOutline(there.points[0], dark)).toBe(true);
    expect(onOutline(there.points[there.points.length - 1], lit)).toBe(true);
    expect(onOutline(back.points[0], lit)).toBe(true);
    expect(onOutline(back.points[back.points.length - 1], dark)).toBe(true);
    // The two labels are apart (one on each side of the line between the states), each under the bend.
    expect(Math.hypot(there.label.x - back.label.x, there.label.y - back.label.y)).toBeGreaterThan(20);
    // The loop on dark, which was not moved, keeps the layout's route.
    const loop = shown.edges.find((e) => e.from === 'dark' && e.to === 'dark');
    expect(loop).toBe(l.edges.find((e) => e.from === 'dark' && e.to === 'dark'));
  });

  it('moves a loop with its state, and draws a one-way transition straight', () => {
    const dark = node(l, 'dark');
    const shown = arranged(l, new Map([['dark', { x: dark.x - 40, y: dark.y + 90 }]]));
    const before = l.edges.find((e) => e.from === 'dark' && e.to === 'dark');
    const loop = shown.edges.find((e) => e.from === 'dark' && e.to === 'dark');
    if (!before || !loop) throw new Error('no loop');
    loop.points.forEach((p, i) => expect([p.x - before.points[i].x, p.y - before.points[i].y]).toEqual([-40, 90]));
    expect([loop.label.x - before.label.x, loop.label.y - before.label.y]).toEqual([-40, 90]);
    const a = { ...dark, x: 0, y: 0 };
    const b = { ...dark, id: 'b', x: 300, y: 100 };
    const straight = route(a, b, 0);
    const [p0, mid, p1] = straight.points;
    // Collinear: the cross product of (mid − p0) and (p1 − p0) is zero.
    expect((mid.x - p0.x) * (p1.y - p0.y) - (mid.y - p0.y) * (p1.x - p0.x)).toBeCloseTo(0, 6);
    expect(onOutline(p0, a) && onOutline(p1, b)).toBe(true);
  });

  it('ends every rerouted transition on the outlines of its states, wherever they are put (fast-check, seed 7)', () => {
    const dark = node(l, 'dark');
    fc.assert(
      fc.property(
        fc.integer({ min: -600, max: 600 }),
        fc.integer({ min: -600, max: 600 }),
        fc.boolean(),
        (x, y, twoWay) => {
          const b = { ...dark, id: 'b', x: dark.x + x, y: dark.y + y };
          // Overlapping cards have no outline between them to end on: not a place the check is about.
          fc.pre(Math.abs(x) > dark.width || Math.abs(y) > dark.height);
          const r = route(dark, b, twoWay ? 24 : 0);
          return onOutline(r.points[0], dark) && onOutline(r.points[r.points.length - 1], b);
        },
      ),
      { seed: 7, numRuns: 300 },
    );
  });

  it('takes a moved state into the extent Fit shows', () => {
    const lit = node(l, 'lit');
    const shown = arranged(l, new Map([['lit', { x: -300, y: 900 }]]));
    const e = extent(l, shown);
    expect(e.x).toBeLessThanOrEqual(-300 - lit.width / 2);
    expect(e.y + e.height).toBeGreaterThanOrEqual(900 + lit.height / 2);
  });

  it('keeps the places across an edit: moved with the layout, a rename carries its place, a deletion drops it', () => {
    const places = new Map([
      ['lit', { x: 500, y: 40 }],
      ['dark', { x: 10, y: 20 }],
    ]);
    // A state drawn in front of the start state: the layout gains a rank and moves every state.
    const grown = laid(`${LOOPED}\nstate waking\n  go dark\n`);
    const s = meanShift(l, grown);
    expect(Math.hypot(s.x, s.y)).toBeGreaterThan(20);
    expect(follow(places, l, grown)).toEqual(
      new Map([
        ['lit', { x: 500 + s.x, y: 40 + s.y }],
        ['dark', { x: 10 + s.x, y: 20 + s.y }],
      ]),
    );
    // lit renamed to glowing (every reference to it too): the place goes with the name.
    const renamed = laid(LOOPED.replace('state lit', 'state glowing').replace('go lit', 'go glowing'));
    const r = meanShift(l, renamed);
    expect(follow(places, l, renamed).get('glowing')).toEqual({ x: 500 + r.x, y: 40 + r.y });
    expect(follow(places, l, renamed).has('lit')).toBe(false);
    // lit deleted with its transitions: its place goes; dark's stays.
    const deleted = laid(
      LOOPED.replace('  when button go lit # at a clock with button pulled, go to lit\n', '').replace(
        /state lit[^]*$/,
        '',
      ),
    );
    expect([...follow(places, l, deleted).keys()]).toEqual(['dark']);
  });
});
