import { createDatabase } from "../db/client";
import { migrateDatabase } from "../db/migrate";
import { seedDemo } from "../db/seed";
import { env } from "../lib/env";

const { DATABASE_URL, DATABASE_AUTH_TOKEN } = env();
const db = createDatabase(DATABASE_URL, DATABASE_AUTH_TOKEN);
await migrateDatabase(db);
const added = await seedDemo(db);
console.log(`Demo seed on ${DATABASE_URL}: added ${added.sites} site(s), ${added.zones} zone(s), ${added.devices} device(s), ${added.users} user(s) (existing rows kept).`);
