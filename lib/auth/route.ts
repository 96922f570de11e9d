import "server-only";
import { z } from "zod";
import { getMembership } from "@/db/queries/members";
import type { Membership } from "@/db/schema";
import { errorResponse } from "@/lib/api/respond";
import { env } from "@/lib/env";
import { AppError } from "@/lib/errors";
import { siteParamsSchema } from "@/lib/validation/site";
import { isSameOrigin, isStateChanging } from "./origin";
import { can, type Permission } from "./permissions";
import { readSessionCookie, refreshedSessionCookie, validateSessionId, type AuthUser } from "./session";
import type { Session } from "lucia";

type RouteContext = { params: Promise<Record<string, string | string[]>> };

type Base<P> = { request: Request; params: P; session: Session | null };
export type PublicCtx<P> = Base<P> & { user: AuthUser | null };
export type UserCtx<P> = Base<P> & { user: AuthUser; session: Session };
export type SiteCtx<P> = UserCtx<P> & { siteId: string; membership: Membership };

type Options<S extends z.ZodType> = { params?: S };

async function resolve(request: Request) {
  const sessionId = readSessionCookie(request.headers.get("cookie"));
  const auth = await validateSessionId(sessionId);
  return auth;
}

function guardOrigin(request: Request) {
  if (isStateChanging(request.method) && !isSameOrigin(request, env().APP_URL)) {
    throw new AppError("forbidden", "This request did not come from the Joulepath console.");
  }
}

function finish(res: Response, session: Session | null): Response {
  const cookie = session ? refreshedSessionCookie(session) : null;
  if (cookie) res.headers.append("set-cookie", cookie);
  return res;
}

/**
 * Route handler wrappers: each resolves the session from the cookie, checks
 * the Origin of state changes, parses params with zod and turns errors into
 * responses. `siteRoute` also checks the caller's role on that site against
 * the permission table; a site you are not a member of answers 404.
 */
export function publicRoute<S extends z.ZodType = z.ZodUnknown>(fn: (ctx: PublicCtx<z.infer<S>>) => Promise<Response>, options: Options<S> = {}) {
  return async (request: Request, context?: RouteContext): Promise<Response> => {
    try {
      guardOrigin(request);
      const params = options.params ? options.params.parse(await context?.params) : undefined;
      const { user, session } = await resolve(request);
      return finish(await fn({ request, params: params as z.infer<S>, user, session }), session);
    } catch (err) {
      return errorResponse(err);
    }
  };
}

export function userRoute<S extends z.ZodType = z.ZodUnknown>(fn: (ctx: UserCtx<z.infer<S>>) => Promise<Response>, options: Options<S> = {}) {
  return async (request: Request, context?: RouteContext): Promise<Response> => {
    try {
      const { user, session } = await resolve(request);
      if (!user) throw new AppError("unauthenticated", "Sign in to continue.");
      guardOrigin(request);
      const params = options.params ? options.params.parse(await context?.params) : undefined;
      return finish(await fn({ request, params: params as z.infer<S>, user, session }), session);
    } catch (err) {
      return errorResponse(err);
    }
  };
}

export function siteRoute<S extends z.ZodType<{ siteId: string }> = typeof siteParamsSchema>(
  permission: Permission,
  fn: (ctx: SiteCtx<z.infer<S>>) => Promise<Response>,
  options: Options<S> = {},
) {
  return async (request: Request, context?: RouteContext): Promise<Response> => {
    try {
      const { user, session } = await resolve(request);
      if (!user) throw new AppError("unauthenticated", "Sign in to continue.");
      guardOrigin(request);
      const raw = await context?.params;
      // Who may ask comes first: the other params are only parsed for a member with the permission,
      // so a non-member learns nothing about a site (not even which ids it would refuse).
      const { siteId } = siteParamsSchema.pick({ siteId: true }).strip().parse(raw);
      const membership = await getMembership({ siteId, userId: user.id });
      // Not a member: the site does not exist as far as this caller can tell.
      if (!membership) throw new AppError("not_found", "No such site.");
      if (!can(membership.role, permission)) throw new AppError("forbidden", "Your role on this site does not allow this.");
      const params = (options.params ?? siteParamsSchema).parse(raw) as z.infer<S>;
      return finish(await fn({ request, params, user, session, siteId: params.siteId, membership }), session);
    } catch (err) {
      return errorResponse(err);
    }
  };
}

/** Reads a JSON body (at most `maxBytes`) and parses it with a schema; bad JSON is a 400, bad fields a 422. */
export async function readJson<S extends z.ZodType>(request: Request, schema: S, maxBytes = 64 * 1024): Promise<z.infer<S>> {
  const length = Number(request.headers.get("content-length") ?? "0");
  if (length > maxBytes) throw new AppError("too_large", `The request body is larger than ${maxBytes} bytes.`);
  const text = await readLimitedText(request, maxBytes);
  let data: unknown;
  try {
    data = text ? JSON.parse(text) : {};
  } catch {
    throw new AppError("bad_request", "The request body is not valid JSON.");
  }
  return schema.parse(data);
}

/**
 * The body as UTF-8 text, counting bytes as they arrive: a body sent without a
 * Content-Length (chunked) is refused as soon as it passes `maxBytes`, never buffered whole.
 */
export async function readLimitedText(request: Request, maxBytes: number): Promise<string> {
  if (!request.body) return "";
  const reader = request.body.getReader();
  const decoder = new TextDecoder();
  let received = 0;
  let text = "";
  for (;;) {
    const { done, value } = await reader.read();
    if (done) break;
    received += value.byteLength;
    if (received > maxBytes) {
      await reader.cancel().catch(() => undefined);
      throw new AppError("too_large", `The request body is larger than ${maxBytes} bytes.`);
    }
    text += decoder.decode(value, { stream: true });
  }
  return text + decoder.decode();
}
