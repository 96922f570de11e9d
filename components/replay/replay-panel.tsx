"use client";

import { useMutation, useQuery, useQueryClient } from "@tanstack/react-query";
import { usePathname, useRouter, useSearchParams } from "next/navigation";
import { fetchJson } from "@/components/api/fetch-json";
import type { SiteContext } from "@/components/events/types";
import { formatSiteTime } from "@/lib/eventlog/local-input";
import type { ReplayResult } from "@/lib/replay/types";
import { ReplayForm, type RuleSetOptions } from "./replay-form";
import { ReplayResults } from "./replay-results";

type JobView = {
  id: string;
  status: "queued" | "running" | "done" | "failed" | "cancelled";
  processed: number;
  total: number;
  cancelRequested: boolean;
  error: string | null;
  createdAt: string;
  params: { from: number; to: number; runs: { label: string }[] };
  result: ReplayResult | null;
};

const isActive = (s: JobView["status"]) => s === "queued" || s === "running";

export function ReplayPanel({ ctx, options, initialWindow }: { ctx: SiteContext; options: RuleSetOptions; initialWindow: { from: number; to: number } }) {
  const router = useRouter();
  const pathname = usePathname();
  const jobId = useSearchParams().get("job");
  const client = useQueryClient();
  const base = `/api/sites/${encodeURIComponent(ctx.siteId)}/replays`;
  const open = (id: string) => router.replace(`${pathname}?job=${id}`, { scroll: false });

  const jobs = useQuery({ queryKey: ["sites", ctx.siteId, "replays"], queryFn: () => fetchJson<{ jobs: JobView[] }>(base), refetchInterval: 5000 });
  const job = useQuery({
    queryKey: ["sites", ctx.siteId, "replays", jobId],
    queryFn: () => fetchJson<{ job: JobView }>(`${base}/${jobId}`),
    enabled: !!jobId,
    refetchInterval: (q) => (q.state.data && !isActive(q.state.data.job.status) ? false : 500),
  });
  const cancel = useMutation({
    mutationFn: (id: string) => fetchJson(`${base}/${id}/cancel`, { method: "POST" }),
    onSuccess: () => client.invalidateQueries({ queryKey: ["sites", ctx.siteId, "replays"] }),
  });
  const current = job.data?.job;

  return (
    <div className="space-y-6">
      <header>
        <h1 className="text-3xl font-extrabold tracking-tight">Replay</h1>
        <p className="text-sm text-slate">Run a window of the Event log through the active rules, the draft or any version — or Compare two — and read the Trace of any step. Times are the site&apos;s ({ctx.timeZone}).</p>
      </header>
      <ReplayForm
        ctx={ctx}
        options={options}
        initialWindow={initialWindow}
        onQueued={(id) => {
          open(id);
          void client.invalidateQueries({ queryKey: ["sites", ctx.siteId, "replays"] });
        }}
      />

      {jobId && job.isError ? <p role="alert" className="text-sm font-semibold text-clay">{job.error.message}</p> : null}
      {current ? (
        <section aria-labelledby="job-h" className="space-y-4">
          <div className="rounded-xl border border-line bg-paper p-4">
            <h2 id="job-h" className="text-lg font-bold">
              {current.params.runs.map((r) => r.label).join(" vs ")}
            </h2>
            <p className="text-xs text-slate">
              {formatSiteTime(current.params.from, ctx.timeZone, false)} → {formatSiteTime(current.params.to, ctx.timeZone, false)}
            </p>
            {isActive(current.status) ? (
              <div className="mt-2 flex flex-wrap items-center gap-3">
                <div className="min-w-[12rem] flex-1">
                  <label htmlFor="replay-progress" className="text-sm font-semibold">
                    {current.status === "queued" ? "Waiting for the replay worker…" : `Replaying: ${current.processed} of ${current.total} events`}
                    {current.cancelRequested ? " (stopping…)" : ""}
                  </label>
                  <progress id="replay-progress" className="block h-2 w-full accent-harvest" max={Math.max(1, current.total)} value={current.processed} />
                </div>
                <button type="button" onClick={() => cancel.mutate(current.id)} disabled={cancel.isPending || current.cancelRequested} className="rounded-md border border-clay px-3 py-1.5 text-sm font-semibold text-clay disabled:opacity-50">
                  Cancel
                </button>
              </div>
            ) : (
              <p role="status" className={`mt-2 text-sm font-semibold ${current.status === "done" ? "text-moss" : "text-clay"}`}>
                {current.status === "done" ? `Done: ${current.processed} events replayed.` : current.status === "cancelled" ? `Cancelled after ${current.processed} of ${current.total} events.` : (current.error ?? "The replay failed.")}
              </p>
            )}
          </div>
          {current.status === "done" && current.result ? <ReplayResults ctx={ctx} result={current.result} /> : null}
        </section>
      ) : null}

      <section aria-labelledby="recent-h" className="rounded-xl border border-line bg-paper p-4">
        <h2 id="recent-h" className="text-lg font-bold">
          Recent replays
        </h2>
        {jobs.data?.jobs.length ? (
          <ul className="mt-2 divide-y divide-line text-sm">
            {jobs.data.jobs.map((j) => (
              <li key={j.id} className="flex flex-wrap items-center justify-between gap-2 py-1.5">
                <button type="button" className="text-left underline decoration-dotted underline-offset-2" onClick={() => open(j.id)} aria-current={j.id === jobId ? "true" : undefined}>
                  {j.params.runs.map((r) => r.label).join(" vs ")} · {formatSiteTime(j.params.from, ctx.timeZone, false)} → {formatSiteTime(j.params.to, ctx.timeZone, false)}
                </button>
                <span className="text-xs text-slate">
                  {j.status}
                  {isActive(j.status) ? ` ${j.processed}/${j.total}` : ""}
                </span>
              </li>
            ))}
          </ul>
        ) : (
          <p className="text-sm text-slate">{jobs.isPending ? "Loading…" : "None yet."}</p>
        )}
      </section>
    </div>
  );
}
