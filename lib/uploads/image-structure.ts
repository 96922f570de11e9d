/**
 * Walks each container just far enough to see that the file is whole. image-size
 * reads only the header, so a download cut off halfway still "has" a size; these
 * checks refuse it before it is stored and shown broken on the plan. No pixel is
 * decoded. Each returns null when the file looks whole, or what is wrong.
 */
const u32be = (b: Uint8Array, at: number) => ((b[at] << 24) >>> 0) + (b[at + 1] << 16) + (b[at + 2] << 8) + b[at + 3];
const u32le = (b: Uint8Array, at: number) => b[at] + (b[at + 1] << 8) + (b[at + 2] << 16) + ((b[at + 3] << 24) >>> 0);
const tag = (b: Uint8Array, at: number) => String.fromCharCode(b[at], b[at + 1], b[at + 2], b[at + 3]);

/** PNG: IHDR first, chunks that fit the file, at least one IDAT, and IEND (W3C PNG specification, chunk layout and ordering). */
export function pngProblem(bytes: Uint8Array): string | null {
  let at = 8;
  let hasImageData = false;
  let isFirst = true;
  while (at + 12 <= bytes.byteLength) {
    const length = u32be(bytes, at);
    const type = tag(bytes, at + 4);
    if (isFirst && (type !== "IHDR" || length !== 13)) return "no IHDR header chunk";
    isFirst = false;
    if (at + 12 + length > bytes.byteLength) return `the ${type} chunk is cut off`;
    if (type === "IDAT") hasImageData = true;
    if (type === "IEND") return hasImageData ? null : "no image data";
    at += 12 + length;
  }
  return "it ends before the IEND chunk";
}

const isStandalone = (marker: number) => marker === 0x01 || (marker >= 0xd0 && marker <= 0xd7);
const isFrameHeader = (marker: number) => marker >= 0xc0 && marker <= 0xcf && marker !== 0xc4 && marker !== 0xc8 && marker !== 0xcc;

/** JPEG: marker segments that fit the file, a frame header before the first scan, and an EOI marker (ITU-T T.81 Annex B). */
export function jpegProblem(bytes: Uint8Array): string | null {
  let at = 2;
  let hasFrame = false;
  while (at < bytes.byteLength) {
    if (bytes[at] !== 0xff) return "a marker is missing";
    while (bytes[at] === 0xff) at += 1; // fill bytes may pad before a marker
    if (at >= bytes.byteLength) break;
    const marker = bytes[at];
    at += 1;
    if (marker === 0xd9) return hasFrame ? null : "no frame header";
    if (isStandalone(marker)) continue;
    if (at + 2 > bytes.byteLength) break;
    const length = (bytes[at] << 8) + bytes[at + 1];
    if (length < 2 || at + length > bytes.byteLength) return "a segment is cut off";
    if (isFrameHeader(marker)) hasFrame = true;
    at += length;
    if (marker === 0xda) {
      if (!hasFrame) return "a scan comes before the frame header";
      at = endOfEntropyData(bytes, at);
    }
  }
  return "it ends before the end-of-image marker";
}

/** In scan data 0xFF is followed by 0x00 (a stuffed byte) or a restart marker; anything else starts the next segment. */
function endOfEntropyData(bytes: Uint8Array, from: number): number {
  for (let at = from; at + 1 < bytes.byteLength; at += 1) {
    if (bytes[at] !== 0xff) continue;
    const next = bytes[at + 1];
    if (next !== 0x00 && next !== 0xff && !(next >= 0xd0 && next <= 0xd7)) return at;
  }
  return bytes.byteLength;
}

/** WebP: the RIFF size covers a first chunk of VP8, VP8L or VP8X that fits the file (RFC 9649). */
export function webpProblem(bytes: Uint8Array): string | null {
  if (bytes.byteLength < 20) return "it is too short";
  const riffEnd = 8 + u32le(bytes, 4);
  if (riffEnd > bytes.byteLength) return "it is shorter than its RIFF header says";
  const first = tag(bytes, 12);
  if (first !== "VP8 " && first !== "VP8L" && first !== "VP8X") return `it starts with an unknown ${JSON.stringify(first)} chunk`;
  if (20 + u32le(bytes, 16) > riffEnd) return `the ${first.trim()} chunk is cut off`;
  return null;
}
