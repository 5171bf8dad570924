import type { Route } from "./+types/sign-out";
import { recordAudit } from "~/.server/audit.server";
import { db } from "~/.server/db.server";
import { clientIp } from "~/.server/sign-in.server";
import { endSession, sessionUserId } from "~/.server/session.server";

export async function loader() {
  return new Response(null, { status: 302, headers: { Location: "/" } });
}

export async function action({ request, context }: Route.ActionArgs) {
  const userId = await sessionUserId(request);
  if (userId) await recordAudit(db, { action: "sign-out", actorId: userId, ip: clientIp(context) });
  return endSession(request, "/sign-in");
}
