import { Form, useActionData, useNavigation } from "react-router";
import type { Route } from "./+types/verify-bundle";
import { verifyBundleAndFigure } from "~/.server/exports/verify-bundle-figure.server";
import { env } from "~/.server/platform/env.server";
import { Button } from "~/components/ui/button";
import { Notice } from "~/components/ui/notice";

/**
 * Anyone (no account) uploads a submission bundle and gets the same report as
 * `npm run verify-bundle`: every manifest hash, and the figure drawn again from figure.json.
 * Nothing is stored.
 */
export async function action({ request }: Route.ActionArgs) {
  // The server refuses a body above the upload limit before reading it (scripts/lib/http-hardening.js);
  // this says the same in the page's words should the page be served without that middleware.
  const declared = Number(request.headers.get("Content-Length") ?? "0");
  if (declared > env.UPLOAD_MAX_BYTES) return { ok: false as const, message: `The file is larger than ${env.UPLOAD_MAX_BYTES.toLocaleString("en")} bytes, the upload limit; run \`npm run verify-bundle\` on it instead.`, report: null };
  const form = await request.formData();
  const file = form.get("bundle");
  if (!(file instanceof File) || file.size === 0) return { ok: false as const, message: "Choose the bundle's zip file.", report: null };
  const result = await verifyBundleAndFigure(new Uint8Array(await file.arrayBuffer()));
  return {
    ok: true as const,
    message: null,
    report: {
      name: file.name,
      verified: result.ok,
      files: result.files,
      problems: result.problems,
      figure: result.figure,
      fingerprint: typeof result.manifest?.fingerprint === "string" ? result.manifest.fingerprint : null,
    },
  };
}

const STATUS_WORDS = { ok: "matches", differs: "differs", missing: "missing", "not listed": "not in the manifest" } as const;

export default function VerifyBundlePage() {
  const result = useActionData<typeof action>();
  const busy = useNavigation().state !== "idle";
  const report = result?.report ?? null;
  return (
    <section className="max-w-3xl">
      <h2 className="font-serif text-2xl">Check a submission bundle</h2>
      <p className="mt-2 text-sm text-ink-soft">
        A referee or an editor can check a bundle here without an account and without trusting its sender: every file is
        hashed again and compared with manifest.json, and the figure is drawn again from the bundled model, data and
        prediction parameters to confirm that it is the picture the co-authors signed off. The file is read and not kept.
      </p>
      <Form method="post" encType="multipart/form-data" className="mt-4 flex flex-wrap items-end gap-3" data-testid="verify-form">
        <label className="flex flex-col gap-1 text-sm font-medium">
          Bundle (.zip)
          <input type="file" name="bundle" accept=".zip,application/zip" required className="text-sm" />
        </label>
        <Button kind="primary" type="submit" disabled={busy}>{busy ? "Checking…" : "Check the bundle"}</Button>
      </Form>
      {result && !result.ok ? <div className="mt-4"><Notice tone="caution">{result.message}</Notice></div> : null}
      {report ? (
        <div className="mt-6" data-testid="verify-report">
          <Notice tone={report.verified ? "ok" : "caution"}>
            {report.verified
              ? `${report.name}: intact. Every file matches manifest.json and the figure drawn again is the signed-off one.`
              : `${report.name}: not intact. See what differs below.`}
            {report.fingerprint ? <> Version fingerprint <span className="font-mono">{report.fingerprint.slice(0, 12)}…</span>.</> : null}
          </Notice>
          <table className="mt-4 w-full text-sm">
            <thead className="border-b border-rule text-left text-ink-soft"><tr><th className="py-1 font-medium">File</th><th className="font-medium">Against the manifest</th><th className="font-medium">SHA-256 in the zip</th></tr></thead>
            <tbody className="divide-y divide-rule">
              {report.files.map((f) => (
                <tr key={f.name}>
                  <td className="py-1 font-mono">{f.name}</td>
                  <td className={f.status === "ok" ? "" : "font-semibold text-madder"}>{f.status === "ok" ? "✓ " : "✗ "}{STATUS_WORDS[f.status]}</td>
                  <td className="font-mono text-xs text-ink-soft">{f.actual ? `${f.actual.slice(0, 16)}…` : "—"}</td>
                </tr>
              ))}
            </tbody>
          </table>
          {report.problems.length > 0 ? <ul className="mt-3 list-disc pl-5 text-sm text-madder">{report.problems.map((p) => <li key={p}>{p}</li>)}</ul> : null}
          <p className={`mt-4 text-sm ${report.figure.ok ? "" : "font-semibold text-madder"}`} data-testid="verify-figure">{report.figure.ok ? "✓ " : "✗ "}{report.figure.message}</p>
        </div>
      ) : null}
    </section>
  );
}

export const meta: Route.MetaFunction = () => [{ title: "Check a submission bundle · Steradian" }];
