/**
 * `latchwright compare FILE [--json]`: every named encoding side by side, the cheapest marked,
 * the text table and the JSON form telling the same story.
 */
import { beforeAll, describe, expect, it } from 'vitest';
import { ENCODINGS } from '../../src/core/phases/encode/index.js';
import { DEFAULT_PROFILE } from '../../src/core/physics/profile.js';
import { expectNoStack, run, runJson, type Run } from './support.js';

type Counts = { gates: number; latches: number; levers: number; capstans: number; weights: number; cords: number };
interface Row {
  strategy: string;
  ok: boolean;
  encoding?: { strategy: string; bits: number; codes: Record<string, string> };
  parts?: Counts;
  termGates?: number;
  cost?: number;
  cheapest: boolean;
  diagnostics: { code: string; message: string }[];
}
interface CompareJson {
  machine: string;
  encodings: Row[];
}

/** The weighted part count with the shipped cost weights, worked out here from the counts. */
const costOf = (p: Counts): number => {
  const w = DEFAULT_PROFILE.cost;
  return (
    p.gates * w.gate +
    p.latches * w.latch +
    p.levers * w.lever +
    p.capstans * w.capstan +
    p.weights * w.weight +
    p.cords * w.cord
  );
};

describe('cli/commands/compare', () => {
  const MB = 'examples/marble-bell.lw';
  let json: Run & { json: CompareJson };
  let text: Run;
  beforeAll(async () => {
    json = await runJson<CompareJson>(['compare', MB, '--json']);
    text = await run(['compare', MB]);
  });

  it('--json: one row per named encoding (pinned only when the machine pins codes), exit 0', () => {
    expect(json.code).toBe(0);
    expect(json.json.machine).toBe('marble_bell');
    expect(json.json.encodings.map((r) => r.strategy)).toEqual(ENCODINGS.filter((e) => e !== 'pinned'));
  });

  it('--json: each row has its codes by state, its parts and a cost that is the weighted part count', () => {
    for (const r of json.json.encodings) {
      expect(r.ok, r.strategy).toBe(true);
      expect(Object.keys(r.encoding!.codes).sort()).toEqual(['none', 'one', 'rung', 'two']);
      expect(new Set(Object.values(r.encoding!.codes)).size, r.strategy).toBe(4);
      for (const code of Object.values(r.encoding!.codes)) expect(code).toHaveLength(r.encoding!.bits);
      expect(r.cost).toBe(costOf(r.parts!));
    }
    // One-hot: a bit per state, so four bits and four latch pairs (DESIGN.md §5).
    const oneHot = json.json.encodings.find((r) => r.strategy === 'one-hot')!;
    expect(oneHot.encoding!.bits).toBe(4);
    expect(oneHot.parts!.latches).toBe(8);
    expect(Object.values(oneHot.encoding!.codes).every((c) => c.split('').filter((b) => b === '1').length === 1)).toBe(
      true,
    );
  });

  it('--json: exactly the rows of least cost are marked cheapest; auto is never dearer than binary', () => {
    const least = Math.min(...json.json.encodings.map((r) => r.cost!));
    for (const r of json.json.encodings) expect(r.cheapest, r.strategy).toBe(r.cost === least);
    const cost = (s: string): number => json.json.encodings.find((r) => r.strategy === s)!.cost!;
    expect(cost('auto')).toBeLessThanOrEqual(cost('binary'));
    expect(cost('auto')).toBe(least);
  });

  it('text: a header and one line per encoding with the same figures, the cheapest marked', () => {
    expect(text.code).toBe(0);
    const lines = text.out.trimEnd().split('\n');
    expect(lines[0]).toBe('marble_bell: 4 states after minimisation');
    expect(lines[1].split(/\s{2,}/)).toEqual([
      'encoding',
      'bits',
      'latches',
      'term gates',
      'gates',
      'levers',
      'capstans',
      'weights',
      'cords',
      'cost',
    ]);
    const body = lines.slice(2);
    expect(body).toHaveLength(json.json.encodings.length);
    json.json.encodings.forEach((r, i) => {
      const cells = body[i].split(/\s+/);
      const p = r.parts!;
      expect(cells.slice(0, 10)).toEqual(
        [
          r.strategy,
          r.encoding!.bits,
          p.latches,
          r.termGates,
          p.gates,
          p.levers,
          p.capstans,
          p.weights,
          p.cords,
          r.cost,
        ].map(String),
      );
      expect(body[i].endsWith('← cheapest'), r.strategy).toBe(r.cheapest);
    });
    expectNoStack(text);
  });

  it('an encoding that does not fit is shown with its reason, in both forms', async () => {
    // One state: no state bits, and Johnson codes need a ring of at least two states.
    const j = await runJson<CompareJson>(['compare', 'examples/odd-lever.lw', '--json']);
    expect(j.code).toBe(0);
    const johnson = j.json.encodings.find((r) => r.strategy === 'johnson')!;
    expect(johnson.ok).toBe(false);
    expect(johnson.cheapest).toBe(false);
    expect(johnson.diagnostics.map((d) => d.code)).toEqual(['LW701']);
    const t = await run(['compare', 'examples/odd-lever.lw']);
    expect(t.out).toContain('odd_lever: 1 state after minimisation\n');
    expect(t.out).toMatch(
      new RegExp(`^johnson\\s+—\\s+${johnson.diagnostics[0].message.replace(/[.*+?^${}()|[\]\\]/g, '\\$&')}$`, 'm'),
    );
  });

  it('a machine with pinned codes gets a pinned row', async () => {
    const pinned = [
      'machine pinned_toggle',
      'inputs t',
      'outputs lit',
      'start off',
      'state off code 01',
      '  when t go on',
      'state on code 10 with lit=1',
      '  when t go off',
      '',
    ].join('\n');
    const j = await runJson<CompareJson>(['compare', 'pinned.lw', '--json'], { 'pinned.lw': pinned });
    expect(j.code).toBe(0);
    const row = j.json.encodings.find((r) => r.strategy === 'pinned')!;
    expect(row.ok).toBe(true);
    expect(row.encoding!.codes).toEqual({ off: '01', on: '10' });
  });
});
