/**
 * Placement benchmark (not yet part of `npm run bench`): run with
 *   node --import tsx bench/place.ts [fixture …]
 * 1. the exact arrangement (subset dynamic programming) on random one-drum builds of growing
 *    size, beside the heuristic on the same build;
 * 2. the examples: total cord and cord along the channel against the netlist's own order;
 * 3. the largest LGSynth'91 builds given (default s1488, binary encoding): placement plus
 *    routing under the shipped profile and on one long drum.
 * Figures are medians of several runs; the machine may be shared, so read ratios, not
 * absolute times. Never a test.
 */
import { readFileSync, readdirSync } from 'node:fs';
import { frameUnits, place, type Placement } from '../src/core/phases/place/index.js';
import { DEFAULT_PROFILE, type Profile } from '../src/core/physics/index.js';
import { buildNetlist, randomNetlist } from '../tests/core/phases/place/support.js';
import { median } from './median.js';

const ONE_DRUM: Profile = { ...DEFAULT_PROFILE, frame: { ...DEFAULT_PROFILE.frame, longestDrumM: 1000 } };
const ms = (x: number): string => (x >= 1000 ? `${(x / 1000).toFixed(2)} s` : `${x.toFixed(1)} ms`);
const pct = (a: number, b: number): string => `${((1 - a / b) * 100).toFixed(1)} %`;

function exactRows(): void {
  console.log('\n## Exact arrangement (one drum, random builds)\n');
  console.log('| bays | units | exact | heuristic | heuristic / exact cord |');
  console.log('|---|---|---|---|---|');
  for (const bays of [8, 10, 12, 14, 16, 18, 20]) {
    const n = randomNetlist(2024 + bays, bays);
    const units = frameUnits(n, ONE_DRUM).units.length;
    let exact: Placement | undefined;
    let heuristic: Placement | undefined;
    const te = median(3, () => (exact = place(n, ONE_DRUM, { exactLimit: 2 ** 22 })));
    const th = median(3, () => (heuristic = place(n, ONE_DRUM, { exactLimit: 0 })));
    const ratio = exact && heuristic && exact.channelM > 0 ? (heuristic.channelM / exact.channelM).toFixed(4) : '—';
    console.log(`| ${bays} | ${units} | ${ms(te)} (${exact?.method}) | ${ms(th)} | ${ratio} |`);
  }
}

/** Share of cord saved against the netlist order: along the channel, and in all. */
interface Saved {
  readonly channel: number;
  readonly total: number;
}

const savedOf = (p: Placement): Saved => ({
  channel: 1 - p.channelM / p.baselineChannelM,
  total: 1 - p.totalCordM / p.baselineCordM,
});

function middle(xs: readonly number[]): number {
  const s = [...xs].sort((a, b) => a - b);
  const k = Math.floor(s.length / 2);
  return s.length % 2 === 1 ? s[k] : (s[k - 1] + s[k]) / 2;
}

function exampleRows(): Saved[] {
  console.log('\n## Examples (shipped profile)\n');
  console.log(
    '| example | drums | method | time | total cord | netlist order | saved | along channel | netlist order | saved |',
  );
  console.log('|---|---|---|---|---|---|---|---|---|---|');
  const saved: Saved[] = [];
  for (const f of readdirSync('examples')
    .filter((x) => x.endsWith('.lw'))
    .sort()) {
    const n = buildNetlist(readFileSync(`examples/${f}`, 'utf8'), f, 'auto');
    let p: Placement | undefined;
    const t = median(3, () => (p = place(n, DEFAULT_PROFILE)));
    if (!p) continue;
    saved.push(savedOf(p));
    console.log(
      `| ${f} | ${p.drums.length} | ${p.method} | ${ms(t)} | ${p.totalCordM.toFixed(1)} m | ${p.baselineCordM.toFixed(1)} m | ${pct(p.totalCordM, p.baselineCordM)} | ${p.channelM.toFixed(1)} m | ${p.baselineChannelM.toFixed(1)} m | ${pct(p.channelM, p.baselineChannelM)} |`,
    );
  }
  return saved;
}

function fixtureRows(names: readonly string[]): Saved[] {
  console.log("\n## LGSynth'91 builds (binary encoding)\n");
  console.log(
    '| fixture | bays | profile | drums | time | total cord | netlist order | saved | along channel | saved |',
  );
  console.log('|---|---|---|---|---|---|---|---|---|---|');
  const saved: Saved[] = [];
  for (const name of names) {
    const file = `tests/fixtures/lgsynth91/${name}.json`;
    const n = buildNetlist(readFileSync(file, 'utf8'), file, 'binary');
    for (const [label, profile] of [
      ['shipped', DEFAULT_PROFILE],
      ['one drum', ONE_DRUM],
    ] as const) {
      let p: Placement | undefined;
      const t = median(3, () => (p = place(n, profile)));
      if (!p) continue;
      if (label === 'shipped') saved.push(savedOf(p));
      console.log(
        `| ${name} | ${p.bays.length} | ${label} | ${p.drums.length} | ${ms(t)} | ${p.totalCordM.toFixed(0)} m | ${p.baselineCordM.toFixed(0)} m | ${pct(p.totalCordM, p.baselineCordM)} | ${p.channelM.toFixed(0)} m | ${pct(p.channelM, p.baselineChannelM)} |`,
      );
    }
  }
  return saved;
}

const fixtures = process.argv.slice(2);
exactRows();
const saved = [...exampleRows(), ...fixtureRows(fixtures.length > 0 ? fixtures : ['s1488'])];
const pc = (x: number): string => `${(x * 100).toFixed(1)} %`;
console.log(
  `\nMedian saving over the examples and fixtures (shipped profile): along the channel ${pc(middle(saved.map((x) => x.channel)))}, total cord ${pc(middle(saved.map((x) => x.total)))}`,
);
