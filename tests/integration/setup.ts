import { randomUUID } from "node:crypto";
import { rmSync } from "node:fs";
import os from "node:os";
import path from "node:path";
import { afterAll, beforeAll } from "vitest";

// A throwaway SQLite file per test file: real libSQL, real migrations, never a mock.
const file = path.join(os.tmpdir(), `joulepath-it-${randomUUID()}.db`);
process.env.DATABASE_URL = `file:${file}`;
delete (globalThis as { joulepathDb?: unknown }).joulepathDb;

beforeAll(async () => {
  const [{ getDb }, { migrateDatabase }] = await Promise.all([import("@/db"), import("@/db/migrate")]);
  await migrateDatabase(getDb());
});

afterAll(() => {
  for (const suffix of ["", "-wal", "-shm"]) rmSync(file + suffix, { force: true });
});
