import "server-only";
import { DrizzleSQLiteAdapter } from "@lucia-auth/adapter-drizzle";
import { Lucia, TimeSpan } from "lucia";
import { getDb } from "@/db";
import { sessions, users } from "@/db/schema";
import { env } from "@/lib/env";

/**
 * lucia v3 stays behind lib/auth: nothing else imports it, so replacing it
 * (upstream no longer develops v3) touches only this folder.
 */
function isSecureCookie(): boolean {
  const { NODE_ENV, APP_URL } = env();
  const { protocol, hostname } = new URL(APP_URL);
  if (protocol === "https:") return true;
  // A production build served on http://localhost (the demo) cannot use Secure everywhere.
  return NODE_ENV === "production" && hostname !== "localhost" && hostname !== "127.0.0.1";
}

function createLucia() {
  const db = getDb();
  const adapter = new DrizzleSQLiteAdapter(db, sessions, users);
  return new Lucia(adapter, {
    sessionExpiresIn: new TimeSpan(30, "d"),
    sessionCookie: {
      name: "jp_session",
      expires: true,
      attributes: { secure: isSecureCookie(), sameSite: "lax" },
    },
    getUserAttributes: (attributes) => ({ email: attributes.email, name: attributes.name }),
  });
}

type AppLucia = ReturnType<typeof createLucia>;
const holder = globalThis as unknown as { joulepathLucia?: AppLucia; joulepathLuciaDb?: unknown };

export function getLucia(): AppLucia {
  // Rebuilt if the database handle changes (tests swap it per file).
  const db = getDb();
  if (!holder.joulepathLucia || holder.joulepathLuciaDb !== db) {
    holder.joulepathLucia = createLucia();
    holder.joulepathLuciaDb = db;
  }
  return holder.joulepathLucia;
}

declare module "lucia" {
  interface Register {
    Lucia: AppLucia;
    DatabaseUserAttributes: { email: string; name: string };
  }
}
