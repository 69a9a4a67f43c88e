import pg from "pg";
import type { Browser, Page } from "playwright-core";
import { afterAll, beforeAll, beforeEach, describe, expect, it } from "vitest";
import { BASE_URL, keepEvidenceOnFailure, launchBrowser, screenshotPath } from "../support/browser";
import { readSeedWriteups } from "../support/seed-files";

let browser: Browser;
let page: Page;
const errors: string[] = [];

beforeAll(async () => {
  browser = await launchBrowser();
  page = await browser.newPage({ viewport: { width: 1280, height: 900 } });
  page.on("pageerror", (e) => errors.push(e.message));
  // Document 404s are asked for below; the browser logs each as "Failed to load resource".
  // Any other failed request (a script, a font, a stylesheet) is recorded from the response.
  page.on("console", (m) => { if (m.type() === "error" && !m.text().startsWith("Failed to load resource")) errors.push(m.text()); });
  page.on("response", (r) => { if (r.status() >= 400 && r.request().resourceType() !== "document") errors.push(`${r.status()} ${r.url()}`); });
});
beforeEach(keepEvidenceOnFailure("browse", () => page));
afterAll(async () => browser?.close());

const published = readSeedWriteups()
  .filter((w) => w.status === "published")
  .sort((a, b) => String(b.publishedAt).localeCompare(String(a.publishedAt)));

describe("a new owner browsing", () => {
  it("sees the newest published write-ups and the systems on the home page", async () => {
    const response = await page.goto(BASE_URL);
    expect(response?.status()).toBe(200);
    await expect(page.locator("h1").first().textContent()).resolves.toContain("What owners have done");
    const titles = await page.locator("#recent-heading ~ div article h3").allTextContents();
    // Other journeys may have published write-ups in this run: compare with the database itself.
    const client = new pg.Client({ connectionString: process.env.E2E_DATABASE_URL });
    await client.connect();
    const newest = await client.query<{ title: string }>("select title from writeups where status = 'published' order by published_at desc limit 6");
    await client.end();
    expect(titles).toEqual(newest.rows.map((r) => r.title));
    // The demo class has more than six published write-ups.
    expect(newest.rows.length).toBe(6);
    const systems = page.locator("#systems-heading ~ ul li");
    expect(await systems.count()).toBe(11);
    await page.getByRole("link", { name: /Electrical/ }).first().waitFor();
    // The font is served by the app itself.
    const fontOk = await page.evaluate(async () => { await document.fonts.ready; return document.fonts.check('16px "Literata"'); });
    expect(fontOk).toBe(true);
    await page.screenshot({ path: screenshotPath("home"), fullPage: true });
  });

  it("opens a write-up and reads its rendered Markdown, parts and cautions", async () => {
    const target = published.find((w) => w.systems.includes("electrical"))!;
    await page.goto(BASE_URL);
    await page.getByRole("link", { name: target.title }).first().click();
    await page.waitForURL(`**/writeups/${target.slug}`);
    await page.getByRole("heading", { level: 1, name: target.title }).waitFor();
    // A heading from the Markdown body is rendered as a heading with an anchor id.
    const firstHeading = /^##\s+(.+)$/m.exec(target.body)?.[1];
    expect(firstHeading).toBeTruthy();
    const h2 = page.locator(".prose h2").first();
    expect((await h2.textContent())?.trim()).toBe(firstHeading!.replace(/[*_`]/g, "").trim());
    expect(await h2.getAttribute("id")).toMatch(/^[a-z0-9-]+$/);
    await page.getByRole("heading", { name: "Before you start" }).waitFor();
    expect(await page.getByText("33 CFR 183.420", { exact: false }).count()).toBeGreaterThan(0);
    await page.screenshot({ path: screenshotPath("writeup"), fullPage: true });
  });

  it("shows a clear page for an unknown address, with status 404", async () => {
    const response = await page.goto(`${BASE_URL}/writeups/no-such-thing`);
    expect(response?.status()).toBe(404);
    expect(await page.locator("h1").textContent()).toBe("Page not found");
    const other = await page.goto(`${BASE_URL}/nowhere/at/all`);
    expect(other?.status()).toBe(404);
  });

  it("searches from the header box", async () => {
    await page.goto(BASE_URL);
    await page.getByLabel("Search write-ups").fill("battery");
    await page.getByRole("button", { name: "Search" }).click();
    await page.waitForURL("**/search?q=battery");
    await page.getByRole("heading", { level: 1, name: /matching “battery”/ }).waitFor();
    expect(await page.locator("main article").count()).toBeGreaterThan(0);
  });

  it("links to the safety page from the footer", async () => {
    await page.goto(BASE_URL);
    await page.getByRole("link", { name: "Safety and the limits of this advice" }).click();
    await page.waitForURL("**/safety");
    await page.getByRole("heading", { level: 1, name: "Safety and the limits of this advice" }).waitFor();
    const text = await page.locator("main").textContent();
    expect(text).toContain("33 CFR Part 183");
    expect(text).toContain("licensed or certified professional");
  });

  it("sizes a cable run from the header's calculators without an account, and is asked to sign in only to attach it", async () => {
    await page.goto(BASE_URL);
    await page.getByRole("navigation", { name: "Calculators" }).getByRole("link", { name: "Cable sizes" }).click();
    await page.waitForURL("**/tools/cable**");
    await page.getByRole("heading", { level: 1, name: "Cable for a DC run" }).waitFor();
    await page.getByLabel("Current").fill("30");
    await page.getByLabel("Run length, one way").fill("11 ft");
    await page.getByRole("button", { name: "Size the cable" }).click();
    await page.waitForURL("**/tools/cable?**current=30**");
    const answer = page.locator("section[aria-labelledby='cable-answer']");
    await answer.getByRole("link", { name: "Sign in" }).waitFor();
    // By hand: 30 A over 11 ft one way at 12 V with a 3 % drop: CM = 10.75 x 30 x 22 / 0.36 =
    // 19,708 (the formula of ABYC E-11 as widely reproduced), so 6 AWG: 26,240 CM, while 8 AWG
    // has 16,510 (NEC Chapter 9, Table 8).
    await expect(answer.textContent()).resolves.toContain("6 AWG");
    expect(await answer.getByRole("button", { name: "Attach to the write-up" }).count()).toBe(0);
    const href = await answer.getByRole("link", { name: "Sign in" }).getAttribute("href");
    expect(decodeURIComponent(href ?? "")).toContain("/tools/cable?");
  });

  it("reports a healthy database on /api/health", async () => {
    const r = await fetch(`${BASE_URL}/api/health`);
    expect(r.status).toBe(200);
    expect(await r.json()).toMatchObject({ ok: true, database: "up" });
  });

  it("logged no errors in the browser", () => {
    expect(errors).toEqual([]);
  });
});
