/** Domain errors carry a code that maps to an HTTP status at the edge. */
export type AppErrorCode = "unauthenticated" | "forbidden" | "not_found" | "conflict" | "too_large" | "rate_limited" | "bad_request" | "unavailable";

export const APP_ERROR_STATUS: Record<AppErrorCode, number> = {
  bad_request: 400,
  unauthenticated: 401,
  forbidden: 403,
  not_found: 404,
  conflict: 409,
  too_large: 413,
  rate_limited: 429,
  unavailable: 503,
};

export class AppError extends Error {
  readonly code: AppErrorCode;
  readonly details?: Record<string, unknown>;

  constructor(code: AppErrorCode, message: string, details?: Record<string, unknown>) {
    super(message);
    this.name = "AppError";
    this.code = code;
    this.details = details;
  }

  get status(): number {
    return APP_ERROR_STATUS[this.code];
  }
}
