/**
 * Stored expected outputs for whole builds of the example machines (examples/*.lw, our own
 * invented exhibits), built as `latchwright build FILE` builds them: default encoding (auto),
 * default seed, shipped profile. Each build is summarised — machine counts, merges, encoding,
 * part counts, guard, equations (terms in cube order), the frame (how the bays were ordered,
 * each drum's length and bays, the cord to cut against the netlist order, to the centimetre),
 * check names and ok flags; not the netlist, not timings — and compared exactly with
 * tests/fixtures/expected/<name>.json.
 *
 * When a change to the pipeline changes a build on purpose, rewrite the stored files with
 *   LW_UPDATE_EXPECTED=1 npx vitest run tests/core/examples.test.ts
 * and review the diff before committing: these files are reviewed whenever they change (a
 * larger part count or a different equation must be explained by the change that caused it).
 */
import { existsSync, mkdirSync, readdirSync, readFileSync, writeFileSync } from 'node:fs';
import { describe, expect, it } from 'vitest';
import { analyse, buildMachine, type Built } from '../../src/core/pipeline.js';
import { printCubes } from '../../src/core/forms/expr.js';

const EXAMPLES = readdirSync('examples')
  .filter((f) => f.endsWith('.lw'))
  .map((f) => f.slice(0, -3))
  .sort();
const EXPECTED_DIR = 'tests/fixtures/expected';
const UPDATE = process.env.LW_UPDATE_EXPECTED === '1';

const cm = (m: number): number => Math.round(m * 100) / 100;

/** The part of a build that is stored: everything a reviewer can judge by eye. */
function summary(b: Built) {
  const a = b.analysed;
  const f = b.build.machine;
  return {
    machine: {
      name: a.machine.name,
      states: a.machine.states.length,
      reachable: a.machine.states.length - a.minimised.unreachable.length,
      minimized: f.states.length,
      inputs: a.machine.inputs,
      outputs: a.machine.outputs,
    },
    merged: a.minimised.merged,
    encoding: {
      strategy: b.build.encoding.strategy,
      bits: b.build.encoding.bits,
      codes: Object.fromEntries(f.states.map((s, i) => [s, b.build.encoding.codes[i]])),
    },
    parts: b.build.parts,
    guard: {
      ok: b.build.guard.ok,
      method: b.build.guard.method,
      extraGates: b.build.guard.extraGates,
      extraCords: b.build.guard.extraCords,
    },
    // Terms in cube order, so that a change of term order alone (no change of logic) leaves the file alone.
    equations: b.build.equations.map((e) => ({
      name: e.name,
      expr: e.terms.length === 0 ? '0' : printCubes([...e.terms].sort(), b.build.vars),
    })),
    frame: {
      method: b.placement.method,
      drums: b.placement.drums.map((d) => ({ lengthM: cm(d.lengthM), bays: d.bays.length })),
      totalCordM: cm(b.placement.totalCordM),
      baselineCordM: cm(b.placement.baselineCordM),
      pulleys: b.placement.pulleys,
    },
    checks: b.checks.map((c) => ({ name: c.name, ok: c.ok })),
    diagnostics: b.diagnostics.filter((d) => d.severity !== 'info').map((d) => d.code),
  };
}

function buildExample(name: string): Built {
  const file = `examples/${name}.lw`;
  const a = analyse(readFileSync(file, 'utf8'), file);
  if (!a.ok) throw new Error(`${file} does not analyse: ${a.diagnostics.map((d) => d.message).join('; ')}`);
  const b = buildMachine(a);
  if (!b.ok) throw new Error(`${file} does not build: ${b.diagnostics.map((d) => d.message).join('; ')}`);
  return b;
}

describe('core/pipeline on the examples (stored expected builds)', () => {
  it('has an example to check', () => {
    expect(EXAMPLES.length).toBeGreaterThanOrEqual(5);
  });

  for (const name of EXAMPLES) {
    it(`${name}: the whole build matches tests/fixtures/expected/${name}.json`, () => {
      const got = summary(buildExample(name));
      const path = `${EXPECTED_DIR}/${name}.json`;
      if (UPDATE) {
        mkdirSync(EXPECTED_DIR, { recursive: true });
        writeFileSync(path, JSON.stringify(got, null, 2) + '\n', 'utf8');
      }
      expect(
        existsSync(path),
        `${path} is missing: run LW_UPDATE_EXPECTED=1 npx vitest run tests/core/examples.test.ts and review it`,
      ).toBe(true);
      expect(got).toEqual(JSON.parse(readFileSync(path, 'utf8')));
      // Every stored build is a good one: a failing check is never the expected output.
      expect(got.checks.every((c) => c.ok)).toBe(true);
      expect(got.guard.ok).toBe(true);
      // The layout check is among them, and the placed frame is never longer in cord than the netlist's own order.
      expect(got.checks.map((c) => c.name)).toContain('layout');
      expect(got.frame.totalCordM).toBeLessThanOrEqual(got.frame.baselineCordM);
    });
  }

  it('stores no expected file for an example that no longer exists', () => {
    const stored = readdirSync(EXPECTED_DIR)
      .filter((f) => f.endsWith('.json'))
      .map((f) => f.slice(0, -5))
      .sort();
    expect(stored).toEqual(EXAMPLES);
  });
});
