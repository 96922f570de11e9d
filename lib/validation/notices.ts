import { z } from "zod";
import { NOTICE_CHANNELS } from "@/lib/rules/graph-actions";
import { NOTICE_KINDS } from "@/lib/rules/notice-kind";
import { idSchema } from "@/lib/validation/site";

/*
 * Shared by the notice settings forms (client) and the notices/push route
 * handlers (server): pure zod, no node:crypto (the server checks that p256dh
 * is really a point on P-256 with lib/push/ece.ts).
 */

/**
 * A browser's PushSubscription as `JSON.stringify(subscription)` gives it
 * (Push API §PushSubscription.toJSON): p256dh is the 65-octet uncompressed
 * P-256 key, auth the 16-octet secret (RFC 8291 §2), both base64url.
 */
export const pushSubscriptionSchema = z.object({
  endpoint: z
    .string("endpoint is missing")
    .max(2048, "endpoint is longer than 2048 characters")
    .refine((v) => URL.canParse(v) && /^https?:$/.test(new URL(v).protocol), "endpoint is not an http(s) URL"),
  expirationTime: z.number().int().nonnegative().nullable().optional(),
  keys: z
    .object({
      p256dh: z.string("keys.p256dh is missing").regex(/^B[A-Za-z0-9_-]{86}=?$/, "keys.p256dh is not a 65-octet uncompressed P-256 key in base64url"),
      auth: z.string("keys.auth is missing").regex(/^[A-Za-z0-9_-]{22}(==)?$/, "keys.auth is not a 16-octet secret in base64url"),
    })
    .strict(),
});
export type PushSubscriptionJson = z.infer<typeof pushSubscriptionSchema>;

export const subscribeBodySchema = z
  .object({
    subscription: pushSubscriptionSchema,
    /** "demo": taken from the local push service; "browser": from PushManager.subscribe. */
    origin: z.enum(["browser", "demo"]).default("browser"),
    label: z.string().trim().max(80, "Use at most 80 characters for the label").default(""),
  })
  .strict();

export const unsubscribeBodySchema = z.object({ endpoint: z.string().min(1, "endpoint is missing").max(2048) }).strict();

const clock = z.union([z.string().regex(/^([01]\d|2[0-3]):[0-5]\d$/, "Use a 24-hour time such as 22:00"), z.literal("").transform(() => null), z.null()]);

export const noticePrefsSchema = z
  .object({
    kinds: z.array(z.enum(NOTICE_KINDS, `Kinds are ${NOTICE_KINDS.join(", ")}`)).nullable(),
    channels: z.array(z.enum(NOTICE_CHANNELS, "Channels are push, in-app and email")),
    quietFrom: clock,
    quietTo: clock,
  })
  .strict()
  .superRefine((v, ctx) => {
    if ((v.quietFrom === null) !== (v.quietTo === null)) {
      ctx.addIssue({ code: "custom", path: [v.quietFrom === null ? "quietFrom" : "quietTo"], message: "Give both ends of the quiet hours, or neither" });
    } else if (v.quietFrom !== null && v.quietFrom === v.quietTo) {
      ctx.addIssue({ code: "custom", path: ["quietTo"], message: "Quiet hours must end at a different time than they start" });
    }
  });
export type NoticePrefsInput = z.input<typeof noticePrefsSchema>;
export type NoticePrefsJson = z.output<typeof noticePrefsSchema>;

export const inboxQuerySchema = z
  .object({
    siteId: idSchema.optional(),
    show: z.enum(["all", "unread"]).default("all"),
    /** Items older than this item id (for "show older"). */
    before: z.coerce.number().int().positive().optional(),
    limit: z.coerce.number().int().min(1).max(100).default(30),
  })
  .strict();

export const markReadSchema = z.union([
  z.object({ ids: z.array(z.number().int().positive()).min(1, "Name at least one item").max(500) }).strict(),
  z.object({ all: z.literal(true), siteId: idSchema.optional() }).strict(),
]);

export type InboxItemJson = { id: number; siteId: string; siteName: string; kind: string; text: string; url: string | null; count: number; at: number; readAt: string | null };
export type PushSubscriptionRowJson = { id: string; label: string; origin: "browser" | "demo"; host: string; createdAt: string; lastSuccessAt: string | null };
