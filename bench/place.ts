/**
 * Placement and routing benchmark (part of `npm run bench`, bench/run.ts; also runs alone:
 *   node --import tsx bench/place.ts [fixture …]   — fixtures for section 3, default s298 and s1488)
 * 1. the exact arrangement (subset dynamic programming) on random one-drum builds of growing
 *    size, beside the heuristic on the same build;
 * 2. every example, built as `latchwright build` builds it: total cord and cord along the channel
 *    against the netlist's own order, measured in the same run;
 * 3. the largest LGSynth'91 builds given (binary encoding): placement plus routing under the
 *    shipped profile and on one long drum;
 * 4. the cord saved against the netlist order, median over the examples and every LGSynth'91
 *    fixture that builds — total cord and cord along the channel, each figure for what it is.
 * Figures are medians of several runs; the machine may be shared, so read ratios, not
 * absolute times. Never a test.
 */
import { readFileSync, readdirSync } from 'node:fs';
import { pathToFileURL } from 'node:url';
import { analyse, buildMachine, place, type Built, type Placement } from '../src/core/index.js';
import { DEFAULT_PROFILE, type Profile } from '../src/core/physics/index.js';
import { frameUnits } from '../src/core/phases/place/index.js';
import { randomNetlist } from '../tests/core/phases/place/support.js';
import { median, middle } from './median.js';
import { ms, type BenchRow } from './row.js';

export type PlaceBenchRow = BenchRow;

const ONE_DRUM: Profile = { ...DEFAULT_PROFILE, frame: { ...DEFAULT_PROFILE.frame, longestDrumM: 1000 } };
const pct = (a: number, b: number): string => `${((1 - a / b) * 100).toFixed(1)} %`;
const pc = (x: number): string => `${(x * 100).toFixed(1)} %`;

/**
 * Share of cord saved against the netlist order: along the channel, and in all; and, on one
 * drum, the most any order could save. On one drum a cord's trunk and drop and a branch's
 * rise and knots are the same in every order (a cord rises straight only when every lever it
 * pulls is in its own driver's bay), so the order changes only the runs along the channel,
 * and no order can save more than the channel's share of the netlist order's cord.
 */
interface Saved {
  readonly channel: number;
  readonly total: number;
  /** baselineChannelM / baselineCordM when the build sits on one drum; undefined otherwise. */
  readonly bound: number | undefined;
}

const savedOf = (p: Placement): Saved => ({
  channel: 1 - p.channelM / p.baselineChannelM,
  total: 1 - p.totalCordM / p.baselineCordM,
  bound: p.drums.length === 1 ? p.baselineChannelM / p.baselineCordM : undefined,
});

/** A build with cord to route: one that minimises to a single state with fixed outputs has none. */
const hasCord = (p: Placement): boolean => p.baselineCordM > 0;

function built(text: string, file: string, encoding: 'auto' | 'binary'): Built | undefined {
  const a = analyse(text, file);
  if (!a.ok) return undefined;
  const b = buildMachine(a, { encoding, checks: false });
  return b.ok ? b : undefined;
}

function exactSection(out: string[]): PlaceBenchRow {
  out.push('### Exact arrangement (one drum, random builds)', '');
  out.push('| bays | units | exact | heuristic | heuristic / exact cord along the channel |', '|---|---|---|---|---|');
  let row12: PlaceBenchRow | undefined;
  for (const bays of [8, 10, 12, 14, 16]) {
    const n = randomNetlist(2024 + bays, bays);
    const units = frameUnits(n, ONE_DRUM).units.length;
    let exact: Placement | undefined;
    let heuristic: Placement | undefined;
    const te = median(3, () => (exact = place(n, ONE_DRUM, { exactLimit: 2 ** 22 })));
    const th = median(3, () => (heuristic = place(n, ONE_DRUM, { exactLimit: 0 })));
    const ratio = exact && heuristic && exact.channelM > 0 ? (heuristic.channelM / exact.channelM).toFixed(4) : '—';
    out.push(`| ${bays} | ${units} | ${ms(te)} (${exact?.method ?? '—'}) | ${ms(th)} | ${ratio} |`);
    if (bays === 12)
      row12 = {
        name: `exact placement, 12 bays (random one-drum build, ${units} units)`,
        figure: ms(te),
        reference: `heuristic on the same build ${ms(th)}`,
        ratio: `${(te / th).toFixed(2)}×`,
        goal: '< 1 s',
      };
  }
  out.push('');
  return row12 as PlaceBenchRow;
}

