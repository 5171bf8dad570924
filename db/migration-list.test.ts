import { readdirSync } from "node:fs";
import path from "node:path";
import { describe, expect, it } from "vitest";
import { MIGRATIONS } from "./migration-list";

describe("migration list", () => {
  it("names every file in db/migrations, in order", () => {
    const files = readdirSync(path.join(import.meta.dirname, "migrations")).filter((f) => f.endsWith(".ts")).map((f) => f.replace(/\.ts$/, "")).sort();
    expect(Object.keys(MIGRATIONS).sort()).toEqual(files);
    for (const m of Object.values(MIGRATIONS)) expect(typeof m.up).toBe("function");
  });
});
