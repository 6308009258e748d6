/**
 * One machine through the campaign: both forms read, the round trips, the builds of several
 * settings each explored against the reference, the checks' verdicts held to it, and now and
 * then the Verilog export elaborated by Yosys. Every finding is returned, never thrown.
 */
import {
  analyse,
  buildDocuments,
  buildMachine,
  checkEquivalence,
  exportXstate,
  findCheck,
  importXstate,
  machineToJson,
  printTextMachine,
  type Analysed,
  type BuildOptions,
  type Built,
  type Diagnostic,
  type Profile,
} from '../../src/core/index.js';
import { commissioningDisagreement } from './commissioning-ref.js';
import { driveDisagreement } from './drive-ref.js';
import { explore } from './explore.js';
import { recoveryDisagreement, resetDisagreement } from './recovery-ref.js';
import { timingDisagreement } from './timing-ref.js';
import { editJson, editText } from './fuzz.js';
import { textForm } from './generate.js';
import type { Rng } from './random.js';
import { Reference, type SpecJson } from './reference.js';
import { compareWithXstate } from './xstate-ref.js';

export interface Finding {
  readonly area: string;
  readonly kind: string;
  readonly words: string;
  readonly setting?: string;
}

export interface Tally {
  readonly counts: Map<string, number>;
  readonly findings: Finding[];
}

export function bump(t: Tally, key: string, by = 1): void {
  t.counts.set(key, (t.counts.get(key) ?? 0) + by);
}

const ENCODINGS = ['binary', 'gray', 'johnson', 'one-hot', 'auto'] as const;

function errorWords(e: unknown): string {
  return e instanceof Error
    ? `${e.name}: ${e.message} @ ${(e.stack ?? '').split('\n').slice(1, 4).join(' | ')}`
    : String(e);
}

/** A diagnostic a user can act on: a stable code, a message and a place (file with line or JSON path). */
function badDiagnostic(d: Diagnostic, needPlace: boolean): string | undefined {
  if (!/^LW\d{3}$/.test(d.code)) return `code '${d.code}'`;
  if (!d.message) return `${d.code} without a message`;
  if (needPlace && d.severity === 'error' && d.location.line === undefined && d.location.path === undefined)
    return `${d.code} without a line or path: ${d.message}`;
  return undefined;
}

function checkDiagnostics(
  t: Tally,
  area: string,
  ds: readonly Diagnostic[],
  needPlace: boolean,
  setting?: string,
): void {
  for (const d of ds) {
    const bad = badDiagnostic(d, needPlace);
    if (bad) t.findings.push({ area, kind: 'diagnostic', words: bad, ...(setting ? { setting } : {}) });
    if (d.severity === 'error')
      bump(t, `${area}: rejected ${d.code} ${d.message.replace(/'[^']*'/g, "'…'").slice(0, 60)}`);
  }
}

/** The canonical JSON of a machine without its description (the text form's header comment). */
function canonical(a: Analysed): string {
  const { description: _d, ...rest } = machineToJson(a.machine);
  return JSON.stringify(rest);
}

function readForms(t: Tally, m: SpecJson, r: Rng): { text?: Analysed; json?: Analysed; source: string } {
  const source = textForm(r, m);
  const read = (s: string, file: string, form: string): Analysed | undefined => {
    try {
      const a = analyse(s, file);
      bump(t, `forms: ${form} ${a.ok ? 'read' : 'rejected'}`);
      if (!a.ok) checkDiagnostics(t, 'forms', a.diagnostics, true);
      return a.ok ? a : undefined;
    } catch (e) {
      t.findings.push({ area: 'forms', kind: 'crash', words: `${form}: ${errorWords(e)}` });
      return undefined;
    }
  };
  const text = read(source, 'soak.lw', 'text');
  const json = read(JSON.stringify(m, null, r.chance(0.5) ? 2 : undefined), 'soak.json', 'json');
  if (!text !== !json) t.findings.push({ area: 'forms', kind: 'disagree', words: 'one form read, the other rejected' });
  else if (text && json && canonical(text) !== canonical(json))
    t.findings.push({ area: 'forms', kind: 'disagree', words: `text ${canonical(text)} vs json ${canonical(json)}` });
  return { ...(text ? { text } : {}), ...(json ? { json } : {}), source };
}