function exampleSection(out: string[]): Saved[] {
  out.push('### Examples (shipped profile, as `latchwright build` builds them)', '');
  out.push(
    '| example | bays | drums | method | place + route | total cord | netlist order | saved | along the channel | netlist order | saved |',
    '|---|---|---|---|---|---|---|---|---|---|---|',
  );
  const saved: Saved[] = [];
  for (const f of readdirSync('examples')
    .filter((x) => x.endsWith('.lw'))
    .sort()) {
    const b = built(readFileSync(`examples/${f}`, 'utf8'), f, 'auto');
    if (!b) continue;
    let p: Placement = b.placement;
    const t = median(3, () => (p = place(b.build.netlist, DEFAULT_PROFILE)));
    saved.push(savedOf(p));
    out.push(
      `| ${f} | ${p.bays.length} | ${p.drums.length} | ${p.method} | ${ms(t)} | ${p.totalCordM.toFixed(1)} m | ${p.baselineCordM.toFixed(1)} m | ${pct(p.totalCordM, p.baselineCordM)} | ${p.channelM.toFixed(1)} m | ${p.baselineChannelM.toFixed(1)} m | ${pct(p.channelM, p.baselineChannelM)} |`,
    );
  }
  out.push('');
  return saved;
}

const FIXTURES = 'tests/fixtures/lgsynth91';

function largeSection(out: string[], names: readonly string[]): PlaceBenchRow | undefined {
  out.push("### The largest LGSynth'91 builds (binary encoding)", '');
  out.push(
    '| fixture | bays | profile | drums | place + route | synthesis (same build) | total cord | netlist order | saved | along the channel | saved |',
    '|---|---|---|---|---|---|---|---|---|---|---|',
  );
  let first: PlaceBenchRow | undefined;
  for (const name of names) {
    const file = `${FIXTURES}/${name}.json`;
    const a = analyse(readFileSync(file, 'utf8'), file);
    if (!a.ok) continue;
    let synthMs = NaN;
    const b = buildMachine(a, {
      encoding: 'binary',
      checks: false,
      now: () => performance.now(),
      onPhase: (phase, t) => void (phase === 'synthesise' ? (synthMs = t) : undefined),
    });
    if (!b.ok) {
      out.push(`| ${name} | — | — | — | does not build: ${b.diagnostics[0]?.message ?? ''} | | | | | | |`);
      continue;
    }
    for (const [label, profile] of [
      ['shipped', DEFAULT_PROFILE],
      ['one long drum', ONE_DRUM],
    ] as const) {
      let p: Placement = b.placement;
      const t = median(3, () => (p = place(b.build.netlist, profile)));
      out.push(
        `| ${name} | ${p.bays.length} | ${label} | ${p.drums.length} | ${ms(t)} | ${ms(synthMs)} | ${p.totalCordM.toFixed(0)} m | ${p.baselineCordM.toFixed(0)} m | ${pct(p.totalCordM, p.baselineCordM)} | ${p.channelM.toFixed(0)} m | ${pct(p.channelM, p.baselineChannelM)} |`,
      );
      if (!first && label === 'shipped')
        first = {
          name: `placement + routing, LGSynth'91 ${name} (binary; ${p.bays.length} bays, ${p.drums.length} drums)`,
          figure: ms(t),
          reference: `synthesis of the same build ${ms(synthMs)}`,
          ratio: `${(t / synthMs).toFixed(2)}×`,
          goal: '< 2 s',
        };
    }
  }
  out.push('');
  return first;
}

