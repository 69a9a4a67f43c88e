import fs from "node:fs";
import os from "node:os";
import path from "node:path";
import type { Browser, BrowserContext, Page } from "playwright-core";
import sharp from "sharp";
import { afterAll, beforeAll, beforeEach, describe, expect, it } from "vitest";
import { signInAs } from "../support/auth";
import { BASE_URL, keepEvidenceOnFailure, launchBrowser, screenshotPath } from "../support/browser";
import { expectedUpright, hullRangeOf, mainForFit, readSeedSpaces } from "../support/seed-spaces";

let browser: Browser;
const errors: string[] = [];

function watch(page: Page) {
  page.on("pageerror", (e) => errors.push(e.message));
  page.on("console", (m) => { if (m.type() === "error" && !m.text().startsWith("Failed to load resource")) errors.push(m.text()); });
  page.on("response", (r) => { if (r.status() >= 400 && r.request().resourceType() !== "document") errors.push(`${r.status()} ${r.url()}`); });
}

beforeAll(async () => {
  browser = await launchBrowser();
});
afterAll(async () => browser?.close());

// BCI group size chart: group 31 is 13 x 6 13/16 x 9 7/16 in; upright, 1/2 in clear all round.
const expected = expectedUpright({ lengthIn: 13, widthIn: 6 + 13 / 16, heightIn: 9 + 7 / 16 }, 0.5);

