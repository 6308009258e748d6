import { readFileSync } from 'node:fs';
import { describe, expect, it } from 'vitest';
import type { Build } from '../../../src/core/model/build.js';
import type { FlatMachine } from '../../../src/core/model/flat.js';
import { DEFAULT_PROFILE } from '../../../src/core/physics/profile.js';
import { synthesise } from '../../../src/core/synthesise.js';
import {
  LAYERED_MAX_PARTS,
  schematicLayout,
  schematicSvg,
  type SchematicLayout,
} from '../../../src/core/export/schematic-svg.js';
import { analyse, buildMachine } from '../../../src/core/pipeline.js';
import { stagesOf, STAGE_RANK } from '../../../src/core/export/stages.js';
import { oneHotEncoding } from '../support/synthesis.js';
import { example, exampleNames, expectStoredDigests, xmlProblems } from './support.js';

type Box = { readonly x: number; readonly y: number; readonly width: number; readonly height: number };

const overlap = (a: Box, b: Box): boolean =>
  Math.abs(a.x - b.x) * 2 < a.width + b.width && Math.abs(a.y - b.y) * 2 < a.height + b.height;

function overlappingPairs(l: SchematicLayout): string[] {
  const out: string[] = [];
  for (let i = 0; i < l.nodes.length; i++)
    for (let j = i + 1; j < l.nodes.length; j++)
      if (overlap(l.nodes[i], l.nodes[j])) out.push(`${l.nodes[i].id} × ${l.nodes[j].id}`);
  return out;
}

/** An invented ring of n stations stepped forward by `go` and back by `back`, one-hot coded: about 12 parts per station. */
function ringBuild(n: number): Build {
  const f: FlatMachine = {
    name: 'ring',
    inputs: ['go', 'back'],
    outputs: ['bell', 'lamp'],
    states: Array.from({ length: n }, (_, i) => `station${i}`),
    start: 0,
    never: ['11'],
    rows: Array.from({ length: n }, (_, s) => [
      { cube: '10', next: (s + 1) % n, out: [s % 3 === 0 ? 1 : 0, (s % 2) as 0 | 1], transition: 0 },
      { cube: '01', next: (s + n - 1) % n, out: [0, 1], transition: 1 },
      { cube: '00', next: s, out: [s % 3 === 0 ? 1 : 0, 0], transition: -1 },
    ]),
  };
  return synthesise(f, oneHotEncoding(f), { profile: DEFAULT_PROFILE });
}

/** An LGSynth'91 benchmark machine (tests/fixtures/lgsynth91/PROVENANCE.md), built with binary codes. */
function lgsynth91(name: string): Build {
  const a = analyse(readFileSync(new URL(`../../fixtures/lgsynth91/${name}.json`, import.meta.url), 'utf8'), name);
  if (!a.ok) throw new Error(`${name}: ${a.diagnostics.map((d) => d.message).join('; ')}`);
  const r = buildMachine(a, { encoding: 'binary', checks: false });
  if (!r.ok) throw new Error(`${name}: ${r.diagnostics.map((d) => d.message).join('; ')}`);
  return r.build;
}

/** Every cord branch the drawing must show as a line (a latch's own feedback is inside its box). */
function branchesOf(b: Build): string[] {
  const latchOf = new Map(
    b.netlist.parts.flatMap((p) => (p.kind === 'gate' && p.latch ? [[p.id, p.latch] as const] : [])),
  );
  const node = (id: string): string => latchOf.get(id) ?? id;
  return b.netlist.cords
    .flatMap((c) =>
      [...c.ports.map((p) => p.part), ...c.actuators]
        .filter((t) => node(t) !== node(c.driver))
        .map((t) => `${c.id}>${node(t)}`),
    )
    .sort();
}

/** The boxes the drawing must show: every part but a latch's two gates (drawn as the latch). */
const boxesOf = (b: Build): string[] =>
  b.netlist.parts
    .filter(
      (p) => !(p.kind === 'gate' && p.latch !== undefined && (p.role === 'latch-set' || p.role === 'latch-reset')),
    )
    .map((p) => p.id)
    .sort();

