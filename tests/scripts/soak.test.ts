/**
 * The campaign's own parts: its reference interpreter against the semantics of the notation
 * (docs/notation.md "Meaning" and "Guard expressions", DESIGN.md §7), its explorer able to see
 * a difference, and a few fixed-seed machines of the campaign through every area (the full
 * campaign is `npm run soak`).
 */
import { describe, expect, it } from 'vitest';
import { analyse, buildMachine, DEFAULT_PROFILE, type Built } from '../../src/core/index.js';
import { explore } from '../../scripts/soak/explore.js';
import { randomMachine } from '../../scripts/soak/generate.js';
import { runMachine, type Tally } from '../../scripts/soak/machine.js';
import { Rng } from '../../scripts/soak/random.js';
import { parseGuard, Reference, type SpecJson } from '../../scripts/soak/reference.js';

const values = (a: number, b: number, c: number, d: number) =>
  new Map([
    ['a', a === 1],
    ['b', b === 1],
    ['c', c === 1],
    ['d', d === 1],
  ]);

describe('scripts/soak/reference', () => {
  it('reads `a | b & !c ^ d` as `a | ((b & (!c)) ^ d)` (docs/notation.md, Guard expressions)', () => {
    const g = parseGuard('a | b & !c ^ d');
    for (let k = 0; k < 16; k++) {
      const [a, b, c, d] = [8, 4, 2, 1].map((bit) => ((k & bit) !== 0 ? 1 : 0));
      expect(g(values(a, b, c, d))).toBe(a === 1 || (b === 1 && c === 0) !== (d === 1));
    }
  });

  it('fires the first transition whose guard holds, and applies the unspecified rule otherwise (DESIGN.md §7)', () => {
    const spec: SpecJson = {
      name: 'porch_light',
      inputs: ['a', 'b'],
      outputs: ['x', 'y'],
      start: 's',
      unspecified: 'dont-care',
      states: [
        {
          name: 's',
          outputs: { x: 1, y: '-' },
          transitions: [
            { when: 'a', to: 't', outputs: { x: 0 } },
            { when: 'a | b', to: 's' },
          ],
        },
        { name: 't', transitions: [{ to: 's' }] },
      ],
    };
    const r = new Reference(spec);
    // a and b: the first transition wins; its x overrides the state's; y stays free ("-").
    expect(r.step('s', '11')).toEqual({ next: 't', outputs: [0, null] });
    expect(r.step('s', '01')).toEqual({ next: 's', outputs: [1, null] });
    // No transition fires: dont-care leaves the next state and unnamed outputs free.
    expect(r.step('s', '00')).toEqual({ next: null, outputs: [1, null] });
    // A transition without `when` always fires; outputs named by neither are 0.
    expect(r.step('t', '00')).toEqual({ next: 's', outputs: [0, 0] });
  });
});

describe('scripts/soak/explore', () => {
  it('sees a build that differs from a spec in one output', () => {
    const text =
      'machine door\ninputs a\noutputs x\nstart s\nstate s\n  when a go t\nstate t with x=1\n  when a go s\n';
    const a = analyse(text, 'door.lw');
    if (!a.ok) throw new Error('the door machine should read');
    const b = buildMachine(a, { encoding: 'binary' }) as Built;
    const spec: SpecJson = {
      name: 'door',
      inputs: ['a'],
      outputs: ['x'],
      start: 's',
      states: [
        { name: 's', transitions: [{ when: 'a', to: 't' }] },
        { name: 't', outputs: { x: 0 }, transitions: [{ when: 'a', to: 's' }] },
      ],
    };
    expect(explore(b.build, new Reference(spec), b.profile, new Rng(1)).difference?.kind).toBe('output');
    const same = { ...spec, states: [spec.states[0], { ...spec.states[1], outputs: { x: 1 as const } }] };
    expect(explore(b.build, new Reference(same), b.profile, new Rng(1)).difference).toBeUndefined();
  });
});

describe('scripts/soak', () => {
  it('finds nothing on a few fixed-seed machines of the campaign', () => {
    const t: Tally = { counts: new Map(), findings: [] };
    for (let i = 0; i < 4; i++) {
      const r = new Rng(20_251_205 + i);
      runMachine(t, randomMachine(r, i), r, [{ name: 'default', profile: DEFAULT_PROFILE }], 1);
    }
    expect(t.findings).toEqual([]);
    expect(t.counts.get('build: built')).toBeGreaterThan(0);
  });
});
