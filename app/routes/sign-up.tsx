import { Form, Link, redirect, useActionData, useNavigation } from "react-router";
import type { Route } from "./+types/sign-up";
import { SignUpForm, signUp } from "~/.server/accounts/accounts.server";
import { db } from "~/.server/platform/db.server";
import { parseForm } from "~/.server/platform/http/forms.server";
import { optionalUser } from "~/.server/platform/http/guards.server";
import { clientIp } from "~/.server/platform/http/client-address.server";
import { Button } from "~/components/ui/button";
import { Field } from "~/components/ui/field";
import { Notice } from "~/components/ui/notice";

export async function loader({ request }: Route.LoaderArgs) {
  if (await optionalUser(request)) throw redirect("/manuscripts");
  return null;
}

export async function action({ request, context }: Route.ActionArgs) {
  const parsed = await parseForm(request, SignUpForm);
  if (!parsed.ok) return parsed.response;
  await signUp(db, parsed.value, clientIp(context));
  return { ok: true as const, email: parsed.value.email };
}

export default function SignUp() {
  const result = useActionData<typeof action>();
  const busy = useNavigation().state === "submitting";
  if (result?.ok) {
    return (
      <section className="mx-auto mt-8 max-w-md">
        <h1 className="text-3xl">Check your inbox</h1>
        <p className="mt-4">We sent a message to <strong>{result.email}</strong>. Follow its link within 24 hours to activate the account.</p>
      </section>
    );
  }
  const errors = result && !result.ok ? result.fieldErrors : {};
  return (
    <section className="mx-auto mt-8 max-w-sm">
      <h1 className="text-3xl">Create an account</h1>
      <p className="mt-2 text-sm text-ink-soft">Invited to a manuscript? Use the link in the invitation instead; it adds you to the manuscript at once.</p>
      <Form method="post" className="mt-6 flex flex-col gap-4" noValidate>
        <Field label="Name" name="name" autoComplete="name" required maxLength={120} error={errors.name} />
        <Field label="E-mail address" name="email" type="email" autoComplete="email" required maxLength={254} error={errors.email} />
        <Field label="Password" name="password" type="password" autoComplete="new-password" required minLength={10} error={errors.password} hint="At least 10 characters." />
        {result && !result.ok ? <Notice tone="caution">{result.message}</Notice> : null}
        <Button kind="primary" type="submit" disabled={busy}>Create account</Button>
      </Form>
      <p className="mt-6 text-sm"><Link className="underline underline-offset-4" to="/sign-in">I already have an account</Link></p>
    </section>
  );
}

export const meta: Route.MetaFunction = () => [{ title: "Create an account · Steradian" }];
