import { describe, expect, it } from "vitest";
import { describeCharacter } from "./problem-list";

describe("describeCharacter", () => {
  it("names what a reader mistakes for a digit or a sign, with its code point", () => {
    expect(describeCharacter("O")).toBe("the letter O (U+004F)");
    expect(describeCharacter("l")).toBe("the letter l (U+006C)");
    expect(describeCharacter("\u00a0")).toBe("a no-break space (U+00A0)");
    expect(describeCharacter(" ")).toBe("a space");
    expect(describeCharacter("\u2212")).toBe("a minus sign (U+2212) where a hyphen-minus - is expected");
    expect(describeCharacter(",")).toBe("a comma");
    expect(describeCharacter("µ")).toBe("the letter µ (U+00B5)");
    expect(describeCharacter("%")).toBe("the character % (U+0025)");
  });
});
