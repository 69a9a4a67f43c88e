// The class secretary's yearly digest, as she would do it: compile the demo year, leave one
// write-up out, swap two, preview, issue; the PDF's text (unpdf) has the remaining titles in that
// order; every member who opted in, and no one else, got the e-mail; its unsubscribe link works.
import fs from "node:fs";
import path from "node:path";
import pg from "pg";
import type { Browser, BrowserContext, Page } from "playwright-core";
import { extractText, getDocumentProxy } from "unpdf";
import { afterAll, beforeAll, beforeEach, describe, expect, it } from "vitest";
import { signInAs } from "../support/auth";
import { ARTIFACTS_DIR, BASE_URL, keepEvidenceOnFailure, launchBrowser, screenshotPath } from "../support/browser";
import { extractLinks, mailboxDir, readMailbox } from "../support/mailbox";

// Invented demo content (content-seed/): the class secretary, and the demo year, in which most of
// the seed's write-ups were published.
const RUTH = "ruth.ambler@example.org";
const YEAR = 2025;
const SUBJECT = `Brantwater 22 yearly digest ${YEAR}`;

let browser: Browser;
let context: BrowserContext;
let page: Page;
const errors: string[] = [];

async function query<T>(text: string, values: unknown[] = []): Promise<T[]> {
  if (!process.env.E2E_DATABASE_URL) throw new Error("E2E_DATABASE_URL is not set: run the browser tests through `npm test`.");
  const c = new pg.Client({ connectionString: process.env.E2E_DATABASE_URL });
  await c.connect();
  try {
    return (await c.query(text, values)).rows as T[];
  } finally {
    await c.end();
  }
}

/** The titles of the draft's entries that are in, in page order. */
async function titlesInDraft(): Promise<{ title: string; section: string; included: boolean }[]> {
  return page.$$eval("[data-entry]", (items) => items.map((li) => ({
    title: li.querySelector("p a")?.textContent?.trim() ?? "",
    section: li.closest("section")?.getAttribute("aria-label") ?? "",
    included: !li.textContent?.includes("left out"),
  })));
}

beforeAll(async () => {
  browser = await launchBrowser();
  context = await browser.newContext({ viewport: { width: 1280, height: 900 }, acceptDownloads: true });
  page = await context.newPage();
  page.on("pageerror", (e) => errors.push(e.message));
  page.on("console", (m) => { if (m.type() === "error" && !m.text().startsWith("Failed to load resource")) errors.push(m.text()); });
});
afterAll(async () => {
  await context?.close();
  await browser?.close();
});

