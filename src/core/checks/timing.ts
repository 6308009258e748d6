/**
 * Clock-phase timing: minimum phase times, the fastest safe hand or crank rate, the cam
 * angles of a crank-driven clock, and a seeded Monte Carlo run that varies every stage delay.
 *
 * Method: the longest stage chain of each hand action (stage-chains.ts): φ1 = term gates →
 * master latch (2 stages); φ2 = transfer → slave latch (2 stages) → output decode; the dead
 * band after each release lets the gates it frees return (after φ2 also the next inputs
 * settle). One clock is the sum φ1 + dead band + φ2 + dead band. A crank turns once per
 * clock; its cam holds φ1 from 0° and φ2 after the first dead band, and shares any slack in
 * proportion, so every window keeps the same margin (turn time / minimum clock).
 * Monte Carlo: each run draws every gate's delay uniformly within ±`stageDelaySpread` of its
 * nominal value (seededRandom), then (a) recomputes the chains and checks that each still
 * fits its cam window, and (b) replays the reachable clocks (breadth-first from reset, up to
 * `clocksPerRun`; the input combinations of sim/assignments.ts's rule, without `never`) and
 * compares the settled result with the nominal one — a difference is a race (e.g. a latch
 * released from the forbidden input resolving differently). A clock whose every move the
 * settle programs vouch for (sim/program.ts: no latch port moves both ways, no glitch can reach
 * a latch) settles to the same values with any stage delays, so only the other clocks are
 * replayed; the reachable clocks themselves are found on the bit-parallel simulator.
 */
import type { Build, CheckBase } from '../model/build.js';
import { seededRandom } from '../model/random.js';
import type { Profile } from '../physics/profile.js';
import { describeInputs, inputAssignments, machineInputs } from '../sim/assignments.js';
import { clockFrom, latchKey } from '../sim/clocking.js';
import { LaneBatch } from '../sim/lanes.js';
import { batchKey, sweep } from '../sim/sweep.js';
import { retimed, X, type PartSim } from '../sim/compile.js';
import { resetActions } from '../sim/hand.js';
import { applyInPlace, latchesOf, powerUp, show, simFor, slaveCode, stateAtLatches, timingOf } from '../sim/part.js';
import { chainPlan, type ChainPlan, type StageChain } from './stage-chains.js';

export interface TimingOptions {
  /** Crank speed in turns per minute (one clock per turn); default the fastest safe rate divided by 1 + spread. */
  readonly crankRpm?: number;
  /** Per-gate delay overrides, seconds (by gate or latch id). */
  readonly delays?: Readonly<Record<string, number>>;
  /** Monte Carlo runs (default 20) and seed (default 1). */
  readonly runs?: number;
  readonly seed?: number;
  /** Clocks replayed per run, breadth-first from reset (default 2000). */
  readonly clocksPerRun?: number;
}

export interface MonteCarloReport {
  readonly runs: number;
  readonly seed: number;
  readonly ok: boolean;
  readonly race?: { readonly run: number; readonly words: string };
}

export interface TimingResult extends CheckBase<'timing'> {
  readonly phaseTimesS: { readonly phi1: number; readonly phi2: number };
  /** Dead bands after releasing φ1 and φ2 (the latter includes the next inputs settling). */
  readonly deadBandsS: { readonly afterPhi1: number; readonly afterPhi2: number };
  readonly resetS: number;
  /** Longest chains, part names in order. */
  readonly chains: { readonly phi1: readonly string[]; readonly phi2: readonly string[] };
  readonly clockS: number;
  readonly clocksPerMinute: number;
  readonly crankRpm: number;
  /** Cam windows in degrees of one crank turn. */
  readonly cam: { readonly phi1: readonly [number, number]; readonly phi2: readonly [number, number] };
  readonly monteCarlo: MonteCarloReport;
}

interface Phases {
  readonly phi1: StageChain;
  readonly dead1: StageChain;
  readonly phi2: StageChain;
  readonly dead2: StageChain;
  readonly reset: StageChain;
  readonly loop?: readonly string[];
}

