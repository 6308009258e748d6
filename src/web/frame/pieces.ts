/**
 * A large drawing split so the page can put it in over several frames instead of in one long
 * task: its shell (the root with its first children, the title block: parsed and shown first)
 * and the rest of the root's children in pieces of about `pieceChars` characters, in document
 * order; a group longer than that goes in empty and its children follow in pieces of their
 * own. Putting every piece, in order, at the end of the root or of the group it names gives the
 * drawing element for element. Pure.
 *
 * The text must be an SVG document as the core writes it (src/core/export/svg.ts): every
 * user-given name escaped, so a `<` always opens a tag, a comment or a processing
 * instruction; no CDATA.
 */

/** Children of the root, or of one emptied group of the root, in order. */
export interface Piece {
  /** The group's place among the root's element children (0 for the first), or -1: the root's own children. */
  readonly group: number;
  readonly text: string;
}

export interface Pieces {
  /** The whole drawing when it is small; else its first children, with the rest left out. */
  readonly shell: string;
  /** What goes in after, in document order (none when the drawing is small). */
  readonly pieces: readonly Piece[];
}

/** One element in the text: where it starts, ends, and where its content does. */
interface Span {
  readonly start: number;
  readonly end: number;
  readonly name: string;
  /** After its start tag and before its end tag (equal for an empty element). */
  readonly inner: readonly [number, number];
}

const TAG = /<(\/?)([A-Za-z][\w:.-]*)[^>]*?(\/?)>|<!--[\s\S]*?-->|<\?[\s\S]*?\?>/g;

/** The element children of the element whose content lies in [from, to), in order. */
function childrenIn(text: string, from: number, to: number): Span[] {
  const out: Span[] = [];
  const open: { name: string; start: number; innerStart: number }[] = [];
  TAG.lastIndex = from;
  for (let m = TAG.exec(text); m !== null && m.index < to; m = TAG.exec(text)) {
    const name = m[2] as string | undefined;
    if (name === undefined) continue; // a comment or a processing instruction
    const end = m.index + m[0].length;
    if (m[1] === '/') {
      const el = open.pop();
      if (el && open.length === 0) out.push({ start: el.start, end, name: el.name, inner: [el.innerStart, m.index] });
    } else if (m[3] === '/') {
      if (open.length === 0) out.push({ start: m.index, end, name, inner: [end, end] });
    } else open.push({ name, start: m.index, innerStart: end });
  }
  return out;
}

/**
 * The drawing's shell and pieces: a drawing no longer than `pieceChars` × 2 stays whole. The shell
 * holds the root's first children up to about `pieceChars` characters (the title block); the
 * root's other children follow in pieces, but a group longer than `pieceChars` goes in empty and
 * its children follow in pieces of their own.
 */
export function drawingPieces(svg: string, pieceChars: number): Pieces {
  if (svg.length <= 2 * pieceChars) return { shell: svg, pieces: [] };
  const root = childrenIn(svg, 0, svg.length).find((s) => s.name === 'svg');
  if (!root) return { shell: svg, pieces: [] };
  const children = childrenIn(svg, root.inner[0], root.inner[1]);
  const pieces: Piece[] = [];
  let head = root.inner[0];
  for (const c of children) {
    if (c.end - root.inner[0] > pieceChars || (c.name === 'g' && c.end - c.start > pieceChars)) break;
    head = c.end;
  }
  let piece = head;
  children.forEach((child, index) => {
    if (child.start < head) return;
    if (child.name === 'g' && child.end - child.start > pieceChars) {
      // In empty, with what comes before it; then its children, each with the text before it.
      pieces.push({ group: -1, text: svg.slice(piece, child.inner[0]) + svg.slice(child.inner[1], child.end) });
      piece = child.end;
      let from = child.inner[0];
      for (const c of childrenIn(svg, child.inner[0], child.inner[1]))
        if (c.end - from >= pieceChars) {
          pieces.push({ group: index, text: svg.slice(from, c.end) });
          from = c.end;
        }
      // The last piece takes what follows the last child, up to the group's end tag.
      if (child.inner[1] > from) pieces.push({ group: index, text: svg.slice(from, child.inner[1]) });
    } else if (child.end - piece >= pieceChars) {
      pieces.push({ group: -1, text: svg.slice(piece, child.end) });
      piece = child.end;
    }
  });
  if (root.inner[1] > piece) pieces.push({ group: -1, text: svg.slice(piece, root.inner[1]) });
  return { shell: svg.slice(0, head) + svg.slice(root.inner[1]), pieces };
}
