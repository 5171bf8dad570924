import { Form, data, useActionData, useLoaderData } from "react-router";
import { z } from "zod";
import type { Route } from "./+types/account";
import { createApiToken, listApiTokens, revokeApiToken } from "~/.server/accounts/api-tokens.server";
import { db } from "~/.server/platform/db.server";
import { parseForm } from "~/.server/platform/http/forms.server";
import { requireUser } from "~/.server/platform/http/guards.server";
import { clientIp } from "~/.server/platform/http/client-address.server";
import { recordAudit } from "~/.server/platform/audit.server";
import { endAllSessions, endSession } from "~/.server/platform/session.server";
import { Button } from "~/components/ui/button";
import { Field } from "~/components/ui/field";
import { Notice } from "~/components/ui/notice";

export async function loader({ request }: Route.LoaderArgs) {
  const user = await requireUser(request);
  return { user, tokens: await listApiTokens(db, user.id) };
}

const TokenAction = z.discriminatedUnion("intent", [
  z.object({ intent: z.literal("create-token"), name: z.string().trim().min(1, "Name the token, e.g. “analysis laptop”.").max(80, "At most 80 characters.") }),
  z.object({ intent: z.literal("revoke-token"), tokenId: z.uuid("Unknown token.") }),
  z.object({ intent: z.literal("sign-out-everywhere") }),
], { message: "Unknown action." });

export async function action({ request, context }: Route.ActionArgs) {
  const user = await requireUser(request);
  const parsed = await parseForm(request, TokenAction);
  if (!parsed.ok) return parsed.response;
  const ip = clientIp(context);
  if (parsed.value.intent === "sign-out-everywhere") {
    const ended = await endAllSessions(db, user.id);
    await recordAudit(db, { action: "sign-out-everywhere", actorId: user.id, ip, detail: { sessions: ended } });
    return endSession(request, "/sign-in");
  }
  if (parsed.value.intent === "create-token") {
    const token = await createApiToken(db, user.id, parsed.value.name, ip);
    return { ok: true as const, created: { name: token.name, secret: token.secret } };
  }
  if (!(await revokeApiToken(db, user.id, parsed.value.tokenId, ip))) {
    return data({ ok: false as const, message: "That token does not exist or is already revoked.", fieldErrors: {} as Record<string, string> }, { status: 404 });
  }
  return { ok: true as const, created: null };
}

export default function Account() {
  const { user, tokens } = useLoaderData<typeof loader>();
  const result = useActionData<typeof action>();
  return (
    <div className="max-w-3xl">
      <h1 className="text-3xl">Your account</h1>
      <dl className="mt-4 grid grid-cols-[10rem_1fr] gap-y-1 text-sm">
        <dt className="text-ink-soft">Name</dt><dd>{user.name}</dd>
        <dt className="text-ink-soft">E-mail</dt><dd>{user.email}</dd>
        <dt className="text-ink-soft">Site role</dt><dd>{user.siteRole === "admin" ? "site admin" : "member"}</dd>
      </dl>

      <h2 className="mt-10 text-xl">Personal access tokens</h2>
      <p className="mt-1 text-sm text-ink-soft">For scripts and the command line: send <code className="font-mono">Authorization: Bearer &lt;token&gt;</code> to <code className="font-mono">/api/v1/…</code>. A token acts with all your roles; revoke it when a machine is retired.</p>
      {result?.ok && result.created ? (
        <div className="mt-4"><Notice tone="ok">
          Token “{result.created.name}” created. Copy it now; it is shown only once:
          <code className="mt-2 block select-all break-all bg-paper p-2 font-mono" data-testid="new-token">{result.created.secret}</code>
        </Notice></div>
      ) : null}
      {result && !result.ok ? <div className="mt-4"><Notice tone="caution">{result.message}</Notice></div> : null}
      <Form method="post" className="mt-4 flex items-end gap-3" noValidate>
        <input type="hidden" name="intent" value="create-token" />
        <Field label="Token name" name="name" maxLength={80} required error={result && !result.ok ? result.fieldErrors.name : undefined} />
        <Button kind="primary" type="submit">Create token</Button>
      </Form>
      <table className="mt-6 w-full text-sm">
        <thead className="border-b border-rule text-left text-ink-soft"><tr><th className="py-2 font-medium">Name</th><th className="font-medium">Begins with</th><th className="font-medium">Created</th><th className="font-medium">Last used</th><th /></tr></thead>
        <tbody className="divide-y divide-rule">
          {tokens.length === 0 ? (
            <tr><td colSpan={5} className="py-3 text-ink-soft">No tokens yet. A token lets a script call the JSON API as you; name it after the script that will use it.</td></tr>
          ) : null}
          {tokens.map((t) => (
            <tr key={t.id} className={t.revoked_at ? "text-ink-faint" : ""}>
              <td className="py-2">{t.name}</td>
              <td className="font-mono">{t.prefix}…</td>
              <td className="num">{new Date(t.created_at).toISOString().slice(0, 10)}</td>
              <td className="num">{t.last_used_at ? new Date(t.last_used_at).toISOString().slice(0, 10) : "never"}</td>
              <td className="text-right">
                {t.revoked_at ? "revoked" : (
                  <Form method="post"><input type="hidden" name="intent" value="revoke-token" /><input type="hidden" name="tokenId" value={t.id} />
                    <button className="text-madder underline underline-offset-2" type="submit">Revoke</button></Form>
                )}
              </td>
            </tr>
          ))}
        </tbody>
      </table>

      <h2 className="mt-10 text-xl">Signed-in browsers</h2>
      <p className="mt-1 text-sm text-ink-soft">Ends the session of every browser signed in as you, this one included (a lost laptop, a shared computer). Access tokens stay valid; revoke them above.</p>
      <Form method="post" className="mt-3">
        <input type="hidden" name="intent" value="sign-out-everywhere" />
        <Button type="submit">Sign out everywhere</Button>
      </Form>
    </div>
  );
}

export const meta: Route.MetaFunction = () => [{ title: "Account · Steradian" }];
