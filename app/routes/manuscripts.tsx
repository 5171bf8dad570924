import { Form, Link, redirect, useActionData, useLoaderData } from "react-router";
import type { Route } from "./+types/manuscripts";
import { db } from "~/.server/platform/db.server";
import { parseForm } from "~/.server/platform/http/forms.server";
import { requireUser } from "~/.server/platform/http/guards.server";
import { ManuscriptForm, createManuscript, listManuscriptsForUser } from "~/.server/manuscripts/manuscripts.server";
import { clientIp } from "~/.server/platform/http/client-address.server";
import { Button } from "~/components/ui/button";
import { Field } from "~/components/ui/field";
import { DemoBadge } from "~/components/ui/notice";
import { RoleTag } from "~/components/role-tag";

export async function loader({ request }: Route.LoaderArgs) {
  const user = await requireUser(request);
  return { manuscripts: await listManuscriptsForUser(db, user.id), isAdmin: user.siteRole === "admin" };
}

export async function action({ request, context }: Route.ActionArgs) {
  const user = await requireUser(request);
  const parsed = await parseForm(request, ManuscriptForm);
  if (!parsed.ok) return parsed.response;
  const id = await createManuscript(db, user.id, parsed.value, clientIp(context));
  throw redirect(`/manuscripts/${id}`);
}

export default function Manuscripts() {
  const { manuscripts, isAdmin } = useLoaderData<typeof loader>();
  const result = useActionData<typeof action>();
  return (
    <div className="grid grid-cols-[1fr_18rem] gap-10 max-lg:grid-cols-1">
      <section aria-labelledby="ms-title">
        <h1 id="ms-title" className="text-3xl">Your manuscripts</h1>
        {manuscripts.length === 0 ? (
          isAdmin ? (
            <div className="mt-6 max-w-xl text-ink-soft" data-testid="admin-landing">
              <p>As the site admin you manage accounts and read the mail the site sends; manuscripts are their members' own, so none is listed here unless you are a member.</p>
              <p className="mt-2"><Link className="text-ink underline underline-offset-4" to="/admin/accounts">Accounts</Link> — disable, re-enable, see who signed up. <Link className="text-ink underline underline-offset-4" to="/admin/mail">Mail</Link> — invitations, confirmations and reset links as sent.</p>
            </div>
          ) : (
            <p className="mt-6 text-ink-soft">No manuscripts yet. Start one on the right, or wait for an invitation from a co-author.</p>
          )
        ) : (
          <ul className="mt-6 divide-y divide-rule border-y border-rule">
            {manuscripts.map((m) => (
              <li key={m.id} className="flex items-baseline gap-4 py-4">
                <div className="flex-1">
                  <Link to={`/manuscripts/${m.id}`} className="font-serif text-xl hover:text-madder">{m.title}</Link>
                  <p className="mt-1 text-sm text-ink-soft">
                    {m.journal ? <>{m.journal} · </> : null}
                    <span className="num">{m.memberCount}</span> member{Number(m.memberCount) === 1 ? "" : "s"}
                  </p>
                </div>
                {m.is_demo ? <DemoBadge /> : null}
                <RoleTag role={m.role} />
              </li>
            ))}
          </ul>
        )}
      </section>
      <aside aria-labelledby="new-title" className="border-l border-rule pl-6 max-lg:border-l-0 max-lg:pl-0">
        <h2 id="new-title" className="text-xl">Start a manuscript</h2>
        <p className="mt-1 text-sm text-ink-soft">You become its corresponding author.</p>
        <Form method="post" className="mt-4 flex flex-col gap-3" noValidate>
          <Field label="Working title" name="title" required maxLength={300} error={result?.fieldErrors?.title} />
          <Field label="Target journal (optional)" name="journal" maxLength={200} error={result?.fieldErrors?.journal} />
          <Button kind="primary" type="submit">Create manuscript</Button>
        </Form>
      </aside>
    </div>
  );
}

export const meta: Route.MetaFunction = () => [{ title: "Manuscripts · Steradian" }];
