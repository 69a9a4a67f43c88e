// Journey of a new owner (Lena Marchetti, hull 318, a Mk II, no write-ups yet), on a clean copy of
// the demo database and a server of this file's own: she signs in, searches by words from the
// header, reads the write-up she finds, then asks which spaces of her hull take a group 31 battery
// and opens one of them.
import { describe, expect, it } from "vitest";
import { signInAs } from "../support/auth";
import { screenshotPath } from "../support/browser";
import { journeyOnItsOwnServer } from "../support/journey";
import { expectedUpright, hullRangeOf, readSeedSpaces } from "../support/seed-spaces";

const journey = journeyOnItsOwnServer("journey-new-owner", { width: 1280, height: 900 });


// BCI group size chart (Battery Council International): group 31 is 13 x 6 13/16 x 9 7/16 in.
// Worked out independently of the app from content-seed/spaces.yaml (tests/support/seed-spaces.ts):
// the spaces that take it upright with 1/2 in clear all round, on hull 318.
const HULL = 318;
const forHull = expectedUpright({ lengthIn: 13, widthIn: 6 + 13 / 16, heightIn: 9 + 7 / 16 }, 0.5).filter((e) => {
  const [from, to] = hullRangeOf(readSeedSpaces().find((s) => s.slug === e.slug)!.appliesTo);
  return from <= HULL && HULL <= to;
});

describe("a new owner finds known fixes and room for a bigger battery", () => {
  it("signs in and sees her name in the header", async () => {
    await signInAs(journey.page, "lena.marchetti@example.com", undefined, journey.server.baseUrl);
    await journey.page.getByRole("button", { name: "Sign out", exact: true }).waitFor();
    expect(await journey.page.locator("header").textContent()).toContain("Lena");
  });

  it("searches by words from the header and reads the write-up she finds", async () => {
    const box = journey.page.locator("#site-search");
    await expect.poll(() => box.getAttribute("role")).toBe("combobox"); // hydrated
    await box.fill("battery box under the settee");
    await box.press("Enter");
    await journey.page.waitForURL("**/search?q=battery+box+under+the+settee");
    await journey.page.getByRole("heading", { level: 1, name: /matching “battery box under the settee”/ }).waitFor();
    const titles = await journey.page.locator("main section[aria-labelledby^='group-'] article h3").allTextContents();
    // The demo write-up about exactly this job comes first (content-seed/writeups).
    expect(titles[0]).toBe("Group 27 battery moved under the starboard settee");
    await journey.page.screenshot({ path: screenshotPath("journey-new-owner-search"), fullPage: true });
    await journey.page.getByRole("link", { name: "Group 27 battery moved under the starboard settee" }).first().click();
    await journey.page.getByRole("heading", { level: 1, name: "Group 27 battery moved under the starboard settee" }).waitFor();
    // A battery job carries the battery cautions with their source.
    expect(await journey.page.getByText("33 CFR 183.420", { exact: false }).count()).toBeGreaterThan(0);
  });

  it("asks which spaces of her hull take a group 31 battery upright, with 1/2 in clear", async () => {
    expect(forHull.length).toBeGreaterThan(0);
    await journey.page.getByRole("link", { name: "Will it fit?" }).first().click();
    await journey.page.getByRole("heading", { level: 1, name: "Will it fit?" }).waitFor();
    await journey.page.getByLabel("From the catalogue").selectOption({ label: "Battery, BCI group 31" });
    expect(await journey.page.getByLabel("Length").inputValue()).toBe("13");
    expect(await journey.page.getByLabel("Width").inputValue()).toBe("6 13/16");
    expect(await journey.page.getByLabel("Height").inputValue()).toBe("9 7/16");
    await journey.page.getByLabel("Clearance on every side").pressSequentially("1/2");
    await journey.page.getByLabel("Your hull number").pressSequentially(String(HULL));
    await journey.page.waitForFunction(
      (n) => document.querySelectorAll("[data-testid=fit-results] > li").length === n && !document.querySelector("[aria-busy=true]"),
      forHull.length,
    );
    const shown = await journey.page.locator("[data-testid=fit-results] > li").evaluateAll((els) => els.map((el) => el.getAttribute("data-space")));
    expect([...shown].sort()).toEqual(forHull.map((e) => e.slug).sort());
    expect(await journey.page.locator("#fit-summary").textContent()).toContain(`Hull ${HULL}.`);
    await journey.page.screenshot({ path: screenshotPath("journey-new-owner-fit"), fullPage: true });
  });

  it("keeps what she typed and says what is wrong when a size makes no sense", async () => {
    const length = journey.page.getByLabel("Length");
    await length.fill("13 x");
    await journey.page.getByText("Correct the length above to see the spaces.").waitFor();
    expect(await length.inputValue()).toBe("13 x");
    await length.fill("13");
    await journey.page.waitForFunction(
      (n) => document.querySelectorAll("[data-testid=fit-results] > li").length === n && !document.querySelector("[aria-busy=true]"),
      forHull.length,
    );
  });

  it("opens the best space and reads its measurements", async () => {
    const first = journey.page.locator("[data-testid=fit-results] > li").first();
    const slug = (await first.getAttribute("data-space"))!;
    const space = readSeedSpaces().find((s) => s.slug === slug)!;
    await first.locator("h3 a").click();
    await journey.page.waitForURL(`**/spaces/${slug}`);
    await journey.page.getByRole("heading", { level: 1, name: space.name }).waitFor();
    expect(await journey.page.locator("#measurements tbody tr").count()).toBe(space.measurements?.length ?? 0);
    await journey.page.screenshot({ path: screenshotPath("journey-new-owner-space"), fullPage: true });
  });

  it("saw no errors in the browser and no server failure", () => {
    expect(journey.errors).toEqual([]);
    expect(journey.server.output()).not.toMatch(/Error|error/);
  });
});
