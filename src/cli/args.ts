/** A small, strict command-line parser: `command FILE --flag value --switch`. */

/** A word of the command line that could not be used, and why. */
export interface ArgError {
  /** The option as written, e.g. `--encodng`. */
  readonly option: string;
  readonly message: string;
}

export interface ParsedArgs {
  readonly command?: string;
  readonly positional: readonly string[];
  readonly flags: Readonly<Record<string, string | true>>;
  /** Every value of each flag that may be given more than once, in order. */
  readonly lists: Readonly<Record<string, readonly string[]>>;
  readonly errors: readonly ArgError[];
}

export interface FlagSpec {
  /** Flags that take a value. */
  readonly values: readonly string[];
  /** Flags that are switches. */
  readonly switches: readonly string[];
  /** Flags that take a value and may be given more than once (`--pin a=1 --pin b=2`). */
  readonly lists?: readonly string[];
}

export function parseArgs(argv: readonly string[], spec: FlagSpec): ParsedArgs {
  const positional: string[] = [];
  const flags: Record<string, string | true> = {};
  const lists: Record<string, string[]> = {};
  const errors: ArgError[] = [];
  for (let i = 0; i < argv.length; i++) {
    const a = argv[i];
    if (a === '--') {
      positional.push(...argv.slice(i + 1));
      break;
    }
    if (a.startsWith('--')) {
      const [name, inline] = a.slice(2).split(/=(.*)/s, 2);
      if (spec.switches.includes(name)) flags[name] = true;
      else if (spec.values.includes(name) || spec.lists?.includes(name)) {
        // `--encoding --json` is a forgotten value, not an encoding named '--json'.
        const next = argv[i + 1];
        const v = inline ?? (next === undefined || next.startsWith('--') ? undefined : argv[++i]);
        if (v === undefined) errors.push({ option: `--${name}`, message: `--${name} needs a value` });
        else if (spec.lists?.includes(name)) (lists[name] ??= []).push(v);
        else flags[name] = v;
      } else errors.push({ option: `--${name}`, message: `unknown option --${name}` });
    } else if (a === '-h') flags.help = true;
    else positional.push(a);
  }
  const [command, ...rest] = positional;
  return { command, positional: rest, flags, lists, errors };
}
