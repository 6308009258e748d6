import { describe, expect, it } from 'vitest';
import { readFileSync } from 'node:fs';
import { fileURLToPath } from 'node:url';
import { analyse } from '../../../src/core/pipeline.js';
import { CHAR_W, LAYERED_BUDGET, layoutDiagram, outputWords, type LaidNode } from '../../../src/web/diagram/layout.js';

const example = (f: string): string =>
  readFileSync(fileURLToPath(new URL(`../../../examples/${f}`, import.meta.url)), 'utf8');

function laid(text: string) {
  const a = analyse(text, 'x.lw');
  if (!a.ok) throw new Error('must read');
  return { a, l: layoutDiagram(a.machine, a.minimised.merged, a.minimised.unreachable) };
}

const overlap = (p: LaidNode, q: LaidNode): boolean =>
  Math.abs(p.x - q.x) * 2 < p.width + q.width && Math.abs(p.y - q.y) * 2 < p.height + q.height;

describe('src/web/diagram/layout', () => {
  it('places every state once, boxes apart, inside the drawing, sized to their text', () => {
    for (const f of ['marble-bell.lw', 'sequence-lock.lw', 'crossing.lw', 'lighthouse.lw', 'odd-lever.lw']) {
      const { a, l } = laid(example(f));
      expect(l.nodes.map((n) => n.id)).toEqual(a.machine.states.map((s) => s.name));
      for (const n of l.nodes) {
        expect(n.x - n.width / 2).toBeGreaterThanOrEqual(0);
        expect(n.y + n.height / 2).toBeLessThanOrEqual(l.height + 1e-9);
        expect(n.width).toBeGreaterThanOrEqual(Math.max(...n.lines.map((t) => t.length)) * CHAR_W);
        for (const m of l.nodes) if (m !== n) expect(overlap(n, m)).toBe(false);
      }
      expect(l.nodes.filter((n) => n.start).map((n) => n.id)).toEqual([a.machine.start]);
    }
  });

  it('draws one edge per pair of states, one line per transition, with its source line', () => {
    const { a, l } = laid(example('marble-bell.lw'));
    const transitions = a.machine.states.reduce((k, s) => k + s.transitions.length, 0);
    expect(l.edges.reduce((k, e) => k + e.lines.length, 0)).toBe(transitions);
    const rung = l.edges.filter((e) => e.from === 'rung').map((e) => [e.to, e.lines]);
    expect(rung).toEqual([
      ['one', ['marble']],
      ['none', ['otherwise']],
    ]);
    const back = l.edges.find((e) => e.from === 'rung' && e.to === 'none');
    expect(back?.sourceLines).toEqual([30]);
    for (const e of l.edges) expect(e.points.length).toBeGreaterThanOrEqual(2);
  });

  it('names outputs that are not 0, Mealy outputs after the guard, merged and unreachable states', () => {
    const { l } = laid(example('odd-lever.lw'));
    expect(l.edges[0].lines).toEqual(['left ^ right / chime=1', 'otherwise']);
    expect(outputWords({ a: 0, b: 1, c: '-' }, ['c', 'b', 'a'])).toBe('c=- b=1');
    const text =
      'machine m\ninputs x\noutputs y\nstart a\nstate a\n  when x go b\n  go c\nstate b with y=1\n  go a\nstate c with y=1\n  go a\nstate lost\n  go a\n';
    const { l: l2 } = laid(text);
    const byId = new Map(l2.nodes.map((n) => [n.id, n]));
    expect(byId.get('lost')?.unreachable).toBe(true);
    // b and c behave alike (partition refinement merges them): one is drawn as the other.
    expect([byId.get('b')?.mergedInto, byId.get('c')?.mergedInto].filter((x) => x !== undefined)).toHaveLength(1);
    expect(byId.get('a')?.mergedInto).toBeUndefined();
    expect(byId.get('b')?.lines).toEqual(['b', 'y=1']);
  });

  it('lays out a machine past the layered budget by distance from the start: every state once, none overlapping', () => {
    // An invented ring of stations with a jump back every third: long edges, which make the layered layout slow.
    const n = 150;
    let text = 'machine ring\ninputs a, b\noutputs o\nstart s0\n';
    for (let i = 0; i < n; i++)
      text += `state s${i}${i % 3 === 0 ? ' with o=1' : ''}\n  when a go s${(i + 1) % n}\n  when b go s${(i * 7 + 3) % n}\n`;
    const { a, l } = laid(text);
    expect(a.machine.states.length + l.edges.length).toBeGreaterThan(LAYERED_BUDGET);
    expect(l.method).toBe('by-distance');
    expect(l.nodes.map((x) => x.id)).toEqual(a.machine.states.map((s) => s.name));
    const byId = new Map(l.nodes.map((x) => [x.id, x]));
    // The start state is in the first column; its successors in the next.
    expect(byId.get('s0')?.x).toBe(Math.min(...l.nodes.map((x) => x.x)));
    expect((byId.get('s1')?.x ?? 0) > (byId.get('s0')?.x ?? 0)).toBe(true);
    const sorted = [...l.nodes].sort((p, q) => p.x - q.x || p.y - q.y);
    for (let i = 0; i < sorted.length; i++)
      for (let j = i + 1; j < sorted.length && sorted[j].x - sorted[i].x < 400; j++)
        expect(overlap(sorted[i], sorted[j]), `${sorted[i].id} × ${sorted[j].id}`).toBe(false);
    for (const x of l.nodes) {
      expect(x.x - x.width / 2).toBeGreaterThanOrEqual(0);
      expect(x.y + x.height / 2).toBeLessThanOrEqual(l.height + 1e-9);
    }
  });

  it('lays out a chain of 4,000 states (the stack of a recursive layout would overflow)', () => {
    let text = 'machine chain\ninputs a\noutputs o\nstart s0\n';
    for (let i = 0; i < 4000; i++) text += `state s${i}\n  when a go s${(i + 1) % 4000}\n`;
    const { l } = laid(text);
    expect(l.nodes).toHaveLength(4000);
    // Wrapped into bands rather than one endless row.
    expect(l.width).toBeLessThan(20 * l.height);
  });
});
