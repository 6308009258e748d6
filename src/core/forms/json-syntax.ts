/**
 * Finds where a JSON text first breaks the grammar of RFC 8259, with a plain message.
 * Used only after JSON.parse has failed: the engine's own messages do not always carry a
 * position, and the user needs a line and column.
 */

/** Offset and description of the first syntax error, or undefined when the text is valid. */
export function locateJsonError(text: string): { pos: number; msg: string } | undefined {
  let i = 0;
  class Stop {
    constructor(
      readonly pos: number,
      readonly msg: string,
    ) {}
  }
  const fail = (msg: string, pos = i): never => {
    throw new Stop(pos, msg);
  };
  const found = (): string => (i >= text.length ? 'the end of the text' : `'${text[i]}'`);
  const ws = (): void => {
    while (i < text.length && ' \t\n\r'.includes(text[i])) i++;
  };
  const expect = (ch: string, what: string): void => {
    if (text[i] !== ch) fail(`expected ${what} but found ${found()}`);
    i++;
  };
  const string = (): void => {
    const open = i++;
    for (;;) {
      if (i >= text.length) fail('a string is never closed', open);
      const c = text.charCodeAt(i);
      if (c === 0x22) {
        i++;
        return;
      }
      if (c < 0x20) fail('a string holds a raw control character (a line break?); write it as an escape');
      if (c === 0x5c) {
        const e = text[i + 1];
        if (e === 'u') {
          if (!/^[0-9a-fA-F]{4}$/.test(text.slice(i + 2, i + 6))) fail('\\u must be followed by four hex digits');
          i += 6;
        } else if (e !== undefined && '"\\/bfnrt'.includes(e)) i += 2;
        else fail(`unknown escape '\\${e ?? ''}' in a string`);
      } else i++;
    }
  };
  const number = (): void => {
    const m = /^-?(0|[1-9][0-9]*)(\.[0-9]+)?([eE][+-]?[0-9]+)?/.exec(text.slice(i, i + 400));
    if (!m || m[0] === '-') fail(`malformed number`);
    i += m![0].length;
  };
  const word = (w: string): void => {
    if (text.startsWith(w, i)) i += w.length;
    else fail(`unexpected ${found()}: values are objects, arrays, strings, numbers, true, false or null`);
  };
  const value = (): void => {
    ws();
    const c = text[i];
    if (c === '{') {
      i++;
      ws();
      if (text[i] === '}') {
        i++;
        return;
      }
      for (;;) {
        ws();
        if (text[i] !== '"') fail(`expected a quoted key but found ${found()}`);
        string();
        ws();
        expect(':', "':' after the key");
        value();
        ws();
        if (text[i] === ',') {
          i++;
          continue;
        }
        expect('}', "',' or '}'");
        return;
      }
    } else if (c === '[') {
      i++;
      ws();
      if (text[i] === ']') {
        i++;
        return;
      }
      for (;;) {
        value();
        ws();
        if (text[i] === ',') {
          i++;
          continue;
        }
        expect(']', "',' or ']'");
        return;
      }
    } else if (c === '"') string();
    else if (c === '-' || (c !== undefined && c >= '0' && c <= '9')) number();
    else if (c === 't') word('true');
    else if (c === 'f') word('false');
    else if (c === 'n') word('null');
    else if (c === undefined) fail('the text ends where a value should be');
    else fail(`unexpected ${found()}: values are objects, arrays, strings, numbers, true, false or null`);
  };
  try {
    value();
    ws();
    if (i < text.length) fail(`unexpected ${found()} after the end of the JSON value`);
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
