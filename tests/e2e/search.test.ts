// A new owner searching: by words in the header with the type-ahead and the keyboard, then
// narrowing by system and hull, paging; the same without JavaScript; and a write-up with markup
// in it that must show as text.
import pg from "pg";
import type { Browser, BrowserContext, Page } from "playwright-core";
import { afterAll, beforeAll, beforeEach, describe, expect, it } from "vitest";
import { BASE_URL, keepEvidenceOnFailure, launchBrowser, screenshotPath } from "../support/browser";

let browser: Browser;
const errors: string[] = [];

function watch(page: Page) {
  page.on("pageerror", (e) => errors.push(e.message));
  page.on("console", (m) => { if (m.type() === "error") errors.push(m.text()); });
  page.on("dialog", (d) => { errors.push(`a dialog opened: ${d.message()}`); void d.dismiss(); });
}

// A published write-up with markup in its title and text (OWASP XSS Filter Evasion Cheat Sheet
// style vectors), in the database the app under test reads; removed afterwards.
const HOSTILE_SLUG = "hostile-hatch-e2e";
const HOSTILE = `Hostile hatch <script>window.__hit = 1</script> <img src=x onerror="window.__hit = 2"> <svg/onload=window.__hit=3> end`;
async function withDb<T>(work: (c: pg.Client) => Promise<T>): Promise<T> {
  const c = new pg.Client({ connectionString: process.env.E2E_DATABASE_URL });
  await c.connect();
  try {
    return await work(c);
  } finally {
    await c.end();
  }
}

beforeAll(async () => {
  browser = await launchBrowser();
  if (!process.env.E2E_DATABASE_URL) throw new Error("E2E_DATABASE_URL is not set: run the browser tests through `npm test`.");
  await withDb((c) => c.query(
    `insert into writeups (slug, title, summary, body_markdown, body_text, status, author_id, published_at)
     select $1, $2, $2, $2, $2, 'published', min(id), now() from users
     on conflict (slug) do nothing`,
    [HOSTILE_SLUG, HOSTILE],
  ));
});
afterAll(async () => {
  await withDb((c) => c.query("delete from writeups where slug = $1", [HOSTILE_SLUG]));
  await browser?.close();
});

const resultTitles = (page: Page) => page.locator("main section[aria-labelledby^='group-'] article h3").allTextContents();

