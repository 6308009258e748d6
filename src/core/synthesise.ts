/**
 * Synthesise: a flat (state-minimised) machine and its state codes → a Build.
 *
 *   excite (SR table) → minimise outputs → guard (+ minimise set/reset, prove S·R = 0)
 *   → map to parts → equations
 *
 * Each step is a phase module of its own; this file only wires them, prices the guard's
 * candidate covers by mapping them (so "cheaper" means fewer parts, by the profile's cost
 * weights) and reuses the mapping of the chosen one. The encoding search calls this for every
 * candidate encoding, so nothing here enumerates input combinations.
 *
 * A one-state machine needs no state bits: it is built combinationally with an encoding of
 * 0 bits (its build's `encoding` says so), whatever codes were passed in.
 */
import { complement, type Cube } from './model/cube.js';
import { DiagnosticError, diag } from './model/diagnostics.js';
import type { FlatMachine } from './model/flat.js';
import type { Build, Encoding, Equation } from './model/build.js';
import type { Profile } from './physics/profile.js';
import type { Cord } from './model/netlist.js';
import { excite, type Excitation } from './phases/excite.js';
import { guard, mergeTerms, termsOf, type GuardMethod, type Minimiser } from './phases/guard.js';
import { countParts, mapToParts, partsCost, type Mapped } from './phases/map/index.js';
import { balanceDrive } from './physics/buffer-tree.js';
import { sizeActuators } from './physics/actuators.js';
import { expectedLosses } from './physics/routing.js';
import { minimiseCover } from './phases/minimise-logic/index.js';
import type { MinimiseOptions, MultiFunction, SopCover, Term } from './phases/minimise-logic/types.js';

export interface SynthesisOptions {
  readonly profile: Profile;
  /** Unused codes are don't-cares (default) or go to this state index on every input. */
  readonly unusedCodes?: 'dont-care' | number;
  /** Outputs shown by an actuator instead of a flag: output name → load in grams. */
  readonly actuators?: Readonly<Record<string, number>>;
  /** The forbidden-input guard: one safe method, or 'auto' to keep the cheaper (default). */
  readonly guard?: GuardMethod | 'auto';
  /** The two-level minimiser (default: minimiseCover). */
  readonly minimise?: Minimiser;
  readonly minimiseOptions?: MinimiseOptions;
  /**
   * Measure the guard's cost against an unguarded minimisation (default true). A search that
   * only needs part counts passes false and saves one minimisation per call.
   */
  readonly guardBaseline?: boolean;
  /** Which cords the mapper splits into buffer trees (default: a fixed fan-out limit; the pipeline passes none and balances by force budget instead). */
  readonly tooMany?: (cord: Cord) => boolean;
  /**
   * Work kept between syntheses of one machine under one encoding (`synthesisMemo`): a build
   * that synthesises again with another guard method reuses what the first synthesis computed.
   */
  readonly memo?: SynthesisMemo;
}

/**
 * What syntheses of one machine under one encoding, profile and set of actuators share: the
 * excitation and output cover per unused-code setting, every minimisation by the exact
 * function minimised (the default minimiser and options only), every mapping by its covers,
 * and every balanced netlist. Each is a pure function of what keys it, so a result taken
 * from the memo is the one computing it again would give. A memo used with another machine,
 * codes, profile, actuators or fan-out rule (`tooMany`; compared by identity) is not read:
 * that synthesis works afresh.
 */
export interface SynthesisMemo {
  owner?: {
    readonly f: FlatMachine;
    readonly codes: readonly string[];
    readonly profile: Profile;
    readonly actuators?: Readonly<Record<string, number>>;
    readonly tooMany?: (cord: Cord) => boolean;
  };
  readonly excited: Map<string, { ex: Excitation; out: SopCover }>;
  readonly minimised: Map<string, SopCover>;
  readonly mapped: Map<SopCover, Map<SopCover, Mapped>>;
  readonly balanced: Map<Build['netlist'], Build['netlist']>;
}

/**
 * A memo for the syntheses of one build (see SynthesisMemo), empty or holding minimisations
 * made elsewhere (`keptMinimisations` of another memo, e.g. from a search on another thread):
 * an entry pairs a function, as its key, with the cover the default minimiser gives it, so it
 * answers that function in any synthesis. Anything not shaped as such is left out.
 */
export function synthesisMemo(kept?: unknown): SynthesisMemo {
  const minimised = new Map<string, SopCover>();
  if (Array.isArray(kept))
    for (const entry of kept as unknown[])
      if (Array.isArray(entry) && typeof entry[0] === 'string' && isCover(entry[1])) minimised.set(entry[0], entry[1]);
  return { excited: new Map(), minimised, mapped: new Map(), balanced: new Map() };
}

