"use client";

import "@xyflow/react/dist/style.css";
import { Background, Controls, getNodesBounds, MarkerType, MiniMap, ReactFlow, ReactFlowProvider, useNodesInitialized, useReactFlow, type Connection, type Edge } from "@xyflow/react";
import { useQueryClient } from "@tanstack/react-query";
import { useRouter } from "next/navigation";
import { useCallback, useEffect, useMemo, useRef, useState } from "react";
import { fetchJson } from "@/components/api/fetch-json";
import { useShortDevices } from "@/components/energy/short-mark";
import type { RuleNode } from "@/lib/rules/graph";
import { autoLayout } from "@/lib/rules/layout";
import { newNode, paletteFor, type NodeKind, type NodeType, type PaletteSite } from "@/lib/rules/palette";
import { graphSentences, type RuleSentence, type SiteNames } from "@/lib/rules/sentence";
import type { Problem } from "@/lib/rules/validate";
import type { RulesDto } from "@/lib/validation/rules";
import { ActivateDialog } from "./activate-dialog";
import { CanvasContext } from "./canvas-context";
import { ConflictDialog } from "./conflict-dialog";
import { connectionProblem, copyNodes, edgeId, fromFlow, freeSpot, keepMineAsCopy, NODE_SIZE, newNodeId, placeMissing, toFlow, toFlowNode, type FlowEdge, type FlowNode } from "./flow";
import { HelpDialog } from "./help-dialog";
import { describeNode, Inspector } from "./inspector";
import { nodeTypes } from "./nodes/node-types";
import { DRAG_TYPE, PalettePanel } from "./palette-panel";
import { ProblemsList, SentenceList } from "./rule-lists";
import { ShortNotice } from "./short-notice";
import { useAutosave, type SaveStatus } from "./use-autosave";
import { useCanvasGraph } from "./use-canvas-graph";
import { useCanvasKeys } from "./use-canvas-keys";
import { useIsNarrow } from "./use-is-narrow";
import { VersionsPanel } from "./versions-panel";

type Props = { siteId: string; site: PaletteSite; names: SiteNames; canActivate: boolean; initial: RulesDto };
type Tab = "node" | "paths" | "problems" | "versions";

/** Below this zoom node text is too small to read on a laptop screen. */
const LEGIBLE_ZOOM = 0.7;

const STATUS_WORDS: Record<SaveStatus, string> = {
  saved: "All changes saved",
  unsaved: "Unsaved changes…",
  saving: "Saving…",
  conflict: "Not saved: someone else changed the draft",
  rejected: "Not saved",
  offline: "Not saved: no connection",
};

export function CanvasEditor(props: Props) {
  return (
    <ReactFlowProvider>
      <Editor {...props} />
    </ReactFlowProvider>
  );
}

