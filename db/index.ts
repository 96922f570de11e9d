import "server-only";
import { env } from "@/lib/env";
import { createDatabase, type Database } from "./client";

// One client per server process; kept on globalThis so dev-mode reloads reuse it.
const globalForDb = globalThis as unknown as { joulepathDb?: Database };

export function getDb(): Database {
  if (!globalForDb.joulepathDb) {
    const { DATABASE_URL, DATABASE_AUTH_TOKEN } = env();
    globalForDb.joulepathDb = createDatabase(DATABASE_URL, DATABASE_AUTH_TOKEN);
  }
  return globalForDb.joulepathDb;
}
