import { readLogPages } from "@/db/queries/events";
import { getSite } from "@/db/queries/sites";
import { listDevices } from "@/db/queries/devices";
import { siteRoute } from "@/lib/auth/route";
import { CSV_HEADER, exportFileName, toCsvLine, toNdjsonLine } from "@/lib/eventlog/format";
import { eventFilterSchema, exportQuerySchema } from "@/lib/validation/events";

export const dynamic = "force-dynamic";

/**
 * The filtered log as NDJSON or CSV, oldest first, streamed a keyset page at a
 * time: the columns the import reads, so an export imports back unchanged.
 */
export const GET = siteRoute("replay.use", async ({ request, siteId }) => {
  const query = Object.fromEntries(new URL(request.url).searchParams);
  const filter = eventFilterSchema.parse(query);
  const { format } = exportQuerySchema.parse(query);
  const site = await getSite({ siteId });
  const zoneDevices = filter.zone ? (await listDevices({ siteId })).filter((d) => d.zoneId === filter.zone).map((d) => d.id) : undefined;
  const pages = readLogPages({ siteId, from: filter.from ?? 0, to: filter.to ?? Number.MAX_SAFE_INTEGER, device: filter.device, devices: zoneDevices, kind: filter.kind, pageSize: 1000 });
  const encoder = new TextEncoder();
  let isStarted = false;
  const stream = new ReadableStream<Uint8Array>({
    async pull(controller) {
      if (!isStarted && format === "csv") controller.enqueue(encoder.encode(CSV_HEADER));
      isStarted = true;
      const next = await pages.next();
      if (next.done) return controller.close();
      let text = "";
      for (const e of next.value) text += format === "csv" ? toCsvLine(e) : toNdjsonLine(e);
      controller.enqueue(encoder.encode(text));
    },
    async cancel() {
      await pages.return(undefined);
    },
  });
  const type = format === "csv" ? "text/csv; charset=utf-8" : "application/x-ndjson; charset=utf-8";
  return new Response(stream, {
    headers: { "content-type": type, "content-disposition": `attachment; filename="${exportFileName(site?.name ?? siteId, format, filter.from, filter.to)}"`, "cache-control": "no-store" },
  });
});
