import { afterAll, beforeAll, describe, expect, it, vi } from "vitest";
import { startMailSink, type MailSink } from "@/workers/mail-sink";

type Send = typeof import("@/lib/mail/send").sendMail;
type SinkClient = typeof import("@/lib/mail/sink-client");

let sink: MailSink;
let sendMail: Send;
let listSinkMessages: SinkClient["listSinkMessages"];
let clearSinkMessages: SinkClient["clearSinkMessages"];
let api: string;

beforeAll(async () => {
  sink = await startMailSink({ smtpPort: 0, httpPort: 0 });
  expect(sink.smtpPort).toBeGreaterThan(0);
  expect(sink.httpPort).toBeGreaterThan(0);
  expect(sink.smtpPort).not.toBe(sink.httpPort);
  api = `http://127.0.0.1:${sink.httpPort}`;

  // lib/env.ts parses process.env once per module instance: point it at this
  // sink first, then load fresh copies of the modules that read it.
  process.env.SMTP_URL = `smtp://127.0.0.1:${sink.smtpPort}`;
  process.env.MAIL_SINK_API_URL = api;
  delete process.env.MAIL_FROM;
  vi.resetModules();
  ({ sendMail } = await import("@/lib/mail/send"));
  ({ listSinkMessages, clearSinkMessages } = await import("@/lib/mail/sink-client"));
});

afterAll(async () => {
  await sink?.close();
});

describe("mail sink", () => {
  it("answers its health check", async () => {
    const res = await fetch(`${api}/health`);
    expect(res.status).toBe(200);
    expect(await res.json()).toEqual({ ok: true, messages: 0 });
  });

  it("receives what sendMail sends and filters by recipient", async () => {
    await sendMail({ to: "Ana@Example.invalid", subject: "Invitation to Larch Lane", text: "Open https://console.joulepath.invalid/invite/a1 to join." });
    await sendMail({
      to: "hana@example.invalid",
      subject: "Reset your Joulepath password",
      text: "Reset at https://console.joulepath.invalid/reset/b2",
      html: "<p>Reset <a href=\"https://console.joulepath.invalid/reset/b2\">here</a></p>",
    });

    const all = await listSinkMessages();
    expect(all.map((m) => m.subject)).toEqual(["Reset your Joulepath password", "Invitation to Larch Lane"]);

    // Case-insensitive, and an exact address: "ana@" must not match "hana@".
    const forAna = await listSinkMessages({ to: "ana@example.invalid" });
    expect(forAna).toHaveLength(1);
    const [ana] = forAna;
    expect(ana.subject).toBe("Invitation to Larch Lane");
    expect(ana.text.trim()).toBe("Open https://console.joulepath.invalid/invite/a1 to join.");
    // nodemailer lower-cases the domain on the way out; the address itself is kept.
    expect(ana.to.map((a) => a.toLowerCase())).toEqual(["ana@example.invalid"]);
    expect(ana.from).toContain("no-reply@joulepath.invalid");
    expect(ana.from).toContain("Joulepath");
    expect(ana.html).toBeUndefined();
    expect(Number.isNaN(Date.parse(ana.receivedAt))).toBe(false);
    expect(new Date(ana.receivedAt).toISOString()).toBe(ana.receivedAt);

    const forHana = await listSinkMessages({ to: "HANA@example.invalid" });
    expect(forHana.map((m) => m.subject)).toEqual(["Reset your Joulepath password"]);
    expect(forHana[0].html).toContain('href="https://console.joulepath.invalid/reset/b2"');

    expect(await listSinkMessages({ to: "nobody@example.invalid" })).toEqual([]);
  });

  it("serves one message by id and 404 for an unknown id", async () => {
    const [latest] = await listSinkMessages();
    const res = await fetch(`${api}/messages/${latest.id}`);
    expect(res.status).toBe(200);
    expect(await res.json()).toEqual(latest);
    expect((await fetch(`${api}/messages/no-such-id`)).status).toBe(404);
  });

  it("refuses a message over 1 MiB and keeps nothing of it", async () => {
    const before = (await listSinkMessages()).length;
    await expect(sendMail({ to: "big@example.invalid", subject: "Too big", text: "x".repeat(1_200_000) })).rejects.toThrow(/552/);
    expect(await listSinkMessages()).toHaveLength(before);
  });

  it("clears every message on DELETE", async () => {
    expect(await clearSinkMessages()).toBe(2);
    expect(await listSinkMessages()).toEqual([]);
    const health = await (await fetch(`${api}/health`)).json();
    expect(health.messages).toBe(0);
  });
});
