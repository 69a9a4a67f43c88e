import { sql } from "drizzle-orm";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { appDatabase } from "../support/app";

let t: Awaited<ReturnType<typeof appDatabase>>;
let m: typeof import("~/models/writeup-editing.server");
let w: typeof import("~/models/writeups.server");
let schemaFor: typeof import("~/domain/writeup-form").writeupFormSchema;
const ids: Record<string, number> = {};

beforeAll(async () => {
  t = await appDatabase("template_seeded");
  m = await import("~/models/writeup-editing.server");
  w = await import("~/models/writeups.server");
  schemaFor = (await import("~/domain/writeup-form")).writeupFormSchema;
  const r = await t.db.execute<{ id: number; email: string }>(sql`select id, email from users`);
  for (const row of r.rows) ids[row.email] = row.id;
});
afterAll(async () => t?.drop());

const author = () => ids["lena.marchetti@example.com"];
const moderator = () => ids["nora.pelling@example.org"];
const otherModerator = () => ids["gareth.lindqvist@example.com"];

function value(overrides: Record<string, unknown> = {}) {
  const schema = schemaFor({ systems: ["electrical", "joinery", "trim"], zones: ["port-settee", "starboard-settee"], weightUnit: "lb" });
  return schema.parse({
    title: "A shelf for the battery charger in the port settee",
    summary: "A plywood shelf that holds the charger clear of the bilge water.",
    body: "## Steps\n\n1. Measure.\n2. Cut.\n\nThe charger feeds the battery through a 10 A fuse.",
    systems: ["electrical", "joinery"],
    zones: ["port-settee"],
    appliesTo: "mk2",
    parts: [{ name: "Marine plywood, 12 mm", quantity: "1", weight: "3 lb 8 oz", note: "" }],
    ...overrides,
  });
}

async function outbox(to: string) {
  const r = await t.db.execute<{ subject: string; text_body: string }>(sql`select subject, text_body from outbox where to_address = ${to} order by id`);
  return r.rows;
}

