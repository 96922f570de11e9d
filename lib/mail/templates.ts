/**
 * The e-mails the console sends, as plain data. Every function returns the
 * subject, a plain-text body and an HTML body with each interpolated value
 * escaped. `now` only exists so the "valid for …" wording is reproducible in
 * tests; callers leave it out.
 */

export type MailContent = { subject: string; text: string; html: string };

export type InviteMailInput = {
  siteName: string;
  inviterName: string;
  /** The role's display label, e.g. "Facilities manager". */
  role: string;
  /** Absolute http(s) URL that accepts the invitation. */
  link: string;
  expiresAt: Date;
  now?: Date;
};

export type PasswordResetMailInput = {
  name: string;
  /** Absolute http(s) URL of the reset form, token included. */
  link: string;
  expiresAt: Date;
  now?: Date;
};

export function inviteMail({ siteName, inviterName, role, link, expiresAt, now = new Date() }: InviteMailInput): MailContent {
  assertWebLink(link);
  const validity = describeValidity(expiresAt, now);
  const subject = oneLine(`${inviterName} invited you to ${siteName} on Joulepath`);

  const text = [
    "Hello,",
    "",
    `${inviterName} has invited you to join ${siteName} on Joulepath, with the role ${role}.`,
    "",
    "Accept the invitation here:",
    link,
    "",
    `${validity} After that, ask ${inviterName} to send you a new invitation.`,
    "",
    "If you were not expecting this invitation, you can ignore this e-mail.",
    "",
    "— Joulepath",
  ].join("\n");

  const html = layout([
    "<p>Hello,</p>",
    `<p><strong>${escapeHtml(inviterName)}</strong> has invited you to join <strong>${escapeHtml(siteName)}</strong> on Joulepath, with the role <strong>${escapeHtml(role)}</strong>.</p>`,
    button(link, "Accept the invitation"),
    pasteLink(link),
    `<p>${escapeHtml(validity)} After that, ask ${escapeHtml(inviterName)} to send you a new invitation.</p>`,
    "<p>If you were not expecting this invitation, you can ignore this e-mail.</p>",
  ]);

  return { subject, text, html };
}

export function passwordResetMail({ name, link, expiresAt, now = new Date() }: PasswordResetMailInput): MailContent {
  assertWebLink(link);
  const validity = describeValidity(expiresAt, now);
  const subject = "Reset your Joulepath password";

  const text = [
    `Hello ${name},`,
    "",
    "Someone asked to reset the password of your Joulepath account. Choose a new password here:",
    link,
    "",
    validity,
    "",
    "If you did not ask for this, ignore it: your password stays as it is.",
    "",
    "— Joulepath",
  ].join("\n");

  const html = layout([
    `<p>Hello ${escapeHtml(name)},</p>`,
    "<p>Someone asked to reset the password of your Joulepath account.</p>",
    button(link, "Choose a new password"),
    pasteLink(link),
    `<p>${escapeHtml(validity)}</p>`,
    "<p>If you did not ask for this, ignore it: your password stays as it is.</p>",
  ]);

  return { subject, text, html };
}

/** "This link is valid for 7 days, until Thursday 21 May 2026 at 10:00 UTC." */
export function describeValidity(expiresAt: Date, now: Date): string {
  const until = formatUtc(expiresAt);
  const minutes = Math.round((expiresAt.getTime() - now.getTime()) / 60_000);
  if (minutes <= 0) return `This link expired on ${until}.`;
  return `This link is valid for ${formatDuration(minutes)}, until ${until}.`;
}

// Rounds down, so the mail never promises more time than the link has; the
// exact moment follows in the same sentence.
function formatDuration(minutes: number): string {
  if (minutes < 60) return plural(minutes, "minute");
  const hours = Math.floor(minutes / 60);
  const rest = minutes % 60;
  if (hours < 3 && rest > 0) return `${plural(hours, "hour")} ${plural(rest, "minute")}`;
  if (hours < 48) return plural(hours, "hour");
  return plural(Math.floor(hours / 24), "day");
}

function plural(n: number, unit: string): string {
  return `${n} ${unit}${n === 1 ? "" : "s"}`;
}

const WEEKDAYS = ["Sunday", "Monday", "Tuesday", "Wednesday", "Thursday", "Friday", "Saturday"];
const MONTHS = ["January", "February", "March", "April", "May", "June", "July", "August", "September", "October", "November", "December"];

// Built by hand rather than with Intl so the wording does not shift with the ICU version.
function formatUtc(d: Date): string {
  const hh = String(d.getUTCHours()).padStart(2, "0");
  const mm = String(d.getUTCMinutes()).padStart(2, "0");
  return `${WEEKDAYS[d.getUTCDay()]} ${d.getUTCDate()} ${MONTHS[d.getUTCMonth()]} ${d.getUTCFullYear()} at ${hh}:${mm} UTC`;
}

export function escapeHtml(value: string): string {
  return value
    .replaceAll("&", "&amp;")
    .replaceAll("<", "&lt;")
    .replaceAll(">", "&gt;")
    .replaceAll('"', "&quot;")
    .replaceAll("'", "&#39;");
}

/** A name with a line break must not turn into a second header line. */
function oneLine(value: string): string {
  return value.replace(/\s+/g, " ").trim();
}

function assertWebLink(link: string) {
  if (!/^https?:\/\//i.test(link)) throw new Error("Mail links must be absolute http(s) URLs");
}

function button(link: string, label: string): string {
  return `<p><a href="${escapeHtml(link)}" style="display:inline-block;padding:10px 18px;border-radius:6px;background:#1d2833;color:#f3f5f2;font-weight:700;text-decoration:none">${escapeHtml(label)}</a></p>`;
}

function pasteLink(link: string): string {
  return `<p style="font-size:14px;color:#5b6b7a">Or paste this link into your browser:<br><a href="${escapeHtml(link)}" style="color:#1d2833;word-break:break-all">${escapeHtml(link)}</a></p>`;
}

function layout(paragraphs: string[]): string {
  return [
    '<!doctype html><html lang="en"><head><meta charset="utf-8"></head>',
    '<body style="margin:0;padding:24px;background:#f3f5f2;color:#1d2833;font-family:Nunito,Arial,sans-serif;line-height:1.5">',
    '<div style="max-width:560px;margin:0 auto;padding:24px;background:#ffffff;border:1px solid #d8ddd6;border-radius:12px">',
    ...paragraphs,
    '<p style="color:#5b6b7a">— Joulepath</p>',
    "</div></body></html>",
  ].join("\n");
}
