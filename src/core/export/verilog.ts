/**
 * Structural Verilog (IEEE 1364-2005) of a build, with a self-checking testbench, so that an
 * independent simulator (e.g. Icarus Verilog) can check our netlist against the state table.
 *
 * The module: the input, clock and reset levers are module inputs (a lever's capstan output is
 * 1 exactly when it is pulled, so the lever's signal is the input itself); every gate —
 * latch gates included, which are cross-coupled through their feedback cords — is one `nand`
 * primitive over the drivers of every cord on every port, with delay #STAGE (the profile's
 * stage delay in microseconds; `timescale 1us/1us`); a flag reads Z = AND of its gate's
 * ports, modelled by an `and` primitive over the same inputs with the same delay (a `nand`
 * when the flag is mounted inverted), so it moves when its gate does; an actuator shows 1
 * while a cord on it pulls, i.e. a `nand` of its drivers; a fixed output is a constant.
 *
 * The testbench drives the commissioning sequence (tour.ts) with the two-phase hand procedure
 * — reset; per clock: set the inputs, wait, compare the outputs with the state table (the
 * outputs shown while the inputs are held, before φ1; free outputs are not compared), pull φ1,
 * release, pull φ2, release, then compare the slave latches' Q outputs with the next state's
 * code — waiting SETTLE (STAGE × (gates + 4), longer than any chain) after every move. It
 * prints `PASS`, or one `FAIL …` line per mismatch and a final `FAIL n mismatches`, then calls
 * $finish. Expected values come from the minimised state table, not from our simulator.
 *
 * Identifiers: names are mangled to simple identifiers (escape.ts, VerilogNames): inputs
 * `in_<name>`, outputs `out_<name>`, gate nets `g_<part id>`, gate instances `u_<part id>`,
 * indicator instances `f_<part id>`; the clock and reset inputs are `phi1`, `phi2`, `reset`;
 * the module is `lw_<machine name>` and the testbench `lw_<machine name>_tb`. The file
 * header lists every mapping, so a name in a simulator's output can be traced to its part.
 */
import type { Build } from '../model/build.js';
import type { Part } from '../model/netlist.js';
import type { Profile } from '../physics/profile.js';
import { verilogComment as vc, VerilogNames, verilogString as vs } from './escape.js';
import type { TourClock } from './tour.js';

/** What each identifier prefix stands for, in the file header's name list. */
const NAMESPACE_WORDS: Readonly<Record<string, string>> = {
  '': 'lever',
  lw_: 'module of',
  in_: 'input lever',
  out_: 'output',
  g_: 'output of gate',
  u_: 'instance of gate',
  f_: 'indicator',
};

/** The module and testbench texts, and the names a caller needs to run them. */
export interface VerilogFiles {
  /** The structural module. */
  readonly module: string;
  /** The testbench module (instantiates the structural one). */
  readonly testbench: string;
  readonly moduleName: string;
  readonly testbenchName: string;
}

/** Fixed port names of a sequential build. */
type FixedPorts = { readonly phi1: string; readonly phi2: string; readonly reset: string };

/** What the module's lines need: the names (registered in a fixed order), nets and cords. */
interface ModuleContext {
  readonly build: Build;
  readonly names: VerilogNames;
  readonly outPort: (o: string) => string;
  /** The net of a part's output (a constant 1 when it has none). */
  readonly sig: (id: string) => string;
  /** Drivers of the cords on each part's ports, by part id. */
  readonly inputsOf: ReadonlyMap<string, readonly string[]>;
}

/** A gate input list: the drivers, or a constant 1 when there are none. */
function inputList(ins: readonly string[]): string {
  return (ins.length > 0 ? ins : ["1'b1"]).join(', ');
}

/** The net of every lever and gate output, by part id. */
function partNets(
  build: Build,
  names: VerilogNames,
  fixed: FixedPorts | undefined,
  inPort: (i: string) => string,
): Map<string, string> {
  const net = new Map<string, string>();
  for (const p of build.netlist.parts) {
    if (p.kind === 'lever') {
      if (p.role === 'input') net.set(p.id, inPort(p.input ?? p.name));
      else if (fixed) net.set(p.id, fixed[p.role]);
    } else if (p.kind === 'gate') net.set(p.id, names.get('g_', p.id));
  }
  return net;
}

