/**
 * The exit statuses of every `latchwright` command, defined once. The usage text and the docs
 * read their meanings from here.
 */

/** Exit status by meaning. */
export const EXIT = { ok: 0, checkFailed: 1, badInput: 2 } as const;

export type ExitStatus = (typeof EXIT)[keyof typeof EXIT];

/** What each status means, in the order of the numbers. */
export const EXIT_MEANINGS: readonly { readonly status: ExitStatus; readonly meaning: string }[] = [
  { status: EXIT.ok, meaning: 'all good' },
  { status: EXIT.checkFailed, meaning: 'a check failed' },
  // A fault of the tool itself (LW900) is reported with this status too: the run produced
  // nothing a script may rely on, which is what a script needs to know.
  { status: EXIT.badInput, meaning: 'bad input' },
];

/** "0 all good, 1 a check failed, 2 bad input". */
export function exitStatusText(): string {
  return EXIT_MEANINGS.map((e) => `${e.status} ${e.meaning}`).join(', ');
}
