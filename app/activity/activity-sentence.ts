// The manuscript's activity log read as sentences: each audit row becomes "Ada uploaded r2 of
// …", with links to what it names and fingerprints shortened on screen. Pure: the names of people,
// datasets and figures are looked up by the server and passed in.

/** Every action the audit log records; audit.server.ts takes its type from here. */
export const AUDIT_ACTIONS = [
  "sign-in",
  "sign-in-failed",
  "sign-out",
  "sign-out-everywhere",
  "sign-up",
  "email-confirmed",
  "password-reset-requested",
  "password-reset",
  "manuscript-created",
  "member-invited",
  "member-joined",
  "member-role-changed",
  "member-removed",
  "account-disabled",
  "account-enabled",
  "account-reset",
  "api-token-created",
  "api-token-revoked",
  "dataset-created",
  "dataset-renamed",
  "dataset-retired",
  "revision-uploaded",
  "revision-rejected",
  "revision-identical",
  "raw-file-downloaded",
  "figure-created",
  "figure-draft-saved",
  "version-sealed",
  "version-superseded",
  "signoff-requested",
  "version-signed-off",
  "version-returned",
  "version-commented",
  "export-requested",
  "export-preflight-overridden",
  "export-completed",
  "export-failed",
] as const;
export type AuditAction = (typeof AUDIT_ACTIONS)[number];

/** Entries on one page of the log. */
export const ACTIVITY_PAGE_SIZE = 50;

/** The kinds the log can be filtered by, in the order the filter lists them. */
export const ACTIVITY_KINDS = ["members", "datasets", "figures", "review", "exports", "account"] as const;
export type ActivityKind = (typeof ACTIVITY_KINDS)[number];
export const KIND_LABEL: Record<ActivityKind, string> = {
  members: "Manuscript and members",
  datasets: "Datasets and revisions",
  figures: "Figures and drafts",
  review: "Sealing and sign-off",
  exports: "Exports",
  account: "Accounts and sign-in",
};

/** Which kind each action belongs to; a new action must be given one (the type says so). */
export const KIND_OF: Record<AuditAction, ActivityKind> = {
  "sign-in": "account", "sign-in-failed": "account", "sign-out": "account", "sign-out-everywhere": "account", "sign-up": "account",
  "email-confirmed": "account", "password-reset-requested": "account", "password-reset": "account",
  "account-disabled": "account", "account-enabled": "account", "account-reset": "account", "api-token-created": "account", "api-token-revoked": "account",
  "manuscript-created": "members", "member-invited": "members", "member-joined": "members", "member-role-changed": "members", "member-removed": "members",
  "dataset-created": "datasets", "dataset-renamed": "datasets", "dataset-retired": "datasets", "revision-uploaded": "datasets", "revision-rejected": "datasets",
  "revision-identical": "datasets", "raw-file-downloaded": "datasets",
  "figure-created": "figures", "figure-draft-saved": "figures",
  "version-sealed": "review", "version-superseded": "review", "signoff-requested": "review", "version-signed-off": "review", "version-returned": "review", "version-commented": "review",
  "export-requested": "exports", "export-preflight-overridden": "exports", "export-completed": "exports", "export-failed": "exports",
};

export function actionsOfKind(kind: ActivityKind): AuditAction[] {
  return AUDIT_ACTIONS.filter((a) => KIND_OF[a] === kind);
}

/** A piece of a sentence: plain text, a link, or a hash shown short with the whole value kept. */
export type SentencePart = string | { text: string; href: string } | { fingerprint: string };

export interface ActivityRow {
  action: string;
  actorName: string | null;
  manuscriptId: string | null;
  detail: unknown;
}

/** Names the server looked up for the ids in a page of rows (missing ones read as "a … no longer there"). */
export interface ActivityNames {
  people: Record<string, string>;
  datasets: Record<string, string>;
  figures: Record<string, string>;
  /** For export rows that record only the export's id: the figure and version number exported. */
  exports?: Record<string, { figureId: string; version: number }>;
}

