/**
 * A small document model shared by the printed documents: the build sheet (HTML and Markdown)
 * and the commissioning sheet (HTML). Content is assembled once as plain text in sections and
 * blocks; each renderer escapes it for its own format, so no builder of content ever writes
 * markup (and so never forgets to escape a user's name).
 */

/** A table: header cells, body rows of plain text. */
export interface TableBlock {
  readonly kind: 'table';
  readonly headers: readonly string[];
  readonly rows: readonly (readonly string[])[];
  /** Columns shown in a fixed-width font (expressions, codes, ids). */
  readonly mono?: readonly number[];
  /** Add an empty tick-box column at the left (for ticking off at the bench). */
  readonly tick?: boolean;
  readonly caption?: string;
}

export type Block =
  | { readonly kind: 'p'; readonly text: string }
  | { readonly kind: 'list'; readonly items: readonly string[]; readonly ordered?: boolean }
  | { readonly kind: 'pre'; readonly lines: readonly string[] }
  /** A boxed note: a safety caution, a failed check, or a passed one. */
  | {
      readonly kind: 'note';
      readonly tone: 'caution' | 'fail' | 'ok';
      readonly title: string;
      readonly items: readonly string[];
    }
  | TableBlock
  /** A drawing of the build, from its own file in the build folder. */
  | FigureBlock;

/** A drawing: the SVG text, the file it is also written to, and what it shows. */
export interface FigureBlock {
  readonly kind: 'figure';
  readonly svg: string;
  /** File name in the build folder (the Markdown sheet links to it). */
  readonly file: string;
  readonly caption: string;
}

export interface Section {
  /** Anchor id (letters, digits and '-'). */
  readonly id: string;
  readonly title: string;
  readonly blocks: readonly Block[];
}

export interface Doc {
  readonly title: string;
  /** One line under the title. */
  readonly subtitle?: string;
  readonly sections: readonly Section[];
  /** Print the pages in landscape (wide tables). */
  readonly landscape?: boolean;
}

/** A paragraph block. */
export const p = (text: string): Block => ({ kind: 'p', text });

/** A table block. */
export function table(
  headers: readonly string[],
  rows: readonly (readonly string[])[],
  opts: Omit<TableBlock, 'kind' | 'headers' | 'rows'> = {},
): TableBlock {
  return { kind: 'table', headers, rows, ...opts };
}
