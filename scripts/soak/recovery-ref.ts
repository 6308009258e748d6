/**
 * An independent reading of the recovery check: from every unused code (masters equal to
 * slaves, as after a bump), one clock of the hand procedure per allowed input combination,
 * each hand action settled event by event (stepSim with trace, never the bit-parallel sweep
 * the check uses); then a longest-path search over the clocks among unused codes. A cycle, a
 * clock that leaves a latch undetermined or raises an alarm is a lock-up (DESIGN.md §6: "recovery
 * of every unused code (no lock-up loop) within k clocks").
 */
import { clockActions, findCheck, resetActions, stepSim, timingOf, type Built } from '../../src/core/index.js';
import { isAlarm, readPart, simFor, stateAtCode } from '../../src/core/sim/part.js';
import type { Reference } from './reference.js';

/** k per unused code (null: it can stay unused for ever), by the reference's own search. */
export function recoveryByReference(b: Built, ref: Reference): Map<string, number | null> {
  const sim = simFor(b.build, timingOf(b.profile));
  const used = new Set(b.build.encoding.codes);
  const width = b.build.encoding.codes[0]?.length ?? 0;
  const unused = Array.from({ length: 2 ** width }, (_, k) => k.toString(2).padStart(width, '0')).filter(
    (c) => !used.has(c),
  );
  const inputs = ref.spec.inputs;
  const allowed = ref.assignments.filter((a) => !ref.isNever(a));
  const next = new Map<string, (string | null)[]>();
  for (const c of unused) {
    const out: (string | null)[] = [];
    for (const a of allowed) {
      let state = stateAtCode(sim, c, a);
      const values = Object.fromEntries(inputs.map((n, k) => [n, a[k] === '1' ? 1 : 0] as const));
      let alarm = false;
      for (const action of clockActions(inputs, values, values)) {
        const [s, events] = stepSim(sim, state, action, true);
        state = s;
        if (events.some(isAlarm)) alarm = true;
      }
      const code = readPart(sim, state).code;
      out.push(alarm || !/^[01]*$/.test(code) ? null : code);
    }
    next.set(c, out);
  }
  const k = new Map<string, number | null>();
  const onPath = new Set<string>();
  const visit = (c: string): number | null => {
    if (used.has(c)) return 0;
    if (k.has(c)) return k.get(c) ?? null;
    if (onPath.has(c)) return null;
    onPath.add(c);
    let worst: number | null = 0;
    for (const n of next.get(c) ?? []) {
      const kn = n === null ? null : visit(n);
      worst = kn === null || worst === null ? null : Math.max(worst, kn + 1);
      if (worst === null) break;
    }
    onPath.delete(c);
    k.set(c, worst);
    return worst;
  };
  for (const c of unused) visit(c);
  return k;
}

/** The first disagreement between the recovery check and the reference, in words; undefined when none. */
export function recoveryDisagreement(b: Built, ref: Reference): string | undefined {
  const rec = findCheck(b.checks, 'recovery');
  if (!rec || rec.checked !== 'all' || (b.build.encoding.codes[0]?.length ?? 0) > 8) return undefined;
  const mine = recoveryByReference(b, ref);
  const lockUp = [...mine.values()].some((v) => v === null);
  if (rec.ok === lockUp)
    return `recovery ${rec.ok ? 'passes' : `fails (${rec.summary})`}, the reference finds ${lockUp ? 'a lock-up' : 'none'}: ${JSON.stringify([...mine])}`;
  for (const { code, k } of rec.codes)
    if (mine.has(code) && mine.get(code) !== k)
      return `code ${code}: the check says k=${k}, the reference ${mine.get(code)}`;
  return undefined;
}

/**
 * The reset lever from every code, used or not, with every allowed input combination held
 * (DESIGN.md §5: "Reset lever: forces every latch to the start code"): the slave code after
 * it must be the start state's, with no alarm. The first code where it is not, in words.
 */
export function resetDisagreement(b: Built, ref: Reference): string | undefined {
  const sim = simFor(b.build, timingOf(b.profile));
  const width = b.build.encoding.codes[0]?.length ?? 0;
  if (width > 8) return undefined;
  const start = b.build.encoding.codes[b.build.machine.start];
  const allowed = ref.assignments.filter((a) => !ref.isNever(a));
  for (let k = 0; k < 2 ** width; k++) {
    const code = width === 0 ? '' : k.toString(2).padStart(width, '0');
    for (const a of allowed) {
      let state = stateAtCode(sim, code, a);
      const alarms: string[] = [];
      for (const action of resetActions()) {
        const [s, events] = stepSim(sim, state, action, true);
        state = s;
        alarms.push(...events.filter(isAlarm).map((e) => e.words));
      }
      const after = readPart(sim, state).code;
      if (after !== start || alarms.length > 0)
        return `reset from ${code} with inputs ${a} leaves ${after} (start ${start})${alarms.length ? `: ${alarms.join('; ')}` : ''}`;
    }
  }
  return undefined;
}
