import { createCookieSessionStorage, redirect } from "react-router";
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

export function getSession(request: Request) {
  return sessionStorage.getSession(request.headers.get("Cookie"));
}

/**
 * The signed-in user's id, or null for no, tampered (bad signature), expired or ended sessions
 * (signed out, password reset, account disabled, "sign out everywhere").
 */
export async function sessionUserId(request: Request): Promise<string | null> {
  const session = await getSession(request);
  const userId = session.get("userId");
  const issuedAt = session.get("issuedAt");
  const sessionId = session.get("sessionId");
  if (!userId || typeof issuedAt !== "number" || typeof sessionId !== "string" || !isUuid(sessionId)) return null;
  if (Date.now() - issuedAt > SESSION_MAX_AGE_S * 1000) return null;
  const row = await db
    .selectFrom("user_session")
    .select("id")
    .where("id", "=", sessionId)
    .where("user_id", "=", userId)
    .where("expires_at", ">", new Date())
    .executeTakeFirst();
  return row ? userId : null;
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
