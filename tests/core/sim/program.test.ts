import { describe, expect, it } from 'vitest';
import type { Build } from '../../../src/core/model/build.js';
import { heldProgram, moveProgram } from '../../../src/core/sim/program.js';
import { simFor } from '../../../src/core/sim/part.js';
import { exampleBuild, exampleNames } from '../checks/builds.js';
import { latchBuild } from './handmade.js';

const timing = { stageDelayS: 0.25 };
const PHI1 = 1;
const PHI2 = 2;

/** The bare latch with its set port fed by NAND(s, NOT s): a gate reached by both directions of lever s, into a latch. */
function glitchIntoLatch(): Build {
  const b = latchBuild();
  return {
    ...b,
    netlist: {
      parts: [
        ...b.netlist.parts,
        { kind: 'gate', id: 'g', name: 'g', role: 'inverter', ports: [{ name: 'a' }, { name: 'b' }] },
      ],
      cords: [
        ...b.netlist.cords.filter((c) => c.id !== 'c3'),
        { id: 'c7', driver: 'in_s', ports: [{ part: 'g', port: 'a' }], actuators: [] },
        { id: 'c8', driver: 'inv_s', ports: [{ part: 'g', port: 'b' }], actuators: [] },
        { id: 'c9', driver: 'g', ports: [{ part: 'L.set', port: 's' }], actuators: [] },
      ],
    },
  };
}

describe('core/sim/program', () => {
  it.each(exampleNames())('gives every move of the hand procedure a program on %s', (name) => {
    const sim = simFor(exampleBuild(name).build, timing);
    const moves: [number, number][] = [
      [sim.phi1, 0],
      [sim.phi1, PHI1],
      [sim.phi2, 0],
      [sim.phi2, PHI2],
      [sim.reset, 0],
      ...Array.from(sim.inputLevers, (d): [number, number] => [d, 0]),
    ];
    for (const [d, ctrl] of moves) {
      if (d < 0) continue;
      const p = moveProgram(sim, d, ctrl);
      expect({ lever: sim.names[d], fast: p.fast, why: p.why }).toEqual({
        lever: sim.names[d],
        fast: true,
        why: undefined,
      });
    }
    expect(heldProgram(sim).fast).toBe(true);
  });

  it('orders a move topologically: a gate after the gates it reads, a latch after its ports', () => {
    const sim = simFor(exampleBuild('crossing').build, timing);
    const p = moveProgram(sim, sim.phi1, 0);
    const at = new Map<number, number>();
    p.steps.forEach((s, i) => {
      if (s >= 0) at.set(s, i);
      else {
        at.set(sim.latches[~s].set, i);
        at.set(sim.latches[~s].reset, i);
      }
    });
    p.steps.forEach((s, i) => {
      const reads =
        s >= 0
          ? sim.inputs.subarray(sim.inStart[s], sim.inStart[s + 1])
          : [...sim.latches[~s].sBar, ...sim.latches[~s].rBar];
      for (const d of reads) expect(at.get(d) ?? -1).toBeLessThan(i);
    });
    // φ1 pulled reaches the term gates and the masters, never a slave (φ2 released holds the transfer gates).
    const slaves = new Set(Array.from(sim.slaves));
    expect(p.steps.some((s) => s < 0 && slaves.has(~s))).toBe(false);
  });

  it('gives no program where the master–slave loop closes (φ1 and φ2 pulled together)', () => {
    const sim = simFor(exampleBuild('crossing').build, timing);
    const p = moveProgram(sim, sim.phi2, PHI1);
    expect(p).toMatchObject({ fast: false, why: 'the gates it moves form a loop that is not a latch' });
  });

  it('gives no program where a glitch could reach a latch', () => {
    const sim = simFor(glitchIntoLatch(), timing);
    const s = sim.inputLevers[0];
    expect(moveProgram(sim, s, 0)).toMatchObject({
      fast: false,
      why: 'a port of latch L is reached by both directions',
    });
    // The plain latch: lever s → inverter → S̄ has a program.
    const plain = simFor(latchBuild(), timing);
    expect(moveProgram(plain, plain.inputLevers[0], 0).fast).toBe(true);
  });

  it('lists the gates that may glitch but reach no latch (output decoding)', () => {
    const sim = simFor(exampleBuild('crossing').build, timing);
    const p = moveProgram(sim, sim.phi2, 0);
    expect(p.fast).toBe(true);
    for (const g of p.binate) expect(sim.latchOf[g]).toBe(-1);
  });
});