/** The line that drives output `o`: its flag, its actuator, or a constant. */
function outputLine(c: ModuleContext, o: string): string {
  const n = c.build.netlist;
  const part = n.parts.find((q) => q.id === c.build.signals.outputs[o]);
  const out = c.outPort(o);
  if (part?.kind === 'flag') {
    if (part.fixed !== undefined) return `  assign ${out} = 1'b${part.fixed}; // ${vc(part.name)}, pinned`;
    const ins = (c.inputsOf.get(part.gate) ?? []).map(c.sig);
    const how = `${vc(part.name)}: Z of ${vc(part.gate)}${part.inverted ? ', mounted inverted' : ''}`;
    return `  ${part.inverted ? 'nand' : 'and'} #(STAGE) ${c.names.get('f_', part.id)} (${out}, ${inputList(ins)}); // ${how}`;
  }
  if (part?.kind === 'actuator') {
    const ds = n.cords.filter((cd) => cd.actuators.includes(part.id)).map((cd) => c.sig(cd.driver));
    if (part.fixed !== undefined || ds.length === 0)
      return `  assign ${out} = 1'b${part.fixed ?? 0}; // ${vc(part.name)}, no cord`;
    return `  nand ${c.names.get('f_', part.id)} (${out}, ${ds.join(', ')}); // ${vc(part.name)}: lifted while a cord pulls`;
  }
  return `  assign ${out} = 1'b0; // no part shows this output`;
}

/** The module's statements: one nand per gate, then one line per output. */
function moduleBody(c: ModuleContext, gates: readonly Part[]): string[] {
  const body: string[] = [];
  for (const g of gates) {
    const ins = (c.inputsOf.get(g.id) ?? []).map(c.sig);
    body.push(`  nand #(STAGE) ${c.names.get('u_', g.id)} (${c.sig(g.id)}, ${inputList(ins)}); // ${vc(g.name)}`);
  }
  for (const o of c.build.machine.outputs) body.push(outputLine(c, o));
  return body;
}

/** The file header: what the module is, and every mangled name with what it stands for. */
function moduleHeader(build: Build, names: VerilogNames): string[] {
  return [
    `// Structural Verilog (IEEE 1364-2005) of the lever machine ${vc(build.machine.name)}, written by Latchwright.`,
    '// Every gate is a NAND over every cord on every port; a latch is two cross-coupled gates.',
    "// A lever's signal is 1 exactly when it is pulled. Delays are gate stages of STAGE microseconds.",
    '// Identifiers were mangled from part ids and names (Latchwright docs/build-documents.md):',
    ...names.entries().map(([prefix, from, to]) => `//   ${to} = ${NAMESPACE_WORDS[prefix] ?? 'name'} ${vc(from)}`),
  ];
}

/** Structural Verilog of the build and a testbench that steps `tour` and checks it. */
export function verilogFiles(
  build: Build,
  profile: Pick<Profile, 'stageDelayS'>,
  tour: readonly TourClock[],
): VerilogFiles {
  const names = new VerilogNames();
  const f = build.machine;
  const n = build.netlist;
  const seq = build.encoding.bits > 0 && build.signals.phi1 !== '';
  // Reserve the fixed port names first, so no mangled name can take them.
  const fixed = seq
    ? { phi1: names.get('', 'phi1'), phi2: names.get('', 'phi2'), reset: names.get('', 'reset') }
    : undefined;
  const moduleName = names.get('lw_', f.name);
  const testbenchName = names.get('lw_', `${f.name}_tb`);
  const inPort = (i: string): string => names.get('in_', i);
  const outPort = (o: string): string => names.get('out_', o);
  const net = partNets(build, names, fixed, inPort);
  const inputsOf = new Map<string, string[]>();
  for (const c of n.cords) for (const r of c.ports) inputsOf.set(r.part, [...(inputsOf.get(r.part) ?? []), c.driver]);
  const sig = (id: string): string => net.get(id) ?? "1'b1";
  const gates = n.parts.filter((p) => p.kind === 'gate');
  const body = moduleBody({ build, names, outPort, sig, inputsOf }, gates);
  const stageUs = Math.max(1, Math.round(profile.stageDelayS * 1e6));
  const ports = [
    ...f.inputs.map((i) => `input wire ${inPort(i)}`),
    ...(fixed ? [`input wire ${fixed.phi1}`, `input wire ${fixed.phi2}`, `input wire ${fixed.reset}`] : []),
    ...f.outputs.map((o) => `output wire ${outPort(o)}`),
  ];
  const module = [
    ...moduleHeader(build, names),
    '`timescale 1us / 1us',
    `module ${moduleName} #(parameter STAGE = ${stageUs}) (`,
    ports.map((x) => `  ${x}`).join(',\n'),
    ');',
    ...(gates.length > 0 ? [`  wire ${gates.map((g) => sig(g.id)).join(', ')};`] : []),
    ...body,
    'endmodule',
    '',
  ].join('\n');
  const tb = { names, moduleName, testbenchName, fixed, inPort, outPort, sig, stageUs, gateCount: gates.length };
  const testbench = testbenchText(build, tour, tb);
  return { module, testbench, moduleName, testbenchName };
}

