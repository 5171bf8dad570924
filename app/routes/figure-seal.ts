import { redirect } from "react-router";
import { z } from "zod";
import type { Route } from "./+types/figure-seal";
import { loadFigurePage } from "~/.server/figures/figure-access.server";
import { db } from "~/.server/platform/db.server";
import { clientIp } from "~/.server/platform/http/client-address.server";
import { parseForm } from "~/.server/platform/http/forms.server";
import { sealVersion } from "~/.server/versions/seal-version.server";
import { versionPageError } from "~/.server/versions/version-access.server";
import { VersionError } from "~/.server/versions/version-error.server";

/** The versions live on the figure's page. */
export async function loader({ params }: Route.LoaderArgs) {
  throw redirect(`/manuscripts/${params.manuscriptId}/figures/${params.figureId}`);
}

const SealForm = z.object({ draftRevision: z.coerce.number().int().min(1, "Seal a saved draft revision.") });

/** The page's seal: the same service as POST /api/v1/figures/:id/versions; on success, the new version's page. */
export async function action({ request, params, context }: Route.ActionArgs) {
  const { user, figure } = await loadFigurePage(request, params, "seal:figure");
  const parsed = await parseForm(request, SealForm);
  if (!parsed.ok) return parsed.response;
  try {
    const sealed = await sealVersion(db, { figureId: figure.id, userId: user.id, draftRevision: parsed.value.draftRevision, ip: clientIp(context) });
    throw redirect(`/manuscripts/${figure.manuscript_id}/figures/${figure.id}/versions/${sealed.number}`);
  } catch (e) {
    if (e instanceof VersionError) return versionPageError(e);
    throw e;
  }
}
