import { minuteOfDay } from "@/lib/sun/local-time";
import { NOTICE_CHANNELS, type NoticeChannel } from "@/lib/rules/graph-actions";
import type { NoticeKind } from "@/lib/rules/notice-kind";

export type NoticePrefs = {
  /** Kinds wanted; null means every kind. */
  kinds: NoticeKind[] | null;
  channels: NoticeChannel[];
  /** "HH:MM" in the site's time zone; both null when there are no quiet hours. */
  quietFrom: string | null;
  quietTo: string | null;
};

/** Until a person says otherwise, every notice the rules address to them comes by every channel the rule names. */
export const DEFAULT_PREFS: NoticePrefs = { kinds: null, channels: [...NOTICE_CHANNELS], quietFrom: null, quietTo: null };

/** Kinds a person cannot turn off, and that quiet hours do not hold back. */
export const ALWAYS_DELIVERED_KINDS: readonly string[] = ["emergency"];

export type ChannelPlan = { channel: NoticeChannel; status: "pending" | "skipped"; reason: string | null };

const hhmm = (text: string) => Number(text.slice(0, 2)) * 60 + Number(text.slice(3, 5));

/**
 * Whether `at` falls in the quiet hours, read on the site's wall clock. A span
 * that wraps midnight (22:00–07:00) is quiet from `from` to `to` the next
 * morning; `from` equal to `to` means no quiet hours.
 */
export function isQuietAt(at: number, timeZone: string, quietFrom: string | null, quietTo: string | null): boolean {
  if (!quietFrom || !quietTo) return false;
  const from = hhmm(quietFrom);
  const to = hhmm(quietTo);
  if (from === to) return false;
  const m = minuteOfDay(at, timeZone);
  return from < to ? m >= from && m < to : m >= from || m < to;
}

/**
 * What to do per channel for one notice and one person: the rule's channels,
 * less the ones the person turned off, the kinds they do not want, and push
 * during their quiet hours (the inbox still gets it; e-mail does not buzz).
 * Every channel the rule named gets a plan, so the record says why nothing came.
 */
export function planChannels({ kind, channels, prefs, timeZone, now }: { kind: string; channels: readonly string[]; prefs: NoticePrefs; timeZone: string; now: number }): ChannelPlan[] {
  const isAlways = ALWAYS_DELIVERED_KINDS.includes(kind);
  const plans: ChannelPlan[] = [];
  for (const channel of NOTICE_CHANNELS) {
    if (!channels.includes(channel)) continue;
    const skip = (reason: string) => plans.push({ channel, status: "skipped", reason });
    if (!isAlways && prefs.kinds !== null && !prefs.kinds.includes(kind as NoticeKind)) skip(`${kind} notices are turned off`);
    else if (!prefs.channels.includes(channel) && !(isAlways && channel === "in-app")) skip(`${channel} is turned off`);
    else if (channel === "push" && !isAlways && isQuietAt(now, timeZone, prefs.quietFrom, prefs.quietTo)) skip(`quiet hours ${prefs.quietFrom}–${prefs.quietTo}`);
    else plans.push({ channel, status: "pending", reason: null });
  }
  return plans;
}
