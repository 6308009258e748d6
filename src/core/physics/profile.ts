/**
 * The technology profile: every physical default in one place. The shipped defaults live in
 * profiles/default.json (with a `sources` entry per field); this module holds the type and
 * the same defaults for code that runs without a file (the browser, tests).
 */
import type { DocumentUnits } from '../model/units.js';

export interface RoutingLoss {
  /** Angle a cord branch turns over fixed pins, radians. */
  readonly pinAngleRad: number;
  /** Friction coefficient of cord on a fixed pin. */
  readonly muPin: number;
  /** Number of pulleys a branch passes, each with efficiency `pulleyEfficiency`. */
  readonly pulleys: number;
  readonly pulleyEfficiency: number;
}

/** How a cord changes direction in the frame: over a pulley (efficiency η) or a smooth fixed pin (capstan equation). */
export type FrameTurn = 'pulley' | 'pin';

/**
 * The frame's geometry (design §11): where levers, drum, cord channel and pulleys sit, and the
 * allowances a cord is cut with. Heights are measured from the drum's axis.
 */
export interface FrameGeometry {
  /** Thickness of one lever blank, metres. */
  readonly leverThicknessM: number;
  /** Distance between neighbouring levers on the pivot rail (blank, washers and the weight hook's gap), metres. */
  readonly leverPitchM: number;
  /** Length of one lever blank, metres. */
  readonly leverLengthM: number;
  /** Height of the lever pivot rail above the drum's axis (the drop from rail to drum), metres. */
  readonly railAboveDrumM: number;
  /** Depth of the cord channel below the drum's axis, metres. */
  readonly channelBelowDrumM: number;
  /** Vertical distance between the axes of two drums stacked one above the other, metres. */
  readonly drumSpacingM: number;
  /** Diameter of the cord, metres. */
  readonly cordDiameterM: number;
  /** Diameter of a pulley or pin at a turn of the cord (its bend radius is half of it), metres. */
  readonly pulleyDiameterM: number;
  /** What each turn of a cord passes: a pulley or a smooth pin. */
  readonly turn: FrameTurn;
  /** Cord allowed for a knot at each end of a piece, metres. */
  readonly knotAllowanceM: number;
  /** Cord allowed per branch for lever travel and adjustment at the knot, metres. */
  readonly takeUpAllowanceM: number;
  /** Cord from the frame's exit pulley to an actuator's load, metres. */
  readonly actuatorRunM: number;
  /** Space added to a bay beside its capstan's wraps, metres. */
  readonly bayClearanceM: number;
  /** Longest drum the frame may carry (sag, and a person's reach along it), metres. */
  readonly longestDrumM: number;
  /** Most drums (or sides of one drum) one frame may carry. */
  readonly drumsPerFrame: number;
  /** Radius of a clock cam's base circle (where its lever rests released), metres. */
  readonly camBaseRadiusM: number;
  /** Rise of a clock cam's lobe above its base circle (the travel that pulls the clock lever), metres. */
  readonly camLiftM: number;
}

export interface CostWeights {
  readonly gate: number;
  readonly latch: number;
  readonly lever: number;
  readonly capstan: number;
  readonly weight: number;
  readonly cord: number;
}

