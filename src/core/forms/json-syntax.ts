/**
 * Finds where a JSON text first breaks the grammar of RFC 8259, with a plain message.
 * Used only after JSON.parse has failed: the engine's own messages do not always carry a
 * position, and the user needs a line and column.
 */

/** The first syntax error, thrown inside the scanner and caught by locateJsonError. */
class Stop extends Error {
  constructor(
    readonly pos: number,
    readonly msg: string,
  ) {
    super(msg);
    this.name = 'Stop';
  }
}

const NOT_A_VALUE = 'values are objects, arrays, strings, numbers, true, false or null';

/** A recursive-descent reader of one JSON text that only checks the grammar; `i` is the read position. */
class JsonScanner {
  private i = 0;

  constructor(private readonly text: string) {}

  /** The whole text: one value, then only white space. */
  document(): void {
    this.value();
    this.ws();
    if (this.i < this.text.length) this.fail(`unexpected ${this.found()} after the end of the JSON value`);
  }

  private fail(msg: string, pos = this.i): never {
    throw new Stop(pos, msg);
  }

  private found(): string {
    return this.i >= this.text.length ? 'the end of the text' : `'${this.text[this.i]}'`;
  }

  private ws(): void {
    while (this.i < this.text.length && ' \t\n\r'.includes(this.text[this.i])) this.i++;
  }

  private expect(ch: string, what: string): void {
    if (this.text[this.i] !== ch) this.fail(`expected ${what} but found ${this.found()}`);
    this.i++;
  }

  /**
   * One value. Objects and arrays are read here rather than in methods of their own, so that
   * each level of nesting costs one stack frame.
   */
  private value(): void {
    this.ws();
    const c = this.text[this.i];
    if (c === '{' || c === '[') {
      const close = c === '{' ? '}' : ']';
      this.i++;
      this.ws();
      if (this.text[this.i] === close) {
        this.i++;
        return;
      }
      for (;;) {
        if (c === '{') this.key();
        this.value();
        this.ws();
        if (this.text[this.i] !== ',') break;
        this.i++;
      }
      this.expect(close, `',' or '${close}'`);
    } else if (c === '"') this.string();
    else if (c === '-' || (c !== undefined && c >= '0' && c <= '9')) this.number();
    else if (c === 't') this.word('true');
    else if (c === 'f') this.word('false');
    else if (c === 'n') this.word('null');
    else if (c === undefined) this.fail('the text ends where a value should be');
    else this.fail(`unexpected ${this.found()}: ${NOT_A_VALUE}`);
  }

  /** An object member's key and its ':'. */
  private key(): void {
    this.ws();
    if (this.text[this.i] !== '"') this.fail(`expected a quoted key but found ${this.found()}`);
    this.string();
    this.ws();
    this.expect(':', "':' after the key");
  }

  private string(): void {
    const open = this.i++;
    for (;;) {
      if (this.i >= this.text.length) this.fail('a string is never closed', open);
      const c = this.text.charCodeAt(this.i);
      if (c === 0x22) {
        this.i++;
        return;
      }
      if (c < 0x20) this.fail('a string holds a raw control character (a line break?); write it as an escape');
      if (c === 0x5c) this.escape();
      else this.i++;
    }
  }

  /** A backslash escape inside a string, at the backslash. */
  private escape(): void {
    const e = this.text[this.i + 1];
    if (e === 'u') {
      if (!/^[0-9a-fA-F]{4}$/.test(this.text.slice(this.i + 2, this.i + 6)))
        this.fail('\\u must be followed by four hex digits');
      this.i += 6;
    } else if (e !== undefined && '"\\/bfnrt'.includes(e)) this.i += 2;
    else this.fail(`unknown escape '\\${e ?? ''}' in a string`);
  }

  private number(): void {
    const m = /^-?(0|[1-9][0-9]*)(\.[0-9]+)?([eE][+-]?[0-9]+)?/.exec(this.text.slice(this.i, this.i + 400));
    if (!m || m[0] === '-') this.fail(`malformed number`);
    this.i += m[0].length;
  }

  private word(w: string): void {
    if (this.text.startsWith(w, this.i)) this.i += w.length;
    else this.fail(`unexpected ${this.found()}: ${NOT_A_VALUE}`);
  }
}

/** Offset and description of the first syntax error, or undefined when the text is valid. */
export function locateJsonError(text: string): { pos: number; msg: string } | undefined {
  try {
    new JsonScanner(text).document();
    return undefined;
  } catch (e) {
    if (e instanceof Stop) return { pos: e.pos, msg: e.msg };
    // Nesting deep enough to exhaust the stack: report at the start.
    return { pos: 0, msg: 'the JSON is nested too deeply to read' };
  }
}

/** 1-based line and column of an offset. */
export function lineColumn(text: string, pos: number): { line: number; column: number } {
  let line = 1;
  let last = -1;
  for (let k = 0; k < pos && k < text.length; k++) {
    if (text.charCodeAt(k) === 10) {
      line++;
      last = k;
    }
  }
  return { line, column: pos - last };
}
