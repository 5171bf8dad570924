import { Form, Link, data, redirect, useActionData, useNavigation, useSearchParams } from "react-router";
import type { Route } from "./+types/sign-in";
import { optionalUser } from "~/.server/platform/http/guards.server";
import { SignInError, createAuthenticator } from "~/.server/accounts/sign-in.server";
import { clientIp } from "~/.server/platform/http/client-address.server";
import { startSession } from "~/.server/platform/session.server";
import { Button } from "~/components/ui/button";
import { Field } from "~/components/ui/field";
import { Notice } from "~/components/ui/notice";
import { safeRedirect } from "~/safe-redirect";

export async function loader({ request }: Route.LoaderArgs) {
  if (await optionalUser(request)) throw redirect("/manuscripts");
  return null;
}

export async function action({ request, context }: Route.ActionArgs) {
  const form = await request.clone().formData();
  try {
    const user = await createAuthenticator(clientIp(context)).authenticate("form", request);
    return await startSession(user.id, safeRedirect(form.get("redirectTo")));
  } catch (e) {
    if (e instanceof SignInError) return data({ message: e.message, field: e.field }, { status: e.status });
    throw e;
  }
}

export default function SignIn() {
  const result = useActionData<typeof action>();
  const [params] = useSearchParams();
  const busy = useNavigation().state === "submitting";
  const notice = params.get("notice");
  return (
    <section className="mx-auto mt-8 max-w-sm">
      <h1 className="text-3xl">Sign in</h1>
      {notice ? <div className="mt-4"><Notice tone="ok">{notice}</Notice></div> : null}
      <Form method="post" className="mt-6 flex flex-col gap-4" noValidate>
        <input type="hidden" name="redirectTo" value={params.get("redirectTo") ?? ""} />
        <Field label="E-mail address" name="email" type="email" autoComplete="email" required maxLength={254}
          error={result?.field === "email" ? result.message : undefined} />
        <Field label="Password" name="password" type="password" autoComplete="current-password" required
          error={result?.field === "password" ? result.message : undefined} />
        {result && !result.field ? <Notice tone="caution">{result.message}</Notice> : null}
        <Button kind="primary" type="submit" disabled={busy}>{busy ? "Signing in…" : "Sign in"}</Button>
      </Form>
      <p className="mt-6 text-sm text-ink-soft">
        <Link className="underline underline-offset-4" to="/forgot-password">Forgot your password?</Link>
        {" · "}
        <Link className="underline underline-offset-4" to="/sign-up">Create an account</Link>
      </p>
    </section>
  );
}

export const meta: Route.MetaFunction = () => [{ title: "Sign in · Steradian" }];
