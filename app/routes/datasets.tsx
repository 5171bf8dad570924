import { Form, Link, data, redirect, useActionData, useLoaderData } from "react-router";
import type { Route } from "./+types/datasets";
import { DatasetNameTaken, createDatasetAudited } from "~/.server/datasets/dataset-create.server";
import { DATASET_FORM_FIELDS, DatasetForm } from "~/.server/datasets/dataset-input.server";
import { listDatasets } from "~/.server/datasets/dataset-repository.server";
import { db } from "~/.server/platform/db.server";
import { parseForm } from "~/.server/platform/http/forms.server";
import { requirePermission, requireUser } from "~/.server/platform/http/guards.server";
import { loadManuscriptPage } from "~/.server/manuscripts/manuscript-context.server";
import { clientIp } from "~/.server/platform/http/client-address.server";
import { ManuscriptNav } from "~/components/manuscript-nav";
import { describeQuantity } from "~/components/quantity-labels";
import { Button } from "~/components/ui/button";
import { Field, SelectField } from "~/components/ui/field";
import { DemoBadge, Notice } from "~/components/ui/notice";
import { ENERGY_UNITS, T_UNITS, X_KINDS, X_LABELS, Y_KINDS, Y_LABELS } from "~/datasets/quantity";
import { PROCESSES } from "~/engine";

export async function loader({ request, params }: Route.LoaderArgs) {
  const page = await loadManuscriptPage(request, params.manuscriptId, "read:dataset");
  return { ...page, datasets: await listDatasets(db, params.manuscriptId), processes: PROCESSES.map((p) => ({ id: p.id, reaction: p.reaction })) };
}

export async function action({ request, params, context }: Route.ActionArgs) {
  const user = await requireUser(request);
  await requirePermission("page", user, params.manuscriptId, "create:dataset");
  const parsed = await parseForm(request, DatasetForm, DATASET_FORM_FIELDS);
  if (!parsed.ok) return parsed.response;
  let created;
  try {
    created = await createDatasetAudited(db, { manuscriptId: params.manuscriptId, userId: user.id, ip: clientIp(context), input: parsed.value });
  } catch (e) {
    if (e instanceof DatasetNameTaken) return data({ ok: false as const, message: "Some fields need attention.", fieldErrors: { name: e.message } }, { status: 422 });
    throw e;
  }
  throw redirect(`/manuscripts/${params.manuscriptId}/datasets/${created.id}`);
}

export default function Datasets() {
  const { manuscript, role, can, datasets, processes } = useLoaderData<typeof loader>();
  const result = useActionData<typeof action>();
  const e: Record<string, string> = result && !result.ok ? result.fieldErrors : {};
  return (
    <>
      <ManuscriptNav manuscript={manuscript} role={role} can={can} />
      <div className="grid grid-cols-[1fr_20rem] gap-10 max-lg:grid-cols-1">
        <section aria-labelledby="ds-h">
          <h2 id="ds-h" className="text-xl">Datasets</h2>
          <p className="mt-1 text-sm text-ink-soft">Each dataset is one measured quantity. Every upload that changes its content becomes a new, immutable revision r1, r2, …</p>
          {datasets.length === 0 ? <p className="mt-6 text-ink-soft">No datasets yet.</p> : (
            <ul className="mt-4 divide-y divide-rule border-y border-rule">
              {datasets.map((d) => (
                <li key={d.id} className="flex items-baseline gap-4 py-3">
                  <div className="flex-1">
                    <Link className="font-serif text-lg hover:text-madder" to={d.id}>{d.name}</Link>
                    <p className="text-sm text-ink-soft">{describeQuantity(d.quantity)}{d.target ? ` · target ${d.target}` : ""}</p>
                  </div>
                  {d.is_demo ? <DemoBadge /> : null}
                  <span className="font-mono text-sm">{d.latestRevision ? `r${d.latestRevision}` : "no revision yet"}</span>
                </li>
              ))}
            </ul>
          )}
        </section>
        {can["create:dataset"] ? (
          <aside aria-labelledby="new-ds" className="border-l border-rule pl-6 max-lg:border-l-0 max-lg:pl-0">
            <h2 id="new-ds" className="text-xl">New dataset</h2>
            {result && !result.ok ? <div className="mt-3"><Notice tone="caution">{result.message}</Notice></div> : null}
            <Form method="post" className="mt-4 flex flex-col gap-3" noValidate>
              <Field label="Name" name="name" required maxLength={200} error={e.name} />
              <SelectField label="x is" name="xKind" defaultValue="theta_cm_deg" error={e.xKind}>
                {X_KINDS.map((k) => <option key={k} value={k}>{X_LABELS[k]}{k.startsWith("theta") ? " in degrees" : ""}</option>)}
              </SelectField>
              <SelectField label="Unit of x (for t and energies)" name="xUnit" defaultValue="" error={e.xUnit}>
                <option value="">— (angles, cosθ)</option>
                {[...T_UNITS, ...ENERGY_UNITS].map((u) => <option key={u} value={u}>{u.replace("^2", "²")}</option>)}
              </SelectField>
              <SelectField label="y is" name="yKind" defaultValue="dsigma_domega" error={e.yKind}>
                {Y_KINDS.map((k) => <option key={k} value={k}>{Y_LABELS[k]}</option>)}
              </SelectField>
              <Field label="Unit of y" name="yUnit" defaultValue="nb/sr" required error={e.yUnit} hint="e.g. nb/sr, ub/sr, pb, nb/GeV^2" />
              <SelectField label="Process measured" name="process" defaultValue="" error={e.process}>
                <option value="">— not stated</option>
                {processes.map((p) => <option key={p.id} value={p.id}>{p.reaction}</option>)}
              </SelectField>
              <Field label="Beam energy, GeV (optional)" name="beamEnergyGeV" inputMode="decimal" error={e.beamEnergyGeV} />
              <Field label="Target (optional)" name="target" maxLength={200} error={e.target} />
              <Field label="Description (optional)" name="description" maxLength={4000} error={e.description} />
              <Button kind="primary" type="submit">Create dataset</Button>
            </Form>
          </aside>
        ) : null}
      </div>
    </>
  );
}

export const meta: Route.MetaFunction = () => [{ title: "Datasets · Steradian" }];
