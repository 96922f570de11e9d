import type { Role } from "@/lib/auth/roles";
import type { NoticeKind } from "@/lib/rules/notice-kind";

export type SiteMember = { userId: string; email: string; role: Role; zoneIds: string[] | null };

/**
 * Who an outbox row's `recipient` means on one site (lib/bus/actions.ts writes
 * "role:<role>" or "person:<user id or e-mail>"). Only members of the site
 * ever receive anything. A notice to a role reaches an occupant only when the
 * occupant sees the whole site or the notice is about one of their zones;
 * named people always get what is addressed to them. Emergency notices reach
 * every occupant of the role: leaving someone out of a fire-alarm notice
 * because of zone lists is not a trade-off to make silently.
 */
export function resolveRecipients({ recipient, kind, zoneId, members }: { recipient: string; kind: NoticeKind | string; zoneId: string | null; members: SiteMember[] }): string[] {
  const colon = recipient.indexOf(":");
  const type = colon < 0 ? "" : recipient.slice(0, colon);
  const who = colon < 0 ? "" : recipient.slice(colon + 1);
  if (type === "person") {
    const lower = who.toLowerCase();
    return members.filter((m) => m.userId === who || m.email.toLowerCase() === lower).map((m) => m.userId);
  }
  if (type === "role") {
    return members.filter((m) => m.role === who && (m.role !== "occupant" || isOccupantConcerned(m, kind, zoneId))).map((m) => m.userId);
  }
  return [];
}

function isOccupantConcerned(member: SiteMember, kind: string, zoneId: string | null): boolean {
  if (member.zoneIds === null || kind === "emergency") return true;
  return zoneId !== null && member.zoneIds.includes(zoneId);
}