const ROLE: Record<string, string> = { observer: "observer", contributor: "contributor", coauthor: "co-author", corresponding: "corresponding author" };

type Detail = Record<string, unknown>;
const str = (d: Detail, k: string): string | null => (typeof d[k] === "string" ? (d[k] as string) : null);
const num = (d: Detail, k: string): number | null => (typeof d[k] === "number" ? (d[k] as number) : null);

class Builder {
  readonly parts: SentencePart[] = [];
  constructor(private readonly row: ActivityRow, private readonly d: Detail, private readonly names: ActivityNames) {}
  private get m() {
    return this.row.manuscriptId ? `/manuscripts/${this.row.manuscriptId}` : null;
  }
  text(...t: string[]) {
    this.parts.push(...t.filter((x) => x !== ""));
    return this;
  }
  link(text: string, href: string | null) {
    this.parts.push(href ? { text, href } : text);
    return this;
  }
  fingerprint(value: string | null) {
    if (value) this.parts.push({ fingerprint: value });
    return this;
  }
  person(id: string | null, fallback = "someone no longer registered") {
    return this.text(id ? (this.names.people[id] ?? fallback) : fallback);
  }
  /**
   * The dataset or figure a row names: its current name, quoted and linked, while it is in this
   * manuscript; once it is not (or the row recorded no id), the name the row recorded, unlinked,
   * and said to be gone; without either, a plain placeholder. A link is never made to a page
   * that would not be there.
   */
  private named(kind: "dataset" | "figure", id: string | null, recorded: string | null) {
    const current = this.currentName(kind, id);
    if (current !== undefined && this.m) return this.link(`“${current}”`, `${this.m}/${kind}s/${id}`);
    if (current !== undefined) return this.text(`“${current}”`);
    if (id === null) return this.text(recorded !== null ? `“${recorded}”` : `a ${kind}`);
    return this.text(recorded !== null ? `“${recorded}” (no longer in this manuscript)` : `a ${kind} no longer in this manuscript`);
  }
  /** The name the server found for a dataset or figure of this manuscript; undefined once it is not there. */
  private currentName(kind: "dataset" | "figure", id: string | null): string | undefined {
    return id === null ? undefined : (kind === "dataset" ? this.names.datasets : this.names.figures)[id];
  }
  private exists(kind: "dataset" | "figure", id: string | null): id is string {
    return this.currentName(kind, id) !== undefined;
  }
  dataset() {
    return this.named("dataset", str(this.d, "datasetId"), str(this.d, "name"));
  }
  revision() {
    const id = str(this.d, "datasetId");
    const r = str(this.d, "revision");
    const n = r?.replace(/^r/, "");
    return this.link(r ?? "a revision", this.exists("dataset", id) && n && this.m ? `${this.m}/datasets/${id}/revisions/${n}` : null);
  }
  figure() {
    return this.named("figure", str(this.d, "figureId"), str(this.d, "title"));
  }
  /** vN of the figure, linked to the version's page while the figure is there. */
  version(n: number | null) {
    const id = str(this.d, "figureId");
    return this.link(n === null ? "a version" : `v${n}`, this.exists("figure", id) && n !== null && this.m ? `${this.m}/figures/${id}/versions/${n}` : null);
  }
  /** "export of v2 of “Figure”", or "export" when the version is not known. */
  exportOf(d: Detail) {
    this.text("export");
    return typeof d.figureId === "string" && num(d, "version") !== null ? this.text(" of ").version(num(d, "version")).text(" of ").figure() : this;
  }
  quote(k: string) {
    const t = str(this.d, k);
    return t ? this.text(`: “${t}”`) : this;
  }
}

