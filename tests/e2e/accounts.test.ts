// The admin invites a clinician; the invitation is read from the fake inbox (maildev's JSON API
// at $MAILDEV_WEB_URL/api/email); the clinician sets a password, signs in and opens the worklist.
// Needs the app, the mail worker and maildev running (scripts/test.sh starts them).
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import type { BrowserContext } from "playwright-core";
import { BASE_URL, launch, screenshot, signIn } from "./browser";

const INBOX = `${process.env.MAILDEV_WEB_URL ?? "http://127.0.0.1:1080"}/api/email`;

let browser: BrowserContext;
beforeAll(async () => {
  browser = await launch();
});
afterAll(async () => {
  await browser?.close();
});

async function waitForMail(to: string, timeoutMs = 30_000): Promise<{ subject: string; text: string }> {
  const end = Date.now() + timeoutMs;
  while (Date.now() < end) {
    const mails = (await (await fetch(INBOX)).json()) as { subject: string; text: string; to: { address: string }[] }[];
    const hit = mails.find((m) => m.to.some((t) => t.address === to));
    if (hit) return hit;
    await new Promise((r) => setTimeout(r, 500));
  }
  throw new Error(`no mail to ${to} within ${timeoutMs} ms`);
}

describe("accounts by invitation, worklist and audit trail", () => {
  it("the admin invites a clinician who sets a password from the e-mail, signs in and sees an overdue patient", async () => {
    const email = `e2e-${Date.now()}@dentate.example`;
    const admin = await browser.newPage();
    await signIn(admin, "admin@dentate.example");
    await admin.goto(`${BASE_URL}/staff`);
    const form = admin.locator("form").filter({ has: admin.getByRole("button", { name: "Send invitation" }) });
    await form.getByLabel("E-mail").fill(email);
    await form.getByLabel("Site").selectOption({ label: "Harbour Street Anoscopy Clinic" });
    await form.getByLabel("Role").selectOption("clinician");
    await form.getByRole("button", { name: "Send invitation" }).click();
    await admin.getByText(`Invitation sent to ${email}`).waitFor();
    await screenshot(admin, "staff-invited");

    const mail = await waitForMail(email);
    const link = /https?:\/\/\S+\/accept-invite\/[A-Za-z0-9_-]{43}/.exec(mail.text)![0];
    const path = new URL(link).pathname;

    await browser.clearCookies();
    const newbie = await browser.newPage();
    await newbie.goto(`${BASE_URL}${path}`);
    await newbie.getByLabel("Your name").fill("Dr Robin Example");
    await newbie.getByLabel("New password").fill("short");
    await newbie.getByRole("button", { name: "Set password" }).click();
    await newbie.locator("#password-error").getByText(/at least 15 characters/i).waitFor();
    expect(await newbie.getByLabel("Your name").inputValue()).toBe("Dr Robin Example");
    await newbie.getByLabel("New password").fill("marigold ferry compass");
    await newbie.getByRole("button", { name: "Set password" }).click();
    await newbie.waitForURL((u) => u.pathname === "/sign-in");

    // The link works once.
    await newbie.goto(`${BASE_URL}${path}`);
    await newbie.getByText(/expired, was already used/).waitFor();

    await signIn(newbie, email, "marigold ferry compass");
    await newbie.goto(`${BASE_URL}/worklist?overdue=1`);
    await newbie.getByRole("heading", { name: "Worklist" }).waitFor();
    const overdueFlags = newbie.getByText(/Overdue \d+ days?/);
    expect(await overdueFlags.count()).toBeGreaterThan(0);
    await screenshot(newbie, "worklist");
    await newbie.close();
    await admin.close();
  });

  it("the admin sees sign-in successes and failures in the audit trail", async () => {
    await browser.clearCookies();
    const page = await browser.newPage();
    // One failed attempt to make sure there is one to see.
    await page.goto(`${BASE_URL}/sign-in`);
    await page.getByLabel("E-mail").fill("admin@dentate.example");
    await page.getByLabel("Password").fill("not the password");
    await page.getByRole("button", { name: "Sign in" }).click();
    await page.getByRole("alert").waitFor();
    await signIn(page, "admin@dentate.example");
    await page.goto(`${BASE_URL}/audit?action=sign_in.`);
    await page.getByRole("heading", { name: "Audit trail" }).waitFor();
    expect(await page.getByRole("cell", { name: "Sign-in failed" }).count()).toBeGreaterThan(0);
    expect(await page.getByRole("cell", { name: "Sign-in succeeded" }).count()).toBeGreaterThan(0);
    await page.goto(`${BASE_URL}/audit`);
    await screenshot(page, "audit");
    await page.close();
  });
});
