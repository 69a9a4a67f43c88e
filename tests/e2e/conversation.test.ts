// A member comments on a published write-up and counts their boat, without the page reloading;
// a visitor then sees both, and the hostile text in a comment stays text.
import type { Browser, BrowserContext, Dialog, Page } from "playwright-core";
import { afterAll, beforeAll, beforeEach, describe, expect, it } from "vitest";
import { signInAs } from "../support/auth";
import { BASE_URL, keepEvidenceOnFailure, launchBrowser, screenshotPath } from "../support/browser";

let browser: Browser;
const errors: string[] = [];
const dialogs: string[] = [];

// Invented demo content (content-seed/): members and their hulls, and a write-up by Hal Dunmore,
// done on hull 211.
const JOAN = "joan.pettifer@example.org";
const MARISOL = "marisol.ferrante@example.org"; // hull 468, Little Auk
const SLUG = "trailer-bunks-keel-pad-and-lights";
const HOSTILE = `<script>alert("comment")</script><img src=x onerror="alert('image')">`;
const COMMENT = `Did the same bunks on Lark Rising.\n${HOSTILE}\nThanks for the keel pad sizes.`;

function watch(page: Page) {
  page.on("pageerror", (e) => errors.push(e.message));
  // A 400 on a refused form is expected and logged by the browser as a failed resource.
  page.on("console", (m) => { if (m.type() === "error" && !m.text().startsWith("Failed to load resource")) errors.push(m.text()); });
  page.on("dialog", (d: Dialog) => {
    dialogs.push(`${d.type()}: ${d.message()}`);
    void d.dismiss();
  });
}

/** The page's script has taken over the forms (conform sets novalidate once hydrated). */
async function hydrated(page: Page) {
  await page.waitForSelector("#comment-form[novalidate]", { state: "attached" });
}

beforeAll(async () => {
  browser = await launchBrowser();
});
afterAll(async () => browser?.close());

describe("the conversation under a write-up", () => {
  let context: BrowserContext;
  let page: Page;
  beforeEach(keepEvidenceOnFailure("conversation", () => page));
  beforeAll(async () => {
    context = await browser.newContext({ viewport: { width: 1200, height: 900 } });
    page = await context.newPage();
    watch(page);
  });
  afterAll(async () => context?.close());

  it("a member comments and counts their boat, and the page never reloads", async () => {
    await signInAs(page, JOAN);
    await page.goto(`${BASE_URL}/writeups/${SLUG}`);
    await hydrated(page);
    await page.evaluate(() => { (window as unknown as { samePage: boolean }).samePage = true; });
    const stillSamePage = () => page.evaluate(() => (window as unknown as { samePage?: boolean }).samePage === true);

    // Too short: the message sits beside the field and the text stays.
    const box = page.getByLabel("Your comment");
    await box.fill("k");
    await page.getByRole("button", { name: "Post the comment" }).click();
    await page.getByText("Write at least 2 characters.").waitFor();
    expect(await box.inputValue()).toBe("k");

    const posted = page.waitForResponse((r) => r.url().includes(`/api/writeups/${SLUG}/comments`) && r.request().method() === "POST");
    await box.fill(COMMENT);
    await page.getByRole("button", { name: "Post the comment" }).click();
    expect((await posted).status()).toBe(201);
    const item = page.locator("#comments li").filter({ hasText: "Did the same bunks on Lark Rising." });
    await item.waitFor();
    expect(await item.getByText("Joan Pettifer").count()).toBe(1);
    await page.getByText("Your comment is posted.").waitFor();
    expect(await box.inputValue()).toBe("");
    // Shown as typed, line breaks kept, and no element made from it.
    expect(await item.locator("p.whitespace-pre-wrap").innerText()).toBe(COMMENT);
    expect(await item.locator("script, img").count()).toBe(0);

    await page.getByRole("heading", { name: "Done on 1 boat" }).waitFor();
    await page.getByRole("button", { name: "Count my boat too" }).click();
    await page.getByRole("heading", { name: "Done on 2 boats" }).waitFor();
    await page.locator("#done-too").getByText("Lark Rising (hull 97) is counted.").waitFor();

    // Taken back and counted again, still on the same page.
    await page.getByRole("button", { name: "Take it back for hull 97" }).click();
    await page.getByRole("heading", { name: "Done on 1 boat" }).waitFor();
    await page.getByRole("button", { name: "Count my boat too" }).click();
    await page.getByRole("heading", { name: "Done on 2 boats" }).waitFor();

    expect(await stillSamePage()).toBe(true);
    await page.screenshot({ path: screenshotPath("conversation-member"), fullPage: true });
  });

  it("a visitor sees the comment as text and the count, and no dialog opens", async () => {
    const visitor = await browser.newContext({ viewport: { width: 420, height: 900 } });
    const vpage = await visitor.newPage();
    watch(vpage);
    await vpage.goto(`${BASE_URL}/writeups/${SLUG}`);
    // Visitors have no comment form: wait for the router of the page's script instead.
    await vpage.waitForFunction(() => (window as unknown as { __reactRouterDataRouter?: { state: { initialized: boolean } } }).__reactRouterDataRouter?.state.initialized === true);
    await vpage.waitForLoadState("networkidle");
    await vpage.getByRole("heading", { name: "Done on 2 boats" }).waitFor();
    const hulls = vpage.getByRole("list", { name: "Hulls" });
    expect(await hulls.innerText()).toMatch(/Hull 211[\s\S]*Hull 97, Lark Rising/);
    const item = vpage.locator("#comments li").filter({ hasText: "Did the same bunks on Lark Rising." });
    await item.getByText(`<script>alert("comment")</script>`, { exact: false }).waitFor();
    expect(await item.locator("script, img").count()).toBe(0);
    expect(await vpage.getByRole("button", { name: "Remove the comment" }).count()).toBe(0);
    await vpage.locator("#comments").getByRole("link", { name: "Sign in" }).waitFor();
    await vpage.locator("#done-too").getByRole("link", { name: "Sign in" }).waitFor();
    await vpage.screenshot({ path: screenshotPath("conversation-visitor"), fullPage: true });
    await visitor.close();
    expect(dialogs).toEqual([]);
    expect(errors).toEqual([]);
  });

  it("works without JavaScript too: the forms post and come back to the page", async () => {
    const plain = await browser.newContext({ viewport: { width: 1200, height: 900 }, javaScriptEnabled: false });
    const ppage = await plain.newPage();
    watch(ppage);
    await signInAs(ppage, MARISOL);
    await ppage.goto(`${BASE_URL}/writeups/${SLUG}`);
    await ppage.getByLabel("Your comment").fill("Same trailer here; the bunk heights\nmatched ours to the quarter inch.");
    await Promise.all([ppage.waitForURL(new RegExp(`/writeups/${SLUG}#comment-\\d+$`)), ppage.getByRole("button", { name: "Post the comment" }).click()]);
    await ppage.getByText("Your comment is posted.").waitFor();
    await ppage.locator("#comments li").filter({ hasText: "matched ours to the quarter inch." }).waitFor();

    await Promise.all([ppage.waitForURL(new RegExp(`/writeups/${SLUG}#done-too$`)), ppage.getByRole("button", { name: "Count my boat too" }).click()]);
    await ppage.getByText("Hull 468 is counted. Thank you.").waitFor();
    await ppage.getByRole("heading", { name: "Done on 3 boats" }).waitFor();
    await plain.close();
    expect(dialogs).toEqual([]);
    expect(errors).toEqual([]);
  });
});
