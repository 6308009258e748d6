/**
 * Many clocks from many start points, 32 at a time (lanes.ts), in the order of the start
 * points: the loop the exhaustive checks share. A start point the lanes cannot vouch for goes
 * to the caller's event-driven path, in its place in the order, so that "the first failure"
 * is the same whichever path found it.
 */
import { LANES, LaneBatch } from './lanes.js';
import type { PartSim } from './part.js';

/** What a sweep does with its start points. */
export interface SweepSteps<T> {
  /** Put start point i into a lane: latches and inputs (control levers released). */
  setUp(b: LaneBatch, lane: number, i: number): void;
  /** Read a lane while its inputs are held, before the moves (e.g. the outputs shown). */
  held?(b: LaneBatch, lane: number, i: number): T;
  /** The moves made from the held state (default: one clock). */
  moves?(b: LaneBatch): void;
  /** Start point i, vouched for by the lanes, after the moves; false stops the sweep. */
  done(i: number, b: LaneBatch, lane: number, held: T | undefined): boolean | void;
  /** Start point i, which the lanes cannot vouch for: simulate it event-driven; false stops the sweep. */
  slow(i: number): boolean | void;
}

/** Run start points 0 … count-1 through `steps`, in order; false when a step stopped it. */
export function sweep<T>(sim: PartSim, count: number, steps: SweepSteps<T>, batch = new LaneBatch(sim)): boolean {
  const held: (T | undefined)[] = new Array<T | undefined>(LANES).fill(undefined);
  for (let first = 0; first < count; first += LANES) {
    const n = Math.min(LANES, count - first);
    batch.clear();
    for (let lane = 0; lane < n; lane++) steps.setUp(batch, lane, first + lane);
    batch.settleHeld();
    if (steps.held)
      for (let lane = 0; lane < n; lane++)
        held[lane] = (batch.suspect >>> lane) & 1 ? undefined : steps.held(batch, lane, first + lane);
    if (steps.moves) steps.moves(batch);
    else batch.clock();
    for (let lane = 0; lane < n; lane++) {
      const i = first + lane;
      const go = (batch.suspect >>> lane) & 1 ? steps.slow(i) : steps.done(i, batch, lane, held[lane]);
      if (go === false) return false;
    }
  }
  return true;
}
