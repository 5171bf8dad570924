import { Link, useLoaderData } from "react-router";
import type { Route } from "./+types/manuscript";
import { db } from "~/.server/platform/db.server";
import { loadManuscriptPage } from "~/.server/manuscripts/manuscript-context.server";
import { listMembers } from "~/.server/manuscripts/manuscripts.server";
import { ManuscriptNav } from "~/components/manuscript-nav";
import { RoleTag } from "~/components/role-tag";
import { Notice } from "~/components/ui/notice";

export async function loader({ request, params }: Route.LoaderArgs) {
  const page = await loadManuscriptPage(request, params.manuscriptId);
  const members = await listMembers(db, params.manuscriptId);
  return { ...page, members };
}

const STEPS = ["Data", "Predictions", "Composition", "Seal", "Sign-off", "Export"] as const;
// Figures (composition, sealing, sign-off, export) are not built yet; the page says so.
const AVAILABLE = new Set<string>(["Data", "Predictions"]);

export default function ManuscriptOverview() {
  const { manuscript, role, can, members } = useLoaderData<typeof loader>();
  return (
    <>
      <ManuscriptNav manuscript={manuscript} role={role} can={can} />
      {manuscript.is_demo ? (
        <div className="mb-6"><Notice>This manuscript belongs to an invented demonstration collaboration. Its data are synthetic, generated from the engine's own predictions with seeded noise; they are not measurements.</Notice></div>
      ) : null}
      <div className="grid grid-cols-[1fr_16rem] gap-10 max-lg:grid-cols-1">
        <section aria-labelledby="work-title">
          <h2 id="work-title" className="text-xl">How a figure gets to the journal</h2>
          <ol className="mt-4 flex flex-wrap gap-px border border-rule bg-rule text-sm">
            {STEPS.map((s, i) => (
              <li key={s} className={`flex-1 bg-sheet px-3 py-2 ${AVAILABLE.has(s) ? "" : "text-ink-faint"}`}>
                <span className="font-mono text-ink-faint">{i + 1}</span> {s}{AVAILABLE.has(s) ? null : <span className="sr-only"> (not available yet)</span>}
              </li>
            ))}
          </ol>
          <p className="mt-2 text-xs text-ink-faint">Steps 3–6 (figures, sealed versions, sign-off and export) are not available in this release yet.</p>
          <p className="mt-4 text-sm text-ink-soft">
            Start with the measured data: <Link className="underline underline-offset-4" to={`/manuscripts/${manuscript.id}/datasets`}>datasets of this manuscript</Link>.
            {" "}Theory curves come from the <Link className="underline underline-offset-4" to="/predictions">predictions</Link> engine.
          </p>
        </section>
        <aside aria-labelledby="members-title">
          <h2 id="members-title" className="text-xl">Members</h2>
          <ul className="mt-3 space-y-2 text-sm">
            {members.map((m) => (
              <li key={m.userId} className="flex flex-col"><span>{m.name}</span><RoleTag role={m.role} /></li>
            ))}
          </ul>
          <Link to={`/manuscripts/${manuscript.id}/members`} className="mt-3 inline-block text-sm underline underline-offset-4">
            {can["manage:members"] ? "Manage members" : "All members"}
          </Link>
        </aside>
      </div>
    </>
  );
}

export const meta: Route.MetaFunction = ({ data }) => [{ title: `${data?.manuscript.title ?? "Manuscript"} · Steradian` }];
