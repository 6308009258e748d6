/**
 * Text from the input, made safe to echo in a message, on a terminal, in a JSON report or in
 * Markdown: characters that steer a terminal or reorder text are spelt out, and a long piece
 * is shortened, its middle left out, so a 10 MB word gives a message of a line or two.
 *
 * Spelt out (as `\n`, `\t`, `\r` or `\u{1b}`): the C0 controls U+0000–U+001F (ESC starts the
 * terminal's escape sequences, ECMA-48 §5.3), DEL, the C1 controls U+0080–U+009F (U+009B is
 * a one-character CSI, ECMA-48 §5.3), the line and paragraph separators U+2028 and U+2029,
 * and the bidirectional formatting characters of Unicode Standard Annex #9 (U+061C,
 * U+200E–U+200F, U+202A–U+202E, U+2066–U+2069), which can make a line read in another order
 * than it is written. A backslash stays as it is.
 */

/** Most characters of one echoed piece of the input (a name, a token, a value). */
export const ECHO_MAX = 80;
/** Most characters of a whole message, hint or location. */
export const MESSAGE_MAX = 600;

// eslint-disable-next-line no-control-regex -- matching control characters is the point
const UNSAFE = /[\u0000-\u001f\u007f-\u009f\u061c\u200e\u200f\u2028\u2029\u202a-\u202e\u2066-\u2069]/g;
const NAMED: Readonly<Record<string, string>> = { '\n': '\\n', '\r': '\\r', '\t': '\\t' };

/** True when `text` holds a character `printable` spells out. */
export function hasUnsafe(text: string): boolean {
  UNSAFE.lastIndex = 0;
  return UNSAFE.test(text);
}

/** Control and bidirectional characters spelt out, then at most `max` characters (the middle left out). */
export function printable(text: string, max = ECHO_MAX): string {
  // Shorten first (a 10 MB piece is never scanned whole), then spell out, then shorten what spelling out grew.
  const short = shorten(text, max);
  const safe = short.replace(UNSAFE, (c) => NAMED[c] ?? `\\u{${c.charCodeAt(0).toString(16)}}`);
  return safe === short ? safe : shorten(safe, max + 40);
}

/** At most about `max` characters: the head and the tail, with the count of what is left out between them. */
export function shorten(text: string, max: number): string {
  if (text.length <= max) return text;
  const tailLength = Math.floor(max / 4);
  const head = cut(text.slice(0, max - tailLength - 1));
  const tail = text.slice(text.length - tailLength);
  const left = text.length - head.length - tail.length;
  return `${head}…[${left} characters]…${tail.charCodeAt(0) >= 0xdc00 && tail.charCodeAt(0) <= 0xdfff ? tail.slice(1) : tail}`;
}

/** Without a lone high surrogate at the end (half of a character cut in two). */
function cut(s: string): string {
  const last = s.charCodeAt(s.length - 1);
  return last >= 0xd800 && last <= 0xdbff ? s.slice(0, -1) : s;
}
