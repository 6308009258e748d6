/**
 * The page's memory of encoding searches: the outcomes of the latest few searches, under the
 * key of the setup each searched (core `searchSetupKey`), the most recently used first. The
 * builder is sent them with every build, so a keystroke that leaves the machine's search setup
 * as it was (a comment, spacing, the layout of the text) or returns to a machine searched
 * before builds with the remembered codes instead of searching again. It lives on the page,
 * not in the worker, because a builder busy on stale work may be restarted.
 */
import type { RememberedSearch } from '../worker/protocol.js';

/** How many outcomes are kept: enough for an edit and its undo over a few machines, small to post with every build. */
export const SEARCH_MEMORY = 8;

export class SearchMemory {
  private kept: RememberedSearch[] = [];

  constructor(private readonly size = SEARCH_MEMORY) {}

  /** Keep an outcome, or mark one used again: it goes to the front; past the size the least recently used is forgotten. */
  remember(r: RememberedSearch): void {
    this.kept = [r, ...this.kept.filter((k) => k.key !== r.key)].slice(0, Math.max(0, this.size));
  }

  /** Every outcome kept, the most recently used first. */
  entries(): readonly RememberedSearch[] {
    return this.kept;
  }
}
