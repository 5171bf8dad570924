// Sealing and sign-off as the three demo accounts use them, in Debian's chromium (issue 9): the
// contributor seals v1 and asks the co-author; the co-author reads the e-mail in the mail catcher
// and returns v1 with a comment; the contributor changes the beam energy and seals v2; the
// compare view shows the parameter change; the co-author signs v2 off; the corresponding author
// sees v2 signed off on the manuscript page.
import { mkdirSync } from "node:fs";
import path from "node:path";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import type { Page } from "playwright-core";
import { launchBrowser, signInAs } from "../support/browser";
import { testEnv } from "../support/env";
import { DEMO } from "../support/http";
import { linkIn, waitForMail } from "../support/mail";

let browser: Awaited<ReturnType<typeof launchBrowser>>;
beforeAll(async () => {
  browser = await launchBrowser();
});
afterAll(() => browser?.close());

const shots = path.resolve("tests/e2e/screenshots");

/** Waits until the draft is saved at a revision above `above`, and returns that revision. */
async function waitSaved(page: Page, above = 0): Promise<number> {
  await page.waitForFunction((min) => {
    const m = /^saved · revision (\d+)$/.exec(document.querySelector('[data-testid="save-state"]')?.textContent ?? "");
    return m !== null && Number(m[1]) > min;
  }, above, { timeout: 30_000 });
  return Number(/revision (\d+)/.exec((await page.getByTestId("save-state").textContent()) ?? "")![1]);
}

/** Seals the saved draft (at a revision above `above`) from the figure page; lands on the new version's page. */
async function sealCurrentDraft(page: Page, number: number, above: number) {
  const revision = await waitSaved(page, above);
  const button = page.getByTestId("seal-button");
  await expect(button.textContent()).resolves.toBe(`Seal draft revision ${revision} as v${number}`);
  await button.click();
  await page.waitForURL(new RegExp(`/versions/${number}$`), { timeout: 60_000 });
  await page.getByTestId("sealed-figure").waitFor();
}

const stateOnPage = (page: Page) => page.locator("h2 + [data-testid=version-state]").first().getAttribute("data-state");

