// Journal export as the demo's corresponding author uses it, in Debian's chromium (issue 10):
// Carla opens the demo's signed-off v1, reads the preflight report, exports, watches the job
// until its files are ready, downloads the submission bundle; the test unzips it and checks every
// hash of manifest.json with node's own SHA-256. Then an anonymous visitor checks the same
// bundle on the public page. A co-author sees why they cannot export.
import { createHash } from "node:crypto";
import { mkdirSync, readFileSync } from "node:fs";
import path from "node:path";
import { unzipSync } from "fflate";
import type { Page } from "playwright-core";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { launchBrowser, signInAs } from "../support/browser";
import { connect } from "../support/db";
import { testEnv } from "../support/env";
import { DEMO } from "../support/http";

let browser: Awaited<ReturnType<typeof launchBrowser>>;
const db = connect(testEnv.appDatabaseUrl, 2);
beforeAll(async () => {
  browser = await launchBrowser();
});
afterAll(async () => {
  await browser?.close();
  await db.destroy();
});

const shots = path.resolve("tests/e2e/screenshots");

describe("exporting the demo's signed-off version", () => {
  it("lets the corresponding author export and download a bundle whose manifest verifies", async () => {
    mkdirSync(shots, { recursive: true });
    const page = await browser.context.newPage();
    const errors: string[] = [];
    page.on("pageerror", (e) => errors.push(`pageerror: ${e.message}`));
    page.on("console", (m) => { if (m.type() === "error") errors.push(m.text()); });
    await page.setViewportSize({ width: 1440, height: 1100 });
    const v1 = await db.selectFrom("figure_version").select(["figure_id", "fingerprint"]).where("manuscript_id", "=", DEMO.manuscriptId).where("number", "=", 1).executeTakeFirstOrThrow();
    const versionUrl = `${testEnv.appUrl}/manuscripts/${DEMO.manuscriptId}/figures/${v1.figure_id}/versions/1`;

    // A co-author is told who exports.
    await signInAs(browser.context, page, DEMO.coauthor);
    await page.goto(versionUrl);
    await expect(page.getByTestId("export-why-not").textContent()).resolves.toBe("Only a corresponding author exports a version for the journal; your role here is co-author.");

    await signInAs(browser.context, page, DEMO.corresponding);
    await page.goto(versionUrl);
    // Scoped to the panel: while the streamed preflight arrives, React holds a hidden copy of it
    // outside the panel until it swaps it in, and an unscoped locator can see both.
    const panel = page.getByTestId("export-panel");
    await panel.getByTestId("preflight").waitFor({ timeout: 120_000 });
    const checks = await panel.locator('[data-testid^="preflight-"]').count();
    expect(checks).toBe(9);
    await expect(panel.getByTestId("preflight-text-size").textContent()).resolves.toMatch(/Smallest text.*(passes|fails)\d+(\.\d+)? pt/);
    const before = await page.getByTestId("export").count();
    const override = page.getByLabel(/Why export despite/);
    if (await override.count()) await override.fill("Checked with the journal's production office.");
    await page.getByRole("button", { name: /^Export v1/ }).click();
    await page.getByTestId("action-result").waitFor();
    await page.waitForFunction((n) => document.querySelectorAll('[data-testid="export"]').length === n + 1, before, { timeout: 30_000 });
    const newest = page.getByTestId("export").first();
    // The page polls the job: queued or rendering first, then ready with its files.
    await newest.locator('[data-testid="export-files"]').waitFor({ timeout: 180_000 });
    await expect(newest.getAttribute("data-state")).resolves.toBe("done");
    await expect(newest.getByTestId("export-state").textContent()).resolves.toMatch(/ready to download/);
    await page.screenshot({ path: path.join(shots, "version-exported.png"), fullPage: true });

    const [download] = await Promise.all([page.waitForEvent("download"), newest.getByRole("link", { name: "submission bundle (zip)" }).click()]);
    const zipPath = await download.path();
    const zip = readFileSync(zipPath);
    const entries = unzipSync(new Uint8Array(zip));
    const manifest = JSON.parse(new TextDecoder().decode(entries["manifest.json"])) as { fingerprint: string; files: { name: string; bytes: number; sha256: string }[] };
    expect(manifest.fingerprint).toBe(v1.fingerprint);
    expect(Object.keys(entries).sort()).toEqual([...manifest.files.map((f) => f.name), "manifest.json"].sort());
    for (const f of manifest.files) {
      expect(createHash("sha256").update(entries[f.name]).digest("hex"), f.name).toBe(f.sha256);
      expect(entries[f.name].length, f.name).toBe(f.bytes);
    }
    expect(manifest.files.map((f) => f.name)).toEqual(expect.arrayContaining(["figure.pdf", "figure.svg", "figure.png", "figure.json", "alt-text.txt"]));

    // Anyone can check the bundle on the public page, signed out.
    await browser.context.clearCookies();
    await page.goto(`${testEnv.appUrl}/verify`);
    await page.getByLabel("Bundle (.zip)").setInputFiles(zipPath);
    await page.getByRole("button", { name: "Check the bundle" }).click();
    await page.getByTestId("verify-report").waitFor({ timeout: 120_000 });
    await expect(page.getByTestId("verify-report").textContent()).resolves.toMatch(/intact\. Every file matches manifest\.json and the figure drawn again is the signed-off one/);
    await page.screenshot({ path: path.join(shots, "bundle-checked.png"), fullPage: true });
    expect(errors).toEqual([]);
  }, 400_000);
});
