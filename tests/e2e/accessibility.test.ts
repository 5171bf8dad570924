// Every page as each demo role, scanned by axe-core (Deque's accessibility engine, the WCAG 2.x
// rules it ships) in Debian's chromium: no violation of "serious" or "critical" impact. No rule
// is switched off; a finding is fixed in the markup or the styles.
import AxeBuilder from "@axe-core/playwright";
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

async function signIn(page: Page, email: string) {
  await page.goto(`${testEnv.appUrl}/sign-in`);
  await page.getByLabel("E-mail address").fill(email);
  await page.getByLabel("Password").fill(DEMO.password);
  await page.getByRole("button", { name: "Sign in" }).click();
  await page.waitForURL(/\/manuscripts$/);
}

/** The serious and critical findings of one page, each as "rule: target … (summary)". */
async function findings(page: Page, path: string): Promise<string[]> {
  await page.goto(`${testEnv.appUrl}${path}`);
  await page.waitForLoadState("networkidle");
  const result = await new AxeBuilder({ page }).analyze();
  return result.violations
    .filter((v) => v.impact === "serious" || v.impact === "critical")
    .flatMap((v) => v.nodes.map((n) => `${path} ${v.id}: ${n.target.join(" ")} (${n.failureSummary?.split("\n").slice(1, 2).join("").trim()})`));
}

/** The demo manuscript's pages, found through the API as the signed-in page sees them. */
async function manuscriptPages(page: Page): Promise<string[]> {
  const m = `/manuscripts/${DEMO.manuscriptId}`;
  const { datasets, figures } = await page.evaluate(async (id) => {
    const d = (await (await fetch(`/api/v1/manuscripts/${id}/datasets`)).json()) as { datasets: { id: string; latestRevision: number | null }[] };
    const f = (await (await fetch(`/api/v1/manuscripts/${id}/figures`)).json()) as { figures: { id: string }[] };
    return { datasets: d.datasets, figures: f.figures };
  }, DEMO.manuscriptId);
  const withRevisions = datasets.find((d) => (d.latestRevision ?? 0) >= 2) ?? datasets.find((d) => d.latestRevision);
  const pages = [m, `${m}/members`, `${m}/datasets`, `${m}/figures`];
  if (withRevisions) {
    pages.push(`${m}/datasets/${withRevisions.id}`, `${m}/datasets/${withRevisions.id}/revisions/1`);
    if ((withRevisions.latestRevision ?? 0) >= 2) pages.push(`${m}/datasets/${withRevisions.id}/compare?from=1&to=2`);
  }
  if (figures[0]) pages.push(`${m}/figures/${figures[0].id}`);
  return pages;
}

describe("accessibility of every page, as each role", () => {
  it("signed out: home, sign-in, sign-up, forgotten password", async () => {
    await browser.context.clearCookies();
    const page = await browser.context.newPage();
    const found: string[] = [];
    for (const path of ["/", "/sign-in", "/sign-up", "/forgot-password"]) found.push(...(await findings(page, path)));
    expect(found).toEqual([]);
    await page.close();
  });

  for (const [role, email, extra] of [
    ["contributor", DEMO.contributor, []],
    ["co-author", DEMO.coauthor, []],
    ["corresponding author", DEMO.corresponding, [`/manuscripts/${DEMO.manuscriptId}/audit`]],
    ["site admin", DEMO.admin, ["/admin/accounts", "/admin/mail"]],
  ] as const) {
    it(`as the ${role}`, async () => {
      await browser.context.clearCookies();
      const page = await browser.context.newPage();
      await signIn(page, email);
      const paths = ["/manuscripts", "/predictions", "/account", "/inbox", ...extra];
      if (role !== "site admin") paths.push(...(await manuscriptPages(page)));
      const found: string[] = [];
      for (const path of paths) found.push(...(await findings(page, path)));
      expect(found).toEqual([]);
      await page.close();
    }, 180_000);
  }

  it("gives the site admin a landing page that says what to do, and mail links that can be followed", async () => {
    await browser.context.clearCookies();
    const page = await browser.context.newPage();
    // A message with a link in it: a reset link for the demo co-author (the reset is never used).
    await page.goto(`${testEnv.appUrl}/forgot-password`);
    await page.getByLabel("E-mail address").fill(DEMO.coauthor);
    await page.getByRole("button").last().click();
    await page.waitForLoadState("networkidle");
    await signIn(page, DEMO.admin);
    await page.getByTestId("admin-landing").getByRole("link", { name: "Accounts" }).waitFor();
    await page.goto(`${testEnv.appUrl}/admin/accounts`);
    await expect(page.getByText("(demo) (demo)").count()).resolves.toBe(0);
    await page.goto(`${testEnv.appUrl}/admin/mail`);
    // Every address written in a captured message is a link to itself.
    const texts = await page.locator("pre").allTextContents();
    const written = texts.join("\n").match(/https?:\/\/[^\s<>"]+/g) ?? [];
    const linked = await page.locator("pre a").evaluateAll((as) => as.map((a) => a.getAttribute("href")));
    expect(written.length).toBeGreaterThan(0);
    expect(linked).toEqual(written);
    await page.close();
  });
});
