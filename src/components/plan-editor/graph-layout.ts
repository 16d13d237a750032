/**
 * Where each operation sits in the sequence graph: a layered left-to-right layout by dagre, folded into rows of
 * at most four columns (fewer on a narrow screen, `columnsFor`) like lines of text. Pure, no DOM; unit-tested in
 * tests/unit/plan-editor-graph-layout.test.ts. Laid out afresh whenever operations or links change, so a new
 * operation never lands on an old one and every link runs forward in reading order: to the right in its row, or
 * on to a later row. Why fold: the seven-operation chain in one row was fitted at about 65 % zoom, its labels
 * read at 10 px; in two rows it fits at full size. Positions are the top-left corners React Flow expects; they
 * are not part of the scenario.
 */
import dagre from "@dagrejs/dagre";

export interface GraphLink {
  from: string;
  to: string;
}

export interface GraphPosition {
  x: number;
  y: number;
  /** The row (0 = top) this operation's column was folded into. */
  row: number;
}

export const NODE_WIDTH = 170;
export const NODE_HEIGHT = 80;
/** Most columns in one row; more are spread evenly over as few rows as hold them (7 → 4 + 3, 9 → 3 + 3 + 3). */
export const MAX_COLUMNS_PER_ROW = 4;
/** Space between rows: room for a wrapping link's bend and its lag label. */
export const ROW_GAP = 64;
/** Horizontal space between columns (dagre's ranksep below). */
const COLUMN_GAP = 48;

/**
 * How many columns a row of a graph drawn `width` px wide takes at full size: four on a desktop, fewer on a
 * tablet, never below two (on a phone one column a row would make the graph so tall it is drawn tiny).
 */
export function columnsFor(width: number): number {
  return Math.max(2, Math.min(MAX_COLUMNS_PER_ROW, Math.floor((width - 24) / (NODE_WIDTH + COLUMN_GAP))));
}

export function layoutGraph(
  ids: readonly string[],
  links: readonly GraphLink[],
  size = { width: NODE_WIDTH, height: NODE_HEIGHT },
  maxPerRow = MAX_COLUMNS_PER_ROW,
): Record<string, GraphPosition> {
  const g = new dagre.graphlib.Graph({ multigraph: false });
  // ranksep leaves room for a short lag label ("200 ft"); nodesep keeps parallel crews apart.
  g.setGraph({ rankdir: "LR", nodesep: 36, ranksep: COLUMN_GAP, marginx: 10, marginy: 10 });
  g.setDefaultEdgeLabel(() => ({}));
  const known = new Set(ids);
  for (const id of ids) g.setNode(id, { width: size.width, height: size.height });
  for (const l of links) if (known.has(l.from) && known.has(l.to) && l.from !== l.to) g.setEdge(l.from, l.to);
  dagre.layout(g);
  const flat = new Map<string, { x: number; y: number }>();
  for (const id of ids) {
    const nd = g.node(id);
    flat.set(id, { x: Math.round(nd.x - size.width / 2), y: Math.round(nd.y - size.height / 2) });
  }
  return foldIntoRows(ids, flat, size.height, maxPerRow);
}

/**
 * Cuts dagre's columns (its ranks: one x per rank, as every box is equally wide) into rows of equal length; each
 * row starts at the left edge and sits one graph-height plus ROW_GAP below the one before.
 */
function foldIntoRows(ids: readonly string[], flat: Map<string, { x: number; y: number }>, height: number, maxPerRow: number): Record<string, GraphPosition> {
  const columns = [...new Set([...flat.values()].map((p) => p.x))].sort((a, b) => a - b);
  const rowCount = Math.max(1, Math.ceil(columns.length / maxPerRow));
  const perRow = Math.max(1, Math.ceil(columns.length / rowCount));
  const ys = [...flat.values()].map((p) => p.y);
  const top = ys.length ? Math.min(...ys) : 0;
  const rowHeight = (ys.length ? Math.max(...ys) - top : 0) + height + ROW_GAP;
  const out: Record<string, GraphPosition> = {};
  for (const id of ids) {
    const p = flat.get(id)!;
    const column = columns.indexOf(p.x);
    const row = Math.floor(column / perRow);
    out[id] = { x: p.x - columns[row * perRow] + columns[0], y: p.y + row * rowHeight, row };
  }
  return out;
}
