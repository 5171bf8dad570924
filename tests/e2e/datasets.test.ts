// The demo contributor brings measured data in: upload, map, a refused file, a corrected one,
// and the comparison of r1 with r2 — in Debian's chromium.
import { mkdtempSync, writeFileSync } from "node:fs";
import { tmpdir } from "node:os";
import path from "node:path";
import AxeBuilder from "@axe-core/playwright";
import type { Page } from "playwright-core";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { launchBrowser, signInAs } from "../support/browser";
import { testEnv } from "../support/env";
import { DEMO } from "../support/http";

let browser: Awaited<ReturnType<typeof launchBrowser>>;
const dir = mkdtempSync(path.join(tmpdir(), "steradian-e2e-csv-"));
const file = (name: string, text: string) => {
  const p = path.join(dir, name);
  writeFileSync(p, text);
  return p;
};

/** Creates a dataset of dσ/dΩ in µb/sr against θ (CM) in the demo manuscript and opens its page. */
async function createDataset(page: Page, title: string): Promise<void> {
  await page.goto(`${testEnv.appUrl}/manuscripts/${DEMO.manuscriptId}/datasets`);
  const name = `${title} (browser ${Date.now()})`;
  await page.getByLabel("Name", { exact: true }).fill(name);
  await page.getByLabel("Unit of y").fill("ub/sr");
  await page.getByRole("button", { name: "Create dataset" }).click();
  await page.getByRole("heading", { name }).waitFor();
}

beforeAll(async () => {
  browser = await launchBrowser();
});
afterAll(() => browser?.close());