describe("the yearly digest", () => {
  beforeEach(keepEvidenceOnFailure("digest", () => page));

  it("the secretary compiles, arranges, previews and issues; the PDF, the e-mail and the unsubscribe link work", async () => {
    await signInAs(page, RUTH);
    // The link for secretaries, then the year.
    await page.getByRole("navigation", { name: "Class secretary" }).getByRole("link", { name: "Yearly digest" }).click();
    await page.getByRole("heading", { level: 1, name: "The yearly digest" }).waitFor();
    await page.waitForSelector("#compile[novalidate]", { state: "attached" });
    await page.getByRole("textbox", { name: "Year", exact: true }).fill(String(YEAR));
    await page.getByRole("button", { name: "Compile the digest" }).click();
    await page.getByRole("heading", { level: 1, name: `Yearly digest ${YEAR}` }).waitFor();
    await page.waitForSelector("#letter[novalidate]", { state: "attached" });

    // Leave out the first write-up of the last system; swap the first two of a system that has two.
    const start = await titlesInDraft();
    expect(start.length).toBeGreaterThanOrEqual(5);
    const last = start.at(-1)!.section;
    const leftOut = start.find((e) => e.section === last)!.title;
    await page.getByRole("button", { name: `Leave out “${leftOut}”` }).click();
    await page.getByRole("button", { name: `Put back “${leftOut}”` }).waitFor();
    const section = start.find((e, i) => start[i + 1]?.section === e.section)!.section;
    const [a, b] = start.filter((e) => e.section === section).map((e) => e.title);
    await page.getByRole("button", { name: `Move “${b}” up` }).click();
    await page.waitForFunction(([x, y]) => {
      const titles = [...document.querySelectorAll("[data-entry] p a")].map((n) => n.textContent?.trim());
      return titles.indexOf(y!) < titles.indexOf(x!);
    }, [a, b]);
    const arranged = await titlesInDraft();
    const expected = arranged.filter((e) => e.included).map((e) => e.title);
    expect(expected).not.toContain(leftOut);
    expect(expected.indexOf(b)).toBe(expected.indexOf(a) - 1);

    await page.getByLabel("The editor's letter").fill("Dear members,\n\nA year of **careful** work on our boats. Thank you all.\n\n*Ruth*");
    await page.getByRole("button", { name: "Save the letter" }).click();
    await page.getByText("The letter is saved.").waitFor();
    await page.screenshot({ path: screenshotPath("digest-draft"), fullPage: true });

    // Preview: what members will read, in the order chosen.
    await page.getByRole("link", { name: "Preview and issue" }).click();
    await page.getByRole("heading", { level: 1, name: `Preview: Yearly digest ${YEAR}` }).waitFor();
    await page.waitForSelector("#issue[novalidate]", { state: "attached" });
    const previewed = await page.$$eval(".dg-entry h3", (hs) => hs.map((h) => h.textContent?.trim() ?? ""));
    expect(previewed).toEqual(expected);
    await page.screenshot({ path: screenshotPath("digest-preview"), fullPage: false });

    const recipients = (await query<{ email: string }>("select email from users where digest_opt_in and email_verified_at is not null order by email")).map((r) => r.email);
    const everyone = (await query<{ email: string }>("select email from users")).map((r) => r.email);
    expect(recipients.length).toBeGreaterThan(0);
    expect(recipients.length).toBeLessThan(everyone.length); // the seed has members who said no

    // Issuing without the confirming tick is refused beside the box.
    await page.getByRole("button", { name: "Issue the digest" }).click();
    await page.getByText("Tick the box to confirm").waitFor();
    await page.getByLabel(/I have read the preview/).check();
    await page.getByRole("button", { name: "Issue the digest" }).click();
    await page.waitForURL((url) => url.pathname === `/digest/${YEAR}`);
    await page.getByText(`Yearly digest ${YEAR} is issued.`).waitFor();

    // The PDF, built on the server with progress shown, has the titles in order and not the one left out.
    await page.getByRole("button", { name: "Make the PDF" }).click();
    const download = page.getByRole("link", { name: "Download the PDF" });
    await download.waitFor({ timeout: 30_000 });
    await page.screenshot({ path: screenshotPath("digest-issued"), fullPage: false });
    const response = await page.request.get(`${BASE_URL}${await download.getAttribute("href")}`);
    expect(response.headers()["content-type"]).toBe("application/pdf");
    const pdf = new Uint8Array(await response.body());
    fs.mkdirSync(ARTIFACTS_DIR, { recursive: true });
    fs.writeFileSync(path.join(ARTIFACTS_DIR, `digest-${YEAR}-e2e.pdf`), pdf);
    const { text } = await extractText(await getDocumentProxy(pdf), { mergePages: true });
    const flat = text.replace(/\s+/g, " ");
    expect(flat).not.toContain(leftOut);
    let at = flat.indexOf("the accounts opened in it."); // the last words before the write-ups
    expect(at).toBeGreaterThan(-1);
    for (const title of expected) {
      const next = flat.indexOf(title, at + 1);
      expect({ title, inOrder: next > at }).toEqual({ title, inOrder: true });
      at = next;
    }

    // Printed from the browser, the page is the digest alone: no navigation, no buttons.
    const printed = await page.pdf({ preferCSSPageSize: true });
    const printedText = (await extractText(await getDocumentProxy(new Uint8Array(printed)), { mergePages: true })).text;
    expect(printedText).toContain(expected[0].slice(0, 30));
    for (const chrome of ["Sign out", "Search", "Print this page", "Prepare a correction", "Every yearly digest", "Class secretary"]) {
      expect({ chrome, printed: printedText.includes(chrome) }).toEqual({ chrome, printed: false });
    }

    // Every member who opted in got the e-mail, and no one else.
    // The outbox sends in batches; wait for all of them (and a moment for any stray extra). The
    // run's mailbox also holds what the journeys' own servers sent (the secretary's journey issues
    // the same year): this server's mails are those whose links lead to it.
    const ours = () => readMailbox(mailboxDir()).filter((m) => m.subject === SUBJECT && m.text.includes(`${BASE_URL}/`));
    const until = Date.now() + 20_000;
    while (ours().length < recipients.length && Date.now() < until) {
      await new Promise((r) => setTimeout(r, 200));
    }
    await new Promise((r) => setTimeout(r, 500));
    const mails = ours();
    expect(mails.flatMap((m) => m.to).sort()).toEqual(recipients);
    const mail = mails.find((m) => m.to.includes(RUTH))!;
    for (const title of expected) expect(mail.text).toContain(title);
    expect(mail.text).not.toContain(leftOut);

    // Her unsubscribe link works without signing in; afterwards her opt-in is off.
    const link = extractLinks(mail.text).find((l) => l.includes("/digest/unsubscribe?token="))!;
    const stranger = await browser.newContext();
    const other = await stranger.newPage();
    await other.goto(link.replace(/^https?:\/\/[^/]+/, BASE_URL));
    await other.getByRole("heading", { level: 1, name: "Stop the yearly digest?" }).waitFor();
    await other.getByRole("button", { name: "Stop sending me the digest" }).click();
    await other.getByRole("heading", { level: 1, name: "You will not receive the digest" }).waitFor();
    await other.screenshot({ path: screenshotPath("digest-unsubscribed") });
    await stranger.close();
    const [ruth] = await query<{ digest_opt_in: boolean }>("select digest_opt_in from users where email = $1", [RUTH]);
    expect(ruth.digest_opt_in).toBe(false);
    expect(errors).toEqual([]);
  });
});