describe("with JavaScript", () => {
  let context: BrowserContext;
  let page: Page;
  beforeEach(keepEvidenceOnFailure("search", () => page));
  beforeAll(async () => {
    context = await browser.newContext({ viewport: { width: 1280, height: 900 } });
    page = await context.newPage();
    watch(page);
  });
  afterAll(async () => context?.close());

  it("types in the header, moves through the suggestions with the keyboard, and searches", async () => {
    await page.goto(BASE_URL);
    const box = page.locator("#site-search");
    await expect.poll(() => box.getAttribute("role")).toBe("combobox");
    await box.click();
    await box.pressSequentially("battery box under the settee", { delay: 20 });
    const list = page.locator("#site-search-suggestions");
    await list.waitFor({ state: "visible" });
    expect(await box.getAttribute("aria-expanded")).toBe("true");
    const options = list.getByRole("option");
    expect(await options.count()).toBeGreaterThan(1);
    expect(await options.allTextContents()).toContain("Write-upGroup 27 battery moved under the starboard settee");

    await page.keyboard.press("ArrowDown");
    expect(await box.getAttribute("aria-activedescendant")).toBe("site-search-suggestions-0");
    expect(await options.nth(0).getAttribute("aria-selected")).toBe("true");
    await page.keyboard.press("ArrowDown");
    expect(await box.getAttribute("aria-activedescendant")).toBe("site-search-suggestions-1");
    expect(await options.nth(0).getAttribute("aria-selected")).toBe("false");
    await page.keyboard.press("ArrowUp");
    expect(await box.getAttribute("aria-activedescendant")).toBe("site-search-suggestions-0");
    await page.screenshot({ path: screenshotPath("search-typeahead") });

    // Escape closes the list; Enter then searches for the words as typed.
    await page.keyboard.press("Escape");
    expect(await box.getAttribute("aria-expanded")).toBe("false");
    expect(await box.getAttribute("aria-activedescendant")).toBeNull();
    await page.keyboard.press("Enter");
    await page.waitForURL("**/search?q=battery+box+under+the+settee");
    await page.getByRole("heading", { level: 1, name: /matching “battery box under the settee”/ }).waitFor();
    const titles = await resultTitles(page);
    expect(titles[0]).toBe("Group 27 battery moved under the starboard settee");
    expect(titles).toContain("Correcting a starboard list by moving the second battery to the port berth (Mk II)");
    expect(await page.locator("main mark").count()).toBeGreaterThan(2);
  });

  it("opens a suggestion with Enter", async () => {
    const box = page.locator("#search-words");
    await box.fill("");
    await box.pressSequentially("lazar", { delay: 20 });
    await page.locator("#search-words-suggestions").waitFor({ state: "visible" });
    const labels = await page.locator("#search-words-suggestions").getByRole("option").allTextContents();
    const index = labels.indexOf("SpaceLazarette (stern locker)");
    expect(index).toBeGreaterThanOrEqual(0);
    for (let i = 0; i <= index; i++) await page.keyboard.press("ArrowDown");
    await page.keyboard.press("Enter");
    await page.waitForURL("**/spaces/lazarette");
    await page.goBack();
    await page.waitForURL("**/search?q=battery+box+under+the+settee");
  });

  it("narrows by system and by hull", async () => {
    await page.locator("aside").getByRole("link", { name: /^Electrical \(\d+\)$/ }).click();
    await page.waitForURL(/system=electrical/);
    for (const card of await page.locator("main article").all()) {
      expect(await card.getByRole("link", { name: "Electrical" }).count()).toBe(1);
    }
    await page.getByText("My hull, and what must fit").click();
    await page.getByLabel("Applies to hull").fill("147");
    await page.getByRole("button", { name: "Apply" }).click();
    await page.waitForURL(/hull=147/);
    // A client navigation: the address changes before the new results are drawn.
    await expect.poll(() => page.getByRole("list", { name: "Narrowed by" }).textContent()).toMatch(/Applies to hull 147/);
    const titles = await resultTitles(page);
    // Hull 147 is a Mk I: the Mk II write-up goes, the one for hulls 120-298 stays.
    expect(titles).toContain("Group 27 battery moved under the starboard settee");
    expect(titles).not.toContain("Correcting a starboard list by moving the second battery to the port berth (Mk II)");
    expect(await page.getByRole("list", { name: "Narrowed by" }).textContent()).toMatch(/System: Electrical.*Applies to hull 147/);
    await page.screenshot({ path: screenshotPath("search-narrowed"), fullPage: true });
  });

  it("pages through the results", async () => {
    await page.locator("aside").getByRole("link", { name: "Any system" }).click();
    await page.waitForURL((u) => !u.search.includes("system="));
    const box = page.locator("#search-words");
    await box.fill("settee");
    await box.press("Enter");
    await page.waitForURL(/q=settee.*hull=147|hull=147.*q=settee/);
    const summary = page.locator("#search-summary");
    await expect.poll(() => summary.textContent()).toMatch(/results, 1–10 shown \(page 1 of \d\)/);
    const first = await resultTitles(page);
    await page.getByRole("link", { name: "Next page" }).click();
    await page.waitForURL(/page=2/);
    await expect.poll(() => summary.textContent()).toMatch(/11–\d+ shown \(page 2 of \d\)/);
    const second = await resultTitles(page);
    expect(second.length).toBeGreaterThan(0);
    expect(second.filter((t) => first.includes(t))).toEqual([]);
    await page.screenshot({ path: screenshotPath("search-page-2"), fullPage: true });
    await page.getByRole("link", { name: "Previous page" }).click();
    await page.waitForURL((u) => !u.search.includes("page="));
    await expect.poll(() => resultTitles(page)).toEqual(first);
  });

  it("shows markup in a write-up as text, in the snippet and the title", async () => {
    await page.goto(`${BASE_URL}/search?q=hostile+hatch`);
    const card = page.locator("main article", { hasText: "Hostile hatch" }).first();
    await card.waitFor();
    expect(await card.locator("script, img, svg").count()).toBe(0);
    expect(await card.textContent()).toContain("<img src=x onerror=");
    expect(await page.evaluate(() => (window as unknown as { __hit?: number }).__hit)).toBeUndefined();
    const api = await (await fetch(`${BASE_URL}/api/search?q=hostile+hatch`)).json() as { results: { url: string; snippet: string }[] };
    const hit = api.results.find((r) => r.url === `/writeups/${HOSTILE_SLUG}`)!;
    expect(hit.snippet).not.toMatch(/<(?!\/?mark>)/);
    await page.screenshot({ path: screenshotPath("search-markup-as-text") });
  });

  it("shows what the correction finds; the words as typed explain the syntax and offer the correction", async () => {
    await page.goto(`${BASE_URL}/search?q=chianplates`);
    await page.getByText("Showing results for chainplates.").waitFor();
    expect(await resultTitles(page)).toContain("Chainplates pulled, one replaced, all re-bedded in butyl; new shrouds");
    await page.getByRole("link", { name: "chianplates" }).click();
    await page.waitForURL("**/search?q=chianplates&typed=1");
    await page.getByText("Nothing published matches that search yet.").waitFor();
    await page.getByRole("heading", { name: "How to search" }).waitFor();
    await page.locator("main").getByRole("link", { name: "chainplates" }).click();
    await page.waitForURL("**/search?q=chainplates");
    await expect.poll(() => resultTitles(page)).toContain("Chainplates pulled, one replaced, all re-bedded in butyl; new shrouds");
    expect(errors).toEqual([]);
  });
});

