import { imageSize } from "image-size";
import { pngProblem, jpegProblem, webpProblem } from "./image-structure";

/**
 * Floor-plan uploads: what a file is gets decided from its bytes — magic number,
 * a walk over the container so a cut-off file is refused, and image-size for the
 * dimensions — never from its name or the browser's Content-Type, both of which
 * the uploader controls.
 */
export const MAX_IMAGE_BYTES = 8 * 1024 * 1024;
/** A side longer than this is a scan at a resolution nobody needs for placing devices, and slow to decode in a browser. */
export const MAX_IMAGE_SIDE_PX = 10_000;

export const IMAGE_TYPES = ["png", "jpeg", "webp"] as const;
export type ImageType = (typeof IMAGE_TYPES)[number];
export const IMAGE_MIME: Record<ImageType, string> = { png: "image/png", jpeg: "image/jpeg", webp: "image/webp" };
const EXTENSION: Record<ImageType, string> = { png: "png", jpeg: "jpg", webp: "webp" };

export type SniffErrorCode = "empty" | "too-large" | "unsupported" | "not-an-image" | "damaged" | "too-many-pixels";
export type SniffResult = { ok: true; type: ImageType; width: number; height: number } | { ok: false; code: SniffErrorCode; message: string };

const ACCEPTED = "upload a PNG, JPEG or WebP image";

export function sniffImage(bytes: Uint8Array): SniffResult {
  if (bytes.byteLength === 0) return fail("empty", "The file is empty.");
  if (bytes.byteLength > MAX_IMAGE_BYTES) return fail("too-large", `The file is larger than ${MAX_IMAGE_BYTES / 1024 / 1024} MiB; save the plan at a lower resolution or as JPEG.`);
  const type = magicType(bytes);
  if (type === null) {
    const other = otherFormat(bytes);
    return other ? fail("unsupported", `The file is ${other}; ${ACCEPTED}.`) : fail("not-an-image", `The file is not an image; ${ACCEPTED}.`);
  }
  const problem = type === "png" ? pngProblem(bytes) : type === "jpeg" ? jpegProblem(bytes) : webpProblem(bytes);
  if (problem) return fail("damaged", `The ${LABEL[type]} file is damaged or incomplete (${problem}); export it again.`);

  let size: ReturnType<typeof imageSize>;
  try {
    size = imageSize(bytes);
  } catch {
    return fail("damaged", `The ${LABEL[type]} file's size could not be read; export it again.`);
  }
  // A JPEG can be stored sideways with an EXIF orientation; browsers show it turned, and plan coordinates are taken on what is shown.
  const isTurned = type === "jpeg" && size.orientation !== undefined && size.orientation >= 5;
  const width = isTurned ? size.height : size.width;
  const height = isTurned ? size.width : size.height;
  if (!(width >= 1 && height >= 1)) return fail("damaged", `The ${LABEL[type]} file says it is ${width} × ${height} px; export it again.`);
  if (width > MAX_IMAGE_SIDE_PX || height > MAX_IMAGE_SIDE_PX) {
    return fail("too-many-pixels", `The image is ${width} × ${height} px; the most we take is ${MAX_IMAGE_SIDE_PX.toLocaleString("en")} px a side.`);
  }
  return { ok: true, type, width, height };
}

/** A name to store the file under: 128 random bits and the extension of the sniffed type, nothing from the uploader. */
export function randomStoredName(type: ImageType): string {
  const random = globalThis.crypto.getRandomValues(new Uint8Array(16));
  return `${Array.from(random, (b) => b.toString(16).padStart(2, "0")).join("")}.${EXTENSION[type]}`;
}

/** Checks a stored name read back from a URL before it goes near the file system. */
export function isStoredName(name: string): boolean {
  return /^[0-9a-f]{32}\.(png|jpg|webp)$/.test(name);
}

const LABEL: Record<ImageType, string> = { png: "PNG", jpeg: "JPEG", webp: "WebP" };

function fail(code: SniffErrorCode, message: string): SniffResult {
  return { ok: false, code, message };
}

const startsWith = (bytes: Uint8Array, signature: readonly number[], offset = 0) => signature.every((b, i) => bytes[offset + i] === b);
const ascii = (text: string) => Array.from(text, (c) => c.charCodeAt(0));

function magicType(bytes: Uint8Array): ImageType | null {
  if (startsWith(bytes, [0x89, ...ascii("PNG\r\n\x1a\n")])) return "png";
  if (startsWith(bytes, [0xff, 0xd8, 0xff])) return "jpeg";
  if (startsWith(bytes, ascii("RIFF")) && startsWith(bytes, ascii("WEBP"), 8)) return "webp";
  return null;
}

/** Names formats people often try, so the message can say what the file is. */
function otherFormat(bytes: Uint8Array): string | null {
  if (startsWith(bytes, ascii("GIF8"))) return "a GIF";
  if (startsWith(bytes, ascii("%PDF"))) return "a PDF (export the page as an image)";
  if (startsWith(bytes, ascii("BM"))) return "a BMP";
  if (startsWith(bytes, [0x49, 0x49, 0x2a, 0x00]) || startsWith(bytes, [0x4d, 0x4d, 0x00, 0x2a])) return "a TIFF";
  if (startsWith(bytes, ascii("ftyp"), 4)) return "a HEIC/AVIF photo";
  const head = new TextDecoder().decode(bytes.subarray(0, 256)).trimStart().toLowerCase();
  if (head.startsWith("<svg") || (head.startsWith("<?xml") && head.includes("<svg"))) return "an SVG drawing";
  return null;
}
