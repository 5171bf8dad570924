import { useLoaderData } from "react-router";
import type { Route } from "./+types/manuscript-audit";
import { listManuscriptAudit } from "~/.server/platform/audit.server";
import { db } from "~/.server/platform/db.server";
import { loadManuscriptPage } from "~/.server/manuscripts/manuscript-context.server";
import { ManuscriptNav } from "~/components/manuscript-nav";

export async function loader({ request, params }: Route.LoaderArgs) {
  const page = await loadManuscriptPage(request, params.manuscriptId, "read:audit");
  return { ...page, events: await listManuscriptAudit(db, params.manuscriptId) };
}

export default function Audit() {
  const { manuscript, role, can, events } = useLoaderData<typeof loader>();
  return (
    <>
      <ManuscriptNav manuscript={manuscript} role={role} can={can} />
      <h2 className="text-xl">Activity log</h2>
      <p className="mt-1 text-sm text-ink-soft">Append-only: entries cannot be edited or deleted, by anyone.</p>
      <table className="mt-4 w-full text-sm">
        <thead className="border-b border-rule text-left text-ink-soft">
          <tr><th className="py-2 font-medium">When (UTC)</th><th className="font-medium">Who</th><th className="font-medium">What</th><th className="font-medium">Detail</th></tr>
        </thead>
        <tbody className="divide-y divide-rule">
          {events.map((e) => (
            <tr key={e.id}>
              <td className="num py-1.5 font-mono text-xs">{new Date(e.at).toISOString().replace("T", " ").slice(0, 19)}</td>
              <td>{e.actorName ?? "—"}</td>
              <td>{e.action.replaceAll("-", " ")}</td>
              <td className="font-mono text-xs text-ink-soft">{JSON.stringify(e.detail)}</td>
            </tr>
          ))}
        </tbody>
      </table>
    </>
  );
}

export const meta: Route.MetaFunction = () => [{ title: "Activity log · Steradian" }];
