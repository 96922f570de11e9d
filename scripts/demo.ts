import { runApp } from "./run-app";

const port = Number(process.env.PORT ?? 3000);

await runApp({
  port,
  databaseUrl: process.env.DATABASE_URL ?? "file:data/joulepath.db",
  build: process.env.DEMO_SKIP_BUILD !== "1",
  onReady: (url) => {
    console.log(
      [
        "",
        "Joulepath demo is running.",
        `  Console:  ${url}/sites/larch-lane`,
        `  Health:   ${url}/api/health`,
        "  Demo site: Larch Lane Studio (invented)",
        "Press Ctrl-C to stop.",
        "",
      ].join("\n"),
    );
  },
});
