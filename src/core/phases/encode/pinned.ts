/**
 * User-pinned state codes: reading and checking them, the `pinned` strategy (every state
 * pinned), and the fill that lets every other strategy honour a partial pin — pinned states
 * keep their codes; the others take, in the strategy's state order, the strategy's code
 * words in sequence, skipping words a pin already holds.
 */
import { diag, type Diagnostic } from '../../model/diagnostics.js';
import type { SourceLoc } from '../../model/machine.js';
import type { FlatMachine } from '../../model/flat.js';
import type { Encoding } from '../../model/build.js';

/** Pins that passed their checks: code per state index, and their common length. */
export interface PinSet {
  readonly codes: ReadonlyMap<number, string>;
  /** Length of every pinned code; undefined when nothing is pinned. */
  readonly bits?: number;
}

/** What a strategy returns inside the phase. */
export interface StrategyResult {
  readonly encoding?: Encoding;
  readonly diagnostics: Diagnostic[];
}

const NO_PINS: PinSet = { codes: new Map() };

/**
 * Check the pinned codes against the machine: 0/1 only, one common length, all different
 * (LW206); a name the machine does not have is ignored with a warning (LW207) — state
 * minimisation may have merged it into another state.
 */
export function readPins(
  f: FlatMachine,
  pinned: Readonly<Record<string, string>> | undefined,
  at: Readonly<Record<string, SourceLoc>> = {},
): { pins: PinSet; diagnostics: Diagnostic[] } {
  const diagnostics: Diagnostic[] = [];
  if (!pinned) return { pins: NO_PINS, diagnostics };
  const index = new Map(f.states.map((s, i) => [s, i]));
  const codes = new Map<number, string>();
  let bits: number | undefined;
  let lengthFrom = '';
  const holder = new Map<string, string>();
  // Check in state order, so the messages (and which code sets the length) are stable.
  const names = Object.keys(pinned).sort(
    (a, b) => (index.get(a) ?? Infinity) - (index.get(b) ?? Infinity) || (a < b ? -1 : 1),
  );
  for (const name of names) {
    const code = pinned[name];
    const loc = at[name] ?? {};
    const s = index.get(name);
    if (s === undefined) {
      diagnostics.push(
        diag(
          'LW207',
          `pinned code '${code}' names state '${name}', which the built machine does not have; the pin is ignored`,
          loc,
          'state minimisation may have merged it with an equivalent state; pin that state instead, or correct the name',
        ),
      );
      continue;
    }
    if (typeof code !== 'string' || !/^[01]*$/.test(code)) {
      diagnostics.push(
        diag(
          'LW206',
          `pinned code '${String(code)}' of state '${name}' is not a string of 0s and 1s`,
          loc,
          'write the code as binary digits, bit 0 first, e.g. 010',
        ),
      );
      continue;
    }
    if (bits === undefined) {
      bits = code.length;
      lengthFrom = name;
    } else if (code.length !== bits) {
      diagnostics.push(
        diag(
          'LW206',
          `pinned code '${code}' of state '${name}' has ${code.length} bits, but state '${lengthFrom}' is pinned with ${bits}`,
          loc,
          'give every pinned code the same number of digits',
        ),
      );
      continue;
    }
    const other = holder.get(code);
    if (other !== undefined) {
      diagnostics.push(
        diag(
          'LW206',
          `states '${other}' and '${name}' are both pinned to code '${code}'`,
          loc,
          'give each state its own code',
        ),
      );
      continue;
    }
    holder.set(code, name);
    codes.set(s, code);
  }
  return { pins: { codes, ...(bits !== undefined ? { bits } : {}) }, diagnostics };
}

/**
 * Codes for every state: pins first, then the states of `order` that are not pinned take
 * the words of `sequence` in turn, skipping pinned ones. Undefined when the sequence runs
 * out (the strategy does not fit).
 */
export function fillCodes(
  n: number,
  order: readonly number[],
  sequence: Iterable<string>,
  pins: PinSet,
): string[] | undefined {
  const codes = new Array<string>(n);
  const used = new Set<string>();
  for (const [s, c] of pins.codes) {
    codes[s] = c;
    used.add(c);
  }
  const it = sequence[Symbol.iterator]();
  for (const s of order) {
    if (pins.codes.has(s)) continue;
    let next = it.next();
    while (!next.done && used.has(next.value)) next = it.next();
    if (next.done) return undefined;
    codes[s] = next.value;
    used.add(next.value);
  }
  return codes;
}

/** The `pinned` strategy: every state's code comes from the user. */
export function pinnedStrategy(f: FlatMachine, pins: PinSet): StrategyResult {
  const missing = f.states.filter((_, s) => !pins.codes.has(s));
  if (missing.length > 0) {
    const list = missing.map((m) => `'${m}'`).join(', ');
    return {
      diagnostics: [
        diag(
          'LW701',
          `the pinned encoding needs a code for every state; ${missing.length === 1 ? 'state' : 'states'} ${list} ${missing.length === 1 ? 'has' : 'have'} none`,
          {},
          'pin the missing states, or choose another encoding, which fills in the codes you did not pin',
        ),
      ],
    };
  }
  const codes = f.states.map((_, s) => pins.codes.get(s) as string);
  return { encoding: { strategy: 'pinned', bits: pins.bits ?? 0, codes }, diagnostics: [] };
}

/**
 * A named strategy's encoding: `bits` is the strategy's own length unless pins fix
 * another; the sequence (a function of the length) is filled around the pins in `order`.
 */
export function assignFromSequence(
  f: FlatMachine,
  pins: PinSet,
  strategy: string,
  ownBits: number,
  order: readonly number[],
  sequence: (bits: number) => Iterable<string>,
): StrategyResult {
  const bits = pins.bits ?? ownBits;
  const codes = fillCodes(f.states.length, order, sequence(bits), pins);
  if (codes) return { encoding: { strategy, bits, codes }, diagnostics: [] };
  const free = f.states.length - pins.codes.size;
  return {
    diagnostics: [
      diag(
        'LW701',
        `${strategy} codes of ${bits} bits run out: ${free} unpinned ${free === 1 ? 'state needs a code' : 'states need codes'} not already taken by the ${pins.codes.size} pinned ${pins.codes.size === 1 ? 'state' : 'states'}`,
        {},
        pins.codes.size > 0
          ? 'pin longer codes, or choose binary, gray or auto, which fit any pins'
          : 'choose another encoding',
      ),
    ],
  };
}
