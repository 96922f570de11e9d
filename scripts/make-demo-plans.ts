/**
 * Draws the demo site's floor plans (invented building) as SVG and renders them
 * to PNG with Chromium, once, at development time: `npx tsx scripts/make-demo-plans.ts`.
 * The PNGs are committed under db/seed/plans/ and the seed copies them into UPLOAD_DIR.
 */
import { writeFileSync } from "node:fs";
import { chromium } from "playwright-core";

const PX_PER_M = 50;
type Room = { name: string; x: number; y: number; w: number; h: number; fill?: string };

function svg(widthM: number, heightM: number, rooms: Room[], extras = ""): string {
  const W = widthM * PX_PER_M;
  const H = heightM * PX_PER_M;
  const r = rooms
    .map(
      (room) => `<rect x="${room.x * PX_PER_M}" y="${room.y * PX_PER_M}" width="${room.w * PX_PER_M}" height="${room.h * PX_PER_M}" fill="${room.fill ?? "#ffffff"}" stroke="#1d2833" stroke-width="6"/>
<text x="${(room.x + room.w / 2) * PX_PER_M}" y="${(room.y + room.h / 2) * PX_PER_M}" font-family="sans-serif" font-size="22" fill="#5b6b7a" text-anchor="middle">${room.name}</text>`,
    )
    .join("\n");
  const grid = Array.from({ length: widthM + 1 }, (_, i) => `<line x1="${i * PX_PER_M}" y1="0" x2="${i * PX_PER_M}" y2="${H}" stroke="#e3e7e1" stroke-width="1"/>`).join("");
  return `<svg xmlns="http://www.w3.org/2000/svg" width="${W}" height="${H}" viewBox="0 0 ${W} ${H}"><rect width="${W}" height="${H}" fill="#f3f5f2"/>${grid}${r}${extras}
<g transform="translate(${W - 300},${H - 40})"><line x1="0" y1="0" x2="${5 * PX_PER_M}" y2="0" stroke="#1d2833" stroke-width="4"/><line x1="0" y1="-8" x2="0" y2="8" stroke="#1d2833" stroke-width="4"/><line x1="${5 * PX_PER_M}" y1="-8" x2="${5 * PX_PER_M}" y2="8" stroke="#1d2833" stroke-width="4"/><text x="${2.5 * PX_PER_M}" y="-14" font-family="sans-serif" font-size="18" text-anchor="middle" fill="#1d2833">5 m</text></g></svg>`;
}

// Ground floor, 22 m × 15 m: the front path along the top, the building below it.
const ground = svg(
  22,
  15,
  [
    { name: "Front path", x: 0, y: 0, w: 22, h: 2.5, fill: "#e9ede6" },
    { name: "Shop floor", x: 0.5, y: 4, w: 10, h: 6 },
    { name: "Shop window", x: 0.5, y: 2.5, w: 10, h: 1.5, fill: "#fbf3e2" },
    { name: "Workshop", x: 10.5, y: 2.5, w: 11, h: 7.5 },
    { name: "Stairs / escape", x: 0.5, y: 10, w: 4, h: 4.5 },
    { name: "Back hall", x: 4.5, y: 10, w: 6, h: 4.5 },
    { name: "Textile room", x: 10.5, y: 10, w: 11, h: 4 },
  ],
  `<rect x="${8 * PX_PER_M}" y="${14.3 * PX_PER_M}" width="${1.5 * PX_PER_M}" height="14" fill="#b8553a"/><text x="${8.75 * PX_PER_M}" y="${14.1 * PX_PER_M}" font-family="sans-serif" font-size="16" text-anchor="middle" fill="#b8553a">back door</text>`,
);
// Upper floor, 12 m × 9 m: the flat.
const upper = svg(12, 9, [
  { name: "Flat — living room", x: 0.5, y: 0.5, w: 7, h: 5 },
  { name: "Kitchen", x: 7.5, y: 0.5, w: 4, h: 5 },
  { name: "Stairs", x: 0.5, y: 5.5, w: 4, h: 3 },
  { name: "Bedroom", x: 4.5, y: 5.5, w: 7, h: 3 },
]);

const browser = await chromium.launch({ executablePath: process.env.CHROMIUM_PATH ?? "/usr/bin/chromium", args: ["--no-sandbox", "--disable-gpu", "--no-first-run", "--disable-background-networking"] });
for (const [name, body, w, h] of [
  ["ground-floor", ground, 22, 15],
  ["upper-floor", upper, 12, 9],
] as const) {
  const page = await browser.newPage({ viewport: { width: w * PX_PER_M, height: h * PX_PER_M } });
  await page.setContent(`<html><body style="margin:0">${body}</body></html>`);
  writeFileSync(`db/seed/plans/${name}.png`, await page.screenshot({ type: "png" }));
  await page.close();
}
await browser.close();
console.log(`plans written at ${PX_PER_M} px/m`);
