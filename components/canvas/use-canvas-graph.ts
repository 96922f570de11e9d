"use client";

import { applyEdgeChanges, applyNodeChanges, type EdgeChange, type NodeChange } from "@xyflow/react";
import { useCallback, useRef, useState } from "react";
import type { RuleGraph } from "@/lib/rules/graph";
import { fromFlow, toFlow, type FlowEdge, type FlowNode } from "./flow";

const HISTORY_LIMIT = 100;
/** Edits of one field (typing) or one nudge within this time are one undo step. */
const COALESCE_MS = 1500;

/**
 * The Canvas graph with undo/redo. Refs hold the latest nodes and edges so event
 * handlers never act on a stale copy; every change that means something (not
 * selection, not a drag in progress) goes through `commit`, which records the
 * previous graph for undo and tells the autosave.
 */
export function useCanvasGraph(initial: RuleGraph, onChange: (graph: RuleGraph) => void) {
  const [start] = useState(() => toFlow(initial));
  const [nodes, setNodesState] = useState<FlowNode[]>(start.nodes);
  const [edges, setEdgesState] = useState<FlowEdge[]>(start.edges);
  const nodesRef = useRef(nodes);
  const edgesRef = useRef(edges);
  const history = useRef({ undo: [] as RuleGraph[], redo: [] as RuleGraph[], last: initial, key: "", at: 0 });
  const [meta, setMeta] = useState({ version: 0, undo: 0, redo: 0 });
  const bump = useCallback(() => setMeta((m) => ({ version: m.version + 1, undo: history.current.undo.length, redo: history.current.redo.length })), []);

  const set = useCallback((n: FlowNode[], e: FlowEdge[]) => {
    nodesRef.current = n;
    edgesRef.current = e;
    setNodesState(n);
    setEdgesState(e);
  }, []);

  const commit = useCallback(
    (n: FlowNode[], e: FlowEdge[], opts: { coalesce?: string } = {}) => {
      set(n, e);
      const graph = fromFlow(n, e);
      const h = history.current;
      const now = Date.now();
      const merge = opts.coalesce && opts.coalesce === h.key && now - h.at < COALESCE_MS;
      if (!merge) {
        h.undo.push(h.last);
        if (h.undo.length > HISTORY_LIMIT) h.undo.shift();
      }
      h.redo = [];
      h.last = graph;
      h.key = opts.coalesce ?? "";
      h.at = now;
      bump();
      onChange(graph);
    },
    [bump, onChange, set],
  );

  const restore = useCallback(
    (graph: RuleGraph) => {
      const selected = new Set(nodesRef.current.filter((n) => n.selected).map((n) => n.id));
      const flow = toFlow(graph, selected);
      set(flow.nodes, flow.edges);
      bump();
      onChange(graph);
    },
    [bump, onChange, set],
  );

  const undo = useCallback(() => {
    const h = history.current;
    const previous = h.undo.pop();
    if (!previous) return;
    h.redo.push(h.last);
    h.last = previous;
    h.key = "";
    restore(previous);
  }, [restore]);

  const redo = useCallback(() => {
    const h = history.current;
    const next = h.redo.pop();
    if (!next) return;
    h.undo.push(h.last);
    h.last = next;
    h.key = "";
    restore(next);
  }, [restore]);

  /** A graph from elsewhere (reload after a conflict): history starts again. */
  const replace = useCallback(
    (graph: RuleGraph, selectedIds: ReadonlySet<string> = new Set()) => {
      const flow = toFlow(graph, selectedIds);
      set(flow.nodes, flow.edges);
      history.current = { undo: [], redo: [], last: graph, key: "", at: 0 };
      bump();
    },
    [bump, set],
  );

  const onNodesChange = useCallback(
    (changes: NodeChange<FlowNode>[]) => {
      const next = applyNodeChanges(changes, nodesRef.current);
      // A drag ends, or a keyboard nudge lands, with dragging false: that is a real move.
      const moved = changes.filter((c) => c.type === "position" && c.position && !c.dragging);
      if (moved.length) commit(next, edgesRef.current, { coalesce: `move:${moved.map((c) => (c as { id: string }).id).join(",")}` });
      else set(next, edgesRef.current);
    },
    [commit, set],
  );

  const onEdgesChange = useCallback(
    (changes: EdgeChange<FlowEdge>[]) => {
      set(nodesRef.current, applyEdgeChanges(changes, edgesRef.current));
    },
    [set],
  );

  const current = useCallback(() => history.current.last, []);
  const setSelection = useCallback(
    (ids: ReadonlySet<string>) =>
      set(
        nodesRef.current.map((n) => (!!n.selected === ids.has(n.id) ? n : { ...n, selected: ids.has(n.id) })),
        edgesRef.current.map((e) => (e.selected ? { ...e, selected: false } : e)),
      ),
    [set],
  );

  return {
    nodes,
    edges,
    nodesRef,
    edgesRef,
    commit,
    undo,
    redo,
    replace,
    setSelection,
    onNodesChange,
    onEdgesChange,
    canUndo: meta.undo > 0,
    canRedo: meta.redo > 0,
    /** The graph as last committed (what autosave sends). */
    current,
    /** Bumps on every commit, undo, redo and replace: for things computed from the committed graph. */
    version: meta.version,
  };
}
