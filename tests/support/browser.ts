import { mkdtempSync, rmSync } from "node:fs";
import { tmpdir } from "node:os";
import path from "node:path";
import { type BrowserContext, chromium } from "playwright-core";

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
