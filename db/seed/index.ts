import { readFile } from "node:fs/promises";
import path from "node:path";
import { randomUUID } from "node:crypto";
import { eq, inArray } from "drizzle-orm";
import { hashPassword } from "../../lib/auth/password";
import { randomStoredName, sniffImage } from "../../lib/uploads/image";
import type { Database } from "../client";
import { removeUploadFile, saveUploadFile } from "../files";
import { compileGraph } from "../../lib/rules/compile";
import { demoRuleGraph } from "../../lib/rules/demo-graph";
import { devices, floors, memberships, ruleSetActivations, ruleSets, ruleSetVersions, scenes, sites, uploads, users, zones } from "../schema";
import { seedBenchScenarios } from "./bench-scenarios";
import { demoDevices, demoFloors, demoScenes, demoSite, demoZones } from "./demo-site";
import { DEMO_PASSWORD, demoUsers } from "./demo-users";

export type SeedReport = { sites: number; zones: number; devices: number; users: number };

const PLANS_DIR = path.join(process.cwd(), "db", "seed", "plans");

/** Reads and checks the committed plan images before the transaction, so a bad file stops the seed early. */
async function loadPlans() {
  return Promise.all(
    demoFloors.map(async (f) => {
      const bytes = new Uint8Array(await readFile(path.join(PLANS_DIR, f.planFile)));
      const sniffed = sniffImage(bytes);
      if (!sniffed.ok) throw new Error(`demo plan ${f.planFile}: ${sniffed.message}`);
      return { floor: f, bytes, width: sniffed.width, height: sniffed.height, storedName: randomStoredName(sniffed.type) };
    }),
  );
}

/**
 * Inserts the demo site, its plans, scenes and demo sign-ins. Idempotent: rows
 * that already exist (by id) are left as they are, so seeding again never
 * duplicates or overwrites a user's edits.
 */
export async function seedDemo(db: Database, options: { withUsers?: boolean } = {}): Promise<SeedReport> {
  const withUsers = options.withUsers ?? true;
  const passwordHash = withUsers ? await hashPassword(DEMO_PASSWORD) : "";
  const existingFloors = new Set(
    (await db.select({ id: floors.id }).from(floors).where(inArray(floors.id, demoFloors.map((f) => f.id)))).map((r) => r.id),
  );
  const plans = (await loadPlans()).filter((p) => !existingFloors.has(p.floor.id));
  for (const p of plans) await saveUploadFile(p.storedName, p.bytes);
  try {
    return await db.transaction(async (tx) => {
      const s = await tx.insert(sites).values(demoSite).onConflictDoNothing().returning({ id: sites.id });
      const z = await tx.insert(zones).values(demoZones).onConflictDoNothing().returning({ id: zones.id });
      for (const p of plans) {
        const uploadId = randomUUID();
        await tx.insert(uploads).values({ id: uploadId, siteId: demoSite.id, storedName: p.storedName, mimeType: "image/png", byteSize: p.bytes.byteLength, width: p.width, height: p.height, originalName: p.floor.planFile });
        await tx.insert(floors).values({ id: p.floor.id, siteId: demoSite.id, name: p.floor.name, sortOrder: p.floor.sortOrder, planUploadId: uploadId, pixelsPerMetre: p.floor.pixelsPerMetre });
      }
      const d = await tx.insert(devices).values(demoDevices).onConflictDoNothing().returning({ id: devices.id });
      await tx.insert(scenes).values(demoScenes).onConflictDoNothing();
      // The demo Rule set: the draft and version 1, active. Only when the site has no rules yet.
      const [hasRules] = await tx.insert(ruleSets).values({ siteId: demoSite.id, draftGraph: demoRuleGraph, draftRevision: 1 }).onConflictDoNothing().returning({ siteId: ruleSets.siteId });
      if (hasRules) {
        const versionId = `${demoSite.id}-rules-v1`;
        await tx.insert(ruleSetVersions).values({ id: versionId, siteId: demoSite.id, number: 1, graph: demoRuleGraph, rules: compileGraph(demoRuleGraph) }).onConflictDoNothing();
        await tx.update(ruleSets).set({ activeVersionId: versionId }).where(eq(ruleSets.siteId, demoSite.id));
        // Its activation, so the version history says when it went live (by the seed: no person).
        await tx.insert(ruleSetActivations).values({ siteId: demoSite.id, versionId, activatedBy: null });
      }
      await seedBenchScenarios(tx);
      let u: { id: string }[] = [];
      if (withUsers) {
        u = await tx
          .insert(users)
          .values(demoUsers.map(({ id, email, name }) => ({ id, email, name, passwordHash })))
          .onConflictDoNothing()
          .returning({ id: users.id });
        const added = new Set(u.map((r) => r.id));
        const newMemberships = demoUsers.filter((x) => added.has(x.id)).map((x) => ({ siteId: demoSite.id, userId: x.id, role: x.role, zoneIds: x.zoneIds }));
        if (newMemberships.length) await tx.insert(memberships).values(newMemberships).onConflictDoNothing();
      }
      return { sites: s.length, zones: z.length, devices: d.length, users: u.length };
    });
  } catch (err) {
    for (const p of plans) await removeUploadFile(p.storedName);
    throw err;
  }
}
