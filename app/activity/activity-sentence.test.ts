import { describe, expect, it } from "vitest";
import { AUDIT_ACTIONS, KIND_OF, activitySentence, formatUtc, namedIds, sentenceText, type ActivityNames, type AuditAction, type SentencePart } from "./activity-sentence";

const M = "11111111-1111-4111-8111-111111111111";
const DATASET = "22222222-2222-4222-8222-222222222222";
const FIGURE = "33333333-3333-4333-8333-333333333333";
const BEN = "44444444-4444-4444-8444-444444444444";
const HASH = "9f86d081884c7d659a2feaa0c55ad015a3bf4f1b2b0b822cd15d6c15b0f00a08";
const names: ActivityNames = { people: { [BEN]: "Ben Okafor" }, datasets: { [DATASET]: "π⁺p elastic, 1.2 GeV" }, figures: { [FIGURE]: "Angular distribution" } };
const version = { figureId: FIGURE, versionId: "v-id", number: 2 };

/**
 * Each action with the detail its writer in app/.server records, and the sentence it must read as.
 * A Record over every action: a new action without an example here fails the typecheck, and one
 * without a sentence fails the first test below.
 */
const EXAMPLES: Record<AuditAction, { detail: Record<string, unknown>; text: string }> = {
  "sign-in": { detail: { email: "ada@example.org" }, text: "Ada signed in." },
  "sign-in-failed": { detail: { email: "ada@example.org" }, text: "Ada failed to sign in as ada@example.org." },
  "sign-out": { detail: {}, text: "Ada signed out." },
  "sign-out-everywhere": { detail: { sessions: 3 }, text: "Ada signed out everywhere (3 sessions ended)." },
  "sign-up": { detail: { email: "ada@example.org" }, text: "Ada signed up as ada@example.org." },
  "email-confirmed": { detail: {}, text: "Ada confirmed their e-mail address." },
  "password-reset-requested": { detail: {}, text: "Ada asked for a password reset." },
  "password-reset": { detail: {}, text: "Ada reset their password." },
  "account-disabled": { detail: { userId: BEN }, text: "Ada disabled the account of Ben Okafor." },
  "account-enabled": { detail: { userId: BEN }, text: "Ada enabled the account of Ben Okafor." },
  "account-reset": { detail: { userId: BEN }, text: "Ada reset the account of Ben Okafor." },
  "api-token-created": { detail: { tokenId: "t", name: "laptop" }, text: "Ada made an API token named “laptop”." },
  "api-token-revoked": { detail: { tokenId: "t" }, text: "Ada revoked an API token." },
  "manuscript-created": { detail: { title: "Pion scattering" }, text: "Ada created the manuscript “Pion scattering”." },
  "member-invited": { detail: { email: "ben@example.org", role: "coauthor" }, text: "Ada invited ben@example.org as co-author." },
  "member-joined": { detail: { role: "contributor" }, text: "Ada joined as contributor." },
  "member-role-changed": { detail: { userId: BEN, role: "observer" }, text: "Ada made Ben Okafor observer." },
  "member-removed": { detail: { userId: BEN }, text: "Ada removed Ben Okafor from the manuscript." },
  "dataset-created": { detail: { datasetId: DATASET, name: "π⁺p elastic, 1.2 GeV" }, text: "Ada created the dataset “π⁺p elastic, 1.2 GeV”." },
  "dataset-renamed": { detail: { datasetId: DATASET, from: "old name" }, text: "Ada renamed the dataset “old name” to “π⁺p elastic, 1.2 GeV”." },
  "dataset-retired": { detail: { datasetId: DATASET }, text: "Ada retired the dataset “π⁺p elastic, 1.2 GeV”." },
  "revision-uploaded": {
    detail: { datasetId: DATASET, revision: "r2", contentHash: HASH, rows: 14, fileName: "a.csv" },
    text: `Ada uploaded r2 of “π⁺p elastic, 1.2 GeV” (14 rows), content ${HASH}.`,
  },
  "revision-identical": { detail: { datasetId: DATASET, revision: "r1", contentHash: HASH, rows: 14, fileName: "a.csv" }, text: "Ada uploaded a file identical to r1 of “π⁺p elastic, 1.2 GeV”: nothing new was stored." },
  "revision-rejected": { detail: { datasetId: DATASET, problemCount: 2, fileName: "bad.csv" }, text: "Ada tried to upload “bad.csv” to “π⁺p elastic, 1.2 GeV”; it was refused with 2 problems." },
  "raw-file-downloaded": { detail: { datasetId: DATASET, revision: "r1", sha256: HASH }, text: `Ada downloaded the raw file of r1 of “π⁺p elastic, 1.2 GeV”, SHA-256 ${HASH}.` },
  "figure-created": { detail: { figureId: FIGURE, title: "Angular distribution" }, text: "Ada created the figure “Angular distribution”." },
  "figure-draft-saved": { detail: { figureId: FIGURE, draftRevision: 7 }, text: "Ada saved draft revision 7 of “Angular distribution”." },
  "version-sealed": { detail: { ...version, fingerprint: HASH, draftRevision: 7, svgSha256: HASH }, text: `Ada sealed v2 of “Angular distribution”, fingerprint ${HASH}.` },
  "version-superseded": { detail: { ...version, supersededBy: 3, wasState: "in review" }, text: "Ada superseded v2 of “Angular distribution” (it was in review) by v3." },
  "signoff-requested": { detail: { ...version, reviewers: [{ userId: BEN, name: "Ben Okafor" }, { userId: "x", name: "Chen Wu" }] }, text: "Ada asked Ben Okafor, Chen Wu to sign off v2 of “Angular distribution”." },
  "version-signed-off": { detail: { ...version, fingerprint: HASH, state: "signed off" }, text: "Ada signed off v2 of “Angular distribution”." },
  "version-returned": { detail: { ...version, fingerprint: HASH, state: "returned", comment: "Axis label." }, text: "Ada returned v2 of “Angular distribution”: “Axis label.”" },
  "version-commented": { detail: { ...version, eventId: 4, comment: "Looks right" }, text: "Ada commented on v2 of “Angular distribution”: “Looks right”." },
  "export-requested": { detail: { exportId: "e", figureId: FIGURE, version: 2 }, text: "Ada asked for an export of v2 of “Angular distribution”." },
  "export-preflight-overridden": { detail: { exportId: "e", figureId: FIGURE, version: 2, reason: "Journal agreed" }, text: "Ada overrode the failing preflight of the export of v2 of “Angular distribution”: “Journal agreed”." },
  "export-completed": { detail: { exportId: "e", bundleSha256: HASH, overridden: false, attempts: 1 }, text: `Ada’s export was made; bundle SHA-256 ${HASH}.` },
  "export-failed": { detail: { exportId: "e", reason: "The picture differs." }, text: "Ada’s export was not made: The picture differs." },
};

