// The heel and cable calculators on a phone (390 x 844), as a new owner tries them without an
// account: the answer comes into view after the button, the fuse is not mistaken for the ceiling,
// a masthead run is taken, and the cautions hold only cautions.
import type { Browser, BrowserContext, Page } from "playwright-core";
import { afterAll, beforeAll, beforeEach, describe, expect, it } from "vitest";
import { BASE_URL, keepEvidenceOnFailure, launchBrowser, screenshotPath } from "../support/browser";

let browser: Browser;
let context: BrowserContext;
let page: Page;
const errors: string[] = [];
const PHONE = { width: 390, height: 844 };

beforeAll(async () => {
  browser = await launchBrowser();
  context = await browser.newContext({ viewport: PHONE, isMobile: true, hasTouch: true });
  page = await context.newPage();
  page.on("pageerror", (e) => errors.push(e.message));
  page.on("console", (m) => { if (m.type() === "error" && !m.text().startsWith("Failed to load resource")) errors.push(m.text()); });
  page.on("response", (r) => { if (r.status() >= 500) errors.push(`${r.status()} ${r.url()}`); });
});
beforeEach(keepEvidenceOnFailure("tools", () => page));
afterAll(async () => {
  await context?.close();
  await browser?.close();
});

async function openHydrated(path: string, h1: string) {
  await page.goto(`${BASE_URL}${path}`);
  await page.getByRole("heading", { level: 1, name: h1 }).waitFor();
  await page.waitForFunction(() => Boolean((window as { __reactRouterRouteModules?: unknown }).__reactRouterRouteModules));
}

/** The answer's heading is on the screen and has the focus (a screen reader reads on from it). */
async function expectAnswerInView(headingId: string) {
  await expect.poll(async () => {
    const box = await page.locator(`#${headingId}`).boundingBox();
    return box !== null && box.y >= 0 && box.y + box.height <= PHONE.height;
  }).toBe(true);
  expect(await page.evaluate(() => document.activeElement?.id)).toBe(headingId);
}

describe("the heel calculator on a phone", () => {
  it("says the displacement filled in is the light one, to which the owner adds what is aboard", async () => {
    await openHydrated("/tools/heel?unit=in", "Heel from a weight moved across");
    // Invented demo class: light displacement 2,850 lb (product brief).
    expect(await page.getByLabel("Displacement").inputValue()).toBe("2850 lb");
    const hint = await page.locator("#heel-displacement-hint").textContent();
    expect(hint).toMatch(/^Light displacement is filled in: add the crew, gear, water and fuel aboard/);
    expect(hint).not.toMatch(/As she floats, everything aboard/);
  });

  it("'Work it out' brings the answer into view", async () => {
    await page.getByLabel("Weight moved", { exact: true }).fill("62");
    await page.getByLabel("Moved across by").fill("51");
    const before = await page.locator("#heel-answer").boundingBox();
    expect(before!.y).toBeGreaterThan(PHONE.height); // below the form, off the screen
    await page.getByRole("button", { name: "Work it out" }).click();
    await page.waitForURL(/weight=62/);
    await page.locator("[data-heel-degrees]").waitFor();
    // tan θ = w·d / (Δ·GM) (ASTM F1321): 62 lb × 51/12 ft / (2850 lb × 2.8 ft) = 0.033020 → 1.891°.
    expect(Number(await page.locator("[data-heel-degrees]").getAttribute("data-heel-degrees"))).toBeCloseTo(
      (Math.atan((62 * 51) / 12 / (2850 * 2.8)) * 180) / Math.PI, 3,
    );
    await expectAnswerInView("heel-answer");
    await page.screenshot({ path: screenshotPath("tools-heel-phone-answer"), fullPage: false });
  });

  it("a slip stays beside its field, and the page does not jump away from it", async () => {
    await page.getByLabel("Weight moved", { exact: true }).fill("sixty");
    await page.getByRole("button", { name: "Work it out" }).click();
    await page.waitForURL(/weight=sixty/);
    await page.locator("#heel-weight-error").waitFor();
    // The field is brought to the middle of the screen and has the focus, its message under it.
    await expect.poll(async () => {
      const box = await page.locator("#heel-weight-error").boundingBox();
      return box !== null && box.y >= 0 && box.y + box.height <= PHONE.height;
    }).toBe(true);
    expect(await page.evaluate(() => document.activeElement?.id)).toBe("heel-weight");
    await page.screenshot({ path: screenshotPath("tools-heel-phone-slip"), fullPage: false });
    expect(await page.getByLabel("Moved across by").inputValue()).toBe("51");
  });

  it("keeps the note for developers out of the caution box", async () => {
    const caution = page.locator("aside").filter({ has: page.getByRole("heading", { name: "Weight and stability" }) });
    await caution.waitFor();
    expect(await caution.textContent()).not.toContain("/api/heel");
    expect(await page.locator("main").getByText("GET /api/heel").count()).toBe(1);
  });
});

