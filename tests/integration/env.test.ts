// Configuration is parsed once at start-up: in production a missing secret stops the start,
// in development it is a printed warning.
import { execFile } from "node:child_process";
import { promisify } from "node:util";
import { describe, expect, it } from "vitest";

const run = (env: Record<string, string | undefined>) =>
  promisify(execFile)("node_modules/.bin/tsx", ["-e", 'import("./app/.server/platform/env.server.ts").then((m) => console.log("PORT=" + m.env.PORT))'], {
    env: { PATH: process.env.PATH, HOME: process.env.HOME, ...env },
  });

describe("environment", () => {
  it("refuses to start in production without SESSION_SECRET", async () => {
    const err = await run({ NODE_ENV: "production" }).then(() => null, (e: { code: number; stderr: string }) => e);
    expect(err).not.toBeNull();
    expect(err!.stderr).toContain("SESSION_SECRET must be set in production");
  });

  it("warns in development and uses the defaults", async () => {
    const { stdout, stderr } = await run({ NODE_ENV: "development" });
    expect(stdout).toContain("PORT=3000");
    expect(stderr).toContain("SESSION_SECRET is not set");
  });

  it("names the variable that is malformed", async () => {
    const err = await run({ NODE_ENV: "production", SESSION_SECRET: "x".repeat(20), PORT: "not-a-port" }).then(() => null, (e: { stderr: string }) => e);
    expect(err!.stderr).toMatch(/Invalid environment:\s+PORT:/);
  });
});
