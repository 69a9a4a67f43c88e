// Journey of the class secretary (Ruth Ambler), on a clean copy of the demo database and a server
// of this file's own: she compiles the 2025 digest from the write-ups published that year, leaves
// one out, writes the editor's letter, previews it, issues it with the e-mail, and the members who
// asked for the digest receive it while a reader finds it in the public archive.
import { describe, expect, it } from "vitest";
import { signInAs } from "../support/auth";
import { screenshotPath } from "../support/browser";
import { journeyOnItsOwnServer } from "../support/journey";
import { mailboxDir, readMailbox, waitForMail } from "../support/mailbox";
import { readSeedWriteups, readSeedYaml } from "../support/seed-files";

const journey = journeyOnItsOwnServer("journey-secretary");


// What the demo content published in 2025 (content-seed/writeups/*.md), and who asked for the
// digest (content-seed/members.yaml).
const published2025 = readSeedWriteups().filter((w) => w.status === "published" && w.publishedAt?.startsWith("2025")).map((w) => w.title);
const members = readSeedYaml<{ email: string; digest: boolean }[]>("members.yaml");
const LETTER = "A good year on the water, and a busy one in the lockers: thank you to everyone who measured.";
const startedAt = new Date().toISOString();

describe("the secretary issues the yearly digest", () => {
  let leftOut = "";

  it("compiles the 2025 digest from the write-ups published that year", async () => {
    expect(published2025.length).toBeGreaterThan(2);
    await signInAs(journey.page, "ruth.ambler@example.org", undefined, journey.server.baseUrl);
    await journey.page.getByRole("navigation", { name: "Class secretary" }).getByRole("link", { name: "Yearly digest" }).click();
    await journey.page.getByRole("heading", { level: 1, name: "The yearly digest" }).waitFor();
    await journey.page.waitForSelector("form[novalidate]", { state: "attached" });
    await journey.page.getByRole("textbox", { name: "Year" }).fill("2025");
    await journey.page.getByRole("button", { name: "Compile the digest" }).click();
    await journey.page.getByRole("heading", { level: 1, name: "Yearly digest 2025" }).waitFor();
    const titles = await journey.page.locator("li[data-entry] p.font-serif").allTextContents();
    expect([...titles].sort()).toEqual([...published2025].sort());
  });

  it("leaves one write-up out and writes the editor's letter", async () => {
    leftOut = published2025[published2025.length - 1];
    await journey.page.getByRole("button", { name: `Leave out “${leftOut}”` }).click();
    await journey.page.getByRole("button", { name: `Put back “${leftOut}”` }).waitFor();
    await journey.page.waitForSelector("form[novalidate]", { state: "attached" });
    await journey.page.getByLabel("The editor's letter").fill(LETTER);
    await Promise.all([
      journey.page.waitForResponse((r) => r.request().method() === "POST" && new URL(r.url()).pathname.startsWith("/secretary/digest/2025") && r.ok()),
      journey.page.getByRole("button", { name: "Save the letter" }).click(),
    ]);
    await journey.page.reload();
    await journey.page.getByRole("heading", { level: 1, name: "Yearly digest 2025" }).waitFor();
    expect(await journey.page.getByLabel("The editor's letter").inputValue()).toBe(LETTER);
    await journey.page.screenshot({ path: screenshotPath("journey-secretary-draft"), fullPage: true });
  });

  it("previews it: the letter is in, the write-up left out is not", async () => {
    await journey.page.getByRole("link", { name: "Preview and issue" }).click();
    await journey.page.getByRole("heading", { level: 1, name: "Preview: Yearly digest 2025" }).waitFor();
    const documentText = await journey.page.locator("main").textContent();
    expect(documentText).toContain(LETTER);
    expect(documentText).not.toContain(leftOut);
    for (const title of published2025.filter((t) => t !== leftOut)) expect(documentText).toContain(title);
    await journey.page.screenshot({ path: screenshotPath("journey-secretary-preview"), fullPage: true });
  });

  it("cannot issue without ticking the confirmation, then issues it with the e-mail", async () => {
    await journey.page.waitForSelector("form[novalidate]", { state: "attached" });
    const optedIn = members.filter((m) => m.digest).length;
    await journey.page.getByLabel(/E-mail it to the \d+ members/).check();
    expect(await journey.page.getByText(`E-mail it to the ${optedIn} members`, { exact: false }).count()).toBe(1);
    await journey.page.getByRole("button", { name: "Issue the digest" }).click();
    await journey.page.getByText("Tick the box to confirm").waitFor();
    await journey.page.getByLabel(/I have read the preview/).check();
    await journey.page.getByRole("button", { name: "Issue the digest" }).click();
    await journey.page.waitForURL(/\/digest\/2025\?edition=1/);
    await journey.page.getByText("Yearly digest 2025 is issued.").waitFor();
    const editions = await journey.server.database.pool.query("select count(*)::int as n from digest_editions where year = 2025 and status = 'issued'");
    expect(editions.rows[0].n).toBe(1);
  });

  it("members who asked for the digest receive it with their own unsubscribe link; others do not", async () => {
    const hal = await waitForMail(mailboxDir(), (m) => m.to.includes("hal.dunmore@example.com") && /yearly digest 2025/.test(m.subject) && m.receivedAt >= startedAt, 30_000);
    expect(hal.text).toContain("/digest/unsubscribe");
    expect(hal.text).toContain(journey.server.baseUrl);
    const optedOut = members.filter((m) => !m.digest).map((m) => m.email);
    expect(optedOut.length).toBeGreaterThan(0);
    const mine = readMailbox().filter((m) => /yearly digest 2025/.test(m.subject) && m.text.includes(journey.server.baseUrl));
    for (const email of optedOut) expect(mine.some((m) => m.to.includes(email)), email).toBe(false);
  });

  it("a reader finds the issued digest in the public archive", async () => {
    await journey.page.getByRole("button", { name: "Sign out", exact: true }).click();
    await journey.page.getByRole("link", { name: "Sign in", exact: true }).waitFor();
    await journey.page.goto(`${journey.server.baseUrl}/digest`);
    await journey.page.getByRole("heading", { level: 1, name: "The yearly digest" }).waitFor();
    expect(await journey.page.locator("main").textContent()).toContain(`${published2025.length - 1} write-ups`);
    await journey.page.getByRole("link", { name: "2025", exact: true }).click();
    await journey.page.waitForURL(/\/digest\/2025/);
    await journey.page.getByText(LETTER).first().waitFor();
    const text = await journey.page.locator("main").textContent();
    expect(text).toContain(LETTER);
    expect(text).not.toContain(leftOut);
    await journey.page.screenshot({ path: screenshotPath("journey-secretary-archive"), fullPage: true });
  });

  it("saw no errors in the browser", () => {
    expect(journey.errors).toEqual([]);
  });
});
