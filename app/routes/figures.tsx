import { Form, Link, data, redirect, useActionData, useLoaderData } from "react-router";
import { z } from "zod";
import type { Route } from "./+types/figures";
import { listDatasets } from "~/.server/datasets/dataset-repository.server";
import { db } from "~/.server/platform/db.server";
import { FigureTitleTaken, listFigures } from "~/.server/figures/figure-repository.server";
import { FigureStartError, startFigure } from "~/.server/figures/figure-service.server";
import { requirePermission, requireUser } from "~/.server/platform/http/guards.server";
import { loadManuscriptPage } from "~/.server/manuscripts/manuscript-context.server";
import { latestVersionStates } from "~/.server/versions/version-repository.server";
import { clientIp } from "~/.server/platform/http/client-address.server";
import { parseForm } from "~/.server/platform/http/forms.server";
import { ManuscriptNav } from "~/components/manuscript-nav";
import { Button } from "~/components/ui/button";
import { Field, SelectField } from "~/components/ui/field";
import { DemoBadge, Notice } from "~/components/ui/notice";
import { LatestVersionCell } from "~/components/versions/version-state-tag";

export async function loader({ request, params }: Route.LoaderArgs) {
  const page = await loadManuscriptPage(request, params.manuscriptId);
  const [rows, datasets] = await Promise.all([listFigures(db, params.manuscriptId), listDatasets(db, params.manuscriptId)]);
  const latest = await latestVersionStates(db, rows.map((f) => f.id));
  const figures = rows.map((f) => ({ ...f, latest: latest.get(f.id) ?? null }));
  return { ...page, figures, datasets: datasets.filter((d) => d.latestRevision != null).map((d) => ({ id: d.id, name: d.name, latestRevision: Number(d.latestRevision) })) };
}

const NewFigureForm = z.object({
  title: z.string().trim().min(1, "Give the figure a title.").max(200, "A title is at most 200 characters."),
  start: z.string(),
});

export async function action({ request, params, context }: Route.ActionArgs) {
  const user = await requireUser(request);
  await requirePermission("page", user, params.manuscriptId, "edit:figure");
  const parsed = await parseForm(request, NewFigureForm);
  if (!parsed.ok) return parsed.response;
  const start = parsed.value.start;
  const from = start === "" ? undefined : { datasetId: start };
  let created;
  try {
    created = await startFigure(db, { manuscriptId: params.manuscriptId, userId: user.id, ip: clientIp(context), input: { title: parsed.value.title, from } });
  } catch (e) {
    if (e instanceof FigureTitleTaken) return data({ fieldErrors: { title: e.message } as Record<string, string> }, { status: 422 });
    if (e instanceof FigureStartError) return data({ fieldErrors: { start: e.message } as Record<string, string> }, { status: 422 });
    throw e;
  }
  throw redirect(`/manuscripts/${params.manuscriptId}/figures/${created.id}`);
}

const when = (d: Date | string) => new Date(d).toISOString().slice(0, 16).replace("T", " ") + " UTC";

export default function Figures() {
  const { manuscript, role, can, figures, datasets } = useLoaderData<typeof loader>();
  const result = useActionData<typeof action>();
  const e = result?.fieldErrors ?? {};
  return (
    <>
      <ManuscriptNav manuscript={manuscript} role={role} can={can} />
      <div className="grid grid-cols-[1fr_20rem] gap-10 max-lg:grid-cols-1">
        <section aria-labelledby="fig-h">
          <h2 id="fig-h" className="text-xl">Figures</h2>
          <p className="mt-1 text-sm text-ink-soft">A figure puts measured dataset revisions and the engine's predictions in one picture. Its draft is saved as you edit; what goes to the journal is a sealed version of it.</p>
          {figures.length === 0 ? <p className="mt-6 text-ink-soft">No figures yet.</p> : (
            <table className="mt-4 w-full text-sm">
              <thead className="border-b border-rule text-left text-ink-soft">
                <tr><th className="py-2 font-medium">Title</th><th className="font-medium">Panels</th><th className="font-medium">Latest version</th><th className="font-medium">Draft</th><th className="font-medium">Last edit</th></tr>
              </thead>
              <tbody className="divide-y divide-rule">
                {figures.map((f) => (
                  <tr key={f.id}>
                    <td className="py-2.5"><Link className="font-serif text-base hover:text-madder" to={f.id}>{f.title}</Link> {f.is_demo ? <DemoBadge /> : null}</td>
                    <td className="font-mono">{f.panelCount}</td>
                    <td data-testid={`figure-state-${f.id}`}><LatestVersionCell latest={f.latest} /></td>
                    <td><span className="font-mono text-ink-faint">rev {f.draft_revision}</span></td>
                    <td className="text-ink-soft">{when(f.updated_at)} · {f.updatedByName}</td>
                  </tr>
                ))}
              </tbody>
            </table>
          )}
        </section>
        {can["edit:figure"] ? (
          <aside aria-labelledby="new-fig" className="border-l border-rule pl-6 max-lg:border-l-0 max-lg:pl-0">
            <h2 id="new-fig" className="text-xl">New figure</h2>
            {result ? <div className="mt-3"><Notice tone="caution">Some fields need attention.</Notice></div> : null}
            <Form method="post" className="mt-4 flex flex-col gap-3" noValidate>
              <Field label="Title" name="title" required maxLength={200} error={e.title} hint="For the figure list, e.g. “Fig. 3: annihilation in flight”." />
              <SelectField label="Start from" name="start" defaultValue={datasets[0]?.id ?? ""} error={e.start}>
                <option value="">an empty figure</option>
                {datasets.map((d) => <option key={d.id} value={d.id}>{d.name} (r{d.latestRevision}) with its prediction</option>)}
              </SelectField>
              <p className="text-xs text-ink-faint">A figure started from a dataset shows its latest revision on the dataset's own axes, with the prediction its metadata names (process and beam energy) in a ratio strip.</p>
              <Button kind="primary" type="submit">Create figure</Button>
            </Form>
          </aside>
        ) : null}
      </div>
    </>
  );
}

export const meta: Route.MetaFunction = () => [{ title: "Figures · Steradian" }];
