/**
 * `build --saw STEP:WHAT=POSITION …`: the person at the frame says what they saw differ from the
 * commissioning sheet ("14:s0 set Z=up"), once or several times, at one step or at several; the
 * build answers with the cords that explain all of it (the core's `CordNarrowing`: the steps
 * before the first sight were as the sheet; at a step named, every lever or output not named
 * stood as the sheet; a step after the first sight with nothing named is not known), and the
 * steps ahead that tell them apart. When nothing fits so, the answer takes each step named to
 * tell only what is named (a person who named one lever of two that differed), and says so.
 */
import {
  CordNarrowing,
  diag,
  didYouMean,
  lookColumns,
  narrowedText,
  valueOfWords,
  type Diagnostic,
  type DocumentSources,
  type LookColumn,
  type Narrowed,
  type StepSight,
} from '../../core/index.js';

/** One sight as read: its step, the column as the sheet heads it, what was written, and its value. */
export interface SawSight {
  readonly step: number;
  readonly what: string;
  readonly seen: string;
  readonly at: number;
  readonly value: 0 | 1;
}

/** What was asked, and the cords that answer it. */
export interface SawAnswer {
  /** The first sight (as a single --saw always gave it). */
  readonly step: number;
  readonly what: string;
  readonly seen: string;
  /** The cords that explain every sight (the suspects). */
  readonly cords: readonly { readonly cord: string; readonly trouble: string; readonly alike: string }[];
  readonly sights: readonly Omit<SawSight, 'at'>[];
  readonly narrowed: Narrowed;
  /** No cord explains the steps named as ticked whole; the answer takes each step named to tell only what is named. */
  readonly onlyNamed: boolean;
}

const HINT =
  'write the step, a colon, the lever or output as the sheet heads its column, = and what you saw, e.g. --saw "14:s0 set Z=up" or --saw "9:bell (flag)=up"; give --saw once for every lever that differed';

// Spaces, dashes and underscores alike, brackets left out: `s0-set-Z` and `bell-flag` need no shell quotes.
const norm = (t: string): string =>
  t
    .toLowerCase()
    .replace(/[()]/g, '')
    .replace(/[\s_-]+/g, ' ')
    .trim();

const POSITIONS: Readonly<Record<LookColumn['kind'], string>> = {
  z: 'up or down',
  flag: 'up or down (1 or 0)',
  actuator: 'lifted or at rest (1 or 0)',
};

/** One --saw read against the sheet's columns, or LW700 naming what cannot be read. */
function readSight(raw: string, columns: readonly LookColumn[], rows: number): SawSight | Diagnostic {
  const m = /^\s*(\d+)\s*:\s*(.+?)\s*=\s*(\S.*?)\s*$/s.exec(raw);
  if (!m) return diag('LW700', `--saw ${raw} is not STEP:WHAT=POSITION`, { path: '--saw' }, HINT);
  const step = Number(m[1]);
  if (step < 1 || step > rows)
    return diag('LW700', `--saw: the commissioning sheet has steps 1 to ${rows}, not ${step}`, { path: '--saw' }, HINT);
  const at = columns.findIndex((c) => norm(c.what) === norm(m[2]));
  if (at < 0) {
    const guess = didYouMean(
      m[2],
      columns.map((c) => c.what),
    );
    return diag(
      'LW700',
      `--saw: the sheet has no column '${m[2]}'${guess ? ` — did you mean '${guess}'?` : ''}`,
      { path: '--saw' },
      HINT,
    );
  }
  const column = columns[at];
  const value = valueOfWords(column, m[3]);
  if (value === undefined)
    return diag(
      'LW700',
      `--saw: '${m[3]}' is no position of ${column.what}: write ${POSITIONS[column.kind]}`,
      { path: '--saw' },
      HINT,
    );
  return { step, what: column.what, seen: m[3], at, value };
}

/** The answer to every --saw, or LW700 naming the first that cannot be read. */
export function sawAnswer(raws: readonly string[], sources: DocumentSources): SawAnswer | Diagnostic {
  const columns = lookColumns(sources);
  const rows = sources.steps().length;
  const sights: SawSight[] = [];
  for (const raw of raws) {
    const s = readSight(raw, columns, rows);
    if ('code' in s) return s;
    sights.push(s);
  }
  const steps = sights.map((s) => s.step);
  const walk = new CordNarrowing(sources);
  const said = sights.map((s): StepSight => ({ step: s.step, at: s.at, value: s.value }));
  const whole = walk.narrow(Math.max(...steps), said, Math.min(...steps));
  // Nothing fits with every unnamed lever of a named step as the sheet: perhaps not every lever that differed was named.
  const loose = whole.verdict === 'none' ? walk.narrow(Math.max(...steps), said, Math.min(...steps), true) : undefined;
  const onlyNamed = loose !== undefined && loose.suspects.length > 0;
  const narrowed = onlyNamed ? loose : whole;
  const first = sights[0];
  return {
    step: first.step,
    what: first.what,
    seen: first.seen,
    cords: narrowed.suspects.map((s) => ({ cord: s.cord, trouble: s.trouble, alike: s.alike })),
    sights: sights.map(({ step, what, seen, value }) => ({ step, what, seen, value })),
    narrowed,
    onlyNamed,
  };
}

/** The answer in words, for the terminal. */
export function sawText(a: SawAnswer): string {
  const said = a.sights.map((s) => `at step ${s.step} you saw ${s.what} ${s.seen}`).join('; ');
  const note = a.onlyNamed
    ? `No single cord explains it with every lever you did not name at ${a.sights.length > 1 ? 'those steps' : 'that step'} as the sheet, so this answer takes only what you named: name every lever and output that differed at a step (one --saw each) to narrow it.\n`
    : '';
  return `${said}: ${note}${narrowedText(a.narrowed)}`;
}
