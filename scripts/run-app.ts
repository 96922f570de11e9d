/**
 * Shared by `npm run demo` and the e2e web server: prepare the database, build
 * if asked, then run the production server and the local stand-ins together,
 * stopping all of them when any one stops or on Ctrl-C.
 */
import { spawn, type ChildProcess } from "node:child_process";
import { createServer } from "node:net";
import { createDatabase } from "../db/client";
import { migrateDatabase } from "../db/migrate";
import { seedDemo } from "../db/seed";

export type RunOptions = {
  port: number;
  databaseUrl: string;
  build: boolean;
  /** Ports of the local mail sink (SMTP and its JSON API). */
  mailSink: { smtpPort: number; httpPort: number };
  /** Port of the local push service (`workers/push-service.ts`); default 2530. */
  pushServicePort?: number;
  /** Extra environment for the server and workers. */
  env?: Record<string, string>;
  onReady?: (url: string) => void;
};

const children: ChildProcess[] = [];

function stopAll(code: number): never {
  // Children share our process group (Ctrl-C reaches them too); tsx passes SIGTERM on to its node child.
  for (const c of children) if (c.exitCode === null) c.kill("SIGTERM");
  process.exit(code);
}

function start(name: string, command: string, args: string[], env: NodeJS.ProcessEnv): ChildProcess {
  const child = spawn(command, args, { stdio: "inherit", env });
  children.push(child);
  child.on("exit", (code, signal) => {
    console.log(`[${name}] stopped (${signal ?? `exit ${code}`}); stopping the rest.`);
    stopAll(code ?? 1);
  });
  return child;
}

async function waitForHealth(url: string, timeoutMs: number): Promise<void> {
  const until = Date.now() + timeoutMs;
  while (Date.now() < until) {
    try {
      const res = await fetch(`${url}/api/health`);
      if (res.ok) return;
    } catch {
      // not listening yet
    }
    await new Promise((r) => setTimeout(r, 250));
  }
  throw new Error(`The server at ${url} did not answer /api/health within ${timeoutMs / 1000} s.`);
}

/** Refuses to start on a busy port, so a server left running elsewhere is never mistaken for ours. */
async function assertPortFree(port: number, what: string): Promise<void> {
  await new Promise<void>((resolve, reject) => {
    const probe = createServer();
    probe.once("error", () => reject(new Error(`Port ${port} (${what}) is already in use. Stop the other process, or choose another port (PORT, MAIL_SINK_SMTP_PORT, MAIL_SINK_HTTP_PORT, PUSH_SERVICE_PORT).`)));
    probe.listen(port, () => probe.close(() => resolve()));
  });
}

export async function runApp(options: RunOptions): Promise<void> {
  process.on("SIGINT", () => stopAll(0));
  process.on("SIGTERM", () => stopAll(0));
  const url = `http://localhost:${options.port}`;
  const { smtpPort, httpPort } = options.mailSink;
  const pushPort = options.pushServicePort ?? 2530;
  const env: NodeJS.ProcessEnv = {
    ...process.env,
    APP_URL: url,
    SMTP_URL: `smtp://127.0.0.1:${smtpPort}`,
    MAIL_SINK_API_URL: `http://127.0.0.1:${httpPort}`,
    MAIL_SINK_SMTP_PORT: String(smtpPort),
    MAIL_SINK_HTTP_PORT: String(httpPort),
    PUSH_SERVICE_PORT: String(pushPort),
    PUSH_SERVICE_URL: `http://127.0.0.1:${pushPort}`,
    JOULEPATH_DEV_TOOLS: "1",
    ...options.env,
    DATABASE_URL: options.databaseUrl,
    NEXT_TELEMETRY_DISABLED: "1",
  };

  try {
    await assertPortFree(options.port, "console");
    await assertPortFree(smtpPort, "mail sink SMTP");
    await assertPortFree(httpPort, "mail sink API");
    await assertPortFree(pushPort, "push service");
  } catch (err) {
    console.error(err instanceof Error ? err.message : err);
    process.exit(1);
  }

  const db = createDatabase(options.databaseUrl, process.env.DATABASE_AUTH_TOKEN);
  await migrateDatabase(db);
  const added = await seedDemo(db);
  console.log(`Database ${options.databaseUrl}: migrated; demo seed added ${added.sites} site(s), ${added.zones} zone(s), ${added.devices} device(s), ${added.users} demo user(s).`);

  if (options.build) {
    console.log("Building the console (next build)…");
    await new Promise<void>((resolve, reject) => {
      const b = spawn("npx", ["next", "build"], { stdio: "inherit", env: { ...env, NODE_ENV: "production" } });
      b.on("exit", (code) => (code === 0 ? resolve() : reject(new Error(`next build failed (exit ${code})`))));
    });
  }

  start("mail-sink", "node_modules/.bin/tsx", ["workers/mail-sink.ts"], env);
  start("engine-worker", "node_modules/.bin/tsx", ["workers/engine-worker.ts"], env);
  start("push-service", "node_modules/.bin/tsx", ["workers/push-service.ts"], env);
  start("notice-worker", "node_modules/.bin/tsx", ["workers/notice-worker.ts"], env);
  start("replay-worker", "node_modules/.bin/tsx", ["workers/replay-worker.ts"], env);
  start("app", "node_modules/.bin/next", ["start", "-p", String(options.port)], { ...env, NODE_ENV: "production" });
  await waitForHealth(url, 60_000);
  options.onReady?.(url);
}
