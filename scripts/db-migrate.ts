import { createDatabase } from "../db/client";
import { migrateDatabase } from "../db/migrate";
import { env } from "../lib/env";

const { DATABASE_URL, DATABASE_AUTH_TOKEN } = env();
await migrateDatabase(createDatabase(DATABASE_URL, DATABASE_AUTH_TOKEN));
console.log(`Migrations applied to ${DATABASE_URL}`);
