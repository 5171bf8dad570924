import { useLoaderData } from "react-router";
import type { Route } from "./+types/admin-mail";
import { env } from "~/.server/platform/env.server";
import { requireSite, requireUser } from "~/.server/platform/http/guards.server";
import { Notice } from "~/components/ui/notice";

type Caught = { id: number; receivedAt: string; from: string; to: string[]; subject: string; text: string };

export async function loader({ request }: Route.LoaderArgs) {
  const user = await requireUser(request);
  requireSite("page", user, "read:mail");
  if (!env.MAIL_CATCHER_URL) return { messages: [] as Caught[], problem: "No local mail catcher is configured (MAIL_CATCHER_URL): messages go to the real SMTP relay." };
  try {
    const res = await fetch(new URL("/messages", env.MAIL_CATCHER_URL));
    const body = (await res.json()) as { messages: Caught[] };
    return { messages: body.messages, problem: null };
  } catch {
    return { messages: [] as Caught[], problem: `The local mail catcher at ${env.MAIL_CATCHER_URL} does not answer.` };
  }
}

export default function AdminMail() {
  const { messages, problem } = useLoaderData<typeof loader>();
  return (
    <>
      <h1 className="text-3xl">Captured mail</h1>
      <p className="mt-1 text-sm text-ink-soft">Messages the app sent, caught by the local SMTP stand-in instead of being delivered.</p>
      {problem ? <div className="mt-4"><Notice tone="caution">{problem}</Notice></div> : null}
      {messages.length === 0 && !problem ? <p className="mt-6 text-ink-soft">No messages yet.</p> : null}
      <ul className="mt-6 space-y-4">
        {messages.map((m) => (
          <li key={m.id} className="border border-rule bg-sheet p-4">
            <p className="text-sm text-ink-soft"><span className="num font-mono">{m.receivedAt.replace("T", " ").slice(0, 19)}</span> · to {m.to.join(", ")}</p>
            <h2 className="mt-1 font-sans text-base font-medium">{m.subject}</h2>
            <pre className="mt-2 whitespace-pre-wrap font-sans text-sm">{withLinks(m.text)}</pre>
          </li>
        ))}
      </ul>
    </>
  );
}

export const meta: Route.MetaFunction = () => [{ title: "Mail · Steradian" }];

/** The message's text with each http(s) address as a link, so that an invitation or a reset can be followed from here. */
function withLinks(text: string): React.ReactNode[] {
  return text.split(/(https?:\/\/[^\s<>"]+)/g).map((part, i) =>
    i % 2 === 1 ? <a key={i} href={part} className="break-all underline underline-offset-2">{part}</a> : part,
  );
}
