/**
 * Looks at a page as a person would: `npx tsx scripts/screenshot.ts URL out.png [width] [height]`.
 * Prints the page's console messages so errors are not missed.
 */
import { chromium } from "playwright-core";

const [url, out, width = "1280", height = "900"] = process.argv.slice(2);
if (!url || !out) {
  console.error("usage: npx tsx scripts/screenshot.ts URL out.png [width] [height]");
  process.exit(2);
}
const browser = await chromium.launch({
  executablePath: process.env.CHROMIUM_PATH ?? "/usr/bin/chromium",
  args: ["--no-sandbox", "--disable-gpu", "--disable-quic", "--no-first-run", "--disable-background-networking", "--disable-component-update", "--disable-sync"],
});
const page = await browser.newPage({ viewport: { width: Number(width), height: Number(height) } });
page.on("console", (m) => console.log(`console.${m.type()}: ${m.text()}`));
await page.goto(url, { waitUntil: "networkidle" });
await page.screenshot({ path: out, fullPage: true });
await browser.close();
console.log(`saved ${out}`);
