/**
 * Helpers for the placement tests: random netlists of a given number of bays (seeded), and an
 * independent brute force over every order of the bays that measures the cord along the
 * channel (design §11's cord trees) from positions computed here, not by the module under test.
 */
import { analyse, buildMachine } from '../../../../src/core/pipeline.js';
import type { Cord, GatePart, LatchPart, LeverPart, Netlist, Part } from '../../../../src/core/model/netlist.js';
import { seededRandom, type Random } from '../../../../src/core/model/random.js';
import type { Profile } from '../../../../src/core/physics/profile.js';

/** The netlist of a machine built as `latchwright build` builds it, checks skipped (for tests and the benchmark). */
export function buildNetlist(text: string, file: string, encoding: 'auto' | 'binary' = 'auto'): Netlist {
  const a = analyse(text, file);
  if (!a.ok) throw new Error(`${file}: ${a.diagnostics.map((d) => d.message).join('; ')}`);
  const b = buildMachine(a, { encoding, checks: false });
  if (!b.ok) throw new Error(`${file}: ${b.diagnostics.map((d) => d.message).join('; ')}`);
  return b.build.netlist;
}

/** A random netlist with exactly `bays` bays: levers, one- to three-port gates, latches, sometimes an actuator. */
export function randomNetlist(seed: number, bays: number): Netlist {
  const rng = seededRandom(seed);
  const parts: Part[] = [];
  const drivers: string[] = [];
  const ports: { part: string; port: string }[] = [];
  let left = bays;
  const roles = ['input', 'phi1', 'phi2', 'reset'] as const;
  const levers = Math.min(left - 1, rng.int(3));
  for (let i = 0; i < levers; i++) {
    const id = `lv${i}`;
    parts.push({ kind: 'lever', id, name: id, role: roles[rng.int(roles.length)] } satisfies LeverPart);
    drivers.push(id);
    left--;
  }
  const feedback: Cord[] = [];
  let latches = 0;
  while (left >= 3 && rng.next() < 0.4) {
    const id = `m${latches++}`;
    const set: GatePart = gateOf(`${id}.set`, ['s1', 'fb'], 'latch-set', id);
    const reset: GatePart = gateOf(`${id}.reset`, ['r1', 'fb'], 'latch-reset', id);
    parts.push({
      kind: 'latch',
      id,
      name: id,
      role: 'master',
      bit: 0,
      setGate: set.id,
      resetGate: reset.id,
    } satisfies LatchPart);
    parts.push(set, reset);
    drivers.push(set.id, reset.id);
    ports.push({ part: set.id, port: 's1' }, { part: reset.id, port: 'r1' });
    feedback.push(
      { id: `c.${set.id}`, driver: set.id, ports: [{ part: reset.id, port: 'fb' }], actuators: [] },
      { id: `c.${reset.id}`, driver: reset.id, ports: [{ part: set.id, port: 'fb' }], actuators: [] },
    );
    left -= 2;
  }
  const actuator = left >= 2 && rng.next() < 0.3;
  if (actuator) {
    parts.push({ kind: 'actuator', id: 'act', name: 'act', output: 'o', loadG: 50 });
    left--;
  }
  for (let g = 0; left > 0; g++, left--) {
    const names = ['a', 'b', 'c'].slice(0, 1 + rng.int(3));
    const gate = gateOf(`g${g}`, names, 'term');
    parts.push(gate);
    drivers.push(gate.id);
    for (const n of names) ports.push({ part: gate.id, port: n });
  }
  return { parts, cords: [...feedback, ...randomCords(rng, drivers, ports, actuator, feedback)] };
}

function gateOf(id: string, ports: string[], role: GatePart['role'], latch?: string): GatePart {
  return { kind: 'gate', id, name: id, role, ports: ports.map((name) => ({ name })), ...(latch ? { latch } : {}) };
}

function randomCords(
  rng: Random,
  drivers: readonly string[],
  ports: readonly { part: string; port: string }[],
  actuator: boolean,
  feedback: readonly Cord[],
): Cord[] {
  const out: Cord[] = [];
  const fed = new Set(feedback.map((c) => c.driver));
  drivers.forEach((d, i) => {
    const own = ports.filter((p) => p.part !== d);
    const k = own.length === 0 ? 0 : rng.int(4);
    const picked = new Map<string, { part: string; port: string }>();
    for (let j = 0; j < k; j++) {
      const p = own[rng.int(own.length)];
      picked.set(`${p.part}.${p.port}`, p);
    }
    const acts = actuator && i === 0 ? ['act'] : [];
    if (picked.size + acts.length === 0) return;
    out.push({ id: fed.has(d) ? `c.${d}.x` : `c.${d}`, driver: d, ports: [...picked.values()], actuators: acts });
  });
  return out;
}

/** Bays of a netlist as the brute force sees them (its own reading of design §11). */
interface BruteBay {
  readonly part: string;
  readonly width: number;
  readonly levers: readonly string[];
  readonly latch?: string;
  readonly zone: number;
}

