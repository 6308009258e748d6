/**
 * The largest machine the tool takes (LW400–LW402). The validate phase refuses a machine past
 * them before any other work; a reader that can count cheaply (the xstate importer counts the
 * keys of `states`) refuses it before reading the parts.
 */
export const LIMITS = { states: 4096, inputs: 32, outputs: 256 } as const;

/**
 * The largest machine a build takes (LW407), in states after state minimisation: the two-level
 * minimisation of the set/reset functions grows faster than the table, and past this size a
 * single synthesis alone takes tens of seconds (measured on random machines: 256 states × 4
 * inputs build without their checks in about 30 s on one core, 300 states in over 2 minutes).
 * `check` (parse, validate, minimise states) still takes machines up to LIMITS.states.
 * See docs/notation.md, "Limits".
 */
export const BUILD_LIMITS = { states: 256 } as const;

/**
 * The longest name (machine, state, input or output) the tool takes, in characters (LW405):
 * longer than any label painted on a lever, and it keeps every report, document and message
 * that repeats names a readable size.
 */
export const NAME_MAX = 128;
