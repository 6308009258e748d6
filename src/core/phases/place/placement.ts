/**
 * What the place phase gives a build: every part's drum and bay, each drum's length and order,
 * the routing of every cord over them, and the baseline the order is measured against
 * (index.ts makes it; audit.ts and the layout check read it).
 */
import type { FrameLayout, PlacedBay, Routing } from '../../physics/routing.js';
import type { DrumMethod } from './arrange.js';
import type { PlacementProblem } from './pins.js';

export interface PlacedBayInfo extends PlacedBay {
  readonly kind: 'gate' | 'lever' | 'actuator';
  /** Left edge of the bay, metres from the visitor end. */
  readonly leftM: number;
  /** The unit the bay belongs to: its latch's id, or the part itself. */
  readonly unit: string;
}

export interface PlacedDrum {
  /** Counted from 1, the lowest first. */
  readonly drum: number;
  readonly lengthM: number;
  /** Height of its axis above drum 1's, metres. */
  readonly levelM: number;
  /** Part ids from the visitor end. */
  readonly bays: readonly string[];
  readonly method: DrumMethod;
}

export interface Placement extends FrameLayout {
  /** 'exact' when every drum's order is a proven minimum; 'netlist' when the netlist's own order was the shortest. */
  readonly method: 'exact' | 'heuristic' | 'netlist';
  /** One drum, solved exactly: no arrangement has less cord along the channel. */
  readonly exact: boolean;
  readonly drums: readonly PlacedDrum[];
  readonly bays: readonly PlacedBayInfo[];
  readonly latches: readonly {
    readonly latch: string;
    readonly drum: number;
    readonly bays: readonly [number, number];
  }[];
  readonly flags: readonly {
    readonly flag: string;
    readonly gate: string;
    readonly drum: number;
    readonly bay: number;
  }[];
  readonly routing: Routing;
  /** Every cord's cut length (routing.totalCordM). */
  readonly totalCordM: number;
  /** The same, with the netlist's own order routed the same way. */
  readonly baselineCordM: number;
  /** Cord along the channels (the quantity minimised). */
  readonly channelM: number;
  readonly baselineChannelM: number;
  readonly pulleys: number;
  /** Branches between different drums. */
  readonly crossDrumBranches: number;
  readonly longestDrumM: number;
  readonly drumsAllowed: number;
  readonly seed: number;
  /** Bays' parts the user pinned and the placement kept there (a pinned latch: both its gates). */
  readonly pinned: readonly string[];
  readonly problems: readonly PlacementProblem[];
}
