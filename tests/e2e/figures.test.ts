// The figure composer as the demo contributor uses it, in Debian's chromium: a figure started from
// the demo dataset, a scalar-QED prediction added, its energy changed (the preview follows), the
// preview's SVG equal to the server's draft.svg byte for byte, and a stale second tab told so.
import { mkdirSync } from "node:fs";
import path from "node:path";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import type { Page } from "playwright-core";
import { launchBrowser } from "../support/browser";
import { testEnv } from "../support/env";
import { DEMO } from "../support/http";

let browser: Awaited<ReturnType<typeof launchBrowser>>;
beforeAll(async () => {
  browser = await launchBrowser();
});
afterAll(() => browser?.close());

const shots = path.resolve("tests/e2e/screenshots");

async function signIn(page: Page) {
  await page.goto(`${testEnv.appUrl}/sign-in`);
  await page.getByLabel("E-mail address").fill(DEMO.contributor);
  await page.getByLabel("Password").fill(DEMO.password);
  await page.getByRole("button", { name: "Sign in" }).click();
  await page.waitForURL(/\/manuscripts$/);
}

/** The preview's SVG string as the page drew it (through its own download link). */
async function previewSvg(page: Page): Promise<string> {
  return page.evaluate(async () => {
    const a = document.querySelector<HTMLAnchorElement>('[data-testid="preview-download"]');
    if (!a) throw new Error("no preview download link");
    return (await fetch(a.href)).text();
  });
}

/** Waits until the draft is saved at a revision after `after`, and returns that revision. */
async function waitSaved(page: Page, after: number): Promise<number> {
  const handle = await page.waitForFunction(
    (prev) => {
      const m = /^saved · revision (\d+)$/.exec(document.querySelector('[data-testid="save-state"]')?.textContent ?? "");
      return m !== null && Number(m[1]) > prev ? Number(m[1]) : false;
    },
    after,
    { timeout: 20_000 },
  );
  return (await handle.jsonValue()) as number;
}

/** Waits until the preview shows the saved revision (its metadata names it). */
async function previewOfRevision(page: Page, revision: number): Promise<string> {
  await page.waitForFunction(
    (rev) => document.querySelector('[data-testid="figure-preview"]')?.getAttribute("data-draft-revision") === String(rev) &&
      (document.querySelector('[data-testid="figure-preview"]')?.innerHTML ?? "").includes(`Unsealed draft, revision ${rev},`),
    revision,
    { timeout: 30_000 },
  );
  return previewSvg(page);
}

