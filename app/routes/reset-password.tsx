import { Form, Link, redirect, useActionData, useLoaderData } from "react-router";
import { z } from "zod";
import type { Route } from "./+types/reset-password";
import { PasswordSchema, peekToken, resetPassword } from "~/.server/accounts/accounts.server";
import { db } from "~/.server/platform/db.server";
import { parseForm } from "~/.server/platform/http/forms.server";
import { clientIp } from "~/.server/platform/http/client-address.server";
import { Button } from "~/components/ui/button";
import { Field } from "~/components/ui/field";

export async function loader({ params }: Route.LoaderArgs) {
  return { valid: Boolean(await peekToken(db, params.token, "reset-password")) };
}

const ResetForm = z.object({ password: PasswordSchema });

export async function action({ request, params, context }: Route.ActionArgs) {
  const parsed = await parseForm(request, ResetForm);
  if (!parsed.ok) return parsed.response;
  if (!(await resetPassword(db, params.token, parsed.value.password, clientIp(context)))) {
    return { ok: false as const, message: "This link has expired or was already used. Ask for a new one.", fieldErrors: {} as Record<string, string> };
  }
  throw redirect(`/sign-in?notice=${encodeURIComponent("Your password is changed. Sign in with the new one.")}`);
}

export default function ResetPassword() {
  const { valid } = useLoaderData<typeof loader>();
  const result = useActionData<typeof action>();
  if (!valid) {
    return (
      <section className="mx-auto mt-8 max-w-md">
        <h1 className="text-3xl">This link no longer works</h1>
        <p className="mt-4">Reset links work once and for one hour. <Link className="underline" to="/forgot-password">Ask for a new one.</Link></p>
      </section>
    );
  }
  return (
    <section className="mx-auto mt-8 max-w-sm">
      <h1 className="text-3xl">Choose a new password</h1>
      <Form method="post" className="mt-6 flex flex-col gap-4" noValidate>
        <Field label="New password" name="password" type="password" autoComplete="new-password" required minLength={10}
          error={result?.fieldErrors?.password ?? (result && !result.ok && !result.fieldErrors.password ? result.message : undefined)} hint="At least 10 characters." />
        <Button kind="primary" type="submit">Save the new password</Button>
      </Form>
    </section>
  );
}
