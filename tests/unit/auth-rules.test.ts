import { describe, expect, it } from "vitest";
import { safeNext } from "@/components/auth/safe-next";
import { clientAddress, isSameOrigin } from "@/lib/auth/origin";
import { can, PERMISSIONS } from "@/lib/auth/permissions";
import { ROLES } from "@/lib/auth/roles";
import { sectionsFor } from "@/lib/auth/sections";
import { MAX_FAILURES, throttleVerdict, WINDOW_MS } from "@/lib/auth/throttle";
import { hashToken, newToken } from "@/lib/auth/tokens";

describe("permission table", () => {
  it("gives integrators everything and occupants only viewing, recalling and receiving", () => {
    for (const p of Object.keys(PERMISSIONS) as (keyof typeof PERMISSIONS)[]) expect(can("integrator", p)).toBe(true);
    const occupant = (Object.keys(PERMISSIONS) as (keyof typeof PERMISSIONS)[]).filter((p) => can("occupant", p)).sort();
    expect(occupant).toEqual(["notices.receive", "scenes.recall", "site.view"]);
  });

  it("keeps members, devices and gateway keys from managers", () => {
    expect(can("manager", "members.manage")).toBe(false);
    expect(can("manager", "devices.manage")).toBe(false);
    expect(can("manager", "gateway-keys.manage")).toBe(false);
    expect(can("manager", "rules.activate")).toBe(true);
  });

  it("lists only the sections a role may open", () => {
    expect(sectionsFor("occupant").map((s) => s.label)).toEqual(["Overview"]);
    expect(sectionsFor("integrator").map((s) => s.label)).toContain("Members");
    expect(ROLES).toHaveLength(3);
  });
});

describe("sign-in throttle", () => {
  const now = 1_000_000_000;
  it("lets four failures through and blocks the fifth until it ages out", () => {
    expect(throttleVerdict([now - 1, now - 2, now - 3, now - 4], now).isBlocked).toBe(false);
    const five = [now - 10_000, now - 4, now - 3, now - 2, now - 1];
    const v = throttleVerdict(five, now);
    expect(v).toEqual({ isBlocked: true, retryAfterMs: WINDOW_MS - 10_000 });
    expect(MAX_FAILURES).toBe(5);
  });
  it("ignores failures older than the window", () => {
    expect(throttleVerdict([now - WINDOW_MS, now - WINDOW_MS - 1, now - 1, now - 2, now - 3], now).isBlocked).toBe(false);
  });
});

describe("tokens", () => {
  it("are 256-bit base64url and stored only as SHA-256", () => {
    const t = newToken();
    expect(t).toMatch(/^[A-Za-z0-9_-]{43}$/);
    expect(newToken()).not.toBe(t);
    // Source: FIPS 180-4 SHA-256 of "abc" (published example).
    expect(hashToken("abc")).toBe("ba7816bf8f01cfea414140de5dae2223b00361a396177a9cb410ff61f20015ad");
  });
});

describe("request origin and client address", () => {
  const r = (origin: string | null, extra: Record<string, string> = {}) => new Request("http://localhost:3000/api/x", { method: "POST", headers: { ...(origin ? { origin } : {}), ...extra } });
  it("accepts this console's origin and refuses others or none", () => {
    expect(isSameOrigin(r("http://localhost:3000"), "http://localhost:3000")).toBe(true);
    expect(isSameOrigin(r("https://console.example.invalid"), "https://console.example.invalid")).toBe(true);
    expect(isSameOrigin(r("https://evil.example.invalid"), "http://localhost:3000")).toBe(false);
    expect(isSameOrigin(r(null), "http://localhost:3000")).toBe(false);
  });
  it("takes the right-most forwarded address (the one the server itself saw)", () => {
    expect(clientAddress(r(null, { "x-forwarded-for": "203.0.113.9, 198.51.100.2" }))).toBe("198.51.100.2");
    expect(clientAddress(r(null, { "x-forwarded-for": "203.0.113.9, 198.51.100.2" }), 1)).toBe("203.0.113.9");
    expect(clientAddress(r(null))).toBe("unknown");
  });
});

describe("safeNext", () => {
  it("allows only same-site paths", () => {
    expect(safeNext("/sites/x")).toBe("/sites/x");
    expect(safeNext("//evil.example.invalid")).toBe("/sites");
    expect(safeNext("https://evil.example.invalid")).toBe("/sites");
    expect(safeNext("/\\evil")).toBe("/sites");
    expect(safeNext(undefined)).toBe("/sites");
  });
});
