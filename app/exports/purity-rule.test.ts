// The pure export modules run in the browser too: eslint.config.js refuses Node, database,
// framework and server-only imports in app/exports; its tests may use Node.
import { ESLint } from "eslint";
import { describe, expect, it } from "vitest";

const eslint = new ESLint({ cwd: process.cwd() });
const errorsFor = async (code: string, filePath: string) => {
  const [result] = await eslint.lintText(code, { filePath });
  return result.messages.filter((m) => m.severity === 2).map((m) => m.message);
};

describe("purity rule for app/exports", () => {
  it("refuses node:, kysely and server-only imports in a module", async () => {
    for (const line of ['import { createHash } from "node:crypto";', 'import { Kysely } from "kysely";', 'import { sha256Hex } from "../.server/exports/bundle.server";']) {
      expect(await errorsFor(`${line}\nexport const x = 1;\n`, "app/exports/example-module.ts"), line).toHaveLength(1);
    }
    expect(await errorsFor('import { csvRow } from "./csv";\nexport const x = csvRow;\n', "app/exports/example-module.ts")).toEqual([]);
  });

  it("lets a test read files and hash with Node", async () => {
    expect(await errorsFor('import { createHash } from "node:crypto";\nexport const x = createHash;\n', "app/exports/example-module.test.ts")).toEqual([]);
  });
});
