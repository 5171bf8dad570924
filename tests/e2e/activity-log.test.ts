// The activity log as the demo's corresponding author reads it, in Debian's chromium (issue 12):
// sentences instead of raw JSON, a fingerprint that opens to the whole value, the person filter
// sent as a GET form (so the filter is in the address), paging, and the CSV download of what the
// filter shows. A manuscript of its own with many entries, so the demo's log stays as it is.
import { mkdirSync, readFileSync } from "node:fs";
import path from "node:path";
import { parse } from "csv-parse/sync";
import type { Page } from "playwright-core";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { createAccount, createManuscriptWith } from "../support/accounts";
import { launchBrowser, signInAs } from "../support/browser";
import { connect } from "../support/db";
import { testEnv } from "../support/env";
import { DEMO } from "../support/http";

let browser: Awaited<ReturnType<typeof launchBrowser>>;
const db = connect(testEnv.appDatabaseUrl, 2);
let manuscriptId = "";
let helperName = "";
const HASH = "0123456789abcdef0123456789abcdef0123456789abcdef0123456789abcdef";

beforeAll(async () => {
  browser = await launchBrowser();
  const carla = await db.selectFrom("app_user").select("id").where("email", "=", DEMO.corresponding).executeTakeFirstOrThrow();
  const helper = await createAccount(db, "activity-e2e");
  helperName = "Test activity-e2e";
  manuscriptId = await createManuscriptWith(db, [{ id: carla.id, role: "corresponding" }, { id: helper.id, role: "contributor" }], "Activity log test (synthetic)");
  // 70 draft saves by the helper and one sealed version by Carla, as the app records them.
  await db.insertInto("audit_event").values([
    ...Array.from({ length: 70 }, (_, i) => ({ action: "figure-draft-saved", actor_id: helper.id, manuscript_id: manuscriptId, detail: JSON.stringify({ figureId: "88888888-8888-4888-8888-888888888888", draftRevision: i + 1 }) })),
    { action: "version-sealed", actor_id: carla.id, manuscript_id: manuscriptId, detail: JSON.stringify({ figureId: "88888888-8888-4888-8888-888888888888", versionId: "x", number: 1, fingerprint: HASH }) },
  ]).execute();
});
afterAll(async () => {
  await browser?.close();
  await db.destroy();
});

const shots = path.resolve("tests/e2e/screenshots");

describe("the activity log in the browser", () => {
  it("reads the demo's log as sentences with links and short fingerprints", async () => {
    const page = await browser.context.newPage();
    await page.setViewportSize({ width: 1440, height: 900 });
    await signInAs(browser.context, page, DEMO.corresponding);
    await page.goto(`${testEnv.appUrl}/manuscripts/${DEMO.manuscriptId}/audit`);
    const body = await page.locator("tbody").innerText();
    expect(body).not.toMatch(/[{}]|"[a-zA-Z]+":/);
    expect(body).toMatch(/ sealed v1 of “/);
    // Each time on one line: its text lies in a single line box.
    const lineBoxes = await page.locator("tbody tr td:first-child").evaluateAll((tds) => tds.map((td) => {
      const range = document.createRange();
      range.selectNodeContents(td);
      return new Set([...range.getClientRects()].map((r) => Math.round(r.top))).size;
    }));
    expect(lineBoxes.length).toBeGreaterThan(0);
    expect(new Set(lineBoxes)).toEqual(new Set([1]));
    mkdirSync(shots, { recursive: true });
    await page.screenshot({ path: path.join(shots, "activity-log.png") });
    await page.close();
  }, 60_000);

  it("filters by person in the address, pages, opens a fingerprint and downloads the filtered CSV", async () => {
    const page = await browser.context.newPage();
    await page.setViewportSize({ width: 1440, height: 900 });
    await signInAs(browser.context, page, DEMO.corresponding);
    await page.goto(`${testEnv.appUrl}/manuscripts/${manuscriptId}/audit`);
    await page.getByRole("status").filter({ hasText: "Entries 1–50 of 71, page 1 of 2." }).waitFor();
    const fingerprint = page.locator(`[data-fingerprint="${HASH}"]`);
    await expect(fingerprint.innerText()).resolves.toContain("0123 4567 89ab …");
    await fingerprint.click();
    await expect(fingerprint.innerText()).resolves.toMatch(new RegExp(`^fingerprint\\s+${HASH}$`));

    await page.getByLabel("Person").selectOption({ label: helperName });
    await page.getByRole("button", { name: "Show" }).click();
    await page.waitForURL(/person=[0-9a-f-]{36}/);
    await page.getByRole("status").filter({ hasText: "Entries 1–50 of 70, page 1 of 2." }).waitFor();
    await expect(page.locator("tbody").innerText()).resolves.not.toContain("sealed");
    await page.getByRole("link", { name: "Older entries →" }).click();
    await page.waitForURL(/page=2/);
    await page.getByRole("status").filter({ hasText: "Entries 51–70 of 70, page 2 of 2." }).waitFor();
    await expect(page.locator("tbody tr").count()).resolves.toBe(20);
    await expect(page.locator("tbody tr").last().innerText()).resolves.toContain(`${helperName} saved draft revision 1 of a figure no longer in this manuscript.`);
    await page.screenshot({ path: path.join(shots, "activity-log-filtered.png") });

    const [download] = await Promise.all([page.waitForEvent("download"), page.getByRole("link", { name: "Download these entries as CSV" }).click()]);
    const rows = parse(readFileSync((await download.path())!, "utf8"), { columns: true }) as Record<string, string>[];
    expect(rows.length).toBe(70);
    expect(new Set(rows.map((r) => r.person))).toEqual(new Set([helperName]));
    expect(rows.map((r) => r.sentence)).toContain(`${helperName} saved draft revision 70 of a figure no longer in this manuscript.`);
    await page.close();
  }, 90_000);
});
