import { mkdtempSync, rmSync } from "node:fs";
import { tmpdir } from "node:os";
import path from "node:path";
import { type BrowserContext, chromium, type Page } from "playwright-core";
import { testEnv } from "./env";
import { DEMO } from "./http";

/** Debian's chromium, headless, in a fresh profile that is removed afterwards (docs/conventions.md, "Stack facts"). */
export async function launchBrowser(): Promise<{ context: BrowserContext; close(): Promise<void> }> {
  const dir = mkdtempSync(path.join(tmpdir(), "steradian-chromium-"));
  const context = await chromium.launchPersistentContext(dir, {
    executablePath: "/usr/bin/chromium",
    headless: true,
    viewport: { width: 1280, height: 860 },
    args: ["--headless", "--no-sandbox", "--disable-gpu", "--disable-quic", "--no-first-run", "--disable-background-networking", "--disable-component-update", "--disable-sync"],
  });
  return {
    context,
    async close() {
      await context.close();
      rmSync(dir, { recursive: true, force: true });
    },
  };
}

/** Signs in through the sign-in form as a demo user, after dropping whoever was signed in. */
export async function signInAs(context: BrowserContext, page: Page, email: string): Promise<void> {
  await context.clearCookies();
  await page.goto(`${testEnv.appUrl}/sign-in`);
  await page.getByLabel("E-mail address").fill(email);
  await page.getByLabel("Password").fill(DEMO.password);
  await page.getByRole("button", { name: "Sign in" }).click();
  await page.waitForURL(/\/manuscripts$/);
}
