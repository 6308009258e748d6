/**
 * `latchwright build FILE [--json]`: the report's blocks, the checks it names, the drive check's
 * figures, and what a technology profile with a low drum friction does (buffers, or a failed
 * drive check naming the weak cord, exit 1).
 */
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { DEFAULT_PROFILE } from '../../src/core/physics/profile.js';
import {
  EXAMPLES,
  examplePath,
  expectNoStack,
  readText,
  run,
  runJson,
  removeTempDirs,
  tempDir,
  writeTemp,
  type Run,
} from './support.js';

interface Check {
  name: string;
  ok: boolean;
  summary: string;
  [k: string]: unknown;
}
interface Part {
  kind: string;
  id: string;
  role?: string;
}
interface Report {
  machine: { name: string; states: number; reachable: number; minimized: number; inputs: number; outputs: number };
  merged: Record<string, string>;
  encoding: { strategy: string; bits: number; codes: Record<string, string> };
  parts: { gates: number; latches: number; levers: number; capstans: number; weights: number; cords: number };
  guard: { ok: boolean; extraGates: number; extraCords: number; method: string };
  equations: { name: string; expr: string }[];
  netlist: { parts: Part[]; cords: { id: string; driver: string; ports: unknown[]; actuators: unknown[] }[] };
  checks: Check[];
  ok: boolean;
  bom: { item: string; kind: string; count: number }[];
  commissioning: {
    faults: number;
    collapsed: number;
    simulated: number;
    sampled: boolean;
    shown: number;
    tourClocks: number;
    extraClocks: number;
    total: { faults: number; tour: number; extra: number; may: number; never: number; open: number };
    byKind: Record<'slack' | 'taut' | 'untied', { faults: number; tour: number; extra: number }>;
  };
  layout: {
    method: string;
    exact: boolean;
    drums: { lengthM: number; bays: number }[];
    totalCordM: number;
    baselineCordM: number;
    channelM: number;
    baselineChannelM: number;
    pulleys: number;
  };
  diagnostics: unknown[];
}

/** vitest's "any value of this type" matchers (typed any by vitest), held as unknown. */
const aNumber: unknown = expect.any(Number);
const aString: unknown = expect.any(String);

const CHECK_NAMES = [
  'forbidden-input',
  'next-state-equivalence',
  'equivalence',
  'recovery',
  'timing',
  'drive',
  'layout',
];
const MB = 'examples/marble-bell.lw';
const LOCK = 'examples/sequence-lock.lw';

afterAll(removeTempDirs);

