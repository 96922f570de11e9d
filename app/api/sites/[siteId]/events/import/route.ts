import { importEventStream } from "@/db/queries/events";
import { siteRoute } from "@/lib/auth/route";
import { AppError } from "@/lib/errors";
import { describeReport } from "@/lib/eventlog/check";
import { importQuerySchema, MAX_IMPORT_BYTES } from "@/lib/validation/events";

export const dynamic = "force-dynamic";

/**
 * Imports an event log file sent as the raw request body (NDJSON or CSV).
 * `mode=check` reads it and reports every problem with its line; `mode=commit`
 * writes it — all of it, or nothing if any line has a problem, unless
 * `acceptValid=1` ("import the valid lines"). Repeated event ids are skipped.
 */
export const POST = siteRoute("replay.use", async ({ request, siteId }) => {
  const { format, mode, acceptValid } = importQuerySchema.parse(Object.fromEntries(new URL(request.url).searchParams));
  const length = Number(request.headers.get("content-length") ?? "0");
  if (length > MAX_IMPORT_BYTES) throw new AppError("too_large", `The file is ${Math.round(length / 1024 / 1024)} MiB; at most ${MAX_IMPORT_BYTES / 1024 / 1024} MiB can be imported at once. Split it by date and import the parts (repeated events are skipped).`);
  if (!request.body) throw new AppError("bad_request", "Send the file as the request body.");
  const { report, inserted, skipped, isWritten } = await importEventStream({ siteId, body: request.body, format, mode, acceptValid, maxBytes: MAX_IMPORT_BYTES });
  const summary = describeReport(report);
  if (mode === "check") return Response.json({ report, summary });
  if (!isWritten) {
    const message = report.valid === 0 ? "The file has no valid events; nothing was imported." : `The file has ${report.errorCount} line${report.errorCount === 1 ? "" : "s"} with problems; nothing was imported. Fix them, or choose to import the valid lines.`;
    return Response.json({ error: "invalid_log", message, report, summary }, { status: 422 });
  }
  return Response.json({ report, summary, inserted, skipped }, { status: 201 });
});
