import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import type { Netlist } from '../../../src/core/model/netlist.js';
import { balanceDrive } from '../../../src/core/physics/buffer-tree.js';
import { checkDrive } from '../../../src/core/physics/check-drive.js';
import { driveBudget } from '../../../src/core/physics/drive.js';
import { DEFAULT_PROFILE, type Profile } from '../../../src/core/physics/profile.js';
import { actuator, cord, evaluate, fanOut, gate, lever } from './netlists.js';

const lowMu: Profile = { ...DEFAULT_PROFILE, mu: 0.15 }; // gain e^(0.6π) ≈ 6.59: three one-port loads per capstan

/** Every lever combination gives the same output on every original gate. */
function sameLogic(before: Netlist, after: Netlist): boolean {
  const levers = before.parts.filter((p) => p.kind === 'lever').map((p) => p.id);
  const gates = before.parts.filter((p) => p.kind === 'gate').map((p) => p.id);
  for (let m = 0; m < 1 << levers.length; m++) {
    const pulled = new Set(levers.filter((_, i) => (m >> i) & 1));
    const a = evaluate(before, pulled);
    const b = evaluate(after, pulled);
    if (gates.some((g) => a.get(g) !== b.get(g))) return false;
  }
  return true;
}

/** Netlist invariants (src/core/model/netlist.ts): unique ids, one driver per cord, every port tied and on a gate. */
function invariantsHold(n: Netlist): boolean {
  const ids = [...n.parts.map((p) => p.id), ...n.cords.map((c) => c.id)];
  if (new Set(ids).size !== ids.length) return false;
  const parts = new Map(n.parts.map((p) => [p.id, p]));
  for (const c of n.cords) {
    const d = parts.get(c.driver);
    if (!d || (d.kind !== 'lever' && d.kind !== 'gate')) return false;
    if (c.ports.length + c.actuators.length === 0) return false;
    if (
      c.ports.some((r) => {
        const g = parts.get(r.part);
        return g?.kind !== 'gate' || !g.ports.some((p) => p.name === r.port);
      })
    )
      return false;
  }
  for (const p of n.parts) {
    if (p.kind !== 'gate') continue;
    for (const port of p.ports)
      if (!n.cords.some((c) => c.ports.some((r) => r.part === p.id && r.port === port.name))) return false;
  }
  return true;
}