function roundTrips(t: Tally, a: Analysed, ref: Reference, r: Rng): void {
  try {
    const again = analyse(printTextMachine(a.machine), 'again.lw');
    bump(t, 'round trip: text');
    if (!again.ok || canonical(again) !== canonical(a))
      t.findings.push({
        area: 'round trip',
        kind: 'text',
        words: again.ok ? canonical(again) : again.diagnostics[0]?.message,
      });
    const x = exportXstate(a.machine);
    bump(t, `round trip: xstate ${x.form}`);
    if (x.form === 'levers') {
      const back = importXstate(JSON.parse(JSON.stringify(x.config)), 'again.json');
      if (!back.machine)
        t.findings.push({ area: 'round trip', kind: 'xstate', words: back.diagnostics[0]?.message ?? '' });
      else {
        const diff = sameSteps(ref, new Reference(machineToJson(back.machine)));
        if (diff) t.findings.push({ area: 'round trip', kind: 'xstate levers', words: diff });
      }
    }
    const diff = compareWithXstate(a.machine, ref, r);
    bump(t, 'xstate reference: machines');
    if (diff) t.findings.push({ area: 'xstate reference', kind: 'differs', words: diff });
  } catch (e) {
    t.findings.push({ area: 'round trip', kind: 'crash', words: errorWords(e) });
  }
}

/**
 * Every state × allowed combination stepped by both references, inputs matched by name (an
 * import orders its inputs by first use; an input it lacks is never answered, so pulled or
 * not it changes nothing); `b` may fix what `a` leaves free. The first difference in words.
 */
function sameSteps(a: Reference, b: Reference): string | undefined {
  const inB = (x: string): string =>
    b.spec.inputs.map((n) => (a.spec.inputs.includes(n) ? x[a.spec.inputs.indexOf(n)] : '0')).join('');
  for (const s of a.spec.states)
    for (const x of a.assignments) {
      if (a.isNever(x)) continue;
      const p = a.step(s.name, x);
      const q = b.step(s.name, inB(x));
      const outputs = a.spec.outputs.every(
        (o, k) => p.outputs[k] === null || p.outputs[k] === q.outputs[b.spec.outputs.indexOf(o)],
      );
      if ((p.next !== null && p.next !== q.next) || !outputs)
        return `state '${s.name}' inputs ${x}: ${JSON.stringify(p)} before, ${JSON.stringify(q)} after`;
    }
  return undefined;
}

export interface Setting {
  readonly label: string;
  readonly options: BuildOptions;
}

/** The settings a machine is built with: the default, then a few drawn from every choice. */
export function settings(
  r: Rng,
  m: SpecJson,
  profiles: readonly { name: string; profile: Profile }[],
  k: number,
): Setting[] {
  const out: Setting[] = [{ label: 'auto', options: {} }];
  const pinned = m.states.some((s) => s.code !== undefined);
  for (let i = 0; i < k; i++) {
    const encoding = pinned && r.chance(0.4) ? 'pinned' : r.pick(ENCODINGS);
    const unused = r.pick([undefined, 'dont-care', r.pick(m.states).name]);
    const p = r.pick(profiles);
    const seed = r.chance(0.3) ? r.int(2, 10_000) : 1;
    const label = `${encoding}${unused ? ` --unused ${unused}` : ''} profile=${p.name} seed=${seed}`;
    out.push({ label, options: { encoding, ...(unused ? { unusedCodes: unused } : {}), profile: p.profile, seed } });
  }
  return out;
}