describe("the life cycle of a write-up", () => {
  let writeupId: number;

  it("a member saves a draft that only they see, with parts converted to kilograms", async () => {
    const saved = await m.saveDraft(t.db, { authorId: author(), writeupId: null, value: value(), weightUnit: "lb" });
    writeupId = saved.writeupId;
    const rev = await m.getRevision(t.db, saved.revisionId);
    expect(rev?.status).toBe("draft");
    // 3 lb 8 oz = 3.5 lb x 0.45359237 kg/lb (NIST Handbook 44, Appendix C: the pound is exactly 0.45359237 kg)
    expect(rev?.parts[0].weightKg).toBeCloseTo(3.5 * 0.45359237, 10);
    expect(rev?.hullFrom).toBe(299);
    const [row] = (await t.db.execute<{ slug: string }>(sql`select slug from writeups where id = ${writeupId}`)).rows;
    expect(await w.getPublishedWriteup(t.db, row.slug)).toBeNull();
    const mine = await m.listMyWriteups(t.db, author());
    expect(mine.map((x) => [x.id, x.latestTitle, x.latestStatus])).toEqual([[writeupId, "A shelf for the battery charger in the port settee", "draft"]]);
  });

  it("only the author edits it; a moderator cannot decide on a draft", async () => {
    await expect(m.saveDraft(t.db, { authorId: moderator(), writeupId, value: value(), weightUnit: "lb" })).rejects.toThrow(/Only the author/);
    const rev = (await m.getForEditing(t.db, writeupId))!.revision;
    await expect(m.decide(t.db, { revisionId: rev.id, moderatorId: moderator(), decision: "publish", reason: "", checklist: {}, appUrl: "http://x" })).rejects.toThrow(/cannot be published/);
  });

  it("submitted, it waits for review and the author can no longer change it", async () => {
    await m.submitForReview(t.db, writeupId, author());
    const queue = await m.reviewQueue(t.db, { system: "joinery" });
    expect(queue.map((q) => q.writeupId)).toContain(writeupId);
    expect((await m.reviewQueue(t.db, { system: "rigging" })).map((q) => q.writeupId)).not.toContain(writeupId);
    await expect(m.saveDraft(t.db, { authorId: author(), writeupId, value: value(), weightUnit: "lb" })).rejects.toThrow(/with the moderators/);
  });

  it("asking for changes needs a reason, is recorded with who and why, and e-mails the author", async () => {
    const rev = (await m.getForEditing(t.db, writeupId))!.revision;
    await expect(m.decide(t.db, { revisionId: rev.id, moderatorId: moderator(), decision: "request_changes", reason: "no", checklist: {}, appUrl: "http://x" })).rejects.toThrow(/Tell the author why/);
    await m.decide(t.db, { revisionId: rev.id, moderatorId: moderator(), decision: "request_changes", reason: "Please add the charger's weight and how the shelf is fixed.", checklist: { cautions: true }, appUrl: "http://x" });
    const decisions = await m.listDecisions(t.db, writeupId);
    expect(decisions[0]).toMatchObject({ decision: "request_changes", by: "Nora Pelling", reason: "Please add the charger's weight and how the shelf is fixed." });
    const mails = await outbox("lena.marchetti@example.com");
    expect(mails.at(-1)?.subject).toMatch(/^Changes asked:/);
    expect(mails.at(-1)?.text_body).toContain("how the shelf is fixed");
  });

  it("the author revises and resubmits; a moderator publishes; readers see it", async () => {
    await m.saveDraft(t.db, { authorId: author(), writeupId, value: value({ summary: "A plywood shelf, screwed and glued to the settee front, that holds the 4 lb charger clear of the bilge." }), weightUnit: "lb" });
    await m.submitForReview(t.db, writeupId, author());
    const rev = (await m.getForEditing(t.db, writeupId))!.revision;
    expect(rev.number).toBe(1); // the same revision, revised while it was sent back
    await m.decide(t.db, { revisionId: rev.id, moderatorId: otherModerator(), decision: "publish", reason: "", checklist: { cautions: true, measurements: true, photos: true, tone: true }, appUrl: "http://x" });
    const [row] = (await t.db.execute<{ slug: string }>(sql`select slug from writeups where id = ${writeupId}`)).rows;
    const published = await w.getPublishedWriteup(t.db, row.slug);
    expect(published?.summary).toMatch(/4 lb charger/);
    expect(published?.systems.map((x) => x.slug).sort()).toEqual(["electrical", "joinery"]);
    expect((await outbox("lena.marchetti@example.com")).at(-1)?.subject).toMatch(/^Published:/);
  });

  it("editing a published write-up makes a new revision; the published text stays until it is reviewed", async () => {
    const saved = await m.saveDraft(t.db, { authorId: author(), writeupId, value: value({ title: "A shelf for the charger in the port settee (revised)" }), weightUnit: "lb" });
    const rev = await m.getRevision(t.db, saved.revisionId);
    expect(rev?.number).toBe(2);
    const [row] = (await t.db.execute<{ slug: string; title: string }>(sql`select slug, title from writeups where id = ${writeupId}`)).rows;
    expect(row.title).toBe("A shelf for the battery charger in the port settee");
    await m.submitForReview(t.db, writeupId, author());
    const review = await m.getForReview(t.db, saved.revisionId);
    expect(review?.previous?.number).toBe(1);
    await m.decide(t.db, { revisionId: saved.revisionId, moderatorId: moderator(), decision: "publish", reason: "", checklist: { cautions: true, measurements: true, photos: true, tone: true }, appUrl: "http://x" });
    expect((await w.getPublishedWriteup(t.db, row.slug))?.title).toBe("A shelf for the charger in the port settee (revised)");
  });

  it("a moderator never reviews their own write-up", async () => {
    const saved = await m.saveDraft(t.db, { authorId: moderator(), writeupId: null, value: value({ title: "Nora's own write-up about a shelf" }), weightUnit: "lb" });
    await m.submitForReview(t.db, saved.writeupId, moderator());
    await expect(m.decide(t.db, { revisionId: saved.revisionId, moderatorId: moderator(), decision: "publish", reason: "", checklist: {}, appUrl: "http://x" })).rejects.toThrow(/Another moderator/);
  });

  it("a declined write-up is not shown; the author may withdraw theirs", async () => {
    const saved = await m.saveDraft(t.db, { authorId: author(), writeupId: null, value: value({ title: "A second shelf, declined" }), weightUnit: "lb" });
    await m.submitForReview(t.db, saved.writeupId, author());
    await m.decide(t.db, { revisionId: saved.revisionId, moderatorId: moderator(), decision: "decline", reason: "This repeats the write-up published last week.", checklist: {}, appUrl: "http://x" });
    const [row] = (await t.db.execute<{ slug: string; status: string }>(sql`select slug, status from writeups where id = ${saved.writeupId}`)).rows;
    expect(row.status).toBe("declined");
    expect(await w.getPublishedWriteup(t.db, row.slug)).toBeNull();
    await m.withdraw(t.db, writeupId, { id: author(), isModerator: false });
    const [first] = (await t.db.execute<{ slug: string }>(sql`select slug from writeups where id = ${writeupId}`)).rows;
    expect(await w.getPublishedWriteup(t.db, first.slug)).toBeNull();
  });
});
