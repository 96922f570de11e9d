import type { Role } from "@/lib/auth/roles";
import { sectionsFor } from "@/lib/auth/sections";
import type { NoticeKind } from "@/lib/rules/notice-kind";

export const KIND_LABEL: Record<NoticeKind, string> = {
  visitor: "Visitor",
  call: "Call button",
  door: "Door",
  emergency: "Emergency",
  climate: "Climate",
  energy: "Energy",
  care: "Care",
  other: "Other",
};

export function kindLabel(kind: string): string {
  return (KIND_LABEL as Record<string, string>)[kind] ?? "Notice";
}

/** The text of a message standing for `count` notices (a collapsed burst). */
export function countedText(text: string, count: number): string {
  return count > 1 ? `${text} (+${count - 1} more like it)` : text;
}

/** What the service worker receives in a push message (kept small: RFC 8291 allows 4096 octets in all). */
export type PushPayload = { v: 1; title: string; body: string; url: string; tag: string; kind: string; count: number; at: number };

export function pushPayload({ siteName, kind, text, url, count, at, tag }: { siteName: string; kind: string; text: string; url: string; count: number; at: number; tag: string }): PushPayload {
  return { v: 1, title: `${kindLabel(kind)} · ${siteName}`, body: countedText(text, count).slice(0, 1000), url, tag, kind, count, at };
}

export function noticeEmail({ siteName, kind, text, link, settingsLink, count }: { siteName: string; kind: string; text: string; link: string; settingsLink: string; count: number }) {
  const body = countedText(text, count);
  const short = body.length > 90 ? `${body.slice(0, 87)}…` : body;
  return {
    subject: `${kindLabel(kind)} at ${siteName}: ${short}`,
    text: [body, "", `Open it in the console: ${link}`, "", `Choose which notices reach you, and how: ${settingsLink}`].join("\n"),
  };
}

/**
 * The page a notice opens for one person: its own link when their role may
 * open that part of the site (lib/auth/sections.ts), else the site overview —
 * an occupant never lands on a page that refuses them (e.g. a bench notice).
 */
export function linkForRole(url: string | null, siteId: string, role: Role | null): string {
  const home = `/sites/${siteId}`;
  if (!url || !role) return "/inbox";
  if (url !== home && !url.startsWith(`${home}/`) && !url.startsWith(`${home}?`)) return url;
  const rest = url.slice(home.length).split(/[?#]/)[0];
  if (rest === "" || rest === "/") return url;
  const section = `/${rest.split("/")[1]}`;
  return sectionsFor(role).some((s) => s.href === section) ? url : home;
}
