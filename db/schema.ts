import { relations } from "drizzle-orm";
import { integer, real, sqliteTable, text, uniqueIndex, index, primaryKey } from "drizzle-orm/sqlite-core";
import { DEVICE_KINDS } from "../lib/catalogue/device-kinds";
import { ROLES } from "../lib/auth/roles";

const createdAt = () =>
  integer("created_at", { mode: "timestamp_ms" })
    .notNull()
    .$defaultFn(() => new Date());

export const sites = sqliteTable("sites", {
  id: text("id").primaryKey(),
  name: text("name").notNull(),
  address: text("address").notNull().default(""),
  /** IANA time zone, e.g. "Europe/Paris"; rules and sun times use it. */
  timeZone: text("time_zone").notNull(),
  latitude: real("latitude").notNull(),
  longitude: real("longitude").notNull(),
  createdAt: createdAt(),
});

export const zones = sqliteTable(
  "zones",
  {
    id: text("id").primaryKey(),
    siteId: text("site_id")
      .notNull()
      .references(() => sites.id, { onDelete: "cascade" }),
    name: text("name").notNull(),
    /** Mesh group address for the zone, 0xC000–0xFEFF (Mesh Profile §3.4.2). */
    groupAddress: integer("group_address").notNull(),
    sortOrder: integer("sort_order").notNull().default(0),
    createdAt: createdAt(),
  },
  (t) => [uniqueIndex("zones_site_group_address").on(t.siteId, t.groupAddress), uniqueIndex("zones_site_name").on(t.siteId, t.name)],
);

export const devices = sqliteTable(
  "devices",
  {
    id: text("id").primaryKey(),
    siteId: text("site_id")
      .notNull()
      .references(() => sites.id, { onDelete: "cascade" }),
    zoneId: text("zone_id").references(() => zones.id, { onDelete: "set null" }),
    name: text("name").notNull(),
    kind: text("kind", { enum: DEVICE_KINDS }).notNull(),
    /** First element's unicast address, 0x0001–0x7FFF (Mesh Profile §3.4.2). */
    unicastAddress: integer("unicast_address").notNull(),
    /** Number of elements; the device owns unicastAddress … unicastAddress + elementCount − 1. */
    elementCount: integer("element_count").notNull().default(1),
    floorId: text("floor_id").references(() => floors.id, { onDelete: "set null" }),
    /** Position on the floor plan in metres from the plan's top-left corner. */
    x: real("x"),
    y: real("y"),
    /** Kind-specific settings (buttons, energy profile …) as JSON, parsed by lib/catalogue/profiles. */
    profile: text("profile", { mode: "json" }).$type<Record<string, unknown>>().notNull().default({}),
    createdAt: createdAt(),
  },
  (t) => [
    uniqueIndex("devices_site_unicast").on(t.siteId, t.unicastAddress),
    uniqueIndex("devices_site_name").on(t.siteId, t.name),
    index("devices_site_zone").on(t.siteId, t.zoneId),
  ],
);

/** Uploaded files (floor plans). Stored on disk under a random name; served only to members. */
export const uploads = sqliteTable("uploads", {
  id: text("id").primaryKey(),
  siteId: text("site_id")
    .notNull()
    .references(() => sites.id, { onDelete: "cascade" }),
  storedName: text("stored_name").notNull().unique(),
  mimeType: text("mime_type").notNull(),
  byteSize: integer("byte_size").notNull(),
  width: integer("width").notNull(),
  height: integer("height").notNull(),
  originalName: text("original_name").notNull().default(""),
  createdAt: createdAt(),
});

export const floors = sqliteTable(
  "floors",
  {
    id: text("id").primaryKey(),
    siteId: text("site_id")
      .notNull()
      .references(() => sites.id, { onDelete: "cascade" }),
    name: text("name").notNull(),
    sortOrder: integer("sort_order").notNull().default(0),
    planUploadId: text("plan_upload_id").references(() => uploads.id, { onDelete: "set null" }),
    /** Plan scale, set from two points and the distance between them; null until set. */
    pixelsPerMetre: real("pixels_per_metre"),
    createdAt: createdAt(),
  },
  (t) => [uniqueIndex("floors_site_name").on(t.siteId, t.name)],
);

export type SceneLevel = { zoneId?: string; deviceId?: string; level: number };

