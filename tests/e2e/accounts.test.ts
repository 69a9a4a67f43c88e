import type { Browser, Page } from "playwright-core";
import { afterAll, beforeAll, beforeEach, describe, expect, it } from "vitest";
import { signInAs, signOut } from "../support/auth";
import { BASE_URL, keepEvidenceOnFailure, launchBrowser, screenshotPath } from "../support/browser";
import { extractLinks, waitForMail } from "../support/mailbox";

let browser: Browser;
let page: Page;
const errors: string[] = [];
const mailDir = () => {
  const dir = process.env.MAIL_STANDIN_DIR;
  if (!dir) throw new Error("MAIL_STANDIN_DIR is not set: run through npm test");
  return dir;
};

beforeAll(async () => {
  browser = await launchBrowser();
  page = await browser.newPage({ viewport: { width: 1100, height: 900 } });
  page.on("pageerror", (e) => errors.push(e.message));
  // A 400 on a refused form is expected and logged by the browser as a failed resource.
  page.on("console", (m) => { if (m.type() === "error" && !m.text().startsWith("Failed to load resource")) errors.push(m.text()); });
});
beforeEach(keepEvidenceOnFailure("accounts", () => page));
afterAll(async () => browser?.close());

describe("a new owner makes an account", () => {
  const email = `wren.${Date.now()}@example.org`;

  it("sees a clear message beside a weak password, keeps what was typed, then signs up", async () => {
    await page.goto(BASE_URL);
    await page.getByRole("link", { name: "Sign in" }).click();
    await page.getByRole("heading", { level: 1, name: "Sign in" }).waitFor();
    await page.getByRole("link", { name: "Make an account" }).click();
    await page.getByRole("heading", { level: 1, name: "Make an account" }).waitFor();
    await page.getByLabel("E-mail address").fill(email);
    await page.getByLabel("Your name").fill("Ash Wren");
    await page.getByLabel("Password").fill("short");
    await page.getByRole("button", { name: "Make my account" }).click();
    await page.getByText("Use at least 10 characters", { exact: false }).waitFor();
    expect(await page.getByLabel("E-mail address").inputValue()).toBe(email);
    expect(await page.getByLabel("Your name").inputValue()).toBe("Ash Wren");
    await page.screenshot({ path: screenshotPath("sign-up-error") });
    await page.getByLabel("Password").fill("halyard winch and a flask of tea");
    await Promise.all([page.waitForURL("**/account"), page.getByRole("button", { name: "Make my account" }).click()]);
    await page.getByText("not confirmed yet", { exact: false }).waitFor();
  });

  it("confirms the address from the e-mail the SMTP stand-in caught", async () => {
    const mail = await waitForMail(mailDir(), (m) => m.to.includes(email) && /Confirm/.test(m.subject));
    const link = extractLinks(mail.text).find((l) => l.includes("/verify-email?token="));
    expect(link).toBeTruthy();
    await page.goto(link!);
    await Promise.all([page.waitForURL("**/account"), page.getByRole("button", { name: "Confirm my address" }).click()]);
    await page.getByText("your e-mail address is confirmed", { exact: false }).waitFor();
    expect(await page.getByText("not confirmed yet", { exact: false }).count()).toBe(0);
  });

  it("registers a boat by hull number, with the message beside the field for a wrong number", async () => {
    await page.getByLabel("Hull number").fill("700");
    await page.getByRole("button", { name: "Add boat" }).click();
    await page.getByText("hull numbers run from 1 to 612", { exact: false }).waitFor();
    await page.getByLabel("Hull number").fill("233");
    await page.getByLabel("Boat name (optional)").fill("Kestrel");
    await page.getByRole("button", { name: "Add boat" }).click();
    await page.getByText("Hull 233, Kestrel", { exact: false }).waitFor();
    expect(await page.getByText("(Mk I)").count()).toBe(1);
    await page.screenshot({ path: screenshotPath("account"), fullPage: true });
  });

  it("signs out and back in", async () => {
    await signOut(page);
    await signInAs(page, email, "halyard winch and a flask of tea");
    await page.getByRole("link", { name: "Ash Wren" }).waitFor();
    await signOut(page);
  });

  it("an administrator finds members by role and gives a role", async () => {
    await signInAs(page, "tomasz.wren@example.org");
    await page.getByRole("link", { name: "Members" }).click();
    await page.getByRole("heading", { level: 1, name: "Members and roles" }).waitFor();
    await page.getByLabel("Role", { exact: true }).selectOption("secretary");
    await page.getByRole("button", { name: "Show" }).click();
    await page.waitForURL("**/admin/users?**role=secretary**");
    const rows = page.locator("tbody tr");
    await expect.poll(() => rows.count()).toBeGreaterThan(0);
    await page.getByLabel("Name or e-mail").fill("");
    await page.getByLabel("Role", { exact: true }).selectOption("");
    await page.getByRole("button", { name: "Show" }).click();
    await page.getByLabel("Name or e-mail").fill("Ash Wren");
    await page.getByRole("button", { name: "Show" }).click();
    const form = page.getByRole("form", { name: "Roles of Ash Wren" });
    await form.getByLabel("Moderator").check();
    await form.getByRole("button", { name: "Save" }).click();
    await page.getByText("Roles saved.").waitFor();
    expect(await page.getByRole("form", { name: "Roles of Ash Wren" }).getByLabel("Moderator").isChecked()).toBe(true);
    await page.screenshot({ path: screenshotPath("admin-users"), fullPage: true });
    await signOut(page);
  });

  it("logged no errors in the browser", () => {
    expect(errors).toEqual([]);
  });
});

