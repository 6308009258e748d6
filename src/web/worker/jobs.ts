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
  type DriveResult,
  type EncodeResult,
  type Encoding,
  equationTexts,
  findCheck,
  momentWords,
  operatorForces,
  type Progress,
  runChecks,
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

/** Encode and synthesise, without the checks (they follow in checkJob); `searched`: the search already run on two cores (worker/search.ts). */
export function buildJob(
  a: Analysed,
  s: BuildSettings,
  onProgress?: (p: Progress) => void,
  searched?: EncodeResult,
): { view?: BuildView; built?: Built; diagnostics: Built['diagnostics'] } {
  const b = buildMachine(a, { ...buildOptions(s, onProgress), checks: false, ...(searched ? { searched } : {}) });
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
  const drive = findCheck(checks, 'drive');
  const names = new Map(b.build.netlist.parts.map((p) => [p.id, p.name]));
  const margins: MarginBar[] = (drive?.drivers ?? [])
    .filter((d) => Number.isFinite(d.margin))
    .map((d) => ({ driver: d.driver, label: names.get(d.driver) ?? d.driver, margin: d.margin, ok: d.ok }))
    .sort((x, y) => x.margin - y.margin);
  const forbidden = findCheck(checks, 'forbidden-input');
  const timing = findCheck(checks, 'timing');
  return {
    built,
    view: {
      checks,
      margins,
      minMargin: b.profile.minMargin,
      mu: b.profile.mu,
      muMin: drive?.muMin ?? null,
      muAtMinMargin: drive?.muAtMinMargin ?? null,
      outputLoads: Object.entries(drive?.outputs ?? {}).map(([output, o]) => ({ output, ...o })),
      torque: drive ? torqueBars(drive) : [],
      powerW: drive?.worstPowerW ?? 0,
      ...(timing ? { timing } : {}),
      rules: forbidden?.rules ?? [],
    },
  };
}

/** The worst drum torque of each state, as the drive check found it (no snapshot is simulated again here). */
export function torqueBars(drive: Pick<DriveResult, 'worstByState'>): TorqueBar[] {
  return drive.worstByState.map((w) => ({ state: w.where.state, torqueNm: w.torqueNm, at: momentWords(w.where) }));
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