describe("datasets in the browser", () => {
  it("upload, map columns, see a refused file, upload the corrected one, compare r1 with r2", async () => {
    await browser.context.clearCookies();
    const page = await browser.context.newPage();
    const errors: string[] = [];
    page.on("pageerror", (e) => errors.push(e.message));
    await signInAs(browser.context, page, DEMO.contributor);
    await createDataset(page, "Angular distribution");

    const good = "theta_cm,theta_lo,theta_hi,dsigma,stat\n30,25,35,1.5,0.1\n45,40,50,1.2,0.08\n60,55,65,0.95,0.07\n";
    await page.getByLabel("CSV file").setInputFiles(file("first.csv", good));
    await page.getByRole("button", { name: "Upload" }).click();
    await page.getByRole("heading", { name: /Map the columns of “first.csv”/ }).waitFor();
    // Guessed from the headers; checked, not trusted.
    await expect(page.getByLabel("x", { exact: true }).inputValue()).resolves.toBe("theta_cm");
    await expect(page.getByLabel("y (required)").inputValue()).resolves.toBe("dsigma");
    await page.getByRole("button", { name: "Check and store as a revision" }).click();
    await page.getByText("Stored as revision").waitFor();
    await page.getByRole("link", { name: "r1", exact: true }).waitFor();

    const broken = "theta_cm,theta_lo,theta_hi,dsigma,stat\n30,25,35,1.5,0.1\n45,40,50,\"1,2\",0.08\n60,65,55,0.95,0.07\n";
    await page.getByLabel("CSV file").setInputFiles(file("second.csv", broken));
    await page.getByRole("button", { name: "Upload" }).click();
    await page.getByText(/The file was not stored: 2 problems/).waitFor();
    const problems = await page.getByRole("region", { name: /The file was not stored/ }).textContent();
    expect(problems).toContain("decimal point");
    expect(problems).toMatch(/low edge|bin/);
    await expect(page.getByRole("link", { name: "r2", exact: true }).count()).resolves.toBe(0);

    const corrected = "theta_cm,theta_lo,theta_hi,dsigma,stat\n30,25,35,1.5,0.1\n45,40,50,1.2,0.08\n60,55,65,0.97,0.07\n75,70,80,0.81,0.06\n";
    await page.getByLabel("CSV file").setInputFiles(file("second-fixed.csv", corrected));
    await page.getByRole("button", { name: "Upload" }).click();
    await page.getByRole("link", { name: "r2", exact: true }).waitFor();

    await page.getByRole("button", { name: "Compare row by row" }).click();
    await page.waitForURL(/compare\?from=1&to=2/);
    await expect(page.getByTestId("diff-summary").textContent()).resolves.toBe("r1 → r2: 1 added, 0 removed, 1 changed, 2 unchanged");
    // The changed bin [55, 65]: 0.95 ± 0.07 → 0.97 ± 0.07. By hand: Δ = +0.02, Δ/|y| = 2.11 %,
    // σ = √(0.07² + 0.07²) = 0.0990, Δ/σ = 0.202. Symmetric errors are written once.
    const changed = page.getByRole("table", { name: "Rows changed from r1 to r2" }).locator("tbody tr td");
    await expect(changed.allTextContents()).resolves.toEqual([expect.stringMatching(/^\[55, 65\]/), "0.95 ± 0.07", "0.97 ± 0.07", "+0.02", "+2.11 %", "+0.202", ""]);
    await expect(page.getByRole("table", { name: "Rows changed from r1 to r2" }).locator("tbody td").nth(5).evaluate((e) => getComputedStyle(e).textAlign)).resolves.toBe("right");
    // The plot of both revisions: drawn by the figure renderer, one legend entry per revision.
    const plot = page.getByTestId("quick-look");
    await plot.waitFor();
    await expect(plot.locator(":scope > svg").count()).resolves.toBe(1);
    const plotText = (await plot.textContent()) ?? "";
    expect(plotText).toContain("r1");
    expect(plotText).toContain("r2");
    await page.screenshot({ path: path.join(dir, "compare.png"), fullPage: true });
    expect(errors).toEqual([]);
    await page.close();
  });

  it("guesses dsdo_ub_sr as y, marks a missing column at its field, empties the file picker after a stored revision, and tells a co-author why the page is read-only", async () => {
    await browser.context.clearCookies();
    const page = await browser.context.newPage();
    const errors: string[] = [];
    page.on("pageerror", (e) => errors.push(e.message));
    await signInAs(browser.context, page, DEMO.contributor);
    await createDataset(page, "Abbreviated headers");
    const datasetUrl = page.url();

    await page.getByLabel("CSV file").setInputFiles(file("abbrev.csv", "theta_cm,dsdo_ub_sr,stat\n30,1.5,0.1\n45,1.2,0.08\n"));
    await page.getByRole("button", { name: "Upload" }).click();
    await page.getByRole("heading", { name: /Map the columns of “abbrev.csv”/ }).waitFor();
    await expect(page.getByLabel("y (required)").inputValue()).resolves.toBe("dsdo_ub_sr");

    // Unmap y: the refusal is written at the y field, in words.
    await page.getByLabel("y (required)").selectOption("");
    await page.getByRole("button", { name: "Check and store as a revision" }).click();
    const y = page.getByLabel("y (required)");
    await expect.poll(() => y.getAttribute("aria-invalid")).toBe("true");
    const describedBy = (await y.getAttribute("aria-describedby"))!;
    await expect(page.locator(`[id="${describedBy}"]`).textContent()).resolves.toBe("Choose a column.");
    await expect(page.getByText(/Invalid input|expected string/).count()).resolves.toBe(0);

    await y.selectOption("dsdo_ub_sr");
    await page.getByRole("button", { name: "Check and store as a revision" }).click();
    await page.getByText("Stored as revision").waitFor();
    await expect(page.getByLabel("CSV file").inputValue()).resolves.toBe("");

    await signInAs(browser.context, page, DEMO.coauthor);
    await page.goto(datasetUrl);
    await page.getByTestId("read-only-reason").getByText("You are a co-author of this manuscript").waitFor();
    await expect(page.getByLabel("CSV file").count()).resolves.toBe(0);
    expect(errors).toEqual([]);
    await page.close();
  });

  it("marks the bad cell of a refused file, then stores a file that gives only bin edges, plotted at the bins' centres", async () => {
    await browser.context.clearCookies();
    const page = await browser.context.newPage();
    const errors: string[] = [];
    page.on("pageerror", (e) => errors.push(e.message));
    await signInAs(browser.context, page, DEMO.contributor);
    await createDataset(page, "Edges only");

    // A letter O typed for a zero: "4O.2" reads as 40.2 in a plain table.
    await page.getByLabel("CSV file").setInputFiles(file("edges-typo.csv", "theta_lo,theta_hi,dsdo_ub_sr,stat\n20,30,4O.2,0.5\n30,45,35.1,0.4\n"));
    await page.getByRole("button", { name: "Upload" }).click();
    await page.getByRole("heading", { name: /Map the columns of “edges-typo.csv”/ }).waitFor();
    // No x column: x stays empty, both edges are guessed, and that is enough.
    await expect(page.getByLabel("x", { exact: true }).inputValue()).resolves.toBe("");
    await expect(page.getByLabel("bin low edge").inputValue()).resolves.toBe("theta_lo");
    await expect(page.getByLabel("bin high edge").inputValue()).resolves.toBe("theta_hi");
    await page.getByRole("button", { name: "Check and store as a revision" }).click();
    await page.getByText(/The file was not stored: 1 problem/).waitFor();
    const refused = page.getByRole("table", { name: "Refused lines of the file" });
    const cell = refused.locator("td[data-problem]");
    await expect(cell.count()).resolves.toBe(1);
    await expect(cell.getAttribute("data-problem")).resolves.toContain("is not a number");
    // Line 2, the third column of the file.
    await expect(refused.locator("tbody tr").first().locator("td").nth(3).getAttribute("data-problem")).resolves.not.toBeNull();
    const odd = cell.getByTestId("odd-character");
    await expect(odd.count()).resolves.toBe(1);
    await expect(odd.getAttribute("title")).resolves.toBe("the letter O (U+004F)");
    // Named in visible text too, not only on hover.
    await expect(page.getByTestId("odd-characters").textContent()).resolves.toBe("line 2, column 3 “dsdo_ub_sr”: the letter O (U+004F)");
    await expect(page.locator("td[data-problem]").count()).resolves.toBe(2); // and in the mapping step's preview
    await page.screenshot({ path: path.join(dir, "refused.png"), fullPage: true });
    // The refusal as the page shows it, with its marked cells: no serious or critical axe finding.
    const scan = await new AxeBuilder({ page }).analyze();
    expect(scan.violations.filter((v) => v.impact === "serious" || v.impact === "critical").map((v) => `${v.id}: ${v.nodes.map((n) => n.target.join(" ")).join(", ")}`)).toEqual([]);

    // The file still waits in the mapping step: another mapping, leaving the bad column out, is
    // checked without a new upload (y read from "stat", only to show the file was kept).
    await page.getByLabel("y (required)").selectOption("stat");
    await page.getByLabel("statistical error: kind").selectOption("none");
    await page.getByRole("button", { name: "Check and store as a revision" }).click();
    await page.getByText("Stored as revision").waitFor();
    await page.getByRole("link", { name: "r1", exact: true }).waitFor();

    await page.getByLabel("CSV file").setInputFiles(file("edges.csv", "theta_lo,theta_hi,dsdo_ub_sr,stat\n20,30,40.2,0.5\n30,45,35.1,0.4\n"));
    await page.getByLabel("Use the saved column mapping").uncheck();
    await page.getByRole("button", { name: "Upload" }).click();
    await page.getByRole("heading", { name: /Map the columns of “edges.csv”/ }).waitFor();
    await page.getByLabel("y (required)").selectOption("dsdo_ub_sr");
    await page.getByLabel("statistical error: kind").selectOption("symmetric");
    await page.getByLabel("column", { exact: true }).selectOption("stat");
    await page.getByRole("button", { name: "Check and store as a revision" }).click();
    await page.getByText("Stored as revision").waitFor();

    await page.getByRole("link", { name: "r2", exact: true }).click();
    await page.getByTestId("bin-centre-note").waitFor();
    const table = page.getByRole("table", { name: "Rows of r2" });
    await expect(table.locator("thead th").nth(1).textContent()).resolves.toMatch(/^x, bin centre/);
    // (20 + 30)/2 and (30 + 45)/2, by hand.
    await expect(table.locator("tbody tr").nth(0).locator("td").nth(1).textContent()).resolves.toBe("25");
    await expect(table.locator("tbody tr").nth(1).locator("td").nth(1).textContent()).resolves.toBe("37.5");
    expect(errors).toEqual([]);
    await page.close();
  });
});