function Editor({ siteId, site, names, canActivate, initial }: Props) {
  const rf = useReactFlow<FlowNode, FlowEdge>();
  const router = useRouter();
  const isNarrow = useIsNarrow();
  const isReadOnly = isNarrow;
  const wrapper = useRef<HTMLDivElement>(null);
  const [problems, setProblems] = useState<Problem[]>(initial.problems);
  const [active, setActive] = useState(initial.active);
  // Until someone picks a tab: the node form on a wide screen, the sentences on a narrow one.
  const [chosenTab, setTab] = useState<Tab | null>(null);
  const tab = chosenTab ?? (isNarrow ? "paths" : "node");
  const [showMinimap, setShowMinimap] = useState(true);
  const [helpOpen, setHelpOpen] = useState(false);
  const [activateOpen, setActivateOpen] = useState(false);
  const [notice, setNotice] = useState<string | null>(null);
  const [resolving, setResolving] = useState(false);
  const clipboard = useRef<{ graph: ReturnType<typeof fromFlow>; pastes: number } | null>(null);

  const changedRef = useRef<() => void>(() => undefined);
  const onChange = useCallback(() => changedRef.current(), []);
  const [startGraph] = useState(() => placeMissing(initial.draft.graph));
  const g = useCanvasGraph(startGraph, onChange);
  // Which devices the saved draft leaves short of energy: asked again after every save (the problems arrive with it).
  const client = useQueryClient();
  const short = useShortDevices(siteId, "draft");
  const onSaved = useCallback(
    (p: Problem[]) => {
      setProblems(p);
      void client.invalidateQueries({ queryKey: ["sites", siteId, "energy"] });
    },
    [client, siteId],
  );
  const autosave = useAutosave({ siteId, initialRevision: initial.draft.revision, getGraph: g.current, onProblems: onSaved });
  useEffect(() => {
    changedRef.current = autosave.changed;
  }, [autosave.changed]);

  // The first view: the whole graph if it reads at that size, else its top-left corner at a legible zoom (the minimap and F show the rest).
  const initialized = useNodesInitialized();
  const [isViewReady, setViewReady] = useState(false);
  useEffect(() => {
    if (isViewReady || (!initialized && g.nodesRef.current.length > 0)) return;
    if (g.nodesRef.current.length === 0) {
      void Promise.resolve().then(() => setViewReady(true));
      return;
    }
    const box = wrapper.current?.getBoundingClientRect();
    const bounds = getNodesBounds(g.nodesRef.current);
    const fit = box && bounds.width ? Math.min(box.width / (bounds.width * 1.1), box.height / (bounds.height * 1.1)) : 1;
    const done = fit >= LEGIBLE_ZOOM ? rf.fitView({ padding: 0.1, maxZoom: 1 }) : rf.setViewport({ x: 24 - bounds.x * LEGIBLE_ZOOM, y: 24 - bounds.y * LEGIBLE_ZOOM, zoom: LEGIBLE_ZOOM });
    void Promise.resolve(done).then(() => setViewReady(true));
  }, [initialized, isViewReady, g.nodesRef, rf]);

  const graphVersion = g.version;
  const graph = useMemo(() => g.current(), [g, graphVersion]); // eslint-disable-line react-hooks/exhaustive-deps
  const sentences = useMemo(() => graphSentences(graph, names), [graph, names]);
  const problemsByNode = useMemo(() => {
    const map = new Map<string, Problem[]>();
    for (const p of problems) if (p.nodeId) map.set(p.nodeId, [...(map.get(p.nodeId) ?? []), p]);
    return map;
  }, [problems]);
  const shortByDevice = short.byDevice;
  const context = useMemo(() => ({ siteId, names, site, problemsByNode, shortByDevice, isReadOnly }), [siteId, names, site, problemsByNode, shortByDevice, isReadOnly]);
  const palette = useMemo(() => paletteFor(site), [site]);
  const byId = useMemo(() => new Map(graph.nodes.map((n) => [n.id, n])), [graph]);
  const describe = useCallback((id: string) => (byId.get(id) ? describeNode(byId.get(id)!, names) : "a node no longer on the Canvas"), [byId, names]);

  const selectedNodes = g.nodes.filter((n) => n.selected);
  const selected = selectedNodes.length === 1 ? byId.get(selectedNodes[0].id) : undefined;

  const say = (text: string) => setNotice(text);

  const addNode = useCallback(
    (kind: NodeKind, type: NodeType, at?: { x: number; y: number }) => {
      const taken = new Set(g.nodesRef.current.map((n) => n.id));
      const id = newNodeId(kind, type, taken);
      let position = at;
      if (!position) {
        const box = wrapper.current?.getBoundingClientRect();
        const centre = rf.screenToFlowPosition({ x: (box?.left ?? 0) + (box?.width ?? 0) / 2, y: (box?.top ?? 0) + (box?.height ?? 0) / 2 });
        position = freeSpot(g.nodesRef.current, { x: centre.x - NODE_SIZE[kind].width / 2, y: centre.y - NODE_SIZE[kind].height / 2 }, NODE_SIZE[kind]);
      }
      const node = newNode(site, kind, type, id, position);
      if (!node) return say("This site has nothing this node could use.");
      g.commit([...g.nodesRef.current.map((n) => (n.selected ? { ...n, selected: false } : n)), toFlowNode(node, 0, true)], g.edgesRef.current);
      setTab("node");
      say(`Added ${describeNode(node, names)}.`);
    },
    [g, names, rf, site],
  );

  const connect = useCallback(
    (source: string, target: string) => {
      const problem = connectionProblem(fromFlow(g.nodesRef.current, g.edgesRef.current), source, target);
      if (problem) return say(problem);
      g.commit(g.nodesRef.current, [...g.edgesRef.current, { id: edgeId(source, target), source, target }]);
    },
    [g],
  );

  const disconnect = useCallback((id: string) => g.commit(g.nodesRef.current, g.edgesRef.current.filter((e) => e.id !== id)), [g]);

  const deleteSelected = useCallback(() => {
    const gone = new Set(g.nodesRef.current.filter((n) => n.selected).map((n) => n.id));
    const edges = g.edgesRef.current.filter((e) => !e.selected && !gone.has(e.source) && !gone.has(e.target));
    if (gone.size === 0 && edges.length === g.edgesRef.current.length) return;
    g.commit(
      g.nodesRef.current.filter((n) => !gone.has(n.id)),
      edges,
    );
    say(`Deleted ${gone.size} node${gone.size === 1 ? "" : "s"} and ${g.edgesRef.current.length - edges.length} connection${g.edgesRef.current.length - edges.length === 1 ? "" : "s"}. Ctrl+Z brings them back.`);
  }, [g]);

  const copy = useCallback(() => {
    const ids = new Set(g.nodesRef.current.filter((n) => n.selected).map((n) => n.id));
    if (!ids.size) return;
    const all = fromFlow(g.nodesRef.current, g.edgesRef.current);
    clipboard.current = { graph: { nodes: all.nodes.filter((n) => ids.has(n.id)), edges: all.edges.filter((e) => ids.has(e.source) && ids.has(e.target)) }, pastes: 0 };
    say(`Copied ${ids.size} node${ids.size === 1 ? "" : "s"}.`);
  }, [g]);

  const paste = useCallback(() => {
    const clip = clipboard.current;
    if (!clip) return;
    clip.pastes++;
    const taken = new Set(g.nodesRef.current.map((n) => n.id));
    const copied = copyNodes(clip.graph, new Set(clip.graph.nodes.map((n) => n.id)), taken, 40 * clip.pastes);
    const flow = toFlow(copied, new Set(copied.nodes.map((n) => n.id)));
    g.commit([...g.nodesRef.current.map((n) => (n.selected ? { ...n, selected: false } : n)), ...flow.nodes], [...g.edgesRef.current, ...flow.edges]);
    say(`Pasted ${copied.nodes.length} node${copied.nodes.length === 1 ? "" : "s"}.`);
  }, [g]);

  const tidy = useCallback(() => {
    const nodes = g.nodesRef.current;
    const pos = autoLayout(
      nodes.map((n) => ({ id: n.id, ...NODE_SIZE[n.data.rule.kind] })),
      g.edgesRef.current,
    );
    g.commit(
      nodes.map((n) => ({ ...n, position: pos.get(n.id) ?? n.position })),
      g.edgesRef.current,
    );
    requestAnimationFrame(() => void rf.fitView({ padding: 0.1, duration: 200 }));
  }, [g, rf]);

  const focusNodes = useCallback(
    (ids: string[], focusFirst: boolean) => {
      g.setSelection(new Set(ids));
      void rf.fitView({ nodes: ids.map((id) => ({ id })), duration: 250, maxZoom: 1.1, padding: 0.3 });
      if (focusFirst) {
        setTimeout(() => {
          const el = wrapper.current?.querySelector<HTMLElement>(`.react-flow__node[data-id="${CSS.escape(ids[0])}"]`);
          el?.focus({ preventScroll: true });
        }, 300);
      }
    },
    [g, rf],
  );

  useCanvasKeys({
    isReadOnly,
    undo: g.undo,
    redo: g.redo,
    deleteSelected,
    copy,
    paste,
    duplicate: () => {
      copy();
      paste();
    },
    selectAll: () => g.setSelection(new Set(g.nodesRef.current.map((n) => n.id))),
    clearSelection: () => g.setSelection(new Set()),
    tidy,
    fit: () => void rf.fitView({ padding: 0.1, duration: 200 }),
    zoomIn: () => void rf.zoomIn({ duration: 150 }),
    zoomOut: () => void rf.zoomOut({ duration: 150 }),
    toggleMinimap: () => setShowMinimap((v) => !v),
    help: () => setHelpOpen(true),
  });

  const reloadDraft = async () => fetchJson<RulesDto>(`/api/sites/${siteId}/rules`);
  const onReload = async () => {
    setResolving(true);
    try {
      const fresh = await reloadDraft();
      g.replace(fresh.draft.graph);
      onSaved(fresh.problems);
      setActive(fresh.active);
      autosave.resume(fresh.draft.revision, fresh.draft.graph, false);
      say(`Loaded the draft as it is now (revision ${fresh.draft.revision}).`);
    } finally {
      setResolving(false);
    }
  };
  const onKeepCopy = async () => {
    setResolving(true);
    try {
      const fresh = await reloadDraft();
      const { graph: merged, copiedIds } = keepMineAsCopy(autosave.base(), g.current(), fresh.draft.graph);
      g.replace(merged, new Set(copiedIds));
      autosave.resume(fresh.draft.revision, fresh.draft.graph, copiedIds.length > 0 || merged.edges.length !== fresh.draft.graph.edges.length);
      say(`Loaded their draft and added ${copiedIds.length} of your node${copiedIds.length === 1 ? "" : "s"} beside it, selected.`);
    } finally {
      setResolving(false);
    }
  };

  const openActivate = async () => {
    if (!(await autosave.flush())) return say("Save the draft first (see the message above).");
    setActivateOpen(true);
  };
  const tryOnBench = async () => {
    if (!(await autosave.flush())) return say("Save the draft first (see the message above).");
    router.push(`/sites/${siteId}/bench?source=draft`);
  };

  const outgoing = selected ? graph.edges.filter((e) => e.source === selected.id).map((e) => ({ edgeId: e.id, nodeId: e.target, label: describe(e.target) })) : [];
  const incoming = selected ? graph.edges.filter((e) => e.target === selected.id).map((e) => ({ edgeId: e.id, nodeId: e.source, label: describe(e.source) })) : [];
  const candidates = selected && selected.kind !== "action" ? graph.nodes.filter((n) => connectionProblem(graph, selected.id, n.id) === null).map((n) => ({ nodeId: n.id, label: describeNode(n, names) })) : [];
  const errorCount = problems.filter((p) => p.severity === "error").length;

  const flow = (
    <div
      ref={wrapper}
      role="region"
      aria-label={isReadOnly ? "Canvas (read-only on a narrow screen)" : "Canvas"}
      data-view-ready={isViewReady ? "true" : "false"}
      className={`relative overflow-hidden rounded-xl border border-line bg-fog ${isNarrow ? "h-[360px]" : "h-[calc(100vh-230px)] min-h-[460px]"}`}
      onDragOver={(e) => {
        if (!isReadOnly && e.dataTransfer.types.includes(DRAG_TYPE)) {
          e.preventDefault();
          e.dataTransfer.dropEffect = "copy";
        }
      }}
      onDrop={(e) => {
        const raw = e.dataTransfer.getData(DRAG_TYPE);
        if (!raw || isReadOnly) return;
        e.preventDefault();
        const { kind, type } = JSON.parse(raw) as { kind: NodeKind; type: NodeType };
        const p = rf.screenToFlowPosition({ x: e.clientX, y: e.clientY });
        addNode(kind, type, { x: Math.round(p.x - NODE_SIZE[kind].width / 2), y: Math.round(p.y - NODE_SIZE[kind].height / 2) });
      }}
    >
      <CanvasContext.Provider value={context}>
        <ReactFlow<FlowNode, FlowEdge>
          nodes={g.nodes}
          edges={g.edges}
          nodeTypes={nodeTypes}
          onNodesChange={g.onNodesChange}
          onEdgesChange={g.onEdgesChange}
          onConnect={(c: Connection) => connect(c.source, c.target)}
          isValidConnection={(c: Connection | Edge) => connectionProblem(fromFlow(g.nodesRef.current, g.edgesRef.current), c.source, c.target) === null}
          onNodeClick={() => setTab("node")}
          nodesDraggable={!isReadOnly}
          nodesConnectable={!isReadOnly}
          edgesFocusable={!isReadOnly}
          deleteKeyCode={null}
          selectionKeyCode="Shift"
          multiSelectionKeyCode={["Meta", "Control"]}
          onlyRenderVisibleElements={g.nodes.length > 150}
          defaultEdgeOptions={{ markerEnd: { type: MarkerType.ArrowClosed, width: 18, height: 18 }, style: { strokeWidth: 1.5 } }}
          minZoom={0.08}
          maxZoom={2}
          proOptions={{ hideAttribution: true }}
        >
          <Background gap={24} color="#d8ddd6" />
          <Controls showInteractive={false} position="bottom-left" />
          {showMinimap && !isNarrow ? <MiniMap pannable zoomable position="bottom-right" style={{ width: 150, height: 100 }} ariaLabel="Minimap of the Canvas" nodeColor={(n) => (n.type === "action" ? "#1d2833" : n.type === "gate" ? "#5b6b7a" : "#d99a1e")} /> : null}
        </ReactFlow>
      </CanvasContext.Provider>
    </div>
  );

  const tabs: { id: Tab; label: string }[] = [
    { id: "node", label: selected ? "Node" : "Node" },
    { id: "paths", label: `Paths (${sentences.length})` },
    { id: "problems", label: `Problems (${problems.length})` },
    { id: "versions", label: "Versions" },
  ];

  const side = (
    <div className="flex min-h-0 flex-col rounded-xl border border-line bg-paper">
      <div role="tablist" aria-label="Canvas panels" className="flex flex-wrap gap-1 border-b border-line p-1.5">
        {tabs.map((t) => (
          <button
            key={t.id}
            role="tab"
            id={`tab-${t.id}`}
            aria-selected={tab === t.id}
            aria-controls={`panel-${t.id}`}
            onClick={() => setTab(t.id)}
            className={`rounded-md px-1.5 py-1 text-[13px] font-semibold ${tab === t.id ? "bg-ink text-fog" : "hover:bg-fog"} ${t.id === "problems" && errorCount ? "underline decoration-clay decoration-2" : ""}`}
          >
            {t.label}
          </button>
        ))}
      </div>
      <div role="tabpanel" id={`panel-${tab}`} aria-labelledby={`tab-${tab}`} className={`overflow-y-auto p-3 ${isNarrow ? "" : "max-h-[calc(100vh-290px)] min-h-[400px]"}`}>
        {tab === "node" ? (
          selected ? (
            <Inspector
              key={selected.id}
              rule={selected}
              site={site}
              names={names}
              problems={problemsByNode.get(selected.id) ?? []}
              isReadOnly={isReadOnly}
              outgoing={outgoing}
              incoming={incoming}
              candidates={candidates}
              onParams={(params, field) => {
                const id = selected.id;
                g.commit(
                  g.nodesRef.current.map((n) => (n.id === id ? ({ ...n, data: { rule: { ...n.data.rule, params } as RuleNode } } as FlowNode) : n)),
                  g.edgesRef.current,
                  { coalesce: `params:${id}:${field}` },
                );
              }}
              onConnect={(target) => connect(selected.id, target)}
              onDisconnect={disconnect}
              onDelete={deleteSelected}
              notice={<ShortNotice siteId={siteId} rule={selected} shortByDevice={shortByDevice} />}
            />
          ) : selectedNodes.length > 1 ? (
            <div className="space-y-2 text-sm">
              <p>
                <strong>{selectedNodes.length} nodes</strong> selected.
              </p>
              {!isReadOnly ? (
                <div className="flex gap-2">
                  <button type="button" onClick={deleteSelected} className="rounded-md border border-clay px-3 py-1.5 font-semibold text-clay">
                    Delete them
                  </button>
                  <button type="button" onClick={() => (copy(), paste())} className="rounded-md border border-line px-3 py-1.5 font-semibold">
                    Duplicate
                  </button>
                </div>
              ) : null}
            </div>
          ) : (
            <p className="text-sm text-slate">{isReadOnly ? "Tap a node to see its settings." : "Select a node to change it, or add one from the list on the left."}</p>
          )
        ) : null}
        {tab === "paths" ? <SentenceList sentences={sentences} onShow={(s: RuleSentence) => focusNodes(s.nodeIds, false)} /> : null}
        {tab === "problems" ? <ProblemsList problems={problems} describe={describe} onFocus={(id) => focusNodes([id], true)} /> : null}
        {tab === "versions" ? <VersionsPanel siteId={siteId} canActivate={canActivate} /> : null}
      </div>
    </div>
  );

  const button = "rounded-md border border-line bg-paper px-2.5 py-1 text-sm font-semibold hover:border-ink disabled:opacity-40";
  return (
    // Wider than the console's text column on large screens: the Canvas needs the room.
    <div className="relative left-1/2 w-[min(calc(100vw-2rem),1600px)] -translate-x-1/2 space-y-3">
      <div className="flex flex-wrap items-center gap-2">
        <h1 className="mr-2 text-2xl font-extrabold">Canvas</h1>
        <p className="text-sm text-slate">{active ? `Active: version ${active.number}` : "No active version yet"}</p>
        <p role="status" aria-live="polite" className={`text-sm font-semibold ${autosave.status === "conflict" || autosave.status === "rejected" || autosave.status === "offline" ? "text-clay" : "text-slate"}`}>
          · {STATUS_WORDS[autosave.status]}
          {autosave.message ? `: ${autosave.message}` : ""}
        </p>
        <div className="ml-auto flex flex-wrap gap-2">
          {!isReadOnly ? (
            <>
              <button type="button" className={button} onClick={g.undo} disabled={!g.canUndo} aria-keyshortcuts="Control+Z">
                Undo
              </button>
              <button type="button" className={button} onClick={g.redo} disabled={!g.canRedo} aria-keyshortcuts="Control+Shift+Z">
                Redo
              </button>
              <button type="button" className={button} onClick={tidy} aria-keyshortcuts="L">
                Auto-layout
              </button>
            </>
          ) : null}
          <button type="button" className={button} onClick={() => void rf.fitView({ padding: 0.1, duration: 200 })} aria-keyshortcuts="F">
            Fit view
          </button>
          <button type="button" className={button} onClick={() => setHelpOpen(true)} aria-keyshortcuts="Shift+?">
            Keys
          </button>
          <button type="button" className={button} onClick={() => void tryOnBench()}>
            Try on bench
          </button>
          {canActivate ? (
            <button type="button" className="rounded-md bg-moss px-3 py-1 text-sm font-semibold text-paper" onClick={() => void openActivate()}>
              Activate…
            </button>
          ) : null}
        </div>
      </div>
      {notice ? (
        <p aria-live="polite" className="text-sm">
          {notice}
        </p>
      ) : null}
      {isNarrow ? (
        <div className="space-y-3">
          <p className="rounded-md border border-line bg-paper p-2 text-sm">The Canvas is read-only on a narrow screen. The paths below read as sentences; use a wider screen to edit the graph.</p>
          {side}
          {flow}
        </div>
      ) : (
        <div className="grid grid-cols-[160px_minmax(0,1fr)_310px] gap-3">
          <div className="max-h-[calc(100vh-230px)] overflow-y-auto pr-1">
            <PalettePanel entries={palette} onAdd={(k, t) => addNode(k, t)} />
          </div>
          {flow}
          {side}
        </div>
      )}
      <HelpDialog open={helpOpen} onClose={() => setHelpOpen(false)} />
      <ConflictDialog open={autosave.status === "conflict"} serverRevision={autosave.conflictRevision} isBusy={resolving} onReload={() => void onReload()} onKeepCopy={() => void onKeepCopy()} />
      {activateOpen ? (
        <ActivateDialog
          siteId={siteId}
          open={activateOpen}
          revision={autosave.revision()}
          activeNumber={active?.number ?? null}
          problems={problems}
          onClose={() => setActivateOpen(false)}
          onActivated={(v) => {
            setActivateOpen(false);
            setActive(v);
            say(`Version ${v.number} is now active.`);
          }}
        />
      ) : null}
    </div>
  );
}
