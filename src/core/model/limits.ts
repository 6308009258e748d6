/**
 * The largest machine the tool takes (LW400–LW402). The validate phase refuses a machine past
 * them before any other work; a reader that can count cheaply (the xstate importer counts the
 * keys of `states`) refuses it before reading the parts.
 */
export const LIMITS = { states: 4096, inputs: 32, outputs: 256 } as const;
