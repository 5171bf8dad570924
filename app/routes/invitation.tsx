import { Form, Link, data, redirect, useActionData, useLoaderData } from "react-router";
import { z } from "zod";
import type { Route } from "./+types/invitation";
import { NameSchema, PasswordSchema } from "~/.server/accounts/accounts.server";
import { db } from "~/.server/platform/db.server";
import { parseForm } from "~/.server/platform/http/forms.server";
import { optionalUser } from "~/.server/platform/http/guards.server";
import { MembershipError, acceptInvitation, createAccountFromInvitation, findInvitation } from "~/.server/manuscripts/manuscripts.server";
import { clientIp } from "~/.server/platform/http/client-address.server";
import { startSession } from "~/.server/platform/session.server";
import { findUserByEmail, hashPassword } from "~/.server/accounts/users.server";
import { RoleTag } from "~/components/role-tag";
import { Button } from "~/components/ui/button";
import { Field } from "~/components/ui/field";
import { Notice } from "~/components/ui/notice";

async function openInvitation(token: string) {
  const inv = await findInvitation(db, token);
  if (!inv || inv.accepted_at || new Date(inv.expires_at) <= new Date()) {
    throw data({ message: "This invitation has expired or was already used. Ask the corresponding author for a new one." }, { status: 404 });
  }
  return inv;
}

export async function loader({ request, params }: Route.LoaderArgs) {
  const inv = await openInvitation(params.token);
  const user = await optionalUser(request);
  const hasAccount = Boolean(await findUserByEmail(db, inv.email));
  return {
    invitation: { email: inv.email, role: inv.role, title: inv.title, inviterName: inv.inviterName },
    signedInAs: user?.email ?? null,
    matches: user ? user.email.toLowerCase() === inv.email.toLowerCase() : false,
    hasAccount,
    path: new URL(request.url).pathname,
  };
}

const NewAccount = z.object({ name: NameSchema, password: PasswordSchema });

export async function action({ request, params, context }: Route.ActionArgs) {
  const inv = await openInvitation(params.token);
  const ip = clientIp(context);
  const user = await optionalUser(request);
  try {
    if (user) {
      if (user.email.toLowerCase() !== inv.email.toLowerCase()) {
        return data({ ok: false as const, message: `This invitation is for ${inv.email}; sign out first.`, fieldErrors: {} as Record<string, string> }, { status: 403 });
      }
      const id = await acceptInvitation(db, inv.id, user.id, ip);
      throw redirect(`/manuscripts/${id}`);
    }
    if (await findUserByEmail(db, inv.email)) {
      throw redirect(`/sign-in?redirectTo=${encodeURIComponent(`/invitations/${params.token}`)}`);
    }
    const parsed = await parseForm(request, NewAccount);
    if (!parsed.ok) return parsed.response;
    const passwordHash = await hashPassword(parsed.value.password);
    const { userId, manuscriptId } = await createAccountFromInvitation(db, { invitationId: inv.id, email: inv.email, name: parsed.value.name, passwordHash, ip });
    return await startSession(userId, `/manuscripts/${manuscriptId}`, "Welcome to Steradian.");
  } catch (e) {
    if (e instanceof MembershipError) return data({ ok: false as const, message: e.message, fieldErrors: {} as Record<string, string> }, { status: 422 });
    throw e;
  }
}

export default function InvitationPage() {
  const { invitation, signedInAs, matches, hasAccount, path } = useLoaderData<typeof loader>();
  const result = useActionData<typeof action>();
  const errors: Record<string, string> = result && "fieldErrors" in result ? result.fieldErrors : {};
  return (
    <section className="mx-auto mt-8 max-w-md">
      <h1 className="text-3xl">You are invited</h1>
      <p className="mt-4">{invitation.inviterName} invites <strong>{invitation.email}</strong> to the manuscript “{invitation.title}” as <RoleTag role={invitation.role} />.</p>
      {result && !result.ok && result.message && Object.keys(errors).length === 0 ? <div className="mt-4"><Notice tone="caution">{result.message}</Notice></div> : null}
      {signedInAs && !matches ? (
        <p className="mt-6">You are signed in as {signedInAs}. Sign out, then open this link again to accept it as {invitation.email}.</p>
      ) : signedInAs ? (
        <Form method="post" className="mt-6"><Button kind="primary" type="submit">Join the manuscript</Button></Form>
      ) : hasAccount ? (
        <p className="mt-6"><Link className="underline" to={`/sign-in?redirectTo=${encodeURIComponent(path)}`}>Sign in as {invitation.email}</Link> to accept.</p>
      ) : (
        <Form method="post" className="mt-6 flex flex-col gap-4" noValidate>
          <p className="text-sm text-ink-soft">Create your account to accept. The e-mail address is the one invited.</p>
          <Field label="Name" name="name" autoComplete="name" required maxLength={120} error={errors.name} />
          <Field label="Password" name="password" type="password" autoComplete="new-password" required minLength={10} error={errors.password} hint="At least 10 characters." />
          <Button kind="primary" type="submit">Create account and join</Button>
        </Form>
      )}
    </section>
  );
}

export const meta: Route.MetaFunction = () => [{ title: "Invitation · Steradian" }];
