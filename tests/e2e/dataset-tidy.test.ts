// Issue 12: the demo contributor renames a dataset they created, then retires it; it leaves the
// dataset list, and its page and revision stay readable — in Debian's chromium.
import { mkdtempSync, writeFileSync } from "node:fs";
import { tmpdir } from "node:os";
import path from "node:path";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { launchBrowser } from "../support/browser";
import { testEnv } from "../support/env";
import { DEMO } from "../support/http";

let browser: Awaited<ReturnType<typeof launchBrowser>>;
const dir = mkdtempSync(path.join(tmpdir(), "steradian-e2e-tidy-"));

beforeAll(async () => {
  browser = await launchBrowser();
});
afterAll(() => browser?.close());

describe("tidying a dataset in the browser", () => {
  it("renames, then retires; the dataset leaves the list and its revision stays readable", async () => {
    await browser.context.clearCookies();
    const page = await browser.context.newPage();
    const errors: string[] = [];
    page.on("pageerror", (e) => errors.push(e.message));
    await page.goto(`${testEnv.appUrl}/sign-in`);
    await page.getByLabel("E-mail address").fill(DEMO.contributor);
    await page.getByLabel("Password").fill(DEMO.password);
    await page.getByRole("button", { name: "Sign in" }).click();
    await page.waitForURL(/\/manuscripts$/);

    const list = `${testEnv.appUrl}/manuscripts/${DEMO.manuscriptId}/datasets`;
    await page.goto(list);
    const stamp = Date.now();
    const name = `To be tidied (browser ${stamp})`;
    await page.getByLabel("Name", { exact: true }).fill(name);
    await page.getByLabel("Unit of y").fill("ub/sr");
    await page.getByRole("button", { name: "Create dataset" }).click();
    await page.getByRole("heading", { name }).waitFor();
    const p = path.join(dir, "tidy.csv");
    writeFileSync(p, "theta_cm,dsigma,stat\n30,1.5,0.1\n45,1.2,0.08\n60,0.95,0.07\n");
    await page.getByLabel("CSV file").setInputFiles(p);
    await page.getByRole("button", { name: "Upload" }).click();
    await page.getByRole("button", { name: "Check and store as a revision" }).click();
    await page.getByText("Stored as revision").waitFor();
    const datasetUrl = page.url().split("?")[0];

    const renamed = `Tidied (browser ${stamp})`;
    await page.getByLabel("New name").fill(renamed);
    await page.getByRole("button", { name: "Rename" }).click();
    await page.getByRole("heading", { name: renamed }).waitFor();
    await page.getByText("Renamed.").waitFor();

    await page.getByLabel(/Retire this dataset/).check();
    await page.getByRole("button", { name: "Retire", exact: true }).click();
    await page.getByTestId("retired-notice").waitFor();
    expect(await page.getByTestId("retired-notice").textContent()).toContain("This dataset was retired");
    // A retired dataset takes no new revisions: the upload form is gone, and so is the tidy form.
    expect(await page.getByLabel("CSV file").count()).toBe(0);
    expect(await page.getByRole("button", { name: "Retire", exact: true }).count()).toBe(0);

    await page.goto(list);
    await page.getByRole("heading", { name: "Datasets" }).first().waitFor();
    expect(await page.getByText(renamed).count()).toBe(0);

    await page.goto(datasetUrl);
    await page.getByRole("heading", { name: renamed }).waitFor();
    await page.getByRole("link", { name: "r1", exact: true }).click();
    await page.getByRole("heading", { name: /Revision r1/ }).waitFor();
    await page.getByTestId("retired-notice").waitFor();
    const rows = page.getByRole("table", { name: "Rows of r1" }).locator("tbody tr");
    expect(await rows.count()).toBe(3);
    expect(errors).toEqual([]);
  });
});
