import { spawn } from "node:child_process";
import { createDatabase } from "../db/client";
import { migrateDatabase } from "../db/migrate";
import { seedDemo } from "../db/seed";

const url = process.env.DATABASE_URL ?? "file:data/joulepath.db";
const db = createDatabase(url, process.env.DATABASE_AUTH_TOKEN);
await migrateDatabase(db);
await seedDemo(db);

const child = spawn("npx", ["next", "dev", ...process.argv.slice(2)], { stdio: "inherit", env: { ...process.env, DATABASE_URL: url } });
child.on("exit", (code) => process.exit(code ?? 0));
process.on("SIGINT", () => child.kill("SIGINT"));
