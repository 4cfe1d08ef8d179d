import { afterAll, beforeAll, describe, expect, inject, it } from "vitest";
import Database from "better-sqlite3";
import type { Browser } from "playwright-core";
import { launchBrowser } from "../helpers/browser";
import { Client, GOOD_PASSWORD, uniqueEmail } from "../helpers/http";

let browser: Browser;
beforeAll(async () => {
  browser = await launchBrowser();
});
afterAll(async () => {
  await browser?.close();
});

/** The newest password-reset link mailed to `to` (outbox text, checked against the captured copy). */
function resetLinkFor(to: string): string {
  const db = new Database(inject("dbPath"), { readonly: true });
  try {
    const row = db
      .prepare(
        "select o.text_body, c.raw from outbox o join captured_mail c on c.outbox_id = o.id where o.kind = 'password_reset' and o.to_addresses = ? order by o.id desc",
      )
      .get(to) as { text_body: string; raw: string } | undefined;
    const link = row?.text_body.match(/https?:\/\/\S+\/reset-password\?token=[A-Za-z0-9_-]{43}/)?.[0];
    expect(link).toBeDefined();
    expect(row!.raw.replace(/=\r?\n/g, "")).toContain(link!.split("token=")[1]);
    return link!;
  } finally {
    db.close();
  }
}

describe("account in the browser (issue 12 finding 9)", () => {
  it("forgot password → e-mailed link → new password → sign in; then change it on the account page", async () => {
    const baseUrl = inject("baseUrl");
    const email = uniqueEmail("reset");
    const signUp = await new Client(baseUrl).post("/api/auth/sign-up", { email, password: GOOD_PASSWORD, name: "Rita Reset" });
    expect(signUp.status).toBe(201);

    const ctx = await browser.newContext({ baseURL: baseUrl });
    const page = await ctx.newPage();
    const errors: string[] = [];
    page.on("pageerror", (e) => errors.push(e.message));
    await page.goto("/sign-in");
    await page.getByRole("link", { name: "Forgot password?" }).click();
    await page.waitForURL(/\/forgot-password$/);
    await page.getByLabel("E-mail").fill(email);
    await page.getByRole("button", { name: "Send reset link" }).click();
    await page.getByRole("status").getByText("If an account uses this address").waitFor();

    await page.goto(resetLinkFor(email));
    const newPassword = "orbit willow gravel 31";
    await page.getByLabel("New password").fill("qwertyuiop");
    await page.getByRole("button", { name: "Set new password" }).click();
    await expect.poll(() => page.locator("#f-password-error").textContent()).toContain("most common passwords");
    await page.getByLabel("New password").fill(newPassword);
    await page.getByRole("button", { name: "Set new password" }).click();
    await page.waitForURL(/\/sign-in\?reset=1$/);
    await page.getByText("Your password was changed").waitFor();

    await page.getByLabel("E-mail").fill(email);
    await page.getByLabel("Password", { exact: true }).fill(newPassword);
    await page.getByRole("button", { name: "Sign in" }).click();
    await page.waitForURL(/\/teams(\?landing=1)?$/);

    // The account menu leads to the account page; changing the password there keeps this browser signed in.
    await page.getByRole("button", { name: "Account" }).click();
    await page.getByRole("link", { name: "Account and password" }).click();
    await page.waitForURL(/\/account$/);
    await page.getByLabel("Current password").fill(newPassword);
    await page.getByLabel("New password").fill("lantern basalt meadow 64");
    await page.getByRole("button", { name: "Change password" }).click();
    await page.getByRole("status").getByText("Password changed.").waitFor();
    expect(await page.getByLabel("Current password").inputValue()).toBe("");

    await page.getByRole("button", { name: "Sign out everywhere" }).click();
    await page.waitForURL(/\/sign-in/);
    expect(errors).toEqual([]);
    await ctx.close();
  });
});
