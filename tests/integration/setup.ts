import { randomUUID } from "node:crypto";
import { rmSync } from "node:fs";
import os from "node:os";
import path from "node:path";
import { afterAll, beforeAll } from "vitest";
import { startMailSink } from "@/workers/mail-sink";

// A throwaway SQLite file per test file: real libSQL, real migrations, never a mock.
const file = path.join(os.tmpdir(), `joulepath-it-${randomUUID()}.db`);
process.env.DATABASE_URL = `file:${file}`;
const uploadDir = path.join(os.tmpdir(), `joulepath-it-uploads-${randomUUID()}`);
process.env.UPLOAD_DIR = uploadDir;
delete (globalThis as { joulepathDb?: unknown }).joulepathDb;

// A real SMTP sink on free loopback ports, so mail-sending code runs for real.
const sink = await startMailSink({ smtpPort: 0, httpPort: 0 });
process.env.SMTP_URL = `smtp://127.0.0.1:${sink.smtpPort}`;
process.env.MAIL_SINK_API_URL = `http://127.0.0.1:${sink.httpPort}`;

beforeAll(async () => {
  const [{ getDb }, { migrateDatabase }] = await Promise.all([import("@/db"), import("@/db/migrate")]);
  await migrateDatabase(getDb());
});

afterAll(async () => {
  await sink.close();
  for (const suffix of ["", "-wal", "-shm"]) rmSync(file + suffix, { force: true });
  rmSync(uploadDir, { recursive: true, force: true });
});
