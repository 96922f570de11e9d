import { z } from "zod";
import { AppError } from "@/lib/errors";

export type FieldErrors = Record<string, string[]>;

/** Flattens a zod error into `{ "field.path": ["message", …] }` for forms and API clients. */
export function fieldErrors(error: z.ZodError): FieldErrors {
  const out: FieldErrors = {};
  for (const issue of error.issues) {
    const key = issue.path.length ? issue.path.join(".") : "_";
    (out[key] ??= []).push(issue.message);
  }
  return out;
}

/**
 * The one place that turns an exception into a response: zod → 422 with field
 * messages, AppError → its status, anything else → a logged 500 that shows no
 * internals.
 */
export function errorResponse(err: unknown): Response {
  if (err instanceof z.ZodError) {
    return Response.json({ error: "invalid_input", message: "Some fields are not valid.", fields: fieldErrors(err) }, { status: 422 });
  }
  if (err instanceof AppError) {
    return Response.json({ ...err.details, error: err.code, message: err.message }, { status: err.status });
  }
  console.error("[api] unexpected error", err);
  return Response.json({ error: "internal", message: "Something went wrong on the server. It has been logged." }, { status: 500 });
}

