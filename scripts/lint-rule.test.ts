// The engine stays pure: the lint rule in eslint.config.js refuses framework, database and Node
// imports in app/engine (and lets its tests and oracle use what they need).
import { ESLint } from "eslint";
import { describe, expect, it } from "vitest";

const eslint = new ESLint({ cwd: process.cwd() });

async function errorsFor(code: string, filePath: string): Promise<string[]> {
  const [result] = await eslint.lintText(code, { filePath });
  return result.messages.filter((m) => m.severity === 2).map((m) => m.message);
}

describe("purity rule for app/engine", () => {
  for (const [what, line] of [
    ["react", 'import { useState } from "react";'],
    ["react-router", 'import { data } from "react-router";'],
    ["kysely", 'import { Kysely } from "kysely";'],
    ["pg", 'import pg from "pg";'],
    ["node: builtins", 'import { readFileSync } from "node:fs";'],
    ["bare builtins", 'import path from "path";'],
    ["server-only modules", 'import { db } from "../.server/platform/db.server";'],
  ] as const) {
    it(`refuses ${what}`, async () => {
      const errors = await errorsFor(`${line}\nexport const x = 1;\n`, "app/engine/example-module.ts");
      expect(errors.length).toBe(1);
    });
  }

  it("accepts pure imports, and leaves tests and code outside the engine alone", async () => {
    expect(await errorsFor('import { sha256 } from "@noble/hashes/sha2.js";\nexport const x = sha256;\n', "app/engine/example-module.ts")).toEqual([]);
    expect(await errorsFor('import { readFileSync } from "node:fs";\nexport const x = readFileSync;\n', "app/engine/example-module.test.ts")).toEqual([]);
    expect(await errorsFor('import { readFileSync } from "node:fs";\nexport const x = readFileSync;\n', "app/.server/example.server.ts")).toEqual([]);
  });
});
