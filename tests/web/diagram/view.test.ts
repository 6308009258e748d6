import { describe, expect, it } from 'vitest';
import { zoomIdentity } from 'd3';
import { parseTextMachine } from '../../../src/core/forms/text.js';
import { layoutDiagram, type DiagramLayout } from '../../../src/web/diagram/layout.js';
import { fitted, insideView, keptView } from '../../../src/web/diagram/view.js';
import { arranged } from '../../../src/web/diagram/arrange.js';
import { NEW_MACHINE } from '../../../src/web/examples.js';

function laid(text: string): DiagramLayout {
  const r = parseTextMachine(text);
  if (!r.machine) throw new Error(r.diagnostics.map((d) => d.message).join('; '));
  return layoutDiagram(r.machine);
}

/** Where each state of `l` is drawn on screen through the view `t`. */
function onScreen(l: DiagramLayout, t: typeof zoomIdentity): Map<string, [number, number]> {
  return new Map(l.nodes.map((n) => [n.id, [t.applyX(n.x), t.applyY(n.y)]]));
}

describe('src/web/diagram/view', () => {
  const before = laid(NEW_MACHINE);
  // A state drawn in front of the start state: the layout gains a rank and moves every state.
  const after = laid(`${NEW_MACHINE}\nstate waking\n  go dark\n`);
  const t = zoomIdentity.translate(400, 300).scale(1.5);

  it('keeps the states that stay where they were on screen, though the layout moved them all', () => {
    const moved = Math.hypot(
      (after.nodes.find((n) => n.id === 'lit')?.x ?? 0) - (before.nodes.find((n) => n.id === 'lit')?.x ?? 0),
      (after.nodes.find((n) => n.id === 'lit')?.y ?? 0) - (before.nodes.find((n) => n.id === 'lit')?.y ?? 0),
    );
    expect(moved).toBeGreaterThan(50);
    const kept = keptView(before, after, t, 2000, 1200);
    if (!kept) throw new Error('not kept');
    expect(kept.k).toBe(t.k);
    const was = onScreen(before, t);
    for (const [id, [x, y]] of onScreen(after, kept))
      if (was.has(id)) expect(Math.hypot(x - (was.get(id)?.[0] ?? 0), y - (was.get(id)?.[1] ?? 0))).toBeLessThan(16);
  });

  it('gives up (so the sketch is fitted) when a state would leave the view, or no state stays', () => {
    expect(keptView(before, after, t, 500, 400)).toBeUndefined();
    expect(keptView(before, after, zoomIdentity.translate(10, 10), 2000, 1200)).toBeUndefined();
    const other = laid('machine other\nstart a\nstate a\n  go b\nstate b\n  go a\n');
    expect(keptView(before, other, t, 2000, 1200)).toBeUndefined();
  });

  it('counts the states where they are drawn: a state moved out of the kept view makes it give up', () => {
    expect(keptView(before, after, t, 2000, 1200)).toBeDefined();
    const shown = arranged(after, new Map([['lit', { x: 5000, y: 0 }]]));
    expect(keptView(before, after, t, 2000, 1200, shown)).toBeUndefined();
  });

  it('fits the layout’s own box while nothing was moved, and the moved states too once one was', () => {
    const k = Math.min(2, 0.92 * Math.min(800 / after.width, 600 / after.height));
    expect(fitted(after, after, 800, 600, 10 / 12).t).toEqual(
      zoomIdentity.translate((800 - after.width * k) / 2, (600 - after.height * k) / 2).scale(k),
    );
    const shown = arranged(after, new Map([['lit', { x: 1500, y: -400 }]]));
    const f = fitted(after, shown, 800, 600, 0.1);
    for (const n of shown.nodes) {
      expect(f.t.applyX(n.x - n.width / 2)).toBeGreaterThanOrEqual(0);
      expect(f.t.applyX(n.x + n.width / 2)).toBeLessThanOrEqual(800);
      expect(f.t.applyY(n.y - n.height / 2)).toBeGreaterThanOrEqual(0);
      expect(f.t.applyY(n.y + n.height / 2)).toBeLessThanOrEqual(600);
    }
  });

  it('keeps a card put near the edge of the view inside it', () => {
    const n = after.nodes[0];
    const p = insideView({ ...n, x: -1000, y: 1e6 }, t, 800, 600);
    expect(t.applyX(p.x - n.width / 2)).toBeCloseTo(4, 6);
    expect(t.applyY(p.y + n.height / 2)).toBeCloseTo(596, 6);
  });
});
