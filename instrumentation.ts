/**
 * Runs once when a Next.js server starts: bring the database schema up to date
 * before the first request, so a new deployment never serves an old schema.
 */
export async function register() {
  if (process.env.NEXT_RUNTIME !== "nodejs") return;
  const [{ getDb }, { migrateDatabase }] = await Promise.all([import("@/db"), import("@/db/migrate")]);
  try {
    await migrateDatabase(getDb());
  } catch (err) {
    // Keep serving so /api/health can say what is wrong instead of the process dying silently.
    console.error("[startup] database migration failed:", err instanceof Error ? err.message : err);
  }
}
