/**
 * Encrypted Content-Encoding "aes128gcm" (RFC 8188) with the Web Push key
 * derivation (RFC 8291), on node:crypto only. The local push service decrypts
 * with these functions and the unit tests run RFC 8291 Appendix A through them.
 */
import { createCipheriv, createDecipheriv, createECDH, createHmac, randomBytes } from "node:crypto";

/** RFC 8188 §2.1: salt (16) ‖ rs (uint32, big-endian) ‖ idlen (1) ‖ keyid (idlen). */
export type EceHeader = { salt: Buffer; recordSize: number; keyId: Buffer; length: number };

export class EceError extends Error {
  constructor(message: string) {
    super(message);
    this.name = "EceError";
  }
}

const TAG_LENGTH = 16;
/** RFC 8188 §2: the smallest record that can hold a tag and a delimiter octet is 18. */
export const MIN_RECORD_SIZE = 18;
/** RFC 8291 §4: a push message body is a single record of at most 4096 octets. */
export const MAX_PUSH_BODY = 4096;

export function parseEceHeader(body: Uint8Array): EceHeader {
  const buf = Buffer.from(body);
  if (buf.length < 21) throw new EceError(`The body is ${buf.length} octets: too short for an aes128gcm header (21 or more).`);
  const salt = buf.subarray(0, 16);
  const recordSize = buf.readUInt32BE(16);
  const idLength = buf[20];
  if (recordSize < MIN_RECORD_SIZE) throw new EceError(`Record size ${recordSize} is below ${MIN_RECORD_SIZE}, which RFC 8188 §2.1 forbids.`);
  if (buf.length < 21 + idLength) throw new EceError("The header's key id runs past the end of the body.");
  return { salt: Buffer.from(salt), recordSize, keyId: Buffer.from(buf.subarray(21, 21 + idLength)), length: 21 + idLength };
}

export function buildEceHeader({ salt, recordSize, keyId }: { salt: Uint8Array; recordSize: number; keyId: Uint8Array }): Buffer {
  if (salt.length !== 16) throw new EceError("The salt must be 16 octets.");
  if (keyId.length > 255) throw new EceError("The key id must be at most 255 octets.");
  const head = Buffer.alloc(21);
  Buffer.from(salt).copy(head, 0);
  head.writeUInt32BE(recordSize, 16);
  head[20] = keyId.length;
  return Buffer.concat([head, Buffer.from(keyId)]);
}

const hmac = (key: Uint8Array, data: Uint8Array) => createHmac("sha256", key).update(data).digest();

/** RFC 8291 §3.3–3.4 and RFC 8188 §2.2–2.3: the content-encryption key and base nonce. */
export function deriveWebPushKeys({ ecdhSecret, authSecret, uaPublic, asPublic, salt }: { ecdhSecret: Uint8Array; authSecret: Uint8Array; uaPublic: Uint8Array; asPublic: Uint8Array; salt: Uint8Array }) {
  const prkKey = hmac(authSecret, ecdhSecret);
  const keyInfo = Buffer.concat([Buffer.from("WebPush: info\0", "latin1"), Buffer.from(uaPublic), Buffer.from(asPublic)]);
  const ikm = hmac(prkKey, Buffer.concat([keyInfo, Buffer.from([1])]));
  const prk = hmac(salt, ikm);
  const cek = hmac(prk, Buffer.from("Content-Encoding: aes128gcm\0\x01", "latin1")).subarray(0, 16);
  const nonce = hmac(prk, Buffer.from("Content-Encoding: nonce\0\x01", "latin1")).subarray(0, 12);
  return { cek, nonce };
}

/** RFC 8188 §2.3: the record nonce is the base nonce XOR the record sequence number (big-endian, right-aligned). */
function recordNonce(base: Buffer, seq: number): Buffer {
  const nonce = Buffer.from(base);
  // Sequence numbers here stay far below 2^32, so only the last four octets change.
  nonce.writeUInt32BE((nonce.readUInt32BE(8) ^ seq) >>> 0, 8);
  return nonce;
}

export type UaKeys = {
  /** The user agent's P-256 private key, the 32-octet scalar. */
  privateKey: Uint8Array;
  /** Its uncompressed public point, 65 octets starting 0x04. */
  publicKey: Uint8Array;
  /** The 16-octet authentication secret. */
  authSecret: Uint8Array;
};

/**
 * Decrypts an aes128gcm Web Push body as the user agent would (RFC 8291 §3.4):
 * the key id is the application server's ephemeral public key.
 */
