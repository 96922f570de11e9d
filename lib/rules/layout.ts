import dagre from "@dagrejs/dagre";

/**
 * Auto-layout for the Canvas with dagre (layered, left to right): triggers in
 * the first column, gates in the middle, actions last, crossings kept low.
 * A Rule set is mostly many small separate paths; laid out as one, they make a
 * column too tall to read, so each connected group is laid out on its own and
 * the groups are packed into columns until the whole has about the shape of a
 * screen (`aspect`, width / height). Returns top-left positions, as stored.
 */
export type LayoutNode = { id: string; width: number; height: number };
export type LayoutEdge = { source: string; target: string };
type Point = { x: number; y: number };

const GAP = 48;

export function autoLayout(nodes: LayoutNode[], edges: LayoutEdge[], opts: { nodeSep?: number; rankSep?: number; aspect?: number } = {}): Map<string, Point> {
  const ids = new Set(nodes.map((n) => n.id));
  const usable = edges.filter((e) => ids.has(e.source) && ids.has(e.target) && e.source !== e.target);
  const groups = components(nodes, usable).map((group) => layoutGroup(group, usable, opts));

  const area = groups.reduce((sum, g) => sum + (g.width + GAP) * (g.height + GAP), 0);
  const columnHeight = Math.max(Math.sqrt(area / (opts.aspect ?? 1.6)), ...groups.map((g) => g.height));
  const out = new Map<string, Point>();
  let x = 0;
  let y = 0;
  let columnWidth = 0;
  for (const g of groups) {
    if (y > 0 && y + g.height > columnHeight) {
      x += columnWidth + GAP * 2;
      y = 0;
      columnWidth = 0;
    }
    for (const [id, p] of g.positions) out.set(id, { x: Math.round(p.x + x), y: Math.round(p.y + y) });
    y += g.height + GAP;
    columnWidth = Math.max(columnWidth, g.width);
  }
  return out;
}

/** Weakly connected groups, in the order their first node appears. */
function components(nodes: LayoutNode[], edges: LayoutEdge[]): LayoutNode[][] {
  const parent = new Map(nodes.map((n) => [n.id, n.id]));
  const find = (id: string): string => {
    let root = id;
    while (parent.get(root) !== root) root = parent.get(root)!;
    parent.set(id, root);
    return root;
  };
  for (const e of edges) parent.set(find(e.source), find(e.target));
  const groups = new Map<string, LayoutNode[]>();
  for (const n of nodes) {
    const root = find(n.id);
    groups.set(root, [...(groups.get(root) ?? []), n]);
  }
  return [...groups.values()];
}

function layoutGroup(nodes: LayoutNode[], edges: LayoutEdge[], opts: { nodeSep?: number; rankSep?: number }) {
  const g = new dagre.graphlib.Graph();
  g.setGraph({ rankdir: "LR", nodesep: opts.nodeSep ?? 24, ranksep: opts.rankSep ?? 72 });
  g.setDefaultEdgeLabel(() => ({}));
  const ids = new Set(nodes.map((n) => n.id));
  for (const n of nodes) g.setNode(n.id, { width: n.width, height: n.height });
  for (const e of edges) if (ids.has(e.source)) g.setEdge(e.source, e.target);
  dagre.layout(g);
  const positions = new Map<string, Point>();
  let [minX, minY, maxX, maxY] = [Infinity, Infinity, -Infinity, -Infinity];
  for (const n of nodes) {
    const c = g.node(n.id) as Point;
    // dagre gives centres; the Canvas stores top-left corners.
    const p = { x: c.x - n.width / 2, y: c.y - n.height / 2 };
    positions.set(n.id, p);
    [minX, minY, maxX, maxY] = [Math.min(minX, p.x), Math.min(minY, p.y), Math.max(maxX, p.x + n.width), Math.max(maxY, p.y + n.height)];
  }
  for (const p of positions.values()) {
    p.x -= minX;
    p.y -= minY;
  }
  return { positions, width: maxX - minX, height: maxY - minY };
}