/** The minimisations of a memo as plain data (key and cover pairs), for `synthesisMemo` elsewhere. */
export function keptMinimisations(memo: SynthesisMemo): [string, SopCover][] {
  return [...memo.minimised];
}

function isCover(v: unknown): v is SopCover {
  if (typeof v !== 'object' || v === null) return false;
  const c = v as Partial<Record<keyof SopCover, unknown>>;
  return typeof c.vars === 'number' && typeof c.functions === 'number' && Array.isArray(c.terms);
}

/** The memo when it belongs to this synthesis (binding an unused one to it), else undefined. */
function memoFor(f: FlatMachine, enc: Encoding, opts: SynthesisOptions): SynthesisMemo | undefined {
  const m = opts.memo;
  if (!m || opts.minimise || opts.minimiseOptions) return undefined;
  m.owner ??= { f, codes: enc.codes, profile: opts.profile, actuators: opts.actuators, tooMany: opts.tooMany };
  const o = m.owner;
  const same =
    o.f === f &&
    o.codes === enc.codes &&
    o.profile === opts.profile &&
    o.actuators === opts.actuators &&
    o.tooMany === opts.tooMany;
  return same ? m : undefined;
}

/** The default minimiser, answering a function it has minimised before from the memo. */
function memoMinimiser(memo: SynthesisMemo | undefined): Minimiser {
  if (!memo) return minimiseCover;
  return (fn, mopts) => {
    if (mopts !== undefined) return minimiseCover(fn, mopts);
    const key = JSON.stringify([fn.vars, fn.on, fn.dc]);
    let cover = memo.minimised.get(key);
    if (!cover) {
      cover = minimiseCover(fn, mopts);
      memo.minimised.set(key, cover);
    }
    return cover;
  };
}

/** Build the lever machine of a flat machine under an encoding. */
export function synthesise(f: FlatMachine, enc: Encoding, opts: SynthesisOptions): Build {
  checkOptions(f, opts);
  const encoding: Encoding = f.states.length === 1 ? { strategy: enc.strategy, bits: 0, codes: [''] } : enc;
  const memo = memoFor(f, enc, opts);
  const minimise = opts.minimise ?? memoMinimiser(memo);
  const { ex, out } = excited(f, encoding, opts, minimise, memo);
  const cache = mappings(out, memo);
  const mapWith = (sr: SopCover): Mapped => {
    let m = cache.get(sr);
    if (!m) {
      m = mapToParts({
        bits: ex.bits,
        inputs: f.inputs,
        outputs: f.outputs,
        startCode: encoding.codes[f.start],
        sr,
        out,
        actuators: opts.actuators,
        profile: opts.profile,
        ...(opts.tooMany ? { tooMany: opts.tooMany } : {}),
      });
      cache.set(sr, m);
    }
    return m;
  };
  const g = guard(ex, {
    method: opts.guard,
    minimise,
    minimiseOptions: opts.minimiseOptions,
    baseline: opts.guardBaseline,
    price: (sr) => {
      const c = mapWith(sr).parts;
      return { gates: c.gates, cords: c.cords, cost: partsCost(c, opts.profile.cost) };
    },
  });
  const mapped = mapWith(g.cover);
  const equations: Equation[] = [];
  for (let j = 0; j < ex.bits; j++)
    equations.push(
      { name: `S${j}`, terms: termsOf(g.cover, 2 * j) },
      { name: `R${j}`, terms: termsOf(g.cover, 2 * j + 1) },
    );
  f.outputs.forEach((name, k) => equations.push({ name, terms: termsOf(out, k) }));
  return {
    machine: f,
    encoding,
    vars: ex.vars,
    equations,
    guard: g.report,
    netlist: mapped.netlist,
    signals: mapped.signals,
    parts: mapped.parts,
  };
}

/** The excitation table and the minimised outputs under these unused codes (from the memo when it has them). */
function excited(
  f: FlatMachine,
  encoding: Encoding,
  opts: SynthesisOptions,
  minimise: Minimiser,
  memo: SynthesisMemo | undefined,
): { ex: Excitation; out: SopCover } {
  const key = String(opts.unusedCodes ?? 'dont-care');
  const known = memo?.excited.get(key);
  if (known) return known;
  const ex = excite(f, encoding, { unusedCodes: opts.unusedCodes });
  const made = { ex, out: minimiseOutputs(ex, minimise, opts.minimiseOptions) };
  memo?.excited.set(key, made);
  return made;
}

