/**
 * `build --saw STEP:WHAT=POSITION`: the person at the frame says what they saw at the first row
 * of the commissioning sheet that did not match ("14:s0 set Z=up"), and the build answers with
 * the cords to look at, from the sheet's dictionary of broken cords (the core's `cordsFor`).
 */
import {
  cordsFor,
  diag,
  didYouMean,
  type Diagnostic,
  type DocumentSources,
  type FinderEntry,
} from '../../core/index.js';

/** What was asked, and the cords that answer it. */
export interface SawAnswer {
  readonly step: number;
  readonly what: string;
  readonly seen: string;
  readonly cords: readonly { readonly cord: string; readonly trouble: string; readonly alike: string }[];
}

const HINT =
  'write the step, a colon, the lever or output as the sheet heads its column, = and what you saw, e.g. --saw "14:s0 set Z=up" or --saw "9:bell (flag)=up"';

/** The sheet's column names a person may write: each latch's two Z levers and each output. */
function columns(sources: DocumentSources): string[] {
  const first = sources.steps()[0];
  if (!first) return [];
  return [
    ...first.latches.flatMap((l) => [`${l.id} set Z`, `${l.id} reset Z`]),
    ...first.outputs.map((o) => `${o.output} (${o.kind})`),
  ];
}

/** The answer to --saw, or LW700 naming what cannot be read. */
export function sawAnswer(raw: string, sources: DocumentSources): SawAnswer | Diagnostic {
  const m = /^\s*(\d+)\s*:\s*(.+?)\s*=\s*(\S.*?)\s*$/s.exec(raw);
  if (!m) return diag('LW700', `--saw ${raw} is not STEP:WHAT=POSITION`, { path: '--saw' }, HINT);
  const step = Number(m[1]);
  const rows = sources.steps().length;
  if (step < 1 || step > rows)
    return diag('LW700', `--saw: the commissioning sheet has steps 1 to ${rows}, not ${step}`, { path: '--saw' }, HINT);
  const names = columns(sources);
  // Spaces, dashes and underscores alike, brackets left out: `s0-set-Z` and `bell-flag` need no shell quotes.
  const norm = (t: string): string =>
    t
      .toLowerCase()
      .replace(/[()]/g, '')
      .replace(/[\s_-]+/g, ' ')
      .trim();
  const what = names.find((n) => norm(n) === norm(m[2]));
  if (what === undefined) {
    const guess = didYouMean(m[2], names);
    return diag(
      'LW700',
      `--saw: the sheet has no column '${m[2]}'${guess ? ` — did you mean '${guess}'?` : ''}`,
      { path: '--saw' },
      HINT,
    );
  }
  const cords = cordsFor(sources.finder(), step, what, m[3]).map((e: FinderEntry) => ({
    cord: e.cord,
    trouble: e.trouble,
    alike: e.alike,
  }));
  return { step, what, seen: m[3], cords };
}

/** The answer in words, for the terminal. */
export function sawText(a: SawAnswer): string {
  const head = `at step ${a.step} you saw ${a.what} ${a.seen}: `;
  if (a.cords.length === 0)
    return `${head}no single broken, jammed or untied cord shows first there like that. Check the rows before it again; or look for two faults at once, a lever off its pivot, a weight fallen off or a cord tied to the wrong port.\n`;
  const lines = a.cords.map(
    (c) => `  look at ${c.cord}: ${c.trouble}${c.alike === '' ? '' : ` (looks the same as ${c.alike})`}`,
  );
  return `${head}stop the drum, then check:\n${lines.join('\n')}\n`;
}
