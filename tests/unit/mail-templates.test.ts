import { describe, expect, it } from "vitest";
import { describeValidity, inviteMail, passwordResetMail } from "@/lib/mail/templates";

const now = new Date("2026-05-14T10:00:00Z");
const inAWeek = new Date("2026-05-21T10:00:00Z");
const inAnHour = new Date("2026-05-14T11:00:00Z");
const inviteLink = "https://console.joulepath.invalid/invite/abc123?x=1&y=2";
const resetLink = "https://console.joulepath.invalid/reset/tok-987";

describe("inviteMail", () => {
  const mail = inviteMail({
    siteName: "Larch Lane Studios",
    inviterName: "Wren Halloway",
    role: "Facilities manager",
    link: inviteLink,
    expiresAt: inAWeek,
    now,
  });

  it("names the site and the inviter, and carries the link in both bodies", () => {
    expect(mail.subject).toBe("Wren Halloway invited you to Larch Lane Studios on Joulepath");
    expect(mail.text).toContain("Larch Lane Studios");
    expect(mail.text).toContain("Facilities manager");
    expect(mail.text).toContain(`\n${inviteLink}\n`);
    expect(mail.html).toContain("Larch Lane Studios");
    // In HTML the & of the query string is escaped, as an attribute value must be.
    expect(mail.html).toContain('href="https://console.joulepath.invalid/invite/abc123?x=1&amp;y=2"');
  });

  it("says how long the link is valid", () => {
    expect(mail.text).toContain("This link is valid for 7 days, until Thursday 21 May 2026 at 10:00 UTC.");
    expect(mail.html).toContain("This link is valid for 7 days, until Thursday 21 May 2026 at 10:00 UTC.");
  });

  it("escapes every interpolated value in the HTML", () => {
    const evil = inviteMail({
      siteName: "<script>alert(1)</script>",
      inviterName: 'Ivo "Quote" & <b>Co</b>',
      role: "<img src=x onerror=alert(2)>",
      link: 'https://console.joulepath.invalid/invite/"><script>alert(3)</script>',
      expiresAt: inAWeek,
      now,
    });
    expect(evil.html).not.toMatch(/<script|<img|<b>/i);
    expect(evil.html).toContain("&lt;script&gt;alert(1)&lt;/script&gt;");
    expect(evil.html).toContain("Ivo &quot;Quote&quot; &amp; &lt;b&gt;Co&lt;/b&gt;");
    expect(evil.html).toContain("&lt;img src=x onerror=alert(2)&gt;");
    expect(evil.html).toContain('href="https://console.joulepath.invalid/invite/&quot;&gt;&lt;script&gt;');
    // The plain-text body is not HTML and stays literal.
    expect(evil.text).toContain("<script>alert(1)</script>");
  });

  it("keeps the subject on one line whatever the names contain", () => {
    const m = inviteMail({ siteName: "North\r\nBcc: someone@example.invalid", inviterName: "Ada", role: "Occupant", link: inviteLink, expiresAt: inAWeek, now });
    expect(m.subject).not.toMatch(/[\r\n]/);
  });

  it("refuses a link that is not an http(s) URL", () => {
    expect(() => inviteMail({ siteName: "S", inviterName: "A", role: "Occupant", link: "javascript:alert(1)", expiresAt: inAWeek, now })).toThrow(/http/);
  });
});

describe("passwordResetMail", () => {
  const mail = passwordResetMail({ name: "Tamsin <Reed>", link: resetLink, expiresAt: inAnHour, now });

  it("carries the link and greets by name, escaped in HTML", () => {
    expect(mail.subject).toBe("Reset your Joulepath password");
    expect(mail.text).toContain("Hello Tamsin <Reed>,");
    expect(mail.text).toContain(`\n${resetLink}\n`);
    expect(mail.html).toContain(`href="${resetLink}"`);
    expect(mail.html).toContain("Hello Tamsin &lt;Reed&gt;,");
    expect(mail.html).not.toContain("<Reed>");
  });

  it("says how long the link is valid and to ignore it if unasked", () => {
    expect(mail.text).toContain("This link is valid for 1 hour, until Thursday 14 May 2026 at 11:00 UTC.");
    expect(mail.html).toContain("valid for 1 hour");
    expect(mail.text).toContain("If you did not ask for this, ignore it");
    expect(mail.html).toContain("If you did not ask for this, ignore it");
  });
});

describe("describeValidity", () => {
  it("picks a readable unit and singular/plural", () => {
    expect(describeValidity(new Date("2026-05-14T10:01:00Z"), now)).toMatch(/valid for 1 minute,/);
    expect(describeValidity(new Date("2026-05-14T10:30:00Z"), now)).toMatch(/valid for 30 minutes,/);
    expect(describeValidity(new Date("2026-05-14T11:00:00Z"), now)).toMatch(/valid for 1 hour,/);
    expect(describeValidity(new Date("2026-05-14T11:30:00Z"), now)).toMatch(/valid for 1 hour 30 minutes,/);
    expect(describeValidity(new Date("2026-05-14T12:00:00Z"), now)).toMatch(/valid for 2 hours,/);
    expect(describeValidity(new Date("2026-05-14T15:45:00Z"), now)).toMatch(/valid for 5 hours,/);
    expect(describeValidity(new Date("2026-05-15T10:00:00Z"), now)).toMatch(/valid for 24 hours,/);
    expect(describeValidity(new Date("2026-05-17T10:00:00Z"), now)).toMatch(/valid for 3 days,/);
    // Never rounds up: 2 days 23 hours is not "3 days".
    expect(describeValidity(new Date("2026-05-17T09:00:00Z"), now)).toMatch(/valid for 2 days,/);
    // A caller's "now + 7 days" computed a few milliseconds earlier still reads as 7 days.
    expect(describeValidity(new Date(now.getTime() + 7 * 86_400_000 - 5), now)).toMatch(/valid for 7 days,/);
  });

  it("does not call an expired link valid", () => {
    expect(describeValidity(new Date("2026-05-14T09:00:00Z"), now)).toBe("This link expired on Thursday 14 May 2026 at 09:00 UTC.");
  });
});
