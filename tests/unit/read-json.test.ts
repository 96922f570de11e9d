import { describe, expect, it } from "vitest";
import { z } from "zod";
import { readJson, readLimitedText } from "@/lib/auth/route";

/** A request whose body arrives in chunks with no Content-Length, as a chunked upload does. */
function chunked(parts: string[]): Request {
  const bytes = parts.map((p) => new TextEncoder().encode(p));
  let pulled = 0;
  const body = new ReadableStream<Uint8Array>({
    pull(controller) {
      if (pulled < bytes.length) controller.enqueue(bytes[pulled++]);
      else controller.close();
    },
  });
  return new Request("http://localhost/x", { method: "POST", body, duplex: "half" } as RequestInit);
}

describe("readJson", () => {
  it("counts bytes, not characters: 40 × 'é' is 80 bytes", async () => {
    const body = JSON.stringify({ name: "é".repeat(40) });
    await expect(readJson(chunked([body]), z.object({ name: z.string() }), 60)).rejects.toMatchObject({ code: "too_large" });
    await expect(readJson(chunked([body]), z.object({ name: z.string() }), 200)).resolves.toEqual({ name: "é".repeat(40) });
  });

  it("stops reading a chunked body as soon as it passes the limit", async () => {
    const chunks = Array.from({ length: 1000 }, () => "x".repeat(1024));
    const request = chunked(chunks);
    await expect(readLimitedText(request, 10 * 1024)).rejects.toMatchObject({ code: "too_large" });
  });

  it("keeps a multi-byte character split across chunks whole", async () => {
    const bytes = new TextEncoder().encode("\"ü\"");
    const body = new ReadableStream<Uint8Array>({
      start(c) {
        c.enqueue(bytes.slice(0, 2));
        c.enqueue(bytes.slice(2));
        c.close();
      },
    });
    const request = new Request("http://localhost/x", { method: "POST", body, duplex: "half" } as RequestInit);
    await expect(readJson(request, z.string())).resolves.toBe("ü");
  });
});
