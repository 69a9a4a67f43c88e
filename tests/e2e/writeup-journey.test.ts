import fs from "node:fs";
import os from "node:os";
import path from "node:path";
import type { Browser, BrowserContext, Page } from "playwright-core";
import sharp from "sharp";
import { afterAll, beforeAll, beforeEach, describe, expect, it } from "vitest";
import { signInAs, signOut } from "../support/auth";
import { BASE_URL, keepEvidenceOnFailure, launchBrowser, screenshotPath } from "../support/browser";
import { waitForMail } from "../support/mailbox";

let browser: Browser;
let context: BrowserContext;
let page: Page;
const dialogs: string[] = [];
const errors: string[] = [];
const TITLE = `A drip tray under the galley pump, ${Date.now()}`;
const mailDir = () => process.env.MAIL_STANDIN_DIR ?? "";

beforeAll(async () => {
  browser = await launchBrowser();
  context = await browser.newContext({ viewport: { width: 1280, height: 1000 } });
  page = await context.newPage();
  page.on("dialog", async (d) => { dialogs.push(d.message()); await d.dismiss(); });
  page.on("pageerror", (e) => errors.push(e.message));
});
beforeEach(keepEvidenceOnFailure("writeup-journey", () => page));
afterAll(async () => browser?.close());

async function photoFile(): Promise<string> {
  const file = path.join(os.tmpdir(), `drip-tray-${process.pid}.jpg`);
  const jpeg = await sharp({ create: { width: 640, height: 480, channels: 3, background: { r: 140, g: 160, b: 170 } } }).jpeg().toBuffer();
  fs.writeFileSync(file, jpeg);
  return file;
}

