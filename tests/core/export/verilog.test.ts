/**
 * The Verilog export against two independent tools:
 * - Yosys (`@yowasp/yosys`, from npm, on every machine) reads the module and its testbench and
 *   elaborates the module; what it built is compared, gate for gate, with our netlist.
 * - Icarus Verilog (`iverilog`, an IEEE 1364 simulator; Debian package `iverilog`) runs each
 *   testbench where it is on PATH. Where it is not, that one test is skipped and says why;
 *   with LW_REQUIRE_IVERILOG=1 (set by .ci/run) a missing iverilog fails it instead.
 */
import { execFileSync } from 'node:child_process';
import { accessSync, constants, mkdtempSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { delimiter, join } from 'node:path';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { Build } from '../../../src/core/model/build.js';
import { DEFAULT_PROFILE } from '../../../src/core/physics/profile.js';
import { commissioningTour } from '../../../src/core/export/tour.js';
import { verilogFiles, type VerilogFiles } from '../../../src/core/export/verilog.js';
import { evilBuild, example, exampleNames } from './support.js';
import { readWithYosys, type YosysNet, type YosysReading } from './yosys.js';

const work = mkdtempSync(join(tmpdir(), 'lw-verilog-'));
afterAll(() => rmSync(work, { recursive: true, force: true }));

const filesOf = (b: Build): VerilogFiles => verilogFiles(b, DEFAULT_PROFILE, commissioningTour(b.machine));

/** The directory on PATH holding an executable `name`, if any. */
function onPath(name: string): string | undefined {
  for (const dir of (process.env.PATH ?? '').split(delimiter).filter(Boolean)) {
    try {
      accessSync(join(dir, name), constants.X_OK);
      return dir;
    } catch {
      // not in this directory
    }
  }
  return undefined;
}

const ICARUS = onPath('iverilog') !== undefined && onPath('vvp') !== undefined;
const REQUIRE_ICARUS = process.env.LW_REQUIRE_IVERILOG === '1';
const NO_ICARUS =
  'Icarus Verilog testbench run did not run: iverilog and vvp are not both on PATH ' +
  '(Debian package iverilog; .ci/run installs it). The Yosys checks of the same exports do run.';
if (!ICARUS && !REQUIRE_ICARUS) console.warn(`core/export/verilog: ${NO_ICARUS}`);

/**
 * Compile the module and its testbench with Icarus Verilog (Debian package `iverilog`, an
 * independent IEEE 1364 simulator) and run the testbench; returns what it printed.
 */
function simulate(b: Build, tag: string): string {
  const v = filesOf(b);
  const dir = mkdtempSync(join(work, `${tag}-`));
  writeFileSync(join(dir, 'machine.v'), v.module);
  writeFileSync(join(dir, 'machine_tb.v'), v.testbench);
  execFileSync(
    'iverilog',
    ['-g2005', '-Wall', '-o', join(dir, 'sim'), join(dir, 'machine.v'), join(dir, 'machine_tb.v')],
    { stdio: 'pipe' },
  );
  return execFileSync('vvp', ['-n', join(dir, 'sim')], { encoding: 'utf8', timeout: 60_000 });
}

/** The same build with one cord cut off its first port (that latch input is never pulled). */
function miswired(b: Build): Build {
  const first = b.netlist.cords.find((c) => c.driver.startsWith('t.'));
  return {
    ...b,
    netlist: {
      ...b.netlist,
      cords: b.netlist.cords.map((c) => (c === first ? { ...c, ports: c.ports.slice(1) } : c)),
    },
  };
}

/** What the module should hold according to our netlist: nets, ports, cell counts and latch pairs. */
interface Expected {
  readonly nets: Map<string, YosysNet>;
  readonly ports: Record<string, 'input' | 'output'>;
  readonly cells: Record<string, number>;
  readonly latches: string[];
}

/**
 * The identifiers the Verilog gave our parts, read from the mapping the file header lists
 * ("<identifier> = output of gate <part id>", …), as the header documents them.
 */
function headerNames(module: string): Map<string, string> {
  const names = new Map<string, string>();
  for (const m of module.matchAll(
    /^\/\/ {3}(\S+) = (output of gate|instance of gate|input lever|lever|output|indicator|module of) (.*)$/gm,
  ))
    names.set(`${m[2]} ${m[3]}`, m[1]);
  return names;
}

/**
 * Our netlist in Yosys's terms (IEEE 1364-2005 §7 gate primitives, as verilog.ts documents the
 * mapping): a gate is a NAND over the drivers of every cord on its ports, i.e. one `$not` over
 * k − 1 two-input `$and` cells; a flag is an AND (NAND when mounted inverted) over its gate's
 * inputs; an actuator a NAND of the drivers of its cords; a pinned output a constant.
 */
function expected(b: Build, module: string): Expected {
  const n = b.netlist;
  const names = headerNames(module);
  const named = (key: string): string => {
    const id = names.get(key);
    if (id === undefined) throw new Error(`the Verilog header does not list "${key}"`);
    return id;
  };
  const sig = (partId: string): string => {
    const p = n.parts.find((q) => q.id === partId);
    if (p?.kind === 'gate') return named(`output of gate ${p.id}`);
    if (p?.kind === 'lever')
      return p.role === 'input' ? named(`input lever ${p.input ?? p.name}`) : (names.get(`lever ${p.role}`) ?? '1');
    throw new Error(`cord driver ${partId} is neither a gate nor a lever`);
  };
  const inputsOf = (partId: string): string[] =>
    n.cords.flatMap((c) => c.ports.filter((r) => r.part === partId).map(() => sig(c.driver))).sort();
  const nets = new Map<string, YosysNet>();
  const cells = { $not: 0, $and: 0 };
  const nand = (ins: string[]): YosysNet => {
    cells.$not++;
    cells.$and += ins.length - 1;
    return { form: 'nand', leaves: ins };
  };
  const gates = n.parts.filter((p) => p.kind === 'gate');
  for (const g of gates) nets.set(sig(g.id), nand(inputsOf(g.id)));
  const ports: Record<string, 'input' | 'output'> = {};
  for (const i of b.machine.inputs) ports[named(`input lever ${i}`)] = 'input';
  for (const role of ['phi1', 'phi2', 'reset'] as const)
    if (names.has(`lever ${role}`)) ports[named(`lever ${role}`)] = 'input';
  for (const o of b.machine.outputs) {
    const out = named(`output ${o}`);
    ports[out] = 'output';
    const part = n.parts.find((q) => q.id === b.signals.outputs[o]);
    if (part?.kind === 'flag' && part.fixed === undefined) {
      const ins = inputsOf(part.gate);
      if (part.inverted) nets.set(out, nand(ins));
      else if (ins.length === 1) nets.set(out, { form: 'wire', leaves: ins });
      else {
        cells.$and += ins.length - 1;
        nets.set(out, { form: 'and', leaves: ins });
      }
    } else if (part?.kind === 'actuator' && part.fixed === undefined) {
      const ds = n.cords
        .filter((c) => c.actuators.includes(part.id))
        .map((c) => sig(c.driver))
        .sort();
      nets.set(out, ds.length > 0 ? nand(ds) : { form: 'const', leaves: ['0'] });
    } else {
      const pinned = part?.kind === 'flag' || part?.kind === 'actuator' ? part.fixed : undefined;
      nets.set(out, { form: 'const', leaves: [String(pinned ?? 0)] });
    }
  }
  const latches = n.parts
    .filter((p) => p.kind === 'latch')
    .map((l) => [sig(l.setGate), sig(l.resetGate)].sort().join(' + '))
    .sort();
  return { nets, ports, cells: Object.fromEntries(Object.entries(cells).filter(([, k]) => k > 0)), latches };
}

/** Cross-coupled pairs in what Yosys built: two nets, each at a leaf of the other's NAND. */
function latchPairs(r: YosysReading): string[] {
  const pairs: string[] = [];
  for (const [a, na] of r.nets)
    for (const [b, nb] of r.nets)
      if (a < b && na.form === 'nand' && nb.form === 'nand' && na.leaves.includes(b) && nb.leaves.includes(a))
        pairs.push(`${a} + ${b}`);
  return pairs.sort();
}

/** Where Yosys's reading differs from what the netlist says (empty when they agree). */
function differences(r: YosysReading, want: Expected): string[] {
  const out: string[] = [];
  const show = (x: YosysNet | undefined): string => (x ? `${x.form}(${x.leaves.join(', ')})` : 'missing');
  for (const [name, w] of want.nets) {
    const got = r.nets.get(name);
    if (show(got) !== show(w)) out.push(`${name}: Yosys has ${show(got)}, the netlist says ${show(w)}`);
  }
  const sorted = (o: Readonly<Record<string, unknown>>): string => JSON.stringify(Object.entries(o).sort());
  if (sorted(r.cells) !== sorted(want.cells))
    out.push(`cells: Yosys has ${JSON.stringify(r.cells)}, the netlist says ${JSON.stringify(want.cells)}`);
  if (sorted(r.ports) !== sorted(want.ports))
    out.push(`ports: Yosys has ${JSON.stringify(r.ports)}, the netlist says ${JSON.stringify(want.ports)}`);
  const pairs = latchPairs(r);
  if (pairs.join('; ') !== want.latches.join('; '))
    out.push(`latches: Yosys has ${pairs.length} (${pairs.join('; ')}), the netlist ${want.latches.length}`);
  return out;
}

/** Every example as the CLI builds it (encoding 'auto'), then the sanitised-names build. */
const builds = (): { tag: string; build: Build }[] => [
  ...exampleNames().map((name) => ({ tag: name, build: example(name, 'auto').build })),
  { tag: 'sanitised names', build: evilBuild().build },
];

describe('core/export/verilog', () => {
  // Yosys (@yowasp/yosys): one run reads every export, and a module with one cord removed.
  let readings: { tag: string; build: Build; module: string; reading: YosysReading }[];
  let cutReading: YosysReading;
  beforeAll(async () => {
    const all = builds().map((x) => ({ ...x, files: filesOf(x.build) }));
    const marble = all.find((x) => x.tag === 'marble-bell.lw');
    if (!marble) throw new Error('examples/marble-bell.lw is missing');
    // The first gate with two or more inputs loses its first input: a cord the Verilog forgot.
    const cut = marble.files.module.replace(/^( {2}nand #\(STAGE\) u_\w+ \(\w+, )\w+, /m, '$1');
    expect(cut).not.toBe(marble.files.module);
    const designs = [...all.map((x) => x.files), { ...marble.files, module: cut }].map((f) => ({
      module: f.module,
      testbench: f.testbench,
      top: f.moduleName,
    }));
    const read = await readWithYosys(designs);
    readings = all.map((x, i) => ({ tag: x.tag, build: x.build, module: x.files.module, reading: read[i] }));
    cutReading = read[read.length - 1];
  });

  it('Yosys reads every export and elaborates the module: one NAND per gate over exactly its cords, latches cross-coupled', () => {
    expect(readings.map((r) => r.tag)).toEqual([...exampleNames(), 'sanitised names']);
    for (const r of readings) {
      const want = expected(r.build, r.module);
      expect(differences(r.reading, want), r.tag).toEqual([]);
      // The counts in words: a $not per gate (and per inverted flag or actuator); a pair per latch.
      const { parts, cords } = r.build.netlist;
      const gates = parts.filter((p) => p.kind === 'gate').length;
      const flipped = parts.filter(
        (p) =>
          (p.kind === 'flag' && p.inverted && p.fixed === undefined) ||
          (p.kind === 'actuator' && p.fixed === undefined && cords.some((c) => c.actuators.includes(p.id))),
      );
      expect(r.reading.cells.$not, r.tag).toBe(gates + flipped.length);
      expect(latchPairs(r.reading), r.tag).toHaveLength(parts.filter((p) => p.kind === 'latch').length);
    }
    // Sequential examples have latches to find; the comparison is not vacuous.
    expect(readings.some((r) => latchPairs(r.reading).length >= 4)).toBe(true);
  });

  it('the comparison with Yosys notices a cord missing from the Verilog', () => {
    const marble = readings.find((r) => r.tag === 'marble-bell.lw');
    if (!marble) throw new Error('no reading of marble-bell.lw');
    const diff = differences(cutReading, expected(marble.build, marble.module));
    expect(diff.some((d) => d.startsWith('cells:'))).toBe(true);
    expect(diff.filter((d) => /^g_\w+: Yosys has nand/.test(d))).toHaveLength(1);
  });

  it('writes one nand per gate, levers as inputs, outputs as outputs, a flag as an and of its gate’s inputs', () => {
    const b = example('marble-bell.lw').build;
    const v = filesOf(b);
    const gates = b.netlist.parts.filter((p) => p.kind === 'gate').length;
    expect(v.module.match(/^\s+nand #\(STAGE\) u_/gm)).toHaveLength(gates);
    expect(v.module).toContain('module lw_marble_bell #(parameter STAGE = 250000) (');
    expect(v.module).toMatch(
      /input wire in_marble,\n\s+input wire phi1,\n\s+input wire phi2,\n\s+input wire reset,\n\s+output wire out_bell/,
    );
    expect(v.module).toMatch(/and #\(STAGE\) f_flag_bell \(out_bell, g_s0_set, g_s1_set\);/);
    expect(v.module).toContain('//   g_t_S0_1 = output of gate t.S0.1');
    expect(v.testbench).toContain('$finish;');
    expect(v.moduleName).toBe('lw_marble_bell');
    expect(v.testbenchName).toBe('lw_marble_bell_tb');
  });

  it('sanitises names with quotes, <, & and formula characters (Yosys reads the result above)', () => {
    const v = filesOf(evilBuild().build);
    for (const text of [v.module, v.testbench]) {
      expect(text).not.toMatch(/[^\t\n\x20-\x7e]/);
      for (const line of text.split('\n')) {
        // Outside comments and string literals, no trace of the names' special characters.
        const code = line.replace(/\/\/.*$/, '').replace(/"(?:[^"\\]|\\.)*"/g, '""');
        expect(code, line).not.toMatch(/[<>&|]|=cmd|\+rung/);
      }
    }
  });

  // Icarus Verilog as an independent simulator checking our netlist against the state table:
  // every example's testbench and the sanitised-names build's pass, a miswired build's fails.
  it('Icarus Verilog: every export’s testbench passes and a miswired build’s fails', (ctx) => {
    if (!ICARUS) {
      if (REQUIRE_ICARUS) throw new Error(`LW_REQUIRE_IVERILOG=1 makes this a failure: ${NO_ICARUS}`);
      ctx.skip(NO_ICARUS);
    }
    for (const { tag, build } of builds()) {
      const out = simulate(build, tag.replace('.lw', '').replace(/\W+/g, '-'));
      expect(out, tag).toContain('PASS');
      expect(out, tag).not.toContain('FAIL');
    }
    const out = simulate(miswired(example('marble-bell.lw').build), 'cut');
    expect(out).toMatch(/FAIL clock \d+: state code is/);
    expect(out).toMatch(/FAIL \d+ mismatches/);
    expect(out).not.toMatch(/^PASS$/m);
  });
});
