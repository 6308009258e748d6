/**
 * The xstate features a lever machine cannot have, each with the name used in LW500
 * messages and a hint on how to express the behaviour without it. One table, so the
 * messages, the tests and docs/xstate.md name the features the same way.
 */

/** A feature reported as LW500. */
export type Feature =
  | 'parallel'
  | 'nested'
  | 'history'
  | 'after'
  | 'always'
  | 'eventless'
  | 'guard'
  | 'cond'
  | 'in'
  | 'actions'
  | 'entry'
  | 'exit'
  | 'invoke'
  | 'activities'
  | 'onDone'
  | 'output'
  | 'route'
  | 'context'
  | 'wildcard'
  | 'builtinEvent'
  | 'multipleTargets'
  | 'finalTransitions'
  | 'rootOutputs'
  | 'rootTarget';

const FLATTEN = 'flatten the machine: one state per combination of active states, with the transitions copied down';
const NO_CODE = 'a lever machine runs no code; drop it and show its effect as outputs (meta.outputs or tags)';
const AN_EVENT =
  'every step of a lever machine is one clock with levers pulled; give the transition an event of its own';

const NOTES: Readonly<Record<Feature, { readonly name: string; readonly hint: string }>> = {
  parallel: { name: 'parallel states (type: "parallel")', hint: FLATTEN },
  nested: { name: 'nested states', hint: FLATTEN },
  history: {
    name: 'history states',
    hint: 'flatten the machine, giving each remembered child state its own copy of the states that return to it',
  },
  after: {
    name: 'delayed transitions (after)',
    hint: 'a lever machine has no timer; make the delay an event (a lever, or a cam on the clock crank)',
  },
  always: { name: 'eventless transitions (always)', hint: AN_EVENT },
  eventless: { name: 'eventless transitions (the "" event)', hint: AN_EVENT },
  guard: {
    name: 'guards (guard)',
    hint: 'a guard written as code or by name cannot be built from levers; give each condition its own event, or export from the machine form where guards are expressions',
  },
  cond: {
    name: 'guards (cond, the xstate v4 spelling)',
    hint: 'a guard written as code or by name cannot be built from levers; give each condition its own event',
  },
  in: { name: 'state guards (in)', hint: "flatten the machine so that the other region's state is part of this state" },
  actions: { name: 'actions', hint: NO_CODE },
  entry: { name: 'entry actions', hint: NO_CODE },
  exit: { name: 'exit actions', hint: NO_CODE },
  invoke: {
    name: 'invoked actors (invoke)',
    hint: 'a lever machine cannot start other machines; build them as separate machines linked by levers',
  },
  activities: { name: 'activities (xstate v4)', hint: NO_CODE },
  onDone: {
    name: 'done transitions (onDone)',
    hint: 'these follow from nested or invoked machines; flatten the machine and give the step an event',
  },
  output: {
    name: 'machine output (output, data)',
    hint: 'show results as outputs (meta.outputs or tags) of the states',
  },
  route: { name: 'routes (route)', hint: 'write the transitions into the states that can take them' },
  context: {
    name: 'extended state (context)',
    hint: 'a lever machine remembers only its state; make each value of the data a state of its own, or drop the context',
  },
  wildcard: { name: 'wildcard events (*)', hint: 'list each event type that a state answers to' },
  builtinEvent: {
    name: 'built-in events (xstate.*)',
    hint: 'only events that a person or a sensor sends can become levers',
  },
  multipleTargets: { name: 'multiple targets (parallel regions)', hint: FLATTEN },
  finalTransitions: {
    name: 'transitions out of a final state',
    hint: 'xstate stops the machine in a top-level final state, so these never fire; remove them or drop type: "final"',
  },
  rootOutputs: {
    name: 'outputs on the machine root (meta.outputs)',
    hint: 'put meta.outputs on each state, or use a tag on the root for an output that is always 1',
  },
  rootTarget: {
    name: 'transitions to the machine root',
    hint: 'name the state to go to, for example the initial state',
  },
};

/** The name and hint of a feature. */
export function featureNote(f: Feature): { readonly name: string; readonly hint: string } {
  return NOTES[f];
}
