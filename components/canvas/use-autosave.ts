"use client";

import { useCallback, useEffect, useRef, useState } from "react";
import { ApiError, fetchJson } from "@/components/api/fetch-json";
import type { RuleGraph } from "@/lib/rules/graph";
import type { Problem } from "@/lib/rules/validate";
import type { SaveDraftDto } from "@/lib/validation/rules";

export type SaveStatus = "saved" | "unsaved" | "saving" | "conflict" | "rejected" | "offline";

const DELAY_MS = 800;

/**
 * Saves the draft shortly after each change, one request at a time, with the
 * revision it started from. A 409 stops saving and reports the conflict (nothing
 * is overwritten); a 422/413 keeps the server's draft and says why.
 */
export function useAutosave({ siteId, initialRevision, getGraph, onProblems }: { siteId: string; initialRevision: number; getGraph: () => RuleGraph; onProblems: (p: Problem[]) => void }) {
  const [status, setStatus] = useState<SaveStatus>("saved");
  const [message, setMessage] = useState<string | null>(null);
  const [conflictRevision, setConflictRevision] = useState<number | null>(null);
  const revision = useRef(initialRevision);
  const timer = useRef<ReturnType<typeof setTimeout> | null>(null);
  const inFlight = useRef<Promise<void> | null>(null);
  const changeSeq = useRef(0);
  const savedSeq = useRef(0);
  const blocked = useRef(false);
  /** The graph as the server last stored it from us: the base for "keep mine as a copy". */
  const base = useRef<RuleGraph>(getGraph());

  const run = useCallback(async (): Promise<void> => {
    if (inFlight.current) {
      await inFlight.current;
      if (changeSeq.current !== savedSeq.current && !blocked.current) return run();
      return;
    }
    if (blocked.current || changeSeq.current === savedSeq.current) return;
    const seq = changeSeq.current;
    const graph = getGraph();
    setStatus("saving");
    const work = (async () => {
      try {
        const res = await fetchJson<SaveDraftDto>(`/api/sites/${siteId}/rules/draft`, { method: "PUT", headers: { "content-type": "application/json" }, body: JSON.stringify({ graph, revision: revision.current }) });
        revision.current = res.revision;
        savedSeq.current = seq;
        base.current = graph;
        onProblems(res.problems);
        setMessage(null);
        setStatus(changeSeq.current === seq ? "saved" : "unsaved");
      } catch (err) {
        if (err instanceof ApiError && err.status === 409) {
          blocked.current = true;
          setConflictRevision(Number((err.body as { revision?: number } | undefined)?.revision ?? NaN));
          setStatus("conflict");
        } else if (err instanceof ApiError && (err.status === 422 || err.status === 413)) {
          const fields = (err.body as { fields?: Record<string, string[]> } | undefined)?.fields;
          const first = fields ? Object.values(fields)[0]?.[0] : undefined;
          setMessage(first && first !== err.message ? `${err.message} ${first}` : err.message);
          setStatus("rejected");
        } else {
          setMessage(err instanceof Error ? err.message : "The draft could not be saved.");
          setStatus("offline");
        }
      }
    })();
    inFlight.current = work;
    await work;
    inFlight.current = null;
    // Changes made while this save was on its way go in the next one.
    if (changeSeq.current !== seq && !blocked.current) schedule();
  }, [getGraph, onProblems, siteId]);

  function schedule() {
    if (timer.current) clearTimeout(timer.current);
    timer.current = setTimeout(() => void runRef.current(), DELAY_MS);
  }
  const runRef = useRef(run);
  useEffect(() => {
    runRef.current = run;
  }, [run]);

  const changed = useCallback(() => {
    changeSeq.current++;
    if (!blocked.current) setStatus("unsaved");
    schedule();
  }, []);

  /** Save now and wait (before Activate or the bench). True when the server has exactly what is on screen. */
  const flush = useCallback(async () => {
    if (timer.current) clearTimeout(timer.current);
    await run();
    return changeSeq.current === savedSeq.current && !blocked.current;
  }, [run]);

  /** After a conflict is settled: continue from the server's revision. */
  const resume = useCallback(
    (serverRevision: number, serverGraph: RuleGraph, hasMore: boolean) => {
      revision.current = serverRevision;
      base.current = serverGraph;
      blocked.current = false;
      setConflictRevision(null);
      setMessage(null);
      if (hasMore) changed();
      else {
        savedSeq.current = changeSeq.current;
        setStatus("saved");
      }
    },
    [changed],
  );

  useEffect(() => {
    const warn = (e: BeforeUnloadEvent) => {
      if (changeSeq.current !== savedSeq.current) e.preventDefault();
    };
    window.addEventListener("beforeunload", warn);
    return () => window.removeEventListener("beforeunload", warn);
  }, []);

  return { status, message, conflictRevision, changed, flush, resume, revision: () => revision.current, base: () => base.current };
}
