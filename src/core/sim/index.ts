/**
 * The simulation layer's barrel: the part-level simulator (pure step and compiled netlist),
 * the settle programs and the bit-parallel lanes, the hand procedure, the runner with undo,
 * scripted stepping, drive snapshots, the abstract reference simulator and the
 * random-machine generator the tests and benchmarks share; the runner's memo of clocks.
 */
export * from './abstract.js';
export * from './hand.js';
export { MEMO_BYTES, type MemoStats } from './memo.js';
export * from './part.js';
export * from './random-machine.js';
export * from './runner.js';
export * from './script.js';
export * from './snapshots.js';
export { allCodes, grayAssignments } from './assignments.js';
export { clockFrom } from './clocking.js';
export { LANES, LaneBatch } from './lanes.js';
export { heldProgram, moveProgram, type SettleProgram } from './program.js';
export { sweep, type SweepSteps } from './sweep.js';
