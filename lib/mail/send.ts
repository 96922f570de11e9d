import nodemailer from "nodemailer";
import { env } from "@/lib/env";

export type OutgoingMail = {
  to: string;
  subject: string;
  text: string;
  html?: string;
};

type Transport = ReturnType<typeof nodemailer.createTransport>;

// One transport per process, kept on globalThis so dev-mode reloads reuse it.
// Keyed by URL and sender so a changed environment (tests) gets a fresh one.
const globalForMail = globalThis as unknown as { joulepathMail?: { key: string; transport: Transport } };

function transport(): Transport {
  const { SMTP_URL, MAIL_FROM } = env();
  const key = `${SMTP_URL}\n${MAIL_FROM}`;
  if (globalForMail.joulepathMail?.key !== key) {
    globalForMail.joulepathMail = { key, transport: nodemailer.createTransport(SMTP_URL, { from: MAIL_FROM }) };
  }
  return globalForMail.joulepathMail.transport;
}

/** Sends one e-mail from MAIL_FROM through SMTP_URL; resolves once the server accepted it. */
export async function sendMail({ to, subject, text, html }: OutgoingMail): Promise<{ messageId: string }> {
  const info = await transport().sendMail({ to, subject, text, ...(html === undefined ? {} : { html }) });
  return { messageId: info.messageId };
}