/** The plans of the chains a clock needs (stage-chains.ts), made once per netlist. */
interface Plans {
  readonly phi1: ChainPlan;
  readonly dead1: ChainPlan;
  readonly phi2: ChainPlan;
  readonly rel2: ChainPlan;
  readonly inputs: ChainPlan;
  readonly reset: ChainPlan;
}

function plansOf(sim: PartSim): Plans {
  return {
    phi1: chainPlan(sim, 'phi1'),
    dead1: chainPlan(sim, 'phi1-release'),
    phi2: chainPlan(sim, 'phi2'),
    rel2: chainPlan(sim, 'phi2-release'),
    inputs: chainPlan(sim, 'inputs'),
    reset: chainPlan(sim, 'reset'),
  };
}

/** The dead band after φ2: the slower of its release and the next inputs settling. */
function deadAfterPhi2(plans: Plans, sim: PartSim): { dead2: StageChain; inputs: StageChain; rel2: StageChain } {
  const inputs = plans.inputs.chain(sim);
  const rel2 = plans.rel2.chain(sim);
  return { dead2: inputs.timeS > rel2.timeS ? inputs : rel2, inputs, rel2 };
}

function phases(plans: Plans, sim: PartSim): Phases {
  const { dead2, inputs, rel2 } = deadAfterPhi2(plans, sim);
  const p: Phases = {
    phi1: plans.phi1.chain(sim),
    dead1: plans.dead1.chain(sim),
    phi2: plans.phi2.chain(sim),
    dead2,
    reset: plans.reset.chain(sim),
  };
  const loop = [p.phi1, p.dead1, p.phi2, p.dead2, p.reset, inputs, rel2].find((c) => c.loop)?.loop;
  return loop ? { ...p, loop } : p;
}

/** Round to `step` (0.1, 0.01 …) without binary noise in the printed figure. */
const round = (x: number, step: number): number =>
  Number((Math.round(x / step) * step).toFixed(Math.max(0, -Math.floor(Math.log10(step)))));

/** Phase times, clock rate, cam angles and the Monte Carlo run. */
export function checkTiming(
  build: Build,
  profile: Pick<Profile, 'stageDelayS' | 'stageDelaySpread'>,
  opts: TimingOptions = {},
): TimingResult {
  const sim = simFor(build, timingOf(profile, opts.delays));
  const plans = plansOf(sim);
  const p = phases(plans, sim);
  const clockS = p.phi1.timeS + p.dead1.timeS + p.phi2.timeS + p.dead2.timeS;
  // A loop gives no finite time; a machine with nothing that moves (no clock, no inputs) needs none.
  const timed = Number.isFinite(clockS) && clockS > 0;
  const clocksPerMinute = timed ? Math.floor((60 / clockS) * 10) / 10 : 0;
  const spread = profile.stageDelaySpread;
  const crankRpm = opts.crankRpm ?? Math.floor((clocksPerMinute / (1 + spread)) * 10) / 10;
  const turnS = crankRpm > 0 ? 60 / crankRpm : Infinity;
  const deg = (s: number): number => (timed ? round((s / clockS) * 360, 0.1) : 0);
  const a1 = deg(p.phi1.timeS);
  const b2 = deg(p.phi1.timeS + p.dead1.timeS);
  const e2 = deg(p.phi1.timeS + p.dead1.timeS + p.phi2.timeS);
  const cam = { phi1: [0, a1] as const, phi2: [b2, e2] as const };
  const runs = opts.runs ?? 20;
  const seed = opts.seed ?? 1;
  const window = (x: number): number => (timed ? (x / clockS) * turnS : Infinity);
  const windows = {
    phi1: window(p.phi1.timeS),
    dead1: window(p.dead1.timeS),
    phi2: window(p.phi2.timeS),
    dead2: window(p.dead2.timeS),
  };
  const monteCarlo = p.loop
    ? { runs: 0, seed, ok: false }
    : monteCarloRun(sim, plans, profile, opts, runs, seed, windows);
  const base = {
    name: 'timing' as const,
    phaseTimesS: { phi1: p.phi1.timeS, phi2: p.phi2.timeS },
    deadBandsS: { afterPhi1: p.dead1.timeS, afterPhi2: p.dead2.timeS },
    resetS: p.reset.timeS,
    chains: { phi1: p.phi1.parts, phi2: p.phi2.parts },
    clockS,
    clocksPerMinute,
    crankRpm,
    cam,
    monteCarlo,
  };
  if (p.loop)
    return {
      ...base,
      ok: false,
      summary: `the gates ${p.loop.join(' → ')} form a loop that no latch closes: the machine may never settle`,
    };
  if (!timed)
    return { ...base, ok: monteCarlo.ok, summary: 'nothing to time: the machine has no clock levers and no inputs' };
  if (sim.slaves.length === 0) {
    const settleS = round(p.dead2.timeS, 0.01);
    return {
      ...base,
      ok: monteCarlo.ok,
      summary: `no clock (one state): the outputs settle ${settleS} s after an input lever moves${monteCarlo.ok ? '' : `; but ${monteCarlo.race?.words ?? 'a Monte Carlo run differs'}`}`,
    };
  }
  if (turnS < clockS) {
    const chain =
      p.phi1.timeS >= p.phi2.timeS ? `φ1 chain ${p.phi1.parts.join(' → ')}` : `φ2 chain ${p.phi2.parts.join(' → ')}`;
    return {
      ...base,
      ok: false,
      summary: `a crank at ${crankRpm} turns per minute gives ${round(turnS, 0.01)} s per clock, but one clock needs ${round(clockS, 0.01)} s (longest: ${chain}); turn at most ${clocksPerMinute} per minute`,
    };
  }
  const what = `φ1 ${round(p.phi1.timeS, 0.01)} s, φ2 ${round(p.phi2.timeS, 0.01)} s, one clock ${round(clockS, 0.01)} s: at most ${clocksPerMinute} clocks per minute; crank at ${crankRpm} per minute with φ1 ${cam.phi1[0]}°–${cam.phi1[1]}°, φ2 ${cam.phi2[0]}°–${cam.phi2[1]}°`;
  return {
    ...base,
    ok: monteCarlo.ok,
    summary: monteCarlo.ok
      ? `${what}; ${runs} Monte Carlo runs (seed ${seed}) agree`
      : `${what}; but ${monteCarlo.race?.words ?? 'a Monte Carlo run differs'}`,
  };
}

