/**
 * A sealed version's state, derived from its append-only events (docs/decisions/0010): nothing
 * stores "the state"; every reader computes it from the same history with this one function.
 *
 * - no request yet: `sealed`;
 * - requests and no decision that closes it: `in review`;
 * - every requested reviewer signed off: `signed off`;
 * - any reviewer returned it: `returned` (one return sends it back);
 * - a `superseded` event (a newer version was sealed while this one waited, or a newer one
 *   was signed off): `superseded`, whatever came before.
 */
export const VERSION_STATES = ["sealed", "in review", "signed off", "returned", "superseded"] as const;
export type VersionState = (typeof VERSION_STATES)[number];

export type VersionEventKind = "requested" | "signed-off" | "returned" | "superseded" | "comment";

export interface VersionEventInput {
  kind: VersionEventKind;
  actorId: string;
  reviewerId: string | null;
  supersededBy: string | null;
  at: Date | string;
}

export interface ReviewerStanding {
  reviewerId: string;
  requestedBy: string;
  requestedAt: Date | string;
  decision: "pending" | "signed-off" | "returned";
  decidedAt: Date | string | null;
}

export interface DerivedVersionState {
  state: VersionState;
  reviewers: ReviewerStanding[];
  supersededBy: string | null;
}

/** Events in the order they were appended (by id). */
export function deriveVersionState(events: readonly VersionEventInput[]): DerivedVersionState {
  const reviewers = new Map<string, ReviewerStanding>();
  let returned = false;
  let supersededBy: string | null = null;
  for (const e of events) {
    if (e.kind === "requested" && e.reviewerId !== null && !reviewers.has(e.reviewerId)) {
      reviewers.set(e.reviewerId, { reviewerId: e.reviewerId, requestedBy: e.actorId, requestedAt: e.at, decision: "pending", decidedAt: null });
    } else if ((e.kind === "signed-off" || e.kind === "returned") && e.reviewerId !== null) {
      const r = reviewers.get(e.reviewerId);
      if (r && r.decision === "pending") {
        r.decision = e.kind;
        r.decidedAt = e.at;
      }
      if (e.kind === "returned") returned = true;
    } else if (e.kind === "superseded") {
      supersededBy = e.supersededBy;
    }
  }
  const list = [...reviewers.values()];
  const state: VersionState =
    supersededBy !== null ? "superseded"
    : returned ? "returned"
    : list.length === 0 ? "sealed"
    : list.every((r) => r.decision === "signed-off") ? "signed off"
    : "in review";
  return { state, reviewers: list, supersededBy };
}

/** Who acts next on a version, in words and (where it is named people) their ids. */
export function nextActor(derived: DerivedVersionState): { who: "authors" | "reviewers" | "corresponding" | "nobody"; userIds: string[]; text: string } {
  switch (derived.state) {
    case "sealed":
      return { who: "authors", userIds: [], text: "a contributor or corresponding author requests sign-off" };
    case "in review": {
      const pending = derived.reviewers.filter((r) => r.decision === "pending").map((r) => r.reviewerId);
      return { who: "reviewers", userIds: pending, text: "the reviewers who have not decided yet sign off or return it" };
    }
    case "signed off":
      return { who: "corresponding", userIds: [], text: "the corresponding author exports it for the journal" };
    case "returned":
      return { who: "authors", userIds: [], text: "the authors revise the draft and seal a new version" };
    case "superseded":
      return { who: "nobody", userIds: [], text: "nobody: a newer version took its place" };
  }
}
