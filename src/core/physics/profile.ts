/**
 * The technology profile: every physical default in one place. The shipped defaults live in
 * profiles/default.json (with a `sources` entry per field); this module holds the type and
 * the same defaults for code that runs without a file (the browser, tests).
 */

export interface RoutingLoss {
  /** Angle a cord branch turns over fixed pins, radians. */
  readonly pinAngleRad: number;
  /** Friction coefficient of cord on a fixed pin. */
  readonly muPin: number;
  /** Number of pulleys a branch passes, each with efficiency `pulleyEfficiency`. */
  readonly pulleys: number;
  readonly pulleyEfficiency: number;
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
  /** Typical length of one cord branch, metres (for the bill of materials). */
  readonly cordBranchM: number;
  /** Time for one gate stage (lever swing plus cord take-up), seconds. */
  readonly stageDelayS: number;
  /** Relative spread of the stage delay for the Monte Carlo timing run (0.2 = ±20 %). */
  readonly stageDelaySpread: number;
  /** Weights per part kind for the encoding search's cost. */
  readonly cost: CostWeights;
}

/** The shipped defaults (profiles/default.json carries the same values with their sources). */
export const DEFAULT_PROFILE: Profile = {
  portWeightG: 15,
  zWeightG: 15,
  leverRatio: 1,
  leverWeightG: 15,
  operatorExtraG: 5,
  wraps: 2,
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
};
