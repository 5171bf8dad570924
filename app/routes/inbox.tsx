import { Form, Link, useLoaderData } from "react-router";
import { z } from "zod";
import type { Route } from "./+types/inbox";
import { db } from "~/.server/platform/db.server";
import { parseForm } from "~/.server/platform/http/forms.server";
import { requireUser } from "~/.server/platform/http/guards.server";
import { listNotifications, markRead } from "~/.server/versions/notifications.server";
import { Button } from "~/components/ui/button";
import { Shape } from "~/components/ui/shape";

export async function loader({ request }: Route.LoaderArgs) {
  const user = await requireUser(request);
  return { notifications: await listNotifications(db, user.id) };
}

const InboxForm = z.discriminatedUnion("intent", [z.object({ intent: z.literal("read-all") }), z.object({ intent: z.literal("read"), id: z.uuid() })]);

export async function action({ request }: Route.ActionArgs) {
  const user = await requireUser(request);
  const parsed = await parseForm(request, InboxForm);
  if (!parsed.ok) return parsed.response;
  const marked = await markRead(db, user.id, parsed.value.intent === "read-all" ? { all: true } : { id: parsed.value.id });
  return { ok: true as const, marked };
}

const when = (d: Date | string) => new Date(d).toISOString().slice(0, 16).replace("T", " ") + " UTC";
const KIND_LABEL = { requested: "sign-off requested", "signed-off": "signed off", returned: "returned", superseded: "superseded" } as const;

export default function Inbox() {
  const { notifications } = useLoaderData<typeof loader>();
  const unread = notifications.filter((n) => n.read_at === null).length;
  return (
    <>
      <div className="mb-6 flex items-baseline gap-4 border-b border-rule pb-3">
        <h1 className="flex-1 text-3xl">Inbox</h1>
        <span className="text-sm text-ink-soft">{unread} unread</span>
        {unread > 0 ? <Form method="post"><input type="hidden" name="intent" value="read-all" /><Button type="submit">Mark all as read</Button></Form> : null}
      </div>
      <p className="mb-4 text-sm text-ink-soft">Requests for sign-off, and what happened to the versions you sealed, asked for or reviewed. The same messages go to your e-mail address. Opening a version marks its messages read.</p>
      {notifications.length === 0 ? <p className="text-ink-soft">Nothing here yet.</p> : (
        <ul className="divide-y divide-rule border-y border-rule" data-testid="inbox">
          {notifications.map((n) => (
            <li key={n.id} className="flex gap-4 py-3" data-unread={n.read_at === null ? "true" : "false"}>
              <span className="pt-1" title={n.read_at === null ? "unread" : "read"}><Shape name={n.read_at === null ? "disc" : "ring"} /><span className="sr-only">{n.read_at === null ? "unread" : "read"}</span></span>
              <div className="flex-1">
                <p className="text-xs uppercase tracking-wider text-ink-faint">{KIND_LABEL[n.kind]} · {when(n.created_at)}</p>
                <Link to={n.link} className={`font-serif text-lg hover:text-madder ${n.read_at === null ? "" : "text-ink-soft"}`}>{n.subject}</Link>
                <div className="mt-1 space-y-1 text-sm text-ink-soft">{n.body.split("\n\n").map((p, i) => <p key={i} className="break-words">{p}</p>)}</div>
              </div>
              {n.read_at === null ? (
                <Form method="post" className="self-start"><input type="hidden" name="intent" value="read" /><input type="hidden" name="id" value={n.id} /><button type="submit" className="text-xs text-ink-soft underline underline-offset-4">mark read</button></Form>
              ) : null}
            </li>
          ))}
        </ul>
      )}
    </>
  );
}

export const meta: Route.MetaFunction = () => [{ title: "Inbox · Steradian" }];