/** The sentence for one audit row, starting with who did it. */
export function activitySentence(row: ActivityRow, names: ActivityNames): SentencePart[] {
  const recorded: Detail = row.detail && typeof row.detail === "object" && !Array.isArray(row.detail) ? (row.detail as Detail) : {};
  const exported = typeof recorded.exportId === "string" && typeof recorded.figureId !== "string" ? names.exports?.[recorded.exportId] : undefined;
  const d: Detail = exported ? { ...recorded, ...exported } : recorded;
  const b = new Builder(row, d, names);
  const who = row.actorName ?? "Someone";
  const action = row.action as AuditAction;
  const write = SENTENCES[action];
  if (!write) return [`${who} did “${row.action}” (an action this version of Steradian does not describe).`];
  b.text(POSSESSIVE.has(action) ? `${who}’s ` : `${who} `);
  write(b, d);
  const last = b.parts[b.parts.length - 1];
  if (typeof last !== "string" || !/[.!?]”?$/.test(last)) b.text(".");
  return b.parts;
}

/** Actions recorded under the person who asked for them, told as what happened to their request. */
const POSSESSIVE = new Set<AuditAction>(["export-completed", "export-failed"]);

const SENTENCES: Record<AuditAction, (b: Builder, d: Detail) => void> = {
  "sign-in": (b) => b.text("signed in"),
  "sign-in-failed": (b, d) => b.text(`failed to sign in${str(d, "email") ? ` as ${str(d, "email")}` : ""}`),
  "sign-out": (b) => b.text("signed out"),
  "sign-out-everywhere": (b, d) => b.text(`signed out everywhere${num(d, "sessions") !== null ? ` (${num(d, "sessions")} sessions ended)` : ""}`),
  "sign-up": (b, d) => b.text(`signed up${str(d, "email") ? ` as ${str(d, "email")}` : ""}`),
  "email-confirmed": (b) => b.text("confirmed their e-mail address"),
  "password-reset-requested": (b) => b.text("asked for a password reset"),
  "password-reset": (b) => b.text("reset their password"),
  "account-disabled": (b, d) => b.text("disabled the account of ").person(str(d, "userId")),
  "account-enabled": (b, d) => b.text("enabled the account of ").person(str(d, "userId")),
  "account-reset": (b, d) => b.text("reset the account of ").person(str(d, "userId")),
  "api-token-created": (b, d) => b.text(`made an API token${str(d, "name") ? ` named “${str(d, "name")}”` : ""}`),
  "api-token-revoked": (b) => b.text("revoked an API token"),
  "manuscript-created": (b, d) => b.text(`created the manuscript${str(d, "title") ? ` “${str(d, "title")}”` : ""}`),
  "member-invited": (b, d) => b.text(`invited ${str(d, "email") ?? "someone"} as ${ROLE[str(d, "role") ?? ""] ?? "a member"}`),
  "member-joined": (b, d) => b.text(`joined as ${ROLE[str(d, "role") ?? ""] ?? "a member"}`),
  "member-role-changed": (b, d) => b.text("made ").person(str(d, "userId")).text(` ${ROLE[str(d, "role") ?? ""] ?? "a member"}`),
  "member-removed": (b, d) => b.text("removed ").person(str(d, "userId")).text(" from the manuscript"),
  "dataset-created": (b) => b.text("created the dataset ").dataset(),
  "dataset-renamed": (b, d) => {
    const from = str(d, "from") ?? str(d, "previousName") ?? str(d, "oldName");
    b.text(from ? `renamed the dataset “${from}” to ` : "renamed the dataset ").dataset();
  },
  "dataset-retired": (b) => b.text("retired the dataset ").dataset(),
  "revision-uploaded": (b, d) => b.text("uploaded ").revision().text(" of ").dataset().text(`${num(d, "rows") !== null ? ` (${num(d, "rows")} rows)` : ""}, content `).fingerprint(str(d, "contentHash")),
  "revision-identical": (b) => b.text("uploaded a file identical to ").revision().text(" of ").dataset().text(": nothing new was stored"),
  "revision-rejected": (b, d) => {
    b.text(`tried to upload ${str(d, "fileName") ? `“${str(d, "fileName")}”` : "a file"} to `).dataset();
    if (num(d, "problemCount") !== null) b.text(`; it was refused with ${num(d, "problemCount")} problem${num(d, "problemCount") === 1 ? "" : "s"}`);
    else if (d.limit !== undefined) b.text("; it was refused for going over a limit");
    else if (str(d, "reason")) b.text(`; it was refused: ${str(d, "reason")}`);
    else b.text("; it was refused");
  },
  "raw-file-downloaded": (b, d) => b.text("downloaded the raw file of ").revision().text(" of ").dataset().text(", SHA-256 ").fingerprint(str(d, "sha256")),
  "figure-created": (b) => b.text("created the figure ").figure(),
  "figure-draft-saved": (b, d) => b.text(`saved draft revision ${num(d, "draftRevision") ?? "?"} of `).figure(),
  "version-sealed": (b, d) => b.text("sealed ").version(num(d, "number")).text(" of ").figure().text(", fingerprint ").fingerprint(str(d, "fingerprint")),
  "version-superseded": (b, d) => b.text("superseded ").version(num(d, "number")).text(" of ").figure().text(`${str(d, "wasState") ? ` (it was ${str(d, "wasState")})` : ""} by v${num(d, "supersededBy") ?? "?"}`),
  "signoff-requested": (b, d) => {
    const reviewers = Array.isArray(d.reviewers) ? (d.reviewers as { name?: unknown }[]).map((r) => (typeof r.name === "string" ? r.name : "someone")) : [];
    b.text(`asked ${reviewers.length ? reviewers.join(", ") : "co-authors"} to sign off `).version(num(d, "number")).text(" of ").figure();
  },
  "version-signed-off": (b, d) => b.text("signed off ").version(num(d, "number")).text(" of ").figure().quote("comment"),
  "version-returned": (b, d) => b.text("returned ").version(num(d, "number")).text(" of ").figure().quote("comment"),
  "version-commented": (b, d) => b.text("commented on ").version(num(d, "number")).text(" of ").figure().quote("comment"),
  "export-requested": (b, d) => b.text("asked for an export of ").version(num(d, "version")).text(" of ").figure(),
  "export-preflight-overridden": (b, d) => b.text("overrode the failing preflight of the export of ").version(num(d, "version")).text(" of ").figure().quote("reason"),
  "export-completed": (b, d) => b.exportOf(d).text(` was made${d.overridden === true ? " with the preflight overridden" : ""}; bundle SHA-256 `).fingerprint(str(d, "bundleSha256")),
  "export-failed": (b, d) => b.exportOf(d).text(` was not made${str(d, "reason") ? `: ${str(d, "reason")}` : ""}`),
};

