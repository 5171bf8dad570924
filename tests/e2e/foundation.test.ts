// As a person would: in Debian's chromium, through the real pages.
import { afterAll, afterEach, beforeAll, describe, expect, it } from "vitest";
import type { BrowserContext, Page } from "playwright-core";
import { launchBrowser } from "../support/browser";
import { testEnv } from "../support/env";
import { DEMO } from "../support/http";
import { linkIn, waitForMail } from "../support/mail";
import { uniqueEmail } from "../support/accounts";

let browser: Awaited<ReturnType<typeof launchBrowser>>;
beforeAll(async () => {
  browser = await launchBrowser();
});
afterAll(() => browser?.close());

const pageErrors: string[] = [];
async function freshPage(context: BrowserContext): Promise<Page> {
  await context.clearCookies();
  const page = await context.newPage();
  page.on("pageerror", (e) => pageErrors.push(e.message));
  return page;
}
afterEach(() => {
  expect(pageErrors.splice(0)).toEqual([]);
});

async function signIn(page: Page, email: string, password: string) {
  await page.goto(`${testEnv.appUrl}/sign-in`);
  await page.getByLabel("E-mail address").fill(email);
  await page.getByLabel("Password").fill(password);
  await page.getByRole("button", { name: "Sign in" }).click();
  await page.waitForURL(/\/manuscripts$/);
}

describe("foundation in the browser", () => {
  it("the demo contributor signs in, opens the demo manuscript, and signs out", async () => {
    const page = await freshPage(browser.context);
    await signIn(page, DEMO.contributor, DEMO.password);
    await page.getByRole("link", { name: /Positron annihilation in flight/ }).click();
    await page.waitForURL(new RegExp(`/manuscripts/${DEMO.manuscriptId}$`));
    // The address changes before the new page has rendered: wait for its heading.
    await page.getByRole("heading", { level: 1, name: /Positron annihilation/ }).waitFor();
    await expect(page.getByText("demo · synthetic").first().isVisible()).resolves.toBe(true);
    await page.getByRole("button", { name: "Sign out" }).click();
    await page.waitForURL(/\/sign-in$/);
    await page.goto(`${testEnv.appUrl}/manuscripts`);
    await page.waitForURL(/\/sign-in\?redirectTo=/);
    await page.close();
  });

  it("the corresponding author invites a new member, who accepts from the e-mail and is listed", async () => {
    const email = uniqueEmail("browser-invitee");
    const page = await freshPage(browser.context);
    await signIn(page, DEMO.corresponding, DEMO.password);
    await page.goto(`${testEnv.appUrl}/manuscripts/${DEMO.manuscriptId}/members`);
    await page.getByLabel("E-mail address").fill(email);
    await page.getByLabel("Role", { exact: true }).selectOption("observer");
    await page.getByRole("button", { name: "Send invitation" }).click();
    await page.getByText(`Invitation sent to ${email}.`).waitFor();
    await page.getByRole("button", { name: "Sign out" }).click();
    await page.waitForURL(/\/sign-in$/);

    const mail = await waitForMail(email, (m) => m.subject.includes("Invitation"));
    await page.goto(linkIn(mail, "/invitations/"));
    await page.getByLabel("Name").fill("Invited Observer");
    await page.getByLabel("Password").fill("a long enough password");
    await page.getByRole("button", { name: "Create account and join" }).click();
    await page.waitForURL(new RegExp(`/manuscripts/${DEMO.manuscriptId}$`));
    await page.getByRole("link", { name: "All members" }).click();
    await page.getByRole("cell", { name: email }).waitFor();
    await expect(page.getByRole("row", { name: new RegExp(email) }).textContent()).resolves.toContain("observer");
    await page.close();
  });
});
