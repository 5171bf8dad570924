// An export's states in Steradian's own words, for the page and the API (docs/decisions/0011-export-jobs.md).
import type { PreflightCheck } from "./preflight";

export const EXPORT_STATES = ["queued", "rendering", "done", "failed"] as const;
export type ExportState = (typeof EXPORT_STATES)[number];

export const EXPORT_STATE_WORDS: Record<ExportState, string> = {
  queued: "waiting for a renderer",
  rendering: "drawing the files",
  done: "ready to download",
  failed: "not made",
};

/** The files an export delivers, in the order the page lists them. */
export const EXPORT_FILES = ["figure.pdf", "figure.svg", "figure.png", "bundle.zip"] as const;
export type ExportFileName = (typeof EXPORT_FILES)[number];

export const EXPORT_FILE_TYPES: Record<ExportFileName, string> = {
  "figure.pdf": "application/pdf",
  "figure.svg": "image/svg+xml; charset=utf-8",
  "figure.png": "image/png",
  "bundle.zip": "application/zip",
};

export interface StoredExportFile {
  key: string;
  sha256: string;
  bytes: number;
}

export const isFinished = (state: ExportState) => state === "done" || state === "failed";

/** The checks that failed, in one line, for a refusal's reason. */
export function failedChecks(report: readonly PreflightCheck[]): string {
  return report.filter((c) => !c.pass).map((c) => `${c.label.toLowerCase()} ${c.measured} (needs ${c.limit})`).join("; ");
}