describe("a new owner looking for room for a group 31 battery", () => {
  let context: BrowserContext;
  let page: Page;
  beforeEach(keepEvidenceOnFailure("fit", () => page));
  beforeAll(async () => {
    context = await browser.newContext({ viewport: { width: 1280, height: 900 } });
    page = await context.newPage();
    watch(page);
  });
  afterAll(async () => context?.close());

  it("finds every space that takes it upright with 1/2 in clearance, and which openings are too small", async () => {
    const apiCalls: string[] = [];
    page.on("request", (r) => { if (new URL(r.url()).pathname.startsWith("/api/fit")) apiCalls.push(r.url()); });
    await page.goto(BASE_URL);
    await page.getByRole("link", { name: "Will it fit?" }).click();
    await page.waitForURL("**/fit");
    await page.getByRole("heading", { level: 1, name: "Will it fit?" }).waitFor();

    await page.getByLabel("From the catalogue").selectOption({ label: "Battery, BCI group 31" });
    expect(await page.getByLabel("Length").inputValue()).toBe("13");
    expect(await page.getByLabel("Width").inputValue()).toBe("6 13/16");
    expect(await page.getByLabel("Height").inputValue()).toBe("9 7/16");
    const upright = page.getByLabel("Must stay upright");
    expect(await upright.isChecked()).toBe(true);
    expect(await upright.isDisabled()).toBe(true);

    await page.getByLabel("Clearance on every side").pressSequentially("1/2");
    const cards = page.locator("[data-testid=fit-results] > li");
    await page.waitForFunction(
      (n) => document.querySelectorAll("[data-testid=fit-results] > li").length === n && !document.querySelector("[aria-busy=true]"),
      expected.length,
    );
    expect(apiCalls.length).toBeGreaterThan(0); // the results came from the API, as the owner typed

    const shown = await cards.evaluateAll((els) => els.map((el) => ({ slug: el.getAttribute("data-space"), verdict: el.getAttribute("data-verdict") })));
    expect(shown.map((s) => s.slug).sort()).toEqual(expected.map((e) => e.slug).sort());
    const tooSmall = expected.filter((e) => e.throughOpening === false);
    expect(tooSmall.length).toBeGreaterThan(0);
    for (const e of expected) {
      const card = page.locator(`[data-space="${e.slug}"]`);
      expect(await card.getAttribute("data-verdict"), e.slug).toBe(e.throughOpening === false ? "opening-too-small" : "fits");
      if (e.throughOpening === false) {
        expect(await card.textContent()).toContain("The opening must be enlarged.");
        // Say that the opening was checked with the clearance, which the owner may not need there.
        expect(await card.textContent()).toContain("It is checked for the item with your 1/2 in on each side");
      }
      expect(await card.textContent()).toContain("(your 1/2 in on each side comes out of this)");
    }
    // Those that fit outright come before those that need the opening enlarged.
    const firstTooSmall = shown.findIndex((s) => s.verdict === "opening-too-small");
    expect(shown.slice(firstTooSmall).every((s) => s.verdict === "opening-too-small")).toBe(true);
    expect(await page.locator("#fit-summary").textContent()).toContain(`${expected.length} spaces take it; in ${tooSmall.length} of them the opening must be enlarged first`);
    // Each answer comes with a drawing from above and from the side, and the battery cautions.
    expect(await cards.first().locator("svg[role=img]").count()).toBe(2);
    await page.getByRole("heading", { name: "Before you start" }).waitFor();
    expect(await page.getByText("33 CFR 183.420", { exact: false }).count()).toBeGreaterThan(0);
    await page.screenshot({ path: screenshotPath("fit-group-31"), fullPage: true });
  });

  it("narrows to the spaces of their own hull, and switches to millimetres", async () => {
    await page.getByLabel("Your hull number").pressSequentially("402");
    const mk2 = expected.filter((e) => {
      const [from, to] = hullRangeOf(readSeedSpaces().find((s) => s.slug === e.slug)!.appliesTo);
      return from <= 402 && 402 <= to;
    });
    expect(mk2.length).toBeLessThan(expected.length);
    await page.waitForFunction(
      (n) => document.querySelectorAll("[data-testid=fit-results] > li").length === n && !document.querySelector("[aria-busy=true]"),
      mk2.length,
    );
    await page.getByRole("link", { name: "millimetres" }).click();
    await page.waitForURL(/unit=mm/);
    await page.waitForFunction(() => (document.getElementById("fit-length") as HTMLInputElement | null)?.value === "330");
    expect(await page.locator("[data-testid=fit-results] > li").count()).toBe(mk2.length);
    expect(await page.locator("[data-testid=fit-results]").textContent()).toMatch(/\d+ mm fore and aft/);
  });

  it("opens a space whose opening is too small and reads its measurements", async () => {
    const slug = expected.find((e) => e.throughOpening === false && readSeedSpaces().find((s) => s.slug === e.slug)!.appliesTo === "all")!.slug;
    await page.goto(`${BASE_URL}/fit?item=bci-group-31&clearance=1/2`);
    await page.locator(`[data-space="${slug}"] h3 a`).click();
    await page.waitForURL(`**/spaces/${slug}`);
    const space = readSeedSpaces().find((s) => s.slug === slug)!;
    await page.getByRole("heading", { level: 1, name: space.name }).waitFor();
    expect(await page.locator("#measurements tbody tr").count()).toBe(space.measurements!.length);
    await page.getByRole("rowheader", { name: "Consensus (median)" }).waitFor();
    expect(await page.locator("svg[role=img]").count()).toBe(2);
    const fits = page.getByRole("heading", { name: "What fits here" });
    await fits.waitFor();
    await page.screenshot({ path: screenshotPath("space-page"), fullPage: true });
  });

  it("sees the register of spaces by zone, filtered by hull", async () => {
    await page.goto(BASE_URL);
    await page.getByRole("link", { name: "Spaces", exact: true }).click();
    // The address changes before the new page has rendered: wait for what the owner reads, not for the URL.
    await page.waitForURL("**/spaces");
    await page.getByRole("heading", { level: 1, name: "Hidden spaces" }).waitFor();
    const seed = readSeedSpaces();
    await expect.poll(() => page.locator("main section li > a").allTextContents().then((n) => n.length)).toBe(seed.length);
    expect(await page.locator("main li a").filter({ hasText: seed[0].name }).count()).toBe(1);
    await page.getByLabel("Your hull number").fill("61");
    await page.getByRole("button", { name: "Show" }).click();
    await page.waitForURL(/hull=61/);
    const onHull61 = seed.filter((s) => {
      const [from, to] = hullRangeOf(s.appliesTo);
      return from <= 61 && 61 <= to;
    });
    expect(onHull61.length).toBeLessThan(seed.length);
    // A hull range may be written with a hyphen or an en dash ("hulls 1-119", "hulls 1–119").
    const dashes = (names: string[]) => names.map((n) => n.replace(/–/g, "-")).sort();
    await expect.poll(async () => dashes(await page.locator("main section li > a").allTextContents()))
      .toEqual(dashes(onHull61.map((s) => s.name)));
  });

  it("on a phone, 'Show the spaces' brings the answer into view", async () => {
    const phone = await browser.newPage({ viewport: { width: 390, height: 844 } });
    await phone.goto(`${BASE_URL}/fit`);
    await phone.waitForSelector("form[aria-label='The item to fit']");
    await phone.waitForFunction(() => Boolean((window as { __reactRouterRouteModules?: unknown }).__reactRouterRouteModules));
    await phone.getByLabel("From the catalogue").selectOption({ label: "Battery, BCI group 31" });
    await phone.getByRole("button", { name: "Show the spaces" }).click();
    await phone.waitForURL(/item=bci-group-31/);
    const heading = phone.getByRole("heading", { level: 2, name: "Where it fits" });
    await expect.poll(async () => {
      const box = await heading.boundingBox();
      return box !== null && box.y >= 0 && box.y < 844;
    }).toBe(true);
    await phone.screenshot({ path: screenshotPath("fit-phone-answer"), fullPage: false });
    await phone.close();
  });

  it("on a phone, a battery's cautions come before the list of spaces", async () => {
    const phone = await browser.newPage({ viewport: { width: 390, height: 844 } });
    watch(phone);
    await phone.goto(`${BASE_URL}/fit?item=bci-group-31`);
    await phone.locator("[data-testid=fit-results] > li").first().waitFor();
    // 33 CFR 183.420: secure it, vent its hydrogen, never directly above or below a fuel tank.
    const cautions = phone.getByRole("complementary", { name: "Before you start" });
    expect(await cautions.textContent()).toContain("never place a battery directly above or below a fuel tank");
    // The wiring caution tells the ceiling (33 CFR 183.455(c): 150 % of the ampacity) from the fuse to fit.
    expect(await cautions.textContent()).toContain("Its rating may never exceed what the conductor allows (150 % of its ampacity under 50 V)");
    expect(await cautions.textContent()).toContain("pick a rating at or just above what the load draws (common practice)");
    const cautionsTop = (await cautions.boundingBox())!.y;
    const firstSpaceTop = (await phone.locator("[data-testid=fit-results] > li").first().boundingBox())!.y;
    const headingTop = (await phone.getByRole("heading", { level: 2, name: "Where it fits" }).boundingBox())!.y;
    expect(cautionsTop).toBeGreaterThan(headingTop);
    expect(cautionsTop).toBeLessThan(firstSpaceTop);
    expect(await phone.getByRole("complementary", { name: "Before you start" }).count()).toBe(1);
    await phone.screenshot({ path: screenshotPath("fit-phone-battery-cautions"), fullPage: true, clip: { x: 0, y: headingTop, width: 390, height: 844 } });

    // Something that is not a battery keeps its one caution (weight) after the list.
    await phone.goto(`${BASE_URL}/fit?length=20&width=10&height=8`);
    await phone.locator("[data-testid=fit-results] > li").first().waitFor();
    const weightOnly = phone.getByRole("complementary", { name: "Before you start" });
    expect(await weightOnly.textContent()).not.toContain("fuel tank");
    const lastSpaceTop = (await phone.locator("[data-testid=fit-results] > li").last().boundingBox())!.y;
    expect((await weightOnly.boundingBox())!.y).toBeGreaterThan(lastSpaceTop);
    await phone.close();
  });

  it("on a phone, 'Show the spaces' with several slips marks each field with its own message", async () => {
    const phone = await browser.newPage({ viewport: { width: 390, height: 844 } });
    watch(phone);
    await phone.goto(`${BASE_URL}/fit`);
    await phone.waitForSelector("form[aria-label='The item to fit']");
    await phone.waitForFunction(() => Boolean((window as { __reactRouterRouteModules?: unknown }).__reactRouterRouteModules));
    await phone.getByLabel("Length").fill("13");
    await phone.getByLabel("Width").fill("seven");
    await phone.getByLabel("Your hull number").fill("999");
    // While typing, the word and the hull are marked at once; the height is not asked for yet.
    await phone.locator("#fit-width-error").waitFor();
    await phone.locator("#fit-hull-error").waitFor();
    expect(await phone.locator("#fit-height-error").count()).toBe(0);
    await phone.getByRole("button", { name: "Show the spaces" }).click();
    await phone.waitForURL(/hull=999/);
    await phone.locator("#fit-height-error").waitFor();
    // The demo class has hulls 1 to 612 (product brief).
    expect(await phone.locator("#fit-width-error").textContent()).toMatch(/Could not read "seven" as a length/);
    expect(await phone.locator("#fit-height-error").textContent()).toBe("Enter the height, e.g. 13 or 13 1/2.");
    expect(await phone.locator("#fit-hull-error").textContent()).toBe("Must be a whole number from 1 to 612.");
    expect(await phone.locator("main [aria-invalid=true]").evaluateAll((els) => els.map((e) => e.id))).toEqual(["fit-width", "fit-height", "fit-hull"]);
    expect(await phone.getByText("Correct the 3 fields marked above to see the spaces.").count()).toBe(1);
    // Nothing typed is lost, and the page goes to the first field marked rather than to an empty answer.
    expect(await phone.evaluate(() => document.activeElement?.id)).toBe("fit-width");
    expect(await phone.getByLabel("Width").inputValue()).toBe("seven");
    expect(await phone.getByLabel("Your hull number").inputValue()).toBe("999");
    const widthError = (await phone.locator("#fit-width-error").boundingBox())!;
    await phone.locator("#fit-width").scrollIntoViewIfNeeded();
    await phone.screenshot({ path: screenshotPath("fit-phone-three-slips"), fullPage: false });
    expect(widthError.height).toBeGreaterThan(0);

    // The same address opened directly marks the same three fields (no script needed to see them).
    await phone.goto(`${BASE_URL}/fit?unit=in&item=&length=13&width=seven&height=&clearance=&count=1&hull=999`);
    expect(await phone.locator("main [aria-invalid=true]").evaluateAll((els) => els.map((e) => e.id))).toEqual(["fit-width", "fit-height", "fit-hull"]);

    // An empty form asks for the three sizes beside them when the button is pressed.
    await phone.goto(`${BASE_URL}/fit`);
    await phone.waitForFunction(() => Boolean((window as { __reactRouterRouteModules?: unknown }).__reactRouterRouteModules));
    expect(await phone.locator("main [aria-invalid=true]").count()).toBe(0);
    await phone.getByRole("button", { name: "Show the spaces" }).click();
    await phone.locator("#fit-length-error").waitFor();
    expect(await phone.locator("main [aria-invalid=true]").evaluateAll((els) => els.map((e) => e.id))).toEqual(["fit-length", "fit-width", "fit-height"]);
    await expect.poll(() => phone.evaluate(() => document.activeElement?.id)).toBe("fit-length");
    await phone.close();
  });

  it("logged no errors in the browser", () => {
    expect(errors).toEqual([]);
  });
});