describe("without JavaScript", () => {
  let context: BrowserContext;
  let page: Page;
  beforeEach(keepEvidenceOnFailure("search", () => page));
  beforeAll(async () => {
    context = await browser.newContext({ viewport: { width: 1280, height: 900 }, javaScriptEnabled: false });
    page = await context.newPage();
    watch(page);
  });
  afterAll(async () => context?.close());

  it("searches, narrows by system and hull, and pages through with the plain form and links", async () => {
    await page.goto(BASE_URL);
    const box = page.locator("#site-search");
    expect(await box.getAttribute("role")).toBeNull();
    await box.fill("battery box under the settee");
    await box.press("Enter");
    await page.waitForURL("**/search?q=battery+box+under+the+settee");
    expect((await resultTitles(page))[0]).toBe("Group 27 battery moved under the starboard settee");

    await page.locator("aside").getByRole("link", { name: /^Electrical \(\d+\)$/ }).click();
    await page.waitForURL(/system=electrical/);
    await page.getByText("My hull, and what must fit").click();
    await page.getByLabel("Applies to hull").fill("mk1");
    await page.getByRole("button", { name: "Apply" }).click();
    await page.waitForURL(/hull=mk1/);
    const titles = await resultTitles(page);
    expect(titles).toContain("Group 27 battery moved under the starboard settee");
    expect(titles).not.toContain("Correcting a starboard list by moving the second battery to the port berth (Mk II)");

    await page.locator("aside").getByRole("link", { name: "Any system" }).click();
    await page.locator("#search-words").fill("settee");
    await page.getByRole("button", { name: "Search", exact: true }).last().click();
    await page.waitForURL(/q=settee/);
    const first = await resultTitles(page);
    await page.getByRole("link", { name: "Next page" }).click();
    await page.waitForURL(/page=2/);
    const second = await resultTitles(page);
    expect(second.length).toBeGreaterThan(0);
    expect(second.filter((t) => first.includes(t))).toEqual([]);
    await page.screenshot({ path: screenshotPath("search-without-javascript"), fullPage: true });
    expect(errors).toEqual([]);
  });
});
