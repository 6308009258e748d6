/**
 * The worker's jobs as plain functions (testable without a worker): read a machine, build it,
 * check it, compare encodings. Each returns a view for the page (protocol.ts); the pipeline
 * in src/core/pipeline.ts does the work.
 */
import {
  analyse,
  type Analysed,
  billOfMaterials,
  buildMachine,
  type BuildOptions,
  type Built,
  compareEncodings,
  DEFAULT_PROFILE,
  type DriveCheck,
  driveSnapshots,
  drumLoad,
  type Encoding,
  equationTexts,
  type ForbiddenInputResult,
  operatorForces,
  type Progress,
  runChecks,
  type TimingResult,
} from '../../core/index.js';
import { layoutDiagram } from '../diagram/layout.js';
import type { BuildSettings, BuildView, ChecksView, CodeRow, MarginBar, Reading, TorqueBar } from './protocol.js';

/** Parse, validate and minimise; lay out the diagram when the machine is sound. */
export function readJob(text: string, file: string): { reading: Reading; analysed?: Analysed } {
  const a = analyse(text, file);
  if (!a.ok) return { reading: { ok: false, form: a.form, diagnostics: a.diagnostics } };
  const m = a.minimised;
  const reading: Reading = {
    ok: true,
    form: a.form,
    diagnostics: a.diagnostics,
    machine: a.machine,
    merged: m.merged,
    reduced: m.machine.states,
    unreachable: m.unreachable,
    method: m.method,
    layout: layoutDiagram(a.machine, m.merged, m.unreachable),
  };
  return { reading, analysed: a };
}

/** Build options from the page's settings. */
export function buildOptions(s: BuildSettings, onProgress?: (p: Progress) => void): BuildOptions {
  const kept: Encoding | undefined = 'kept' in s.encoding ? s.encoding.kept : undefined;
  return {
    encoding: kept ? () => kept : 'strategy' in s.encoding ? s.encoding.strategy : 'binary',
    seed: s.seed,
    unusedCodes: s.unusedCodes,
    profile: DEFAULT_PROFILE,
    ...(onProgress ? { onProgress } : {}),
  };
}

/** Encode and synthesise, without the checks (they follow in checkJob). */
export function buildJob(
  a: Analysed,
  s: BuildSettings,
  onProgress?: (p: Progress) => void,
): { view?: BuildView; built?: Built; diagnostics: Built['diagnostics'] } {
  const b = buildMachine(a, { ...buildOptions(s, onProgress), checks: false });
  if (!b.ok) return { diagnostics: b.diagnostics };
  const view: BuildView = {
    build: b.build,
    profile: b.profile,
    equations: equationTexts(b),
    guard: b.build.guard,
    bom: billOfMaterials(b.build.netlist, b.profile),
    forces: operatorForces(b.build.netlist, b.profile),
    ...(b.search ? { search: b.search } : {}),
    diagnostics: b.diagnostics,
  };
  return { view, built: b, diagnostics: b.diagnostics };
}

/** Run every check of a build; returns the checked build and the page's view of it. */
export function checkJob(b: Built, seed: number): { built: Built; view: ChecksView } {
  const checks = runChecks(b.build, b.analysed, b.profile, seed);
  const built: Built = { ...b, checks };
  const drive = checks.find((c) => c.name === 'drive') as DriveCheck | undefined;
  const names = new Map(b.build.netlist.parts.map((p) => [p.id, p.name]));
  const margins: MarginBar[] = (drive?.drivers ?? [])
    .filter((d) => Number.isFinite(d.margin))
    .map((d) => ({ driver: d.driver, label: names.get(d.driver) ?? d.driver, margin: d.margin, ok: d.ok }))
    .sort((x, y) => x.margin - y.margin);
  const drum = drumLoad(b.build.netlist, b.profile, driveSnapshots(b.build, b.profile, seed));
  const torque = torqueByState(b.build.machine.states, drum.snapshots);
  const forbidden = checks.find((c) => c.name === 'forbidden-input') as ForbiddenInputResult | undefined;
  const timing = checks.find((c) => c.name === 'timing') as TimingResult | undefined;
  return {
    built,
    view: {
      checks,
      margins,
      minMargin: b.profile.minMargin,
      torque,
      powerW: drum.worst.powerW,
      ...(timing ? { timing } : {}),
      rules: forbidden?.rules ?? [],
    },
  };
}

/** The worst snapshot of each state (snapshot labels start with the state's name and a comma). */
export function torqueByState(
  states: readonly string[],
  snapshots: readonly { label: string; torqueNm: number }[],
): TorqueBar[] {
  const worst = new Map<string, TorqueBar>();
  for (const s of snapshots) {
    const cut = s.label.indexOf(', ');
    const state = cut < 0 ? s.label : s.label.slice(0, cut);
    const at = cut < 0 ? '' : s.label.slice(cut + 2);
    const w = worst.get(state);
    if (!w || s.torqueNm > w.torqueNm) worst.set(state, { state, torqueNm: s.torqueNm, at });
  }
  return states.flatMap((s) => {
    const w = worst.get(s);
    return w ? [w] : [];
  });
}

/** Every encoding side by side, priced by the finished build's part count. */
export function compareJob(a: Analysed, s: BuildSettings, onProgress?: (p: Progress) => void): CodeRow[] {
  return compareEncodings(a, buildOptions(s, onProgress)).map((r) => ({
    strategy: r.strategy,
    ok: r.ok,
    ...(r.encoding ? { encoding: r.encoding } : {}),
    ...(r.parts ? { parts: r.parts } : {}),
    ...(r.termGates !== undefined ? { termGates: r.termGates } : {}),
    ...(r.guard ? { guard: r.guard } : {}),
    ...(r.cost !== undefined ? { cost: r.cost } : {}),
    cheapest: r.cheapest,
    ...(r.ok ? {} : { problem: r.diagnostics[0]?.message ?? 'does not fit this machine' }),
  }));
}
