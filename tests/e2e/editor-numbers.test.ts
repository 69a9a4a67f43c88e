// Numbers for readers: the author works out a cable run in the editor, sees the result, attaches
// it and sends the revision for review; the moderator sees it marked as new and publishes; readers
// then find it under the write-up with its cautions. A removal waits for review in the same way.
import type { Browser, Page } from "playwright-core";
import { afterAll, beforeAll, beforeEach, describe, expect, it } from "vitest";
import { signInAs, signOut } from "../support/auth";
import { BASE_URL, keepEvidenceOnFailure, launchBrowser, screenshotPath } from "../support/browser";

let browser: Browser;
let page: Page;
const SLUG = "trailer-bunks-keel-pad-and-lights"; // Hal's published write-up in the demo seed
const TITLE = "Trailer bunks rebuilt, keel pad reset, and new lights with a proper ground";
const LABEL = `Tow vehicle plug to the trailer lights ${Date.now()}`;

beforeAll(async () => {
  browser = await launchBrowser();
  page = await (await browser.newContext({ viewport: { width: 1280, height: 1000 } })).newPage();
});
beforeEach(keepEvidenceOnFailure("editor-numbers", () => page));
afterAll(async () => browser?.close());

describe("a cable run attached from the editor", () => {
  it("is worked out, shown, then attached; a wrong field says so beside it", async () => {
    await signInAs(page, "hal.dunmore@example.com");
    await page.goto(`${BASE_URL}/my/writeups`);
    await page.getByRole("link", { name: TITLE }).click();
    await page.getByRole("heading", { level: 1, name: "Edit your write-up" }).waitFor();
    await page.waitForSelector('form[id^="writeup-"][novalidate]', { state: "attached" });

    const form = page.getByRole("form", { name: "A cable run" });
    await form.getByLabel("What the run feeds").fill(LABEL);
    await form.getByLabel("Current").fill("six amps");
    await form.getByLabel("Run length, one way").fill("25");
    await form.getByRole("button", { name: "Work it out" }).click();
    await form.getByText("Enter the current in amps, e.g. 30.").waitFor();
    expect(await form.getByLabel("Current").getAttribute("aria-invalid")).toBe("true");

    await form.getByLabel("Current").fill("6");
    await form.getByRole("button", { name: "Work it out" }).click();
    // 10.75 × 6 A × 50 ft round trip / 0.36 V = 8,958 CM → 10 AWG by area (ABYC E-11 as reproduced), but
    // 10 AWG at 1.24 Ω per 1000 ft drops 0.372 V > 0.36 V, so 8 AWG (NEC Chapter 9 Table 8).
    const result = page.getByRole("region", { name: "The result, before you attach it" });
    await result.getByText("Use at least").waitFor();
    expect(await result.locator("[data-awg]").getAttribute("data-awg")).toBe("8");
    await page.screenshot({ path: screenshotPath("editor-numbers-preview"), fullPage: true });

    await form.getByRole("button", { name: "Attach to the write-up" }).click();
    await page.getByRole("list", { name: "Attached numbers" }).getByRole("listitem").filter({ hasText: LABEL }).waitFor();
  });

  it("a weight move is worked out with the class figures and drawn before it is attached", async () => {
    await page.getByLabel("a weight move").check();
    const form = page.getByRole("form", { name: "A weight move" });
    await form.getByLabel("What moves").fill("House battery");
    await form.getByLabel("Its weight").fill("62");
    await form.getByRole("group", { name: "Where it was" }).getByLabel("Aft of the bow").fill("135");
    await form.getByRole("group", { name: "Where it was" }).getByLabel("Off the centreline").fill("25");
    await form.getByRole("group", { name: "Where it goes" }).getByLabel("Aft of the bow").fill("135");
    await form.getByRole("group", { name: "Where it goes" }).getByLabel("Off the centreline").fill("25");
    await form.getByRole("button", { name: "Work it out" }).click();
    const result = page.getByRole("region", { name: "The result, before you attach it" });
    // tan θ = w·y / (Δ·GM) (ASTM F1321): 62 lb × 25 in / 12 over (2,850 + 62) lb × 2.8 ft (demo class figures) → 0.91°.
    await result.locator('[data-row="heel"] [data-when="after"]').getByText(/0\.9.*port/).waitFor();
    await result.locator("svg").first().waitFor();
    await page.screenshot({ path: screenshotPath("editor-numbers-weight-move"), fullPage: true });
    await page.getByLabel("a cable run").check();
  });

  it("waits for review: readers see it, with the cautions, once a moderator publishes the revision", async () => {
    const editorUrl = page.url();
    await page.goto(`${BASE_URL}/writeups/${SLUG}`);
    await page.getByRole("heading", { level: 1, name: TITLE }).waitFor();
    expect(await page.getByText(LABEL).count()).toBe(0);

    await page.goto(editorUrl);
    await page.getByRole("heading", { level: 1, name: "Edit your write-up" }).waitFor();
    await page.waitForSelector('form[id^="writeup-"][novalidate]', { state: "attached" });
    // The seeded 0.01 lb a connector comes back into the editor as "0 oz", which the form refuses
    // as no weight: the author types it as 0.16 oz (16 oz to the pound, NIST Handbook 44, Appendix C).
    await page.getByLabel("Part 5 weight").fill("0.16 oz");
    await page.getByRole("button", { name: "Send for review" }).click();
    await page.getByText("Sent to the moderators").waitFor();
    await signOut(page);

    await signInAs(page, "nora.pelling@example.org");
    await page.goto(`${BASE_URL}/review`);
    await page.getByRole("link", { name: TITLE }).click();
    await page.getByRole("heading", { level: 1, name: TITLE }).waitFor();
    const proposed = page.locator("#calculations");
    await proposed.getByRole("heading", { name: LABEL }).waitFor();
    await proposed.getByText("New in this revision").waitFor();
    await page.getByRole("list", { name: "Changes to the numbers" }).getByText(`Numbers added: ${LABEL}`).waitFor();
    await page.screenshot({ path: screenshotPath("editor-numbers-review"), fullPage: true });
    for (const box of await page.locator('input[name^="check."]').all()) await box.check();
    await page.getByRole("radio", { name: "Publish" }).check(); // the diff region is "Changes since the published revision"
    await page.getByRole("button", { name: "Record the decision" }).click();
    await page.getByText("The author has been e-mailed").waitFor();
    await signOut(page);

    await page.goto(`${BASE_URL}/writeups/${SLUG}`);
    const numbers = page.locator("#calculations");
    await numbers.getByRole("heading", { name: LABEL }).waitFor();
    expect(await numbers.locator('[data-calculation="cable-run"] [data-awg]').getAttribute("data-awg")).toBe("8");
    await numbers.getByText("Overcurrent protection and batteries").waitFor();
    await numbers.screenshot({ path: screenshotPath("editor-numbers-published") });
  });

  it("taken off in the editor, it stays on the published page until that revision is published", async () => {
    await signInAs(page, "hal.dunmore@example.com");
    await page.goto(`${BASE_URL}/my/writeups`);
    await page.getByRole("link", { name: TITLE }).click();
    await page.getByRole("heading", { level: 1, name: "Edit your write-up" }).waitFor();
    await page.waitForSelector('form[id^="writeup-"][novalidate]', { state: "attached" });
    await page.getByRole("button", { name: `Remove ${LABEL}` }).click();
    await page.getByText("Nothing attached yet.").waitFor();
    await page.goto(`${BASE_URL}/writeups/${SLUG}`);
    await page.locator("#calculations").getByRole("heading", { name: LABEL }).waitFor();
  });
});
