import { describe, expect, it } from "vitest";
import { parseEnv } from "@/lib/env";

describe("parseEnv", () => {
  it("defaults to an embedded file database under data/", () => {
    const env = parseEnv({});
    expect(env.DATABASE_URL).toBe("file:data/joulepath.db");
    expect(env.APP_URL).toBe("http://localhost:3000");
  });

  it("accepts any libSQL URL", () => {
    expect(parseEnv({ DATABASE_URL: "libsql://db.example.invalid" }).DATABASE_URL).toBe("libsql://db.example.invalid");
    expect(parseEnv({ DATABASE_URL: "http://127.0.0.1:8080" }).DATABASE_URL).toBe("http://127.0.0.1:8080");
  });

  it("names the variable that is wrong", () => {
    expect(() => parseEnv({ DATABASE_URL: "postgres://x" })).toThrow(/DATABASE_URL: must be a libSQL URL/);
    expect(() => parseEnv({ APP_URL: "not a url" })).toThrow(/APP_URL/);
    expect(() => parseEnv({ NODE_ENV: "staging" })).toThrow(/NODE_ENV/);
  });
});
