// Journey of a member (Hal Dunmore, hull 211, a Mk I), on a clean copy of the demo database and a
// server of this file's own: he measures the aft bay under his starboard settee, adds the
// measurement with a photo of the tape in place, sees the consensus move, then writes up the job
// with a photo and sends it for review. Everything he typed and uploaded must be stored.
import fs from "node:fs";
import os from "node:os";
import path from "node:path";
import sharp from "sharp";
import { beforeAll, describe, expect, it } from "vitest";
import { signInAs } from "../support/auth";
import { screenshotPath } from "../support/browser";
import { journeyOnItsOwnServer } from "../support/journey";
import { medianOf, readSeedSpaces } from "../support/seed-spaces";

const journey = journeyOnItsOwnServer("journey-member");
const SLUG = "starboard-settee-aft-late-mk1";
const TITLE = "A fiddled shelf over the starboard settee bay";

async function count(table: string): Promise<number> {
  const r = await journey.server.database.pool.query(`select count(*)::int as n from ${table}`);
  return r.rows[0].n;
}

async function photoFile(name: string, colour: { r: number; g: number; b: number }): Promise<string> {
  const file = path.join(os.tmpdir(), `${name}-${process.pid}.jpg`);
  fs.writeFileSync(file, await sharp({ create: { width: 800, height: 600, channels: 3, background: colour } }).jpeg().toBuffer());
  return file;
}

const before: Record<string, number> = {};

beforeAll(async () => {
  for (const t of ["space_measurements", "photos", "writeups", "writeup_revisions"]) before[t] = await count(t);
  journey.page.on("dialog", (d) => { journey.errors.push(`a dialog opened: ${d.message()}`); void d.dismiss(); });
});

// The seeded measurements of the bay (content-seed/spaces.yaml) plus Hal's new one, in inches.
const seeded = readSeedSpaces().find((s) => s.slug === SLUG)!;
const mine = { lengthIn: 24.75, widthIn: 14.25, heightIn: 11.5 };

