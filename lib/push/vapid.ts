/**
 * VAPID (RFC 8292): the application server proves who it is to a push service
 * with an ES256-signed JWT in `Authorization: vapid t=<jwt>, k=<public key>`.
 * The local push service verifies with `verifyVapid`; `createVapidJwt` signs
 * (for tests and tools; the notice worker lets web-push sign).
 */
import { createPrivateKey, createPublicKey, sign, verify, type KeyObject } from "node:crypto";
import { fromB64u, toB64u } from "./base64url";

/** RFC 8292 §2: a push service refuses an `exp` more than 24 hours ahead. */
export const MAX_VAPID_AHEAD_S = 24 * 60 * 60;

export type VapidClaims = { aud: string; exp: number; sub?: string };

export class VapidError extends Error {
  /** 401: no usable credentials; 403: valid credentials that this service will not accept (RFC 8292 §4.2). */
  constructor(
    readonly status: 401 | 403,
    message: string,
  ) {
    super(message);
    this.name = "VapidError";
  }
}

/** Parses `vapid t=…, k=…` (RFC 8292 §3); parameter order and spacing are free. */
export function parseVapidAuthorization(header: string | null | undefined): { token: string; key: string } {
  if (!header) throw new VapidError(401, "No Authorization header: VAPID (RFC 8292) is required.");
  const match = /^vapid\s+(.*)$/i.exec(header.trim());
  if (!match) throw new VapidError(401, 'The Authorization scheme is not "vapid" (RFC 8292 §3).');
  const params = new Map<string, string>();
  for (const part of match[1].split(",")) {
    const eq = part.indexOf("=");
    if (eq < 0) continue;
    params.set(part.slice(0, eq).trim().toLowerCase(), part.slice(eq + 1).trim().replace(/^"(.*)"$/, "$1"));
  }
  const token = params.get("t");
  const key = params.get("k");
  if (!token || !key) throw new VapidError(401, "The vapid Authorization needs both t (the JWT) and k (the public key).");
  return { token, key };
}

/** The application server's public key (65-octet uncompressed P-256 point, base64url) as a KeyObject. */
export function publicKeyFromRaw(raw: string): KeyObject {
  const bytes = fromB64u(raw);
  if (!bytes || bytes.length !== 65 || bytes[0] !== 0x04) throw new VapidError(401, "k is not an uncompressed P-256 public key in base64url (RFC 8292 §3.2).");
  try {
    return createPublicKey({ key: { kty: "EC", crv: "P-256", x: toB64u(bytes.subarray(1, 33)), y: toB64u(bytes.subarray(33)) }, format: "jwk" });
  } catch {
    throw new VapidError(401, "k is not a point on P-256.");
  }
}

function privateKeyFromRaw(rawPrivate: string, rawPublic: string): KeyObject {
  const d = fromB64u(rawPrivate);
  const pub = fromB64u(rawPublic);
  if (!d || d.length !== 32 || !pub || pub.length !== 65) throw new Error("A VAPID key pair is a 32-octet private and a 65-octet public key in base64url.");
  return createPrivateKey({ key: { kty: "EC", crv: "P-256", d: toB64u(d), x: toB64u(pub.subarray(1, 33)), y: toB64u(pub.subarray(33)) }, format: "jwk" });
}

/** Signs a VAPID JWT (ES256, RFC 7515 with the raw r‖s signature of RFC 7518 §3.4). */
export function createVapidJwt({ claims, publicKey, privateKey, header = { typ: "JWT", alg: "ES256" } }: { claims: Record<string, unknown>; publicKey: string; privateKey: string; header?: Record<string, unknown> }): string {
  const input = `${toB64u(Buffer.from(JSON.stringify(header)))}.${toB64u(Buffer.from(JSON.stringify(claims)))}`;
  const signature = sign("sha256", Buffer.from(input), { key: privateKeyFromRaw(privateKey, publicKey), dsaEncoding: "ieee-p1363" });
  return `${input}.${toB64u(signature)}`;
}

function decodeJson(part: string, what: string): Record<string, unknown> {
  const bytes = fromB64u(part);
  try {
    const value: unknown = bytes ? JSON.parse(bytes.toString("utf8")) : null;
    if (value && typeof value === "object" && !Array.isArray(value)) return value as Record<string, unknown>;
  } catch {
    // fall through
  }
  throw new VapidError(401, `The JWT ${what} is not base64url JSON.`);
}

/**
 * Verifies a VAPID Authorization header for a push service at `audience` (its
 * origin, e.g. "http://127.0.0.1:2530"). Returns the claims and the key.
 * `nowS` is the current time in seconds since the epoch.
 */
export function verifyVapid({ authorization, audience, nowS }: { authorization: string | null | undefined; audience: string; nowS: number }): { claims: VapidClaims; key: string } {
  const { token, key } = parseVapidAuthorization(authorization);
  const parts = token.split(".");
  if (parts.length !== 3) throw new VapidError(401, "t is not a JWT (three dot-separated parts).");
  const header = decodeJson(parts[0], "header");
  // RFC 8292 §2: the JWT MUST use ES256.
  if (header.alg !== "ES256") throw new VapidError(401, `The JWT is signed with ${String(header.alg)}; VAPID requires ES256 (RFC 8292 §2).`);
  const signature = fromB64u(parts[2]);
  if (!signature || signature.length !== 64) throw new VapidError(401, "The JWT signature is not a 64-octet ES256 signature.");
  const isValid = verify("sha256", Buffer.from(`${parts[0]}.${parts[1]}`), { key: publicKeyFromRaw(key), dsaEncoding: "ieee-p1363" }, signature);
  if (!isValid) throw new VapidError(401, "The JWT signature does not match the key in k.");

  const claims = decodeJson(parts[1], "claims");
  // RFC 8292 §2: "aud" is the origin of the push resource.
  if (claims.aud !== audience) throw new VapidError(403, `The JWT audience is ${JSON.stringify(claims.aud)}; this push service is ${audience} (RFC 8292 §2).`);
  if (typeof claims.exp !== "number" || !Number.isFinite(claims.exp)) throw new VapidError(401, "The JWT has no numeric exp claim (RFC 8292 §2).");
  if (claims.exp <= nowS) throw new VapidError(401, "The JWT has expired.");
  // RFC 8292 §2: exp MUST NOT be more than 24 hours from the time of the request.
  if (claims.exp > nowS + MAX_VAPID_AHEAD_S) throw new VapidError(403, `The JWT expires ${claims.exp - nowS} s from now; RFC 8292 §2 allows at most 24 hours (${MAX_VAPID_AHEAD_S} s).`);
  if (claims.sub !== undefined && (typeof claims.sub !== "string" || !/^(mailto:|https:)/.test(claims.sub))) {
    throw new VapidError(403, 'The JWT "sub" must be a mailto: or https: URI (RFC 8292 §2.1).');
  }
  return { claims: { aud: claims.aud, exp: claims.exp, ...(typeof claims.sub === "string" ? { sub: claims.sub } : {}) }, key };
}
