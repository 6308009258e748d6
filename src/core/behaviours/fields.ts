/**
 * What every behaviour shares: its parameters (fields), read from plain strings as the
 * command line and the designer's form give them, with a coded diagnostic for each mistake a
 * user can make (LW800–LW804), and the pieces of text the machines are written with.
 *
 * Preconditions: none — any strings give diagnostics, never an exception.
 * Postconditions: a value is returned only when it is good; otherwise one diagnostic names the
 * parameter (location path `BEHAVIOUR.FIELD`), says what is wrong and hints at a fix.
 */
import { diag, printable, type Diagnostic } from '../model/diagnostics.js';
import { NAME_MAX } from '../model/limits.js';
import { ownValue } from '../model/records.js';

/**
 * How a field's value is written: one name, a list of names, a whole number, one of a few
 * words, or a list of steps (each the names that show at once joined by `+`, or `0`).
 */
export type FieldKind = 'name' | 'names' | 'count' | 'choice' | 'steps';

/** One parameter of a behaviour. Its key is also its command-line option (`--key`). */
export interface Field {
  readonly key: string;
  readonly kind: FieldKind;
  /** Short words for the designer's form. */
  readonly label: string;
  /** One line: what the field means (the command line's usage and the docs). */
  readonly help: string;
  /** Left empty, the behaviour goes without it (an optional input or output). */
  readonly optional?: true;
  /** The value the designer's form starts with (an invented scenario). */
  readonly example: string;
  /** Inclusive bounds of a count. */
  readonly min?: number;
  readonly max?: number;
  /** The words a choice takes, the first the default. */
  readonly choices?: readonly { readonly value: string; readonly label: string }[];
}

/** The values of a behaviour's fields, as typed (a missing or blank value is left out). */
export type FieldValues = Readonly<Record<string, string | undefined>>;

/** What a behaviour writes: the machine in the text form and the sentence it stands for. */
export type Written =
  | { readonly ok: true; readonly text: string; readonly sentence: string; readonly diagnostics: readonly [] }
  | { readonly ok: false; readonly diagnostics: readonly Diagnostic[] };

const IDENTIFIER = /^[A-Za-z_][A-Za-z0-9_]*$/;
const MACHINE_NAME = /^[A-Za-z0-9_][A-Za-z0-9_-]*$/;

/** Reads the fields of one behaviour, collecting a diagnostic for every value that is not good. */
export class FieldReader {
  readonly diagnostics: Diagnostic[] = [];
  /** Each name given so far, with the field it was given for (one name, one role). */
  private readonly roles = new Map<string, string>();

  constructor(
    private readonly behaviour: string,
    private readonly fields: readonly Field[],
    private readonly values: FieldValues,
  ) {}

  private field(key: string): Field {
    const f = this.fields.find((x) => x.key === key);
    if (!f) throw new Error(`behaviour ${this.behaviour} has no field ${key}`);
    return f;
  }

  private raw(key: string): string | undefined {
    const v = ownValue(this.values, key)?.trim();
    return v === undefined || v === '' ? undefined : v;
  }

  private where(key: string) {
    return { path: `${this.behaviour}.${key}` };
  }

  private missing(f: Field): undefined {
    this.diagnostics.push(
      diag(
        'LW802',
        `${this.behaviour}: ${f.label.toLowerCase()} (--${f.key}) is not given`,
        this.where(f.key),
        `give it, for example --${f.key} ${f.example}`,
      ),
    );
    return undefined;
  }

  /** A name is good when the notation takes it for an input or output (docs/notation.md, Names). */
  private goodName(key: string, n: string): boolean {
    if (n.length <= NAME_MAX && IDENTIFIER.test(n)) return true;
    const why = n.length > NAME_MAX ? `is longer than ${NAME_MAX} characters` : 'is not a name';
    this.diagnostics.push(
      diag(
        'LW801',
        `${this.behaviour}: '${printable(n)}' (--${key}) ${why}`,
        this.where(key),
        'use letters, digits and _, starting with a letter or _ (red_button, lamp_2)',
      ),
    );
    return false;
  }

  /** Remember that `n` plays the role of field `key`; a second role for it is LW803. */
  private claim(key: string, n: string): void {
    const prior = this.roles.get(n);
    if (prior === undefined) this.roles.set(n, key);
    else if (prior !== key)
      this.diagnostics.push(
        diag(
          'LW803',
          `${this.behaviour}: '${n}' is given both as --${prior} and as --${key}`,
          this.where(key),
          'one lever or flag, one role: give each its own name',
        ),
      );
  }

  /** One name, or undefined (with a diagnostic, unless the field is optional and left empty). */
  name(key: string): string | undefined {
    const f = this.field(key);
    const v = this.raw(key);
    if (v === undefined) return f.optional ? undefined : this.missing(f);
    if (!this.goodName(key, v)) return undefined;
    this.claim(key, v);
    return v;
  }

  /**
   * A list of names (separated by commas or spaces), or undefined. `repeats` allows a name more
   * than once (an order of presses); otherwise a repeat is LW803.
   */
  names(key: string, repeats = false): string[] | undefined {
    const list = this.words(key);
    if (list === undefined || list.length === 0) return list;
    if (!list.every((n) => this.goodName(key, n))) return undefined;
    if (!repeats) {
      const twice = list.find((n, i) => list.indexOf(n) !== i);
      if (twice !== undefined) {
        this.diagnostics.push(
          diag('LW803', `${this.behaviour}: '${twice}' is named twice in --${key}`, this.where(key), 'name it once'),
        );
        return undefined;
      }
    }
    return list;
  }