const layouts = new Map<Build, SchematicLayout>();
const layoutOf = (b: Build): SchematicLayout => {
  let l = layouts.get(b);
  if (!l) layouts.set(b, (l = schematicLayout(b)));
  return l;
};

describe('core/export/schematic-svg', () => {
  it('draws every example as well-formed SVG with every part and every cord branch', () => {
    for (const name of exampleNames()) {
      const b = example(name).build;
      const l = layoutOf(b);
      const svg = schematicSvg(b, l);
      expect(xmlProblems(svg), name).toEqual([]);
      expect(svg).toContain('xmlns="http://www.w3.org/2000/svg"');
      expect(svg).not.toMatch(/(href|src)=/);
      expect(l.nodes.map((n) => n.id).sort(), name).toEqual(boxesOf(b));
      expect(
        l.edges
          .filter((e) => e.style !== 'reads')
          .map((e) => `${e.cord}>${e.to}`)
          .sort(),
        name,
      ).toEqual(branchesOf(b));
      expect(overlappingPairs(l), name).toEqual([]);
    }
  });

  it('groups the master, transfer gates and slave of one state bit in one cluster', () => {
    const b = example('crossing.lw').build;
    const l = layoutOf(b);
    expect(l.clusters).toHaveLength(b.encoding.bits);
    for (let j = 0; j < b.encoding.bits; j++) {
      const c = l.clusters.find((k) => k.label === `state bit q${j}`);
      expect(c).toBeDefined();
      for (const id of [`m${j}`, `s${j}`, `tr${j}.set`, `tr${j}.reset`]) {
        const n = l.nodes.find((x) => x.id === id) as Box;
        const inside =
          c &&
          n.x - n.width / 2 >= c.x &&
          n.x + n.width / 2 <= c.x + c.width &&
          n.y - n.height / 2 >= c.y &&
          n.y + n.height / 2 <= c.y + c.height;
        expect(inside, `${id} in bit ${j}`).toBe(true);
      }
    }
  });

  it('flows left to right: a cord from an earlier stage to a later one points right', () => {
    for (const name of exampleNames()) {
      const b = example(name).build;
      const l = layoutOf(b);
      const stages = stagesOf(b.netlist);
      const at = new Map(l.nodes.map((n) => [n.id, n]));
      for (const e of l.edges) {
        const r1 = STAGE_RANK[stages.stage.get(e.from) ?? 'indicator'];
        const r2 = STAGE_RANK[stages.stage.get(e.to) ?? 'indicator'];
        if (r2 > r1)
          expect((at.get(e.to)?.x ?? 0) > (at.get(e.from)?.x ?? 0), `${name}: ${e.from} → ${e.to}`).toBe(true);
      }
    }
  });

  it('marks kinds in its own words and shows the lever glyph on levers', () => {
    const b = example('marble-bell.lw').build;
    const svg = schematicSvg(b, layoutOf(b));
    for (const words of [
      'operator lever',
      'clock lever',
      'reset lever',
      'φ1 term',
      'φ2 transfer',
      'Q · set',
      'Q̄ · reset',
      'state bit q0',
    ])
      expect(svg).toContain(words);
    expect(svg.match(/class="pivot"/g)).toHaveLength(4);
  });

  // Figures noted in docs/build-documents.md ("Schematic: size").
  it('stays usable at about 200 parts: no overlapping boxes, bounded size', () => {
    const b = ringBuild(17);
    expect(b.netlist.parts.length).toBeGreaterThanOrEqual(190);
    const l = layoutOf(b);
    expect(overlappingPairs(l)).toEqual([]);
    expect(l.width).toBeLessThan(4000);
    expect(l.height).toBeLessThan(8000);
    expect((l.width * l.height) / l.nodes.length).toBeLessThan(100_000);
    expect(xmlProblems(schematicSvg(b, l))).toEqual([]);
  });

  // Stored digests of the examples' drawings (binary codes, both palettes), reviewed when they
  // change: rewrite with LW_UPDATE_EXPECTED=1 npx vitest run tests/core/export/schematic-svg.test.ts
  it('draws every example exactly as the stored digests say (layered layout, both palettes)', () => {
    const drawings: Record<string, string> = {};
    for (const name of exampleNames()) {
      const b = example(name).build;
      expect(layoutOf(b).method, name).toBe('layered');
      for (const palette of ['paper', 'screen'] as const)
        drawings[`${name} ${palette}`] = schematicSvg(b, layoutOf(b), { palette });
    }
    expectStoredDigests('tests/fixtures/drawings/schematic-digests.json', drawings);
  });

  describe("past the layered layout's size bound", () => {
    // planet (LGSynth'91, 48 states, 7 inputs, 19 outputs): about 650 parts with binary codes.
    const b = lgsynth91('planet');
    const l = schematicLayout(b);

    it('lays the parts out in stage columns and says so on the drawing', () => {
      expect(b.netlist.parts.length).toBeGreaterThan(LAYERED_MAX_PARTS);
      expect(l.method).toBe('stage-columns');
      const svg = schematicSvg(b, l);
      expect(xmlProblems(svg)).toEqual([]);
      expect(svg).toContain('Laid out in stage columns');
      expect(svg).toContain('laid out in stage columns.</desc>');
    });

    it('draws every part as a box and every cord branch as a line, none of them empty', () => {
      expect(l.nodes.map((n) => n.id).sort()).toEqual(boxesOf(b));
      expect(
        l.edges
          .filter((e) => e.style !== 'reads')
          .map((e) => `${e.cord}>${e.to}`)
          .sort(),
      ).toEqual(branchesOf(b));
      const flagsReading = b.netlist.parts.filter((p) => p.kind === 'flag' && p.fixed === undefined).length;
      expect(l.edges.filter((e) => e.style === 'reads')).toHaveLength(flagsReading);
      for (const e of l.edges) expect(e.points.length, `${e.cord} ${e.from} → ${e.to}`).toBeGreaterThanOrEqual(2);
      const svg = schematicSvg(b, l);
      expect(svg.match(/class="box k-/g)?.length).toBe(l.nodes.length + 8); // + the legend's 8 swatches
      expect(svg.match(/<path d="[^"]*" class="e[ "]/g)?.length).toBe(l.edges.length + 4); // + the legend's 4 lines
    });

    it("keeps boxes apart, stages left to right, and each state bit's latches and transfers in its band", () => {
      expect(overlappingPairs(l)).toEqual([]);
      const stages = stagesOf(b.netlist);
      const rank = (id: string): number => STAGE_RANK[stages.stage.get(id) ?? 'indicator'];
      const right = new Map<number, number>();
      const left = new Map<number, number>();
      for (const n of l.nodes) {
        right.set(rank(n.id), Math.max(right.get(rank(n.id)) ?? -Infinity, n.x + n.width / 2));
        left.set(rank(n.id), Math.min(left.get(rank(n.id)) ?? Infinity, n.x - n.width / 2));
      }
      const ranks = [...left.keys()].sort((x, y) => x - y);
      for (let i = 1; i < ranks.length; i++)
        expect(left.get(ranks[i]) ?? 0).toBeGreaterThan(right.get(ranks[i - 1]) ?? 0);
      expect(l.clusters).toHaveLength(b.encoding.bits);
      for (let j = 0; j < b.encoding.bits; j++) {
        const c = l.clusters.find((k) => k.label === `state bit q${j}`) as Box & { x: number };
        for (const id of [`m${j}`, `s${j}`]) {
          const n = l.nodes.find((x) => x.id === id) as Box;
          expect(n.x - n.width / 2 >= c.x && n.x + n.width / 2 <= c.x + c.width, `${id} across`).toBe(true);
          expect(n.y - n.height / 2 >= c.y && n.y + n.height / 2 <= c.y + c.height, `${id} down`).toBe(true);
        }
      }
    });
  });
});
