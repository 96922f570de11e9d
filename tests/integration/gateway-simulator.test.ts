import { eq } from "drizzle-orm";
import { beforeAll, describe, expect, it } from "vitest";
import { POST as postEvents } from "@/app/api/v1/sites/[siteId]/events/route";
import { getDb } from "@/db";
import { listApiKeys, verifyApiKey } from "@/db/queries/api-keys";
import { DEMO_SITE_ID } from "@/db/seed/demo-site";
import { engineStates, gatewayCommands, noticesOutbox } from "@/db/schema";
import type { EngineState, GatewayCommand } from "@/lib/bus/types";
import { batchesOf, buildDay, mintKeyInDatabase, parseSimulatorArgs, runSimulator } from "@/workers/gateway-simulator";
import { params, seedDemoSite } from "./helpers";

const day = { year: 2026, month: 6, day: 20 };
let key = "";

/** The simulator's fetch, answered by the real route handler instead of a server on a port. */
const viaRoute: typeof fetch = async (input, init) => postEvents(new Request(input as string, init), params({ siteId: DEMO_SITE_ID }));

beforeAll(async () => {
  await seedDemoSite();
});

describe("gateway simulator", () => {
  it("mints a key in the database that the app's own check accepts (same format and hashing as db/queries/api-keys.ts)", async () => {
    const minted = await mintKeyInDatabase({ url: process.env.DATABASE_URL!, siteId: DEMO_SITE_ID, name: "Gateway simulator" });
    key = minted.key;
    expect(minted.timeZone).toBe("WET");
    expect(key).toMatch(/^jpk_[A-Za-z0-9_-]{43}$/);
    const verified = await verifyApiKey({ key, siteId: DEMO_SITE_ID });
    expect(await verifyApiKey({ key, siteId: "another-site" })).toBeNull();
    expect(verified?.siteId).toBe(DEMO_SITE_ID);
    const row = (await listApiKeys({ siteId: DEMO_SITE_ID })).find((k) => k.id === verified!.keyId)!;
    expect(row).toMatchObject({ name: "Gateway simulator", prefix: key.slice(0, 10), revokedAt: null });
    await expect(mintKeyInDatabase({ url: process.env.DATABASE_URL!, siteId: "nowhere", name: "x" })).rejects.toThrow(/No site "nowhere"/);
  });

  it("takes only loopback URLs, a well-formed key and a bounded speed", () => {
    expect(parseSimulatorArgs([])).toEqual({ url: "http://localhost:3000", siteId: "larch-lane", key: null, speed: 0, day: null });
    expect(parseSimulatorArgs(["--url", "http://127.0.0.1:4000/", "--speed", "0", "--day", "2026-06-20"])).toMatchObject({ url: "http://127.0.0.1:4000", speed: 0, day });
    expect(() => parseSimulatorArgs(["--url", "http://example.org"])).toThrow(/loopback/);
    expect(() => parseSimulatorArgs(["--url", "http://10.0.0.5:3000"])).toThrow(/loopback/);
    expect(() => parseSimulatorArgs(["--key", "jpk_short"])).toThrow(/43 more characters/);
    expect(() => parseSimulatorArgs(["--speed", "5"])).toThrow(/--speed/);
    expect(() => parseSimulatorArgs(["--day", "2026-02-30"])).toThrow(/real date/);
    expect(() => parseSimulatorArgs(["--bogus"])).toThrow();
  });

  it("builds the same day every time, in batches of one half hour, within the day", () => {
    const a = buildDay({ siteId: DEMO_SITE_ID, day, timeZone: "WET" });
    expect(buildDay({ siteId: DEMO_SITE_ID, day, timeZone: "WET" })).toEqual(a);
    expect(buildDay({ siteId: DEMO_SITE_ID, day: { ...day, day: 21 }, timeZone: "WET" }).map((e) => e.value)).not.toEqual(a.map((e) => e.value));
    expect(new Set(a.map((e) => e.id)).size).toBe(a.length);
    // 2026-06-20 in WET (summer time, UTC+1): 2026-06-19T23:00Z to 2026-06-20T23:00Z.
    for (const e of a) expect(e.at >= Date.UTC(2026, 5, 19, 23) && e.at < Date.UTC(2026, 5, 20, 23)).toBe(true);
    const batches = batchesOf(a);
    expect(batches.flatMap((b) => b.events)).toEqual(a);
    for (const b of batches) {
      expect(b.to - b.from).toBe(30 * 60_000);
      for (const e of b.events) expect(e.at >= b.from && e.at < b.to).toBe(true);
    }
  });

  it("posts the day through the gateway API: every event accepted, and the rules respond as the demo Rule set says", async () => {
    const lines: string[] = [];
    const events = buildDay({ siteId: DEMO_SITE_ID, day, timeZone: "WET" });
    const summary = await runSimulator({ url: "http://localhost:3000", siteId: DEMO_SITE_ID, key, speed: 0, day, timeZone: "WET" }, { fetch: viaRoute, log: (l) => lines.push(l), sleep: async () => undefined });
    expect(summary).toMatchObject({ events: events.length, accepted: events.length, duplicates: 0, rejected: 0, failed: 0 });
    // Speed 0 sends the whole day as one batch, so the timer worker cannot step in between.
    expect(summary.batches).toBe(1);
    expect(lines).toHaveLength(summary.batches);
    expect(lines[0]).toMatch(/^0\d:\d\d–23:\d\d +251 events +accepted 251, duplicates 0, rejected 0, commands \d+$/);

    const commands = (await getDb().select().from(gatewayCommands).where(eq(gatewayCommands.siteId, DEMO_SITE_ID))).map((r) => r.command as GatewayCommand);
    expect(commands.length).toBe(summary.commands);
    // The workshop fan relay (0x000F): Generic OnOff Set Unacknowledged is 0x82 0x03 (Mesh Model 1.0.1 Table 7.1), On = 0x01.
    // The first reading (19 °C) already counts as "below 26 °C" (lib/bus/derive.ts crosses), so the day starts with an Off.
    const fan = commands.filter((c) => c.destination === 0x000f);
    expect(fan.map((c) => c.bytes.slice(0, 8))).toEqual(["82 03 00", "82 03 01", "82 03 00"]);
    const localHour = (ms: number) => new Date(ms + 3600_000).toISOString().slice(11, 16);
    expect(localHour(fan[0].at)).toBe("07:00");
    // On once past 28 °C in the early afternoon, off once below 26 °C in the late afternoon.
    expect(localHour(fan[1].at) >= "13:00" && localHour(fan[1].at) <= "15:00").toBe(true);
    expect(localHour(fan[2].at) >= "16:00" && localHour(fan[2].at) <= "18:00").toBe(true);
    // The path group 0xC004 lit for the visitor (Light Lightness Set Unacknowledged, 0x82 0x4D).
    expect(commands.some((c) => c.destination === 0xc004 && c.bytes.startsWith("82 4D FF FF"))).toBe(true);

    const notices = (await getDb().select().from(noticesOutbox).where(eq(noticesOutbox.siteId, DEMO_SITE_ID))).map((n) => [n.recipient, n.text]);
    expect(notices).toEqual(
      expect.arrayContaining([
        ["role:manager", "Someone is waiting at the counter (11:47)."],
        ["role:occupant", "The back door has been open for 10 minutes (18:12)."],
        ["role:occupant", "Someone is on the front path (22:10)."],
      ]),
    );
    const [state] = await getDb().select().from(engineStates).where(eq(engineStates.siteId, DEMO_SITE_ID));
    expect((state.state as EngineState).mode).toBe("closed");
  });

  it("a second run of the same day is all duplicates and sends nothing", async () => {
    const summary = await runSimulator({ url: "http://localhost:3000", siteId: DEMO_SITE_ID, key, speed: 0, day, timeZone: "WET" }, { fetch: viaRoute, log: () => undefined, sleep: async () => undefined });
    expect(summary).toMatchObject({ accepted: 0, rejected: 0, commands: 0, failed: 0 });
    expect(summary.duplicates).toBe(summary.events);
  });

  it("stops at once when the key is refused, and paces batches by --speed", async () => {
    const waits: number[] = [];
    await expect(
      runSimulator({ url: "http://localhost:3000", siteId: DEMO_SITE_ID, key: `jpk_${"B".repeat(43)}`, speed: 600, day, timeZone: "WET" }, { fetch: viaRoute, log: () => undefined, sleep: async (ms) => void waits.push(ms) }),
    ).rejects.toThrow(/401/);
    // The first batch goes at once.
    expect(waits).toEqual([0]);

    const paced: number[] = [];
    await runSimulator({ url: "http://localhost:3000", siteId: DEMO_SITE_ID, key, speed: 600, day, timeZone: "WET" }, { fetch: viaRoute, log: () => undefined, sleep: async (ms) => void paced.push(ms) });
    // Half an hour at 600× is 3 s; a gap of empty half hours waits for all of them.
    expect(paced[0]).toBe(0);
    expect(paced.slice(1).every((ms) => ms >= 3000 && ms % 3000 === 0)).toBe(true);
  });
});