describe('core/physics/buffer-tree', () => {
  it('returns the netlist unchanged when every budget passes', () => {
    const n = fanOut(10, 1);
    expect(balanceDrive(n, DEFAULT_PROFILE)).toBe(n);
  });

  it('inserts buffer pairs under a low μ so that every margin passes, without changing the logic', () => {
    const n = fanOut(20, 1);
    expect(driveBudget(n, lowMu).some((b) => !b.ok)).toBe(true);
    const out = balanceDrive(n, lowMu);
    const buffers = out.parts.filter((p) => p.kind === 'gate' && p.role === 'buffer');
    expect(buffers.length).toBeGreaterThan(0);
    expect(buffers.length % 2).toBe(0);
    expect(buffers[0].id).toBe('c.L.buf1a');
    expect(buffers[1].id).toBe('c.L.buf1b');
    expect(driveBudget(out, lowMu).every((b) => b.ok)).toBe(true);
    expect(checkDrive(out, lowMu, []).ok).toBe(true);
    expect(sameLogic(n, out)).toBe(true);
    expect(invariantsHold(out)).toBe(true);
  });

  it('builds a deeper tree when even the buffer ports overload the driver', () => {
    // Multi-port ports load 30 g; at μ = 0.15 a capstan carries 49.4 g at margin 2, so one
    // such port per buffer, and the one-port buffer levers need buffering in turn.
    const n = fanOut(10, 2);
    const out = balanceDrive(n, lowMu);
    expect(driveBudget(out, lowMu).every((b) => b.ok)).toBe(true);
    expect(sameLogic(n, out)).toBe(true);
    expect(invariantsHold(out)).toBe(true);
  });

  it("keeps a latch's feedback branch on its own gate while buffering the rest", () => {
    const set = { ...gate('qs', ['s', 'fb'], 'latch-set'), latch: 'm0' };
    const reset = { ...gate('qr', ['r', 'fb'], 'latch-reset'), latch: 'm0' };
    const terms = Array.from({ length: 6 }, (_, i) => gate(`t${i}`, 2, 'term'));
    const n: Netlist = {
      parts: [lever('S'), lever('R'), lever('X'), set, reset, ...terms],
      cords: [
        cord('cS', 'S', ['qs.s']),
        cord('cR', 'R', ['qr.r']),
        cord('qr.out', 'qr', ['qs.fb']),
        cord(
          'cX',
          'X',
          terms.map((t) => `${t.id}.b`),
        ),
        cord('q.out', 'qs', ['qr.fb', ...terms.map((t) => `${t.id}.a`)]),
      ],
    };
    const out = balanceDrive(n, lowMu);
    expect(driveBudget(out, lowMu).every((b) => b.ok)).toBe(true);
    expect(out.cords.find((c) => c.id === 'q.out')?.ports).toContainEqual({ part: 'qr', port: 'fb' });
    expect(invariantsHold(out)).toBe(true);
  });

  it('gives the same ids on every run and leaves a balanced netlist as it is', () => {
    const n = fanOut(20, 1);
    const a = balanceDrive(n, lowMu);
    expect(balanceDrive(n, lowMu)).toEqual(a);
    expect(balanceDrive(a, lowMu)).toBe(a);
  });

  it('keeps a branch no capstan can lift on its driver and leaves that driver unchanged', () => {
    const n = { parts: [lever('L'), gate('g', 1), actuator('gong', 2000)], cords: [cord('c', 'L', ['g.a'], ['gong'])] };
    expect(balanceDrive(n, DEFAULT_PROFILE)).toBe(n);
    const check = checkDrive(n, DEFAULT_PROFILE, []);
    expect(check.ok).toBe(false);
    expect(check.weakestCord).toBe('c');
    expect(check.summary).toContain("cord 'c'");
  });

  it('drops a plan whose buffer cord a per-cord routing makes too lossy, and still balances the other drivers', () => {
    // Two levers, each pulling 20 one-port gates: both fail at μ = 0.15. The profile routes the
    // first buffer cord of M over pins turning 10 rad at μ 0.5 (loss e^5 ≈ 148), so M's buffer
    // `b` cannot carry its group and M's plan is dropped whole; L's plan is tried on its own
    // budgets and lands as it would alone.
    const gates = (d: string) => Array.from({ length: 20 }, (_, i) => gate(`${d}${i + 1}`, 1, 'term'));
    const ofL = gates('l');
    const ofM = gates('m');
    const n: Netlist = {
      parts: [lever('L'), lever('M'), ...ofL, ...ofM],
      cords: [
        cord(
          'c.L',
          'L',
          ofL.map((g) => `${g.id}.a`),
        ),
        cord(
          'c.M',
          'M',
          ofM.map((g) => `${g.id}.a`),
        ),
      ],
    };
    const lossy: Profile = { ...lowMu, cordRouting: { 'c.M.buf1b.out': { pinAngleRad: 10, muPin: 0.5 } } };
    const out = balanceDrive(n, lossy);
    expect(out.cords.find((c) => c.id === 'c.M')).toBe(n.cords[1]);
    expect(out.parts.some((p) => p.id.startsWith('c.M.buf'))).toBe(false);
    const alone = balanceDrive({ parts: [lever('L'), ...ofL], cords: [n.cords[0]] }, lossy);
    expect(out.parts.filter((p) => p.id.startsWith('c.L.buf'))).toEqual(
      alone.parts.filter((p) => p.id.startsWith('c.L.buf')),
    );
    const budgets = driveBudget(out, lossy);
    expect(budgets.find((b) => b.driver === 'L')?.ok).toBe(true);
    expect(budgets.find((b) => b.driver === 'M')?.ok).toBe(false);
    expect(sameLogic(n, out)).toBe(true);
    expect(invariantsHold(out)).toBe(true);
  });

  it('fails the drive check naming the weak cord when μ is absurdly small', () => {
    const absurd: Profile = { ...DEFAULT_PROFILE, mu: 0.01 }; // gain ≈ 1.13: not even one port at margin 2
    const n = fanOut(3, 1);
    const out = balanceDrive(n, absurd);
    expect(out).toBe(n);
    const check = checkDrive(out, absurd, []);
    expect(check.ok).toBe(false);
    expect(check.weakestCord).toBe('c.L');
    expect(check.summary).toContain("cord 'c.L'");
    expect(check.summary).toContain('margin');
  });

  it('keeps the logic and the invariants, and balances whatever buffers can fix, on random fan-outs (property)', () => {
    fc.assert(
      fc.property(
        fc.integer({ min: 1, max: 24 }),
        fc.integer({ min: 1, max: 3 }),
        fc.constantFrom<'lever' | 'gate'>('lever', 'gate'),
        fc.double({ min: 0.05, max: 0.4, noNaN: true }),
        fc.integer({ min: 5, max: 40 }),
        (count, ports, driver, mu, portWeightG) => {
          const p: Profile = { ...DEFAULT_PROFILE, mu, portWeightG };
          const n = fanOut(count, ports, driver);
          const out = balanceDrive(n, p);
          if (!sameLogic(n, out) || !invariantsHold(out)) return false;
          // Every driver passes, or it failed before and is left exactly as it was.
          for (const b of driveBudget(out, p)) {
            if (b.ok) continue;
            const orig = n.cords.filter((c) => c.driver === b.driver);
            const now = out.cords.filter((c) => c.driver === b.driver);
            if (JSON.stringify(orig) !== JSON.stringify(now)) return false;
          }
          // Under the default μ range buffers always suffice.
          if (mu >= 0.2 && portWeightG <= 30 && !driveBudget(out, p).every((b) => b.ok)) return false;
          return true;
        },
      ),
      { seed: 42, numRuns: 150 },
    );
  });
});
