import { readFileSync } from "node:fs";
import path from "node:path";
import { describe, expect, it } from "vitest";
import { isStoredName, MAX_IMAGE_BYTES, randomStoredName, sniffImage } from "@/lib/uploads/image";

// Fixtures are written from bytes by tests/fixtures/uploads/make-fixtures.ts (and were checked to decode with libpng, libjpeg and libwebp).
const fixture = (name: string) => new Uint8Array(readFileSync(path.join(import.meta.dirname, "../fixtures/uploads", name)));

describe("sniffImage", () => {
  it.each([
    ["plan.png", "png", 3, 2],
    ["plan.jpg", "jpeg", 16, 8],
    ["plan.webp", "webp", 3, 2],
  ])("reads %s as %s, %i × %i px", (file, type, width, height) => {
    expect(sniffImage(fixture(file))).toEqual({ ok: true, type, width, height });
  });

  it("decides from the bytes, not the name: a PNG called .jpg is a PNG", () => {
    expect(sniffImage(fixture("png-named.jpg"))).toMatchObject({ ok: true, type: "png" });
  });

  it("refuses a text file called plan.png", () => {
    expect(sniffImage(fixture("text-named.png"))).toMatchObject({ ok: false, code: "not-an-image" });
  });

  it("refuses a PNG cut off before its end, though its header still gives a size", () => {
    const result = sniffImage(fixture("truncated.png"));
    expect(result).toMatchObject({ ok: false, code: "damaged" });
    if (!result.ok) expect(result.message).toContain("PNG");
  });

  it("refuses a declared size over 10,000 px a side without decoding anything", () => {
    const result = sniffImage(fixture("huge-declared.png"));
    expect(result).toMatchObject({ ok: false, code: "too-many-pixels" });
    if (!result.ok) expect(result.message).toContain("20000 × 10 px");
  });

  it("gives the size as shown for a JPEG stored sideways (EXIF orientation 6)", () => {
    expect(sniffImage(fixture("sideways.jpg"))).toEqual({ ok: true, type: "jpeg", width: 8, height: 16 });
  });

  it("refuses JPEG and WebP files cut short", () => {
    const jpeg = fixture("plan.jpg");
    expect(sniffImage(jpeg.subarray(0, jpeg.length - 2))).toMatchObject({ ok: false, code: "damaged" });
    expect(sniffImage(jpeg.subarray(0, 60))).toMatchObject({ ok: false, code: "damaged" });
    const webp = fixture("plan.webp");
    expect(sniffImage(webp.subarray(0, webp.length - 4))).toMatchObject({ ok: false, code: "damaged" });
  });

  it("refuses a PNG without IEND, without image data, or with a chunk before IHDR", () => {
    const png = fixture("plan.png");
    expect(sniffImage(png.subarray(0, png.length - 12))).toMatchObject({ ok: false, code: "damaged" }); // cut exactly between chunks
    const noData = new Uint8Array([...png.subarray(0, 33), ...png.subarray(png.length - 12)]); // signature + IHDR + IEND
    expect(sniffImage(noData)).toMatchObject({ ok: false, code: "damaged" });
    const shuffled = new Uint8Array([...png.subarray(0, 8), ...png.subarray(png.length - 12), ...png.subarray(8)]);
    expect(sniffImage(shuffled)).toMatchObject({ ok: false, code: "damaged" });
  });

  it("names formats it does not take", () => {
    const bytes = (text: string) => new TextEncoder().encode(text);
    expect(sniffImage(bytes("GIF89a\x01\x00\x01\x00"))).toMatchObject({ ok: false, code: "unsupported", message: expect.stringContaining("GIF") });
    expect(sniffImage(bytes("%PDF-1.7\n"))).toMatchObject({ ok: false, code: "unsupported", message: expect.stringContaining("PDF") });
    expect(sniffImage(bytes('  <svg xmlns="http://www.w3.org/2000/svg"/>'))).toMatchObject({ ok: false, code: "unsupported", message: expect.stringContaining("SVG") });
  });

  it("refuses empty files and files over 8 MiB before looking inside", () => {
    expect(sniffImage(new Uint8Array())).toMatchObject({ ok: false, code: "empty" });
    const big = new Uint8Array(MAX_IMAGE_BYTES + 1);
    big.set(fixture("plan.png"));
    expect(sniffImage(big)).toMatchObject({ ok: false, code: "too-large" });
    expect(MAX_IMAGE_BYTES).toBe(8 * 1024 * 1024);
  });
});

describe("randomStoredName", () => {
  it("is 128 random bits in hex with the sniffed type's extension", () => {
    const name = randomStoredName("jpeg");
    expect(name).toMatch(/^[0-9a-f]{32}\.jpg$/);
    expect(isStoredName(name)).toBe(true);
    expect(randomStoredName("webp")).toMatch(/\.webp$/);
  });

  it("does not repeat", () => {
    const names = new Set(Array.from({ length: 1000 }, () => randomStoredName("png")));
    expect(names.size).toBe(1000);
  });

  it("isStoredName refuses anything a path could be built from", () => {
    for (const bad of ["../etc/passwd", "a.png", `${"0".repeat(32)}.svg`, `${"0".repeat(32)}.png/..`, `${"A".repeat(32)}.png`]) expect(isStoredName(bad)).toBe(false);
  });
});
