import { Link, useLoaderData } from "react-router";
import type { Route } from "./+types/manuscript";
import { db } from "~/.server/platform/db.server";
import { loadManuscriptPage } from "~/.server/manuscripts/manuscript-context.server";
import { listFigures } from "~/.server/figures/figure-repository.server";
import { listMembers } from "~/.server/manuscripts/manuscripts.server";
import { latestVersionStates } from "~/.server/versions/version-repository.server";
import { ManuscriptNav } from "~/components/manuscript-nav";
import { RoleTag } from "~/components/role-tag";
import { Notice } from "~/components/ui/notice";
import { LatestVersionCell } from "~/components/versions/version-state-tag";

export async function loader({ request, params }: Route.LoaderArgs) {
  const page = await loadManuscriptPage(request, params.manuscriptId);
  const [members, figures] = await Promise.all([listMembers(db, params.manuscriptId), listFigures(db, params.manuscriptId)]);
  const latest = await latestVersionStates(db, figures.map((f) => f.id));
  return { ...page, members, figures: figures.map((f) => ({ ...f, latest: latest.get(f.id) ?? null })) };
}

/**
 * The way from measured data to the journal, each step with the page where it is done and who
 * does it ("authors": contributors and the corresponding author, app/permissions.ts).
 */
const STEPS = [
  { name: "Data", where: "datasets", who: "authors upload revisions" },
  { name: "Predictions", where: "/predictions", who: "any member computes curves" },
  { name: "Composition", where: "figures", who: "authors edit the draft" },
  { name: "Seal", where: "figures", who: "authors seal a version" },
  { name: "Sign-off", where: "figures", who: "co-authors sign it off" },
  { name: "Export", where: "figures", who: "the corresponding author exports it" },
] as const;

export default function ManuscriptOverview() {
  const { manuscript, role, can, members, figures } = useLoaderData<typeof loader>();
  return (
    <>
      <ManuscriptNav manuscript={manuscript} role={role} can={can} />
      {manuscript.is_demo ? (
        <div className="mb-6"><Notice>This manuscript belongs to an invented demonstration collaboration. Its data are synthetic, generated from the engine's own predictions with seeded noise; they are not measurements.</Notice></div>
      ) : null}
      <div className="grid grid-cols-[1fr_16rem] gap-10 max-lg:grid-cols-1">
        <section aria-labelledby="work-title">
          <h2 id="work-title" className="text-xl">How a figure gets to the journal</h2>
          <ol className="mt-4 grid grid-cols-6 gap-px border border-rule bg-rule text-sm max-lg:grid-cols-3">
            {STEPS.map((s, i) => (
              <li key={s.name} className="bg-sheet px-3 py-2">
                <Link className="hover:text-madder" to={s.where.startsWith("/") ? s.where : `/manuscripts/${manuscript.id}/${s.where}`}>
                  <span className="font-mono text-ink-faint">{i + 1}</span> {s.name}
                </Link>
                <span className="block text-xs text-ink-soft">{s.who}</span>
              </li>
            ))}
          </ol>
          <p className="mt-4 text-sm text-ink-soft">
            Start with the measured data: <Link className="underline underline-offset-4" to={`/manuscripts/${manuscript.id}/datasets`}>datasets of this manuscript</Link>.
            {" "}Theory curves come from the <Link className="underline underline-offset-4" to="/predictions">predictions</Link> engine.
          </p>
          <h2 id="figures-title" className="mt-8 text-xl">Figures</h2>
          {figures.length === 0 ? (
            <p className="mt-2 text-sm text-ink-soft">No figures yet. <Link className="underline underline-offset-4" to={`/manuscripts/${manuscript.id}/figures`}>{can["edit:figure"] ? "Start one" : "Figures"}</Link></p>
          ) : (
            <table className="mt-3 w-full text-sm" aria-labelledby="figures-title">
              <thead className="border-b border-rule text-left text-ink-soft"><tr><th className="py-1.5 pr-4 font-medium">Title</th><th className="pr-4 text-right font-medium">Panels</th><th className="pr-4 font-medium">Latest version</th><th className="pr-4 font-medium">Draft</th><th className="font-medium">Last edit</th></tr></thead>
              <tbody className="divide-y divide-rule">
                {figures.map((f) => (
                  <tr key={f.id}>
                    <td className="py-2 pr-4"><Link className="font-serif hover:text-madder" to={`/manuscripts/${manuscript.id}/figures/${f.id}`}>{f.title}</Link></td>
                    <td className="num pr-4 text-right font-mono">{f.panelCount}</td>
                    <td className="pr-4 whitespace-nowrap" data-testid={`figure-state-${f.id}`}><LatestVersionCell latest={f.latest} /></td>
                    <td className="pr-4 whitespace-nowrap"><span className="font-mono text-ink-faint">rev {f.draft_revision}</span></td>
                    <td className="text-ink-soft">{new Date(f.updated_at).toISOString().slice(0, 16).replace("T", " ")} UTC · {f.updatedByName}</td>
                  </tr>
                ))}
              </tbody>
            </table>
          )}
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