/** Reachable clocks breadth-first from reset with nominal delays: start values, inputs, and the settled result. */
interface Replay {
  /** The state with the inputs held; null for a clock the settle programs vouch for (it cannot race: sim/program.ts). */
  readonly held: Uint8Array | null;
  readonly inputs: string;
  readonly code: string;
  readonly result: Settled;
}

/** What a clock settles to: the slave code, the outputs before φ1, and the alarms in words. */
interface Settled {
  readonly code: string;
  readonly outputs: string;
  readonly alarms: string;
}

function nominalReplay(sim: PartSim, limit: number, seed: number): Replay[] {
  const f = sim.build.machine;
  const values = powerUp(sim)[0].values.slice();
  for (const a of resetActions()) applyInPlace(sim, values, 0, a, []);
  const tries = inputAssignments(machineInputs(f), seededRandom(seed)).list;
  const out: Replay[] = [];
  const bases: Uint8Array[] = [latchesOf(sim, values)];
  const seen = new Set([latchKey(sim, values)]);
  const batch = new LaneBatch(sim);
  const reach = (latches: Uint8Array): void => {
    const key = latchesKey(latches);
    if (!seen.has(key)) {
      seen.add(key);
      bases.push(latches);
    }
  };
  for (let i = 0; i < bases.length && out.length < limit; i++) {
    const base = bases[i];
    let code = '';
    sweep<string>(
      sim,
      Math.min(tries.length, limit - out.length),
      {
        setUp: (b, lane, k) => {
          b.setLatches(lane, base);
          b.setInputs(lane, tries[k]);
        },
        recordKey: (first, n) => batchKey(base, tries, first, n),
        held: (b, lane) => b.outputs(lane).map(show).join(''),
        done: (k, b, lane, outputs) => {
          code ||= slaveCodeOf(sim, base);
          out.push({
            held: null,
            inputs: tries[k],
            code,
            result: { code: b.slaveCode(lane), outputs: outputs ?? '', alarms: '' },
          });
          reach(b.latchesOf(lane));
        },
        slow: (k) => {
          const held = stateAtLatches(sim, base, tries[k]).values;
          const c = clockFrom(sim, held);
          out.push({ held, inputs: tries[k], code: slaveCode(sim, held), result: settledOf(c) });
          reach(latchesOf(sim, c.values));
        },
      },
      batch,
    );
  }
  return out;
}

