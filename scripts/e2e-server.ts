/** The server Playwright starts: a fresh database, the built app, the local stand-ins. */
import { rmSync } from "node:fs";
import { runApp } from "./run-app";

const file = "data/e2e.db";
const uploadDir = "data/e2e-uploads";
for (const suffix of ["", "-wal", "-shm"]) rmSync(file + suffix, { force: true });
rmSync(uploadDir, { recursive: true, force: true });
process.env.UPLOAD_DIR = uploadDir;

await runApp({
  port: Number(process.env.E2E_PORT ?? 3100),
  databaseUrl: `file:${file}`,
  build: false,
  // Ports apart from the demo's, so the two can run side by side.
  mailSink: { smtpPort: 2625, httpPort: 2626 },
  pushServicePort: 2630,
});