export const scenes = sqliteTable(
  "scenes",
  {
    id: text("id").primaryKey(),
    siteId: text("site_id")
      .notNull()
      .references(() => sites.id, { onDelete: "cascade" }),
    /** Mesh scene number 1–65535 (0 is prohibited, Mesh Model §5.1.3.1). */
    number: integer("number").notNull(),
    name: text("name").notNull(),
    fadeMs: integer("fade_ms").notNull().default(0),
    isOccupantRecallable: integer("is_occupant_recallable", { mode: "boolean" }).notNull().default(false),
    /** Levels in percent per zone or per luminaire; a luminaire entry overrides its zone's. */
    levels: text("levels", { mode: "json" }).$type<SceneLevel[]>().notNull().default([]),
    createdAt: createdAt(),
    updatedAt: integer("updated_at", { mode: "timestamp_ms" })
      .notNull()
      .$defaultFn(() => new Date()),
  },
  (t) => [uniqueIndex("scenes_site_number").on(t.siteId, t.number), uniqueIndex("scenes_site_name").on(t.siteId, t.name)],
);

/** One Rule set per site: the draft being edited, and which numbered version is live. */
export const ruleSets = sqliteTable("rule_sets", {
  siteId: text("site_id")
    .primaryKey()
    .references(() => sites.id, { onDelete: "cascade" }),
  /** The Canvas graph (lib/rules/graph.ts). */
  draftGraph: text("draft_graph", { mode: "json" }).$type<unknown>().notNull(),
  /** Bumped on every draft save, for optimistic concurrency. */
  draftRevision: integer("draft_revision").notNull().default(1),
  activeVersionId: text("active_version_id"),
  updatedAt: integer("updated_at", { mode: "timestamp_ms" })
    .notNull()
    .$defaultFn(() => new Date()),
  updatedBy: text("updated_by").references(() => users.id, { onDelete: "set null" }),
});

export const ruleSetVersions = sqliteTable(
  "rule_set_versions",
  {
    id: text("id").primaryKey(),
    siteId: text("site_id")
      .notNull()
      .references(() => sites.id, { onDelete: "cascade" }),
    number: integer("number").notNull(),
    graph: text("graph", { mode: "json" }).$type<unknown>().notNull(),
    /** json-rules-engine rule JSON compiled from the graph: the stored, reference form. */
    rules: text("rules", { mode: "json" }).$type<unknown[]>().notNull(),
    createdAt: createdAt(),
    createdBy: text("created_by").references(() => users.id, { onDelete: "set null" }),
  },
  (t) => [uniqueIndex("rule_set_versions_site_number").on(t.siteId, t.number)],
);

/** The append-only Event log. `seq` orders it; (site, event id) makes ingest idempotent. */
export const events = sqliteTable(
  "events",
  {
    seq: integer("seq").primaryKey({ autoIncrement: true }),
    siteId: text("site_id")
      .notNull()
      .references(() => sites.id, { onDelete: "cascade" }),
    eventId: text("event_id").notNull(),
    at: integer("at").notNull(),
    device: text("device").notNull(),
    kind: text("kind").notNull(),
    value: text("value", { mode: "json" }).$type<number | boolean | string | null>(),
    source: text("source", { enum: ["gateway", "bench", "import", "console"] }).notNull(),
    receivedAt: integer("received_at").notNull(),
  },
  (t) => [uniqueIndex("events_site_event").on(t.siteId, t.eventId), index("events_site_at").on(t.siteId, t.at)],
);

/** What the engine did for one event or one timer run: changes, commands, notices and the Trace. */
export const engineSteps = sqliteTable(
  "engine_steps",
  {
    seq: integer("seq").primaryKey({ autoIncrement: true }),
    siteId: text("site_id")
      .notNull()
      .references(() => sites.id, { onDelete: "cascade" }),
    eventSeq: integer("event_seq").references(() => events.seq, { onDelete: "cascade" }),
    at: integer("at").notNull(),
    versionId: text("version_id"),
    output: text("output", { mode: "json" }).$type<unknown>().notNull(),
  },
  (t) => [index("engine_steps_site_seq").on(t.siteId, t.seq), index("engine_steps_event").on(t.eventSeq)],
);

