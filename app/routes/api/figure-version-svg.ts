import type { Route } from "./+types/figure-version-svg";
import { apiHandler, methodNotAllowed } from "~/.server/platform/http/api-handler.server";
import { accessVersion } from "~/.server/versions/version-access.server";

/** The sealed SVG exactly as stored (its SHA-256 is part of the version's fingerprint). */
export const loader = apiHandler(async ({ request, params }: Route.LoaderArgs) => {
  const { figure, version } = await accessVersion("api", request, params.figureId, params.number, "read:manuscript");
  const name = figure.title.replace(/[^\w.\- ]+/g, "_").trim() || "figure";
  return new Response(version.svg, {
    headers: {
      "Content-Type": "image/svg+xml; charset=utf-8",
      "Content-Disposition": `${new URL(request.url).searchParams.has("download") ? "attachment" : "inline"}; filename="${name} v${version.number}.svg"`,
      "X-Fingerprint": version.fingerprint,
      "X-SVG-SHA256": version.svg_sha256,
      // A sealed version never changes: its picture may be cached for good.
      "Cache-Control": "private, max-age=31536000, immutable",
    },
  });
});

export const action = methodNotAllowed("GET");
