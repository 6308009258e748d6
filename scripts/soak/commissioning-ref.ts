/**
 * The commissioning sheet (commissioning.csv) read back as a person at the levers would, and
 * held to the reference interpreter: on each clock of the sheet's tour, every output the spec
 * names must read its value on the row that sets the input levers (outputs show while the
 * inputs are held, before φ1), and the state after the clock must be the one the spec goes
 * to (the build's state standing for it: StateMinimisation.merged), where the machine is
 * completely specified. The sheet is parsed as
 * CSV (RFC 4180 quoting); the tour's input levers come from the core's commissioningTour,
 * the expected values from the reference alone.
 */
import { buildDocuments, type Analysed, type Built } from '../../src/core/index.js';
import { commissioningTour } from '../../src/core/export/tour.js';
import type { Reference } from './reference.js';

/** RFC 4180 records. */
function csv(text: string): string[][] {
  const rows: string[][] = [];
  let row: string[] = [];
  let cell = '';
  let quoted = false;
  for (let i = 0; i < text.length; i++) {
    const ch = text[i];
    if (quoted) {
      if (ch === '"' && text[i + 1] === '"') {
        cell += '"';
        i++;
      } else if (ch === '"') quoted = false;
      else cell += ch;
    } else if (ch === '"') quoted = true;
    else if (ch === ',') {
      row.push(cell);
      cell = '';
    } else if (ch === '\n' || ch === '\r') {
      if (ch === '\r' && text[i + 1] === '\n') i++;
      row.push(cell);
      rows.push(row);
      row = [];
      cell = '';
    } else cell += ch;
  }
  if (cell !== '' || row.length > 0) rows.push([...row, cell]);
  return rows;
}

/** The first place where the sheet and the reference differ, in words; undefined when none. */
export function commissioningDisagreement(b: Built, a: Analysed, ref: Reference): string | undefined {
  const text = buildDocuments(b).get('commissioning.csv') ?? '';
  const [header, ...rows] = csv(text);
  const col = (name: string): number => header.indexOf(name);
  const outCols = ref.spec.outputs.map((o) => header.findIndex((h) => h.startsWith(`${o} (`)));
  const tour = commissioningTour(b.build.machine);
  const inputs = ref.spec.inputs.length;
  let state: string | null = ref.spec.start;
  const free = (o: Readonly<Record<string, unknown>> | undefined): boolean => Object.values(o ?? {}).includes('-');
  const complete =
    ref.spec.unspecified !== 'dont-care' &&
    ref.spec.states.every((s) => !free(s.outputs) && s.transitions.every((t) => !free(t.outputs)));
  const byClock = new Map<number, string[][]>();
  for (const r of rows) {
    const c = Number(r[col('clock')]);
    if (r[0] === 'caution' || !Number.isInteger(c) || c < 1) continue;
    byClock.set(c, [...(byClock.get(c) ?? []), r]);
  }
  for (let k = 1; k <= tour.length; k++) {
    const clock = tour[k - 1];
    const lines = byClock.get(k) ?? [];
    if (clock.reset) state = ref.spec.start;
    // Without inputs the clock's first row is where its outputs are read ("Look at the flags." for a one-state machine).
    const set =
      lines.find((r) => r[col('action')].startsWith('Set the input levers')) ?? (inputs === 0 ? lines[0] : undefined);
    const last = lines[lines.length - 1];
    if (state === null || !set || !last) return state === null ? undefined : `clock ${k}: rows missing`;
    if (ref.isNever(clock.inputs)) return undefined;
    const want = ref.step(state, clock.inputs);
    for (const [i, o] of ref.spec.outputs.entries()) {
      const v = want.outputs[i];
      const shown = /\(([01X?])\)/.exec(set[outCols[i]] ?? '')?.[1];
      if (v !== null && shown !== String(v))
        return `clock ${k} (inputs ${clock.inputs}, in '${state}'): the sheet shows ${o} ${set[outCols[i]]}, the spec ${v}`;
    }
    // Only a completely specified machine's states are a partition of the written ones; with
    // don't-cares a written state may be covered by several (Paull–Unger closed covers), and the
    // build may go to any of them: its outputs above are then what the sheet must get right.
    if (want.next !== null && complete) {
      const stands = a.minimised.merged[want.next] ?? want.next;
      if (last[col('state after')] !== stands)
        return `clock ${k} (inputs ${clock.inputs}, from '${state}'): the sheet says '${last[col('state after')]}' after, the spec '${want.next}' ('${stands}')`;
    }
    state = want.next;
  }
  return undefined;
}
