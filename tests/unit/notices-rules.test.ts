import { describe, expect, it } from "vitest";
import { BACKOFF_MS, MAX_ATTEMPTS, nextAttemptAt, RATE_LIMIT, rateDecision } from "@/lib/notices/delivery-policy";
import { countedText, linkForRole, noticeEmail, pushPayload } from "@/lib/notices/message";
import { DEFAULT_PREFS, isQuietAt, planChannels } from "@/lib/notices/preferences";
import { resolveRecipients, type SiteMember } from "@/lib/notices/recipients";

const members: SiteMember[] = [
  { userId: "u-int", email: "int@example.invalid", role: "integrator", zoneIds: null },
  { userId: "u-man", email: "Man@example.invalid", role: "manager", zoneIds: null },
  { userId: "u-flat", email: "flat@example.invalid", role: "occupant", zoneIds: ["zone-flat", "zone-path"] },
  { userId: "u-shop", email: "shop@example.invalid", role: "occupant", zoneIds: ["zone-shop"] },
  { userId: "u-all", email: "all@example.invalid", role: "occupant", zoneIds: null },
];

describe("recipients: a role or people → members of the site", () => {
  it("sends a role notice to members with that role", () => {
    expect(resolveRecipients({ recipient: "role:manager", kind: "call", zoneId: null, members })).toEqual(["u-man"]);
    expect(resolveRecipients({ recipient: "role:integrator", kind: "other", zoneId: "zone-shop", members })).toEqual(["u-int"]);
  });

  it("gives occupants only notices about their zones (or all, when they see the whole site)", () => {
    expect(resolveRecipients({ recipient: "role:occupant", kind: "visitor", zoneId: "zone-path", members })).toEqual(["u-flat", "u-all"]);
    expect(resolveRecipients({ recipient: "role:occupant", kind: "door", zoneId: "zone-shop", members })).toEqual(["u-shop", "u-all"]);
    // No zone known: only the whole-site occupants.
    expect(resolveRecipients({ recipient: "role:occupant", kind: "other", zoneId: null, members })).toEqual(["u-all"]);
  });

  it("sends emergency notices to every occupant whatever their zones", () => {
    expect(resolveRecipients({ recipient: "role:occupant", kind: "emergency", zoneId: "zone-escape", members })).toEqual(["u-flat", "u-shop", "u-all"]);
  });

  it("finds named people by user id or e-mail (any case), never outside the site", () => {
    expect(resolveRecipients({ recipient: "person:u-shop", kind: "visitor", zoneId: "zone-path", members })).toEqual(["u-shop"]);
    expect(resolveRecipients({ recipient: "person:man@EXAMPLE.invalid", kind: "other", zoneId: null, members })).toEqual(["u-man"]);
    expect(resolveRecipients({ recipient: "person:stranger@example.invalid", kind: "other", zoneId: null, members })).toEqual([]);
    expect(resolveRecipients({ recipient: "nonsense", kind: "other", zoneId: null, members })).toEqual([]);
  });
});

// WET: UTC+0 in winter, UTC+1 in summer (EU Directive 2000/84/EC: last Sunday of March to last Sunday of October).
const winter = (hh: number, mm = 0) => Date.UTC(2026, 0, 15, hh, mm);
const summer = (hh: number, mm = 0) => Date.UTC(2026, 6, 15, hh - 1, mm);

describe("quiet hours on the site's wall clock", () => {
  it("wraps midnight: 22:00–07:00 is quiet at 23:30 and 06:59, not at 07:00 or 21:59", () => {
    expect(isQuietAt(winter(23, 30), "WET", "22:00", "07:00")).toBe(true);
    expect(isQuietAt(winter(6, 59), "WET", "22:00", "07:00")).toBe(true);
    expect(isQuietAt(winter(7, 0), "WET", "22:00", "07:00")).toBe(false);
    expect(isQuietAt(winter(21, 59), "WET", "22:00", "07:00")).toBe(false);
  });

  it("reads the site's time zone, summer time included", () => {
    // 21:30 UTC in July is 22:30 on a WET wall clock.
    expect(isQuietAt(Date.UTC(2026, 6, 15, 21, 30), "WET", "22:00", "07:00")).toBe(true);
    expect(isQuietAt(Date.UTC(2026, 6, 15, 21, 30), "UTC", "22:00", "07:00")).toBe(false);
    expect(isQuietAt(summer(13), "WET", "12:00", "14:00")).toBe(true);
  });

  it("has no quiet hours when either end is missing or both are equal", () => {
    expect(isQuietAt(winter(3), "WET", null, null)).toBe(false);
    expect(isQuietAt(winter(3), "WET", "03:00", "03:00")).toBe(false);
  });
});