describe("the cable calculator on a phone", () => {
  it("sizes a masthead light's run of 40 ft one way, and brings the answer into view", async () => {
    await openHydrated("/tools/cable?unit=in", "Cable for a DC run");
    await page.getByLabel("Current").fill("2");
    await page.getByLabel("Run length, one way").fill("40");
    await page.getByLabel("What it feeds (optional)").fill("Masthead light");
    await page.getByRole("button", { name: "Size the cable" }).click();
    await page.waitForURL(/current=2/);
    const answer = page.locator("[data-calculation=cable-run]");
    await answer.waitFor();
    await expectAnswerInView("cable-answer");
    await page.screenshot({ path: screenshotPath("tools-cable-phone-answer"), fullPage: false });
    // CM = 10.75 × 2 A × 80 ft / 0.36 V = 4,778 (ABYC E-11) → 12 AWG, 6,530 CM (NEC Ch. 9 Table 8);
    // 14 AWG: 2 × 3.14 × 80 / 1000 = 0.50 V > 0.36 V. Ampacity 45 A at 105 °C (33 CFR 183.425 Table 5).
    expect(await answer.locator("[data-awg]").getAttribute("data-awg")).toBe("12");
    expect(await answer.textContent()).toContain("4,778 CM");
  });

  it("tells the fuse to fit from the most the conductor may have", async () => {
    const row = page.locator("[data-calculation=cable-run] [data-row=overcurrent]");
    // 33 CFR 183.455(c): at most 150 % of 45 A = 67.5 A; near the load's 2 A is common practice.
    expect(await row.locator("[data-max-overcurrent]").getAttribute("data-max-overcurrent")).toBe("67.5");
    const text = (await row.textContent())!.replace(/\s+/g, " ");
    expect(text).toContain("at or just above what the load draws (2 A)");
    expect(text).toContain("(common practice)");
    expect(text).toContain("never above 67.5 A");
    expect(text).toContain("150 % of its 45 A (33 CFR 183.455(c))");
    expect(text).toContain("it is not the fuse to buy");
    expect(text).not.toMatch(/Largest fuse/);
    // What the sizes are sized against is said once; ABYC E-11 is named plainly.
    const answerText = await page.locator("[data-calculation=cable-run]").textContent();
    expect(answerText!.split("Marine SAE-sized cable has less copper").length - 1).toBe(1);
    expect(answerText).not.toContain("widely reproduced");
    await page.locator("[data-calculation=cable-run]").screenshot({ path: screenshotPath("tools-cable-phone-fuse") });
    // The note for developers is a line of its own at the end of the page, not in the answer or its cautions.
    expect(answerText).not.toContain("/api/cable");
    expect(await page.locator("section[aria-labelledby='cable-answer']").textContent()).not.toContain("/api/cable");
    expect(await page.locator("main").getByText("GET /api/cable").count()).toBe(1);
  });

  it("refuses a run past 100 ft beside the field, and keeps what was typed", async () => {
    await page.getByLabel("Run length, one way").fill("140");
    await page.getByRole("button", { name: "Size the cable" }).click();
    await page.waitForURL(/length=140/);
    await page.locator("#cable-length-error").filter({ hasText: "That is more than 100 ft (about 30 m) one way" }).waitFor();
    expect(await page.getByLabel("Current").inputValue()).toBe("2");
    expect(await page.getByLabel("What it feeds (optional)").inputValue()).toBe("Masthead light");
  });

  it("logged no errors in the browser", () => {
    expect(errors).toEqual([]);
  });
});
