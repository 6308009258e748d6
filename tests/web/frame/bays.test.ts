/**
 * The bay a dragged part is let go over (src/web/frame/bays.ts): exact expectations on a
 * hand-made frame of two drums, three bays each, with boxes as a page would measure them.
 */
import { describe, expect, it } from 'vitest';
import { bayBoxes, bayNearest, type BayBox } from '../../../src/web/frame/bays.js';

/** Drum 1 low on the screen (y 200–220), drum 2 above it (y 100–120); bays 40 px apart, lever ends 10 px wide. */
const ends: BayBox[] = [1, 2].flatMap((drum) =>
  [1, 2, 3].flatMap((bay) =>
    [0, 12].map((dx) => ({
      drum,
      bay,
      left: 40 * bay + dx,
      right: 40 * bay + dx + 10,
      top: drum === 1 ? 200 : 100,
      bottom: drum === 1 ? 220 : 120,
    })),
  ),
);

describe('src/web/frame/bays', () => {
  it('joins the lever ends of a bay into one box', () => {
    const boxes = bayBoxes(ends);
    expect(boxes).toHaveLength(6);
    expect(boxes.find((b) => b.drum === 1 && b.bay === 2)).toEqual({
      drum: 1,
      bay: 2,
      left: 80,
      right: 102,
      top: 200,
      bottom: 220,
    });
  });

  it('finds the bay under the point, or the nearest on the nearest drum', () => {
    const boxes = bayBoxes(ends);
    expect(bayNearest(boxes, 85, 210)).toEqual({ drum: 1, bay: 2 });
    expect(bayNearest(boxes, 125, 110)).toEqual({ drum: 2, bay: 3 });
    // Between two bays, above the levers, past the last bay.
    expect(bayNearest(boxes, 106, 190)).toEqual({ drum: 1, bay: 2 });
    expect(bayNearest(boxes, 117, 190)).toEqual({ drum: 1, bay: 3 });
    expect(bayNearest(boxes, 500, 90)).toEqual({ drum: 2, bay: 3 });
    expect(bayNearest([], 10, 10)).toBeUndefined();
  });
});
