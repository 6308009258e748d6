/**
 * xstate v5 interop (see docs/xstate.md): import a flat xstate configuration as a Machine,
 * and export a Machine as a configuration that xstate steps the same way, clock by clock.
 * The work lives in ./xstate/; this file is the entry point the rest of the tool imports.
 */
export { importXstate } from './xstate/import.js';
export {
  exportXstate,
  clockGuards,
  clockEvent,
  hasLeverShape,
  type XstateExport,
  type XstateExportOptions,
} from './xstate/export.js';
export { featureNote, type Feature } from './xstate/features.js';
export { resolveTarget, toStatePath } from './xstate/targets.js';
export { isLeverName } from './xstate/scan.js';
export {
  CLOCK_EVENT,
  HOLDS_GUARD,
  type ClockEvent,
  type XstateConfig,
  type XstateForm,
  type XstateGuardFn,
  type XstateStateConfig,
  type XstateTransitionConfig,
} from './xstate/types.js';
