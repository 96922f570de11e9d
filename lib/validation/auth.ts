import { z } from "zod";
import { ROLES } from "@/lib/auth/roles";
import { idSchema } from "./site";

export const emailSchema = z
  .string("Enter an e-mail address")
  .trim()
  .toLowerCase()
  .max(254, "An e-mail address has at most 254 characters")
  .pipe(z.email("Enter an e-mail address like name@example.org"));

/** Long passphrases welcome; no composition rules (common practice after NIST SP 800-63B). */
export const passwordSchema = z
  .string()
  .min(10, "Use at least 10 characters")
  .max(256, "Use at most 256 characters");

export const nameSchema = z.string().trim().min(1, "Enter your name").max(100, "Use at most 100 characters");

export const signUpSchema = z.object({ name: nameSchema, email: emailSchema, password: passwordSchema }).strict();
export const signInSchema = z.object({ email: emailSchema, password: z.string().min(1, "Enter your password").max(256) }).strict();
export const forgotPasswordSchema = z.object({ email: emailSchema }).strict();
export const tokenSchema = z.string().regex(/^[A-Za-z0-9_-]{43}$/, "This link is not valid");
export const resetPasswordSchema = z.object({ token: tokenSchema, password: passwordSchema }).strict();
export const changePasswordSchema = z
  .object({ currentPassword: z.string().min(1, "Enter your current password").max(256), newPassword: passwordSchema })
  .strict();

export const roleSchema = z.enum(ROLES, "Choose integrator, manager or occupant");
export const zoneIdsSchema = z.array(idSchema).max(200).nullable();

export const inviteSchema = z.object({ email: emailSchema, role: roleSchema, zoneIds: zoneIdsSchema.default(null) }).strict();
export const memberUpdateSchema = z.object({ role: roleSchema, zoneIds: zoneIdsSchema.default(null) }).strict();
export const acceptInviteSchema = z
  .object({ token: tokenSchema, name: nameSchema.optional(), password: passwordSchema.optional() })
  .strict();

const siteFields = {
    name: z.string().trim().min(1, "Give the site a name").max(100, "Use at most 100 characters"),
    address: z.string().trim().max(300, "Use at most 300 characters"),
    timeZone: z
      .string()
      .max(64)
      .refine((tz) => {
        try {
          new Intl.DateTimeFormat("en", { timeZone: tz });
          return true;
        } catch {
          return false;
        }
      }, "Choose a time zone from the IANA list (e.g. UTC, WET, CET)"),
    latitude: z.number("Enter a latitude in degrees").min(-90, "Latitude is between −90° and 90°").max(90, "Latitude is between −90° and 90°"),
    longitude: z.number("Enter a longitude in degrees").min(-180, "Longitude is between −180° and 180°").max(180, "Longitude is between −180° and 180°"),
};

export const createSiteSchema = z.object({ ...siteFields, address: siteFields.address.default("") }).strict();
/** No defaults: a PATCH leaves out what it does not change. */
export const siteUpdateSchema = z.object(siteFields).partial().strict();

export type SignUpInput = z.input<typeof signUpSchema>;
export type SignInInput = z.input<typeof signInSchema>;
export type InviteInput = z.input<typeof inviteSchema>;
export type CreateSiteInput = z.input<typeof createSiteSchema>;

const recordIdSchema = z.string().min(1).max(64).regex(/^[A-Za-z0-9-]+$/, "is not a valid id");
export const memberParamsSchema = z.object({ siteId: idSchema, userId: recordIdSchema }).strict();
export const inviteParamsSchema = z.object({ siteId: idSchema, inviteId: recordIdSchema }).strict();
