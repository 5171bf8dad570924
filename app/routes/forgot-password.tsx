import { Form, useActionData } from "react-router";
import { z } from "zod";
import type { Route } from "./+types/forgot-password";
import { EmailSchema, requestPasswordReset } from "~/.server/accounts/accounts.server";
import { db } from "~/.server/platform/db.server";
import { parseForm } from "~/.server/platform/http/forms.server";
import { clientIp } from "~/.server/platform/http/client-address.server";
import { Button } from "~/components/ui/button";
import { Field } from "~/components/ui/field";

const ForgotForm = z.object({ email: EmailSchema });

export async function action({ request, context }: Route.ActionArgs) {
  const parsed = await parseForm(request, ForgotForm);
  if (!parsed.ok) return parsed.response;
  // The look-up, the token and the mail happen after the answer, so that the answer takes the
  // same time whether or not an account uses the address (docs/decisions/0012-hardening.md).
  const { email } = parsed.value;
  const ip = clientIp(context);
  setImmediate(() => {
    requestPasswordReset(db, email, ip).catch((e: unknown) => console.error("[steradian] sending a reset link failed:", e));
  });
  return { ok: true as const };
}

export default function ForgotPassword() {
  const result = useActionData<typeof action>();
  return (
    <section className="mx-auto mt-8 max-w-sm">
      <h1 className="text-3xl">Reset your password</h1>
      {result?.ok ? (
        <p className="mt-4">If an account uses that address, a message with a reset link is on its way. The link works once, for one hour.</p>
      ) : (
        <Form method="post" className="mt-6 flex flex-col gap-4" noValidate>
          <Field label="E-mail address" name="email" type="email" autoComplete="email" required maxLength={254}
            error={result && !result.ok ? result.fieldErrors.email : undefined} />
          <Button kind="primary" type="submit">Send me a reset link</Button>
        </Form>
      )}
    </section>
  );
}

export const meta: Route.MetaFunction = () => [{ title: "Reset your password · Steradian" }];
