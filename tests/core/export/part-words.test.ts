/**
 * What each part does, in words, read from the netlist's structure alone — checked against the
 * build's own equations (the minimised set/reset and output covers): every term gate's words
 * name the functions it feeds and a condition that is one of those functions' product terms,
 * literal for literal, in the notation's own operators.
 */
import { describe, expect, it } from 'vitest';
import { partWords } from '../../../src/core/export/part-words.js';
import { cubeExpr } from '../../../src/core/export/readable.js';
import { example, exampleNames } from './support.js';

describe('core/export/part-words', () => {
  it('names every term gate by the latch ports it feeds and a product term of those equations', () => {
    let terms = 0;
    for (const name of exampleNames()) {
      const b = example(name);
      const words = partWords(b.build);
      const eq = new Map(b.build.equations.map((e) => [e.name, e.terms.map((t) => cubeExpr(t, b.build.vars))]));
      for (const p of b.build.netlist.parts) {
        if (p.kind !== 'gate' || p.role !== 'term') continue;
        const m = /^((?:(?:set|reset) bit \d+)(?: and (?:set|reset) bit \d+)*) when (.+) \(at φ1\)$/.exec(
          words.get(p.id) ?? '',
        );
        expect(m, `${name} ${p.id}: ${words.get(p.id)}`).not.toBeNull();
        if (!m) continue;
        for (const fn of m[1].split(' and ')) {
          const [side, , bit] = fn.split(' ');
          const fnName = `${side === 'set' ? 'S' : 'R'}${bit}`;
          expect(eq.get(fnName), `${name} ${p.id} → ${fnName}`).toContain(m[2]);
        }
        terms++;
      }
    }
    expect(terms).toBeGreaterThan(10);
  });

  it('names output term gates by the output they show and a term of its equation', () => {
    const b = example('ferry-gate.lw');
    const words = partWords(b.build);
    const eq = new Map(b.build.equations.map((e) => [e.name, e.terms.map((t) => cubeExpr(t, b.build.vars))]));
    const outputs = b.build.netlist.parts.filter((p) => p.kind === 'gate' && p.role === 'output');
    expect(outputs.length).toBeGreaterThan(0);
    for (const p of outputs) {
      const w = words.get(p.id) ?? '';
      const m = /^(\w+) when (.+)$/.exec(w);
      if (m) expect(eq.get(m[1]), `${p.id}: ${w}`).toContain(m[2]);
      else expect(w, p.id).toMatch(/^\w+: any of its terms$/);
    }
  });

  it('names latches by their bit, levers by their use, and the transfer gates by what they copy', () => {
    const b = example('marble-bell.lw');
    const w = partWords(b.build);
    expect(w.get('m0')).toBe('master latch of q0');
    expect(w.get('s1.reset')).toBe('slave latch q1, reset side (Q̄)');
    expect(w.get('in.marble')).toBe('operator lever ‘marble’');
    expect(w.get('clk.phi2')).toBe('clock lever φ2');
    expect(w.get('rst')).toBe('reset lever');
    expect(w.get('tr0.set')).toBe('φ2: set q0 when M0');
    expect(w.get('tr0.reset')).toBe('φ2: reset q0 when !M0');
  });
});