  /** The words of a list (separated by commas or spaces), unchecked, or undefined (LW802 unless optional). */
  words(key: string): string[] | undefined {
    const f = this.field(key);
    const list = (this.raw(key) ?? '').split(/[\s,]+/).filter((s) => s !== '');
    if (list.length === 0) return f.optional ? [] : this.missing(f);
    return list;
  }

  /** Record the names of a list as playing the role of field `key` (after any checks among them). */
  claimAll(key: string, names: readonly string[]): void {
    for (const n of new Set(names)) this.claim(key, n);
  }

  /** A whole number within the field's bounds, or undefined with LW800. */
  count(key: string): number | undefined {
    const f = this.field(key);
    const v = this.raw(key) ?? (f.optional ? f.example : undefined);
    if (v === undefined) return this.missing(f);
    const min = f.min ?? 1;
    const max = f.max ?? min;
    const n = /^[0-9]{1,6}$/.test(v) ? Number(v) : NaN;
    if (Number.isInteger(n) && n >= min && n <= max) return n;
    this.diagnostics.push(
      diag(
        'LW800',
        `${this.behaviour}: --${key} is '${printable(v)}', not a whole number from ${min} to ${max}`,
        this.where(key),
        `give a whole number from ${min} to ${max}`,
      ),
    );
    return undefined;
  }

  /** One of the field's words (the first when left empty), or undefined with LW804. */
  choice<T extends string>(key: string): T | undefined {
    const f = this.field(key);
    const words = (f.choices ?? []).map((c) => c.value);
    const v = this.raw(key) ?? words[0];
    if (words.includes(v)) return v as T;
    this.diagnostics.push(
      diag(
        'LW804',
        `${this.behaviour}: --${key} is '${printable(v)}', which it does not take`,
        this.where(key),
        `write one of: ${words.join(', ')}`,
      ),
    );
    return undefined;
  }

  /** LW800 for a list of `n` names when the field's bounds do not take that many; whether they do. */
  countOf(key: string, n: number): boolean {
    const f = this.field(key);
    const min = f.min ?? 1;
    const max = f.max ?? n;
    if (n >= min && n <= max) return true;
    this.diagnostics.push(
      diag(
        'LW800',
        `${this.behaviour}: --${key} names ${n}, not ${min} to ${max}`,
        this.where(key),
        `name from ${min} to ${max}`,
      ),
    );
    return false;
  }

  /** The machine's name: the field `name` when given (letters, digits, _ and -), else `fallback`. */
  machineName(fallback: string): string {
    const v = this.raw('name');
    if (v === undefined) return fallback;
    if (v.length <= NAME_MAX && MACHINE_NAME.test(v)) return v;
    this.diagnostics.push(
      diag(
        'LW801',
        `${this.behaviour}: '${printable(v)}' (--name) is not a machine name`,
        this.where('name'),
        'use letters, digits, _ and -, not starting with -',
      ),
    );
    return fallback;
  }

  /** Report a mistake of the behaviour's own (for example an order that names an input not listed). */
  report(d: Diagnostic): void {
    this.diagnostics.push(d);
  }

  get ok(): boolean {
    return this.diagnostics.length === 0;
  }
}

/** The `name` field every behaviour has: the machine's name. */
export function nameField(example: string): Field {
  return {
    key: 'name',
    kind: 'name',
    label: 'Machine name',
    help: `the machine's name (default ${example})`,
    optional: true,
    example,
  };
}

/** The guard "exactly `one` of `all` is pulled" (a press of that lever alone). */
export function alone(one: string, all: readonly string[]): string {
  return [one, ...all.filter((x) => x !== one).map((x) => `!${x}`)].join(' & ');
}

/** The guard "none of `all` is pulled". */
export function noneOf(all: readonly string[]): string {
  return all.length === 1 ? `!${all[0]}` : `!(${all.join(' | ')})`;
}

/** Lines with their comments lined up after the statement: `[statement, comment]`. */
export function commented(lines: readonly (readonly [string, string])[]): string[] {
  const width = Math.max(...lines.map(([s]) => s.length));
  return lines.map(([s, c]) => (c ? `${s.padEnd(width)}  # ${c}` : s));
}

/** The header comment of a written machine: its sentence, then notes, each line `# …`. */
export function header(title: string, paragraphs: readonly string[]): string[] {
  const out = [`# ${title}`];
  for (const p of paragraphs) out.push('#', ...wrap(p, 88).map((l) => `# ${l}`));
  return out;
}

function wrap(text: string, width: number): string[] {
  const lines: string[] = [];
  let line = '';
  for (const w of text.split(/\s+/)) {
    if (line && line.length + 1 + w.length > width) {
      lines.push(line);
      line = w;
    } else line = line ? `${line} ${w}` : w;
  }
  if (line) lines.push(line);
  return lines;
}

/** "1st", "2nd", "3rd", "4th", … */
export function ordinal(n: number): string {
  const t = n % 100;
  const s = t >= 11 && t <= 13 ? 'th' : (['th', 'st', 'nd', 'rd'][n % 10] ?? 'th');
  return `${n}${s}`;
}
