/**
 * The frame's lever stands against the part-level simulator (src/core/sim) and the trial run's
 * own drawing of the same levers (src/web/elements/lever-bank.ts: an operator lever is down
 * while pulled; a latch holding 1 has its set side down and its reset side up). The physical
 * rule checked across every lever (the netlist model, src/core/model/netlist.ts): a gate's Z
 * lever is the AND of its ports, so with nothing undetermined it is down exactly when one of
 * its port levers is down.
 */
import { describe, expect, it } from 'vitest';
import { readFileSync } from 'node:fs';
import { fileURLToPath } from 'node:url';
import { analyse, buildMachine, type Built } from '../../../src/core/pipeline.js';
import { createRunner } from '../../../src/core/sim/runner.js';
import { timingOf } from '../../../src/core/sim/part.js';
import { clockActions, phaseActions, resetActions } from '../../../src/core/sim/hand.js';
import { leverStands, leversDown, type Stand, type Stands } from '../../../src/web/frame/stands.js';

function builtExample(file: string): Built {
  const a = analyse(readFileSync(fileURLToPath(new URL(`../../../examples/${file}`, import.meta.url)), 'utf8'), file);
  if (!a.ok) throw new Error('the example must read');
  const b = buildMachine(a);
  if (!b.ok) throw new Error('the example must build');
  return b;
}

const standOf = (v: string): Stand => (v === '1' ? 'down' : v === '0' ? 'up' : 'X');

function stand(s: Stands, part: string, lever: string): Stand | undefined {
  return s.get(part)?.get(lever);
}

describe('src/web/frame/stands', () => {
  const b = builtExample('marble-bell.lw');
  const runner = createRunner(b.build, timingOf(b.profile));
  const now = (): Stands => leverStands(b.build.netlist, b.placement.bays, runner.sim.ids, runner.state.values);
  const parts = b.build.netlist.parts;

  /** The trial run's lever drawings (lever-bank.ts) for the operator levers and the latch sides. */
  function agreesWithTheTrialRun(s: Stands): void {
    const r = runner.reading();
    for (const p of parts) {
      if (p.kind === 'lever') {
        const pulled = p.role === 'input' ? r.inputs[p.input ?? ''] === 1 : r[p.role];
        expect(stand(s, p.id, 'lever'), p.id).toBe(pulled ? 'down' : 'up');
      }
      if (p.kind === 'latch') {
        const l = r.latches.find((x) => x.name === p.name);
        if (!l) throw new Error(`no reading of ${p.name}`);
        expect(stand(s, p.setGate, 'Z'), `${p.name} set side`).toBe(standOf(l.q));
        expect(stand(s, p.resetGate, 'Z'), `${p.name} reset side`).toBe(standOf(l.qBar));
      }
    }
  }

  /** Z = AND of the ports (lever up = 1): with nothing undetermined, Z is down exactly when a port lever is. */
  function zFollowsItsPorts(s: Stands): void {
    for (const p of parts) {
      if (p.kind !== 'gate' || p.ports.length < 2) continue;
      const ports = p.ports.map((q) => stand(s, p.id, q.name));
      if (ports.includes('X') || stand(s, p.id, 'Z') === 'X') continue;
      expect(stand(s, p.id, 'Z') === 'down', p.id).toBe(ports.includes('down'));
    }
  }

  it('gives every lever of every bay a stand, and leaves the latches undetermined at power-up', () => {
    const s = now();
    for (const bay of b.placement.bays)
      for (const l of bay.levers) if (l.name !== 'exit') expect(stand(s, bay.part, l.name), bay.part).toBeDefined();
    for (const p of parts) if (p.kind === 'latch') expect(stand(s, p.setGate, 'Z')).toBe('X');
  });

  it('agrees with the trial run and with the Z–port coupling after reset, through clocks, and with φ1 held', () => {
    for (const a of resetActions()) runner.act(a);
    agreesWithTheTrialRun(now());
    zFollowsItsPorts(now());
    for (const marble of [1, 1, 0, 1, 1]) {
      for (const a of clockActions(['marble'], { marble: marble as 0 | 1 })) {
        runner.act(a);
        const s = now();
        agreesWithTheTrialRun(s);
        zFollowsItsPorts(s);
      }
    }
    runner.act(phaseActions()[0]);
    expect(leversDown(now())).toContain(`${parts.find((p) => p.kind === 'lever' && p.role === 'phi1')?.id} lever`);
  });

  it('changes which levers are down from one clock to the next', () => {
    for (const a of resetActions()) runner.act(a);
    const before = leversDown(now());
    for (const a of clockActions(['marble'], { marble: 1 })) runner.act(a);
    expect(leversDown(now())).not.toEqual(before);
  });
});
