import { Form, Link, data, redirect, useActionData, useLoaderData, useNavigation, useSearchParams } from "react-router";
import type { Route } from "./+types/dataset";
import { accessDataset, auditRefusedUpload, loadDatasetPage } from "~/.server/datasets/dataset-access.server";
import { MappingForm } from "~/.server/datasets/dataset-input.server";
import { limitMessage } from "~/.server/datasets/dataset-json.server";
import { listRevisions } from "~/.server/datasets/dataset-repository.server";
import { DatasetNameTaken } from "~/.server/datasets/dataset-create.server";
import { TIDY_REFUSAL, canTidyDataset, datasetNameSchema, renameDataset, retireDataset } from "~/.server/datasets/dataset-tidy.server";
import { previewCsv, type RefusedLines } from "~/.server/datasets/csv/preview-csv.server";
import { db } from "~/.server/platform/db.server";
import { env } from "~/.server/platform/env.server";
import { parseFields } from "~/.server/platform/http/forms.server";
import { type UploadOutcome, ingestUpload, pendingId, receiveUploadForm } from "~/.server/datasets/revision-upload.server";
import { openPending, signPending } from "~/.server/datasets/pending-upload.server";
import { clientIp } from "~/.server/platform/http/client-address.server";
import { Fingerprint } from "~/components/fingerprint";
import { ManuscriptNav } from "~/components/manuscript-nav";
import { MappingEditor } from "~/components/mapping-editor";
import { ProblemList } from "~/components/problem-list";
import { describeQuantity } from "~/components/quantity-labels";
import { Button } from "~/components/ui/button";
import { Field } from "~/components/ui/field";
import { DemoBadge, Notice } from "~/components/ui/notice";
import { columnMappingSchema, mappingFieldWords } from "~/datasets/column-mapping";
import { equivalentEnergy, PROCESSES } from "~/engine";
import { quantitySchema } from "~/datasets/quantity";

export async function loader({ request, params }: Route.LoaderArgs) {
  const page = await loadDatasetPage(request, params);
  const { dataset } = page;
  const revisions = await listRevisions(db, dataset.id);
  const url = new URL(request.url);
  const pending = url.searchParams.get("pending");
  let mappingStep = null;
  if (pending && page.can["upload:revision"]) {
    const fileName = url.searchParams.get("file") ?? "";
    const file = await openPending(pending, { userId: page.user.id, datasetId: dataset.id, fileName });
    const preview = file ? await previewCsv(file.tempPath, { rows: 8 }) : null;
    mappingStep = { pending, fileName, gone: !file, preview };
  }
  const saved = dataset.mapping ? columnMappingSchema.safeParse(dataset.mapping) : null;
  const retiredBy = dataset.retired_by ? (await db.selectFrom("app_user").select("name").where("id", "=", dataset.retired_by).executeTakeFirst())?.name ?? null : null;
  return { ...page, dataset, revisions, mappingStep, canTidy: canTidyDataset(page.role, page.user.id, dataset), retiredBy, savedMapping: saved?.success ? saved.data : null, maxBytes: env.UPLOAD_MAX_BYTES };
}

type ActionResult =
  | { kind: "problems"; problems: { row: number | null; column: number | null; header: string | null; message: string }[]; problemCount: number; refused: RefusedLines | null }
  | { kind: "identical"; number: number }
  | { kind: "error"; message: string; fieldErrors?: Record<string, string> }
  | { kind: "rename-error"; message: string };