function bruteBays(n: Netlist, profile: Profile): BruteBay[] {
  const f = profile.frame;
  // A capstan's own turns (a gate's `wraps`, else the profile's); a part that pulls no cord has none.
  const drivers = new Set(n.cords.map((c) => c.driver));
  const capstanOf = (p: Part): number =>
    drivers.has(p.id)
      ? (p.kind === 'gate' && p.wraps !== undefined ? p.wraps : profile.wraps) * profile.wrapPitchM + f.bayClearanceM
      : 0;
  const out: BruteBay[] = [];
  for (const p of n.parts) {
    if (p.kind === 'gate') {
      const levers = p.ports.length === 1 ? [p.ports[0].name] : [...p.ports.map((x) => x.name), 'Z'];
      out.push({
        part: p.id,
        width: Math.max(levers.length * f.leverPitchM, capstanOf(p)),
        levers,
        latch: p.latch,
        zone: 1,
      });
    } else if (p.kind === 'lever')
      out.push({
        part: p.id,
        width: Math.max(f.leverPitchM, capstanOf(p)),
        levers: ['lever'],
        zone: p.role === 'input' ? 0 : 2,
      });
    else if (p.kind === 'actuator' && p.fixed === undefined)
      out.push({
        part: p.id,
        width: Math.max(f.leverPitchM, f.pulleyDiameterM + f.bayClearanceM),
        levers: ['exit'],
        zone: 0,
      });
  }
  return out;
}

function permutations<T>(xs: readonly T[], visit: (p: readonly T[]) => void): void {
  const a = [...xs];
  const c = new Array<number>(a.length).fill(0);
  visit(a);
  // Heap's algorithm (B. R. Heap, "Permutations by interchanges", The Computer Journal 6, 1963).
  for (let i = 1; i < a.length;) {
    if (c[i] < i) {
      const j = i % 2 === 0 ? 0 : c[i];
      [a[j], a[i]] = [a[i], a[j]];
      visit(a);
      c[i]++;
      i = 1;
    } else c[i++] = 0;
  }
}

/**
 * Channel length on one drum, by design §11's cord runs: a cord that leaves its bay splits at
 * knots in the channel, so its run along the channel is the span from its capstan to the
 * furthest lever it pulls on either side; a cord all of whose levers are in its own bay rises
 * straight and has none. `capstan` by part, `lever` by `part.lever` (an actuator's: `id.exit`).
 */
function spans(n: Netlist, capstan: ReadonlyMap<string, number>, lever: ReadonlyMap<string, number>): number {
  let s = 0;
  for (const c of n.cords) {
    if (c.actuators.length === 0 && c.ports.every((p) => p.part === c.driver)) continue;
    const xs = [
      capstan.get(c.driver) as number,
      ...c.ports.map((p) => lever.get(`${p.part}.${p.port}`) as number),
      ...c.actuators.map((a) => lever.get(`${a}.exit`) as number),
    ];
    s += Math.max(...xs) - Math.min(...xs);
  }
  return s;
}

/** Channel length of one order of bays (`spans`), positions worked out here from the widths. */
export function channelOf(n: Netlist, order: readonly BruteBay[]): number {
  const capstan = new Map<string, number>();
  const lever = new Map<string, number>();
  let x = 0;
  for (const b of order) {
    capstan.set(b.part, x + b.width / 2);
    b.levers.forEach((name, i) => lever.set(`${b.part}.${name}`, x + ((i + 0.5) * b.width) / b.levers.length));
    x += b.width;
  }
  return spans(n, capstan, lever);
}

/** The least channel length over every order of the bays that keeps latches together and the end rules. */
export function bruteForceChannel(n: Netlist, profile: Profile): number {
  const bays = bruteBays(n, profile);
  let best = Infinity;
  permutations(bays, (order) => {
    for (let i = 0; i < order.length; i++) {
      const l = order[i].latch;
      if (l !== undefined && order[i - 1]?.latch !== l && order[i + 1]?.latch !== l) return;
      if (i > 0 && order[i].zone < order[i - 1].zone) return;
    }
    best = Math.min(best, channelOf(n, order));
  });
  return best;
}

/** A netlist's channel length in its own order, with the end rules applied (the baseline, measured here). */
export function netlistOrderChannel(n: Netlist, profile: Profile): number {
  const bays = bruteBays(n, profile);
  return channelOf(
    n,
    [...bays].sort((a, b) => a.zone - b.zone),
  );
}

/** The same measure read from a placement's published positions (one drum): each bay's centre and its levers. */
export function placedChannel(
  n: Netlist,
  bays: readonly { part: string; xM: number; levers: readonly { name: string; xM: number }[] }[],
): number {
  const order = [...bays].sort((a, b) => a.xM - b.xM);
  const capstan = new Map(order.map((b) => [b.part, b.xM]));
  const lever = new Map(order.flatMap((b) => b.levers.map((l) => [`${b.part}.${l.name}`, l.xM] as const)));
  return spans(n, capstan, lever);
}