/** The sentence as plain text, fingerprints whole (for the CSV download). */
export function sentenceText(parts: SentencePart[]): string {
  return parts.map((p) => (typeof p === "string" ? p : "fingerprint" in p ? p.fingerprint : p.text)).join("");
}

/** The ids a page of rows names, so the server can look their names up in one query each. */
export function namedIds(rows: { detail: unknown }[]): { people: string[]; datasets: string[]; figures: string[]; exports: string[] } {
  const exports = new Set<string>();
  const people = new Set<string>();
  const datasets = new Set<string>();
  const figures = new Set<string>();
  for (const r of rows) {
    const d = r.detail && typeof r.detail === "object" ? (r.detail as Detail) : {};
    if (typeof d.userId === "string") people.add(d.userId);
    if (typeof d.datasetId === "string") datasets.add(d.datasetId);
    if (typeof d.figureId === "string") figures.add(d.figureId);
    else if (typeof d.exportId === "string") exports.add(d.exportId);
  }
  return { people: [...people], datasets: [...datasets], figures: [...figures], exports: [...exports] };
}

/** A moment on one line, in UTC, said so: 2026-12-02 18:04:05 UTC. */
export function formatUtc(at: Date | string): string {
  return `${new Date(at).toISOString().replace("T", " ").slice(0, 19)} UTC`;
}
