import { Form, Link, redirect, useActionData, useLoaderData } from "react-router";
import type { Route } from "./+types/confirm-email";
import { confirmEmail, peekToken } from "~/.server/accounts/accounts.server";
import { db } from "~/.server/platform/db.server";
import { clientIp } from "~/.server/platform/http/client-address.server";
import { Button } from "~/components/ui/button";

// Opening the link only shows a button: mail scanners that fetch every link must not use up
// the one-time token before its owner does.
export async function loader({ params }: Route.LoaderArgs) {
  return { valid: Boolean(await peekToken(db, params.token, "confirm-email")) };
}

export async function action({ params, context }: Route.ActionArgs) {
  if (await confirmEmail(db, params.token, clientIp(context))) {
    throw redirect(`/sign-in?notice=${encodeURIComponent("Your address is confirmed. Sign in to continue.")}`);
  }
  return { used: true as const };
}

export default function ConfirmEmail() {
  const { valid } = useLoaderData<typeof loader>();
  const result = useActionData<typeof action>();
  if (!valid || result?.used) {
    return (
      <section className="mx-auto mt-8 max-w-md">
        <h1 className="text-3xl">This link no longer works</h1>
        <p className="mt-4">Confirmation links work once and for 24 hours. If your account is already active, <Link className="underline" to="/sign-in">sign in</Link>; otherwise <Link className="underline" to="/sign-up">sign up again</Link>.</p>
      </section>
    );
  }
  return (
    <section className="mx-auto mt-8 max-w-md">
      <h1 className="text-3xl">Confirm your address</h1>
      <p className="mt-4">One click activates your account.</p>
      <Form method="post" className="mt-6"><Button kind="primary" type="submit">Confirm my address</Button></Form>
    </section>
  );
}

export const meta: Route.MetaFunction = () => [{ title: "Confirm your address · Steradian" }];
