import type { FieldValues, Path, UseFormSetError } from "react-hook-form";
import { ApiError, fetchJson } from "@/components/api/fetch-json";

/**
 * Sends a form as JSON. Field messages from the server (422 or a domain error
 * with `fields`) land on their inputs; anything else becomes the form's root error.
 */
export async function submitJson<T extends FieldValues, R = unknown>(
  url: string,
  body: unknown,
  setError: UseFormSetError<T>,
  method: "POST" | "PATCH" | "PUT" | "DELETE" = "POST",
): Promise<R | undefined> {
  try {
    return await fetchJson<R>(url, { method, headers: { "content-type": "application/json" }, body: JSON.stringify(body) });
  } catch (err) {
    if (err instanceof ApiError) {
      const fields = (err.body as { fields?: Record<string, string[]> } | undefined)?.fields;
      let placed = false;
      if (fields) {
        for (const [name, messages] of Object.entries(fields)) {
          if (name === "_") continue;
          setError(name as Path<T>, { type: "server", message: messages[0] });
          placed = true;
        }
      }
      if (!placed || err.status !== 422) setError("root.server" as Path<T>, { type: "server", message: err.message });
    } else {
      setError("root.server" as Path<T>, { type: "server", message: "The console could not reach the server. Check the connection and try again." });
    }
    return undefined;
  }
}
