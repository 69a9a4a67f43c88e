// A member on a phone measures one part of a space, corrects the measurement, then removes it;
// another member sees no way to change it. The space is left as the seed had it.
import type { Browser, BrowserContext, Page } from "playwright-core";
import { afterAll, beforeAll, beforeEach, describe, expect, it } from "vitest";
import { signInAs } from "../support/auth";
import { BASE_URL, keepEvidenceOnFailure, launchBrowser, screenshotPath } from "../support/browser";
import { readSeedSpaces } from "../support/seed-spaces";

let browser: Browser;
let context: BrowserContext | undefined;
let page: Page | undefined;
const errors: string[] = [];

beforeAll(async () => {
  browser = await launchBrowser();
});
afterAll(async () => browser?.close());

async function phone(): Promise<Page> {
  await context?.close();
  context = await browser.newContext({ viewport: { width: 390, height: 844 }, isMobile: true, hasTouch: true });
  page = await context.newPage();
  page.on("pageerror", (e) => errors.push(e.message));
  page.on("console", (m) => { if (m.type() === "error" && !m.text().startsWith("Failed to load resource")) errors.push(m.text()); });
  return page;
}

/** The form is hydrated when conform has set `novalidate` on it. */
async function hydrated(p: Page, formId: string) {
  await p.waitForFunction((id) => document.getElementById(id)?.hasAttribute("novalidate"), formId);
}

const SLUG = "anchor-locker";
const PART = "forward taper at the stem"; // its second section (content-seed/spaces.yaml)
const MEMBER = "hal.dunmore@example.com"; // invented demo member who reads inches (content-seed/members.yaml)

describe("a member corrects and removes a measurement on a phone", () => {
  beforeEach(keepEvidenceOnFailure("measurements", () => page));
  afterAll(async () => context?.close());

  it("measures the second part of a space; that part gets its own consensus", async () => {
    const space = readSeedSpaces().find((s) => s.slug === SLUG)!;
    expect(space.sections.length).toBeGreaterThan(1);
    const p = await phone();
    await signInAs(p, MEMBER);
    await p.goto(`${BASE_URL}/spaces/${SLUG}?unit=in`);
    await p.getByRole("heading", { level: 1, name: space.name }).waitFor();
    await hydrated(p, "measurement-form");
    // Nobody has measured this part in the seed.
    const part = p.getByRole("group", { name: new RegExp(PART, "i") });
    await part.getByText("Nobody has measured this part yet").waitFor();

    await p.getByLabel("Part of the space you measured").selectOption({ label: PART });
    await p.getByLabel("Length (fore and aft)").fill("5 1/4");
    await p.getByLabel("Width (athwartships)").fill("8");
    await p.getByLabel("Height").fill("9 in");
    await p.getByLabel("Tape", { exact: true }).check();
    await p.getByLabel("Hull number of the boat measured").fill("211");
    await p.getByRole("button", { name: "Add my measurement" }).click();
    await p.getByText("your measurement is added").waitFor();
    // One measurement: it is the consensus of that part (the median of one value is that value).
    expect(await part.locator("[data-consensus=length]").textContent()).toBe("5 1/4 in");
    // The main part's measurements are untouched.
    const main = p.getByRole("group", { name: /main/i });
    expect(await main.locator("tbody tr").count()).toBe(space.measurements!.length);
  });

  it("corrects it: a mistake is shown beside its field with everything typed kept, then the consensus moves", async () => {
    const p = page!;
    const part = p.getByRole("group", { name: new RegExp(PART, "i") });
    await part.getByRole("link", { name: /Change or remove the measurement/ }).click();
    await p.getByRole("heading", { name: "Change your measurement" }).waitFor();
    await hydrated(p, "edit-measurement-form");
    const form = p.locator("#edit-measurement-form");
    // The form holds what was stored, as it can be typed again.
    expect(await form.getByLabel("Length (fore and aft)").inputValue()).toBe("5 1/4");
    expect(await form.getByLabel("Part of the space you measured").inputValue()).toBe("1");

    await form.getByLabel("Length (fore and aft)").fill("5 1/2 x");
    await form.getByLabel("Width (athwartships)").fill("8 1/8");
    await form.getByLabel("Why (optional)").fill("Measured again along the bottom");
    await p.getByRole("button", { name: "Save the change" }).click();
    const lengthError = form.locator("[role=alert]").filter({ hasText: /./ }).first();
    await lengthError.waitFor();
    expect(await form.getByLabel("Length (fore and aft)").getAttribute("aria-invalid")).toBe("true");
    expect(await form.getByLabel("Width (athwartships)").inputValue()).toBe("8 1/8");
    expect(await form.getByLabel("Why (optional)").inputValue()).toBe("Measured again along the bottom");
    await p.screenshot({ path: screenshotPath("measurement-edit-phone-error") });

    await form.getByLabel("Length (fore and aft)").fill("5 1/2");
    await p.getByRole("button", { name: "Save the change" }).click();
    await p.getByText("The measurement is changed and the consensus is updated.").waitFor();
    expect(await part.locator("[data-consensus=length]").textContent()).toBe("5 1/2 in");
    expect(await part.locator("[data-consensus=width]").textContent()).toBe("8 1/8 in");
    expect(await part.locator("[data-consensus=height]").textContent()).toBe("9 in");
    expect(await part.locator("tbody tr").first().textContent()).toMatch(/changed \d{1,2} [A-Z][a-z]+ \d{4} by Hal/); // dates as the rest of the site writes them
    // The history keeps what it said before and why.
    const history = p.getByRole("heading", { name: "Changes to the measurements" });
    await history.waitFor();
    const entry = p.locator("#measurements ol > li").first();
    expect(await entry.textContent()).toContain("changed their own measurement");
    expect(await entry.textContent()).toContain("5 1/4 × 8 × 9 in");
    expect(await entry.textContent()).toContain("Measured again along the bottom");
    await p.screenshot({ path: screenshotPath("measurement-edit-phone"), fullPage: true });
    const overflow = await p.evaluate(() => document.documentElement.scrollWidth - window.innerWidth);
    expect(overflow).toBeLessThanOrEqual(0);
  });

  it("another member sees no way to change it", async () => {
    const p = await phone();
    await signInAs(p, "lena.marchetti@example.com"); // invented new owner (content-seed/members.yaml)
    await p.goto(`${BASE_URL}/spaces/${SLUG}`);
    await p.getByRole("heading", { level: 1 }).waitFor();
    expect(await p.getByRole("link", { name: /Change or remove/ }).count()).toBe(0);
  });

  it("removes it: the part is unmeasured again and the fit uses its recorded size", async () => {
    const p = await phone();
    await signInAs(p, MEMBER);
    await p.goto(`${BASE_URL}/spaces/${SLUG}?unit=in`);
    const part = p.getByRole("group", { name: new RegExp(PART, "i") });
    await part.getByRole("link", { name: /Change or remove the measurement/ }).click();
    await p.getByRole("heading", { name: "Change your measurement" }).waitFor();
    await hydrated(p, "remove-measurement-form");
    await p.getByText("Remove this measurement…").click();
    await p.getByRole("button", { name: "Remove it for good" }).click();
    await p.getByText("The measurement is removed and the consensus is updated.").waitFor();
    await part.getByText("Nobody has measured this part yet").waitFor();
    const row = p.getByRole("row", { name: new RegExp(`^${PART}`, "i") });
    expect(await row.textContent()).not.toContain("members' consensus");
    expect(await p.locator("#measurements ol > li").first().textContent()).toContain("removed their own measurement");
  });

  it("logged no errors in the browser", () => {
    expect(errors).toEqual([]);
  });
});