/** Commands for the gateway, numbered so a polling gateway asks for those after the last it has. */
export const gatewayCommands = sqliteTable(
  "gateway_commands",
  {
    seq: integer("seq").primaryKey({ autoIncrement: true }),
    siteId: text("site_id")
      .notNull()
      .references(() => sites.id, { onDelete: "cascade" }),
    stepSeq: integer("step_seq").notNull(),
    at: integer("at").notNull(),
    command: text("command", { mode: "json" }).$type<unknown>().notNull(),
  },
  (t) => [index("gateway_commands_site_seq").on(t.siteId, t.seq)],
);

/** The live engine's state per site (levels, overrides, timers …) and the lease a worker holds to fire timers. */
export const engineStates = sqliteTable("engine_states", {
  siteId: text("site_id")
    .primaryKey()
    .references(() => sites.id, { onDelete: "cascade" }),
  state: text("state", { mode: "json" }).$type<unknown>().notNull(),
  versionId: text("version_id"),
  /** Bumped on every write: a writer that read an older revision retries. */
  revision: integer("revision").notNull().default(0),
  /** Earliest timer due, for the worker's query; null when none. */
  nextTimerAt: integer("next_timer_at"),
  leaseOwner: text("lease_owner"),
  leaseUntil: integer("lease_until"),
  updatedAt: integer("updated_at").notNull(),
});

/** Notices waiting for delivery; the dedupe key keeps one notice per event, rule and recipient. */
export const noticesOutbox = sqliteTable(
  "notices_outbox",
  {
    id: integer("id").primaryKey({ autoIncrement: true }),
    siteId: text("site_id")
      .notNull()
      .references(() => sites.id, { onDelete: "cascade" }),
    dedupeKey: text("dedupe_key").notNull(),
    recipient: text("recipient").notNull(),
    channels: text("channels", { mode: "json" }).$type<string[]>().notNull(),
    text: text("text").notNull(),
    at: integer("at").notNull(),
    status: text("status", { enum: ["pending", "handed-on", "delivered", "failed"] }).notNull().default("pending"),
    /** What the notice is about, for people's preferences ("visitor", "call", "door", "emergency", "energy", "care", "other"). */
    kind: text("kind").notNull().default("other"),
    /** The console page a click on the notice opens. */
    url: text("url"),
    /** The zone of the device whose event or timer set the notice off: occupants of other zones are spared it. */
    zoneId: text("zone_id").references(() => zones.id, { onDelete: "set null" }),
    leaseOwner: text("lease_owner"),
    leaseUntil: integer("lease_until"),
    createdAt: createdAt(),
  },
  (t) => [uniqueIndex("notices_outbox_site_dedupe").on(t.siteId, t.dedupeKey), index("notices_outbox_status").on(t.status)],
);

/** Gateway keys: shown once, stored as SHA-256; revoked keys stay for the record. */
export const apiKeys = sqliteTable(
  "api_keys",
  {
    id: text("id").primaryKey(),
    siteId: text("site_id")
      .notNull()
      .references(() => sites.id, { onDelete: "cascade" }),
    name: text("name").notNull(),
    /** The first characters of the key, to recognise it in the list. */
    prefix: text("prefix").notNull(),
    keyHash: text("key_hash").notNull().unique(),
    createdAt: createdAt(),
    createdBy: text("created_by").references(() => users.id, { onDelete: "set null" }),
    lastUsedAt: integer("last_used_at", { mode: "timestamp_ms" }),
    revokedAt: integer("revoked_at", { mode: "timestamp_ms" }),
  },
  (t) => [index("api_keys_site").on(t.siteId)],
);

export const users = sqliteTable("users", {
  id: text("id").primaryKey(),
  /** Stored lower-case; unique. */
  email: text("email").notNull().unique(),
  name: text("name").notNull(),
  /** Argon2id PHC string ($argon2id$v=19$m=…,t=…,p=…$salt$hash). */
  passwordHash: text("password_hash").notNull(),
  createdAt: createdAt(),
});

/** lucia's session table: expires_at in Unix seconds, as its SQLite adapter expects. */
export const sessions = sqliteTable("sessions", {
  id: text("id").primaryKey(),
  userId: text("user_id")
    .notNull()
    .references(() => users.id, { onDelete: "cascade" }),
  expiresAt: integer("expires_at").notNull(),
});

