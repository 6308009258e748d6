import { describe, expect, it } from 'vitest';
import { stageChain } from '../../../src/core/checks/stage-chains.js';
import { checkTiming } from '../../../src/core/checks/timing.js';
import type { Build } from '../../../src/core/model/build.js';
import type { FlatMachine } from '../../../src/core/model/flat.js';
import { DEFAULT_PROFILE } from '../../../src/core/physics/profile.js';
import { synthesise } from '../../../src/core/synthesise.js';
import { simFor } from '../../../src/core/sim/part.js';
import { toggleBuild } from '../sim/handmade.js';
import { brokenBuild, exampleBuild, exampleNames } from './builds.js';

const profile = DEFAULT_PROFILE; // 0.25 s per stage, ±30 % spread

describe('core/checks/timing', () => {
  // DESIGN §4–5: φ1 = term gate + master latch (2 stages); φ2 = transfer + slave latch (2 stages)
  // + output decode (here an output term and the output gate).
  it('gives the phase times, clock rate and cam angles of the toggle', () => {
    const r = checkTiming(toggleBuild(), profile, { crankRpm: 12 });
    expect(r).toMatchObject({
      name: 'timing',
      ok: true,
      phaseTimesS: { phi1: 0.75, phi2: 1.25 },
      deadBandsS: { afterPhi1: 0.25, afterPhi2: 0.25 },
      resetS: 1.25,
      clockS: 2.5,
      clocksPerMinute: 24,
      crankRpm: 12,
      // 0.75 s of 2.5 s is 108°; φ2 starts after the 0.25 s dead band (144°) and lasts 180°.
      cam: { phi1: [0, 108], phi2: [144, 324] },
      monteCarlo: { runs: 20, seed: 1, ok: true },
    });
    expect(r.chains).toEqual({
      phi1: ['S0.t0', 'latch M0 (2 stages)'],
      phi2: ['T0.s', 'latch Q0 (2 stages)', 'lit.t0', 'out_lit'],
    });
  });

  it('picks a crank speed with room for the delay spread when none is given', () => {
    // 24 clocks per minute / 1.3 = 18.46…, rounded down to 18.4.
    expect(checkTiming(toggleBuild(), profile).crankRpm).toBe(18.4);
  });

  it('catches a too-long chain and names it', () => {
    const r = checkTiming(brokenBuild('toggle-long-chain'), profile, { crankRpm: 12 });
    expect(r.ok).toBe(false);
    expect(r.phaseTimesS.phi1).toBe(3.75);
    expect(r.chains.phi1).toEqual([
      ...Array.from({ length: 12 }, (_, i) => `buf${i + 1}`),
      'S0.t0',
      'latch M0 (2 stages)',
    ]);
    expect(r.summary).toMatch(
      /^a crank at 12 turns per minute gives 5 s per clock, but one clock needs 8.5 s \(longest: φ1 chain buf1 → buf2 → /,
    );
  });

  it('reports a cam window that a slower run of delays overruns', () => {
    const r = checkTiming(toggleBuild(), profile, { crankRpm: 24 });
    expect(r.ok).toBe(false);
    expect(r.monteCarlo.race?.words).toMatch(
      /^Monte Carlo run \d+ \(seed 1\): with stage delays varied by up to ±30 %, .* needs .* s but its cam window lasts/,
    );
  });

  it('reports the race of a latch released from the forbidden input, the same way twice', () => {
    const b = brokenBuild('toggle-release-race');
    const first = checkTiming(b, profile, { seed: 7 });
    const again = checkTiming(b, profile, { seed: 7 });
    expect(first.monteCarlo.ok).toBe(false);
    expect(first.monteCarlo.race?.words).toMatch(
      /a race — one clock from code 0 with t=0: nominal delays leave code X, varied delays code [01]$/,
    );
    expect(again).toEqual(first);
  });

  it('reports a loop of gates that no latch closes', () => {
    const b = toggleBuild();
    const ring: Build = {
      ...b,
      netlist: {
        parts: [...b.netlist.parts, { kind: 'gate', id: 'ring', name: 'ring', role: 'buffer', ports: [{ name: 'a' }] }],
        cords: [
          ...b.netlist.cords,
          {
            id: 'r1',
            driver: 'ring',
            ports: [
              { part: 'ring', port: 'a' },
              { part: 'S0.t0', port: 'p0' },
            ],
            actuators: [],
          },
        ],
      },
    };
    const r = checkTiming(ring, profile);
    expect(r.ok).toBe(false);
    expect(r.summary).toBe('the gates ring form a loop that no latch closes: the machine may never settle');
  });

  it('stops chains at the latches on a release', () => {
    const sim = simFor(toggleBuild(), { stageDelayS: 0.25 });
    expect(stageChain(sim, 'phi1-release')).toEqual({ timeS: 0.25, parts: ['S0.t0'] });
    expect(stageChain(sim, 'inputs')).toEqual({ timeS: 0, parts: [] });
  });

  it('uses per-part delays', () => {
    const r = checkTiming(toggleBuild(), profile, { delays: { 'S0.t0': 1, M0: 0.5 } });
    // φ1: the slow term (1 s) and the master latch's two gates at 0.5 s each.
    expect(r.phaseTimesS.phi1).toBe(2);
  });

  it('has nothing to time in a machine with one state and no inputs', () => {
    const still: FlatMachine = {
      name: 'still',
      inputs: [],
      outputs: ['on'],
      states: ['only'],
      start: 0,
      rows: [[{ cube: '', next: 0, out: [1], transition: 0 }]],
      never: [],
    };
    const r = checkTiming(synthesise(still, { strategy: 'binary', bits: 0, codes: [''] }, { profile }), profile);
    expect(r).toMatchObject({
      ok: true,
      clockS: 0,
      clocksPerMinute: 0,
      summary: 'nothing to time: the machine has no clock levers and no inputs',
    });
  });

  it.each(exampleNames())('passes for the example %s', (name) => {
    expect(checkTiming(exampleBuild(name).build, profile).ok).toBe(true);
  });
});
