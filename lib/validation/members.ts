import type { Role } from "@/lib/auth/roles";

/** Shape of GET /api/sites/{siteId}/members (dates as ISO strings over JSON). */
export type MembersResponse = {
  me: string;
  members: { userId: string; name: string; email: string; role: Role; zoneIds: string[] | null; createdAt: string }[];
  invites: { id: string; email: string; role: Role; zoneIds: string[] | null; expiresAt: string; lastSentAt: string; invitedByName: string | null }[];
  zones: { id: string; name: string }[];
};
