import { data } from "react-router";
import type { ManuscriptAction } from "~/permissions";
import { accessFigure } from "../figures/figure-access.server";
import { db } from "../platform/db.server";
import { apiError } from "../platform/http/api-error.server";
import { notFound, type Mode } from "../platform/http/guards.server";
import { VersionError } from "./version-error.server";
import { findVersion } from "./version-repository.server";

/** `2` or `v2` in an address. */
export function parseVersionNumber(raw: string | undefined): number {
  const m = /^v?(\d{1,9})$/.exec(raw ?? "");
  return m ? Number(m[1]) : Number.NaN;
}

/** Authorises an action on one version of a figure; a version that does not exist is a 404. */
export async function accessVersion(mode: Mode, request: Request, figureId: string, rawNumber: string | undefined, action: ManuscriptAction) {
  const { user, role, figure } = await accessFigure(mode, request, figureId, action);
  const version = await findVersion(db, figure.id, parseVersionNumber(rawNumber));
  if (!version) notFound(mode, "The version");
  return { user, role, figure, version };
}

/** A refused step as the API answers it: `{ error: { code, message, field?, … } }`. */
export function versionApiError(e: VersionError): Response {
  return apiError(e.status, e.code, e.message, { ...(e.field !== null ? { field: e.field } : {}), ...e.extra });
}

/** A refused step as a page's action answers it, for the form to show beside the field. */
export function versionPageError(e: VersionError) {
  return data({ ok: false as const, message: e.message, fieldErrors: e.field ? { [e.field]: e.message } : ({} as Record<string, string>) }, { status: e.status });
}