export async function action({ request, params, context }: Route.ActionArgs) {
  const multipart = (request.headers.get("content-type") ?? "").startsWith("multipart/form-data");
  const posted = multipart ? null : await request.formData();
  const intent = posted?.get("intent");
  if (intent === "rename" || intent === "retire") return tidy(request, params, clientIp(context), intent, posted!);
  const { user, dataset } = await accessDataset("page", request, params.manuscriptId, params.datasetId, "upload:revision");
  const quantity = quantitySchema.parse(dataset.quantity);
  const base = `/manuscripts/${params.manuscriptId}/datasets/${dataset.id}`;
  const common = { manuscriptId: params.manuscriptId, datasetId: dataset.id, userId: user.id, ip: clientIp(context), quantity };

  if (multipart) {
    const form = await receiveUploadForm(request);
    if (!form.ok) {
      const message = form.limit ? limitMessage(form.limit) : form.message;
      await auditRefusedUpload({ userId: user.id, manuscriptId: params.manuscriptId, datasetId: dataset.id, ip: common.ip, reason: message });
      return data<ActionResult>({ kind: "error", message }, { status: form.limit ? 413 : 422 });
    }
    if (!form.upload || form.upload.bytes === 0 && form.upload.fileName === "") {
      await form.discard();
      return data<ActionResult>({ kind: "error", message: "Choose a CSV file to upload.", fieldErrors: { file: "Choose a CSV file to upload." } }, { status: 422 });
    }
    const upload = form.upload;
    const saved = dataset.mapping ? columnMappingSchema.safeParse(dataset.mapping) : null;
    if (form.fields.get("useSaved") === "on" && saved?.success) {
      const outcome = await ingestUpload({ ...common, tempPath: upload.tempPath, raw: { sha256: upload.sha256, bytes: upload.bytes, fileName: upload.fileName }, mapping: saved.data, refusedLines: true });
      return answer(outcome, base);
    }
    // Kept in temporary storage until its columns are mapped; cleaned at the next start if abandoned.
    const token = signPending({ id: pendingId(upload), sha256: upload.sha256 }, { userId: user.id, datasetId: dataset.id, fileName: upload.fileName });
    throw redirect(`${base}?pending=${encodeURIComponent(token)}&file=${encodeURIComponent(upload.fileName)}`);
  }

  const form = posted!;
  const fileName = String(form.get("fileName") ?? "");
  const pending = await openPending(String(form.get("pending") ?? ""), { userId: user.id, datasetId: dataset.id, fileName });
  if (!pending) return data<ActionResult>({ kind: "error", message: "That upload is no longer waiting (it was used, or the server restarted). Upload the file again." }, { status: 422 });
  const mapping = parseFields(form, MappingForm);
  if (!mapping.ok) return data<ActionResult>({ kind: "error", message: "Some columns need attention.", fieldErrors: mapping.fieldErrors }, { status: 422 });
  const outcome = await ingestUpload({ ...common, tempPath: pending.tempPath, raw: { sha256: pending.sha256, bytes: pending.bytes, fileName }, mapping: mapping.value, keepRefused: true, refusedLines: true });
  return answer(outcome, base);
}

/** Rename or retire, for the corresponding author and the dataset's creator; both are audited. */
async function tidy(request: Request, params: { manuscriptId: string; datasetId: string }, ip: string | null, intent: "rename" | "retire", form: FormData) {
  const { user, role, dataset } = await accessDataset("page", request, params.manuscriptId, params.datasetId, "read:dataset");
  if (!canTidyDataset(role, user.id, dataset)) throw data({ message: TIDY_REFUSAL }, { status: 403 });
  const base = `/manuscripts/${params.manuscriptId}/datasets/${dataset.id}`;
  if (intent === "retire") {
    await retireDataset(db, { dataset, userId: user.id, ip });
    throw redirect(`${base}?retired=1`);
  }
  const name = datasetNameSchema.safeParse(String(form.get("name") ?? ""));
  if (!name.success) return data<ActionResult>({ kind: "rename-error", message: name.error.issues[0].message }, { status: 422 });
  try {
    await renameDataset(db, { dataset, userId: user.id, ip, name: name.data });
  } catch (e) {
    if (e instanceof DatasetNameTaken) return data<ActionResult>({ kind: "rename-error", message: e.message }, { status: 422 });
    throw e;
  }
  throw redirect(`${base}?renamed=1`);
}

function answer(o: UploadOutcome, base: string) {
  if (o.kind === "created") throw redirect(`${base}?uploaded=r${o.revision.number}`);
  if (o.kind === "identical") return data<ActionResult>({ kind: "identical", number: o.revision.number });
  if (o.kind === "limit") return data<ActionResult>({ kind: "error", message: limitMessage(o.limit) }, { status: 413 });
  if (o.kind === "problems") return data<ActionResult>({ kind: "problems", problems: o.problems, problemCount: o.problemCount, refused: o.refused }, { status: 422 });
  throw new Error("unreachable upload outcome");
}