export const memberships = sqliteTable(
  "memberships",
  {
    siteId: text("site_id")
      .notNull()
      .references(() => sites.id, { onDelete: "cascade" }),
    userId: text("user_id")
      .notNull()
      .references(() => users.id, { onDelete: "cascade" }),
    role: text("role", { enum: ROLES }).notNull(),
    /** For occupants: the zones they see and may recall scenes in; null means the whole site. */
    zoneIds: text("zone_ids", { mode: "json" }).$type<string[] | null>(),
    createdAt: createdAt(),
  },
  (t) => [primaryKey({ columns: [t.siteId, t.userId] }), index("memberships_user").on(t.userId)],
);

export const invites = sqliteTable(
  "invites",
  {
    id: text("id").primaryKey(),
    siteId: text("site_id")
      .notNull()
      .references(() => sites.id, { onDelete: "cascade" }),
    email: text("email").notNull(),
    role: text("role", { enum: ROLES }).notNull(),
    zoneIds: text("zone_ids", { mode: "json" }).$type<string[] | null>(),
    /** SHA-256 of the token in the link; the token itself is never stored. */
    tokenHash: text("token_hash").notNull().unique(),
    invitedBy: text("invited_by").references(() => users.id, { onDelete: "set null" }),
    expiresAt: integer("expires_at", { mode: "timestamp_ms" }).notNull(),
    acceptedAt: integer("accepted_at", { mode: "timestamp_ms" }),
    revokedAt: integer("revoked_at", { mode: "timestamp_ms" }),
    lastSentAt: integer("last_sent_at", { mode: "timestamp_ms" }).notNull(),
    createdAt: createdAt(),
  },
  (t) => [index("invites_site").on(t.siteId)],
);

export const passwordResets = sqliteTable("password_resets", {
  id: text("id").primaryKey(),
  userId: text("user_id")
    .notNull()
    .references(() => users.id, { onDelete: "cascade" }),
  tokenHash: text("token_hash").notNull().unique(),
  expiresAt: integer("expires_at", { mode: "timestamp_ms" }).notNull(),
  usedAt: integer("used_at", { mode: "timestamp_ms" }),
  createdAt: createdAt(),
});

/** Failed sign-ins, keyed "account:<email>" or "client:<address>", for throttling. */
export const signInFailures = sqliteTable(
  "sign_in_failures",
  {
    id: integer("id").primaryKey({ autoIncrement: true }),
    key: text("key").notNull(),
    at: integer("at", { mode: "timestamp_ms" }).notNull(),
  },
  (t) => [index("sign_in_failures_key_at").on(t.key, t.at)],
);

/** Who activated which version when: activating an earlier version is a rollback and gets a row too. */
export const ruleSetActivations = sqliteTable(
  "rule_set_activations",
  {
    id: integer("id").primaryKey({ autoIncrement: true }),
    siteId: text("site_id")
      .notNull()
      .references(() => sites.id, { onDelete: "cascade" }),
    versionId: text("version_id")
      .notNull()
      .references(() => ruleSetVersions.id, { onDelete: "cascade" }),
    activatedBy: text("activated_by").references(() => users.id, { onDelete: "set null" }),
    activatedAt: createdAt(),
  },
  (t) => [index("rule_set_activations_site").on(t.siteId, t.id)],
);

/** A person's Test bench: a sandbox copy of the site state run against the active rules or the draft. */
export const benchSessions = sqliteTable(
  "bench_sessions",
  {
    id: text("id").primaryKey(),
    siteId: text("site_id")
      .notNull()
      .references(() => sites.id, { onDelete: "cascade" }),
    userId: text("user_id")
      .notNull()
      .references(() => users.id, { onDelete: "cascade" }),
    source: text("source", { enum: ["active", "draft"] }).notNull(),
    /** The version run when source is "active"; the draft revision loaded when "draft". */
    versionId: text("version_id"),
    draftRevision: integer("draft_revision"),
    /** EngineState (lib/bus/types.ts) of the sandbox. */
    state: text("state", { mode: "json" }).$type<unknown>().notNull(),
    createdAt: createdAt(),
    updatedAt: integer("updated_at", { mode: "timestamp_ms" })
      .notNull()
      .$defaultFn(() => new Date()),
  },
  (t) => [uniqueIndex("bench_sessions_site_user").on(t.siteId, t.userId)],
);

