import webpush from "web-push";
import { describe, expect, it } from "vitest";
import { createVapidJwt, MAX_VAPID_AHEAD_S, parseVapidAuthorization, VapidError, verifyVapid } from "@/lib/push/vapid";

const keys = webpush.generateVAPIDKeys();
const other = webpush.generateVAPIDKeys();
const AUD = "http://127.0.0.1:2530";
const NOW = 1_790_000_000;

const header = (claims: Record<string, unknown>, k = keys, jwtHeader?: Record<string, unknown>) =>
  `vapid t=${createVapidJwt({ claims, publicKey: k.publicKey, privateKey: k.privateKey, header: jwtHeader })}, k=${k.publicKey}`;
const check = (authorization: string, nowS = NOW) => verifyVapid({ authorization, audience: AUD, nowS });
const refusal = (authorization: string, nowS = NOW) => {
  try {
    check(authorization, nowS);
  } catch (error) {
    if (error instanceof VapidError) return { status: error.status, message: error.message };
    throw error;
  }
  return null;
};

describe("RFC 8292 VAPID claims as the local push service checks them", () => {
  it("accepts the header web-push builds for this audience (ES256, aud = origin, exp 12 h ahead)", () => {
    const { Authorization } = webpush.getVapidHeaders(AUD, "mailto:notices@joulepath.invalid", keys.publicKey, keys.privateKey, "aes128gcm");
    // RFC 8292 §3: "Authorization: vapid t=<JWT>, k=<public key>".
    expect(Authorization).toMatch(/^vapid t=[\w-]+\.[\w-]+\.[\w-]+, k=[\w-]+$/);
    const { claims, key } = verifyVapid({ authorization: Authorization, audience: AUD, nowS: Math.floor(Date.now() / 1000) });
    expect(claims).toMatchObject({ aud: AUD, sub: "mailto:notices@joulepath.invalid" });
    expect(key).toBe(keys.publicKey);
  });

  it("accepts an exp exactly 24 h ahead and refuses 24 h + 1 s (RFC 8292 §2)", () => {
    expect(MAX_VAPID_AHEAD_S).toBe(86_400);
    expect(check(header({ aud: AUD, exp: NOW + 86_400, sub: "mailto:a@example.invalid" })).claims.exp).toBe(NOW + 86_400);
    const late = refusal(header({ aud: AUD, exp: NOW + 86_401, sub: "mailto:a@example.invalid" }));
    expect(late?.status).toBe(403);
    expect(late?.message).toMatch(/at most 24 hours/);
  });

  it("refuses an expired token, and one without exp (RFC 8292 §2)", () => {
    expect(refusal(header({ aud: AUD, exp: NOW }))?.message).toMatch(/expired/);
    expect(refusal(header({ aud: AUD }))?.message).toMatch(/no numeric exp/);
  });

  it("refuses an audience that is not this service's origin (RFC 8292 §2: aud is the origin of the push resource)", () => {
    expect(refusal(header({ aud: "http://127.0.0.1:2630", exp: NOW + 60 }))?.status).toBe(403);
    expect(refusal(header({ aud: `${AUD}/push/x`, exp: NOW + 60 }))?.status).toBe(403);
  });

  it("refuses other algorithms, a signature by another key, and a sub that is not mailto: or https: (RFC 8292 §2, §2.1)", () => {
    expect(refusal(header({ aud: AUD, exp: NOW + 60 }, keys, { typ: "JWT", alg: "HS256" }))?.message).toMatch(/ES256/);
    const forged = header({ aud: AUD, exp: NOW + 60 }, other).replace(/k=.*$/, `k=${keys.publicKey}`);
    expect(refusal(forged)?.message).toMatch(/signature does not match/);
    expect(refusal(header({ aud: AUD, exp: NOW + 60, sub: "http://example.invalid" }))?.status).toBe(403);
  });

  it("parses t and k in any order, and refuses other schemes or missing parts (RFC 8292 §3)", () => {
    expect(parseVapidAuthorization("vapid k=abc,t=x.y.z")).toEqual({ token: "x.y.z", key: "abc" });
    for (const bad of [undefined, "", "Bearer x.y.z", "WebPush x.y.z", "vapid t=x.y.z", "vapid k=abc"]) {
      expect(() => parseVapidAuthorization(bad)).toThrow(VapidError);
    }
    expect(refusal(`vapid t=a.b.c, k=${keys.publicKey.slice(0, 40)}`)?.status).toBe(401);
  });
});
