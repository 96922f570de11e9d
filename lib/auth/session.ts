import "server-only";
import type { Session, User } from "lucia";
import { getLucia } from "./lucia";

export type AuthUser = Pick<User, "id" | "email" | "name">;
export type AuthResult = { user: AuthUser; session: Session } | { user: null; session: null };

export async function validateSessionId(sessionId: string | null | undefined): Promise<AuthResult> {
  if (!sessionId) return { user: null, session: null };
  const result = await getLucia().validateSession(sessionId);
  if (!result.session) return { user: null, session: null };
  return { user: { id: result.user.id, email: result.user.email, name: result.user.name }, session: result.session };
}

export function sessionCookieName(): string {
  return getLucia().sessionCookieName;
}

/** Reads the session cookie from a raw Cookie header. */
export function readSessionCookie(cookieHeader: string | null): string | null {
  return getLucia().readSessionCookie(cookieHeader ?? "");
}

/** Starts a session and returns its Set-Cookie value. */
export async function startSession(userId: string): Promise<string> {
  const lucia = getLucia();
  const session = await lucia.createSession(userId, {});
  return lucia.createSessionCookie(session.id).serialize();
}

/** A Set-Cookie value for a session that lucia extended (it is past half its life). */
export function refreshedSessionCookie(session: Session): string | null {
  return session.fresh ? getLucia().createSessionCookie(session.id).serialize() : null;
}

export function blankSessionCookie(): string {
  return getLucia().createBlankSessionCookie().serialize();
}

export async function endSession(sessionId: string): Promise<void> {
  await getLucia().invalidateSession(sessionId);
}

export async function endAllSessions(userId: string): Promise<void> {
  await getLucia().invalidateUserSessions(userId);
}
