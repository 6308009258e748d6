/**
 * Yosys (the npm package `@yowasp/yosys`, Yosys compiled to WebAssembly, so it runs wherever
 * Node runs) as an independent Verilog front end for the export tests: it parses the module
 * and its testbench, elaborates the module, and we read back what it built — its cell counts
 * (`stat -json`) and its netlist (`write_json`) — to compare with our own netlist.
 *
 * Several designs go through one Yosys run (each is elaborated, written out, and then
 * dropped with `design -reset`), because starting the WebAssembly module costs about a second.
 *
 * The testbench is parsed but not elaborated (`read_verilog -defer`, and only the module is
 * named as the top): Yosys is a synthesis tool and runs an `initial` block's `$finish` while
 * elaborating, which ends the run; the testbench is for simulators.
 */
import { runYosys } from '@yowasp/yosys';

/** One design to hand to Yosys: the module text, its testbench and the module's name. */
export interface YosysDesign {
  readonly module: string;
  readonly testbench: string;
  readonly top: string;
}

/** How a net is made, as Yosys elaborated it, after `hierarchy; proc; flatten`. */
export interface YosysNet {
  /** 'nand' when a `$not` drives it over a tree of `$and`, 'and' for the tree alone, 'const' for a constant. */
  readonly form: 'nand' | 'and' | 'const' | 'wire';
  /** The named nets (ports and gate nets) at the leaves of its `$and` tree, sorted; '0'/'1' for constants. */
  readonly leaves: readonly string[];
}

/** What Yosys made of one design. */
export interface YosysReading {
  /** `stat -json`: cells by type (e.g. `$and`, `$not`). */
  readonly cells: Readonly<Record<string, number>>;
  /** Module ports by name, with their direction. */
  readonly ports: Readonly<Record<string, 'input' | 'output'>>;
  /** Every named net of the module (no `$` names), by how it is driven. */
  readonly nets: ReadonlyMap<string, YosysNet>;
}

interface JsonCell {
  readonly type: string;
  readonly connections: Readonly<Record<string, readonly (number | string)[]>>;
}
interface JsonModule {
  readonly ports: Readonly<
    Record<string, { readonly direction: 'input' | 'output'; readonly bits: readonly number[] }>
  >;
  readonly cells: Readonly<Record<string, JsonCell>>;
  readonly netnames: Readonly<Record<string, { readonly bits: readonly (number | string)[] }>>;
}
interface StatJson {
  readonly modules: Readonly<Record<string, { readonly num_cells_by_type: Readonly<Record<string, number>> }>>;
}

const decoder = new TextDecoder();

/**
 * Read every design with Yosys in one run; the readings in the same order. Throws with Yosys's
 * own messages (which name the file `d<i>.v` or `d<i>_tb.v` and the line) when it rejects one.
 */
export async function readWithYosys(designs: readonly YosysDesign[]): Promise<YosysReading[]> {
  const files: Record<string, string> = {};
  const script: string[] = [];
  designs.forEach((d, i) => {
    files[`d${i}.v`] = d.module;
    files[`d${i}_tb.v`] = d.testbench;
    script.push(
      `read_verilog -defer d${i}.v d${i}_tb.v`,
      `hierarchy -check -top ${d.top}`,
      'proc -noopt',
      'flatten',
      `tee -q -o d${i}.stat.json stat -json`,
      `write_json d${i}.json`,
      'design -reset',
    );
  });
  let log = '';
  const keep = (b: Uint8Array | null): void => {
    if (b) log += decoder.decode(b, { stream: true });
  };
  let out: Record<string, unknown>;
  try {
    out = (await runYosys(['-q', '-p', script.join('; ')], files, { stdout: keep, stderr: keep })) as Record<
      string,
      unknown
    >;
  } catch (e) {
    throw new Error(`Yosys rejected the Verilog: ${log.trim() || String(e)}`, { cause: e });
  }
  return designs.map((d, i) => {
    const stat = JSON.parse(String(out[`d${i}.stat.json`])) as StatJson;
    const json = JSON.parse(String(out[`d${i}.json`])) as { modules: Record<string, JsonModule> };
    const m = json.modules[d.top];
    const statModule = Object.entries(stat.modules).find(([name]) => name.replace(/^\\/, '') === d.top)?.[1];
    if (!m || !statModule) throw new Error(`Yosys did not elaborate module ${d.top}`);
    const ports: Record<string, 'input' | 'output'> = {};
    for (const [name, p] of Object.entries(m.ports)) ports[name] = p.direction;
    return { cells: statModule.num_cells_by_type, ports, nets: namedNets(m) };
  });
}

/**
 * Every named net, traced back through the `$not` and the tree of `$and` cells that Yosys
 * makes of a gate primitive. An output port that Yosys merged with another named net (an
 * `and` of one input is that input) is a 'wire' whose leaf is the other net.
 */
function namedNets(m: JsonModule): Map<string, YosysNet> {
  const driver = new Map<number | string, JsonCell>();
  for (const c of Object.values(m.cells)) for (const b of c.connections.Y ?? []) driver.set(b, c);
  const namesOf = new Map<number | string, string[]>();
  for (const [name, n] of Object.entries(m.netnames))
    if (!name.startsWith('$') && n.bits.length === 1) namesOf.set(n.bits[0], [...(namesOf.get(n.bits[0]) ?? []), name]);
  const isOutput = (name: string): boolean => m.ports[name]?.direction === 'output';
  // The leaves under `bit`: go down through `$and` cells whose output has no name of its own.
  const tree = (bit: number | string): string[] => {
    const c = driver.get(bit);
    if (c?.type === '$and' && !namesOf.has(bit)) return [...tree(c.connections.A[0]), ...tree(c.connections.B[0])];
    if (typeof bit === 'string') return [bit];
    return [namesOf.get(bit)?.find((x) => !isOutput(x)) ?? namesOf.get(bit)?.[0] ?? `unnamed bit ${bit}`];
  };
  const nets = new Map<string, YosysNet>();
  for (const [bit, names] of namesOf) {
    const c = driver.get(bit);
    for (const name of names) {
      const others = names.filter((x) => x !== name && !isOutput(x));
      if (typeof bit === 'string') nets.set(name, { form: 'const', leaves: [bit] });
      else if (isOutput(name) && others.length > 0) nets.set(name, { form: 'wire', leaves: others.sort() });
      else if (c?.type === '$not') nets.set(name, { form: 'nand', leaves: tree(c.connections.A[0]).sort() });
      else if (c?.type === '$and')
        nets.set(name, { form: 'and', leaves: [...tree(c.connections.A[0]), ...tree(c.connections.B[0])].sort() });
      else nets.set(name, { form: 'wire', leaves: others.sort() });
    }
  }
  return nets;
}
