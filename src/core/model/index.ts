/**
 * The model layer's barrel: the shared types (machine, flat table, netlist, build), cube
 * algebra in positional notation, diagnostics and their codes, and the seeded generator.
 * Everything else in src/core builds on these; nothing here imports from another layer.
 */
export * from './build.js';
export * from './cube.js';
export * from './diagnostics.js';
export * from './flat.js';
export * from './machine.js';
export * from './netlist.js';
export * from './random.js';
export * from './records.js';
export * from './units.js';
export * from './words.js';
