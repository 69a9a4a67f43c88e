// The search page on a phone (390 x 844, a common phone's CSS viewport) when something in the
// search cannot be read or gives nothing: the message stands beside the field it is about and the
// rest of the search still shows; a page past the last; punctuation alone; the jump to the filters.
import type { Browser, BrowserContext, Page } from "playwright-core";
import { afterAll, beforeAll, beforeEach, describe, expect, it } from "vitest";
import { BASE_URL, keepEvidenceOnFailure, launchBrowser, screenshotPath } from "../support/browser";

let browser: Browser;
let context: BrowserContext;
let page: Page;
const errors: string[] = [];

beforeAll(async () => {
  browser = await launchBrowser();
  context = await browser.newContext({ viewport: { width: 390, height: 844 } });
  page = await context.newPage();
  page.on("pageerror", (e) => errors.push(e.message));
});
afterAll(async () => {
  await context?.close();
  await browser?.close();
});
beforeEach(keepEvidenceOnFailure("search-page-messages", () => page));

const resultTitles = () => page.locator("main section[aria-labelledby^='group-'] article h3").allTextContents();

describe("the search page on a phone", () => {
  it("marks a hull it cannot read beside the field, keeps what was typed, and still shows the results", async () => {
    await page.goto(`${BASE_URL}/search?q=battery`);
    const all = await resultTitles();
    expect(all.length).toBeGreaterThan(0);

    await page.goto(`${BASE_URL}/search?q=battery&hull=999`);
    const hull = page.locator("#search-hull");
    await expect.poll(() => hull.getAttribute("aria-invalid")).toBe("true");
    expect(await hull.inputValue()).toBe("999");
    const message = page.locator("#search-hull-error");
    expect(await message.textContent()).toMatch(/^There is no hull 999: the class's hulls are numbered 1 to 612\./);
    // The message is right under the field, in view with it.
    const [field, under] = [await hull.boundingBox(), await message.boundingBox()];
    expect(under!.y - (field!.y + field!.height)).toBeLessThan(16);
    expect(await page.locator("#search-left-out").textContent()).toContain("This search is for every hull");
    expect(await resultTitles()).toEqual(all);
    await page.screenshot({ path: screenshotPath("search-phone-hull-999"), fullPage: false });

    // Correcting it in the same form narrows the search.
    // Hydrated (the words field becomes the type-ahead's combobox) before typing.
    await expect.poll(() => page.locator("#search-words").getAttribute("role")).toBe("combobox");
    await hull.fill("298-120");
    await Promise.all([page.waitForURL(/hull=298-120/), page.getByRole("button", { name: "Apply" }).click()]);
    await expect.poll(() => page.locator("#search-hull").getAttribute("aria-invalid")).toBeNull();
    expect(await page.locator("ul[aria-label='Narrowed by']").textContent()).toContain("Applies to hulls 120–298");
  });

  it("marks a size it cannot read beside the 'must fit' field", async () => {
    await page.goto(`${BASE_URL}/search?q=battery&fit=13+by+seven&unit=in`);
    const fit = page.locator("#search-fit");
    expect(await fit.getAttribute("aria-invalid")).toBe("true");
    expect(await fit.inputValue()).toBe("13 by seven");
    expect(await page.locator("#search-fit-error").textContent()).toBe('Enter 3 sizes separated by "x", like 13 x 7 x 9 1/2 in.');
    expect((await resultTitles()).length).toBeGreaterThan(0);
    await page.screenshot({ path: screenshotPath("search-phone-fit-bad"), fullPage: false });
  });

  it("says there is no page 5 of 2, with links to the last and the first", async () => {
    await page.goto(`${BASE_URL}/search?q=battery&page=50`);
    const box = page.locator("#search-beyond");
    expect(await box.textContent()).toMatch(/There is no page 50: these results have \d+ pages?\./);
    expect(await page.locator("#search-summary").count()).toBe(0);
    await page.screenshot({ path: screenshotPath("search-phone-page-beyond"), fullPage: false });
    await Promise.all([page.waitForURL((u) => !u.searchParams.has("page")), box.getByRole("link", { name: "Go to the first page" }).click()]);
    expect(await page.locator("#search-summary").textContent()).toContain("(page 1 of");
  });

  it("does not list everything for punctuation alone", async () => {
    await page.goto(`${BASE_URL}/search?q=!!!`);
    expect(await page.locator("#search-no-words").textContent()).toContain("There is nothing to look for in “!!!”: a search needs a word.");
    expect(await resultTitles()).toEqual([]);
    await page.screenshot({ path: screenshotPath("search-phone-punctuation"), fullPage: false });
  });

  it("names the systems there are beside the system filter when the one asked for is not one", async () => {
    await page.goto(`${BASE_URL}/search?q=battery&system=nope`);
    expect((await resultTitles()).length).toBeGreaterThan(0);
    const jump = page.locator("#search-jump-narrow");
    expect(await jump.isVisible()).toBe(true);
    await jump.click();
    const error = page.locator("#search-system-error");
    await expect.poll(async () => {
      const b = await error.boundingBox();
      return b !== null && b.y >= 0 && b.y < 844;
    }).toBe(true);
    expect(await error.textContent()).toContain("There is no system “nope”. The systems are:");
    expect(await error.getByRole("link", { name: "Electrical" }).count()).toBe(1);
    await page.screenshot({ path: screenshotPath("search-phone-system-nope"), fullPage: false });
  });

  it("shows what 'did you mean' finds when the words as typed find nothing", async () => {
    await page.goto(`${BASE_URL}/search?q=chianplates`);
    const note = page.locator("#search-corrected");
    expect(await note.textContent()).toBe("Showing results for chainplates. Search for chianplates instead.");
    expect((await resultTitles()).length).toBeGreaterThan(0);
    await page.screenshot({ path: screenshotPath("search-phone-corrected"), fullPage: false });
    await Promise.all([page.waitForURL(/typed=1/), note.getByRole("link", { name: "chianplates" }).click()]);
    // A client navigation: the URL changes before the new page is drawn.
    await expect.poll(() => page.getByText("Did you mean").count()).toBe(1);
    expect(await page.locator("#search-corrected").count()).toBe(0);
  });

  it("offers the filters from beside the count, in the first screen of results", async () => {
    await page.goto(`${BASE_URL}/search?q=battery&hull=318`);
    expect(await page.locator("ul[aria-label='Narrowed by']").textContent()).toContain("Applies to hull 318");
    const jump = page.locator("#search-jump-narrow");
    const box = await jump.boundingBox();
    expect(box!.y + box!.height).toBeLessThan(844 * 1.5); // within about a screen and a half of the top, not after every result
    await jump.scrollIntoViewIfNeeded();
    await page.screenshot({ path: screenshotPath("search-phone-jump-link"), fullPage: false });
    await jump.click();
    await expect.poll(async () => (await page.locator("#narrow h2").boundingBox())?.y ?? -1).toBeLessThan(100);
    expect(await page.locator("#narrow h2").boundingBox()).not.toBeNull();
    await page.screenshot({ path: screenshotPath("search-phone-after-jump"), fullPage: false });
  });

  it("on a desktop, shows the message under the hull field and a quoted query quoted once", async () => {
    const desk = await browser.newContext({ viewport: { width: 1280, height: 900 } });
    try {
      const p = await desk.newPage();
      p.on("pageerror", (e) => errors.push(e.message));
      await p.goto(`${BASE_URL}/search?q=%22house+battery%22&hull=999`);
      expect(await p.locator("h1").textContent()).toBe("Write-ups, spaces and items matching “house battery”");
      await p.screenshot({ path: screenshotPath("search-desk-hull-999-quoted"), fullPage: false });
      const [field, message] = [await p.locator("#search-hull").boundingBox(), await p.locator("#search-hull-error").boundingBox()];
      expect(message!.y - (field!.y + field!.height)).toBeLessThan(16);
      expect(Math.abs(message!.x - field!.x)).toBeLessThan(2);
    } finally {
      await desk.close();
    }
  });

  it("raised no script error", () => {
    expect(errors).toEqual([]);
  });
});
