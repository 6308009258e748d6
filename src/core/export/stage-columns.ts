/**
 * Stage columns: the schematic's layout for machines past the layered layout's size bound
 * (schematic-svg.ts). Every box goes into the column of its stage (stages.ts: levers, input
 * inverters and reset driver, φ1 terms, master latches, φ2 transfers, slave latches, outputs,
 * flags and actuators); the master latch, transfer gates and slave latch of one state bit form
 * one band across their three columns, bands stacked in bit order, so a reader finds bit j in the
 * j-th band — the bands are pinned, and everything below is arranged round them. First placement:
 * the other boxes of a column are ordered by the barycentre of the boxes they are already linked
 * to (the barycentre heuristic of K. Sugiyama, S. Tagawa & M. Toda, "Methods for visual
 * understanding of hierarchical system structures", IEEE Trans. SMC 11(2), 1981, one pass
 * outward from the bands) and each is put at that height or, when taken, just below the box
 * above it. Then the crossings are reduced (column-order.ts: sweeps down and up by barycentre
 * and median, the adjacent exchange, the best placement seen kept), moving only boxes outside
 * the bands.
 *
 * Cost: near-linear, O(s · (n + e) log (n + e)) for s ≤ MAX_SWEEPS sweeps, where the layered
 * layout's ranking and crossing reduction grow much faster (schematic-svg.ts gives the figures).
 * The price: no routing round boxes — a cord is a smooth line drawn behind the boxes, turning at
 * the column edges: from its driver's right side to its target's left side, or, against the
 * flow, from the driver's left side to the target's right side (as the layered drawing draws a
 * reversed cord), or, when both share a column, through the gap beside it.
 *
 * The state diagram uses the same placement past its own size bound (diagram-svg.ts), with a
 * state's distance from the start state as its rank and no bands.
 *
 * Preconditions: ranks are small non-negative integers; links name laid-out boxes. Postconditions:
 * no two boxes overlap; every box of a lower rank lies left of every box of a higher rank.
 */
import { reduceCrossings } from './column-order.js';
import type { Point } from './svg.js';

/** A box to place: its size, stage rank, netlist position and, for a latch or transfer gate, its state bit. */
export interface ColumnBox {
  readonly id: string;
  readonly width: number;
  readonly height: number;
  readonly rank: number;
  readonly position: number;
  readonly bit?: number;
}

/**
 * A cord branch between two boxes. An end on a latch may be on its set half (side -1: a quarter of
 * the box's height above its centre) or its reset half (side 1, as far below); 0 or absent, the centre.
 */
export interface ColumnLink {
  readonly from: string;
  readonly to: string;
  readonly fromSide?: number;
  readonly toSide?: number;
}

/** A placed band: the boxes of one state bit and the rectangle round them (top-left corner). */
export interface ColumnBand {
  readonly bit: number;
  readonly x: number;
  readonly y: number;
  readonly width: number;
  readonly height: number;
}

export interface ColumnLayout {
  /** Centre of every box. */
  readonly centre: ReadonlyMap<string, Point>;
  readonly bands: readonly ColumnBand[];
  /**
   * The route of a cord branch from `from` to `to`, leaving at height `fromY` and arriving at
   * `toY` (a latch's set or reset half).
   */
  route(from: string, to: string, fromY: number, toY: number): Point[];
}

/** Space between boxes in a column, between columns, and round a band (its caption on top). */
const BOX_GAP = 14;
const COLUMN_GAP = 120;
const BAND_PAD = 10;
const BAND_TOP = 24;
const BAND_GAP = 18;
/** Horizontal run of a cord where it leaves or enters a box, so its arrow points along the flow. */
const LEAD = 16;

interface Columns {
  readonly ranks: readonly number[];
  readonly members: ReadonlyMap<number, ColumnBox[]>;
  readonly left: ReadonlyMap<number, number>;
  readonly width: ReadonlyMap<number, number>;
}

