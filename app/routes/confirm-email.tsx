import { Link, redirect } from "react-router";
import type { Route } from "./+types/confirm-email";
import { confirmEmail } from "~/.server/accounts.server";
import { db } from "~/.server/db.server";
import { clientIp } from "~/.server/sign-in.server";

export async function loader({ params, context }: Route.LoaderArgs) {
  if (await confirmEmail(db, params.token, clientIp(context))) {
    throw redirect(`/sign-in?notice=${encodeURIComponent("Your address is confirmed. Sign in to continue.")}`);
  }
  return null;
}

export default function ConfirmEmail() {
  return (
    <section className="mx-auto mt-8 max-w-md">
      <h1 className="text-3xl">This link no longer works</h1>
      <p className="mt-4">Confirmation links work once and for 24 hours. If your account is already active, <Link className="underline" to="/sign-in">sign in</Link>; otherwise <Link className="underline" to="/sign-up">sign up again</Link>.</p>
    </section>
  );
}
