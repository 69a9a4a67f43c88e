// The write-up editor keeps what is typed on the device: a reload without saving loses nothing
// ("Put it back"), a refused submit keeps every field, a send lost on the way can be put back after
// a reload, and a successful send clears the kept copy.
import type { Browser, Page } from "playwright-core";
import { afterAll, beforeAll, beforeEach, describe, expect, it } from "vitest";
import { signInAs } from "../support/auth";
import { BASE_URL, keepEvidenceOnFailure, launchBrowser, screenshotPath } from "../support/browser";

let browser: Browser;
let page: Page;
const stamp = Date.now();
const TITLE = `A bilge pump switch panel, ${stamp}`;
const BODY = `## The panel\n\nA three-way switch (off, auto, manual) on a plywood plate, fused at 7.5 A. Draft ${stamp}.`;
const NEW_KEY = "sistership:writeup:new";

beforeAll(async () => {
  browser = await launchBrowser();
  page = await (await browser.newContext({ viewport: { width: 1280, height: 1000 } })).newPage();
  page.on("dialog", (d) => d.accept());
});
beforeEach(keepEvidenceOnFailure("editor-drafts", () => page));
afterAll(async () => browser?.close());

/** The editor's own form gets `novalidate` from conform once the page has hydrated. */
async function editorReady(heading: string) {
  await page.getByRole("heading", { level: 1, name: heading }).waitFor();
  await page.waitForSelector('form[id^="writeup-"][novalidate]', { state: "attached" });
}

const kept = (key: string) => page.evaluate((k) => window.localStorage.getItem(k), key);

describe("typed text survives", () => {
  it("a reload without saving: the editor offers to put it back, and does", async () => {
    await signInAs(page, "hal.dunmore@example.com");
    await page.goto(`${BASE_URL}/my/writeups/new`);
    await editorReady("A new write-up");
    await page.getByLabel("Title").fill(TITLE);
    await page.getByLabel("The write-up").fill(BODY);
    await page.waitForFunction(([k, s]) => window.localStorage.getItem(k)?.includes(s) ?? false, [NEW_KEY, String(stamp)] as const);

    await page.reload();
    await editorReady("A new write-up");
    expect(await page.getByLabel("Title").inputValue()).toBe("");
    await page.getByRole("button", { name: "Put it back" }).click();
    expect(await page.getByLabel("Title").inputValue()).toBe(TITLE);
    expect(await page.getByLabel("The write-up").inputValue()).toBe(BODY);
    await page.getByTestId("preview").getByRole("heading", { name: "The panel" }).waitFor();
  });

  it("leaving by a link at once after typing: back in the editor, it offers the text, the last words too", async () => {
    await page.getByLabel("Title").fill(`${TITLE} (left at once)`);
    // No pause: the link is followed within the 400 ms the editor waits before writing to the device.
    await page.getByRole("link", { name: "← Your write-ups" }).click();
    await page.getByRole("heading", { level: 1, name: "Your write-ups" }).waitFor();
    expect(await kept(NEW_KEY)).toContain("(left at once)");
    await page.goto(`${BASE_URL}/my/writeups/new`);
    await editorReady("A new write-up");
    await page.getByRole("button", { name: "Put it back" }).click();
    expect(await page.getByLabel("Title").inputValue()).toBe(`${TITLE} (left at once)`);
    await page.getByLabel("Title").fill(TITLE);
  });

  it("a refused submit: the message sits beside the field and every field keeps its text", async () => {
    await page.getByLabel("Summary").fill("Too short");
    await page.getByRole("button", { name: "Send for review" }).click();
    await page.getByText("Sum it up in at least 10 characters.").waitFor();
    await page.getByText("Choose at least one boat system.").waitFor();
    expect(new URL(page.url()).pathname).toBe("/my/writeups/new");
    expect(await page.getByLabel("Title").inputValue()).toBe(TITLE);
    expect(await page.getByLabel("Summary").inputValue()).toBe("Too short");
    expect(await page.getByLabel("The write-up").inputValue()).toBe(BODY);
    await page.screenshot({ path: screenshotPath("editor-drafts-refused"), fullPage: true });
  });

  it("a send that never reaches the server: after a reload everything can be put back", async () => {
    await page.getByLabel("Summary").fill("A switch panel for the bilge pump, with its own fuse.");
    await page.getByLabel("Electrical").check();
    await page.waitForFunction((k) => window.localStorage.getItem(k)?.includes("its own fuse") ?? false, NEW_KEY);
    const lost = (url: URL) => url.pathname.startsWith("/my/writeups/new");
    await page.route(lost, (route) => (route.request().method() === "POST" ? route.abort("internetdisconnected") : route.continue()));
    const failed = page.waitForEvent("requestfailed");
    await page.getByRole("button", { name: "Send for review" }).click();
    await failed;
    await page.unroute(lost);

    await page.reload();
    await editorReady("A new write-up");
    await page.getByRole("button", { name: "Put it back" }).click();
    expect(await page.getByLabel("Title").inputValue()).toBe(TITLE);
    expect(await page.getByLabel("Summary").inputValue()).toBe("A switch panel for the bilge pump, with its own fuse.");
    expect(await page.getByLabel("The write-up").inputValue()).toBe(BODY);
    expect(await page.getByLabel("Electrical").isChecked()).toBe(true);
  });

  it("a successful send for review clears the copy kept on the device", async () => {
    await page.getByRole("button", { name: "Send for review" }).click();
    await page.getByText("Sent to the moderators").waitFor();
    const id = /\/my\/writeups\/(\d+)/.exec(page.url())?.[1];
    expect(id).toBeTruthy();
    await page.waitForFunction(() => !window.location.search.includes("kept="));
    expect(await kept(NEW_KEY)).toBeNull();
    expect(await kept(`sistership:writeup:${id}`)).toBeNull();
    // Nothing is offered after a reload, here or on a new write-up.
    await page.reload();
    await page.getByRole("heading", { level: 1, name: "Edit your write-up" }).waitFor();
    await page.goto(`${BASE_URL}/my/writeups/new`);
    await editorReady("A new write-up");
    expect(await page.getByRole("button", { name: "Put it back" }).count()).toBe(0);
  });

  it("the first save of a new write-up says the draft is saved", async () => {
    await page.getByLabel("Title").fill(`${TITLE}, second`);
    await page.getByLabel("Summary").fill("A second panel, for the cockpit lights.");
    await page.getByLabel("The write-up").fill(BODY);
    await page.getByLabel("Electrical").check();
    await page.getByRole("button", { name: "Save draft" }).click();
    await page.getByRole("heading", { level: 1, name: "Edit your write-up" }).waitFor();
    await page.getByText("Draft saved.").waitFor();
  });

  it("a draft with only its title is saved; sending it for review asks for the rest beside the fields", async () => {
    await page.goto(`${BASE_URL}/my/writeups/new`);
    await editorReady("A new write-up");
    await page.getByLabel("Title").fill(`${TITLE}, started`);
    await page.getByRole("button", { name: "Save draft" }).click();
    await page.getByRole("heading", { level: 1, name: "Edit your write-up" }).waitFor();
    await page.getByText("Draft saved.").waitFor();
    await page.waitForSelector('form[id^="writeup-"][novalidate]', { state: "attached" });
    await page.getByRole("button", { name: "Send for review" }).click();
    await page.getByText("Sum it up in a sentence or two.").waitFor();
    await page.getByText("Choose at least one boat system.").waitFor();
    expect(await page.getByLabel("Title").inputValue()).toBe(`${TITLE}, started`);
  });
});
