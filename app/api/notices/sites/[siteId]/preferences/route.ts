import { getNoticePrefs, saveNoticePrefs } from "@/db/queries/notices";
import { readJson, siteRoute } from "@/lib/auth/route";
import { noticePrefsSchema } from "@/lib/validation/notices";

export const dynamic = "force-dynamic";

/** The signed-in person's notice preferences on this site (defaults until they save). */
export const GET = siteRoute("notices.receive", async ({ siteId, user }) => {
  return Response.json({ prefs: await getNoticePrefs({ siteId, userId: user.id }) }, { headers: { "cache-control": "no-store" } });
});

export const PUT = siteRoute("notices.receive", async ({ request, siteId, user }) => {
  const prefs = await readJson(request, noticePrefsSchema, 8 * 1024);
  return Response.json({ prefs: await saveNoticePrefs({ siteId, userId: user.id, prefs }) });
});
