/** What a notice is about, so people can choose which kinds reach them and how. */
export const NOTICE_KINDS = ["visitor", "call", "door", "emergency", "climate", "energy", "care", "other"] as const;
export type NoticeKind = (typeof NOTICE_KINDS)[number];

const BY_TRIGGER: Record<string, NoticeKind> = {
  "call-button-press": "call",
  "door-handle-turn": "visitor",
  "motion-detected": "visitor",
  "contact-opened": "door",
  "contact-closed": "door",
  "contact-left-open": "door",
  "fire-alarm-active": "emergency",
  "fire-alarm-cleared": "emergency",
  "temperature-above": "climate",
  "temperature-below": "climate",
  "humidity-above": "climate",
  "humidity-below": "climate",
};

/** The kind a notice action names, else the one its trigger implies. */
export function noticeKindFor(triggerType: string, explicit?: NoticeKind): NoticeKind {
  return explicit ?? BY_TRIGGER[triggerType] ?? "other";
}
