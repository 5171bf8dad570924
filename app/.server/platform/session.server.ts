import { createCookieSessionStorage, redirect } from "react-router";
import { env } from "./env.server";

export const SESSION_MAX_AGE_S = 60 * 60 * 24 * 7;

interface SessionData {
  userId: string;
  issuedAt: number;
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

/** The signed-in user's id, or null for no, tampered (bad signature) or expired sessions. */
export async function sessionUserId(request: Request): Promise<string | null> {
  const session = await getSession(request);
  const userId = session.get("userId");
  const issuedAt = session.get("issuedAt");
  if (!userId || typeof issuedAt !== "number") return null;
  if (Date.now() - issuedAt > SESSION_MAX_AGE_S * 1000) return null;
  return userId;
}

/**
 * Starts a fresh session for the user. A new session object (not the old one with a new key)
 * so that nothing from before sign-in carries over.
 */
export async function startSession(userId: string, redirectTo: string, flash?: string) {
  const session = await sessionStorage.getSession();
  session.set("userId", userId);
  session.set("issuedAt", Date.now());
  if (flash) session.flash("flash", flash);
  return redirect(redirectTo, { headers: { "Set-Cookie": await sessionStorage.commitSession(session) } });
}

export async function endSession(request: Request, redirectTo = "/sign-in") {
  const session = await getSession(request);
  return redirect(redirectTo, { headers: { "Set-Cookie": await sessionStorage.destroySession(session) } });
}

export async function clearSessionCookie(request: Request): Promise<string> {
  return sessionStorage.destroySession(await getSession(request));
}
