// The Predictions page as a person uses it, in Debian's chromium: the curve follows the input,
// a bad energy is explained beside the field, and the downloaded table holds the numbers.
import { readFileSync } from "node:fs";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import type { ConsoleMessage, Page } from "playwright-core";
import { launchBrowser } from "../support/browser";
import { testEnv } from "../support/env";
import { DEMO } from "../support/http";

let browser: Awaited<ReturnType<typeof launchBrowser>>;
beforeAll(async () => {
  browser = await launchBrowser();
});
afterAll(() => browser?.close());

/**
 * Console errors of the page. Chromium itself reports every non-2xx fetch as "Failed to load
 * resource"; the 422 of a deliberately bad input is the contract's answer, not a page error,
 * so exactly that message for the predictions endpoint is set aside and nothing else.
 */
function collectConsoleErrors(page: Page): string[] {
  const errors: string[] = [];
  page.on("pageerror", (e) => errors.push(`pageerror: ${e.message}`));
  page.on("console", (m: ConsoleMessage) => {
    if (m.type() !== "error") return;
    const expected422 = /status of 422/.test(m.text()) && m.location().url.endsWith("/api/v1/predictions");
    if (!expected422) errors.push(`${m.text()} (${m.location().url})`);
  });
  return errors;
}

async function signIn(page: Page) {
  await page.goto(`${testEnv.appUrl}/sign-in`);
  await page.getByLabel("E-mail address").fill(DEMO.contributor);
  await page.getByLabel("Password").fill(DEMO.password);
  await page.getByRole("button", { name: "Sign in" }).click();
  await page.waitForURL(/\/manuscripts$/);
}

const hashOf = async (page: Page) => {
  const label = await page.getByTestId("parameters-hash").getByRole("button").getAttribute("data-fingerprint");
  const hash = /^([0-9a-f]{64})$/.exec(label ?? "")?.[1];
  if (!hash) throw new Error(`no parameters fingerprint on the page (data-fingerprint ${label})`);
  return hash;
};

async function nextHash(page: Page, previous: string): Promise<string> {
  await page.waitForFunction(
    (prev) => {
      const label = document.querySelector('[data-testid="parameters-hash"] button')?.getAttribute("data-fingerprint") ?? "";
      return label.length === 64 && label !== prev;
    },
    previous,
    { timeout: 10_000 },
  );
  return hashOf(page);
}

/** The fingerprint once the curve answers the form as it is now (nothing marked out of date). */
async function settledHash(page: Page): Promise<string> {
  await page.waitForFunction(() => !document.querySelector('[data-testid="stale-curve"]') && document.querySelector('[data-testid="parameters-hash"] button'), null, { timeout: 10_000 });
  return hashOf(page);
}

/** The drawn curve: the SVG path of the line mark, so a redraw with other numbers shows up. */
async function curvePath(page: Page): Promise<string> {
  const path = page.getByTestId("prediction-chart").locator("svg path[aria-roledescription='line mark'], svg .mark-line path").first();
  await path.waitFor();
  return (await path.getAttribute("d")) ?? "";
}

// Klein–Nishina (O. Klein and Y. Nishina, Z. Phys. 52 (1929) 853), r_e and m_e from CODATA 2018.
function kleinNishinaUbPerSr(photonGeV: number, thetaDeg: number): number {
  const c = Math.cos((thetaDeg * Math.PI) / 180);
  const p = 1 / (1 + (photonGeV / 0.51099895e-3) * (1 - c));
  const re2Fm2 = 2.8179403262 ** 2;
  return ((re2Fm2 / 2) * p * p * (p + 1 / p - (1 - c * c))) * 1e4; // 1 fm² = 10 mb = 10⁴ µb
}

