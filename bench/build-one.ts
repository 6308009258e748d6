/**
 * One build for the build table (build-table.ts runs this in a child process, so that its peak
 * resident memory is the build's own): `node --import tsx bench/build-one.ts SOURCE [ENCODING]`
 * where SOURCE is a machine file or `random:STATES:INPUTS:OUTPUTS:SEED`, and ENCODING a named
 * encoding (default: the searched codes). It builds as the command line does (the encoding
 * search on worker threads from 130 states, every check) and prints one JSON line:
 * the wall time of the whole build, of the encoding search and of the checks, the parts cost,
 * whether every check passed, and the peak resident memory.
 */
import { readFileSync } from 'node:fs';
import { availableParallelism } from 'node:os';
import { performance } from 'node:perf_hooks';
import { analyse, buildMachine, type EncodeStrategy, flatToJsonText, randomFlatMachine } from '../src/core/index.js';
import { partsCost } from '../src/core/phases/map/index.js';
import { searchOnThreads } from '../src/cli/search-pool.js';

/** What the child prints. */
export interface BuildFigures {
  readonly ok: boolean;
  readonly states: number;
  readonly minimised: number;
  readonly ms: number;
  readonly searchMs: number;
  readonly checkMs: number;
  readonly cost: number;
  readonly checksPassed: boolean;
  /** The checks that fail, the layout check with its drum count. */
  readonly failing?: readonly string[];
  readonly peakRssMb: number;
  readonly problem?: string;
  /** `layout.totalCordM` and `layout.baselineCordM` of the build, as `build --json` reports them. */
  readonly cordM?: number;
  readonly baselineCordM?: number;
}

function sourceText(source: string): { text: string; file: string } {
  const m = /^random:(\d+):(\d+):(\d+):(\d+)$/.exec(source);
  if (!m) return { text: readFileSync(source, 'utf8'), file: source };
  const [s, i, o, seed] = m.slice(1).map(Number);
  return { text: flatToJsonText(randomFlatMachine(s, i, o, seed)), file: `${source}.json` };
}

async function buildOne(source: string, encoding?: EncodeStrategy): Promise<BuildFigures> {
  const { text, file } = sourceText(source);
  const t0 = performance.now();
  const a = analyse(text, file);
  const peak = (): number => Math.round(process.resourceUsage().maxRSS / 1024);
  if (!a.ok)
    return {
      ok: false,
      states: 0,
      minimised: 0,
      ms: 0,
      searchMs: 0,
      checkMs: 0,
      cost: 0,
      checksPassed: false,
      peakRssMb: peak(),
      problem: a.diagnostics[0]?.code,
    };
  const t1 = performance.now();
  const chosen = encoding ? { encoding } : {};
  const searched = await searchOnThreads(a, chosen, availableParallelism());
  const searchMs = performance.now() - t1;
  let checkMs = 0;
  const b = buildMachine(a, {
    ...chosen,
    ...(searched ? { searched } : {}),
    now: () => performance.now(),
    onPhase: (phase, ms) => {
      if (phase === 'check') checkMs = ms;
    },
  });
  const ms = performance.now() - t0;
  const states = a.flat.states.length;
  const minimised = a.minimised.machine.states.length;
  if (!b.ok)
    return {
      ok: false,
      states,
      minimised,
      ms,
      searchMs,
      checkMs,
      cost: 0,
      checksPassed: false,
      peakRssMb: peak(),
      problem: b.diagnostics.find((d) => d.severity === 'error')?.code,
    };
  return {
    ok: true,
    states,
    minimised,
    ms,
    searchMs,
    checkMs,
    cost: partsCost(b.build.parts, b.profile.cost),
    checksPassed: b.checks.every((c) => c.ok),
    failing: b.checks
      .filter((c) => !c.ok)
      .map((c) =>
        c.name === 'layout' ? `layout (${c.drums.length} drums; a frame carries ${c.drumsAllowed})` : c.name,
      ),
    peakRssMb: peak(),
    cordM: b.placement.totalCordM,
    baselineCordM: b.placement.baselineCordM,
  };
}

const [source, encoding] = process.argv.slice(2);
if (source) process.stdout.write(JSON.stringify(await buildOne(source, encoding as EncodeStrategy | undefined)) + '\n');
