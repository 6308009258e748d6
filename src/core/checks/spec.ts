/** What the checks compare a build against besides its own (minimised) machine. */
import type { FlatMachine } from '../model/flat.js';

/** The machine as analysed: what the build is checked against besides its own (minimised) machine. */
export interface SpecInfo {
  /** The machine as written (flattened), whose minimised form the build was made from. */
  readonly original?: FlatMachine;
  /** Original state name → name of the minimised state that stands for it (StateMinimisation.merged). */
  readonly merged?: Readonly<Record<string, string>>;
}
