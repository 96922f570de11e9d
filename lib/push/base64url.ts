/** Base64url without padding (RFC 4648 §5), the encoding Web Push uses for keys and JWTs. */
export function toB64u(bytes: Uint8Array): string {
  return Buffer.from(bytes).toString("base64url");
}

/** Decodes base64url (padding tolerated); returns null for anything else, so callers can say which field is wrong. */
export function fromB64u(text: string): Buffer | null {
  const trimmed = text.replace(/=+$/, "");
  if (!/^[A-Za-z0-9_-]*$/.test(trimmed)) return null;
  if (trimmed.length % 4 === 1) return null;
  return Buffer.from(trimmed, "base64url");
}