/** Build one setting and hold the build and its checks to the reference. */
function buildOne(t: Tally, a: Analysed, ref: Reference, s: Setting, r: Rng): Built | undefined {
  let b: ReturnType<typeof buildMachine>;
  try {
    b = buildMachine(a, { seed: 1, ...s.options });
    if (b.ok && s.options.seed === undefined) {
      // The same setup twice must give the same build (CONVENTIONS.md: deterministic on purpose).
      const again = buildMachine(a, { seed: 1, ...s.options });
      if (again.ok && JSON.stringify(again.build.netlist) !== JSON.stringify(b.build.netlist))
        t.findings.push({
          area: 'build',
          kind: 'not deterministic',
          words: 'two builds of one setup differ',
          setting: s.label,
        });
    }
  } catch (e) {
    t.findings.push({ area: 'build', kind: 'crash', words: errorWords(e), setting: s.label });
    return undefined;
  }
  if (!b.ok) {
    bump(t, 'build: rejected');
    checkDiagnostics(t, 'build', b.diagnostics, false, s.label);
    return undefined;
  }
  bump(t, 'build: built');
  const x = explore(b.build, ref, b.profile, r);
  bump(t, `explore: pairs`, x.pairs);
  bump(t, `explore: clocks`, x.clocks);
  if (!x.complete) bump(t, 'explore: stopped at the bound');
  const eq = findCheck(b.checks, 'equivalence');
  const fi = findCheck(b.checks, 'forbidden-input');
  const profile = /profile=(\S+)/.exec(s.label)?.[1] ?? 'default';
  for (const c of b.checks)
    bump(t, `check ${c.name}: ${c.ok ? 'pass' : `fail (${profile}, unused ${s.options.unusedCodes ?? 'default'})`}`);
  const wrong = x.difference && x.difference.kind !== 'never-alarm';
  if (x.difference)
    t.findings.push({
      area: 'behaviour',
      kind: x.difference.kind,
      words: `${x.difference.words} after [${x.difference.path.join(' ')}]`,
      setting: s.label,
    });
  if (eq && x.complete && eq.ok === !!wrong)
    t.findings.push({
      area: 'verdict',
      kind: 'equivalence',
      words: `check says ${eq.ok ? 'pass' : `fail (${eq.summary})`}, reference says ${wrong ? 'different' : 'same'}`,
      setting: s.label,
    });
  if (fi?.ok && x.difference && x.difference.kind !== 'output')
    t.findings.push({
      area: 'verdict',
      kind: 'forbidden-input',
      words: `check passes, ${x.difference.words}`,
      setting: s.label,
    });
  const recovery = recoveryDisagreement(b, ref);
  const rec = findCheck(b.checks, 'recovery');
  if (rec?.checked === 'all' && rec.codes.length > 0)
    bump(t, `recovery reference: compared (${rec.ok ? 'recovers' : 'locks up'})`);
  if (recovery) t.findings.push({ area: 'verdict', kind: 'recovery', words: recovery, setting: s.label });
  const reset = resetDisagreement(b, ref);
  if (reset) t.findings.push({ area: 'behaviour', kind: 'reset', words: reset, setting: s.label });
  const timing = timingDisagreement(b, ref, r);
  if (timing) t.findings.push({ area: 'verdict', kind: 'timing', words: timing, setting: s.label });
  const drive = driveDisagreement(b);
  if (drive) t.findings.push({ area: 'verdict', kind: 'drive', words: drive, setting: s.label });
  const layout = findCheck(b.checks, 'layout');
  if (
    layout?.ok &&
    (layout.drums.length > layout.drumsAllowed || layout.drums.some((d) => d.lengthM > layout.longestDrumM + 1e-9))
  )
    t.findings.push({ area: 'verdict', kind: 'layout', words: `layout passes: ${layout.summary}`, setting: s.label });
  return b;
}

