import { DEMO_PASSWORD, demoUsers } from "../db/seed/demo-users";
import { runApp } from "./run-app";

const port = Number(process.env.PORT ?? 3000);

await runApp({
  port,
  databaseUrl: process.env.DATABASE_URL ?? "file:data/joulepath.db",
  build: process.env.DEMO_SKIP_BUILD !== "1",
  mailSink: { smtpPort: Number(process.env.MAIL_SINK_SMTP_PORT ?? 2525), httpPort: Number(process.env.MAIL_SINK_HTTP_PORT ?? 2526) },
  pushServicePort: Number(process.env.PUSH_SERVICE_PORT ?? 2530),
  onReady: (url) => {
    console.log(
      [
        "",
        "Joulepath demo is running.",
        `  Console:  ${url}/sites/larch-lane`,
        `  Health:   ${url}/api/health`,
        `  Mail sent by the console (local sink): ${url}/dev/mail`,
        `  Pushes received by the local push service: ${url}/dev/push`,
        "  Demo site: Larch Lane Studio (invented). Sign in as:",
        ...demoUsers.map((u) => `    ${u.role.padEnd(10)} ${u.email}  password: ${DEMO_PASSWORD}`),
        "Press Ctrl-C to stop.",
        "",
      ].join("\n"),
    );
  },
});
