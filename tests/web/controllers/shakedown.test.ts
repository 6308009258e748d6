/**
 * The shakedown's walk as the browser keeps it (src/web/controllers/shakedown.ts): the stored
 * entry read defensively (anything else is refused, so keep.ts sets it aside), and one walk kept
 * per machine, newest first, at most KEPT_WALKS.
 */
import { describe, expect, it } from 'vitest';
import { KEPT_WALKS, parseWalks, withWalk, type KeptWalk } from '../../../src/web/controllers/shakedown.js';

const walk = (machine: string, reached = 3): KeptWalk => ({
  machine,
  print: '0badcafe',
  reached,
  sights: [{ step: 2, at: 1, value: 0 }],
});

describe('web/controllers/shakedown', () => {
  it('reads back what it writes, and refuses every other shape', () => {
    const kept = [walk('a'), walk('b', 0)];
    expect(parseWalks(JSON.stringify(kept))).toEqual(kept);
    for (const bad of [
      '{',
      '{}',
      '[{"machine": "a", "print": "x", "reached": -1, "sights": []}]',
      '[{"machine": "a", "print": "x", "reached": 1.5, "sights": []}]',
      '[{"machine": "a", "print": "x", "reached": 1, "sights": [{"step": 0, "at": 0, "value": 1}]}]',
      '[{"machine": "a", "print": "x", "reached": 1, "sights": [{"step": 1, "at": 0, "value": 2}]}]',
      '[{"machine": 7, "print": "x", "reached": 1, "sights": []}]',
      '[null]',
    ])
      expect(parseWalks(bad), bad).toBeUndefined();
  });

  it('keeps one walk per machine, the newest first, at most KEPT_WALKS', () => {
    let kept: KeptWalk[] = [];
    for (let i = 0; i < KEPT_WALKS + 3; i++) kept = withWalk(kept, walk(`m${i}`));
    expect(kept).toHaveLength(KEPT_WALKS);
    expect(kept[0].machine).toBe(`m${KEPT_WALKS + 2}`);
    kept = withWalk(kept, walk('m5', 9));
    expect(kept[0]).toEqual(walk('m5', 9));
    expect(kept.filter((k) => k.machine === 'm5')).toHaveLength(1);
  });
});
