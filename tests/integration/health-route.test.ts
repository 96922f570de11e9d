import { describe, expect, it, vi } from "vitest";

describe("GET /api/health", () => {
  it("answers 200 with the database round-trip time", async () => {
    const { GET } = await import("@/app/api/health/route");
    const res = await GET();
    expect(res.status).toBe(200);
    const body = await res.json();
    expect(body.status).toBe("ok");
    expect(body.database.roundTripMs).toBeGreaterThanOrEqual(0);
  });

  it("answers 503 with a reason when the database cannot be reached", async () => {
    // A libSQL server URL on a loopback port where nothing listens.
    const saved = process.env.DATABASE_URL;
    const holder = globalThis as { joulepathDb?: unknown };
    const savedDb = holder.joulepathDb;
    process.env.DATABASE_URL = "http://127.0.0.1:9";
    delete holder.joulepathDb;
    vi.resetModules();
    const spy = vi.spyOn(console, "error").mockImplementation(() => undefined);
    try {
      const { GET } = await import("@/app/api/health/route");
      const res = await GET();
      expect(res.status).toBe(503);
      const body = await res.json();
      expect(body.status).toBe("unavailable");
      expect(body.database.reason).toMatch(/database unreachable/);
    } finally {
      spy.mockRestore();
      process.env.DATABASE_URL = saved;
      holder.joulepathDb = savedDb;
      vi.resetModules();
    }
  });
});