/** A spec like m with one thing changed: an output value, a target, or a guard negated. */
function mutant(r: Rng, m: SpecJson): SpecJson {
  const x = structuredClone(m) as { -readonly [K in keyof SpecJson]: SpecJson[K] } & {
    states: {
      name: string;
      outputs?: Record<string, 0 | 1 | '-'>;
      transitions: { when?: string; to: string; outputs?: Record<string, 0 | 1 | '-'> }[];
    }[];
  };
  const s = r.pick(x.states);
  const roll = r.next();
  if (roll < 0.4 || s.transitions.length === 0) {
    const o = r.pick(x.outputs);
    s.outputs = { ...s.outputs, [o]: s.outputs?.[o] === 1 ? 0 : 1 };
  } else {
    const t = r.pick(s.transitions);
    if (roll < 0.6) t.to = r.pick(x.states).name;
    else if (roll < 0.8) t.when = t.when === undefined ? '0' : `!(${t.when})`;
    else {
      const o = r.pick(x.outputs);
      t.outputs = { ...t.outputs, [o]: t.outputs?.[o] === 1 ? 0 : 1 };
    }
  }
  return x;
}

/**
 * The equivalence check asked about a build against a spec it was not built from (one thing
 * changed): its verdict must be the reference's.
 */
function mutantProbe(t: Tally, b: Built, m: SpecJson, r: Rng, label: string): void {
  const spec = mutant(r, m);
  const a = analyse(JSON.stringify(spec), 'mutant.json');
  if (!a.ok) return;
  bump(t, 'mutants: probed');
  const eq = checkEquivalence(b.build, { original: a.flat }, b.profile);
  const x = explore(b.build, new Reference(spec), b.profile, r);
  const wrong = !!x.difference && x.difference.kind !== 'never-alarm';
  bump(t, `mutants: ${wrong ? 'different' : 'same'}`);
  if (x.complete && eq.complete && eq.ok === wrong)
    t.findings.push({
      area: 'verdict',
      kind: 'equivalence (mutant)',
      words: `check says ${eq.ok ? 'pass' : `fail (${eq.summary})`}, reference says ${wrong ? `different: ${x.difference?.words} after [${x.difference?.path.join(' ')}]` : 'same'}; mutant ${JSON.stringify(spec)}`,
      setting: label,
    });
}

/** Pins for a second build of a built machine: a latch or gate moved to a random bay. */
function pinSetting(r: Rng, b: Built): Setting {
  const ids = b.build.netlist.parts.filter((p) => p.kind === 'latch' || p.kind === 'gate').map((p) => p.id);
  const bays = b.placement.bays.length;
  const pins = Object.fromEntries(r.sample(ids, r.int(1, 2)).map((id) => [id, { bay: r.int(1, bays + 1) }]));
  return { label: `auto --pin ${JSON.stringify(pins)}`, options: { pins } };
}

export interface MachineRun {
  readonly built?: Built;
}

/** Everything the campaign does with one machine. */
export function runMachine(
  t: Tally,
  m: SpecJson,
  r: Rng,
  profiles: readonly { name: string; profile: Profile }[],
  builds: number,
): MachineRun {
  const ref = new Reference(m);
  const forms = readForms(t, m, r);
  const a = forms.json ?? forms.text;
  if (!a) return {};
  roundTrips(t, a, ref, r);
  let first: Built | undefined;
  for (const s of settings(r, m, profiles, builds)) {
    const use = r.chance(0.5) && forms.text ? forms.text : a;
    const b = buildOne(t, use, ref, s, r);
    first ??= b;
  }
  if (first && r.chance(0.3)) buildOne(t, a, ref, pinSetting(r, first), r);
  if (first) {
    bump(t, 'commissioning sheet: read');
    try {
      const sheet = commissioningDisagreement(first, first.analysed, ref);
      if (sheet) t.findings.push({ area: 'documents', kind: 'commissioning', words: sheet, setting: 'auto' });
    } catch (e) {
      t.findings.push({ area: 'documents', kind: 'crash', words: errorWords(e), setting: 'auto' });
    }
  }
  if (first) for (let k = 0; k < 3; k++) mutantProbe(t, first, m, r, 'auto');
  return first ? { built: first } : {};
}

