import { mkdirSync } from "node:fs";
import path from "node:path";
import { createClient } from "@libsql/client";
import { drizzle } from "drizzle-orm/libsql";
import * as schema from "./schema";

export type Database = ReturnType<typeof createDatabase>;

/**
 * Makes a Drizzle database on a libSQL client. Used by db/index.ts for the app
 * and directly by scripts and tests, which must not import "server-only".
 */
export function createDatabase(url: string, authToken?: string) {
  if (url.startsWith("file:")) {
    const file = url.slice("file:".length).split("?")[0];
    mkdirSync(path.dirname(path.resolve(file)), { recursive: true });
  }
  // busy timeout: wait for a lock instead of failing when the worker and the
  // app write at once. Foreign keys are on by default in libSQL.
  const client = createClient({ url, authToken, timeout: 5000 });
  if (url.startsWith("file:")) {
    // WAL lets readers go on while a writer commits; the mode is stored in the file.
    void client.execute("PRAGMA journal_mode = WAL").catch(() => undefined);
  }
  return drizzle(client, { schema });
}