const sentence = (action: string, detail: unknown, actorName: string | null = "Ada"): SentencePart[] => activitySentence({ action, actorName, manuscriptId: M, detail }, names);

describe("activitySentence", () => {
  it.each(AUDIT_ACTIONS.map((a) => [a]))("%s reads as a sentence with no ids, no JSON and a kind", (action) => {
    const example = EXAMPLES[action];
    expect(example, `no example for ${action}`).toBeDefined();
    const text = sentenceText(sentence(action, example.detail));
    expect(text).toBe(example.text);
    expect(text).not.toMatch(/undefined|null|\[object|\{|[0-9a-f]{8}-[0-9a-f]{4}/);
    expect(KIND_OF[action]).toBeDefined();
  });

  it("links to what it names: dataset, revision, figure, version", () => {
    const links = (parts: SentencePart[]) => parts.filter((p) => typeof p === "object" && "href" in p);
    expect(links(sentence("revision-uploaded", EXAMPLES["revision-uploaded"].detail))).toEqual([
      { text: "r2", href: `/manuscripts/${M}/datasets/${DATASET}/revisions/2` },
      { text: "“π⁺p elastic, 1.2 GeV”", href: `/manuscripts/${M}/datasets/${DATASET}` },
    ]);
    expect(links(sentence("version-sealed", EXAMPLES["version-sealed"].detail))).toEqual([
      { text: "v2", href: `/manuscripts/${M}/figures/${FIGURE}/versions/2` },
      { text: "“Angular distribution”", href: `/manuscripts/${M}/figures/${FIGURE}` },
    ]);
  });

  it("keeps hashes whole as fingerprints, for the page to shorten", () => {
    expect(sentence("version-sealed", EXAMPLES["version-sealed"].detail)).toContainEqual({ fingerprint: HASH });
  });

  it("says when a person, dataset or figure is no longer there, and falls back to the recorded name", () => {
    expect(sentenceText(sentence("member-removed", { userId: "55555555-5555-4555-8555-555555555555" }))).toBe("Ada removed someone no longer registered from the manuscript.");
    expect(sentenceText(sentence("figure-created", { figureId: "66666666-6666-4666-8666-666666666666", title: "Old title" }))).toBe("Ada created the figure “Old title” (no longer in this manuscript).");
    expect(sentenceText(sentence("sign-out", {}, null))).toBe("Someone signed out.");
  });

  it("never links to a dataset, revision, figure or version that is no longer in the manuscript", () => {
    const GONE_DATASET = "77777777-7777-4777-8777-777777777777";
    const GONE_FIGURE = "88888888-8888-4888-8888-888888888888";
    const links = (parts: SentencePart[]) => parts.filter((p): p is { text: string; href: string } => typeof p === "object" && "href" in p);

    const uploaded = sentence("revision-uploaded", { datasetId: GONE_DATASET, revision: "r3", contentHash: HASH, rows: 5 });
    expect(sentenceText(uploaded)).toBe(`Ada uploaded r3 of a dataset no longer in this manuscript (5 rows), content ${HASH}.`);
    expect(links(uploaded)).toEqual([]);

    const renamed = sentence("dataset-created", { datasetId: GONE_DATASET, name: "Pilot run" });
    expect(sentenceText(renamed)).toBe("Ada created the dataset “Pilot run” (no longer in this manuscript).");
    expect(links(renamed)).toEqual([]);

    const sealed = sentence("version-sealed", { figureId: GONE_FIGURE, number: 4, fingerprint: HASH, title: "Draft plot" });
    expect(sentenceText(sealed)).toBe(`Ada sealed v4 of “Draft plot” (no longer in this manuscript), fingerprint ${HASH}.`);
    expect(links(sealed)).toEqual([]);

    // The same rows for a dataset and figure that are there keep their links.
    expect(links(sentence("revision-uploaded", { datasetId: DATASET, revision: "r3", contentHash: HASH, rows: 5 })).map((l) => l.href)).toEqual([
      `/manuscripts/${M}/datasets/${DATASET}/revisions/3`,
      `/manuscripts/${M}/datasets/${DATASET}`,
    ]);
    expect(links(sentence("version-sealed", { ...version, fingerprint: HASH })).map((l) => l.href)).toEqual([
      `/manuscripts/${M}/figures/${FIGURE}/versions/2`,
      `/manuscripts/${M}/figures/${FIGURE}`,
    ]);
  });

  it("names the exported version when the server found it from the export's id", () => {
    const withExport = { ...names, exports: { e: { figureId: FIGURE, version: 2 } } };
    const parts = activitySentence({ action: "export-completed", actorName: "Ada", manuscriptId: M, detail: EXAMPLES["export-completed"].detail }, withExport);
    expect(sentenceText(parts)).toBe(`Ada’s export of v2 of “Angular distribution” was made; bundle SHA-256 ${HASH}.`);
    expect(parts).toContainEqual({ text: "v2", href: `/manuscripts/${M}/figures/${FIGURE}/versions/2` });
  });

  it("an action it does not know is shown by name, not dropped", () => {
    expect(sentenceText(sentence("dataset-exploded", {}))).toBe("Ada did “dataset-exploded” (an action this version of Steradian does not describe).");
  });

  it("survives details of the wrong shape", () => {
    for (const action of AUDIT_ACTIONS) {
      for (const detail of [null, [], "text", { number: "2", datasetId: 5, reviewers: "x" }]) {
        expect(sentenceText(sentence(action, detail))).toMatch(/^Ada/);
      }
    }
  });
});

describe("namedIds and formatUtc", () => {
  it("collects each id once", () => {
    expect(namedIds([{ detail: { userId: BEN, datasetId: DATASET } }, { detail: { userId: BEN, figureId: FIGURE } }, { detail: { exportId: "e" } }, { detail: null }])).toEqual({ people: [BEN], datasets: [DATASET], figures: [FIGURE], exports: ["e"] });
  });
  it("writes a moment on one line in UTC", () => {
    expect(formatUtc(new Date(Date.UTC(2026, 11, 2, 18, 4, 5, 678)))).toBe("2026-12-02 18:04:05 UTC");
    expect(formatUtc("2026-12-02T19:04:05+01:00")).toBe("2026-12-02 18:04:05 UTC");
  });
});
