/**
 * Where each operation sits in the sequence graph: a layered left-to-right layout by dagre (pure, no DOM;
 * unit-tested in tests/unit/plan-editor-graph-layout.test.ts). Laid out afresh whenever operations or links
 * change, so a new operation never lands on an old one and every link runs forward between its two boxes.
 * Positions are the top-left corners React Flow expects; they are not part of the scenario.
 */
import dagre from "@dagrejs/dagre";

export interface GraphLink {
  from: string;
  to: string;
}

export const NODE_WIDTH = 170;
export const NODE_HEIGHT = 80;

export function layoutGraph(ids: readonly string[], links: readonly GraphLink[], size = { width: NODE_WIDTH, height: NODE_HEIGHT }): Record<string, { x: number; y: number }> {
  const g = new dagre.graphlib.Graph({ multigraph: false });
  // ranksep leaves room for a short lag label ("200 ft"); nodesep keeps parallel crews apart. Kept tight so the
  // seven-operation chain is fitted at about 65 % zoom on a 1,400 px screen, where its 15 px labels read at 10 px.
  g.setGraph({ rankdir: "LR", nodesep: 36, ranksep: 48, marginx: 10, marginy: 10 });
  g.setDefaultEdgeLabel(() => ({}));
  const known = new Set(ids);
  for (const id of ids) g.setNode(id, { width: size.width, height: size.height });
  for (const l of links) if (known.has(l.from) && known.has(l.to) && l.from !== l.to) g.setEdge(l.from, l.to);
  dagre.layout(g);
  const out: Record<string, { x: number; y: number }> = {};
  for (const id of ids) {
    const nd = g.node(id);
    out[id] = { x: Math.round(nd.x - size.width / 2), y: Math.round(nd.y - size.height / 2) };
  }
  return out;
}
