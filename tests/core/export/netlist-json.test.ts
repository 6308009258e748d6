import { readFileSync } from 'node:fs';
import { describe, expect, it } from 'vitest';
import type { Build } from '../../../src/core/model/build.js';
import { netlistDocument, netlistJson, sortedParts } from '../../../src/core/export/netlist-json.js';
import { example, exampleNames, schemaProblems, type Schema } from './support.js';

const schema = JSON.parse(
  readFileSync(new URL('../../../schemas/netlist.schema.json', import.meta.url), 'utf8'),
) as Schema & { $schema: string };

describe('core/export/netlist-json', () => {
  it('declares JSON Schema 2020-12', () => {
    expect(schema.$schema).toBe('https://json-schema.org/draft/2020-12/schema');
  });

  // Validated with the small 2020-12 subset validator in support.ts (type, const, enum, required,
  // properties, additionalProperties, items, oneOf, $ref, pattern, minimum, minLength, minItems).
  it('writes a document the netlist schema accepts, for every example', () => {
    for (const name of exampleNames()) {
      const doc = JSON.parse(netlistJson(example(name).build)) as unknown;
      expect(schemaProblems(schema, doc), name).toEqual([]);
    }
  });

  it('the schema rejects what it should: a wrong kind, a missing field, an extra field', () => {
    const doc = JSON.parse(netlistJson(example('marble-bell.lw').build)) as {
      parts: Record<string, unknown>[];
      cords: Record<string, unknown>[];
    };
    const bad1 = { ...doc, parts: [{ ...doc.parts[0], kind: 'spring' }, ...doc.parts.slice(1)] };
    const bad2 = { ...doc, cords: [{ id: 'c', driver: 'x', ports: [] }] };
    const bad3 = { ...doc, extra: 1 };
    expect(schemaProblems(schema, bad1).join()).toContain('oneOf');
    expect(schemaProblems(schema, bad2).join()).toContain('missing actuators');
    expect(schemaProblems(schema, bad3).join()).toContain('unexpected extra');
  });

  it('round-trips the netlist: same parts and cords, as sets', () => {
    const b = example('crossing.lw').build;
    const doc = JSON.parse(netlistJson(b)) as {
      parts: { id: string }[];
      cords: { id: string; driver: string; ports: { part: string; port: string }[] }[];
    };
    expect(doc.parts.map((p) => p.id).sort()).toEqual(b.netlist.parts.map((p) => p.id).sort());
    const key = (c: { id: string; driver: string; ports: readonly { part: string; port: string }[] }): string =>
      `${c.id}<${c.driver}>${c.ports
        .map((p) => `${p.part}.${p.port}`)
        .sort()
        .join(',')}`;
    expect(doc.cords.map(key).sort()).toEqual(b.netlist.cords.map(key).sort());
    expect(JSON.stringify(netlistDocument(b))).toBe(JSON.stringify(JSON.parse(netlistJson(b))));
  });

  it('orders parts by kind, then naturally by id (t.S0.2 before t.S0.10)', () => {
    const parts = sortedParts({
      parts: [
        { kind: 'gate', id: 't.S0.10', name: '', role: 'term', ports: [{ name: 'p1' }] },
        { kind: 'lever', id: 'z', name: '', role: 'input', input: 'z' },
        { kind: 'gate', id: 't.S0.2', name: '', role: 'term', ports: [{ name: 'p1' }] },
      ],
      cords: [],
    });
    expect(parts.map((p) => p.id)).toEqual(['z', 't.S0.2', 't.S0.10']);
  });

  it('is stable: the same build gives the same text, and a netlist in another order gives the same text', () => {
    const b = example('sequence-lock.lw').build;
    const shuffled: Build = {
      ...b,
      netlist: {
        parts: [...b.netlist.parts].reverse(),
        cords: [...b.netlist.cords].reverse().map((c) => ({ ...c, ports: [...c.ports].reverse() })),
      },
    };
    expect(netlistJson(shuffled)).toBe(netlistJson(b));
  });

  it('puts one part or cord per line, so one changed part changes one line', () => {
    const b = example('marble-bell.lw').build;
    const renamed: Build = {
      ...b,
      netlist: {
        ...b.netlist,
        parts: b.netlist.parts.map((p) => (p.id === 't.R0.1' ? { ...p, name: 'renamed term' } : p)),
      },
    };
    const a = netlistJson(b).split('\n');
    const c = netlistJson(renamed).split('\n');
    expect(c).toHaveLength(a.length);
    expect(a.filter((line, i) => line !== c[i])).toHaveLength(1);
  });

  it('with a placement: the frame block, every part’s drum, bay and position, every branch as routed — and the schema accepts it', () => {
    for (const name of exampleNames()) {
      const b = example(name);
      const doc = JSON.parse(netlistJson(b.build, { placement: b.placement, profile: b.profile })) as {
        version: number;
        frame: {
          drums: { drum: number; lengthM: number }[];
          totalCordM: number;
          baselineCordM: number;
          channelM: number;
          pulleys: number;
          knotAllowanceM: number;
          takeUpAllowanceM: number;
        };
        parts: {
          id: string;
          kind: string;
          drum?: number;
          bay?: number;
          bays?: number[];
          xM?: number;
          fixed?: number;
        }[];
        cords: {
          id: string;
          driver: string;
          ports: unknown[];
          actuators: unknown[];
          trunkM: number;
          cutM: number;
          pulleys: number;
          branches: {
            part: string;
            lengthM: number;
            channelM: number;
            pathM: number;
            own: { kind: string; drum: number; lengthM: number }[];
            pulleys: number;
          }[];
        }[];
      };
      expect(schemaProblems(schema, doc), name).toEqual([]);
      expect(doc.version).toBe(4);
      expect(doc.frame.drums.length).toBe(b.placement.drums.length);
      expect(doc.frame.totalCordM).toBeLessThanOrEqual(doc.frame.baselineCordM);
      const at = new Map(b.placement.bays.map((x) => [x.part, x]));
      for (const p of doc.parts) {
        if (p.kind === 'gate' || p.kind === 'lever' || (p.kind === 'actuator' && p.fixed === undefined)) {
          expect([p.drum, p.bay], `${name} ${p.id}`).toEqual([at.get(p.id)?.drum, at.get(p.id)?.bay]);
          expect(p.xM, `${name} ${p.id}`).toBeCloseTo(at.get(p.id)?.xM ?? NaN, 4);
        }
        if (p.kind === 'latch') expect(p.bays?.length, `${name} ${p.id}`).toBe(2);
      }
      for (const c of doc.cords) {
        expect(c.branches.length, `${name} ${c.id}`).toBe(c.ports.length + c.actuators.length);
        // Each branch's piece is its own runs and the allowances; it never holds more than its whole path.
        const allow = doc.frame.knotAllowanceM * 2 + doc.frame.takeUpAllowanceM;
        for (const br of c.branches) {
          expect(br.lengthM).toBeGreaterThan(0);
          const own = br.own.reduce((s, r) => s + r.lengthM, 0);
          expect(br.lengthM, `${name} ${c.id}`).toBeCloseTo(own + allow, 3);
          expect(own, `${name} ${c.id}`).toBeLessThanOrEqual(br.pathM + 0.0005);
          const ownChannel = br.own.filter((r) => r.kind === 'channel').reduce((s, r) => s + r.lengthM, 0);
          expect(br.channelM).toBeCloseTo(ownChannel, 3);
          // Design §11, docs/methods/place.md "Routing": a branch between two drums runs in the lower
          // drum's channel; its rise, its run along the channel and the drop it owns name that drum.
          const from = at.get(c.driver)?.drum ?? NaN;
          const lower = Math.min(from, at.get(br.part)?.drum ?? NaN);
          const last = br.own[br.own.length - 1];
          expect(last.drum, `${name} ${c.id} → ${br.part}`).toBe(last.kind === 'direct' ? from : lower);
          for (const r of br.own) {
            expect(r.drum, `${name} ${c.id} → ${br.part} ${r.kind}`).toBeLessThanOrEqual(from);
            if (r.kind === 'channel') expect(r.drum, `${name} ${c.id} → ${br.part}`).toBe(lower);
          }
        }
        expect(c.cutM, `${name} ${c.id}`).toBeCloseTo(c.trunkM + c.branches.reduce((s, br) => s + br.lengthM, 0), 3);
      }
      const channel = doc.cords.reduce((s, c) => s + c.branches.reduce((t, br) => t + br.channelM, 0), 0);
      expect(doc.frame.channelM, name).toBeCloseTo(channel, 2);
      expect(doc.frame.pulleys, name).toBe(doc.cords.reduce((s, c) => s + c.pulleys, 0));
    }
  });
});
