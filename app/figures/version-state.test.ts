import { describe, expect, it } from "vitest";
import { deriveVersionState, nextActor, type VersionEventInput } from "./version-state";

const at = "2026-12-03T09:00:00.000Z";
const requested = (reviewer: string, by = "ada"): VersionEventInput => ({ kind: "requested", actorId: by, reviewerId: reviewer, supersededBy: null, at });
const signed = (reviewer: string): VersionEventInput => ({ kind: "signed-off", actorId: reviewer, reviewerId: reviewer, supersededBy: null, at });
const returned = (reviewer: string): VersionEventInput => ({ kind: "returned", actorId: reviewer, reviewerId: reviewer, supersededBy: null, at });
const comment = (who: string): VersionEventInput => ({ kind: "comment", actorId: who, reviewerId: null, supersededBy: null, at });
const superseded = (by: string): VersionEventInput => ({ kind: "superseded", actorId: "ada", reviewerId: null, supersededBy: by, at });

// The rules of docs/product.md ("Vocabulary") and docs/decisions/0010, one history per case.
describe("deriveVersionState", () => {
  const cases: [string, VersionEventInput[], string][] = [
    ["no events", [], "sealed"],
    ["only comments", [comment("bruno")], "sealed"],
    ["one request", [requested("bruno")], "in review"],
    ["one of two signed off", [requested("bruno"), requested("carla"), signed("bruno")], "in review"],
    ["all signed off", [requested("bruno"), requested("carla"), signed("carla"), signed("bruno")], "signed off"],
    ["a return among sign-offs", [requested("bruno"), requested("carla"), signed("bruno"), returned("carla")], "returned"],
    ["a return first", [requested("bruno"), requested("carla"), returned("bruno")], "returned"],
    ["superseded while in review", [requested("bruno"), superseded("v2")], "superseded"],
    ["superseded after sign-off", [requested("bruno"), signed("bruno"), superseded("v3")], "superseded"],
    ["a decision by someone never asked does not count", [requested("bruno"), signed("dora")], "in review"],
    ["a later request after all signed off reopens the review", [requested("bruno"), signed("bruno"), requested("carla")], "in review"],
  ];
  for (const [name, events, state] of cases) {
    it(`${name}: ${state}`, () => expect(deriveVersionState(events).state).toBe(state));
  }

  it("lists each reviewer once with their decision, in request order", () => {
    const d = deriveVersionState([requested("bruno"), requested("carla", "dora"), requested("bruno"), returned("carla"), signed("carla")]);
    expect(d.reviewers.map((r) => [r.reviewerId, r.requestedBy, r.decision])).toEqual([["bruno", "ada", "pending"], ["carla", "dora", "returned"]]);
  });

  it("names who acts next", () => {
    expect(nextActor(deriveVersionState([])).who).toBe("authors");
    expect(nextActor(deriveVersionState([requested("bruno"), requested("carla"), signed("bruno")]))).toMatchObject({ who: "reviewers", userIds: ["carla"] });
    expect(nextActor(deriveVersionState([requested("bruno"), signed("bruno")])).who).toBe("corresponding");
    expect(nextActor(deriveVersionState([requested("bruno"), returned("bruno")])).who).toBe("authors");
    expect(nextActor(deriveVersionState([superseded("v2")])).who).toBe("nobody");
  });
});