export interface Profile {
  /** Pull-up weight hung on each port lever, grams. */
  readonly portWeightG: number;
  /** Pull-up weight on each gate's summing lever Z, grams (sets the capstan hold tension). */
  readonly zWeightG: number;
  /** Lever ratio between the Z weight and the capstan's hold end. */
  readonly leverRatio: number;
  /**
   * Pull-up weight of each operator, clock and reset lever, grams. The lever is the hold end
   * of its own capstan, as Z is for a gate, so it sets that capstan's hold tension.
   */
  readonly leverWeightG: number;
  /** Allowance at an operator lever's handle for pivot friction and cord stiffness, grams. */
  readonly operatorExtraG: number;
  /** Full turns of cord on the drum per capstan. */
  readonly wraps: number;
  /**
   * Most turns one capstan may have. The capstan of an actuator (an output with a load) gets
   * more turns than `wraps` where its force budget asks for them, up to this.
   */
  readonly maxWraps: number;
  /** Friction coefficient of cord on the drum. */
  readonly mu: number;
  /** Default routing loss of every cord branch. */
  readonly routing: RoutingLoss;
  /** Per-cord overrides of the routing loss, by cord id. */
  readonly cordRouting: Readonly<Record<string, Partial<RoutingLoss>>>;
  readonly maxPortsPerGate: number;
  readonly maxCordsPerPort: number;
  /** Smallest acceptable ratio of available to needed tension. */
  readonly minMargin: number;
  readonly drumRadiusM: number;
  readonly drumRpm: number;
  /** Length of drum taken by one wrap, metres. */
  readonly wrapPitchM: number;
  /**
   * Typical length of one cord branch, metres: the fallback for the bill of materials where a
   * build has no placement (a placed build measures every branch from the frame geometry).
   */
  readonly cordBranchM: number;
  /** Time for one gate stage (lever swing plus cord take-up), seconds. */
  readonly stageDelayS: number;
  /** Relative spread of the stage delay for the Monte Carlo timing run (0.2 = ±20 %). */
  readonly stageDelaySpread: number;
  /** Weights per part kind for the encoding search's cost. */
  readonly cost: CostWeights;
  /** The frame's geometry: bays, cord channel, pulleys, allowances, drum limits. */
  readonly frame: FrameGeometry;
  /**
   * The units the workshop's documents show what it cuts and hangs in (cut list, frame and cam
   * drawings, bill of materials, build sheet): `metric` or `inch` (feet, inches, ounces, pounds;
   * model/units.ts). Only what the documents show changes: every figure of the profile stays SI.
   */
  readonly documentUnits: DocumentUnits;
  /**
   * Where the profile came from, for the build sheet: the file, its description and its
   * `sources`. Absent for the shipped defaults used without a file. Not a physical figure.
   */
  readonly about?: ProfileAbout;
}

/** What a profile file says about itself (its non-physical fields). */
export interface ProfileAbout {
  /** The file it was read from. */
  readonly file?: string;
  readonly description?: string;
  /** Where each value comes from, by field path (`mu`, `routing.muPin`, `frame.leverPitchM`). */
  readonly sources?: Readonly<Record<string, string>>;
}

/** The shipped defaults (profiles/default.json carries the same values with their sources). */
export const DEFAULT_PROFILE: Profile = {
  portWeightG: 15,
  zWeightG: 15,
  leverRatio: 1,
  leverWeightG: 15,
  operatorExtraG: 5,
  wraps: 2,
  maxWraps: 4,
  mu: 0.25,
  routing: { pinAngleRad: 0, muPin: 0.2, pulleys: 0, pulleyEfficiency: 0.95 },
  cordRouting: {},
  maxPortsPerGate: 4,
  maxCordsPerPort: 4,
  minMargin: 2,
  drumRadiusM: 0.04,
  drumRpm: 20,
  wrapPitchM: 0.008,
  cordBranchM: 0.6,
  stageDelayS: 0.25,
  stageDelaySpread: 0.3,
  cost: { gate: 4, latch: 8, lever: 2, capstan: 3, weight: 1, cord: 1 },
  frame: {
    leverThicknessM: 0.012,
    leverPitchM: 0.03,
    leverLengthM: 0.3,
    railAboveDrumM: 0.2,
    channelBelowDrumM: 0.12,
    drumSpacingM: 0.6,
    cordDiameterM: 0.003,
    pulleyDiameterM: 0.03,
    turn: 'pulley',
    knotAllowanceM: 0.05,
    takeUpAllowanceM: 0.1,
    actuatorRunM: 1,
    bayClearanceM: 0.02,
    longestDrumM: 1.5,
    drumsPerFrame: 2,
    camBaseRadiusM: 0.04,
    camLiftM: 0.015,
  },
  documentUnits: 'metric',
};
