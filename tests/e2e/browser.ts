// Headless Debian Chromium driven by playwright-core against the app that scripts/test.sh
// started (BASE_URL).
import { mkdtempSync, mkdirSync } from "node:fs";
import { tmpdir } from "node:os";
import path from "node:path";
import { chromium, type BrowserContext, type Page } from "playwright-core";

export const BASE_URL = process.env.DENTATE_BASE_URL ?? "http://127.0.0.1:3100";
export const DEMO_PASSWORD = "Demo-pass-2026";
export const SHOTS = path.resolve(__dirname, "screenshots");

export async function launch(opts: { width?: number; height?: number; touch?: boolean } = {}): Promise<BrowserContext> {
  return chromium.launchPersistentContext(mkdtempSync(path.join(tmpdir(), "dentate-chromium-")), {
    executablePath: process.env.CHROMIUM_PATH ?? "/usr/bin/chromium",
    headless: true,
    viewport: { width: opts.width ?? 1280, height: opts.height ?? 900 },
    hasTouch: opts.touch ?? false,
    args: ["--headless", "--no-sandbox", "--disable-gpu", "--disable-quic", "--no-first-run", "--disable-background-networking", "--disable-component-update", "--disable-sync"],
  });
}

export async function signIn(page: Page, email: string, password = DEMO_PASSWORD): Promise<void> {
  await page.goto(`${BASE_URL}/sign-in`);
  await page.getByLabel("E-mail").fill(email);
  await page.getByLabel("Password").fill(password);
  await page.getByRole("button", { name: "Sign in" }).click();
  await page.waitForURL((u) => u.pathname !== "/sign-in" && u.pathname !== "/");
}

export async function screenshot(page: Page, name: string): Promise<void> {
  mkdirSync(SHOTS, { recursive: true });
  await page.screenshot({ path: path.join(SHOTS, `${name}.png`), fullPage: true });
}
