import { createCookieSessionStorage, createSession, redirect } from "react-router";
import type { SessionUser } from "../accounts/users.server";
import { isUuid } from "~/is-uuid";
import { db, type Db } from "./db.server";
import { env } from "./env.server";

export const SESSION_MAX_AGE_S = 60 * 60 * 24 * 7;

interface SessionData {
  userId: string;
  issuedAt: number;
  /** The user_session row behind this cookie; the session ends when the row is deleted. */
  sessionId: string;
}
interface SessionFlash {
  flash: string;
}

export const sessionStorage = createCookieSessionStorage<SessionData, SessionFlash>({
  cookie: {
    name: "__steradian",
    httpOnly: true,
    sameSite: "lax",
    // Browsers accept Secure cookies from http://127.0.0.1 and localhost, so a local
    // production start keeps working.
    secure: env.NODE_ENV === "production",
    path: "/",
    maxAge: SESSION_MAX_AGE_S,
    secrets: [env.SESSION_SECRET],
  },
});

/**
 * Cookie headers whose signature has been checked, with what they carry. Checking the HMAC
 * (WebCrypto: a key import and a thread-pool job) was a tenth of the CPU of a signed-in page;
 * the same header always carries the same data, so the check is done once per header. Each
 * call still gets its own Session object. Bounded: the oldest entry goes first.
 */
const verified = new Map<string, SessionData>();
const VERIFIED_MAX = 2000;

export async function getSession(request: Request) {
  const header = request.headers.get("Cookie");
  const known = header === null ? undefined : verified.get(header);
  if (known) return createSession<SessionData, SessionFlash>(structuredClone(known));
  const session = await sessionStorage.getSession(header);
  if (header !== null && session.has("userId")) {
    if (verified.size >= VERIFIED_MAX) verified.delete(verified.keys().next().value as string);
    verified.set(header, structuredClone(session.data) as SessionData);
  }
  return session;
}

/** The cookie's user and session ids, or null when it is missing, tampered, malformed or too old. */
async function liveClaims(request: Request): Promise<{ userId: string; sessionId: string } | null> {
  const session = await getSession(request);
  const userId = session.get("userId");
  const issuedAt = session.get("issuedAt");
  const sessionId = session.get("sessionId");
  if (!userId || typeof issuedAt !== "number" || typeof sessionId !== "string" || !isUuid(sessionId)) return null;
  if (Date.now() - issuedAt > SESSION_MAX_AGE_S * 1000) return null;
  return { userId, sessionId };
}

/**
 * The signed-in user's id, or null for no, tampered (bad signature), expired or ended sessions
 * (signed out, password reset, account disabled, "sign out everywhere").
 */
export async function sessionUserId(request: Request): Promise<string | null> {
  const claims = await liveClaims(request);
  if (!claims) return null;
  const { userId, sessionId } = claims;
  const row = await db
    .selectFrom("user_session")
    .select("id")
    .where("id", "=", sessionId)
    .where("user_id", "=", userId)
    .where("expires_at", ">", new Date())
    .executeTakeFirst();
  return row ? userId : null;
}

/**
 * The signed-in, active user, in one query: the session row joined with its account (a disabled
 * or unconfirmed account signs nobody in). Null for no, tampered, expired or ended sessions.
 */
export async function sessionUser(request: Request): Promise<SessionUser | null> {
  const claims = await liveClaims(request);
  if (!claims) return null;
  const { userId, sessionId } = claims;
  const row = await db
    .selectFrom("user_session")
    .innerJoin("app_user", "app_user.id", "user_session.user_id")
    .select(["app_user.id", "app_user.email", "app_user.name", "app_user.site_role", "app_user.is_demo"])
    .where("user_session.id", "=", sessionId)
    .where("user_session.user_id", "=", userId)
    .where("user_session.expires_at", ">", new Date())
    .where("app_user.status", "=", "active")
    .executeTakeFirst();
  return row ? { id: row.id, email: row.email, name: row.name, siteRole: row.site_role, isDemo: row.is_demo } : null;
}

/** Ends every session of a user: after a password reset, when disabled, or on request. */
export async function endAllSessions(conn: Db, userId: string): Promise<number> {
  const res = await conn.deleteFrom("user_session").where("user_id", "=", userId).executeTakeFirst();
  return Number(res.numDeletedRows);
}

/**
 * Starts a fresh session for the user. A new session object (not the old one with a new key)
 * so that nothing from before sign-in carries over.
 */
export async function startSession(userId: string, redirectTo: string, flash?: string) {
  const issuedAt = Date.now();
  const row = await db
    .insertInto("user_session")
    .values({ user_id: userId, created_at: new Date(issuedAt), expires_at: new Date(issuedAt + SESSION_MAX_AGE_S * 1000) })
    .returning("id")
    .executeTakeFirstOrThrow();
  // Expired rows of anyone are swept as new sessions start; they sign nobody in meanwhile.
  await db.deleteFrom("user_session").where("expires_at", "<", new Date(issuedAt)).execute();
  const session = await sessionStorage.getSession();
  session.set("userId", userId);
  session.set("issuedAt", issuedAt);
  session.set("sessionId", row.id);
  if (flash) session.flash("flash", flash);
  return redirect(redirectTo, { headers: { "Set-Cookie": await sessionStorage.commitSession(session) } });
}

/** Ends this browser's session on the server and clears its cookie. */
export async function endSession(request: Request, redirectTo = "/sign-in") {
  const session = await getSession(request);
  const sessionId = session.get("sessionId");
  if (typeof sessionId === "string" && isUuid(sessionId)) await db.deleteFrom("user_session").where("id", "=", sessionId).execute();
  return redirect(redirectTo, { headers: { "Set-Cookie": await sessionStorage.destroySession(session) } });
}

export async function clearSessionCookie(request: Request): Promise<string> {
  return sessionStorage.destroySession(await getSession(request));
}
