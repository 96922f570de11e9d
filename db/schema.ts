import { relations } from "drizzle-orm";
import { integer, real, sqliteTable, text, uniqueIndex, index } from "drizzle-orm/sqlite-core";
import { DEVICE_KINDS } from "../lib/catalogue/device-kinds";

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
    /** Kind-specific settings (buttons, energy profile …) as JSON, parsed by lib/validation. */
    profile: text("profile", { mode: "json" }).$type<Record<string, unknown>>().notNull().default({}),
    createdAt: createdAt(),
  },
  (t) => [uniqueIndex("devices_site_unicast").on(t.siteId, t.unicastAddress), index("devices_site_zone").on(t.siteId, t.zoneId)],
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
