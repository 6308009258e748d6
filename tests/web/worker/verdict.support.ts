/** What the tests of the designer's worker share: a page's checks held to the command line's exit status. */
import { expect } from 'vitest';

/** The checks pass exactly when the command line exits 0 for the same build; the failing ones are named otherwise. */
export function expectCliVerdict(
  name: string,
  checks: readonly { ok: boolean; summary: string }[],
  code: number,
): void {
  expect(
    checks.every((c) => c.ok) ? 0 : 1,
    `${name}: ${checks
      .filter((c) => !c.ok)
      .map((c) => c.summary)
      .join('; ')}`,
  ).toBe(code);
}