describe("per-person channel plan", () => {
  const base = { timeZone: "WET", now: winter(23) };
  it("follows the rule's channels by default", () => {
    expect(planChannels({ ...base, kind: "visitor", channels: ["push", "in-app"], prefs: DEFAULT_PREFS })).toEqual([
      { channel: "push", status: "pending", reason: null },
      { channel: "in-app", status: "pending", reason: null },
    ]);
  });

  it("holds back push in quiet hours but keeps the inbox and e-mail", () => {
    const prefs = { ...DEFAULT_PREFS, quietFrom: "22:00", quietTo: "07:00" };
    expect(planChannels({ ...base, kind: "visitor", channels: ["push", "in-app", "email"], prefs }).map((p) => [p.channel, p.status, p.reason])).toEqual([
      ["push", "skipped", "quiet hours 22:00–07:00"],
      ["in-app", "pending", null],
      ["email", "pending", null],
    ]);
    // Emergencies come through quiet hours.
    expect(planChannels({ ...base, kind: "emergency", channels: ["push"], prefs })[0].status).toBe("pending");
  });

  it("skips kinds and channels the person turned off, except emergencies in the inbox", () => {
    const prefs = { ...DEFAULT_PREFS, kinds: ["call" as const], channels: ["push" as const] };
    expect(planChannels({ ...base, kind: "visitor", channels: ["push", "in-app"], prefs }).map((p) => p.reason)).toEqual(["visitor notices are turned off", "visitor notices are turned off"]);
    expect(planChannels({ ...base, kind: "call", channels: ["push", "in-app"], prefs }).map((p) => p.status)).toEqual(["pending", "skipped"]);
    expect(planChannels({ ...base, kind: "emergency", channels: ["push", "in-app", "email"], prefs }).map((p) => p.status)).toEqual(["pending", "pending", "skipped"]);
  });
});

describe("retries and the rate limit (this project's numbers, no source)", () => {
  it("waits 10 s, 30 s, 2 min, 10 min, 30 min, then gives up after the 6th failure", () => {
    expect(BACKOFF_MS).toEqual([10_000, 30_000, 120_000, 600_000, 1_800_000]);
    expect([1, 2, 3, 4, 5].map((n) => nextAttemptAt(n, 0))).toEqual([10_000, 30_000, 120_000, 600_000, 1_800_000]);
    expect(MAX_ATTEMPTS).toBe(6);
    expect(nextAttemptAt(6, 0)).toBeNull();
  });

  it("lets 3 messages a minute through and says when the window has room again", () => {
    expect(RATE_LIMIT).toEqual({ windowMs: 60_000, maxPerWindow: 3 });
    expect(rateDecision([], 100_000)).toEqual({ isAllowed: true });
    expect(rateDecision([50_000, 60_000], 100_000)).toEqual({ isAllowed: true });
    expect(rateDecision([50_000, 60_000, 70_000], 100_000)).toEqual({ isAllowed: false, retryAt: 110_000 });
    // Older than a minute does not count.
    expect(rateDecision([30_000, 60_000, 70_000], 100_000)).toEqual({ isAllowed: true });
  });
});

describe("message texts", () => {
  it("says how many notices a collapsed message stands for", () => {
    expect(countedText("Motion on the path.", 1)).toBe("Motion on the path.");
    expect(countedText("Motion on the path.", 50)).toBe("Motion on the path. (+49 more like it)");
    const p = pushPayload({ siteName: "Larch Lane Studio", kind: "visitor", text: "Someone is on the front path (18:00).", url: "/sites/larch-lane", count: 1, at: 0, tag: "notice-1" });
    expect(p).toMatchObject({ title: "Visitor · Larch Lane Studio", body: "Someone is on the front path (18:00).", url: "/sites/larch-lane" });
    // RFC 8291 §4: the whole push body stays within 4096 octets; a payload this size leaves plenty of room.
    expect(Buffer.byteLength(JSON.stringify(pushPayload({ siteName: "x".repeat(120), kind: "other", text: "y".repeat(500), url: "/z", count: 99, at: 0, tag: "t" })))).toBeLessThan(4096 - 86 - 17);
  });

  it("writes an e-mail with the link and where to change settings", () => {
    const mail = noticeEmail({ siteName: "Larch Lane Studio", kind: "call", text: "Someone is waiting at the counter (10:15).", link: "http://localhost:3000/sites/larch-lane", settingsLink: "http://localhost:3000/account#notices", count: 1 });
    expect(mail.subject).toBe("Call button at Larch Lane Studio: Someone is waiting at the counter (10:15).");
    expect(mail.text).toContain("http://localhost:3000/sites/larch-lane");
    expect(mail.text).toContain("http://localhost:3000/account#notices");
  });
});

describe("the page a notice opens", () => {
  it("keeps the link when the role may open it, else falls back to the site overview", () => {
    expect(linkForRole("/sites/larch-lane/bench", "larch-lane", "manager")).toBe("/sites/larch-lane/bench");
    // Occupants cannot open the Test bench (lib/auth/permissions.ts: bench.use).
    expect(linkForRole("/sites/larch-lane/bench", "larch-lane", "occupant")).toBe("/sites/larch-lane");
    expect(linkForRole("/sites/larch-lane", "larch-lane", "occupant")).toBe("/sites/larch-lane");
    expect(linkForRole("/sites/larch-lane/keys?x=1", "larch-lane", "manager")).toBe("/sites/larch-lane");
    expect(linkForRole(null, "larch-lane", "occupant")).toBe("/inbox");
    expect(linkForRole("/sites/larch-lane/bench", "larch-lane", null)).toBe("/inbox");
  });
});