/** What the bench did: the action a person took and the engine Step it produced. */
export const benchSteps = sqliteTable(
  "bench_steps",
  {
    seq: integer("seq").primaryKey({ autoIncrement: true }),
    sessionId: text("session_id")
      .notNull()
      .references(() => benchSessions.id, { onDelete: "cascade" }),
    at: integer("at").notNull(),
    input: text("input", { mode: "json" }).$type<unknown>().notNull(),
    output: text("output", { mode: "json" }).$type<unknown>().notNull(),
  },
  (t) => [index("bench_steps_session").on(t.sessionId, t.seq)],
);

/** A named, replayable sequence of bench actions. */
export const benchScenarios = sqliteTable(
  "bench_scenarios",
  {
    id: text("id").primaryKey(),
    siteId: text("site_id")
      .notNull()
      .references(() => sites.id, { onDelete: "cascade" }),
    name: text("name").notNull(),
    steps: text("steps", { mode: "json" }).$type<unknown[]>().notNull(),
    createdBy: text("created_by").references(() => users.id, { onDelete: "set null" }),
    createdAt: createdAt(),
    updatedAt: integer("updated_at", { mode: "timestamp_ms" })
      .notNull()
      .$defaultFn(() => new Date()),
  },
  (t) => [uniqueIndex("bench_scenarios_site_name").on(t.siteId, t.name)],
);

/** A Replay (or a Compare of two) run off the request thread, with progress and cancel. */
export const replayJobs = sqliteTable(
  "replay_jobs",
  {
    id: text("id").primaryKey(),
    siteId: text("site_id")
      .notNull()
      .references(() => sites.id, { onDelete: "cascade" }),
    createdBy: text("created_by").references(() => users.id, { onDelete: "set null" }),
    status: text("status", { enum: ["queued", "running", "done", "failed", "cancelled"] }).notNull().default("queued"),
    /** Window, rule set(s) to run, filters (lib/validation). */
    params: text("params", { mode: "json" }).$type<unknown>().notNull(),
    processed: integer("processed").notNull().default(0),
    total: integer("total").notNull().default(0),
    cancelRequested: integer("cancel_requested", { mode: "boolean" }).notNull().default(false),
    error: text("error"),
    /** Timeline, level series and differences, sized for a browser (downsampled). */
    result: text("result", { mode: "json" }).$type<unknown>(),
    leaseOwner: text("lease_owner"),
    leaseUntil: integer("lease_until"),
    createdAt: createdAt(),
    startedAt: integer("started_at", { mode: "timestamp_ms" }),
    finishedAt: integer("finished_at", { mode: "timestamp_ms" }),
  },
  (t) => [index("replay_jobs_site").on(t.siteId, t.createdAt), index("replay_jobs_status").on(t.status)],
);

/** Small server-wide secrets and settings generated once (e.g. the VAPID key pair). */
export const appSettings = sqliteTable("app_settings", {
  key: text("key").primaryKey(),
  value: text("value", { mode: "json" }).$type<unknown>().notNull(),
  updatedAt: integer("updated_at", { mode: "timestamp_ms" })
    .notNull()
    .$defaultFn(() => new Date()),
});

/** A browser's push subscription (RFC 8030 endpoint and RFC 8291 keys). */
export const pushSubscriptions = sqliteTable(
  "push_subscriptions",
  {
    id: text("id").primaryKey(),
    userId: text("user_id")
      .notNull()
      .references(() => users.id, { onDelete: "cascade" }),
    endpoint: text("endpoint").notNull().unique(),
    p256dh: text("p256dh").notNull(),
    auth: text("auth").notNull(),
    /** "browser" or "demo" (a subscription taken from the local push service). */
    origin: text("origin", { enum: ["browser", "demo"] }).notNull().default("browser"),
    label: text("label").notNull().default(""),
    createdAt: createdAt(),
    lastSuccessAt: integer("last_success_at", { mode: "timestamp_ms" }),
  },
  (t) => [index("push_subscriptions_user").on(t.userId)],
);

/** A person's notice preferences on one site. */
export const noticePreferences = sqliteTable(
  "notice_preferences",
  {
    siteId: text("site_id")
      .notNull()
      .references(() => sites.id, { onDelete: "cascade" }),
    userId: text("user_id")
      .notNull()
      .references(() => users.id, { onDelete: "cascade" }),
    /** Notice kinds this person wants; null means all. */
    kinds: text("kinds", { mode: "json" }).$type<string[] | null>(),
    channels: text("channels", { mode: "json" }).$type<string[]>().notNull(),
    /** Quiet hours in the site's time zone, "HH:MM"; both null when none. */
    quietFrom: text("quiet_from"),
    quietTo: text("quiet_to"),
    updatedAt: integer("updated_at", { mode: "timestamp_ms" })
      .notNull()
      .$defaultFn(() => new Date()),
  },
  (t) => [primaryKey({ columns: [t.siteId, t.userId] })],
);