describe("a member adding a measurement from a phone", () => {
  it("signs in, gets errors beside the fields, and adds a measurement that keeps the consensus", async () => {
    const context = await browser.newContext({ viewport: { width: 390, height: 844 }, isMobile: true, hasTouch: true });
    const page = await context.newPage();
    watch(page);
    try {
      const space = readSeedSpaces().find((s) => s.slug === "port-settee-aft-mk2")!;
      const member = "gareth.lindqvist@example.com"; // invented demo member, hull 402 (content-seed/members.yaml)
      await signInAs(page, member);
      await page.goto(`${BASE_URL}/spaces/${space.slug}`);
      await page.getByRole("heading", { name: "Add your measurement" }).waitFor();
      const rowsBefore = await page.locator("#measurements tbody tr").count();
      expect(rowsBefore).toBe(space.measurements!.length);

      // The consensus as it stands, typed back in (adding the median keeps the median).
      const main = mainForFit(space);
      const typed = (inches: number) => `${Number(inches.toFixed(4))} in`;
      // This member reads millimetres (members.yaml): type inches with their unit, as one would.
      await page.getByLabel("Length (fore and aft)").fill(typed(main.lengthIn));
      await page.getByLabel("Width (athwartships)").fill("fourteen");
      await page.getByLabel("Height").fill(typed(main.heightIn));
      await page.getByLabel("Story stick").check();
      expect(await page.getByLabel("Hull number of the boat measured").inputValue()).toBe("402");
      await page.getByRole("button", { name: "Add my measurement" }).click();
      // The mistake is shown beside its field; what was typed stays.
      const widthError = page.locator("#add-measurement [role=alert]").filter({ hasText: "Could not read" });
      await widthError.waitFor();
      expect(await page.getByLabel("Length (fore and aft)").inputValue()).toBe(typed(main.lengthIn));
      expect(await page.getByLabel("Width (athwartships)").getAttribute("aria-invalid")).toBe("true");
      await page.screenshot({ path: screenshotPath("measurement-phone-error"), fullPage: false });

      await page.getByLabel("Width (athwartships)").fill(typed(main.widthIn));
      // A photo of the tape in place (a plain test image).
      const photo = path.join(os.tmpdir(), `measurement-${process.pid}.jpg`);
      fs.writeFileSync(photo, await sharp({ create: { width: 800, height: 600, channels: 3, background: { r: 120, g: 130, b: 140 } } }).jpeg().toBuffer());
      await page.getByLabel("A photo (optional)").setInputFiles(photo);
      await page.getByRole("button", { name: "Add my measurement" }).click();
      await page.getByText("Thank you: your measurement is added").waitFor();
      expect(await page.locator("#measurements tbody tr").count()).toBe(rowsBefore + 1);
      const lastRow = await page.locator("#measurements tbody tr").last().textContent();
      expect(lastRow).toContain("Story stick");
      expect(lastRow).toContain("402");
      // The row lays out its photo once for a phone and once for a wide screen: the one shown here.
      const thumb = page.locator("#measurements tbody tr").last().locator('img[src^="/media/photos/"]:visible');
      await thumb.scrollIntoViewIfNeeded();
      await expect.poll(() => thumb.evaluate((img: HTMLImageElement) => img.complete && img.naturalWidth > 0)).toBe(true);
      // This member reads millimetres; the consensus length is unchanged: 28.745 in x 25.4 = 730.1 mm (by hand).
      const consensus = await page.locator("#measurements tfoot tr").first().textContent();
      expect(consensus).toContain(`${Math.round(main.lengthIn * 25.4)} mm`);
      await page.screenshot({ path: screenshotPath("measurement-phone"), fullPage: true });
      // Nothing is wider than the phone's screen.
      const overflow = await page.evaluate(() => document.documentElement.scrollWidth - window.innerWidth);
      expect(overflow).toBeLessThanOrEqual(0);
    } finally {
      await context.close();
    }
    expect(errors).toEqual([]);
  });
});