/** The Verilog pair of a build: module text, testbench and the module's name. */
export function verilogOf(b: Built): { module: string; testbench: string; top: string } {
  const docs = buildDocuments(b);
  const module = docs.get('machine.v') ?? '';
  const testbench = docs.get('machine_tb.v') ?? '';
  const top = /^module\s+(\\?[^\s(]+)/m.exec(module)?.[1] ?? '';
  return { module, testbench, top };
}

/**
 * A value typed twice must be refused, never read over the first: an output given two values in
 * one `with` list (LW106), a key written twice in a JSON object (LW109).
 */
function typedTwice(t: Tally, m: SpecJson, r: Rng): void {
  const text = textForm(r, m);
  const twice = text.replace(
    / with ([A-Za-z_][A-Za-z0-9_]*)=([01-])/,
    (_all, o: string, v: string) => ` with ${o}=${v}, ${o}=${v === '1' ? 0 : 1}`,
  );
  const json = JSON.stringify(m).replace(/"start":("[^"]*")/, '"start":$1,"start":$1');
  for (const [source, file, code] of [
    [twice, 'twice.lw', 'LW106'],
    [json, 'twice.json', 'LW109'],
  ] as const) {
    if (source === (file === 'twice.lw' ? text : JSON.stringify(m))) continue;
    bump(t, `typed twice: ${code}`);
    const a = analyse(source, file);
    if (a.ok || !a.diagnostics.some((d) => d.code === code))
      t.findings.push({
        area: 'forms',
        kind: 'typed twice',
        words: `${file} read without ${code}: ${a.diagnostics.map((d) => d.code).join(' ')}`,
      });
  }
}

/** Edited texts of one machine (and of an xstate configuration): read, and built when they read. */
export function fuzzMachine(t: Tally, m: SpecJson, config: unknown, r: Rng): void {
  typedTwice(t, m, r);
  const texts: [string, string, string][] = [
    ['text', editText(r, textForm(r, m)), 'fuzz.lw'],
    ['text', editText(r, textForm(r, m)), 'fuzz.lw'],
    ['json', JSON.stringify(editJson(r, m), null, 1), 'fuzz.json'],
    ['json', JSON.stringify(editJson(r, m)), 'fuzz.json'],
    ['xstate', JSON.stringify(editJson(r, config), null, 1), 'fuzz.json'],
  ];
  if (r.chance(0.2)) texts.push(['json', editText(r, JSON.stringify(m, null, 1)), 'fuzz.json']);
  for (const [form, text, file] of texts) {
    let a: ReturnType<typeof analyse>;
    try {
      a = analyse(text, file);
    } catch (e) {
      t.findings.push({
        area: 'fuzz',
        kind: 'crash',
        words: `${form}: ${errorWords(e)} reading ${JSON.stringify(text)}`,
      });
      continue;
    }
    bump(t, `fuzz: ${form} ${a.ok ? 'read' : 'rejected'}`);
    if (!a.ok) {
      checkDiagnostics(t, 'fuzz', a.diagnostics, true);
      if (!a.diagnostics.some((d) => d.severity === 'error'))
        t.findings.push({
          area: 'fuzz',
          kind: 'diagnostic',
          words: `rejected without an error: ${JSON.stringify(text)}`,
        });
      continue;
    }
    const spec = machineToJson(a.machine) as unknown as SpecJson;
    const s = { label: `fuzz ${form}`, options: { encoding: r.pick(ENCODINGS.slice(0, 4)) } };
    try {
      buildOne(t, a, new Reference(spec), s, r);
    } catch (e) {
      t.findings.push({
        area: 'fuzz',
        kind: 'crash',
        words: `${form} build: ${errorWords(e)} of ${JSON.stringify(text)}`,
      });
    }
  }
}