export default function DatasetPage() {
  const { manuscript, role, can, dataset, revisions, mappingStep, savedMapping, maxBytes, canTidy, retiredBy } = useLoaderData<typeof loader>();
  const retired = dataset.retired_at != null;
  const result = useActionData<typeof action>() as ActionResult | undefined;
  const [params] = useSearchParams();
  const busy = useNavigation().state === "submitting";
  const uploaded = params.get("uploaded");
  return (
    <>
      <ManuscriptNav manuscript={manuscript} role={role} can={can} />
      <p className="text-sm"><Link className="text-ink-soft underline underline-offset-4" to={`/manuscripts/${manuscript.id}/datasets`}>Datasets</Link> /</p>
      <div className="flex items-baseline gap-4">
        <h2 className="flex-1 text-2xl">{dataset.name}</h2>
        {retired ? <span className="border border-rule-strong px-2 py-0.5 text-sm text-ink-soft">retired</span> : null}
        {dataset.is_demo ? <DemoBadge /> : null}
      </div>
      <p className="mt-1 text-sm text-ink-soft">
        {describeQuantity(dataset.quantity)}
        {dataset.process ? ` · ${reactionOf(dataset.process)}` : ""}
        {dataset.beam_energy_gev ? ` · ${beamEnergyText(dataset.process, Number(dataset.beam_energy_gev))}` : ""}
        {dataset.target ? ` · target ${dataset.target}` : ""}
      </p>
      {dataset.description ? <p className="mt-2 max-w-3xl text-sm">{dataset.description}</p> : null}

      <div className="mt-4 space-y-3">
        {retired ? (
          <Notice tone="caution">
            <span data-testid="retired-notice">This dataset was retired on {new Date(dataset.retired_at!).toISOString().slice(0, 10)}{retiredBy ? ` by ${retiredBy}` : ""}. It no longer appears in the dataset lists and takes no new revisions; its revisions stay readable here, so figures that cite them keep working.</span>
          </Notice>
        ) : null}
        {params.get("renamed") && !result ? <Notice tone="ok">Renamed.</Notice> : null}
        {uploaded && !result ? <Notice tone="ok">Stored as revision <strong className="font-mono">{uploaded}</strong>.</Notice> : null}
        {result?.kind === "identical" ? <Notice>The content is identical to <strong className="font-mono">r{result.number}</strong>: no new revision was created.</Notice> : null}
        {result?.kind === "error" ? <Notice tone="caution">{result.message}{result.fieldErrors ? <ul className="mt-1 list-disc pl-5">{Object.entries(result.fieldErrors).map(([k, v]) => <li key={k}>{k === "file" ? "file" : mappingFieldWords(k)}: {v}</li>)}</ul> : null}</Notice> : null}
        {result?.kind === "problems" ? <ProblemList problems={result.problems} problemCount={result.problemCount} refused={result.refused} /> : null}
      </div>

      {mappingStep ? (
        <section aria-labelledby="map-h" className="mt-6 border border-rule bg-sheet p-5">
          <h3 id="map-h" className="text-xl">Map the columns of “{mappingStep.fileName}”</h3>
          {mappingStep.gone ? <p className="mt-2">This upload is no longer waiting. Upload the file again.</p>
            : mappingStep.preview && !mappingStep.preview.ok ? <div className="mt-3"><ProblemList problems={mappingStep.preview.problems} problemCount={mappingStep.preview.problems.length} /></div>
            : mappingStep.preview?.ok ? (
              <MappingEditor pending={mappingStep.pending} fileName={mappingStep.fileName} preview={mappingStep.preview} saved={savedMapping} busy={busy} errors={result?.kind === "error" ? result.fieldErrors : undefined} problems={result?.kind === "problems" ? result.problems : undefined} />
            ) : null}
        </section>
      ) : null}

      <div className="mt-8 grid grid-cols-[1fr_20rem] gap-10 max-lg:grid-cols-1">
        <section aria-labelledby="rev-h">
          <h3 id="rev-h" className="text-xl">Revisions</h3>
          {revisions.length === 0 ? <p className="mt-3 text-ink-soft">No revision yet. Upload the measured values as CSV.</p> : (
            <table className="mt-3 w-full text-sm">
              <thead className="border-b border-rule text-left text-ink-soft">
                <tr><th className="py-2 font-medium">Revision</th><th className="pr-4 text-right font-medium">Rows</th><th className="font-medium">Content fingerprint</th><th className="font-medium">File</th><th className="font-medium">Uploaded</th></tr>
              </thead>
              <tbody className="divide-y divide-rule">
                {revisions.map((r) => (
                  <tr key={r.id}>
                    <td className="py-2"><Link className="font-mono underline underline-offset-2" to={`revisions/${r.number}`}>r{r.number}</Link></td>
                    <td className="num pr-4 text-right">{r.row_count.toLocaleString("en")}</td>
                    <td><Fingerprint value={r.content_hash} /></td>
                    <td>{can["download:raw"] ? <a className="underline underline-offset-2" href={`/manuscripts/${manuscript.id}/datasets/${dataset.id}/revisions/${r.number}/raw`}>{r.raw_filename}</a> : r.raw_filename}</td>
                    <td className="num text-ink-soft">{new Date(r.created_at).toISOString().slice(0, 16).replace("T", " ")} · {r.uploaderName}</td>
                  </tr>
                ))}
              </tbody>
            </table>
          )}
          {revisions.length >= 2 ? (
            <Form method="get" action="compare" className="mt-4 flex items-end gap-3 text-sm">
              <label className="flex flex-col gap-1">From<select name="from" defaultValue={revisions[1].number} className="border border-rule-strong bg-sheet px-2 py-1">{revisions.map((r) => <option key={r.id} value={r.number}>r{r.number}</option>)}</select></label>
              <label className="flex flex-col gap-1">To<select name="to" defaultValue={revisions[0].number} className="border border-rule-strong bg-sheet px-2 py-1">{revisions.map((r) => <option key={r.id} value={r.number}>r{r.number}</option>)}</select></label>
              <Button type="submit">Compare row by row</Button>
            </Form>
          ) : null}
        </section>
        {retired ? null : can["upload:revision"] ? (
          <aside aria-labelledby="up-h" className="border-l border-rule pl-6 max-lg:border-l-0 max-lg:pl-0">
            <h3 id="up-h" className="text-xl">Upload a revision</h3>
            <p className="mt-1 text-sm text-ink-soft">CSV in UTF-8 (with or without BOM), separated by commas, semicolons or tabs, with a header line. Up to {(maxBytes / 2 ** 20).toFixed(0)} MiB.</p>
            {/* Keyed by the number of revisions: after a stored revision the file input starts empty. */}
            <Form key={revisions.length} method="post" encType="multipart/form-data" className="mt-3 flex flex-col gap-3">
              <label className="flex flex-col gap-1 text-sm font-medium">CSV file
                <input type="file" name="file" accept=".csv,.tsv,.txt,text/csv" required className="text-sm font-normal" />
              </label>
              {savedMapping ? (
                <label className="flex items-center gap-2 text-sm"><input type="checkbox" name="useSaved" defaultChecked /> Use the saved column mapping</label>
              ) : null}
              <Button kind="primary" type="submit" disabled={busy}>{busy ? "Checking…" : "Upload"}</Button>
            </Form>
          </aside>
        ) : (
          <aside aria-labelledby="ro-h" className="border-l border-rule pl-6 text-sm max-lg:border-l-0 max-lg:pl-0">
            <h3 id="ro-h" className="text-xl">Read only for you</h3>
            <p className="mt-1 text-ink-soft" data-testid="read-only-reason">
              You are {role === "observer" ? "an observer" : role === "coauthor" ? "a co-author" : `a ${role}`} of this manuscript: you can read every revision and compare them
              {role === "coauthor" ? ", and you review the figures made from them" : ""}. New revisions are uploaded by contributors and the corresponding author; ask one of them if the data must change.
            </p>
          </aside>
        )}
      </div>

      {canTidy && !retired ? (
        <section aria-labelledby="tidy-h" className="mt-10 max-w-3xl border-t border-rule pt-6">
          <h3 id="tidy-h" className="text-xl">Rename or retire</h3>
          <p className="mt-1 text-sm text-ink-soft">Open to the corresponding author and to whoever created the dataset. Both are recorded in the manuscript's activity.</p>
          <Form method="post" className="mt-3 flex flex-wrap items-end gap-3">
            <input type="hidden" name="intent" value="rename" />
            <Field label="New name" name="name" defaultValue={dataset.name} required maxLength={200} className="min-w-80 flex-1" error={result?.kind === "rename-error" ? result.message : undefined} />
            <Button type="submit" disabled={busy}>Rename</Button>
          </Form>
          <Form method="post" className="mt-5 flex flex-wrap items-center gap-3 text-sm">
            <input type="hidden" name="intent" value="retire" />
            <label className="flex items-center gap-2"><input type="checkbox" name="confirm" required /> Retire this dataset: it leaves the lists and takes no new revisions; its revisions stay readable for the figures that cite them.</label>
            <Button kind="danger" type="submit" disabled={busy}>Retire</Button>
          </Form>
        </section>
      ) : null}
    </>
  );
}

/** A process id as its reaction in physics notation (e⁺e⁻ → γγ), as the engine's registry writes it. */
function reactionOf(processId: string): string {
  return PROCESSES.find((p) => p.id === processId)?.reaction ?? processId;
}

/** The dataset's total beam energy named, to five significant digits, with the kinetic energy where the process has a beam at rest-target. */
function beamEnergyText(processId: string | null, beamGeV: number): string {
  const total = `total beam energy ${Number(beamGeV.toPrecision(5))} GeV`;
  const info = PROCESSES.find((p) => p.id === processId);
  if (!info || info.needsSqrtS || !info.frames.includes("lab")) return total;
  const kinetic = equivalentEnergy({ process: info.id, kind: "beam", valueGeV: beamGeV, mass: null, finalMass: null }, { process: info.id, kind: "kinetic", mass: null, finalMass: null });
  return kinetic === null ? total : `${total} (beam kinetic energy T = ${Number(kinetic.toPrecision(5))} GeV)`;
}

export const meta: Route.MetaFunction = ({ data }) => [{ title: `${data?.dataset.name ?? "Dataset"} · Steradian` }];
