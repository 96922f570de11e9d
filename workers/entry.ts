/**
 * The command-line entry every polling worker shares: parse the environment,
 * let a plain Node process load db/index.ts, stop cleanly on the first SIGINT or
 * SIGTERM (after the work in hand) and at once on the second, print failures
 * with their stack, and close the database at the end.
 */
import { randomUUID } from "node:crypto";
import { register } from "node:module";
import os from "node:os";
import { pathToFileURL } from "node:url";
import { z } from "zod";
import { env } from "@/lib/env";
import type { WorkerLog } from "./outbox";

export function makeOwnerId(): string {
  return `${os.hostname()}:${process.pid}:${randomUUID().slice(0, 8)}`;
}

/**
 * This is a Node process, never a browser bundle, so db/index.ts's "server-only"
 * guard does not apply: resolve that one package as a React server would (to its
 * empty module). The same as `node --conditions=react-server`, limited to it.
 * Call it before anything imports db/index.ts (the benchmarks use it too).
 */
export function allowServerOnly(): void {
  const hook = `export async function resolve(specifier, context, next) {
  return next(specifier, specifier === "server-only" ? { ...context, conditions: [...context.conditions, "react-server"] } : context);
}`;
  register(`data:text/javascript,${encodeURIComponent(hook)}`);
}

export function workerLog(name: string): WorkerLog {
  return {
    info: (message) => console.log(`${name}: ${message}`),
    error: (message) => console.error(`${name}: ${message}`),
  };
}

/** True when this module is the file Node was started with (not imported by a test or another worker). */
export function isEntryModule(importMetaUrl: string): boolean {
  return process.argv[1] !== undefined && importMetaUrl === pathToFileURL(process.argv[1]).href;
}

export function messageOf(error: unknown, withStack = false): string {
  if (!(error instanceof Error)) return String(error);
  // Domain errors (a conflict, a deleted site) are expected enough that their message says it all.
  if (!withStack || error.name === "AppError" || !error.stack) return error.message;
  return error.stack;
}

/** Names the database without printing credentials that a remote URL may carry. */
export function databaseLabel(url: string): string {
  if (url.startsWith("file:") || url.startsWith(":memory:")) return url.split("?")[0];
  try {
    return new URL(url).host;
  } catch {
    return "(unparsable URL)";
  }
}

type Options = {
  log: WorkerLog;
  /** What is finished before stopping, for the log: "the site in hand". */
  inHand: string;
  /** The first log line, given the owner id and the database's label. */
  describe: (owner: string, database: string) => string;
  run: (owner: string, signal: AbortSignal) => Promise<void>;
};

export function runWorkerMain({ log, inHand, describe, run }: Options): void {
  const main = async () => {
    // Parse the environment first, so a bad DATABASE_URL stops the worker with its name.
    const { DATABASE_URL } = env();
    allowServerOnly();
    const owner = makeOwnerId();
    const controller = new AbortController();
    let signals = 0;
    const stop = (signal: NodeJS.Signals) => {
      if (++signals > 1) {
        log.error(`${signal} again: stopping now.`);
        process.exit(1);
      }
      log.info(`${signal}: stopping after ${inHand}.`);
      controller.abort();
    };
    process.on("SIGINT", stop);
    process.on("SIGTERM", stop);
    log.info(describe(owner, databaseLabel(DATABASE_URL)));
    await run(owner, controller.signal);
    const { getDb } = await import("@/db");
    getDb().$client.close();
    log.info("stopped.");
  };
  main().catch((error: unknown) => {
    log.error(messageOf(error, true));
    process.exit(1);
  });
}

const portSchema = z.coerce.number().int().min(0).max(65_535);

/** A port from the environment, or `fallback` when unset; anything else stops the process with the variable's name. */
export function portFromEnv(name: string, fallback: number): number {
  const raw = process.env[name];
  if (raw === undefined || raw === "") return fallback;
  const result = portSchema.safeParse(raw);
  if (!result.success) throw new Error(`${name} must be a port number (0–65535), got "${raw}"`);
  return result.data;
}

/**
 * The entry of a local stand-in service (mail sink, push service): start it, say
 * where it listens, close it on SIGINT or SIGTERM.
 */
export function runServiceMain<S extends { close(): Promise<void> }>(name: string, start: () => Promise<S>, describe: (service: S) => string): void {
  const main = async () => {
    const service = await start();
    console.log(`${name}: ${describe(service)}`);
    const stop = () => {
      service.close().then(
        () => process.exit(0),
        () => process.exit(1),
      );
    };
    process.once("SIGINT", stop);
    process.once("SIGTERM", stop);
  };
  main().catch((error: unknown) => {
    console.error(`${name}: ${error instanceof Error ? error.message : String(error)}`);
    process.exit(1);
  });
}
