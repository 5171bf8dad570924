import { describe, expect, it } from "vitest";
import { safeRedirect } from "./safe-redirect";

describe("safeRedirect", () => {
  it("keeps same-site paths with their query", () => {
    expect(safeRedirect("/manuscripts/abc?x=1")).toBe("/manuscripts/abc?x=1");
    expect(safeRedirect("/invitations/tok-en_1")).toBe("/invitations/tok-en_1");
  });

  it.each(["//evil.example", "/\t/evil.example", "/%09/evil.example".replace("%09", "\t"), "/\\evil.example", "https://evil.example", "evil.example", " /x", "/\n/evil.example", ""])(
    "sends %j home",
    (to) => {
      expect(safeRedirect(to)).toBe("/manuscripts");
    },
  );

  it("refuses what is not a string", () => {
    expect(safeRedirect(null)).toBe("/manuscripts");
    expect(safeRedirect(["/x"])).toBe("/manuscripts");
  });
});
