import { Form, data, useActionData, useLoaderData } from "react-router";
import { z } from "zod";
import type { Route } from "./+types/admin-accounts";
import { AdminError, resetAccount, setAccountStatus } from "~/.server/accounts/admin.server";
import { db } from "~/.server/platform/db.server";
import { parseForm } from "~/.server/platform/http/forms.server";
import { requireSite, requireUser } from "~/.server/platform/http/guards.server";
import { clientIp } from "~/.server/platform/http/client-address.server";
import { listUsers } from "~/.server/accounts/users.server";
import { Notice } from "~/components/ui/notice";
import { Shape } from "~/components/ui/shape";

export async function loader({ request }: Route.LoaderArgs) {
  const user = await requireUser(request);
  requireSite("page", user, "manage:accounts");
  return { accounts: await listUsers(db), me: user.id };
}

const AdminAction = z.object({ intent: z.enum(["disable", "enable", "reset"], { message: "Unknown action." }), userId: z.uuid("Unknown account.") });

export async function action({ request, context }: Route.ActionArgs) {
  const user = await requireUser(request);
  requireSite("page", user, "manage:accounts");
  const parsed = await parseForm(request, AdminAction);
  if (!parsed.ok) return parsed.response;
  const { intent, userId } = parsed.value;
  const ip = clientIp(context);
  try {
    if (intent === "reset") await resetAccount(db, user.id, userId, ip);
    else await setAccountStatus(db, user.id, userId, intent === "disable" ? "disabled" : "active", ip);
  } catch (e) {
    if (e instanceof AdminError) return data({ ok: false as const, message: e.message }, { status: 422 });
    throw e;
  }
  return { ok: true as const, message: intent === "reset" ? "A password-reset link was sent to the account's address, and its sign-in throttle was lifted." : `Account ${intent}d.` };
}

export default function AdminAccounts() {
  const { accounts, me } = useLoaderData<typeof loader>();
  const result = useActionData<typeof action>();
  return (
    <>
      <h1 className="text-3xl">Accounts</h1>
      {result ? <div className="mt-4"><Notice tone={result.ok ? "ok" : "caution"}>{result.message}</Notice></div> : null}
      <table className="mt-6 w-full text-sm">
        <thead className="border-b border-rule text-left text-ink-soft">
          <tr><th className="py-2 font-medium">Name</th><th className="font-medium">E-mail</th><th className="font-medium">Status</th><th className="font-medium">Site role</th><th className="font-medium">Since</th><th /></tr>
        </thead>
        <tbody className="divide-y divide-rule">
          {accounts.map((a) => (
            <tr key={a.id}>
              <td className="py-2">{a.name}{a.is_demo && !/\(demo\)$/.test(a.name) ? <span className="text-ink-faint"> (demo)</span> : null}</td>
              <td>{a.email}</td>
              <td className="whitespace-nowrap"><Shape name={({ active: "disc", pending: "dotted-ring", disabled: "cross" } as const)[a.status]} /> {{ active: "active", pending: "awaiting confirmation", disabled: "disabled" }[a.status]}</td>
              <td>{a.site_role === "admin" ? "site admin" : "member"}</td>
              <td className="num">{new Date(a.created_at).toISOString().slice(0, 10)}</td>
              <td className="flex justify-end gap-3 py-2">
                {a.id === me ? null : (
                  <Form method="post" className="flex gap-3">
                    <input type="hidden" name="userId" value={a.id} />
                    {a.status === "disabled"
                      ? <button name="intent" value="enable" className="underline underline-offset-2">Re-enable</button>
                      : <button name="intent" value="disable" className="text-madder underline underline-offset-2">Disable</button>}
                    <button name="intent" value="reset" className="underline underline-offset-2">Send reset link</button>
                  </Form>
                )}
              </td>
            </tr>
          ))}
        </tbody>
      </table>
    </>
  );
}

export const meta: Route.MetaFunction = () => [{ title: "Accounts · Steradian" }];