describe("sealing and sign-off", () => {
  it("runs from v1 returned to v2 signed off, with e-mail, inbox, compare view and the manuscript's list", async () => {
    mkdirSync(shots, { recursive: true });
    const page = await browser.context.newPage();
    const errors: string[] = [];
    page.on("pageerror", (e) => errors.push(`pageerror: ${e.message}`));
    page.on("console", (m) => { if (m.type() === "error") errors.push(m.text()); });
    await page.setViewportSize({ width: 1440, height: 1000 });
    const title = `Annihilation photons, sign-off ${Date.now()}`;

    // The contributor composes a figure from the demo data and seals it.
    await signInAs(browser.context, page, DEMO.contributor);
    await page.goto(`${testEnv.appUrl}/manuscripts/${DEMO.manuscriptId}/figures`);
    await page.getByLabel("Title").fill(title);
    await page.getByRole("button", { name: "Create figure" }).click();
    await page.waitForURL(/\/figures\/[0-9a-f-]{36}$/);
    const figureUrl = page.url();
    const figureId = /\/figures\/([0-9a-f-]{36})$/.exec(figureUrl)![1];
    await page.getByTestId("figure-preview").locator("svg").first().waitFor({ timeout: 30_000 });
    const started = await waitSaved(page);
    await expect(page.getByTestId("versions-panel").textContent()).resolves.toContain("No sealed version yet");
    await sealCurrentDraft(page, 1, started - 1);
    expect(await stateOnPage(page)).toBe("sealed");

    // … and asks the co-author (the corresponding author could be asked too; the observer could not).
    await page.getByLabel(/Bruno Okafor/).check();
    await page.getByRole("button", { name: "Request sign-off" }).click();
    await page.getByTestId("reviewers").waitFor();
    await expect(page.getByTestId("reviewers").textContent()).resolves.toMatch(/Bruno Okafor \(demo\)\s*not yet decided/);
    expect(await stateOnPage(page)).toBe("in review");
    await page.screenshot({ path: path.join(shots, "version-in-review.png"), fullPage: true });

    // The co-author reads the e-mail in the mail catcher and follows its link.
    const request = await waitForMail(DEMO.coauthor, (m) => m.subject === `Sign-off requested: “${title}” v1`);
    expect(request.text).toContain("Positron annihilation in flight");
    expect(request.text).toMatch(/Fingerprint of v1: [0-9a-f]{4} [0-9a-f]{4} [0-9a-f]{4} …/);
    await signInAs(browser.context, page, DEMO.coauthor);
    const unread = Number(await page.getByTestId("inbox-count").textContent());
    expect(unread).toBeGreaterThanOrEqual(1);
    await page.goto(linkIn(request, `/figures/${figureId}/versions/1`));
    await page.getByTestId("decision-form").waitFor();
    // Opening the version marks its message read; the header's count follows.
    await page.waitForFunction((n) => Number(document.querySelector('[data-testid="inbox-count"]')?.textContent ?? "0") === n, unread - 1, { timeout: 10_000 });
    await page.getByLabel("Your comment (needed to return it)").fill("Please compare with a beam energy of 0.6 GeV as in the run plan.");
    await page.getByRole("button", { name: "Return with comments" }).click();
    await page.getByTestId("action-result").waitFor();
    expect(await stateOnPage(page)).toBe("returned");
    await expect(page.getByTestId("thread").textContent()).resolves.toContain("Please compare with a beam energy of 0.6 GeV");

    // The contributor is told, changes the beam energy and seals v2.
    const returned = await waitForMail(DEMO.contributor, (m) => m.subject === `Returned: “${title}” v1`);
    expect(returned.text).toContain("0.6 GeV as in the run plan");
    await signInAs(browser.context, page, DEMO.contributor);
    await page.goto(figureUrl);
    await expect(page.getByTestId("version-row-1").textContent()).resolves.toMatch(/returned/);
    const energy = page.locator('[data-testid^="energy-"]').first();
    await energy.waitFor();
    const before = Number(await energy.inputValue());
    const sealedRevision = await waitSaved(page);
    await energy.fill("0.6");
    await sealCurrentDraft(page, 2, sealedRevision);
    await page.getByLabel(/Bruno Okafor/).check();
    await page.getByRole("button", { name: "Request sign-off" }).click();
    await page.getByTestId("reviewers").waitFor();

    // The compare view names the parameter that changed, and shows both pictures.
    await page.getByTestId("compare-previous").click();
    await page.waitForURL(/\/compare\?from=1&to=2$/);
    const changes = (await page.getByTestId("prediction-changes").textContent()) ?? "";
    expect(changes).toContain(`energy.beam: ${before} → 0.6`);
    await expect(page.getByTestId("model-changes").textContent()).resolves.toMatch(/energy\.value.*0\.6/s);
    await expect(page.getByTestId("dataset-changes").textContent()).resolves.toContain("the same revision (r1)");
    await page.getByTestId("side-by-side").locator("img").nth(1).waitFor();
    await page.waitForFunction(() => [...document.querySelectorAll<HTMLImageElement>('[data-testid="side-by-side"] img, [data-testid="overlay"] img')].every((i) => i.complete && i.naturalWidth > 0));
    await page.screenshot({ path: path.join(shots, "version-compare.png"), fullPage: true });

    // The co-author signs v2 off from the inbox.
    await signInAs(browser.context, page, DEMO.coauthor);
    await page.goto(`${testEnv.appUrl}/inbox`);
    await page.getByRole("link", { name: `Sign-off requested: “${title}” v2` }).click();
    await page.waitForURL(/\/versions\/2$/);
    await page.getByRole("button", { name: "Sign off v2" }).click();
    await page.getByTestId("action-result").waitFor();
    expect(await stateOnPage(page)).toBe("signed off");

    // The corresponding author sees v2 signed off, by e-mail and on the manuscript page.
    await waitForMail(DEMO.corresponding, (m) => m.subject === `Signed off: “${title}” v2`);
    await signInAs(browser.context, page, DEMO.corresponding);
    await page.goto(`${testEnv.appUrl}/manuscripts/${DEMO.manuscriptId}`);
    const cell = page.getByTestId(`figure-state-${figureId}`);
    await expect(cell.textContent()).resolves.toBe("v2signed off");
    await expect(cell.locator("[data-testid=version-state]").getAttribute("data-state")).resolves.toBe("signed off");
    await page.screenshot({ path: path.join(shots, "manuscript-signed-off.png"), fullPage: true });
    await page.goto(figureUrl);
    await expect(page.getByTestId("version-row-2").textContent()).resolves.toMatch(/signed off/);
    await expect(page.getByTestId("version-row-1").textContent()).resolves.toMatch(/returned/);
    await page.screenshot({ path: path.join(shots, "figure-versions.png") });
    expect(errors).toEqual([]);
  });
});
