import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import { coverHolds } from '../../src/core/model/cube.js';
import { DiagnosticError } from '../../src/core/model/diagnostics.js';
import type { Build } from '../../src/core/model/build.js';
import { DEFAULT_PROFILE } from '../../src/core/physics/profile.js';
import { excite } from '../../src/core/phases/excite.js';
import { balanced, synthesise, synthesisMemo } from '../../src/core/synthesise.js';
import { checkForbiddenInput, checkNextStateEquivalence } from '../../src/core/checks/logic.js';
import {
  binaryEncoding,
  fixture,
  netlistViolations,
  oneHotEncoding,
  randomEncoding,
  randomMachine,
  satEquivalent,
  satExclusive,
} from './support/synthesis.js';

/** Everything a build must satisfy, each part checked independently. */
function expectSound(b: Build): void {
  expect(b.guard.ok).toBe(true);
  expect(checkForbiddenInput(b).ok).toBe(true);
  expect(checkNextStateEquivalence(b).ok).toBe(true);
  // MiniSat (npm logic-solver): S_j ∧ R_j UNSAT; next state and outputs equal the spec.
  expect(satExclusive(b)).toBe(true);
  expect(satEquivalent(b)).toBe(true);
  expect(netlistViolations(b.netlist, DEFAULT_PROFILE)).toEqual([]);
}

describe('core/synthesise', () => {
  it('builds random machines that pass both logic checks and the SAT proofs', () => {
    fc.assert(
      fc.property(fc.integer({ min: 0, max: 1e9 }), fc.constantFrom('binary', 'random', 'one-hot'), (seed, kind) => {
        const f = randomMachine(seed, { maxStates: 6, maxInputs: 3, maxOutputs: 2, incomplete: seed % 4 !== 0 });
        const enc =
          kind === 'binary'
            ? binaryEncoding(f)
            : kind === 'one-hot'
              ? oneHotEncoding(f)
              : randomEncoding(f, binaryEncoding(f).bits + 1, seed);
        expectSound(synthesise(f, enc, { profile: DEFAULT_PROFILE }));
      }),
      { seed: 42, numRuns: 20 },
    );
  });

  it("builds LGSynth'91 benchmark machines (open dataset, tests/fixtures/lgsynth91) soundly", () => {
    for (const name of ['lion', 'dk27', 'bbtas', 'mc', 'beecount', 'dk15']) {
      const f = fixture(name);
      const b = synthesise(f, binaryEncoding(f), { profile: DEFAULT_PROFILE });
      expectSound(b);
      expect(b.parts.latches).toBe(2 * b.encoding.bits);
    }
  });

  it('decodes Moore outputs from the slave bits only', () => {
    // dk27's table with outputs made functions of the state alone, though written per row.
    const dk27 = fixture('dk27');
    const f = {
      ...dk27,
      rows: dk27.rows.map((rs, s) => rs.map((r) => ({ ...r, out: [s % 2 === 1 ? 1 : 0, s > 3 ? 1 : 0] as const }))),
    };
    const enc = binaryEncoding(f);
    const ex = excite(f, enc);
    expect(ex.outputs.map((o) => o.moore)).toEqual([true, true]);
    const b = synthesise(f, enc, { profile: DEFAULT_PROFILE });
    for (let k = 0; k < 2; k++) {
      const terms = b.equations[2 * enc.bits + k].terms;
      expect(terms.length).toBeGreaterThan(0);
      for (const t of terms) expect(t.slice(enc.bits)).toBe('-');
    }
    expectSound(b);
  });

  it('sends unused codes to the chosen state in one clock when asked', () => {
    const f = fixture('dk27');
    const enc = binaryEncoding(f); // 7 states in 3 bits: code 111 is unused
    const b = synthesise(f, enc, { profile: DEFAULT_PROFILE, unusedCodes: f.start });
    const target = enc.codes[f.start];
    for (const x of ['0', '1']) {
      const point = '111' + x;
      const next = [0, 1, 2]
        .map((j) =>
          coverHolds(b.equations[2 * j].terms, point)
            ? '1'
            : coverHolds(b.equations[2 * j + 1].terms, point)
              ? '0'
              : point[j],
        )
        .join('');
      expect(next).toBe(target);
    }
    expectSound(b);
  });

  it('can skip the unguarded baseline for a search, and says so', () => {
    const f = fixture('lion');
    const b = synthesise(f, binaryEncoding(f), {
      profile: DEFAULT_PROFILE,
      guardBaseline: false,
      guard: 'split-by-bit',
    });
    expect(b.guard).toMatchObject({ ok: true, method: 'split-by-bit', compared: false });
    expectSound(b);
  });

  it('rejects build options a user can get wrong with LW700', () => {
    const f = fixture('lion');
    const enc = binaryEncoding(f);
    const codeOf = (run: () => unknown): string | undefined => {
      try {
        run();
      } catch (e) {
        return e instanceof DiagnosticError ? e.diagnostics[0].code : 'not a diagnostic';
      }
      return undefined;
    };
    expect(codeOf(() => synthesise(f, enc, { profile: DEFAULT_PROFILE, unusedCodes: 9 }))).toBe('LW700');
    expect(codeOf(() => synthesise(f, enc, { profile: DEFAULT_PROFILE, actuators: { siren: 10 } }))).toBe('LW700');
    expect(codeOf(() => synthesise(f, enc, { profile: DEFAULT_PROFILE, actuators: { z1: -5 } }))).toBe('LW700');
  });

  it("gives the same builds with a memo as without, in every guard and unused-code setting (LGSynth'91 machines, open dataset)", () => {
    const never = (): boolean => false;
    for (const name of ['dk27', 'bbtas', 'beecount', 'dk15', 'mc']) {
      const f = fixture(name);
      const enc = binaryEncoding(f);
      const memo = synthesisMemo();
      const settings = [
        { unusedCodes: 'dont-care' as const, guardBaseline: false },
        { unusedCodes: 'dont-care' as const, guard: 'split-by-bit' as const, guardBaseline: false },
        { unusedCodes: 'dont-care' as const, guard: 'set-first' as const },
        { unusedCodes: f.start },
        { unusedCodes: 'dont-care' as const },
      ];
      for (const s of settings) {
        const o = { profile: DEFAULT_PROFILE, tooMany: never, ...s };
        const fresh = balanced(synthesise(f, enc, o), DEFAULT_PROFILE);
        expect(
          balanced(synthesise(f, enc, { ...o, memo }), DEFAULT_PROFILE, memo),
          `${name} ${JSON.stringify(s)}`,
        ).toEqual(fresh);
      }
      expect(memo.minimised.size).toBeGreaterThan(0);
    }
  });

  it('reads a memo only for the machine, codes, profile and fan-out rule it was first used with', () => {
    const f = fixture('dk27');
    const memo = synthesisMemo();
    const enc = binaryEncoding(f);
    synthesise(f, enc, { profile: DEFAULT_PROFILE, memo });
    const kept = memo.minimised.size;
    const other = oneHotEncoding(f);
    const b = synthesise(f, other, { profile: DEFAULT_PROFILE, memo });
    expect(b).toEqual(synthesise(f, other, { profile: DEFAULT_PROFILE }));
    expect(memo.minimised.size).toBe(kept);
    expect(synthesise(f, enc, { profile: DEFAULT_PROFILE, memo, tooMany: () => true })).toEqual(
      synthesise(f, enc, { profile: DEFAULT_PROFILE, tooMany: () => true }),
    );
    expect(memo.minimised.size).toBe(kept);
  });
});
