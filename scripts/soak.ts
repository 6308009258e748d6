/**
 * The trust campaign: machines made the way people write them, run through every form,
 * encoding and setting, each build held to a reference interpreter of the JSON form
 * (scripts/soak/reference.ts, written from the machine's semantics) and to the xstate
 * library, the checks' verdicts held to the same reference, and now and then the Verilog
 * export elaborated by Yosys (@yowasp/yosys). Seeded: the same seed and count give the same
 * machines.
 *
 *   node --import tsx scripts/soak.ts --seed 1 --count 200 [--only forms,build,verilog]
 *        [--builds 2] [--verilog-every 50] [--large] [--out findings.jsonl]
 *
 * Areas (--only): forms (both forms read alike, round trips, xstate's actor), build (every
 * encoding and setting explored against the reference, the checks' verdicts, mutant specs),
 * verilog (Yosys elaborates the export), xstate (configurations imported and held to xstate),
 * fuzz (edited texts and JSON), cli (command lines in memory). --large: 8–14 states, 3–5 inputs.
 *
 * Prints counts per area and every finding (area, kind, words, the setting, the machine in
 * the JSON form); exits 1 when there is a finding.
 */
import { readFileSync, readdirSync, writeFileSync } from 'node:fs';
import { runYosys } from '@yowasp/yosys';
import { DEFAULT_PROFILE, loadProfile, type Profile } from '../src/core/index.js';
import { cliRun } from './soak/cli-fuzz.js';
import { randomMachine } from './soak/generate.js';
import { bump, fuzzMachine, runMachine, verilogOf, type Finding, type Tally } from './soak/machine.js';
import { Rng } from './soak/random.js';
import { importAgainstXstate, randomXstateConfig } from './soak/xstate-gen.js';
import type { SpecJson } from './soak/reference.js';

interface Options {
  seed: number;
  count: number;
  only: Set<string>;
  builds: number;
  verilogEvery: number;
  out?: string;
  large: boolean;
}

function options(argv: readonly string[]): Options {
  const o: Options = {
    seed: 1,
    count: 100,
    only: new Set(['forms', 'build', 'verilog', 'xstate', 'fuzz', 'cli']),
    builds: 2,
    verilogEvery: 50,
    large: false,
  };
  for (let i = 0; i < argv.length; i++) {
    const v = argv[i + 1];
    if (argv[i] === '--seed') o.seed = Number(v);
    else if (argv[i] === '--count') o.count = Number(v);
    else if (argv[i] === '--builds') o.builds = Number(v);
    else if (argv[i] === '--verilog-every') o.verilogEvery = Number(v);
    else if (argv[i] === '--only') o.only = new Set(v.split(','));
    else if (argv[i] === '--out') o.out = v;
    else if (argv[i] === '--large') {
      o.large = true;
      continue;
    } else continue;
    i++;
  }
  return o;
}

function profiles(): { name: string; profile: Profile }[] {
  const dir = new URL('../examples/profiles/', import.meta.url);
  const out = [{ name: 'default', profile: DEFAULT_PROFILE }];
  for (const f of readdirSync(dir)
    .filter((x) => x.endsWith('.json'))
    .sort()) {
    const p = loadProfile(JSON.parse(readFileSync(new URL(f, dir), 'utf8')), f).profile;
    if (p) out.push({ name: f, profile: p });
  }
  return out;
}

/** Elaborate Verilog modules with Yosys, one run for all; the failures in words. */
async function elaborate(
  designs: { module: string; testbench: string; top: string; machine: number }[],
): Promise<Finding[]> {
  const found: Finding[] = [];
  for (const d of designs) {
    let log = '';
    const keep = (b: Uint8Array | null): void => {
      if (b) log += new TextDecoder().decode(b);
    };
    try {
      await runYosys(
        ['-q', '-p', `read_verilog -defer m.v tb.v; hierarchy -check -top ${d.top}; proc; flatten`],
        { 'm.v': d.module, 'tb.v': d.testbench },
        { stdout: keep, stderr: keep },
      );
    } catch (e) {
      found.push({ area: 'verilog', kind: 'rejected', words: `machine ${d.machine}: ${log.trim() || String(e)}` });
    }
  }
  return found;
}

/** An xstate configuration: imported and held to xstate's actor, then built and held to the reference. */
function xstateMachine(t: Tally, r: Rng, i: number, ps: { name: string; profile: Profile }[], builds: number): void {
  const config = randomXstateConfig(r, i);
  bump(t, 'xstate configs');
  try {
    const x = importAgainstXstate(r, config);
    if (x.difference)
      t.findings.push({
        area: 'xstate import',
        kind: 'differs',
        words: `${x.difference} in ${JSON.stringify(config)}`,
      });
    if (!x.spec) {
      bump(t, `xstate configs: rejected ${x.diagnostics[0]?.slice(0, 60)}`);
      return;
    }
    if (builds >= 0) runMachine(t, x.spec, r, ps, Math.min(builds, 1));
  } catch (e) {
    t.findings.push({ area: 'xstate import', kind: 'crash', words: `${String(e)} in ${JSON.stringify(config)}` });
  }
}

async function main(): Promise<void> {
  const o = options(process.argv.slice(2));
  const t: Tally = { counts: new Map(), findings: [] };
  const ps = profiles();
  const designs: { module: string; testbench: string; top: string; machine: number }[] = [];
  const machines = new Map<number, SpecJson>();
  for (let i = 0; i < o.count; i++) {
    const r = new Rng(o.seed * 1_000_003 + i);
    const m = randomMachine(r, i, o.large);
    const before = t.findings.length;
    bump(t, 'machines');
    const run = runMachine(t, m, r, ps, o.only.has('build') ? o.builds : -1);
    if (o.only.has('verilog') && run.built && i % o.verilogEvery === 0) {
      designs.push({ ...verilogOf(run.built), machine: i });
      bump(t, 'verilog: elaborated');
    }
    if (o.only.has('fuzz')) fuzzMachine(t, m, randomXstateConfig(r, i), r);
    if (o.only.has('cli')) {
      const c = await cliRun(r, m);
      bump(t, `cli: exit ${c.status ?? 'thrown'}`);
      if (c.problem) t.findings.push({ area: 'cli', kind: 'fault', words: `${c.argv.join(' ')}: ${c.problem}` });
    }
    if (o.only.has('xstate')) xstateMachine(t, new Rng(o.seed * 1_000_003 + i + 0x5eed), i, ps, o.builds);
    if (t.findings.length > before) machines.set(i, m);
    for (const f of t.findings.slice(before)) Object.assign(f, { machine: i });
    if ((i + 1) % 50 === 0) console.error(`… ${i + 1} machines, ${t.findings.length} findings`);
  }
  t.findings.push(...(await elaborate(designs)));
  for (const [k, v] of [...t.counts].sort()) console.log(`${k.padEnd(48)} ${v}`);
  const lines = t.findings.map((f) => {
    const i = (f as Finding & { machine?: number }).machine;
    return JSON.stringify({ ...f, ...(i !== undefined ? { spec: machines.get(i) } : {}) });
  });
  console.log(`\n${t.findings.length} findings`);
  for (const f of t.findings) console.log(`- [${f.area}/${f.kind}] ${f.setting ?? ''} ${f.words.slice(0, 300)}`);
  if (o.out) writeFileSync(o.out, lines.join('\n') + '\n');
  process.exitCode = t.findings.length > 0 ? 1 : 0;
}

await main();