/** The mappings made with this output cover, by set/reset cover (kept in the memo, if any). */
function mappings(out: SopCover, memo: SynthesisMemo | undefined): Map<SopCover, Mapped> {
  let m = memo?.mapped.get(out);
  if (!m) {
    m = new Map<SopCover, Mapped>();
    memo?.mapped.set(out, m);
  }
  return m;
}

/**
 * The build with the mapper's fixed fan-out limit replaced by the capstan force budget: every
 * heavy actuator a capstan of its own with the turns its load needs, then buffer trees where a
 * margin fails — each branch at the loss it will have as routed in the frame (expectedLosses).
 * A memo (one build's, see SynthesisMemo; the same profile) answers a netlist balanced before.
 */
export function balanced(b: Build, profile: Profile, memo?: SynthesisMemo): Build {
  const kept = memo?.owner?.profile === profile ? memo.balanced : undefined;
  let netlist = kept?.get(b.netlist);
  if (!netlist) {
    const sized = sizeActuators(b.netlist, profile, expectedLosses(b.netlist, profile));
    netlist = balanceDrive(sized, profile, expectedLosses(sized, profile));
    kept?.set(b.netlist, netlist);
  }
  return netlist === b.netlist ? b : { ...b, netlist, parts: countParts(netlist) };
}

/**
 * Minimise the output functions. Constant outputs are settled without the minimiser; Moore
 * outputs are minimised over the state bits alone (a code where the output is 1 under some
 * input is 1 under all, which is allowed because it is never 0 there), so they decode slave
 * bits only; Mealy outputs are minimised over bits and inputs. Identical terms are merged.
 */
export function minimiseOutputs(ex: Excitation, minimise: Minimiser, mopts?: MinimiseOptions): SopCover {
  const vars = ex.bits + ex.inputs;
  const terms: Term[] = [];
  const moore: number[] = [],
    mealy: number[] = [];
  ex.outputs.forEach((o, k) => {
    if (o.on.length === 0) return; // constant 0: no term
    if (o.off.length === 0) terms.push({ cube: '-'.repeat(vars), outputs: [k] });
    else (o.moore ? moore : mealy).push(k);
  });
  if (moore.length > 0) {
    const codes = (cs: readonly Cube[]): Cube[] => [...new Set(cs.map((c) => c.slice(0, ex.bits)))];
    const fn: MultiFunction = {
      vars: ex.bits,
      on: moore.map((k) => codes(ex.outputs[k].on)),
      dc: moore.map((k) => complement([...codes(ex.outputs[k].on), ...codes(ex.outputs[k].off)], ex.bits)),
    };
    const freeInputs = '-'.repeat(ex.inputs);
    for (const t of minimise(fn, mopts).terms)
      terms.push({ cube: t.cube + freeInputs, outputs: t.outputs.map((i) => moore[i]) });
  }
  if (mealy.length > 0) {
    const fn: MultiFunction = { vars, on: mealy.map((k) => ex.outputs[k].on), dc: mealy.map((k) => ex.outputs[k].dc) };
    for (const t of minimise(fn, mopts).terms) terms.push({ cube: t.cube, outputs: t.outputs.map((i) => mealy[i]) });
  }
  return { vars, functions: ex.outputs.length, terms: mergeTerms(terms) };
}

/** Build options a user can get wrong become LW700 diagnostics. */
function checkOptions(f: FlatMachine, opts: SynthesisOptions): void {
  const u = opts.unusedCodes;
  if (typeof u === 'number' && !(Number.isInteger(u) && u >= 0 && u < f.states.length)) {
    throw new DiagnosticError([
      diag(
        'LW700',
        `unused codes are sent to state number ${u}, but the machine has states 0…${f.states.length - 1}`,
        { path: '$.unusedCodes' },
        'name an existing state',
      ),
    ]);
  }
  for (const [name, load] of Object.entries(opts.actuators ?? {})) {
    if (!f.outputs.includes(name))
      throw new DiagnosticError([
        diag(
          'LW700',
          `actuator for '${name}', which is not an output of ${f.name}`,
          { path: `$.actuators.${name}` },
          'name one of: ' + f.outputs.join(', '),
        ),
      ]);
    if (!(Number.isFinite(load) && load >= 0))
      throw new DiagnosticError([
        diag(
          'LW700',
          `actuator load of '${name}' is ${load} g`,
          { path: `$.actuators.${name}` },
          'give a load in grams, 0 or more',
        ),
      ]);
  }
}