/** Columns of boxes by rank, left to right; a column holding band boxes leaves room for the band's edge. */
function columnsOf(boxes: readonly ColumnBox[]): Columns {
  const members = new Map<number, ColumnBox[]>();
  for (const b of boxes) {
    const m = members.get(b.rank);
    if (m) m.push(b);
    else members.set(b.rank, [b]);
  }
  const ranks = [...members.keys()].sort((a, b) => a - b);
  const left = new Map<number, number>();
  const width = new Map<number, number>();
  let x = 0;
  for (const r of ranks) {
    const m = members.get(r) ?? [];
    const pad = m.some((b) => b.bit !== undefined) ? BAND_PAD : 0;
    const w = Math.max(...m.map((b) => b.width)) + 2 * pad;
    left.set(r, x);
    width.set(r, w);
    x += w + COLUMN_GAP;
  }
  return { ranks, members, left, width };
}

/** Stack the bands in bit order; returns the bands and the height below them. */
function placeBands(cols: Columns, centre: Map<string, Point>): { bands: ColumnBand[]; bottom: number } {
  const byBit = new Map<number, ColumnBox[]>();
  for (const r of cols.ranks)
    for (const b of cols.members.get(r) ?? [])
      if (b.bit !== undefined) byBit.set(b.bit, [...(byBit.get(b.bit) ?? []), b]);
  const bands: ColumnBand[] = [];
  let y = 0;
  for (const bit of [...byBit.keys()].sort((a, b) => a - b)) {
    const parts = byBit.get(bit) ?? [];
    const ranks = [...new Set(parts.map((b) => b.rank))];
    const stackH = (r: number): number =>
      parts.filter((b) => b.rank === r).reduce((h, b) => h + b.height + BOX_GAP, -BOX_GAP);
    const inner = Math.max(...ranks.map(stackH));
    for (const r of ranks) {
      const cx = (cols.left.get(r) ?? 0) + (cols.width.get(r) ?? 0) / 2;
      let top = y + BAND_TOP + (inner - stackH(r)) / 2;
      for (const b of parts.filter((p) => p.rank === r)) {
        centre.set(b.id, { x: cx, y: top + b.height / 2 });
        top += b.height + BOX_GAP;
      }
    }
    const x0 = Math.min(...ranks.map((r) => cols.left.get(r) ?? 0));
    const x1 = Math.max(...ranks.map((r) => (cols.left.get(r) ?? 0) + (cols.width.get(r) ?? 0)));
    const height = BAND_TOP + inner + BAND_PAD;
    bands.push({ bit, x: x0, y, width: x1 - x0, height });
    y += height + BAND_GAP;
  }
  return { bands, bottom: y };
}

/**
 * Place one column's boxes not yet placed: by the barycentre of their placed neighbours (the
 * others after them, in netlist order), each at its barycentre or just below the box above.
 */
function placeColumn(
  cols: Columns,
  rank: number,
  top: number,
  centre: Map<string, Point>,
  neighbours: ReadonlyMap<string, readonly string[]>,
): void {
  const cx = (cols.left.get(rank) ?? 0) + (cols.width.get(rank) ?? 0) / 2;
  const want = (b: ColumnBox): number => {
    const ys = (neighbours.get(b.id) ?? []).flatMap((n) => {
      const c = centre.get(n);
      return c ? [c.y] : [];
    });
    return ys.length > 0 ? ys.reduce((s, y) => s + y, 0) / ys.length : Infinity;
  };
  const free = (cols.members.get(rank) ?? [])
    .filter((b) => !centre.has(b.id))
    .map((b) => ({ b, at: want(b) }))
    .sort((p, q) => (p.at === q.at ? p.b.position - q.b.position : p.at < q.at ? -1 : 1));
  let cursor = top;
  for (const { b, at } of free) {
    const y = Number.isFinite(at) ? Math.max(at - b.height / 2, cursor) : cursor;
    centre.set(b.id, { x: cx, y: y + b.height / 2 });
    cursor = y + b.height + BOX_GAP;
  }
}

