/** An API error with the server's message, for react-query's error state. */
export class ApiError extends Error {
  constructor(
    readonly status: number,
    message: string,
    readonly body?: unknown,
  ) {
    super(message);
    this.name = "ApiError";
  }
}

export async function fetchJson<T>(input: string, init?: RequestInit): Promise<T> {
  const res = await fetch(input, { ...init, headers: { accept: "application/json", ...init?.headers } });
  const body: unknown = await res.json().catch(() => undefined);
  if (!res.ok) {
    const message = typeof body === "object" && body && "message" in body ? String((body as { message: unknown }).message) : `Request failed (${res.status})`;
    throw new ApiError(res.status, message, body);
  }
  return body as T;
}
