/**
 * Where the values of a JSON text (RFC 8259) start, by JSON path — `$`, `$.states[2].to`,
 * `$.states["odd key"]`, as `jsonKey` writes them — so that a diagnostic that names a path can
 * name a line and column too; where a number literal is too large to hold (JSON.parse
 * reads `1e309` as Infinity, which JSON.stringify then writes as null); and where a key
 * repeats within one object (JSON.parse keeps the last and drops the others without a word;
 * RFC 8259 §4: names SHOULD be unique, and where they are not, readers differ).
 *
 * Method: one pass over the text with an explicit stack of open objects and arrays (no
 * recursion, so nesting of any depth is fine), building each value's path as it goes.
 * Precondition: the text is valid JSON (JSON.parse accepted it); on anything else the pass
 * stops where the text stops making sense and returns what it found before.
 */
import { jsonKey } from './json-path.js';

/** One open object or array: its path, and the key or index of the member being read. */
interface Frame {
  readonly path: string;
  readonly array: boolean;
  index: number;
  key: string;
  /** The keys read so far (objects only). */
  readonly keys?: Set<string>;
}

export interface JsonScan {
  /** Offset of the first character of each value, by path (only the `wanted` paths, when given). */
  readonly offsets: ReadonlyMap<string, number>;
  /** Number literals that JSON.parse reads as ±Infinity: their offset, text and path. */
  readonly overflows: readonly { readonly offset: number; readonly text: string; readonly path: string }[];
  /** Keys that repeat within their object: the offset of the repeat, the key, and the path of its value. */
  readonly duplicates: readonly { readonly offset: number; readonly key: string; readonly path: string }[];
}

const WS = new Set([' ', '\t', '\n', '\r']);
const NUMBER = /-?(?:0|[1-9][0-9]*)(?:\.[0-9]+)?(?:[eE][+-]?[0-9]+)?/y;

/** A reader over the text; `i` is the read position. */
class Scanner {
  i = 0;
  readonly stack: Frame[] = [];
  readonly offsets = new Map<string, number>();
  readonly overflows: { offset: number; text: string; path: string }[] = [];
  readonly duplicates: { offset: number; key: string; path: string }[] = [];

  constructor(
    private readonly text: string,
    private readonly wanted: ReadonlySet<string> | undefined,
  ) {}

  ws(): void {
    while (this.i < this.text.length && WS.has(this.text[this.i])) this.i++;
  }

  /** The path of the value about to be read. */
  path(): string {
    const top = this.stack[this.stack.length - 1];
    if (top === undefined) return '$';
    return top.array ? `${top.path}[${top.index}]` : jsonKey(top.path, top.key);
  }

  /** Offset just past the string that opens at `i`. */
  stringEnd(from: number): number {
    let j = from + 1;
    while (j < this.text.length && this.text[j] !== '"') j += this.text[j] === '\\' ? 2 : 1;
    return j + 1;
  }

  /** A member's key and its ':'; false when the text does not go on as JSON. */
  key(top: Frame): boolean {
    this.ws();
    if (this.text[this.i] !== '"') return false;
    const end = this.stringEnd(this.i);
    top.key = JSON.parse(this.text.slice(this.i, end)) as string;
    if (top.keys?.has(top.key))
      this.duplicates.push({ offset: this.i, key: top.key, path: jsonKey(top.path, top.key) });
    top.keys?.add(top.key);
    this.i = end;
    this.ws();
    if (this.text[this.i] !== ':') return false;
    this.i++;
    return true;
  }

