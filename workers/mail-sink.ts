/**
 * Local mail sink: an SMTP server that accepts every message and keeps it in
 * memory, plus a small JSON API to read them. It stands in for a real mail
 * service in demo, dev and e2e runs, so nothing the console sends leaves the
 * machine.
 *
 *   npx tsx workers/mail-sink.ts
 *
 * Ports come from MAIL_SINK_SMTP_PORT (default 2525) and MAIL_SINK_HTTP_PORT
 * (default 2526). Both listen on 127.0.0.1 only.
 */
import { randomUUID } from "node:crypto";
import http from "node:http";
import type { AddressInfo, Server } from "node:net";
import { simpleParser } from "mailparser";
import { SMTPServer, type SMTPServerDataStream, type SMTPServerSession } from "smtp-server";
import type { SinkMessage } from "../lib/mail/sink-client";
import { isEntryModule, portFromEnv, runServiceMain } from "./entry";

const HOST = "127.0.0.1";
/** Larger messages are refused with 552; the console's mails are a few kilobytes. */
const MAX_MESSAGE_BYTES = 1024 * 1024;
/** Oldest messages are dropped beyond this, so a long demo cannot grow memory without bound. */
const MAX_MESSAGES = 500;

export type MailSinkOptions = {
  /** SMTP port; 0 picks a free one (read the real one from the result). */
  smtpPort: number;
  /** HTTP API port; 0 picks a free one. */
  httpPort: number;
};

export type MailSink = {
  close(): Promise<void>;
  smtpPort: number;
  httpPort: number;
};

export async function startMailSink({ smtpPort, httpPort }: MailSinkOptions): Promise<MailSink> {
  // Newest first.
  const messages: SinkMessage[] = [];

  function store(message: SinkMessage) {
    messages.unshift(message);
    if (messages.length > MAX_MESSAGES) messages.length = MAX_MESSAGES;
  }

  const smtp = new SMTPServer({
    name: "mail-sink.joulepath.invalid",
    banner: "Joulepath local mail sink",
    authOptional: true,
    disabledCommands: ["STARTTLS"],
    size: MAX_MESSAGE_BYTES,
    logger: false,
    // Short, so close() in tests does not wait half a minute for an idle client.
    closeTimeout: 2_000,
    onData(stream, session, callback) {
      receive(stream, session).then(
        (message) => {
          store(message);
          callback();
        },
        (error: unknown) => callback(error instanceof Error ? error : new Error(String(error))),
      );
    },
  });
  // Without a listener a client's socket error would crash the process.
  smtp.on("error", (error) => console.error(`mail sink: SMTP error: ${error.message}`));

  const api = http.createServer((req, res) => handleApi(req, res, messages));

  const realSmtpPort = await listen(smtp.server, () => smtp.listen(smtpPort, HOST));
  let realHttpPort: number;
  try {
    realHttpPort = await listen(api, () => api.listen(httpPort, HOST));
  } catch (error) {
    await new Promise<void>((resolve) => smtp.close(() => resolve()));
    throw error;
  }

  return {
    smtpPort: realSmtpPort,
    httpPort: realHttpPort,
    async close() {
      await Promise.all([
        new Promise<void>((resolve) => smtp.close(() => resolve())),
        new Promise<void>((resolve, reject) => {
          api.close((error) => (error ? reject(error) : resolve()));
          api.closeAllConnections();
        }),
      ]);
    },
  };
}

/** Starts a server and resolves with the port it really got (port 0 means "any free one"). */
function listen(server: Server, start: () => void): Promise<number> {
  return new Promise((resolve, reject) => {
    const onError = (error: Error) => reject(error);
    server.once("error", onError);
    server.once("listening", () => {
      server.off("error", onError);
      resolve((server.address() as AddressInfo).port);
    });
    start();
  });
}

async function receive(stream: SMTPServerDataStream, session: SMTPServerSession): Promise<SinkMessage> {
  const chunks: Buffer[] = [];
  let length = 0;
  for await (const chunk of stream as AsyncIterable<Buffer>) {
    // Keep draining past the limit so the SMTP dialogue can finish with a clean 552.
    if (length <= MAX_MESSAGE_BYTES) chunks.push(chunk);
    length += chunk.length;
  }
  if (stream.sizeExceeded || length > MAX_MESSAGE_BYTES) {
    throw Object.assign(new Error("Message exceeds the 1 MiB limit of the mail sink"), { responseCode: 552 });
  }

  const parsed = await simpleParser(Buffer.concat(chunks));
  const envelopeFrom = session.envelope.mailFrom ? session.envelope.mailFrom.address : "";
  // The envelope says who the message was really delivered to (Bcc included);
  // the To header is only a fallback.
  const envelopeTo = session.envelope.rcptTo.map((r) => r.address);
  const headerTo = (Array.isArray(parsed.to) ? parsed.to : parsed.to ? [parsed.to] : [])
    .flatMap((a) => a.value)
    .flatMap((a) => (a.address ? [a.address] : []));

  return {
    id: randomUUID(),
    receivedAt: new Date().toISOString(),
    from: parsed.from?.text || envelopeFrom,
    to: envelopeTo.length > 0 ? envelopeTo : headerTo,
    subject: parsed.subject ?? "",
    text: parsed.text ?? "",
    ...(typeof parsed.html === "string" ? { html: parsed.html } : {}),
  };
}

function handleApi(req: http.IncomingMessage, res: http.ServerResponse, messages: SinkMessage[]) {
  const url = new URL(req.url ?? "/", `http://${HOST}`);
  const method = req.method ?? "GET";
  const send = (status: number, body: unknown, headers: Record<string, string> = {}) => {
    res.writeHead(status, { "content-type": "application/json; charset=utf-8", "cache-control": "no-store", ...headers });
    res.end(JSON.stringify(body));
  };
  const notAllowed = (allow: string) => send(405, { error: `Method ${method} not allowed` }, { allow });

  if (url.pathname === "/health") {
    if (method !== "GET") return notAllowed("GET");
    return send(200, { ok: true, messages: messages.length });
  }

  if (url.pathname === "/messages") {
    if (method === "GET") {
      const to = url.searchParams.get("to")?.trim().toLowerCase();
      const list = to ? messages.filter((m) => m.to.some((address) => address.toLowerCase() === to)) : messages;
      return send(200, { messages: list });
    }
    if (method === "DELETE") {
      const deleted = messages.length;
      messages.length = 0;
      return send(200, { deleted });
    }
    return notAllowed("GET, DELETE");
  }

  const match = /^\/messages\/([^/]+)$/.exec(url.pathname);
  if (match) {
    if (method !== "GET") return notAllowed("GET");
    let id: string;
    try {
      id = decodeURIComponent(match[1]);
    } catch {
      return send(400, { error: "Malformed message id" });
    }
    const message = messages.find((m) => m.id === id);
    return message ? send(200, message) : send(404, { error: "No such message" });
  }

  return send(404, { error: "Not found" });
}


if (isEntryModule(import.meta.url)) {
  runServiceMain(
    "mail sink",
    () => startMailSink({ smtpPort: portFromEnv("MAIL_SINK_SMTP_PORT", 2525), httpPort: portFromEnv("MAIL_SINK_HTTP_PORT", 2526) }),
    (sink) => `SMTP on ${HOST}:${sink.smtpPort}, messages at http://${HOST}:${sink.httpPort}/messages`,
  );
}
