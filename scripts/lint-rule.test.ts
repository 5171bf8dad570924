// The pure modules stay pure: the lint rule in eslint.config.js refuses framework, database,
// server and Node imports in app/engine, app/datasets, app/figures and app/activity (and lets their tests and
// testing helpers read files).
import { ESLint } from "eslint";
import { describe, expect, it } from "vitest";

const eslint = new ESLint({ cwd: process.cwd() });

async function errorsFor(code: string, filePath: string): Promise<string[]> {
  const [result] = await eslint.lintText(code, { filePath });
  return result.messages.filter((m) => m.severity === 2).map((m) => m.message);
}

for (const dir of ["app/engine", "app/datasets", "app/figures", "app/activity"]) {
  describe(`purity rule for ${dir}`, () => {
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
        const errors = await errorsFor(`${line}\nexport const x = 1;\n`, `${dir}/example-module.ts`);
        expect(errors.length).toBe(1);
      });
    }

    it("refuses React in a .tsx file and in a nested folder too", async () => {
      expect(await errorsFor('import { useState } from "react";\nexport const x = useState;\n', `${dir}/nested/example-module.tsx`)).toHaveLength(1);
    });

    it("accepts pure libraries", async () => {
      for (const line of ['import { sha256 } from "@noble/hashes/sha2.js";', 'import { z } from "zod";', 'import * as vega from "vega";', 'import { compile } from "vega-lite";', 'import { ticks } from "d3-array";']) {
        expect(await errorsFor(`${line}\nexport const x = 1;\n`, `${dir}/example-module.ts`), line).toEqual([]);
      }
    });

    it("lets tests and testing helpers read files, but not import React", async () => {
      const readsFile = 'import { readFileSync } from "node:fs";\nexport const x = readFileSync;\n';
      expect(await errorsFor(readsFile, `${dir}/example-module.test.ts`)).toEqual([]);
      expect(await errorsFor(readsFile, `${dir}/testing/example-helper.ts`)).toEqual([]);
      expect(await errorsFor('import { useState } from "react";\nexport const x = useState;\n', `${dir}/example-module.test.ts`)).toHaveLength(1);
    });
  });
}

it("leaves code outside the pure modules alone", async () => {
  expect(await errorsFor('import { readFileSync } from "node:fs";\nexport const x = readFileSync;\n', "app/.server/example.server.ts")).toEqual([]);
  expect(await errorsFor('import { useState } from "react";\nexport const x = useState;\n', "app/components/example.tsx")).toEqual([]);
});