  /**
   * Read one value: a scalar or an empty container ('value'), or the opening of a container
   * whose first member is to be read next ('open'); 'stop' where the text stops being JSON.
   */
  value(): 'value' | 'open' | 'stop' {
    this.ws();
    const path = this.path();
    if (this.wanted === undefined || this.wanted.has(path)) this.offsets.set(path, this.i);
    const c = this.text[this.i];
    if (c === '{' || c === '[') {
      this.i++;
      const frame: Frame = {
        path,
        array: c === '[',
        index: 0,
        key: '',
        ...(c === '{' ? { keys: new Set<string>() } : {}),
      };
      this.stack.push(frame);
      this.ws();
      if (this.text[this.i] === (c === '{' ? '}' : ']')) {
        this.i++;
        this.stack.pop();
        return 'value';
      }
      return c === '[' || this.key(frame) ? 'open' : 'stop';
    }
    if (c === '"') this.i = this.stringEnd(this.i);
    else if (c === '-' || (c >= '0' && c <= '9')) this.number(path);
    else if (/[tfn]/.test(c ?? '')) this.i += c === 'f' ? 5 : 4;
    else return 'stop';
    return 'value';
  }

  number(path: string): void {
    NUMBER.lastIndex = this.i;
    const m = NUMBER.exec(this.text);
    const t = m ? m[0] : this.text[this.i];
    if (!Number.isFinite(Number(t))) this.overflows.push({ offset: this.i, text: t, path });
    this.i += t.length;
  }

  /** After a value: close what ends here, then read the next member; false when the text is done. */
  next(): boolean {
    for (;;) {
      this.ws();
      const top = this.stack[this.stack.length - 1];
      if (top === undefined) return false;
      const c = this.text[this.i];
      if (c === ',') {
        this.i++;
        top.index++;
        return top.array || this.key(top);
      }
      if (c !== (top.array ? ']' : '}')) return false;
      this.i++;
      this.stack.pop();
    }
  }
}

/** Scan a JSON text; `wanted`: record only these paths (all when absent). */
export function scanJson(text: string, wanted?: ReadonlySet<string>): JsonScan {
  const s = new Scanner(text, wanted);
  for (;;) {
    const read = s.value();
    if (read === 'stop' || (read === 'value' && !s.next())) break;
  }
  return { offsets: s.offsets, overflows: s.overflows, duplicates: s.duplicates };
}

/**
 * Object members written in the text: the ':' outside strings (each member has exactly one).
 * When it equals the keys JSON.parse kept, no key repeats and the text need not be scanned.
 */
export function membersWritten(text: string): number {
  let n = 0;
  for (let i = 0; i < text.length; i++) {
    const c = text.charCodeAt(i);
    if (c === 0x22) {
      for (i++; i < text.length && text.charCodeAt(i) !== 0x22; i++) if (text.charCodeAt(i) === 0x5c) i++;
    } else if (c === 0x3a) n++;
  }
  return n;
}

/** Own keys of every object in a parsed JSON value (nesting already bounded by the caller). */
export function membersKept(value: unknown): number {
  if (Array.isArray(value)) return value.reduce((n: number, v) => n + membersKept(v), 0);
  if (typeof value !== 'object' || value === null) return 0;
  return Object.values(value).reduce((n: number, v) => n + membersKept(v), Object.keys(value).length);
}

/** Offset of the first `{` or `[` that opens level `max + 1` of nesting (strings skipped), or -1 when none does. */
export function tooDeep(text: string, max: number): number {
  let depth = 0;
  for (let i = 0; i < text.length; i++) {
    const c = text.charCodeAt(i);
    if (c === 0x22) {
      for (i++; i < text.length && text.charCodeAt(i) !== 0x22; i++) if (text.charCodeAt(i) === 0x5c) i++;
    } else if (c === 0x7b || c === 0x5b) {
      if (++depth > max) return i;
    } else if (c === 0x7d || c === 0x5d) depth--;
  }
  return -1;
}

/** Every path a diagnostic path may fall back to: itself, then each shorter path (cut before a '.' or '['). */
export function pathPrefixes(path: string): string[] {
  const out = [path];
  for (let k = path.length - 1; k > 0; k--) if (path[k] === '.' || path[k] === '[') out.push(path.slice(0, k));
  return out;
}