describe("the security baseline over HTTP", () => {
  it("sends the security headers, with a nonce for our own scripts", async () => {
    const r = await fetch(`${BASE_URL}/`);
    const csp = r.headers.get("content-security-policy") ?? "";
    expect(csp).toContain("frame-ancestors 'none'");
    expect(csp).toMatch(/script-src 'self' 'nonce-[A-Za-z0-9+/=]+'/);
    expect(csp).not.toContain("unsafe-inline' 'unsafe-eval");
    expect(r.headers.get("x-content-type-options")).toBe("nosniff");
    expect(r.headers.get("referrer-policy")).toBe("strict-origin-when-cross-origin");
    const html = await r.text();
    const nonce = /'nonce-([^']+)'/.exec(csp)![1];
    // Every inline script carries the nonce.
    const inline = [...html.matchAll(/<script(?![^>]*\bsrc=)([^>]*)>/g)];
    expect(inline.length).toBeGreaterThan(0);
    for (const m of inline) expect(m[1]).toContain(`nonce="${nonce}"`);
  });

  it("refuses a form posted from another site (Origin check, by React Router and by our middleware)", async () => {
    const r = await fetch(`${BASE_URL}/sign-in`, {
      method: "POST",
      headers: { Origin: "https://elsewhere.example", "Content-Type": "application/x-www-form-urlencoded" },
      body: "email=nora.pelling%40example.org&password=brantwater-demo",
      redirect: "manual",
    });
    expect([400, 403]).toContain(r.status);
    expect(r.headers.get("set-cookie")).toBeNull();
    // A browser's own marker of a cross-site request, without an Origin header.
    const marked = await fetch(`${BASE_URL}/sign-in`, {
      method: "POST",
      headers: { "Sec-Fetch-Site": "cross-site", "Content-Type": "application/x-www-form-urlencoded" },
      body: "email=nora.pelling%40example.org&password=brantwater-demo",
      redirect: "manual",
    });
    expect(marked.status).toBe(403);
    expect(marked.headers.get("set-cookie")).toBeNull();
  });

  it("does not sign out on GET", async () => {
    const r = await fetch(`${BASE_URL}/sign-out`, { redirect: "manual" });
    expect(r.status).toBe(302);
    expect(r.headers.get("set-cookie")).toBeNull();
  });
});
