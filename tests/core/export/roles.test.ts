/**
 * The role words read off the netlist say what the build's own equations say: a term gate
 * that "sets M1 when a · !b" realises a product a·b̄ of the set equation S1 (the two-level
 * NAND–NAND form of a sum of products, M. Morris Mano & M. Ciletti, *Digital Design*, the
 * chapter on NAND implementation), and an output gate's words are a product of its output's
 * equation. The words are found from which cords drive which ports, never from a part's name.
 */
import { describe, expect, it } from 'vitest';
import { partRoles } from '../../../src/core/export/roles.js';
import type { Build } from '../../../src/core/model/build.js';
import { example, exampleNames } from './support.js';

/** The literals of a cube over the build's variables, as the role words write them. */
function literals(b: Build, cube: string): string {
  return [...cube]
    .flatMap((c, k) => (c === '1' ? [b.vars[k]] : c === '0' ? [`!${b.vars[k]}`] : []))
    .sort()
    .join(' · ');
}

const sorted = (words: string): string => words.split(' · ').sort().join(' · ');

describe('core/export/roles', () => {
  it('names every term gate by the latches it sets or resets and a product of their equations', () => {
    for (const name of exampleNames()) {
      const b = example(name).build;
      const roles = partRoles(b.netlist);
      const products = (eq: string): string[] =>
        (b.equations.find((e) => e.name === eq)?.terms ?? []).map((c) => literals(b, c));
      for (const p of b.netlist.parts) {
        if (p.kind !== 'gate' || p.role !== 'term') continue;
        const role = roles.get(p.id);
        expect(role?.kind).toBe('φ1 term');
        const m = /^(?:sets ((?:M\d+)(?:, M\d+)*))?(?: and )?(?:resets ((?:M\d+)(?:, M\d+)*))? when (.+)$/.exec(
          role?.does ?? '',
        );
        expect(m, `${name} ${p.id}: ${role?.does}`).not.toBeNull();
        const product = sorted(m?.[3] ?? '');
        const sets = m?.[1]?.split(', ') ?? [];
        const resets = m?.[2]?.split(', ') ?? [];
        expect(sets.length + resets.length).toBeGreaterThan(0);
        for (const l of sets) expect(products(`S${l.slice(1)}`), `${name} ${p.id}`).toContain(product);
        for (const l of resets) expect(products(`R${l.slice(1)}`), `${name} ${p.id}`).toContain(product);
      }
    }
  });

  it('names an output gate by its output and a product of its equation, and every part once', () => {
    for (const name of exampleNames()) {
      const b = example(name).build;
      const roles = partRoles(b.netlist);
      expect([...roles.keys()].sort()).toEqual(b.netlist.parts.map((p) => p.id).sort());
      for (const p of b.netlist.parts) {
        const does = roles.get(p.id)?.does ?? '';
        expect(does.length, `${name} ${p.id}`).toBeGreaterThan(0);
        expect(does.length).toBeLessThanOrEqual(72);
        expect(does, 'never the part id').not.toContain(p.id);
        if (p.kind !== 'gate' || p.role !== 'output') continue;
        const m = /^(?:term of )?(\w+):? (when|unless) (.+)$/.exec(does);
        if (!m) continue; // an OR of terms: "chime: 1 when any of its terms holds"
        const eq = b.equations.find((e) => e.name === m[1]);
        expect(eq, `${name} ${p.id}: ${does}`).toBeDefined();
        const terms = eq?.terms.map((c) => literals(b, c)) ?? [];
        if (m[2] === 'when') expect(terms).toContain(sorted(m[3]));
        // A flag showing the complement of Z: the output is 1 unless the product holds, so by
        // De Morgan's law its equation is the sum of the complemented literals.
        else
          expect(terms.sort()).toEqual(
            m[3]
              .split(' · ')
              .map((l) => (l.startsWith('!') ? l.slice(1) : `!${l}`))
              .sort(),
          );
      }
    }
  });
});