/** Every LGSynth'91 fixture that builds (binary) with some cord, placed under the shipped profile. */
function fixtureSavings(): { saved: Saved[]; built: number; tried: number; cordless: number } {
  const names = readdirSync(FIXTURES)
    .filter((f) => f.endsWith('.json'))
    .sort();
  const saved: Saved[] = [];
  let cordless = 0;
  for (const f of names) {
    const b = built(readFileSync(`${FIXTURES}/${f}`, 'utf8'), f, 'binary');
    if (b && hasCord(b.placement)) saved.push(savedOf(b.placement));
    else if (b) cordless++;
  }
  return { saved, built: saved.length, tried: names.length, cordless };
}

/** The placement benchmark: table rows for docs/benchmarks.md, and its own section in Markdown. */
export function benchPlace(large: readonly string[] = ['s298', 's1488']): { rows: PlaceBenchRow[]; markdown: string } {
  const out: string[] = ['## Placement and routing', ''];
  const exact = exactSection(out);
  const examples = exampleSection(out);
  const biggest = largeSection(out, large);
  const fixtures = fixtureSavings();
  const all = [...examples, ...fixtures.saved];
  const m = (xs: readonly Saved[], k: 'total' | 'channel'): string => pc(middle(xs.map((x) => x[k])));
  const bounds = (xs: readonly Saved[]): string => {
    const b = xs.flatMap((x) => (x.bound === undefined ? [] : [x.bound]));
    return b.length === 0 ? '—' : `${pc(middle(b))} (${b.length})`;
  };
  out.push(
    '### Cord saved against the netlist order (median)',
    '',
    'The last column is the most any order could save, median over the builds that sit on one drum (how many in brackets): there the order moves only the runs along the channel, so the channel’s share of the netlist order’s cord bounds the saving.',
    '',
    '| over | builds | total cord | along the channel | most any order could save, one drum |',
    '|---|---|---|---|---|',
    `| the examples | ${examples.length} | ${m(examples, 'total')} | ${m(examples, 'channel')} | ${bounds(examples)} |`,
    `| LGSynth'91 fixtures that build (binary), with cord to route (${fixtures.cordless} minimise to one state with fixed outputs: no cord) | ${fixtures.built} of ${fixtures.tried} | ${m(fixtures.saved, 'total')} | ${m(fixtures.saved, 'channel')} | ${bounds(fixtures.saved)} |`,
    `| both | ${all.length} | ${m(all, 'total')} | ${m(all, 'channel')} | ${bounds(all)} |`,
    '',
  );
  const goalWords = (saved: readonly Saved[]): string => {
    const total = middle(saved.map((x) => x.total));
    return total >= 0.3
      ? '≥ 30 % less (met)'
      : `≥ 30 % less (short by ${((0.3 - total) * 100).toFixed(1)} points: the order moves only the runs along the channel and, over several drums, the drops and rises between them; every cord keeps its trunk and its drop from the drum, and every branch its rise to the lever and its knot allowances, wherever its bays are. On one drum no order can save more than the channel's share of the netlist order's cord, whose median over the builds on one drum is ${bounds(saved)})`;
  };
  const rows: PlaceBenchRow[] = [
    ...(biggest ? [biggest] : []),
    {
      name: `total cord to cut against the netlist order, median over ${examples.length} examples and ${fixtures.built} LGSynth'91 builds`,
      figure: `${m(all, 'total')} less`,
      reference: `cord along the channel ${m(all, 'channel')} less`,
      ratio: '—',
      goal: goalWords(all),
    },
    exact,
  ];
  return { rows, markdown: out.join('\n') };
}

if (process.argv[1] && import.meta.url === pathToFileURL(process.argv[1]).href) {
  const args = process.argv.slice(2);
  const r = benchPlace(args.length > 0 ? args : undefined);
  console.log(r.markdown);
  for (const row of r.rows) console.log(`${row.name}: ${row.figure} (${row.reference}; goal ${row.goal})`);
}