describe('cli/commands/build --json', () => {
  let r: Run & { json: Report };
  beforeAll(async () => {
    r = await runJson<Report>(['build', MB, '--encoding', 'binary', '--json']);
  });

  it('exits 0 with every block of the report', () => {
    expect(r.code).toBe(0);
    expect(r.err).toBe('');
    expect(Object.keys(r.json)).toEqual(
      expect.arrayContaining([
        'machine',
        'merged',
        'encoding',
        'parts',
        'guard',
        'equations',
        'netlist',
        'checks',
        'ok',
        'bom',
      ]),
    );
    expect(r.json.machine).toMatchObject({
      name: 'marble_bell',
      states: 4,
      reachable: 4,
      minimized: 4,
      inputs: 1,
      outputs: 1,
    });
    expect(r.json.ok).toBe(true);
  });

  // Coverage as properties only (docs/methods/faults.md): the figures add up, and the clocks
  // added never lose a fault the tour showed.
  it('commissioning: the coverage of cord faults by the sheet, by kind, adding up', () => {
    const c = r.json.commissioning;
    expect(c.sampled).toBe(false);
    expect(c.simulated).toBe(c.collapsed);
    expect(c.collapsed).toBeLessThanOrEqual(c.faults);
    expect(c.shown).toBe(c.total.tour + c.total.extra);
    expect(c.shown).toBeGreaterThanOrEqual(c.total.tour);
    expect(c.total.tour + c.total.extra + c.total.never + c.total.open).toBe(c.total.faults);
    const kinds = Object.values(c.byKind);
    expect(kinds.reduce((a, k) => a + k.faults, 0)).toBe(c.total.faults);
    expect(c.extraClocks > 0).toBe(c.total.extra > 0);
  });

  it('encoding: strategy, bits and one code per state (binary counts in state order)', () => {
    expect(r.json.encoding).toEqual({
      strategy: 'binary',
      bits: 2,
      codes: { none: '00', one: '01', two: '10', rung: '11' },
    });
  });

  it('equations: the bell decodes exactly the code of rung (Moore output, all four codes used)', () => {
    expect(r.json.equations.map((e) => e.name)).toEqual(['S0', 'R0', 'S1', 'R1', 'bell']);
    expect(r.json.equations.find((e) => e.name === 'bell')?.expr).toBe('q0 & q1');
  });

  it('parts agree with the netlist and with the build rules of DESIGN.md §3 and §5', () => {
    const { parts, netlist } = r.json;
    const kind = (k: string): Part[] => netlist.parts.filter((p) => p.kind === k);
    expect(parts.gates).toBe(kind('gate').length);
    expect(parts.latches).toBe(kind('latch').length);
    expect(parts.levers).toBe(kind('lever').length);
    // Cords are counted by branch: one per tie of a driver's cord to a port or an actuator.
    expect(parts.cords).toBe(netlist.cords.reduce((n, c) => n + c.ports.length + c.actuators.length, 0));
    // A master and a slave latch per state bit; one lever per input plus φ1, φ2 and reset.
    expect(parts.latches).toBe(2 * r.json.encoding.bits);
    expect(parts.levers).toBe(r.json.machine.inputs + 3);
    // Every gate and lever whose output pulls a cord works its own capstan (DESIGN.md §3: a
    // flag reads Z unbuffered, so a gate only a flag reads needs none); the BOM counts the same.
    const driving = new Set(netlist.cords.map((c) => c.driver));
    expect(parts.capstans).toBe(netlist.parts.filter((p) => p.kind !== 'latch' && driving.has(p.id)).length);
    expect(r.json.bom.filter((b) => b.kind === 'capstan').reduce((n, b) => n + b.count, 0)).toBe(parts.capstans);
    // Each latch is two gates of the gate count.
    expect(netlist.parts.filter((p) => p.role === 'latch-set' || p.role === 'latch-reset')).toHaveLength(
      2 * parts.latches,
    );
  });

  it('guard: proven, with its cost over an unguarded build', () => {
    expect(r.json.guard).toMatchObject({
      ok: true,
      extraGates: aNumber,
      extraCords: aNumber,
      method: aString,
    });
    expect(r.json.guard.extraGates).toBeGreaterThanOrEqual(0);
  });

  it('checks: the six named checks, in order, each with ok and a summary', () => {
    expect(r.json.checks.map((c) => c.name)).toEqual(CHECK_NAMES);
    for (const c of r.json.checks) {
      expect(c.ok, c.name).toBe(true);
      expect(c.summary, c.name).toEqual(expect.any(String));
    }
  });

  it('drive: smallest margin, weakest cord, worst drum torque and power, hardest lever pull', () => {
    const d = r.json.checks.find((c) => c.name === 'drive')!;
    expect(d).toMatchObject({
      minMargin: aNumber,
      weakestCord: aString,
      worstTorqueNm: aNumber,
      worstPowerW: aNumber,
      operatorForceMaxG: aNumber,
    });
    expect(d.minMargin as number).toBeGreaterThanOrEqual(DEFAULT_PROFILE.minMargin);
    expect(r.json.netlist.cords.map((c) => c.id)).toContain(d.weakestCord);
    // Power = torque × ω with ω = 2π·rpm/60 (DESIGN.md §4).
    expect(d.worstPowerW as number).toBeCloseTo(
      (d.worstTorqueNm as number) * ((2 * Math.PI * DEFAULT_PROFILE.drumRpm) / 60),
      9,
    );
    // A lever pull is at least its own pull-up weight.
    expect(d.operatorForceMaxG as number).toBeGreaterThanOrEqual(DEFAULT_PROFILE.leverWeightG);
  });

  it('bom: a list of items with counts', () => {
    expect(r.json.bom.length).toBeGreaterThan(0);
    for (const line of r.json.bom) expect(line).toMatchObject({ item: aString, count: aNumber });
  });
});

