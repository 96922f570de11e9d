/**
 * The end-to-end tests drive Debian's Chromium (browser downloads are not
 * possible here). Install it when missing and running as root; otherwise say how.
 */
import { execFileSync } from "node:child_process";
import { existsSync } from "node:fs";

export const CHROMIUM_PATH = process.env.CHROMIUM_PATH ?? "/usr/bin/chromium";

if (existsSync(CHROMIUM_PATH)) {
  process.exit(0);
}
if (typeof process.getuid === "function" && process.getuid() === 0) {
  console.log(`Chromium not found at ${CHROMIUM_PATH}; installing Debian's chromium package (about a minute)…`);
  const env = { ...process.env, DEBIAN_FRONTEND: "noninteractive" };
  execFileSync("apt-get", ["update", "-qq"], { stdio: "inherit", env });
  execFileSync("apt-get", ["install", "-y", "-qq", "chromium"], { stdio: "inherit", env });
  if (!existsSync(CHROMIUM_PATH)) {
    console.error(`apt-get finished but ${CHROMIUM_PATH} is still missing.`);
    process.exit(1);
  }
  process.exit(0);
}
console.error(
  [
    `The end-to-end tests need Chromium at ${CHROMIUM_PATH}.`,
    "Install it once with:  sudo apt-get update && sudo apt-get install -y chromium",
    "or point CHROMIUM_PATH at another Chromium build.",
  ].join("\n"),
);
process.exit(1);