describe("a write-up from draft to publication", () => {
  it("a member writes a write-up with a photo, sees the live preview and sends it for review", async () => {
    await signInAs(page, "hal.dunmore@example.com");
    await page.getByRole("link", { name: "Your write-ups" }).click();
    await page.getByRole("link", { name: "Write up a job" }).click();
    await page.getByRole("heading", { level: 1, name: "A new write-up" }).waitFor();
    await page.getByLabel("Title").fill(TITLE);
    await page.getByLabel("Summary").fill("A shallow tray catches the drips from the hand pump before they reach the cabinet floor.");
    await page.getByLabel("The write-up").fill("## What I measured\n\n| part | size |\n|---|---|\n| tray | 9 x 5 in |\n\nThe tray is bedded in sealant.");
    await page.getByTestId("preview").locator("table").waitFor();
    expect(await page.getByTestId("preview").locator("h2").textContent()).toBe("What I measured");
    await page.getByLabel("Joinery").check();
    await page.getByLabel("Galley cabinet").check();
    await page.getByRole("button", { name: "Add a part" }).click();
    await page.getByLabel("Part 1 name").fill("Plastic tray");
    await page.getByLabel("Part 1 weight").fill("6 oz");
    // The photo: caption and description are required, the upload shows its progress.
    await page.getByRole("button", { name: "Add a photo" }).click();
    await page.getByLabel("Photo", { exact: true }).setInputFiles(await photoFile());
    await page.getByRole("button", { name: "Upload and insert" }).click();
    await page.getByText("Give the photo a caption.").waitFor();
    await page.getByLabel("Caption").fill("The tray in place");
    await page.getByLabel("What the photo shows (for readers who cannot see it)").fill("A grey plastic tray under a hand pump");
    await page.getByRole("button", { name: "Upload and insert" }).click();
    await page.getByTestId("preview").locator('img[src^="/media/photos/"]').waitFor();
    await page.screenshot({ path: screenshotPath("editor"), fullPage: true });
    await page.getByRole("button", { name: "Send for review" }).click();
    await page.getByText("Sent to the moderators").waitFor();
    await signOut(page);
  });

  it("a moderator finds it in the queue, asks for changes with a reason", async () => {
    await signInAs(page, "nora.pelling@example.org");
    await page.getByRole("link", { name: "Review", exact: true }).click();
    await page.getByRole("heading", { level: 1, name: "Waiting for review" }).waitFor();
    await page.getByRole("link", { name: TITLE }).click();
    await page.getByRole("heading", { level: 1, name: TITLE }).waitFor();
    await page.getByLabel("Ask for changes").check();
    await page.getByRole("button", { name: "Record the decision" }).click();
    await page.getByText("Tell the author why").waitFor();
    await page.getByLabel("Why (sent to the author)").fill("Please say what sealant you used and how the tray drains.");
    await page.getByRole("button", { name: "Record the decision" }).click();
    await page.getByText("The author has been e-mailed").waitFor();
    await signOut(page);
  });

  it("the author reads the reason, revises and sends it again", async () => {
    const mail = await waitForMail(mailDir(), (m) => m.to.includes("hal.dunmore@example.com") && m.subject.startsWith("Changes asked"));
    expect(mail.text).toContain("what sealant you used");
    await signInAs(page, "hal.dunmore@example.com");
    await page.getByRole("link", { name: "Your write-ups" }).click();
    await page.getByRole("link", { name: TITLE }).click();
    await page.getByText("Please say what sealant you used").waitFor();
    await page.waitForSelector("form[novalidate]", { state: "attached" });
    const body = page.getByLabel("The write-up");
    await body.fill(`${await body.inputValue()}\n\nI used a polyurethane sealant; the tray drains into the sink through a 3/8 in hose.`);
    await page.getByRole("button", { name: "Send for review" }).click();
    await page.getByText("Sent to the moderators").waitFor();
    await signOut(page);
  });

  it("the moderator publishes it after the checklist, and a visitor finds it on the home page", async () => {
    await signInAs(page, "nora.pelling@example.org");
    await page.goto(`${BASE_URL}/review`);
    await page.getByRole("link", { name: TITLE }).click();
    await page.getByRole("heading", { level: 1, name: TITLE }).waitFor();
    await page.getByLabel("Publish").check();
    await page.getByRole("button", { name: "Record the decision" }).click();
    await page.getByText("Tick every point of the checklist").waitFor();
    for (const box of await page.locator('input[name^="check."]').all()) await box.check();
    await page.getByLabel("Publish").check();
    await page.getByRole("button", { name: "Record the decision" }).click();
    await page.getByText("The author has been e-mailed").waitFor();
    await signOut(page);
    await page.goto(BASE_URL);
    await page.getByRole("link", { name: TITLE }).click();
    await page.getByRole("heading", { level: 1, name: TITLE }).waitFor();
    expect(await page.locator(".prose").textContent()).toContain("polyurethane sealant");
    await page.locator('.prose img[src^="/media/photos/"]').waitFor();
    await page.screenshot({ path: screenshotPath("published-writeup"), fullPage: true });
    const published = await waitForMail(mailDir(), (m) => m.to.includes("hal.dunmore@example.com") && m.subject.startsWith("Published"));
    expect(published.text).toContain("/writeups/");
  });

  it("hostile Markdown from the OWASP XSS Filter Evasion Cheat Sheet runs no script in the preview or once published", async () => {
    const vectors = [
      "<script>alert('XSS')</script>",
      "<IMG SRC=\"javascript:alert('XSS');\">",
      "<img src=x onerror=alert(1)>",
      "<svg/onload=alert('XSS')>",
      "[click me](javascript:alert(1))",
      "<iframe src=\"javascript:alert('XSS');\"></iframe>",
      "<BODY ONLOAD=alert('XSS')>",
    ].join("\n\n");
    await signInAs(page, "hal.dunmore@example.com");
    await page.goto(`${BASE_URL}/my/writeups/new`);
    await page.getByLabel("Title").fill("Hostile markup test write-up");
    await page.getByLabel("Summary").fill("Checks that nothing in the body can run.");
    await page.getByLabel("The write-up").fill(vectors);
    await page.getByLabel("Joinery").check();
    await page.getByTestId("preview").getByText("click me").waitFor();
    await page.getByText("click me").click().catch(() => undefined);
    await page.getByRole("button", { name: "Send for review" }).click();
    await page.getByText("Sent to the moderators").waitFor();
    await signOut(page);
    await signInAs(page, "gareth.lindqvist@example.com");
    await page.goto(`${BASE_URL}/review`);
    await page.getByRole("link", { name: "Hostile markup test write-up" }).click();
    await page.getByRole("heading", { level: 1, name: "Hostile markup test write-up" }).waitFor();
    for (const box of await page.locator('input[name^="check."]').all()) await box.check();
    await page.getByLabel("Publish").check();
    await page.getByRole("button", { name: "Record the decision" }).click();
    await page.getByText("The author has been e-mailed").waitFor();
    await signOut(page);
    await page.goto(BASE_URL);
    await page.getByRole("link", { name: "Hostile markup test write-up" }).first().click();
    await page.getByRole("heading", { level: 1, name: "Hostile markup test write-up" }).waitFor();
    await page.locator(".prose").getByText("click me").click().catch(() => undefined);
    await page.waitForTimeout(300);
    expect(dialogs).toEqual([]);
    expect(await page.locator(".prose script, .prose iframe, .prose svg, .prose [onerror], .prose [onload]").count()).toBe(0);
  });

  it("logged no errors in the browser", () => {
    expect(errors).toEqual([]);
  });
});