export function decryptWebPush(body: Uint8Array, ua: UaKeys): Buffer {
  const header = parseEceHeader(body);
  if (header.keyId.length !== 65 || header.keyId[0] !== 0x04) throw new EceError("The key id is not an uncompressed P-256 public key (65 octets), as RFC 8291 §4 requires.");
  const ecdh = createECDH("prime256v1");
  ecdh.setPrivateKey(Buffer.from(ua.privateKey));
  let ecdhSecret: Buffer;
  try {
    ecdhSecret = ecdh.computeSecret(header.keyId);
  } catch {
    throw new EceError("The key id is not a point on P-256.");
  }
  const { cek, nonce } = deriveWebPushKeys({ ecdhSecret, authSecret: ua.authSecret, uaPublic: ua.publicKey, asPublic: header.keyId, salt: header.salt });
  return decryptRecords(Buffer.from(body).subarray(header.length), header.recordSize, cek, nonce);
}

/** Decrypts the records after the header and strips each record's padding (RFC 8188 §2). */
export function decryptRecords(ciphertext: Buffer, recordSize: number, cek: Uint8Array, baseNonce: Buffer): Buffer {
  if (ciphertext.length === 0) throw new EceError("There is no record after the header.");
  const out: Buffer[] = [];
  let seq = 0;
  for (let start = 0; start < ciphertext.length; start += recordSize, seq++) {
    const record = ciphertext.subarray(start, Math.min(start + recordSize, ciphertext.length));
    const isLast = start + recordSize >= ciphertext.length;
    if (record.length <= TAG_LENGTH) throw new EceError(`Record ${seq} is too short to hold its 16-octet tag.`);
    const decipher = createDecipheriv("aes-128-gcm", cek, recordNonce(baseNonce, seq));
    decipher.setAuthTag(record.subarray(record.length - TAG_LENGTH));
    let plain: Buffer;
    try {
      plain = Buffer.concat([decipher.update(record.subarray(0, record.length - TAG_LENGTH)), decipher.final()]);
    } catch {
      throw new EceError(`Record ${seq} failed authentication: wrong keys, or the body was altered.`);
    }
    // Padding: a delimiter octet (2 for the last record, 1 otherwise) followed by zeros.
    let end = plain.length - 1;
    while (end >= 0 && plain[end] === 0) end--;
    if (end < 0) throw new EceError(`Record ${seq} has no padding delimiter.`);
    const delimiter = plain[end];
    if (delimiter !== (isLast ? 2 : 1)) throw new EceError(`Record ${seq} ends with delimiter ${delimiter}; RFC 8188 §2 wants ${isLast ? 2 : 1}.`);
    out.push(plain.subarray(0, end));
  }
  return Buffer.concat(out);
}

/**
 * Encrypts a push message for a user agent (RFC 8291 §3.4) as one record.
 * `asPrivateKey` and `salt` are for reproducing published examples; normally
 * both are fresh and random.
 */
export function encryptWebPush({
  plaintext,
  uaPublic,
  authSecret,
  asPrivateKey,
  salt = randomBytes(16),
  recordSize = MAX_PUSH_BODY,
}: {
  plaintext: Uint8Array;
  uaPublic: Uint8Array;
  authSecret: Uint8Array;
  asPrivateKey?: Uint8Array;
  salt?: Uint8Array;
  recordSize?: number;
}): Buffer {
  const ecdh = createECDH("prime256v1");
  if (asPrivateKey) ecdh.setPrivateKey(Buffer.from(asPrivateKey));
  else ecdh.generateKeys();
  const asPublic = ecdh.getPublicKey();
  const ecdhSecret = ecdh.computeSecret(Buffer.from(uaPublic));
  const { cek, nonce } = deriveWebPushKeys({ ecdhSecret, authSecret, uaPublic, asPublic, salt });
  const header = buildEceHeader({ salt, recordSize, keyId: asPublic });
  if (header.length + plaintext.length + 1 + TAG_LENGTH > recordSize) throw new EceError("The message does not fit in one record.");
  const cipher = createCipheriv("aes-128-gcm", cek, nonce);
  const sealed = Buffer.concat([cipher.update(Buffer.concat([Buffer.from(plaintext), Buffer.from([2])])), cipher.final(), cipher.getAuthTag()]);
  return Buffer.concat([header, sealed]);
}

/** A fresh user-agent key pair and auth secret, as a browser's push stack makes for each subscription. */
export function generateUaKeys(): UaKeys {
  const ecdh = createECDH("prime256v1");
  ecdh.generateKeys();
  return { privateKey: ecdh.getPrivateKey(), publicKey: ecdh.getPublicKey(), authSecret: randomBytes(16) };
}

/** Whether `bytes` is an uncompressed point on P-256 (what p256dh must hold). */
export function isP256Point(bytes: Uint8Array): boolean {
  if (bytes.length !== 65 || bytes[0] !== 0x04) return false;
  try {
    const probe = createECDH("prime256v1");
    probe.generateKeys();
    probe.computeSecret(Buffer.from(bytes));
    return true;
  } catch {
    return false;
  }
}