/** One outbox notice to one person on one channel: retries, backoff and the outcome. */
export const noticeDeliveries = sqliteTable(
  "notice_deliveries",
  {
    id: integer("id").primaryKey({ autoIncrement: true }),
    outboxId: integer("outbox_id")
      .notNull()
      .references(() => noticesOutbox.id, { onDelete: "cascade" }),
    userId: text("user_id")
      .notNull()
      .references(() => users.id, { onDelete: "cascade" }),
    channel: text("channel", { enum: ["push", "in-app", "email"] }).notNull(),
    status: text("status", { enum: ["pending", "sent", "failed", "skipped", "collapsed"] }).notNull().default("pending"),
    attempts: integer("attempts").notNull().default(0),
    nextAttemptAt: integer("next_attempt_at").notNull(),
    lastError: text("last_error"),
    /** How many notices this one stands for when a burst was collapsed into it. */
    count: integer("count").notNull().default(1),
    leaseOwner: text("lease_owner"),
    leaseUntil: integer("lease_until"),
    sentAt: integer("sent_at"),
    createdAt: createdAt(),
  },
  (t) => [
    uniqueIndex("notice_deliveries_unique").on(t.outboxId, t.userId, t.channel),
    index("notice_deliveries_due").on(t.status, t.nextAttemptAt),
    index("notice_deliveries_user").on(t.userId, t.channel, t.createdAt),
  ],
);

/** The in-app inbox. */
export const inboxItems = sqliteTable(
  "inbox_items",
  {
    id: integer("id").primaryKey({ autoIncrement: true }),
    userId: text("user_id")
      .notNull()
      .references(() => users.id, { onDelete: "cascade" }),
    siteId: text("site_id")
      .notNull()
      .references(() => sites.id, { onDelete: "cascade" }),
    outboxId: integer("outbox_id").references(() => noticesOutbox.id, { onDelete: "set null" }),
    kind: text("kind").notNull(),
    text: text("text").notNull(),
    url: text("url"),
    count: integer("count").notNull().default(1),
    at: integer("at").notNull(),
    readAt: integer("read_at", { mode: "timestamp_ms" }),
    createdAt: createdAt(),
  },
  (t) => [
    uniqueIndex("inbox_items_outbox_user").on(t.outboxId, t.userId),
    index("inbox_items_user").on(t.userId, t.readAt, t.at),
  ],
);

export const sitesRelations = relations(sites, ({ many }) => ({
  zones: many(zones),
  devices: many(devices),
}));

export const zonesRelations = relations(zones, ({ one, many }) => ({
  site: one(sites, { fields: [zones.siteId], references: [sites.id] }),
  devices: many(devices),
}));

export const devicesRelations = relations(devices, ({ one }) => ({
  site: one(sites, { fields: [devices.siteId], references: [sites.id] }),
  zone: one(zones, { fields: [devices.zoneId], references: [zones.id] }),
}));

export type Site = typeof sites.$inferSelect;
export type NewSite = typeof sites.$inferInsert;
export type Zone = typeof zones.$inferSelect;
export type NewZone = typeof zones.$inferInsert;
export type Device = typeof devices.$inferSelect;
export type NewDevice = typeof devices.$inferInsert;
export type User = typeof users.$inferSelect;
export type Membership = typeof memberships.$inferSelect;
export type Invite = typeof invites.$inferSelect;
export type Upload = typeof uploads.$inferSelect;
export type Floor = typeof floors.$inferSelect;
export type Scene = typeof scenes.$inferSelect;
export type RuleSetVersion = typeof ruleSetVersions.$inferSelect;
export type ApiKey = typeof apiKeys.$inferSelect;
export type BenchSession = typeof benchSessions.$inferSelect;
export type BenchScenario = typeof benchScenarios.$inferSelect;
export type ReplayJob = typeof replayJobs.$inferSelect;
export type PushSubscription = typeof pushSubscriptions.$inferSelect;
export type NoticePreference = typeof noticePreferences.$inferSelect;
export type InboxItem = typeof inboxItems.$inferSelect;
