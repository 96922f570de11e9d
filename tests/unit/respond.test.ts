import { describe, expect, it, vi } from "vitest";
import { z } from "zod";
import { errorResponse, fieldErrors } from "@/lib/api/respond";
import { AppError } from "@/lib/errors";

describe("errorResponse", () => {
  it("turns a zod error into 422 with messages per field", async () => {
    const r = z.object({ name: z.string().min(2), nested: z.object({ n: z.number() }) }).safeParse({ name: "x", nested: { n: "1" } });
    expect(r.success).toBe(false);
    const res = errorResponse(r.error);
    expect(res.status).toBe(422);
    const body = await res.json();
    expect(Object.keys(body.fields).sort()).toEqual(["name", "nested.n"]);
  });

  it.each([
    ["unauthenticated", 401],
    ["forbidden", 403],
    ["not_found", 404],
    ["conflict", 409],
    ["too_large", 413],
    ["rate_limited", 429],
  ] as const)("maps AppError %s to %i", (code, status) => {
    expect(errorResponse(new AppError(code, "m")).status).toBe(status);
  });

  it("hides the internals of an unexpected error behind a 500", async () => {
    const spy = vi.spyOn(console, "error").mockImplementation(() => undefined);
    const res = errorResponse(new Error("SQLITE_CORRUPT at /secret/path"));
    expect(res.status).toBe(500);
    expect(JSON.stringify(await res.json())).not.toContain("secret");
    expect(spy).toHaveBeenCalled();
    spy.mockRestore();
  });

  it("keys form-level problems under _", () => {
    const r = z.string().safeParse(3);
    expect(fieldErrors(r.error!)).toHaveProperty("_");
  });
});
