import { data, redirect } from "react-router";
import { type ManuscriptAction, type MemberRole, ROLE_LABELS, can, canSite, rolesFor, type SiteAction } from "~/permissions";
import { isUuid } from "~/is-uuid";
import { apiError } from "./api-error.server";
import { db } from "../db.server";
import { env } from "../env.server";
import { hashSecret } from "../tokens.server";
import { clearSessionCookie, sessionUser } from "../session.server";
import { findActiveUser, type SessionUser } from "../../accounts/users.server";

// The root loader and the page's own loader both ask who is signed in; one look-up a request.
const seen = new WeakMap<Request, Promise<SessionUser | null>>();

export function optionalUser(request: Request): Promise<SessionUser | null> {
  let user = seen.get(request);
  if (!user) {
    user = sessionUser(request);
    seen.set(request, user);
  }
  return user;
}

/** Page guard: no valid session (none, tampered, expired, account disabled) → sign-in page. */
export async function requireUser(request: Request): Promise<SessionUser> {
  const user = await optionalUser(request);
  if (user) return user;
  const url = new URL(request.url);
  const hadCookie = (request.headers.get("Cookie") ?? "").includes("__steradian=");
  const to = `/sign-in?redirectTo=${encodeURIComponent(url.pathname + url.search)}`;
  throw redirect(to, hadCookie ? { headers: { "Set-Cookie": await clearSessionCookie(request) } } : undefined);
}

const SAFE_METHODS = new Set(["GET", "HEAD", "OPTIONS"]);

/**
 * A write authenticated by the session cookie must come from the app's own pages: its Origin is
 * the app's (or, without an Origin, the browser says Sec-Fetch-Site: same-origin). A browser
 * attaches the cookie to a form or fetch sent from any site; this is what tells them apart.
 * Writes with a bearer token carry no ambient credentials and are not checked.
 */
export function isSameOriginWrite(request: Request): boolean {
  if (SAFE_METHODS.has(request.method.toUpperCase())) return true;
  const origin = request.headers.get("Origin");
  if (origin !== null) return origin === new URL(request.url).origin || origin === new URL(env.APP_URL).origin;
  return request.headers.get("Sec-Fetch-Site") === "same-origin";
}

export const CROSS_SITE_MESSAGE = "A change sent with the session cookie must come from Steradian's own pages (a same-origin Origin header); scripts send a personal access token instead.";

/** API guard: a session cookie or `Authorization: Bearer <personal access token>`. */
export async function requireApiUser(request: Request): Promise<SessionUser> {
  const header = request.headers.get("Authorization");
  if (header) {
    const match = /^Bearer\s+(\S+)$/i.exec(header);
    if (!match) throw apiError(401, "unauthenticated", "The Authorization header must be 'Bearer <token>'.");
    const token = await db
      .updateTable("api_token")
      .set({ last_used_at: new Date() })
      .where("token_hash", "=", hashSecret(match[1]))
      .where("revoked_at", "is", null)
      .returning(["user_id"])
      .executeTakeFirst();
    const user = token ? await findActiveUser(db, token.user_id) : null;
    if (!user) throw apiError(401, "unauthenticated", "The access token is unknown, revoked, or its account is disabled.");
    return user;
  }
  const user = await optionalUser(request);
  if (!user) throw apiError(401, "unauthenticated", "Sign in, or send a personal access token as 'Authorization: Bearer <token>'.");
  if (!isSameOriginWrite(request)) throw apiError(403, "cross-site", CROSS_SITE_MESSAGE);
  return user;
}

export async function membershipRole(manuscriptId: string, userId: string): Promise<MemberRole | null> {
  if (!isUuid(manuscriptId)) return null;
  const row = await db
    .selectFrom("membership")
    .select("role")
    .where("manuscript_id", "=", manuscriptId)
    .where("user_id", "=", userId)
    .executeTakeFirst();
  return row?.role ?? null;
}

export type Mode = "page" | "api";

/**
 * Authorises an action on a manuscript. A manuscript the user is not a member of is a 404
 * (its existence is not revealed); a member whose role lacks the action gets a 403 naming the
 * roles that have it.
 */
export async function requirePermission(
  mode: Mode,
  user: SessionUser,
  manuscriptId: string,
  action: ManuscriptAction,
): Promise<MemberRole> {
  const role = await membershipRole(manuscriptId, user.id);
  if (!role) {
    throw mode === "api"
      ? apiError(404, "not-found", "No manuscript with that id is visible to you.")
      : data({ message: "No manuscript with that address is visible to you." }, { status: 404 });
  }
  if (!can(role, action)) {
    const message = `This needs the role of ${rolesFor(action)}; your role here is ${ROLE_LABELS[role]}.`;
    throw mode === "api"
      ? apiError(403, "forbidden", message, { action, requiredRoles: rolesFor(action) })
      : data({ message, action }, { status: 403 });
  }
  return role;
}

export function requireSite(mode: Mode, user: SessionUser, action: SiteAction): void {
  if (canSite(user.siteRole, action)) return;
  const message = "This page needs the site admin role.";
  throw mode === "api" ? apiError(403, "forbidden", message) : data({ message }, { status: 403 });
}

export function notFound(mode: Mode, what: string): never {
  throw mode === "api" ? apiError(404, "not-found", `${what} was not found.`) : data({ message: `${what} was not found.` }, { status: 404 });
}