describe("the Predictions page", () => {
  it("updates the curve as the input changes, explains a bad energy beside the field, and downloads the table", async () => {
    await browser.context.clearCookies();
    const page = await browser.context.newPage();
    const errors = collectConsoleErrors(page);
    await signIn(page);
    await page.goto(`${testEnv.appUrl}/predictions`);
    await page.getByRole("heading", { level: 1, name: "Predictions" }).waitFor();
    await expect(page.getByText("Born-level predictions only").isVisible()).resolves.toBe(true);

    await page.getByTestId("prediction-chart").locator("svg").waitFor();
    const first = await hashOf(page);
    const firstPath = await curvePath(page);
    expect(firstPath.length).toBeGreaterThan(20);

    await page.getByLabel("Process").selectOption("compton");
    const compton = await nextHash(page, first);
    await expect(page.getByLabel("Conventions").textContent()).resolves.toContain("the scattered photon");

    const energy = page.getByLabel("Energy", { exact: true });
    await energy.fill("0.002");
    const atTwoMeV = await nextHash(page, compton);
    await page.waitForFunction((before) => {
      const d = document.querySelector('[data-testid="prediction-chart"] svg .mark-line path')?.getAttribute("d");
      return d !== undefined && d !== null && d !== before;
    }, firstPath);
    expect(await curvePath(page)).not.toBe(firstPath);

    await energy.fill("-1");
    const field = page.locator("div", { has: page.locator('input[name="energy"]') }).last();
    await field.getByRole("alert").getByText("the beam kinetic energy must be positive").waitFor();
    await expect(energy.getAttribute("aria-invalid")).resolves.toBe("true");
    // The last good curve stays visible only marked as out of date, without its fingerprint or a download.
    await page.getByTestId("stale-curve").getByText("Out of date").waitFor();
    await expect(page.getByRole("link", { name: "Download the table (CSV)" }).count()).resolves.toBe(0);
    await expect(page.getByTestId("parameters-hash").count()).resolves.toBe(0);

    // Back to the same input: the same parameters, the same fingerprint (determinism).
    await energy.fill("0.002");
    await page.waitForFunction(() => !document.querySelector('input[name="energy"]')?.hasAttribute("aria-invalid"));
    await page.getByTestId("prediction-chart").locator("svg").waitFor();
    expect(await hashOf(page)).toBe(atTwoMeV);

    const [download] = await Promise.all([page.waitForEvent("download"), page.getByRole("link", { name: "Download the table (CSV)" }).click()]);
    const csv = readFileSync((await download.path())!, "utf8");
    const lines = csv.trimEnd().split("\n");
    const comments = lines.filter((l) => l.startsWith("#"));
    const [header, firstRow, ...rest] = lines.filter((l) => !l.startsWith("#"));
    expect(comments.some((l) => /^# engine_version: \d+\.\d+\.\d+/.test(l))).toBe(true);
    expect(comments).toContain(`# parameters_sha256: ${atTwoMeV}`);
    const requestLine = comments.find((l) => l.startsWith("# request: "));
    expect(requestLine).toBeDefined();
    const request = JSON.parse(requestLine!.slice("# request: ".length)) as { process: string; energy: Record<string, unknown>; thetaDeg: number[] };
    expect(request.process).toBe("compton");
    expect(request.energy).toEqual({ kinetic: 0.002, unit: "GeV" });
    expect(header).toBe("theta_deg,dsigma_dOmega_ub_per_sr");
    expect(rest.length + 1).toBe(request.thetaDeg.length);

    const [theta, value] = firstRow.split(",").map(Number);
    expect(theta).toBe(5);
    // The first row against the closed form computed here (relative 1e-8: CODATA's digits of r_e).
    const kn = kleinNishinaUbPerSr(0.002, 5);
    expect(Math.abs(value - kn) / kn, `got ${value}, Klein–Nishina ${kn}`).toBeLessThan(1e-8);
    // …and against the API asked afresh with the request the file says produced it.
    const fresh = await page.evaluate(async (body) => {
      const res = await fetch("/api/v1/predictions", { method: "POST", headers: { "content-type": "application/json" }, body: JSON.stringify(body) });
      return (await res.json()) as { values: number[]; parametersHash: string };
    }, request);
    expect(fresh.parametersHash).toBe(atTwoMeV);
    expect(firstRow.split(",")[1]).toBe(String(fresh.values[0]));

    expect(errors).toEqual([]);
    await page.close();
  });

  it("converts the energy on a change of unit, keeps the number of points, and gives a shared address the same curve", async () => {
    await browser.context.clearCookies();
    const page = await browser.context.newPage();
    const errors = collectConsoleErrors(page);
    await signIn(page);
    await page.goto(`${testEnv.appUrl}/predictions`);
    await page.getByLabel("Process").selectOption("compton");
    await page.getByTestId("prediction-chart").locator("svg").waitFor();
    const energy = page.getByLabel("Energy", { exact: true });
    await energy.fill("2");
    await page.getByRole("textbox", { name: "points" }).fill("200");
    const before = await settledHash(page);
    const pathBefore = await curvePath(page);
    await page.getByLabel("Energy unit").selectOption("MeV");
    await expect(energy.inputValue()).resolves.toBe("2000");
    // The same energy in other words: new parameters (the request names the unit), the same curve.
    expect(await settledHash(page)).not.toBe(before);
    expect(await curvePath(page)).toBe(pathBefore);

    await page.getByLabel("As a function of").selectOption("cosTheta");
    await expect(page.getByRole("textbox", { name: "points" }).inputValue()).resolves.toBe("200");
    await page.getByLabel("y axis").selectOption("linear");
    const cosHash = await settledHash(page);
    expect(cosHash).not.toBe(before);
    const path = await curvePath(page);

    // The address now holds the form: opened afresh (as a co-author would), it draws the same curve.
    const shared = page.url();
    expect(shared).toContain("energyUnit=MeV");
    const other = await browser.context.newPage();
    await other.goto(shared);
    await other.getByTestId("prediction-chart").locator("svg .mark-line path").first().waitFor();
    expect(await settledHash(other)).toBe(cosHash);
    expect(await curvePath(other)).toBe(path);
    await expect(other.getByLabel("Energy", { exact: true }).inputValue()).resolves.toBe("2000");
    await expect(other.getByLabel("y axis").inputValue()).resolves.toBe("linear");
    await other.close();
    expect(errors).toEqual([]);
    await page.close();
  });

  it("turns a beam energy into the same √s on a change of process and never offers a curve of other input", async () => {
    await browser.context.clearCookies();
    const page = await browser.context.newPage();
    const errors = collectConsoleErrors(page);
    await signIn(page);
    await page.goto(`${testEnv.appUrl}/predictions?process=compton&energy=0.5`);
    await page.getByTestId("prediction-chart").locator("svg").waitFor();
    const compton = await settledHash(page);

    // Delay the next answer so that the moment between the change and the new curve can be looked at.
    await page.route("**/api/v1/predictions", async (route) => {
      await new Promise((r) => setTimeout(r, 1500));
      await route.continue();
    });
    await page.getByLabel("Process").selectOption("bhabha");
    await page.getByTestId("stale-curve").waitFor();
    await expect(page.getByRole("link", { name: "Download the table (CSV)" }).count()).resolves.toBe(0);
    // A 0.5 GeV photon on an electron at rest: √s = √(m² + 2km) = 0.0226 GeV (m_e, CODATA 2018).
    const energy = Number(await page.getByLabel("Energy", { exact: true }).inputValue());
    expect(Math.abs(energy - Math.sqrt(0.51099895e-3 ** 2 + 2 * 0.5 * 0.51099895e-3))).toBeLessThan(1e-6);
    await expect(page.getByLabel("Energy given as").inputValue()).resolves.toBe("sqrtS");
    await page.getByTestId("energy-note").getByText("same √s").waitFor();
    await page.unroute("**/api/v1/predictions");
    const bhabha = await nextHash(page, compton);
    expect(bhabha).not.toBe(compton);
    await page.getByRole("link", { name: "Download the table (CSV)" }).waitFor();

    // An absurd energy is blamed on the energy, in the form's words.
    await page.getByLabel("Energy", { exact: true }).fill("1e300");
    const field = page.locator("div", { has: page.locator('input[name="energy"]') }).last();
    await field.getByRole("alert").getByText("above the Planck energy").waitFor();
    await expect(field.getByRole("alert").textContent()).resolves.not.toMatch(/thetaDeg|energy\.sqrtS/);
    await expect(page.getByRole("link", { name: "Download the table (CSV)" }).count()).resolves.toBe(0);
    expect(errors).toEqual([]);
    await page.close();
  });

  it("tells a signed-out visitor that the predictions need a sign-in", async () => {
    await browser.context.clearCookies();
    const page = await browser.context.newPage();
    await page.goto(`${testEnv.appUrl}/`);
    await page.getByText("asks you to sign in").waitFor();
    await page.getByRole("link", { name: "Try the predictions" }).click();
    await page.waitForURL(/\/sign-in\?redirectTo=%2Fpredictions/);
    await page.close();
  });

  it("adds the shown prediction to a figure's draft the user can edit", async () => {
    await browser.context.clearCookies();
    const page = await browser.context.newPage();
    const errors = collectConsoleErrors(page);
    await signIn(page);
    // A figure of its own in the demo manuscript, so that other tests' figures stay as they are.
    const title = `Predictions page figure ${Date.now()}`;
    const figure = await page.evaluate(async (title) => {
      const list = (await (await fetch("/api/v1/manuscripts")).json()) as { manuscripts: { id: string }[] };
      const res = await fetch(`/api/v1/manuscripts/${list.manuscripts[0].id}/figures`, { method: "POST", headers: { "content-type": "application/json" }, body: JSON.stringify({ title }) });
      return ((await res.json()) as { figure: { id: string } }).figure.id;
    }, title);
    await page.goto(`${testEnv.appUrl}/predictions?process=compton&energy=0.002`);
    await settledHash(page);
    await page.getByLabel("Add this prediction to a figure").selectOption(figure);
    await page.getByRole("button", { name: "Add to the figure's draft" }).click();
    await page.getByRole("status").getByText(`Added to “${title}”`).waitFor();
    const draft = await page.evaluate(async (id) => (await (await fetch(`/api/v1/figures/${id}/draft`)).json()) as { model: { panels: { layers: Record<string, unknown>[] }[] } }, figure);
    const layers = draft.model.panels[0].layers.filter((l) => l.kind === "prediction");
    expect(layers.at(-1)).toMatchObject({ process: "compton", energy: { kind: "kinetic", value: 0.002, unit: "GeV" } });
    expect(errors).toEqual([]);
    await page.close();
  });
});
