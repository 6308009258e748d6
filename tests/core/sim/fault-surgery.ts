/**
 * The independent reference for the fault simulation: a fault made by netlist surgery on a
 * copy of the build (a slack cord or an untied branch taken off its ports and actuators, a
 * taut cord given to a new gate with no cord on its port, whose Z is always up so its cord
 * always pulls), stepped by the event-driven part simulator (`stepPart` with `trace`) and
 * read as a person reads it (`readPart`: each latch's Q and Q̄, each output).
 */
import type { Build } from '../../../src/core/model/build.js';
import type { Cord, GatePart } from '../../../src/core/model/netlist.js';
import { DEFAULT_PROFILE } from '../../../src/core/physics/profile.js';
import type { CordFault } from '../../../src/core/sim/faults.js';
import type { HandAction } from '../../../src/core/sim/hand.js';
import { powerUp, readPart, simFor, stepPart, timingOf, type PartReading } from '../../../src/core/sim/part.js';

/** A copy of the build with the fault made by hand in its netlist. */
export function withFault(build: Build, fault: CordFault): Build {
  const net = build.netlist;
  const untie = (c: Cord): Cord => ({
    ...c,
    ports: c.ports.filter((p) => !(fault.tie?.part === p.part && fault.tie.port === p.port)),
    actuators: c.actuators.filter((a) => !(fault.tie?.part === a && fault.tie.port === '')),
  });
  const jam: GatePart = { kind: 'gate', id: 'surgery-jam', name: 'jam', role: 'buffer', ports: [{ name: 'a' }] };
  const cords = net.cords.map((c): Cord => {
    if (c.id !== fault.cord) return c;
    if (fault.kind === 'slack') return { ...c, ports: [], actuators: [] };
    if (fault.kind === 'untied') return untie(c);
    return { ...c, driver: jam.id };
  });
  return { ...build, netlist: { parts: fault.kind === 'taut' ? [...net.parts, jam] : net.parts, cords } };
}

/** What a person reads after every row: per latch Q and Q̄, then every output ('0', '1' or 'X'). */
export function readingsThrough(build: Build, rows: readonly (readonly HandAction[])[]): string[][] {
  const timing = timingOf(DEFAULT_PROFILE);
  const sim = simFor(build, timing);
  let [state] = powerUp(sim);
  return rows.map((actions) => {
    for (const a of actions) [state] = stepPart(build, state, a, { timing, trace: true });
    return flat(readPart(sim, state), build.machine.outputs);
  });
}

function flat(r: PartReading, outputs: readonly string[]): string[] {
  return [...r.latches.flatMap((l) => [l.q, l.qBar]), ...outputs.map((o) => r.outputs[o])];
}

/** The first row (from 0) where a value is 0/1 in both readings and differs, or -1. */
export function firstShown(good: readonly string[][], bad: readonly string[][]): number {
  return good.findIndex((g, i) => g.some((v, k) => v !== 'X' && bad[i][k] !== 'X' && v !== bad[i][k]));
}

/**
 * A partly built machine made by hand in a copy of the build's netlist: only the parts in
 * `mounted` are kept, and of the cords only the branches in `tied` (`cord|part|port`, port ''
 * for an actuator); the signal map and the machine's outputs keep only what is mounted, so the
 * part-level simulator compiles exactly what stands on the frame.
 */
export function partialMachine(build: Build, mounted: ReadonlySet<string>, tied: ReadonlySet<string>): Build {
  const net = build.netlist;
  const parts = net.parts.filter((p) => mounted.has(p.id));
  const cords = net.cords
    .filter((c) => mounted.has(c.driver))
    .map((c): Cord => ({
      ...c,
      ports: c.ports.filter((p) => tied.has(`${c.id}|${p.part}|${p.port}`)),
      actuators: c.actuators.filter((a) => tied.has(`${c.id}|${a}|`)),
    }));
  const sig = build.signals;
  const shown = build.machine.outputs.filter((o) => {
    const reader = net.parts.find((p) => p.id === sig.outputs[o]);
    return (
      reader !== undefined &&
      mounted.has(reader.id) &&
      (reader.kind !== 'flag' || reader.fixed !== undefined || mounted.has(reader.gate))
    );
  });
  return {
    ...build,
    machine: { ...build.machine, outputs: shown },
    netlist: { parts, cords },
    signals: {
      ...sig,
      masters: sig.masters.filter((l) => mounted.has(l)),
      slaves: sig.slaves.filter((l) => mounted.has(l)),
      outputs: Object.fromEntries(shown.map((o) => [o, sig.outputs[o]])),
    },
  };
}
