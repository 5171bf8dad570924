// What the version page shows about exporting: why the reader cannot, or the preflight report
// and the newest exports for a corresponding author of a signed-off version.
import { rolesFor, ROLE_LABELS, type MemberRole } from "~/permissions";
import type { VersionState } from "~/figures/version-state";
import { db } from "../platform/db.server";
import { findVersion } from "../versions/version-repository.server";
import { exportJson, listVersionExports, type ExportJson } from "./export-access.server";
import { versionPreflight, type VersionPreflight } from "./version-preflight.server";

export type ExportPanel =
  | { allowed: false; why: string }
  | { allowed: true; preflight: Promise<VersionPreflight>; exports: ExportJson[] };

export async function loadExportPanel(page: { role: MemberRole; can: Record<string, boolean>; state: VersionState; figure: { id: string }; version: { number: number } }): Promise<ExportPanel> {
  if (!page.can["export:version"]) return { allowed: false, why: `Only a ${rolesFor("export:version")} exports a version for the journal; your role here is ${ROLE_LABELS[page.role]}.` };
  if (page.state !== "signed off") return { allowed: false, why: `Only a signed-off version can be exported; v${page.version.number} is ${page.state}.` };
  const version = await findVersion(db, page.figure.id, page.version.number);
  if (!version) return { allowed: false, why: "The version was not found." };
  return { allowed: true, preflight: versionPreflight(db, version), exports: (await listVersionExports(db, version.id)).map(exportJson) };
}
