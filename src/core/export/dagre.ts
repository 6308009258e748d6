/**
 * Typed access to @dagrejs/dagre, the layered graph layout (Sugiyama, Tagawa & Toda 1981;
 * Gansner et al. 1993) used by the state diagram, the schematic and the designer's diagram.
 *
 * The package ships declaration files, but they import their siblings without file extensions,
 * which NodeNext module resolution cannot follow, so every type in them arrives as `any`. This
 * module declares the part of the API we use, once, and is the only place that imports dagre.
 * Field names are dagre's own (its graph, node and edge labels).
 */
import dagre from '@dagrejs/dagre';

/** A point of an edge's route. */
export interface LayoutPoint {
  readonly x: number;
  readonly y: number;
}

/** Options of the whole layout (dagre's graph label). */
export interface GraphOptions {
  readonly rankdir?: 'TB' | 'BT' | 'LR' | 'RL';
  readonly nodesep?: number;
  readonly edgesep?: number;
  readonly ranksep?: number;
  readonly marginx?: number;
  readonly marginy?: number;
  readonly ranker?: 'network-simplex' | 'tight-tree' | 'longest-path';
}

/** A node as given to the layout: its size; a cluster may carry a caption and top padding. */
export interface NodeSpec {
  readonly width?: number;
  readonly height?: number;
  readonly label?: string;
  readonly paddingTop?: number;
}

/** An edge as given to the layout: its label's size and place, and how hard it pulls. */
export interface EdgeSpec {
  readonly width?: number;
  readonly height?: number;
  readonly labelpos?: 'l' | 'c' | 'r';
  readonly weight?: number;
  readonly minlen?: number;
}

/** A graph to lay out (a graphlib graph). */
export interface LayoutGraph {
  setGraph(options: GraphOptions): this;
  setDefaultEdgeLabel(make: () => EdgeSpec): this;
  setNode(name: string, spec: NodeSpec): this;
  hasNode(name: string): boolean;
  /** Put `child` inside the cluster `parent` (compound graphs only). */
  setParent(child: string, parent: string): this;
  setEdge(from: string, to: string, spec: EdgeSpec, name?: string): this;
}

/** A node after layout: centre and size (a cluster's size is set by the layout), and its caption. */
export interface LaidNode {
  readonly x: number;
  readonly y: number;
  readonly width: number;
  readonly height: number;
  readonly label?: string;
}

/**
 * An edge after layout: its route, and for an edge given a label width and height, the label's
 * centre and size (read x and y only for such edges: dagre leaves them unset on the others).
 */
export interface LaidEdge {
  readonly points: readonly LayoutPoint[];
  readonly x: number;
  readonly y: number;
  readonly width: number;
  readonly height: number;
}

/** The same graph, read after layout. */
export interface LaidGraph {
  /** The size of the whole drawing, margins included. */
  graph(): { readonly width: number; readonly height: number };
  node(name: string): LaidNode;
  edge(from: string, to: string, name?: string): LaidEdge;
}

interface Dagre {
  readonly graphlib: {
    readonly Graph: new (options: { compound?: boolean; multigraph?: boolean }) => LayoutGraph;
  };
  layout(graph: LayoutGraph): void;
}

/** The package's default export, seen through the declarations above. */
const lib = dagre as unknown as Dagre;

/** A new, empty graph; `multigraph` allows named parallel edges, `compound` clusters. */
export function layoutGraph(options: { compound?: boolean; multigraph?: boolean } = {}): LayoutGraph {
  return new lib.graphlib.Graph(options);
}

/**
 * Lay the graph out (dagre mutates its labels in place) and return it read as laid out: every
 * node then has its centre, every edge its route, the graph its size.
 */
export function layOut(graph: LayoutGraph): LaidGraph {
  lib.layout(graph);
  return graph as unknown as LaidGraph;
}
