import { createCipheriv } from "node:crypto";
import webpush from "web-push";
import { describe, expect, it } from "vitest";
import { buildEceHeader, decryptRecords, decryptWebPush, deriveWebPushKeys, EceError, encryptWebPush, generateUaKeys, isP256Point, parseEceHeader } from "@/lib/push/ece";

const b = (s: string) => Buffer.from(s, "base64url");

// RFC 8291 Appendix A (values as published; references.md "Web push").
const A = {
  plaintext: b("V2hlbiBJIGdyb3cgdXAsIEkgd2FudCB0byBiZSBhIHdhdGVybWVsb24"),
  uaPrivate: b("q1dXpw3UpT5VOmu_cf_v6ih07Aems3njxI-JWgLcM94"),
  uaPublic: b("BCVxsr7N_eNgVRqvHtD0zTZsEc6-VV-JvLexhqUzORcxaOzi6-AYWXvTBHm4bjyPjs7Vd8pZGH6SRpkNtoIAiw4"),
  asPrivate: b("yfWPiYE-n46HLnH0KqZOF1fJJU3MYrct3AELtAQ-oRw"),
  asPublic: b("BP4z9KsN6nGRTbVYI_c7VJSPQTBtkgcy27mlmlMoZIIgDll6e3vCYLocInmYWAmS6TlzAC8wEqKK6PBru3jl7A8"),
  auth: b("BTBZMqHH6r4Tts7J_aSIgg"),
  salt: b("DGv6ra1nlYgDCS1FRnbzlw"),
  body: b("DGv6ra1nlYgDCS1FRnbzlwAAEABBBP4z9KsN6nGRTbVYI_c7VJSPQTBtkgcy27mlmlMoZIIgDll6e3vCYLocInmYWAmS6TlzAC8wEqKK6PBru3jl7A_yl95bQpu6cVPTpK4Mqgkf1CXztLVBSt2Ks3oZwbuwXPXLWyouBWLVWGNWQexSgSxsj_Qulcy4a-fN"),
};
const ua = { privateKey: A.uaPrivate, publicKey: A.uaPublic, authSecret: A.auth };

describe("RFC 8291 Appendix A through lib/push/ece.ts (the push service's decryption)", () => {
  it("decrypts the published body with the published keys to the published plaintext", () => {
    // RFC 8291 Appendix A: the body is 144 octets and the plaintext reads "When I grow up, I want to be a watermelon".
    expect(A.body.length).toBe(144);
    const plain = decryptWebPush(A.body, ua);
    expect(plain.equals(A.plaintext)).toBe(true);
    expect(plain.toString("utf8")).toBe("When I grow up, I want to be a watermelon");
  });

  it("encrypts the published plaintext with the published sender key and salt to the published body, octet for octet", () => {
    // RFC 8291 Appendix A (rs = 4096).
    const body = encryptWebPush({ plaintext: A.plaintext, uaPublic: A.uaPublic, authSecret: A.auth, asPrivateKey: A.asPrivate, salt: A.salt, recordSize: 4096 });
    expect(body.toString("base64url")).toBe(A.body.toString("base64url"));
  });

  it("refuses the published body when one octet is changed, or with another auth secret", () => {
    const altered = Buffer.from(A.body);
    altered[altered.length - 1] ^= 0x01;
    expect(() => decryptWebPush(altered, ua)).toThrow(/failed authentication/);
    expect(() => decryptWebPush(A.body, { ...ua, authSecret: Buffer.alloc(16, 7) })).toThrow(EceError);
  });

  it("reads what web-push (the npm package the worker sends with) encrypts for a fresh browser key pair", () => {
    const keys = generateUaKeys();
    const sealed = webpush.encrypt(Buffer.from(keys.publicKey).toString("base64url"), Buffer.from(keys.authSecret).toString("base64url"), "Someone is on the front path (18:00).", "aes128gcm");
    expect(decryptWebPush(sealed.cipherText, keys).toString()).toBe("Someone is on the front path (18:00).");
  });
});

describe("RFC 8188 §2.1 header layout and record size", () => {
  it("splits the published body's header: salt 16 ‖ rs uint32 BE ‖ idlen ‖ keyid", () => {
    const h = parseEceHeader(A.body);
    // RFC 8188 §2.1: salt is the first 16 octets.
    expect(h.salt.equals(A.salt)).toBe(true);
    // RFC 8188 §2.1: rs is a 32-bit unsigned big-endian integer; the example uses 4096 = 00 00 10 00.
    expect([...A.body.subarray(16, 20)]).toEqual([0x00, 0x00, 0x10, 0x00]);
    expect(h.recordSize).toBe(4096);
    // RFC 8291 §4: keyid is the sender's 65-octet uncompressed public key, so idlen = 65 (0x41).
    expect(A.body[20]).toBe(65);
    expect(h.keyId.equals(A.asPublic)).toBe(true);
    expect(h.length).toBe(86);
  });

  it("refuses a record size below 18 (RFC 8188 §2.1) and a header cut short", () => {
    const small = buildEceHeader({ salt: A.salt, recordSize: 17, keyId: A.asPublic });
    expect(() => parseEceHeader(Buffer.concat([small, Buffer.alloc(20)]))).toThrow(/below 18/);
    const ok = buildEceHeader({ salt: A.salt, recordSize: 18, keyId: A.asPublic });
    expect(parseEceHeader(Buffer.concat([ok, Buffer.alloc(20)])).recordSize).toBe(18);
    expect(() => parseEceHeader(A.body.subarray(0, 20))).toThrow(/too short/);
    expect(() => parseEceHeader(A.body.subarray(0, 40))).toThrow(/runs past the end/);
  });

  it("builds the same header it parses", () => {
    const header = buildEceHeader({ salt: A.salt, recordSize: 4096, keyId: A.asPublic });
    expect(header.equals(A.body.subarray(0, 86))).toBe(true);
  });

  it("decrypts several records, each nonce being the base nonce XOR its sequence number (RFC 8188 §2.3), delimiter 1 then 2 (§2)", () => {
    const { cek, nonce } = deriveWebPushKeys({ ecdhSecret: Buffer.alloc(32, 1), authSecret: A.auth, uaPublic: A.uaPublic, asPublic: A.asPublic, salt: A.salt });
    const rs = 18 + 4; // 4 octets of text + delimiter + 16-octet tag … plus one octet of padding
    const seal = (seq: number, plain: Buffer) => {
      const n = Buffer.from(nonce);
      n.writeUInt32BE((n.readUInt32BE(8) ^ seq) >>> 0, 8);
      const c = createCipheriv("aes-128-gcm", cek, n);
      return Buffer.concat([c.update(plain), c.final(), c.getAuthTag()]);
    };
    const r0 = seal(0, Buffer.from([...Buffer.from("abcd"), 1, 0]));
    const r1 = seal(1, Buffer.from([...Buffer.from("ef"), 2]));
    expect(r0.length).toBe(rs);
    expect(decryptRecords(Buffer.concat([r0, r1]), rs, cek, nonce).toString()).toBe("abcdef");
    // Swapped records fail: each is sealed under its own nonce.
    expect(() => decryptRecords(Buffer.concat([r1, r0]), rs, cek, nonce)).toThrow(EceError);
  });

  it("tells a P-256 point from other 65-octet strings", () => {
    expect(isP256Point(A.uaPublic)).toBe(true);
    const off = Buffer.from(A.uaPublic);
    off[64] ^= 1;
    expect(isP256Point(off)).toBe(false);
    expect(isP256Point(Buffer.alloc(65, 4))).toBe(false);
  });
});