describe("the figure composer", () => {
  it("builds a data-versus-theory figure whose preview is the server's draft SVG, and refuses a stale tab's save", async () => {
    mkdirSync(shots, { recursive: true });
    await browser.context.clearCookies();
    const page = await browser.context.newPage();
    const errors: string[] = [];
    page.on("pageerror", (e) => errors.push(`pageerror: ${e.message}`));
    page.on("console", (m) => { if (m.type() === "error" && !/status of 409/.test(m.text())) errors.push(m.text()); });
    await page.setViewportSize({ width: 1440, height: 900 });
    await signIn(page);

    await page.getByRole("link", { name: /Kestrel Ridge/ }).first().click();
    await page.getByRole("link", { name: "Figures", exact: true }).click();
    await page.getByLabel("Title").fill(`Annihilation in flight ${Date.now()}`);
    await page.getByRole("button", { name: "Create figure" }).click();
    await page.waitForURL(/\/figures\/[0-9a-f-]{36}$/);
    const figureId = /\/figures\/([0-9a-f-]{36})$/.exec(page.url())![1];

    await page.getByTestId("figure-preview").locator("svg").first().waitFor({ timeout: 30_000 });
    const before = await previewOfRevision(page, 1);
    // Started from the dataset: its points and the prediction its metadata names, with a ratio strip.
    expect(before).toContain("Unsealed draft, revision 1,");
    expect(await page.getByTestId("strip-0").inputValue()).toBe("ratio");

    await page.getByTestId("add-prediction-0").selectOption("scalar-annihilation");
    const energy = page.locator('[data-testid^="energy-prediction-"]').last();
    await energy.waitFor();
    const added = await waitSaved(page, 1);
    const afterAdd = await previewOfRevision(page, added);
    expect(afterAdd).not.toBe(before);

    await energy.fill("0.9");
    const revision = await waitSaved(page, added);
    const afterEnergy = await previewOfRevision(page, revision);
    expect(afterEnergy).not.toBe(afterAdd);
    await page.screenshot({ path: path.join(shots, "figure-composer.png"), fullPage: true });

    // The preview is the export: the server renders the saved draft to the same bytes.
    const server = await page.evaluate(async (id) => (await fetch(`/api/v1/figures/${id}/draft.svg`)).text(), figureId);
    expect(server.length).toBeGreaterThan(10_000);
    expect(afterEnergy).toBe(server);

    // A second tab on the same draft revision; the first saves on; the second's save is refused.
    const second = await browser.context.newPage();
    await second.goto(page.url());
    await second.getByTestId("figure-preview").locator("svg").first().waitFor({ timeout: 30_000 });
    await page.getByTestId("strip-0").selectOption("pull");
    await waitSaved(page, revision);
    await second.getByTestId("strip-0").selectOption("none");
    await second.getByTestId("conflict").waitFor({ timeout: 20_000 });
    await expect(second.getByTestId("conflict").textContent()).resolves.toMatch(/saved this draft since you opened it/);
    await second.screenshot({ path: path.join(shots, "figure-conflict.png") });
    const stored = await page.evaluate(async (id) => (await (await fetch(`/api/v1/figures/${id}/draft`)).json()) as { model: { panels: { strip: string }[] } }, figureId);
    expect(stored.model.panels[0].strip).toBe("pull");
    expect(errors).toEqual([]);
  });

  it("shows the figure at printed size with a mm ruler, and a revision's quick look of its points", async () => {
    await browser.context.clearCookies();
    const page = await browser.context.newPage();
    const errors: string[] = [];
    page.on("pageerror", (e) => errors.push(`pageerror: ${e.message}`));
    await page.setViewportSize({ width: 1440, height: 900 });
    await signIn(page);
    await page.getByRole("link", { name: /Kestrel Ridge/ }).first().click();
    await page.getByRole("link", { name: "Figures", exact: true }).click();
    await page.locator("table a").first().click();
    await page.getByTestId("figure-preview").locator("svg").first().waitFor({ timeout: 30_000 });
    await page.getByLabel("at printed size, with a ruler").check();
    const view = page.getByTestId("true-size");
    await view.waitFor();
    await expect(view.textContent()).resolves.toMatch(/At printed size: 86 × \d+ mm\. Smallest text 8\.0 pt, thinnest line 0\.\d+ pt/);
    // 86 mm at CSS's 96 px per inch.
    const box = await view.locator("div[style]").boundingBox();
    expect(Math.abs(box!.width - (86 / 25.4) * 96)).toBeLessThan(1.5);
    await page.screenshot({ path: path.join(shots, "figure-true-size.png") });

    await page.getByRole("link", { name: "Datasets", exact: true }).click();
    await page.locator("ul.divide-y a").first().click();
    await page.getByRole("link", { name: /^r\d+$/ }).first().click();
    const look = page.getByTestId("quick-look");
    await look.locator("svg").first().waitFor({ timeout: 30_000 });
    const logSvg = await look.innerHTML();
    await page.getByLabel("linear y").check();
    await page.waitForFunction((before) => (document.querySelector('[data-testid="quick-look"]')?.innerHTML ?? before) !== before, logSvg, { timeout: 20_000 });
    await page.screenshot({ path: path.join(shots, "revision-quick-look.png") });
    expect(errors).toEqual([]);
  });
});

