// Journey of a moderator (Nora Pelling), on a clean copy of the demo database and a server of this
// file's own: the two write-ups the demo content leaves waiting for review are in her queue; she
// asks for changes to one with a reason, publishes the other after the checklist, and readers find
// it. Each author is e-mailed the decision.
import { describe, expect, it } from "vitest";
import { signInAs } from "../support/auth";
import { screenshotPath } from "../support/browser";
import { journeyOnItsOwnServer } from "../support/journey";
import { mailboxDir, waitForMail } from "../support/mailbox";
import { readSeedWriteups } from "../support/seed-files";

const journey = journeyOnItsOwnServer("journey-moderator");


// What the demo content leaves waiting (content-seed/writeups/*.md, status awaiting-review).
const waiting = readSeedWriteups().filter((w) => w.status === "awaiting-review").map((w) => w.title).sort();
const LIGHTS = "LED cabin lights and a rewired lighting circuit";
const HEAD = "Marine head out, portable toilet in, two thru-hulls glassed over";
const REASON = "Please give the fuse rating and where it sits, and say how the new wire is supported.";

async function decisions(): Promise<{ title: string; decision: string; reason: string }[]> {
  const r = await journey.server.database.pool.query(
    `select r.title, d.decision, d.reason from review_decisions d join writeup_revisions r on r.id = d.revision_id order by d.id`);
  return r.rows;
}

describe("a moderator reviews the queue", () => {
  it("sees the write-ups waiting for review", async () => {
    expect(waiting).toEqual([LIGHTS, HEAD].sort());
    await signInAs(journey.page, "nora.pelling@example.org", undefined, journey.server.baseUrl);
    await journey.page.getByRole("link", { name: "Review", exact: true }).click();
    await journey.page.getByRole("heading", { level: 1, name: "Waiting for review" }).waitFor();
    for (const title of waiting) await journey.page.getByRole("link", { name: title }).waitFor();
    await journey.page.screenshot({ path: screenshotPath("journey-moderator-queue"), fullPage: true });
  });

  it("is told when a filter hides every waiting write-up, not that nothing waits, and clears it", async () => {
    await journey.page.getByLabel("Author").fill("nobody of that name");
    await journey.page.getByRole("button", { name: "Filter" }).click();
    await journey.page.getByText("No write-up waiting for review matches this filter.").waitFor();
    expect(await journey.page.getByText("Nothing is waiting").count()).toBe(0);
    await journey.page.getByRole("link", { name: "Show every write-up waiting" }).click();
    for (const title of waiting) await journey.page.getByRole("link", { name: title }).waitFor();
  });

  it("asks for changes: a reason is required, and then the author is e-mailed it", async () => {
    await journey.page.getByRole("link", { name: LIGHTS }).click();
    await journey.page.getByRole("heading", { level: 1, name: LIGHTS }).waitFor();
    // An electrical job shows the wiring cautions beside the text, for the reviewer to hold it to.
    expect(await journey.page.getByText("ABYC", { exact: false }).count()).toBeGreaterThan(0);
    await journey.page.getByLabel("Ask for changes").check();
    await journey.page.getByRole("button", { name: "Record the decision" }).click();
    await journey.page.getByText("Tell the author why").waitFor();
    expect(await decisions()).toEqual([]);
    await journey.page.getByLabel("Why (sent to the author)").fill(REASON);
    await journey.page.getByRole("button", { name: "Record the decision" }).click();
    await journey.page.getByText("The author has been e-mailed").waitFor();
    const mail = await waitForMail(mailboxDir(), (m) => m.to.includes("joan.pettifer@example.org") && m.subject.startsWith("Changes asked") && m.text.includes(REASON));
    expect(mail.text).toContain(LIGHTS);
  });

  it("publishes the other only once every point of the checklist is ticked", async () => {
    await journey.page.getByRole("link", { name: HEAD }).click();
    await journey.page.getByRole("heading", { level: 1, name: HEAD }).waitFor();
    await journey.page.getByLabel("Publish").check();
    await journey.page.getByRole("button", { name: "Record the decision" }).click();
    await journey.page.getByText("Tick every point of the checklist").waitFor();
    expect((await decisions()).length).toBe(1);
    const boxes = await journey.page.locator('input[name^="check."]').all();
    expect(boxes.length).toBeGreaterThan(1);
    for (const box of boxes) await box.check();
    await journey.page.getByLabel("Publish").check();
    await journey.page.screenshot({ path: screenshotPath("journey-moderator-decision"), fullPage: true });
    await journey.page.getByRole("button", { name: "Record the decision" }).click();
    await journey.page.getByText("The author has been e-mailed").waitFor();
    await journey.page.getByText("Nothing is waiting. Thank you.").waitFor();
    expect(await decisions()).toEqual([
      { title: LIGHTS, decision: "request_changes", reason: REASON },
      { title: HEAD, decision: "publish", reason: "" },
    ]);
    await waitForMail(mailboxDir(), (m) => m.to.includes("priya.dalton@example.com") && m.subject.startsWith("Published") && m.text.includes("/writeups/"));
  });

  it("readers find the published write-up; the one sent back stays out of sight", async () => {
    await journey.page.getByRole("button", { name: "Sign out", exact: true }).click();
    await journey.page.getByRole("link", { name: "Sign in", exact: true }).waitFor();
    await journey.page.goto(journey.server.baseUrl);
    await journey.page.getByRole("link", { name: HEAD }).first().click();
    await journey.page.getByRole("heading", { level: 1, name: HEAD }).waitFor();
    await journey.page.goto(`${journey.server.baseUrl}/search?q=${encodeURIComponent("LED cabin lights")}`);
    await journey.page.getByRole("heading", { level: 1 }).waitFor();
    expect(await journey.page.locator("main article h3").allTextContents()).not.toContain(LIGHTS);
    await journey.page.screenshot({ path: screenshotPath("journey-moderator-published"), fullPage: true });
  });

  it("saw no errors in the browser", () => {
    expect(journey.errors).toEqual([]);
  });
});
