/**
 * Positions in the machine's text: where each line starts, and which characters a diagnostic
 * at a column should mark (the word there, or one character).
 */

/** Offset of the first character of every line (line breaks: LF, CRLF or CR). */
export function lineStarts(text: string): number[] {
  const starts = [0];
  for (let i = 0; i < text.length; i++) {
    const c = text[i];
    if (c === '\r' && text[i + 1] === '\n') i++;
    if (c === '\n' || c === '\r') starts.push(i + 1);
  }
  return starts;
}

/** Offset of a 1-based line and column, clamped to the text. */
export function offsetOf(text: string, line: number, column: number): number {
  const starts = lineStarts(text);
  const l = Math.min(Math.max(line, 1), starts.length);
  const end = l < starts.length ? starts[l] : text.length;
  const lineText = text.slice(starts[l - 1], end).replace(/\r?\n$|\r$/, '');
  return starts[l - 1] + Math.min(Math.max(column, 1) - 1, lineText.length);
}

/** The characters to mark for a diagnostic at a 1-based column: the name or number there, else one character. */
export function markSpan(line: string, column: number): { from: number; to: number } {
  const from = Math.min(Math.max(column - 1, 0), line.length);
  const word = /^[A-Za-z0-9_.-]+/.exec(line.slice(from));
  return { from, to: from + (word ? word[0].length : Math.min(1, line.length - from)) };
}