interface TbContext {
  readonly names: VerilogNames;
  readonly moduleName: string;
  readonly testbenchName: string;
  readonly fixed?: FixedPorts;
  readonly inPort: (i: string) => string;
  readonly outPort: (o: string) => string;
  readonly sig: (id: string) => string;
  readonly stageUs: number;
  readonly gateCount: number;
}

function testbenchText(build: Build, tour: readonly TourClock[], c: TbContext): string {
  const f = build.machine;
  const codes = build.encoding.codes;
  const ins = f.inputs.map(c.inPort);
  const outs = f.outputs.map(c.outPort);
  const ctl = c.fixed ? [c.fixed.phi1, c.fixed.phi2, c.fixed.reset] : [];
  const slaves = build.signals.slaves.map((s) => {
    const latch = build.netlist.parts.find((p) => p.id === s);
    return latch?.kind === 'latch' ? `dut.${c.sig(latch.setGate)}` : "1'bx";
  });
  const lines: string[] = [
    `// Self-checking testbench of ${c.moduleName}: the commissioning sequence, ${tour.length} clocks.`,
    '`timescale 1us / 1us',
    `module ${c.testbenchName};`,
    ...[...ins, ...ctl].map((r) => `  reg ${r};`),
    ...outs.map((o) => `  wire ${o};`),
    '  integer errors;',
    `  localparam STAGE = ${c.stageUs};`,
    `  localparam SETTLE = STAGE * ${c.gateCount + 4};`,
    `  ${c.moduleName} #(.STAGE(STAGE)) dut (${[...ins, ...ctl, ...outs].map((x) => `.${x}(${x})`).join(', ')});`,
    '  initial begin',
    '    errors = 0;',
    ...[...ins, ...ctl].map((r) => `    ${r} = 1'b0;`),
    '    #SETTLE;',
  ];
  const reset = (): void => {
    if (c.fixed) lines.push(`    ${c.fixed.reset} = 1'b1; #SETTLE; ${c.fixed.reset} = 1'b0; #SETTLE;`);
  };
  reset();
  tour.forEach((t, i) => {
    const clock = i + 1;
    if (t.reset) reset();
    lines.push(`    // clock ${clock}: ${vc(f.states[t.state])} -> ${vc(f.states[t.next])}`);
    if (ins.length > 0) lines.push(`    ${ins.map((r, k) => `${r} = 1'b${t.inputs[k]};`).join(' ')} #SETTLE;`);
    f.rows[t.state][t.row].out.forEach((v, k) => {
      if (v === '-') return;
      lines.push(
        `    if (${outs[k]} !== 1'b${v}) begin errors = errors + 1; $display("FAIL clock ${clock}: output ${vs(f.outputs[k])} is %b, expected ${v}", ${outs[k]}); end`,
      );
    });
    if (c.fixed && slaves.length > 0) {
      const fx = c.fixed;
      lines.push(
        `    ${fx.phi1} = 1'b1; #SETTLE; ${fx.phi1} = 1'b0; #SETTLE; ${fx.phi2} = 1'b1; #SETTLE; ${fx.phi2} = 1'b0; #SETTLE;`,
      );
      const want = codes[t.next];
      const got = `{${slaves.join(', ')}}`;
      lines.push(
        `    if (${got} !== ${slaves.length}'b${want}) begin errors = errors + 1; $display("FAIL clock ${clock}: state code is %b, expected ${want} (${vs(f.states[t.next])})", ${got}); end`,
      );
    }
  });
  lines.push(
    '    if (errors == 0) $display("PASS");',
    '    else $display("FAIL %0d mismatches", errors);',
    '    $finish;',
    '  end',
    'endmodule',
    '',
  );
  return lines.join('\n');
}