describe('cli/commands/build (text report)', () => {
  it('prints the encoding, the parts, the equations, one line per check and the safety line', async () => {
    const t = await run(['build', MB, '--encoding', 'binary']);
    expect(t.code).toBe(0);
    // One input and one output: counted in the singular.
    expect(t.out).toContain('marble_bell: 4 states → 4 after minimisation; 1 input, 1 output\n');
    expect(t.out).toContain('encoding binary, 2 state bits: none=00 one=01 two=10 rung=11\n');
    expect(t.out).toContain('  bell = q0 & q1\n');
    for (const name of CHECK_NAMES) expect(t.out).toMatch(new RegExp(`^ {2}ok {3}${name}: `, 'm'));
    expect(t.out).toMatch(/^commissioning sheet: shows \d+ of \d+ cord faults \(\d+ by the tour/m);
    expect(t.out).toMatch(/^Safety: /m);
    expectNoStack(t);
  });
});

describe('cli/commands/build (text report) of a build with no latches', () => {
  it('says the guard is not needed rather than proven for latches it does not have (examples/odd-lever.lw)', async () => {
    const t = await run(['build', 'examples/odd-lever.lw']);
    expect(t.code).toBe(0);
    expect(t.out).toContain('parts: 0 latches, ');
    expect(t.out).toContain('forbidden-input guard: none needed (no latches)\n');
    expect(t.out).not.toContain('proven for every latch');
    // One state: the checks count it, its reachable pair and its start point in the singular.
    expect(t.out).toMatch(
      /next-state-equivalence: next codes and outputs match the specification in its one state \(\d+ input cubes?\)/,
    );
    expect(t.out).toContain('over 1 reachable pair (state, build code)');
    // No inputs either: one start point.
    const lamp = 'machine lamp\noutputs on\nstart lit\nstate lit with on=1\n';
    const one = await run(['build', 'lamp.lw'], { 'lamp.lw': lamp });
    expect(one.out).toContain('(1 start point)');
    expect(one.out).toContain('lamp: 1 state → 1 after minimisation; 0 inputs, 1 output');
  });
});

describe('cli/commands/build with a low-friction profile', () => {
  // Capstan equation (Euler–Eytelwein): gain e^(μθ), θ = 2 wraps = 4π. With the 15 g hold weight
  // and 15 g per port, μ = 0.16 gives 15·e^(0.64π) ≈ 112 g, room for 3 ports at margin 2 even after
  // two pulleys (1/0.95² ≈ 1.108) on a routed branch — buffer trees fix it; μ = 0.10 gives ≈ 53 g,
  // under 2 ports at margin 2, so no tree can share a load. (At μ = 0.15, 99 g, a latch's
  // feedback branch and one more, routed over two pulleys, need 49.9 g: just over half, so a
  // latch fails — the routed frame costs force that a straight cord would not.)
  const profiles = tempDir('lw-profile-');
  const lowMu = (mu: number): string => writeTemp(profiles, `mu-${mu}.json`, JSON.stringify({ mu }));

  it('μ = 0.16: the build inserts buffers and still passes every check', async () => {
    const base = await runJson<Report>(['build', LOCK, '--encoding', 'binary', '--json']);
    const low = await runJson<Report>(['build', LOCK, '--encoding', 'binary', '--json', '--profile', lowMu(0.16)]);
    expect(low.code).toBe(0);
    const buffers = (x: Report): number => x.netlist.parts.filter((p) => p.role === 'buffer').length;
    expect(buffers(low.json)).toBeGreaterThan(buffers(base.json));
    expect(low.json.parts.gates).toBeGreaterThan(base.json.parts.gates);
    expect(low.json.checks.every((c) => c.ok)).toBe(true);
    // The logic is the same machine; only the drive changed.
    expect(low.json.equations).toEqual(base.json.equations);
  });

  it('μ = 0.10: the drive check fails naming the weak cord, and build exits 1', async () => {
    const profile = lowMu(0.1);
    const low = await runJson<Report>(['build', LOCK, '--encoding', 'binary', '--json', '--profile', profile]);
    expect(low.code).toBe(1);
    expect(low.json.ok).toBe(false);
    const d = low.json.checks.find((c) => c.name === 'drive')!;
    expect(d.ok).toBe(false);
    expect(d.minMargin as number).toBeLessThan(DEFAULT_PROFILE.minMargin);
    expect(low.json.netlist.cords.map((c) => c.id)).toContain(d.weakestCord);
    expect(d.summary).toContain(`'${d.weakestCord as string}'`);
    // Only the force budgets fail (the drive check, and the layout check's margins with the routed
    // cords): the logic is still right.
    expect(low.json.checks.filter((c) => !c.ok).map((c) => c.name)).toEqual(['drive', 'layout']);

    const t = await run(['build', LOCK, '--encoding', 'binary', '--profile', profile]);
    expect(t.code).toBe(1);
    expect(t.out).toContain(`  FAIL drive: `);
    expect(t.out).toContain(`'${d.weakestCord as string}'`);
    expectNoStack(t);
  });
});

describe('cli/commands/build with real loads: the canal lock (examples/canal-lock.lw)', () => {
  const CANAL = 'examples/canal-lock.lw';
  interface Drive {
    ok: boolean;
    muMin: number;
    muAtMinMargin: number;
    outputs: Record<string, { loadG: number; maxLoadG: number; margin: number }>;
    drivers: { driver: string; wraps: number; margin: number }[];
  }

  // Hand computation from DESIGN.md §4 (capstan equation, T_hold = 15 g, μ = 0.25, margin 2), each
  // load routed out of the frame over two pulleys of η = 0.95 (design §11: the capstan pulls
  // load / η²): 450 g is 498.6 g at the capstan, a gain of 66.5 → ln 66.5 / (2π·0.25) = 2.67 turns
  // → 2.75; 300 g a gain of 44.3 → 2.41 turns → 2.5; 120 g fits the profile's two turns.
  // Available = 15 g · e^(0.25·2π·turns).
  const ETA2 = 0.95 ** 2;
  const hand = (turns: number, loadG: number) => {
    const available = 15 * Math.exp(0.25 * 2 * Math.PI * turns);
    return { margin: (available * ETA2) / loadG, maxLoadG: Math.floor(((available * ETA2) / 2) * 10) / 10 };
  };

  it('passes with the margins a hand computation gives, and reports the friction headroom', async () => {
    const r = await runJson<Report>(['build', CANAL, '--encoding', 'binary', '--json']);
    expect(r.code).toBe(0);
    const d = r.json.checks.find((c) => c.name === 'drive') as unknown as Drive;
    expect(d.ok).toBe(true);
    const want: Record<string, [number, number]> = {
      lower_gate: [2.75, 450],
      upper_gate: [2.75, 450],
      fill: [2.5, 300],
      drain: [2.5, 300],
      bell: [2, 120],
    };
    for (const [o, [turns, load]] of Object.entries(want)) {
      const h = hand(turns, load);
      expect(d.outputs[o].loadG, o).toBe(load);
      expect(d.outputs[o].margin, o).toBeCloseTo(h.margin, 9);
      expect(d.outputs[o].maxLoadG, o).toBe(h.maxLoadG);
    }
    expect(d.outputs.lower_gate.margin).toBeCloseTo(2.261, 3);
    expect(d.outputs.fill.margin).toBeCloseTo(2.29, 3);
    // The gates' capstans slip first: μ = ln((450/η²)/15) / (2π·2.75).
    expect(d.muMin).toBeCloseTo(Math.log(30 / ETA2) / (2 * Math.PI * 2.75), 12);
    expect(d.muAtMinMargin).toBeCloseTo(Math.log(60 / ETA2) / (2 * Math.PI * 2.75), 12);
    expect(r.json.bom.find((b) => b.item === 'actuator lower_gate')).toBeDefined();
    const t = await run(['build', CANAL, '--encoding', 'binary']);
    expect(t.out).toContain("output 'lower_gate' lifts 450 g, at most 508 g at margin 2");
    expect(t.out).toContain('every capstan holds down to μ = 0.203 and keeps margin 2 down to μ = 0.243');
  });

  it('fails naming the output, how far short and what to change when the load is too heavy', async () => {
    const files = { 'heavy.lw': readText(CANAL).replace('load lower_gate 450 g', 'load lower_gate 5 kg') };
    const t = await run(['build', 'heavy.lw', '--encoding', 'binary'], files);
    expect(t.code).toBe(1);
    // 4 turns (maxWraps) hold 15 g · e^(2π) = 8032 g: at margin 2, 4016 g at the capstan, a load of
    // 4016 · 0.95² = 3624.4 g out of the frame over two pulleys: 1375 g short of 5000 g.
    expect(t.out).toContain(
      "FAIL drive: over budget, margin below 2: output 'lower_gate' lifts 5000 g (actuator act.lower_gate",
    );
    expect(t.out).toContain('can move at most 3625 g at margin 2: 1375 g short');
    expect(t.out).toContain("fix: a lighter load on 'lower_gate': at most 3624 g");
    expect(t.out).toContain('raise maxWraps to 4.25 (now 4)');
    expectNoStack(t);
  });
});

describe('cli/commands/build with a profile that slips a unit or names no cord', () => {
  const dir = tempDir('lw-slip-');

  it('warns about millimetres given as metres, and still builds (the value is allowed)', async () => {
    const t = await run([
      'build',
      MB,
      '--encoding',
      'binary',
      '--profile',
      writeTemp(dir, 'r.json', '{"drumRadiusM": 40}'),
    ]);
    expect(t.code).toBe(0);
    expect(t.err).toContain(
      "$.drumRadiusM: warning LW602: profile field 'drumRadiusM' is 40 m, outside the plausible 0.01–0.3 m: did you mean 0.04 (millimetres given as metres)?",
    );
  });

  it('refuses a stage delay that allows less than one clock a minute, naming the slip', async () => {
    const t = await run([
      'build',
      MB,
      '--encoding',
      'binary',
      '--profile',
      writeTemp(dir, 's.json', '{"stageDelayS": 250}'),
    ]);
    expect(t.code).toBe(2);
    expect(t.err).toContain('error LW600');
    expect(t.err).toContain('did you mean 0.25 (milliseconds given as seconds)?');
  });

  it('refuses a cordRouting key that names no cord, with the cord meant (the old profile reference example)', async () => {
    const p = writeTemp(
      dir,
      'c.json',
      JSON.stringify({ cordRouting: { 'c.phi1': { pinAngleRad: 1.5708, pulleys: 1 } } }),
    );
    const t = await run(['build', MB, '--encoding', 'binary', '--profile', p]);
    expect(t.code).toBe(2);
    expect(t.err).toContain(`${p}:1:26 $.cordRouting["c.phi1"]: error LW603:`);
    expect(t.err).toContain("did you mean 'c.clk.phi1'?");
    expectNoStack(t);
  });

  it('names the gates that have no capstan in the parts line, and counts the same capstans as the BOM', async () => {
    const t = await run(['build', 'examples/ferry-gate.lw', '--encoding', 'binary']);
    expect(t.out).toContain('24 capstans, 42 weights, 49 cords (2 gates that only show a flag have no capstan)');
  });
});

describe('cli/commands/build: the frame', () => {
  it('--json gives the layout block; for every example the placed frame takes no more cord than the netlist order', async () => {
    for (const name of EXAMPLES) {
      const r = await runJson<Report>(['build', examplePath(name), '--json']);
      expect(r.code, name).toBe(0);
      const l = r.json.layout;
      expect(Object.keys(l), name).toEqual([
        'method',
        'exact',
        'drums',
        'totalCordM',
        'baselineCordM',
        'channelM',
        'baselineChannelM',
        'pulleys',
      ]);
      expect(['exact', 'heuristic', 'netlist'], name).toContain(l.method);
      expect(l.drums.length, name).toBeGreaterThanOrEqual(1);
      expect(l.totalCordM, name).toBeLessThanOrEqual(l.baselineCordM);
      expect(r.json.checks.find((c) => c.name === 'layout')?.ok, name).toBe(true);
    }
  });

  it('--pin keeps parts in bays (PART=BAY, PART=BAY@DRUM, repeated or joined with commas)', async () => {
    const one = await runJson<Report>(['build', MB, '--encoding', 'binary', '--json', '--pin', 'o.bell.1=2@2']);
    expect(one.code).toBe(0);
    expect(one.json.layout.drums).toHaveLength(2);
    const two = await runJson<Report>([
      'build',
      MB,
      '--encoding',
      'binary',
      '--json',
      '--pin',
      'm1=9,rst=3',
      '--pin',
      'o.bell.1=2@2',
    ]);
    expect(two.code).toBe(0);
    expect(two.json.layout.drums).toHaveLength(2);
    // No pin problem: every pin was kept.
    expect(JSON.stringify(two.json.diagnostics)).not.toMatch(/LW70[67]/);
  });

  it('--pin on a part the build does not have: LW707 with a did-you-mean, exit 2', async () => {
    const r = await run(['build', MB, '--encoding', 'binary', '--pin', 'o.bel.1=4']);
    expect(r.code).toBe(2);
    expect(r.err).toContain('error LW707');
    expect(r.err).toContain("did you mean 'o.bell.1'?");
    expectNoStack(r);
  });

  it('--pin that is not PART=BAY: LW700 naming the form, exit 2', async () => {
    const r = await run(['build', MB, '--pin', 'm1']);
    expect(r.code).toBe(2);
    expect(r.err).toContain('error LW700: --pin m1 is not PART=BAY or PART=BAY@DRUM');
    expectNoStack(r);
  });

  it('--pin past the end of the drum: a warning (LW708), and the build goes on', async () => {
    const r = await run(['build', MB, '--encoding', 'binary', '--pin', 'o.bell.1=90']);
    expect(r.code).toBe(0);
    expect(r.err).toContain('warning LW708');
  });

  it('--help explains --pin', async () => {
    const r = await run(['--help']);
    expect(r.out).toContain('[--pin PART=BAY[@DRUM] …]');
    expect(r.out).toMatch(/--pin keeps a part in a bay/);
  });
});

describe('cli/commands/build --saw', () => {
  // The answer is the core's dictionary (tests/core/export/cord-finder.test.ts holds its round
  // trip); here: the command line reads the question and says it in words or in JSON.
  it('names the cords to look at for what was seen at a step', async () => {
    const j = await runJson<{ saw: { step: number; what: string; seen: string; cords: { cord: string }[] } }>([
      'build',
      LOCK,
      '--encoding',
      'binary',
      '--json',
      '--saw',
      '1:s0 set Z=down',
    ]);
    expect(j.code).toBe(0);
    expect(j.json.saw).toMatchObject({ step: 1, what: 's0 set Z', seen: 'down' });
    const t = await run(['build', LOCK, '--encoding', 'binary', '--saw', '1:S0-set_Z=down']);
    expect(t.code).toBe(0);
    expect(t.out).toContain('at step 1 you saw s0 set Z down: ');
    if (j.json.saw.cords.length > 0) expect(t.out).toContain(`look at ${j.json.saw.cords[0].cord}: `);
    expectNoStack(t);
  });

  // Several sights narrow the suspects: effect–cause diagnosis over every row walked (Abramovici,
  // Breuer & Friedman, 1990, ch. 12 — from memory). The second sight is the one the first answer
  // proposes (a step ahead and one of its outcomes); the cords left must be among those that
  // outcome leaves, and fewer than the first sight alone leaves (tests/core/export/cord-narrowing
  // holds every suspect to the surgery reference).
  it('narrows the cords with several sights at several steps', async () => {
    interface Outcome {
      sights: { what: string; seen: string }[];
      unsettled: string[];
      asSheet: boolean;
      leaves: string[];
    }
    interface Answer {
      saw: {
        cords: { cord: string }[];
        narrowed: { suspects: { fault: { key: string } }[]; ahead: { step: number; outcomes: Outcome[] }[] };
      };
    }
    const first = ['--saw', '1:s0 set Z=down', '--saw', '1:s0-reset-Z=up'];
    const one = await runJson<Answer>(['build', LOCK, '--encoding', 'binary', '--json', ...first]);
    expect(one.code).toBe(0);
    const before = one.json.saw.narrowed.suspects.map((s) => s.fault.key);
    expect(before.length).toBeGreaterThanOrEqual(2);
    const ahead = one.json.saw.narrowed.ahead[0];
    expect(ahead).toBeDefined();
    const pick = ahead.outcomes.find((o) => !o.asSheet && o.unsettled.length === 0 && o.leaves.length < before.length);
    expect(pick).toBeDefined();
    if (!pick) return;
    const more = pick.sights.flatMap((s) => ['--saw', `${ahead.step}:${s.what}=${s.seen.replace(/ \(.*$/, '')}`]);
    const two = await runJson<Answer>(['build', LOCK, '--encoding', 'binary', '--json', ...first, ...more]);
    expect(two.code).toBe(0);
    const after = two.json.saw.narrowed.suspects.map((s) => s.fault.key);
    expect(after.length).toBeGreaterThan(0);
    expect(after.length).toBeLessThan(before.length);
    for (const k of after) expect(pick.leaves).toContain(k);
    const t = await run(['build', LOCK, '--encoding', 'binary', ...first, ...more]);
    expect(t.out).toContain(
      `at step 1 you saw s0 set Z down; at step 1 you saw s0 reset Z up; at step ${ahead.step} you saw `,
    );
    expect(t.out).toContain('stop the drum');
    expectNoStack(t);
    // One lever named of the two that differed at step 1: the answer takes only what was named, and says so.
    const half = await runJson<Answer>(['build', LOCK, '--encoding', 'binary', '--json', '--saw', '1:s0 set Z=down']);
    expect(half.json.saw.cords.length).toBeGreaterThan(0);
    const said = await run(['build', LOCK, '--encoding', 'binary', '--saw', '1:s0 set Z=down']);
    expect(said.out).toContain('this answer takes only what you named');
  });

  it('refuses a position a column cannot have', async () => {
    const t = await run(['build', LOCK, '--encoding', 'binary', '--saw', '1:s0 set Z=sideways']);
    expect(t.code).toBe(2);
    expect(t.err).toContain('LW700');
    expect(t.err).toContain("'sideways' is no position of s0 set Z: write up or down");
    expectNoStack(t);
  });

  it('refuses a question it cannot read with LW700 and a hint, never a stack', async () => {
    for (const [saw, words] of [
      ['s0 set Z up', 'is not STEP:WHAT=POSITION'],
      ['0:s0 set Z=up', 'has steps 1 to'],
      ['1:s0 sat Z=up', "did you mean 's0 set Z'"],
    ]) {
      const t = await run(['build', LOCK, '--encoding', 'binary', '--saw', saw]);
      expect(t.code, saw).toBe(2);
      expect(t.err, saw).toContain('LW700');
      expect(t.err, saw).toContain(words);
      expectNoStack(t);
    }
  });
});