/** Reduce the crossings of the first placement (column-order.ts), moving only boxes outside the bands. */
function reorder(
  cols: Columns,
  boxes: readonly ColumnBox[],
  links: readonly ColumnLink[],
  centre: Map<string, Point>,
  bandTop: number,
): void {
  const index = new Map(boxes.map((b, i) => [b.id, i]));
  const columnOf = new Map(cols.ranks.map((r, c) => [r, c]));
  const bandRanks = new Set(boxes.filter((b) => b.bit !== undefined).map((b) => b.rank));
  const cords = links.flatMap((l) => {
    const from = index.get(l.from);
    const to = index.get(l.to);
    if (from === undefined || to === undefined || from === to) return [];
    const fromDy = ((l.fromSide ?? 0) * boxes[from].height) / 4;
    return [{ from, to, fromDy, toDy: ((l.toSide ?? 0) * boxes[to].height) / 4 }];
  });
  const { y } = reduceCrossings(
    {
      left: cols.ranks.map((r) => cols.left.get(r) ?? 0),
      right: cols.ranks.map((r) => (cols.left.get(r) ?? 0) + (cols.width.get(r) ?? 0)),
      column: boxes.map((b) => columnOf.get(b.rank) ?? 0),
      cords,
      lead: LEAD,
      height: boxes.map((b) => b.height),
      pinned: boxes.map((b) => b.bit !== undefined),
      top: cols.ranks.map((r) => (bandRanks.has(r) ? bandTop : 0)),
      gap: BOX_GAP,
    },
    boxes.map((b) => centre.get(b.id)?.y ?? 0),
  );
  boxes.forEach((b, i) => {
    const c = centre.get(b.id);
    if (c && b.bit === undefined) centre.set(b.id, { x: c.x, y: y[i] });
  });
}

/** How the stage columns are laid out. */
export interface StageColumnOptions {
  /** Reduce the crossings after the first placement (column-order.ts); on unless told otherwise. */
  readonly reduceCrossings?: boolean;
}

/** Lay the boxes out in stage columns (see the module comment); `links` are the cord branches. */
export function stageColumns(
  boxes: readonly ColumnBox[],
  links: readonly ColumnLink[],
  options: StageColumnOptions = {},
): ColumnLayout {
  const cols = columnsOf(boxes);
  const centre = new Map<string, Point>();
  const { bands, bottom } = placeBands(cols, centre);
  const neighbours = new Map<string, string[]>();
  const link = (a: string, b: string): void => {
    const n = neighbours.get(a);
    if (n) n.push(b);
    else neighbours.set(a, [b]);
  };
  for (const l of links) {
    link(l.from, l.to);
    link(l.to, l.from);
  }
  // Outward from the bands: their own columns (below them), then leftwards, then rightwards.
  const bandRanks = new Set(boxes.filter((b) => b.bit !== undefined).map((b) => b.rank));
  const first = bandRanks.size > 0 ? Math.min(...bandRanks) : (cols.ranks[0] ?? 0);
  const order = [
    ...cols.ranks.filter((r) => bandRanks.has(r)),
    ...cols.ranks.filter((r) => r < first && !bandRanks.has(r)).reverse(),
    ...cols.ranks.filter((r) => r >= first && !bandRanks.has(r)),
  ];
  for (const r of order) placeColumn(cols, r, bandRanks.has(r) ? bottom : 0, centre, neighbours);
  if (options.reduceCrossings !== false) reorder(cols, boxes, links, centre, bottom);

  const box = new Map(boxes.map((b) => [b.id, b]));
  const sideX = (id: string, right: boolean): number => {
    const b = box.get(id);
    const c = centre.get(id);
    return (c?.x ?? 0) + ((right ? 1 : -1) * (b?.width ?? 0)) / 2;
  };
  // A column's edge on either side: cords turn there (plus a lead), so the lines between two columns start level.
  const edgeX = (id: string, right: boolean): number => {
    const r = box.get(id)?.rank ?? 0;
    return (cols.left.get(r) ?? 0) + (right ? (cols.width.get(r) ?? 0) + LEAD : -LEAD);
  };
  return {
    centre,
    bands,
    route(from, to, fromY, toY) {
      if (box.get(from)?.rank === box.get(to)?.rank) {
        const a = sideX(from, true);
        const lane = edgeX(from, true);
        const b = sideX(to, true);
        return [
          { x: a, y: fromY },
          { x: lane, y: fromY },
          { x: lane, y: toY },
          { x: b, y: toY },
        ];
      }
      // A cord against the flow leaves its driver's left side and comes into its target's right side,
      // so it runs only between the two columns, as in the layered drawing.
      const forward = (box.get(from)?.rank ?? 0) < (box.get(to)?.rank ?? 0);
      return [
        { x: sideX(from, forward), y: fromY },
        { x: edgeX(from, forward), y: fromY },
        { x: edgeX(to, !forward), y: toY },
        { x: sideX(to, !forward), y: toY },
      ];
    },
  };
}