/** latchKey of a latchesOf array. */
function latchesKey(latches: Uint8Array): string {
  let k = '';
  for (let i = 0; i < latches.length; i += 2) k += String.fromCharCode(48 + latches[i] * 3 + latches[i + 1]);
  return k;
}

/** The slave code a latchesOf array holds. */
function slaveCodeOf(sim: PartSim, latches: Uint8Array): string {
  let s = '';
  for (const li of sim.slaves) {
    const q = latches[2 * li];
    s += q === X || q === latches[2 * li + 1] ? 'X' : String(q);
  }
  return s;
}

function settledOf(c: ReturnType<typeof clockFrom>): Settled {
  return { code: c.code, outputs: c.outputs.map(show).join(''), alarms: c.alarms.map((e) => e.words).join('; ') };
}

/** How two settled results differ, in words; null when they agree. */
function difference(nominal: Settled, varied: Settled): string | null {
  if (nominal.code !== varied.code)
    return `nominal delays leave code ${nominal.code}, varied delays code ${varied.code}`;
  if (nominal.outputs !== varied.outputs)
    return `nominal delays show outputs ${nominal.outputs}, varied delays ${varied.outputs}`;
  if (nominal.alarms !== varied.alarms)
    return `nominal delays raise ${nominal.alarms || 'no alarm'}, varied delays ${varied.alarms || 'none'}`;
  return null;
}

function monteCarloRun(
  nominal: PartSim,
  plans: Plans,
  profile: Pick<Profile, 'stageDelayS' | 'stageDelaySpread'>,
  opts: TimingOptions,
  runs: number,
  seed: number,
  windows: { phi1: number; dead1: number; phi2: number; dead2: number },
): MonteCarloReport {
  const rnd = seededRandom(seed);
  const replay = nominalReplay(nominal, opts.clocksPerRun ?? 2000, seed);
  const spread = profile.stageDelaySpread;
  const f = nominal.build.machine;
  for (let run = 1; run <= runs; run++) {
    // Every gate's delay drawn in driver order, rounded to whole microseconds as compile.ts rounds a delay.
    const delayUs = new Int32Array(nominal.driverCount);
    for (let g = nominal.leverCount; g < nominal.driverCount; g++) {
      const s = (nominal.delayUs[g] / 1e6) * (1 + spread * (2 * rnd.next() - 1));
      delayUs[g] = Math.max(1, Math.round(s * 1e6));
    }
    const sim = retimed(nominal, delayUs);
    // The reset chain has no cam window; a loop would have stopped the runs before they began.
    const p = {
      phi1: plans.phi1.chain(sim),
      dead1: plans.dead1.chain(sim),
      phi2: plans.phi2.chain(sim),
      dead2: deadAfterPhi2(plans, sim).dead2,
    };
    const tight = (['phi1', 'dead1', 'phi2', 'dead2'] as const).find((w) => p[w].timeS > windows[w] + 1e-9);
    if (tight) {
      const label = { phi1: 'φ1', dead1: 'the dead band after φ1', phi2: 'φ2', dead2: 'the dead band after φ2' }[tight];
      const words = `Monte Carlo run ${run} (seed ${seed}): with stage delays varied by up to ±${round(spread * 100, 1)} %, ${label} needs ${round(p[tight].timeS, 0.01)} s but its cam window lasts ${round(windows[tight], 0.01)} s (chain ${p[tight].parts.join(' → ')})`;
      return { runs, seed, ok: false, race: { run, words } };
    }
    for (const r of replay) {
      if (!r.held) continue;
      const differs = difference(r.result, settledOf(clockFrom(sim, r.held)));
      if (differs) {
        const words = `Monte Carlo run ${run} (seed ${seed}): a race — one clock from code ${r.code} with ${describeInputs(f.inputs, r.inputs)}: ${differs}`;
        return { runs, seed, ok: false, race: { run, words } };
      }
    }
  }
  return { runs, seed, ok: true };
}
