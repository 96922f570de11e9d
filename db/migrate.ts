import path from "node:path";
import { migrate } from "drizzle-orm/libsql/migrator";
import type { Database } from "./client";

export const MIGRATIONS_FOLDER = path.join(process.cwd(), "db", "migrations");

/** Applies every committed drizzle-kit migration not yet applied. Safe to run at each start. */
export async function migrateDatabase(db: Database): Promise<void> {
  await migrate(db, { migrationsFolder: MIGRATIONS_FOLDER });
}
