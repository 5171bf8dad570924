// The preflight report shown on a version's page before it is exported. A sealed version never
// changes, so its report is computed once per process and kept (a few versions at most).
import type { PreflightCheck } from "~/exports/preflight";
import type { Db } from "../platform/db.server";
import type { VersionRow } from "../versions/version-repository.server";
import { ExportRefused, renderVersionExport } from "./version-export.server";

export type VersionPreflight = { ok: true; checks: PreflightCheck[] } | { ok: false; message: string };

const KEEP = 20;
const cache = new Map<string, Promise<VersionPreflight>>();

export function versionPreflight(db: Db, version: VersionRow): Promise<VersionPreflight> {
  let report = cache.get(version.id);
  if (report === undefined) {
    report = renderVersionExport(db, version).then(
      (made): VersionPreflight => ({ ok: true, checks: made.preflight }),
      (e: unknown): VersionPreflight => {
        cache.delete(version.id);
        if (e instanceof ExportRefused) return { ok: false, message: e.message };
        throw e;
      },
    );
    cache.set(version.id, report);
    while (cache.size > KEEP) cache.delete(cache.keys().next().value as string);
  }
  return report;
}
