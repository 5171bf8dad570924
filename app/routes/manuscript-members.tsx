import { Form, data, useActionData, useLoaderData } from "react-router";
import { z } from "zod";
import type { Route } from "./+types/manuscript-members";
import { EmailSchema } from "~/.server/accounts/accounts.server";
import { db } from "~/.server/platform/db.server";
import { parseForm } from "~/.server/platform/http/forms.server";
import { requirePermission, requireUser } from "~/.server/platform/http/guards.server";
import { loadManuscriptPage } from "~/.server/manuscripts/manuscript-context.server";
import {
  MembershipError, RoleSchema, changeRole, inviteMember, listMembers, listOpenInvitations, removeMember,
} from "~/.server/manuscripts/manuscripts.server";
import { clientIp } from "~/.server/platform/http/client-address.server";
import { ManuscriptNav } from "~/components/manuscript-nav";
import { RoleTag } from "~/components/role-tag";
import { Button } from "~/components/ui/button";
import { Field, SelectField } from "~/components/ui/field";
import { Notice } from "~/components/ui/notice";
import { MEMBER_ROLES, ROLE_LABELS } from "~/permissions";

export async function loader({ request, params }: Route.LoaderArgs) {
  const page = await loadManuscriptPage(request, params.manuscriptId);
  const [members, invitations] = await Promise.all([
    listMembers(db, params.manuscriptId),
    page.can["manage:members"] ? listOpenInvitations(db, params.manuscriptId) : Promise.resolve([]),
  ]);
  return { ...page, members, invitations };
}

const MemberAction = z.discriminatedUnion("intent", [
  z.object({ intent: z.literal("invite"), email: EmailSchema, role: RoleSchema }),
  z.object({ intent: z.literal("change-role"), userId: z.uuid("Unknown member."), role: RoleSchema }),
  z.object({ intent: z.literal("remove"), userId: z.uuid("Unknown member.") }),
], { message: "Unknown action." });

export async function action({ request, params, context }: Route.ActionArgs) {
  const user = await requireUser(request);
  await requirePermission("page", user, params.manuscriptId, "manage:members");
  const parsed = await parseForm(request, MemberAction);
  if (!parsed.ok) return parsed.response;
  const input = parsed.value;
  const common = { manuscriptId: params.manuscriptId, ip: clientIp(context) };
  try {
    if (input.intent === "invite") {
      await inviteMember(db, { ...common, inviter: user, email: input.email, role: input.role });
      return { ok: true as const, message: `Invitation sent to ${input.email}.` };
    }
    if (input.intent === "change-role") {
      await changeRole(db, { ...common, actorId: user.id, userId: input.userId, role: input.role });
      return { ok: true as const, message: "Role changed." };
    }
    await removeMember(db, { ...common, actorId: user.id, userId: input.userId });
    return { ok: true as const, message: "Member removed." };
  } catch (e) {
    if (e instanceof MembershipError) return data({ ok: false as const, message: e.message, fieldErrors: { [e.field]: e.message } }, { status: 422 });
    throw e;
  }
}

export default function Members() {
  const { manuscript, role, can, members, invitations, user } = useLoaderData<typeof loader>();
  const result = useActionData<typeof action>();
  const errors: Record<string, string> = result && !result.ok ? result.fieldErrors : {};
  return (
    <>
      <ManuscriptNav manuscript={manuscript} role={role} can={can} />
      {result ? <div className="mb-4"><Notice tone={result.ok ? "ok" : "caution"}>{result.message}</Notice></div> : null}
      <div className="grid grid-cols-[1fr_18rem] gap-10 max-lg:grid-cols-1">
        <section aria-labelledby="members-h">
          <h2 id="members-h" className="text-xl">Members</h2>
          <table className="mt-3 w-full text-sm">
            <thead className="border-b border-rule text-left text-ink-soft">
              <tr><th className="py-2 font-medium">Name</th><th className="font-medium">E-mail</th><th className="font-medium">Role</th>{can["manage:members"] ? <th className="font-medium"><span className="sr-only">Actions</span></th> : null}</tr>
            </thead>
            <tbody className="divide-y divide-rule">
              {members.map((m) => (
                <tr key={m.userId}>
                  <td className="py-2">{m.name}{m.userId === user.id ? <span className="text-ink-faint"> (you)</span> : null}</td>
                  <td>{m.email}</td>
                  <td>
                    {can["manage:members"] ? (
                      <Form method="post" className="flex items-center gap-2">
                        <input type="hidden" name="intent" value="change-role" />
                        <input type="hidden" name="userId" value={m.userId} />
                        <label className="sr-only" htmlFor={`role-${m.userId}`}>Role of {m.name}</label>
                        <select id={`role-${m.userId}`} name="role" defaultValue={m.role} className="border border-rule-strong bg-sheet px-1 py-0.5">
                          {MEMBER_ROLES.map((r) => <option key={r} value={r}>{ROLE_LABELS[r]}</option>)}
                        </select>
                        <button type="submit" className="text-ink-soft underline underline-offset-2 hover:text-ink">Change</button>
                      </Form>
                    ) : <RoleTag role={m.role} />}
                  </td>
                  {can["manage:members"] ? (
                    <td className="text-right">
                      <Form method="post">
                        <input type="hidden" name="intent" value="remove" />
                        <input type="hidden" name="userId" value={m.userId} />
                        <button type="submit" className="text-madder underline underline-offset-2" aria-label={`Remove ${m.name}`}>Remove</button>
                      </Form>
                    </td>
                  ) : null}
                </tr>
              ))}
            </tbody>
          </table>
          {can["manage:members"] && invitations.length > 0 ? (
            <>
              <h3 className="mt-8 text-lg">Open invitations</h3>
              <ul className="mt-2 divide-y divide-rule text-sm">
                {invitations.map((i) => (
                  <li key={i.id} className="flex gap-4 py-2"><span className="flex-1">{i.email}</span><RoleTag role={i.role} /><span className="text-ink-faint">until {new Date(i.expires_at).toISOString().slice(0, 10)}</span></li>
                ))}
              </ul>
            </>
          ) : null}
        </section>
        {can["manage:members"] ? (
          <aside aria-labelledby="invite-h" className="border-l border-rule pl-6 max-lg:border-l-0 max-lg:pl-0">
            <h2 id="invite-h" className="text-xl">Invite a member</h2>
            <Form method="post" className="mt-4 flex flex-col gap-3" noValidate>
              <input type="hidden" name="intent" value="invite" />
              <Field label="E-mail address" name="email" type="email" required maxLength={254} error={errors.email} />
              <SelectField label="Role" name="role" defaultValue="coauthor" error={errors.role}>
                {MEMBER_ROLES.map((r) => <option key={r} value={r}>{ROLE_LABELS[r]}</option>)}
              </SelectField>
              <Button kind="primary" type="submit">Send invitation</Button>
            </Form>
          </aside>
        ) : null}
      </div>
    </>
  );
}

export const meta: Route.MetaFunction = () => [{ title: "Members · Steradian" }];