describe("a member adds a measurement and writes up the job", () => {
  it("signs in", async () => {
    await signInAs(journey.page, "hal.dunmore@example.com", undefined, journey.server.baseUrl);
    await journey.page.getByRole("button", { name: "Sign out", exact: true }).waitFor();
  });

  it("is told what is wrong with a size, next to the field, and keeps what he typed", async () => {
    await journey.page.goto(`${journey.server.baseUrl}/spaces/${SLUG}`);
    // The site writes the hull range of the seed's name ("hulls 120-298") with an en dash.
    await journey.page.getByRole("heading", { level: 1, name: seeded.name.replace(/(\d)-(\d)/g, "$1–$2") }).waitFor();
    await journey.page.waitForSelector("#measurement-form[novalidate]", { state: "attached" }); // hydrated
    expect(await journey.page.locator("#measurements tbody tr").count()).toBe(seeded.measurements!.length);
    await journey.page.getByLabel("Length (fore and aft)").fill("24 3/4");
    await journey.page.getByLabel("Width (athwartships)").fill("14 1/4");
    await journey.page.getByLabel("Height").fill("eleven and a half");
    await journey.page.getByLabel("Hull number of the boat measured").fill("211");
    await journey.page.getByRole("button", { name: "Add my measurement" }).click();
    const height = journey.page.getByLabel("Height");
    await expect.poll(() => height.getAttribute("aria-invalid")).toBe("true");
    const errorId = (await height.getAttribute("aria-describedby"))!.split(" ").find((id) => id.endsWith("-error"))!;
    expect((await journey.page.locator(`[id="${errorId}"]`).textContent())!.trim().length).toBeGreaterThan(5);
    expect(await journey.page.getByLabel("Length (fore and aft)").inputValue()).toBe("24 3/4");
    expect(await count("space_measurements")).toBe(before.space_measurements);
  });

  it("adds the measurement with a photo, and the consensus moves to the new median", async () => {
    await journey.page.getByLabel("Height").fill("11 1/2");
    await journey.page.getByLabel("Tape").check();
    await journey.page.getByLabel("A photo (optional)").setInputFiles(await photoFile("tape-in-bay", { r: 170, g: 150, b: 110 }));
    await journey.page.getByRole("button", { name: "Add my measurement" }).click();
    await journey.page.getByText("Thank you: your measurement is added").waitFor();
    expect(await journey.page.locator("#measurements tbody tr").count()).toBe(seeded.measurements!.length + 1);
    const row = journey.page.locator("#measurements tbody tr", { hasText: "24 3/4 in" });
    expect(await row.locator("img").count()).toBe(1);
    // The consensus is the median of each dimension: with his 24 3/4 in the four lengths
    // 24 3/8, 24 1/2, 24 5/8, 24 3/4 give 24 9/16 in (median of an even count: the mean of the middle two).
    const lengths = [...seeded.measurements!.map((m) => m.lengthIn), mine.lengthIn];
    expect(medianOf(lengths)).toBe(24.5625);
    const consensus = journey.page.getByRole("row", { name: /Consensus \(median\)/ });
    expect(await consensus.textContent()).toContain("24 9/16 in");
    await journey.page.screenshot({ path: screenshotPath("journey-member-measurement"), fullPage: true });

    // Stored in millimetres, exactly: 1 in = 25.4 mm (NIST Handbook 44, Appendix C).
    const stored = await journey.server.database.pool.query(
      `select m.length_mm, m.width_mm, m.height_mm, m.hull_number, m.method, m.photo_id from space_measurements m
       join spaces s on s.id = m.space_id join users u on u.id = m.user_id
       where s.slug = $1 and u.email = 'hal.dunmore@example.com' order by m.id desc limit 1`, [SLUG]);
    const m = stored.rows[0];
    expect(m.length_mm).toBeCloseTo(mine.lengthIn * 25.4, 9);
    expect(m.width_mm).toBeCloseTo(mine.widthIn * 25.4, 9);
    expect(m.height_mm).toBeCloseTo(mine.heightIn * 25.4, 9);
    expect(m.hull_number).toBe(211);
    expect(m.method).toBe("tape");
    expect(m.photo_id).not.toBeNull();
    expect(await count("space_measurements")).toBe(before.space_measurements + 1);
  });

  it("writes up the job with a photo and sends it for review", async () => {
    await journey.page.getByRole("link", { name: "Your write-ups", exact: true }).click();
    await journey.page.getByRole("link", { name: "Write up a job" }).click();
    await journey.page.getByRole("heading", { level: 1, name: "A new write-up" }).waitFor();
    await journey.page.waitForSelector("form[novalidate]", { state: "attached" });
    await journey.page.getByLabel("Title").fill(TITLE);
    await journey.page.getByLabel("Summary").fill("A shelf with a 3/4 in fiddle fitted over the outboard part of the aft settee bay, clear of the tank fill hose.");
    await journey.page.getByLabel("The write-up").fill(
      "## What I measured\n\n| part | size |\n|---|---|\n| bay, main part | 24 3/4 x 14 1/4 x 11 1/2 in |\n| shelf | 22 x 4 in |\n\n" +
      "I measured with a tape, wall to wall, and added the measurement to the space.",
    );
    await journey.page.getByTestId("preview").locator("table").waitFor();
    await journey.page.getByLabel("Joinery").check();
    await journey.page.getByRole("button", { name: "Add a part" }).click();
    await journey.page.getByLabel("Part 1 name").fill("Plywood shelf, 1/2 in");
    await journey.page.getByLabel("Part 1 weight").fill("3 lb");
    await journey.page.getByRole("button", { name: "Add a photo" }).click();
    await journey.page.getByLabel("Photo", { exact: true }).setInputFiles(await photoFile("shelf", { r: 120, g: 90, b: 60 }));
    await journey.page.getByLabel("Caption").fill("The shelf in place");
    await journey.page.getByLabel("What the photo shows (for readers who cannot see it)").fill("A plywood shelf with a low fiddle along the hull side");
    await journey.page.getByRole("button", { name: "Upload and insert" }).click();
    await journey.page.getByTestId("preview").locator('img[src^="/media/photos/"]').waitFor();
    await journey.page.screenshot({ path: screenshotPath("journey-member-editor"), fullPage: true });
    await journey.page.getByRole("button", { name: "Send for review" }).click();
    await journey.page.getByText("Sent to the moderators").waitFor();

    const r = await journey.server.database.pool.query(
      "select status, body_markdown, parts from writeup_revisions where title = $1", [TITLE]);
    expect(r.rows.length).toBe(1);
    expect(r.rows[0].status).toBe("awaiting_review");
    expect(r.rows[0].body_markdown).toContain("24 3/4 x 14 1/4 x 11 1/2 in");
    expect(r.rows[0].body_markdown).toMatch(/!\[[^\]]+\]\(\/media\/photos\//);
    // 3 lb kept in kilograms: 1 lb = 0.45359237 kg exactly (NIST Handbook 44, Appendix C).
    expect(r.rows[0].parts[0].name).toBe("Plywood shelf, 1/2 in");
    expect(r.rows[0].parts[0].weightKg).toBeCloseTo(3 * 0.45359237, 9);
    expect(await count("writeups")).toBe(before.writeups + 1);
    // Two photos stored: the tape in the bay, and the shelf.
    expect(await count("photos")).toBe(before.photos + 2);
  });

  it("finds it in his list as waiting for review", async () => {
    await journey.page.getByRole("link", { name: "Your write-ups", exact: true }).click();
    const row = journey.page.locator("main li, main tr", { hasText: TITLE }).first();
    await row.waitFor();
    expect(await row.textContent()).toMatch(/review/i);
    await journey.page.screenshot({ path: screenshotPath("journey-member-list"), fullPage: true });
  });

  it("saw no errors in the browser", () => {
    expect(journey.errors).toEqual([]);
  });
});
