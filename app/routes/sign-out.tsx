import type { Route } from "./+types/sign-out";
import { CROSS_SITE_MESSAGE, isSameOriginWrite } from "~/.server/platform/http/guards.server";
import { recordAudit } from "~/.server/platform/audit.server";
import { db } from "~/.server/platform/db.server";
import { clientIp } from "~/.server/platform/http/client-address.server";
import { endSession, sessionUserId } from "~/.server/platform/session.server";

export async function loader() {
  return new Response(null, { status: 302, headers: { Location: "/" } });
}

export async function action({ request, context }: Route.ActionArgs) {
  // Another site must not be able to sign a user out (a resource route gets no framework check).
  if (!isSameOriginWrite(request)) return new Response(CROSS_SITE_MESSAGE, { status: 403, headers: { "Content-Type": "text/plain; charset=utf-8" } });
  const userId = await sessionUserId(request);
  if (userId) await recordAudit(db, { action: "sign-out", actorId: userId, ip: clientIp(context) });
  return endSession(request, "/sign-in");
}
