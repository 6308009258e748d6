/**
 * The build report as data: what `build --json` prints and what the text report, the web
 * designer and the build sheet read. Pure.
 */
import type { Analysed, Built } from './pipeline.js';
import { printCubes } from './forms/expr.js';
import { billOfMaterials } from './physics/bom.js';
import { operatorForces } from './physics/operator.js';
import { profileChanges } from './physics/profile-load.js';
import type { Profile } from './physics/profile.js';
import type { CheckBase } from './model/build.js';

/** The `machine` block that `check --json` and `build --json` share: counts and names. */
export function machineBlock(a: Analysed) {
  return {
    name: a.machine.name,
    states: a.machine.states.length,
    reachable: a.machine.states.length - a.minimised.unreachable.length,
    minimized: a.minimised.machine.states.length,
    inputs: a.machine.inputs.length,
    outputs: a.machine.outputs.length,
    inputNames: a.machine.inputs,
    outputNames: a.machine.outputs,
  };
}

/** Equations as readable expressions over q-bits and inputs ('0' when a function has no term). */
export function equationTexts(b: Built): { name: string; expr: string }[] {
  return b.build.equations.map((e) => ({
    name: e.name,
    expr: e.terms.length === 0 ? '0' : printCubes(e.terms, b.build.vars),
  }));
}

/**
 * A check as `build --json` gives it: its summary (and its findings' words) in SI, the typed
 * words the documents write in the workshop's units left out.
 */
function siOnly<C extends CheckBase>(check: C): C {
  const { says: _, ...rest } = check;
  if (!('findings' in rest) || !Array.isArray(rest.findings)) return rest as C;
  const findings = (rest.findings as { says?: unknown; hintSays?: unknown }[]).map(
    ({ says: _s, hintSays: _h, ...f }) => f,
  );
  return { ...rest, findings } as unknown as C;
}

const mm = (m: number): number => Math.round(m * 1000) / 1000;

/**
 * The `layout` block: how the bays were ordered, each drum's length and bay count, the cord to
 * cut against the same routing in the netlist's own order (measured in the same run), the cord
 * along the channels (what the order minimises) and the pulleys. Metres, to the millimetre.
 */
export function layoutBlock(b: Pick<Built, 'placement'>) {
  const p = b.placement;
  return {
    method: p.method,
    exact: p.exact,
    drums: p.drums.map((d) => ({ lengthM: mm(d.lengthM), bays: d.bays.length })),
    totalCordM: mm(p.totalCordM),
    baselineCordM: mm(p.baselineCordM),
    channelM: mm(p.channelM),
    baselineChannelM: mm(p.baselineChannelM),
    pulleys: p.pulleys,
  };
}

/** The `profile` block: the file and description of the profile used, and every value that differs from the defaults with its source. */
export function profileBlock(profile: Profile) {
  return {
    ...(profile.about?.file !== undefined ? { file: profile.about.file } : {}),
    ...(profile.about?.description !== undefined ? { description: profile.about.description } : {}),
    changes: profileChanges(profile),
  };
}

/**
 * What the fault simulation of the commissioning sheet found (export/sheet-faults.ts
 * `coverageBlock`, made by the shell with the documents so it runs once): counts of cord faults
 * shown, by kind.
 */
export interface CommissioningCoverage {
  readonly faults: number;
  readonly collapsed: number;
  readonly simulated: number;
  readonly sampled: boolean;
  readonly shown: number;
}

/** The whole report as one JSON-ready object; `commissioning`, when given, is the sheet's coverage of cord faults. */
export function buildReport<C extends CommissioningCoverage>(b: Built, commissioning?: C) {
  const f = b.build.machine;
  return {
    machine: machineBlock(b.analysed),
    merged: b.analysed.minimised.merged,
    encoding: {
      strategy: b.build.encoding.strategy,
      bits: b.build.encoding.bits,
      codes: Object.fromEntries(f.states.map((s, i) => [s, b.build.encoding.codes[i]])),
      ...(b.search ? { search: b.search } : {}),
    },
    parts: b.build.parts,
    layout: layoutBlock(b),
    profile: profileBlock(b.profile),
    guard: b.build.guard,
    equations: equationTexts(b),
    checks: b.checks.map(siOnly),
    ok: b.checks.every((c) => c.ok),
    // Data for programs: the notes' sizes in SI whatever the workshop's units.
    bom: billOfMaterials(b.build.netlist, { ...b.profile, documentUnits: 'metric' }, b.placement),
    operatorForces: operatorForces(b.build.netlist, b.profile),
    ...(commissioning ? { commissioning } : {}),
    netlist: b.build.netlist,
    diagnostics: b.diagnostics,
  };
}
