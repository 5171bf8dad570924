// The Content-Security-Policy in a real browser (docs/decisions/0012-hardening.md): the pages
// that draw with vega in the browser — the Predictions chart and the figure composer's preview —
// work with a policy that has no 'unsafe-eval', and the browser reports no violation anywhere.
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

/** Every CSP violation the page reports, through the DOM event and the console alike. */
async function watchViolations(page: Page): Promise<string[]> {
  const seen: string[] = [];
  await page.exposeFunction("__reportViolation", (text: string) => seen.push(text));
  await page.addInitScript(() => {
    document.addEventListener("securitypolicyviolation", (e) => {
      (window as unknown as { __reportViolation(t: string): void }).__reportViolation(`${e.violatedDirective} blocked ${e.blockedURI} (${e.sourceFile}:${e.lineNumber})`);
    });
  });
  page.on("console", (m) => {
    if (/Content Security Policy|Refused to/i.test(m.text())) seen.push(m.text());
  });
  page.on("pageerror", (e) => seen.push(`pageerror: ${e.message}`));
  return seen;
}

describe("Content-Security-Policy in chromium", () => {
  it("the Predictions chart and the figure preview draw, with no violation reported", async () => {
    await browser.context.clearCookies();
    const page = await browser.context.newPage();
    const violations = await watchViolations(page);
    const answer = await page.goto(`${testEnv.appUrl}/sign-in`);
    expect(answer?.headers()["content-security-policy"]).toContain("script-src 'self' 'nonce-");
    await page.getByLabel("E-mail address").fill(DEMO.contributor);
    await page.getByLabel("Password").fill(DEMO.password);
    await page.getByRole("button", { name: "Sign in" }).click();
    await page.waitForURL(/\/manuscripts$/);

    await page.goto(`${testEnv.appUrl}/predictions`);
    // vega-embed drew the curve: an SVG with a path inside the chart.
    await page.getByTestId("prediction-chart").locator("svg path").first().waitFor({ timeout: 30_000 });

    await page.goto(`${testEnv.appUrl}/manuscripts`);
    await page.getByRole("link", { name: /Kestrel Ridge/ }).first().click();
    await page.getByRole("link", { name: "Figures", exact: true }).click();
    await page.getByLabel("Title").fill(`CSP check ${Date.now()}`);
    await page.getByRole("button", { name: "Create figure" }).click();
    await page.waitForURL(/\/figures\/[0-9a-f-]{36}$/);
    // vega drew the preview in the browser (through its interpreter, without Function()).
    await page.getByTestId("figure-preview").locator("svg").first().waitFor({ timeout: 30_000 });
    expect(await page.getByTestId("figure-preview").locator("svg path").count()).toBeGreaterThan(5);
    expect(violations).toEqual([]);
    await page.close();
  });
});
