// The yearly digest against a database of this file's own: the figures it prints are checked
// against counts this test makes itself (its own SQL, and the demo files in content-seed/), and
// the secretary's arranging, issuing, mailing, freezing, correcting and the unsubscribe link are
// driven through the route modules, as the browser would.
import fs from "node:fs";
import path from "node:path";
import { sql } from "drizzle-orm";
import sharp from "sharp";
import { extractText, getDocumentProxy } from "unpdf";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { appDatabase, cookieFrom, formRequest, getRequest, settle } from "../support/app";
import { ARTIFACTS_DIR } from "../support/browser";
import { readSeedWriteups, readSeedYaml } from "../support/seed-files";

let t: Awaited<ReturnType<typeof appDatabase>>;
let signIn: typeof import("~/routes/sign-in");
let compilePage: typeof import("~/routes/secretary.digest");
let draftPage: typeof import("~/routes/secretary.digest.$year");
let previewPage: typeof import("~/routes/secretary.digest.$year.preview");
let yearPage: typeof import("~/routes/digest.$year");
let unsubscribePage: typeof import("~/routes/digest.unsubscribe");
let digests: typeof import("~/models/digests.server");
let links: typeof import("~/services/unsubscribe.server");
let DEMO_PASSWORD: string;

// Invented demo members (content-seed/members.yaml).
const RUTH = "ruth.ambler@example.org"; // class secretary
const LENA = "lena.marchetti@example.com"; // member only
const YEAR = 2025; // the demo year: most of the seed's write-ups were published in it

beforeAll(async () => {
  t = await appDatabase("template_seeded");
  [signIn, compilePage, draftPage, previewPage, yearPage, unsubscribePage, digests, links] = await Promise.all([
    import("~/routes/sign-in"), import("~/routes/secretary.digest"), import("~/routes/secretary.digest.$year"),
    import("~/routes/secretary.digest.$year.preview"), import("~/routes/digest.$year"), import("~/routes/digest.unsubscribe"),
    import("~/models/digests.server"), import("~/services/unsubscribe.server"),
  ]);
  ({ DEMO_PASSWORD } = await import("../../scripts/seed-content"));
});
afterAll(async () => {
  await (await import("~/services/pdf.server")).closePdfBrowser();
  await (await import("~/db/index.server")).pool.end();
  await t?.drop();
});

const args = (request: Request, params: Record<string, string> = {}) => ({ request, params, context: {} }) as never;
const cookies = new Map<string, string>();

async function cookieOf(email: string) {
  const known = cookies.get(email);
  if (known) return known;
  const address = `198.18.${Math.floor(Math.random() * 250)}.${Math.floor(Math.random() * 250)}`; // RFC 2544 benchmarking range
  const r = await settle(() => signIn.action(args(formRequest("/sign-in", { email, password: DEMO_PASSWORD, redirectTo: "/" }, { address }))));
  expect(r.status).toBe(302);
  const cookie = cookieFrom(r.response!);
  cookies.set(email, cookie);
  return cookie;
}

async function rows<T>(query: ReturnType<typeof sql>): Promise<T[]> {
  return (await t.db.execute(query)).rows as T[];
}

async function draftEntries(year: number) {
  const r = await settle(async () => draftPage.loader(args(getRequest(`/secretary/digest/${year}`, await cookieOf(RUTH)), { year: String(year) })));
  expect(r.status).toBe(200);
  return (r.data as { sections: { slug: string; entries: { writeupId: number; slug: string; title: string; included: boolean }[] }[] }).sections;
}

async function postDraft(year: number, fields: Record<string, string>) {
  return settle(async () => draftPage.action(args(formRequest(`/secretary/digest/${year}`, fields, { cookie: await cookieOf(RUTH) }), { year: String(year) })));
}

const inYear = (iso: string | undefined, year: number) => !!iso && new Date(iso).getUTCFullYear() === year;

describe("compiling a year", () => {
  it("is for secretaries and administrators only", async () => {
    const member = await settle(async () => compilePage.loader(args(getRequest("/secretary/digest", await cookieOf(LENA)))));
    expect(member.status).toBe(403);
    const anonymous = await settle(() => compilePage.loader(args(getRequest("/secretary/digest"))));
    expect(anonymous.status).toBe(302);
    expect(anonymous.response!.headers.get("location")).toMatch(/^\/sign-in/);
  });

  it("refuses a year without write-ups, beside the year field, keeping what was typed", async () => {
    const r = await settle(async () => compilePage.action(args(formRequest("/secretary/digest", { year: "1999" }, { cookie: await cookieOf(RUTH) }))));
    expect(r.status).toBe(400);
    const result = (r.data as { result: { error: Record<string, string[]>; initialValue: Record<string, string> } }).result;
    expect(result.error.year[0]).toContain("No write-ups were published in 1999");
    expect(result.initialValue.year).toBe("1999");
    const bad = await settle(async () => compilePage.action(args(formRequest("/secretary/digest", { year: "twenty" }, { cookie: await cookieOf(RUTH) }))));
    expect(bad.status).toBe(400);
  });

  it("takes every write-up published in the year, grouped by system", async () => {
    const r = await settle(async () => compilePage.action(args(formRequest("/secretary/digest", { year: String(YEAR) }, { cookie: await cookieOf(RUTH) }))));
    expect(r.status).toBe(302);
    expect(r.response!.headers.get("location")).toBe(`/secretary/digest/${YEAR}`);
    const sections = await draftEntries(YEAR);
    const slugs = sections.flatMap((s) => s.entries.map((e) => e.slug)).sort();
    // Independently: the published write-ups of the demo files dated in the year.
    const expected = readSeedWriteups().filter((w) => w.status === "published" && inYear(w.publishedAt, YEAR)).map((w) => w.slug).sort();
    expect(expected.length).toBe(7);
    expect(slugs).toEqual(expected);
    // Listed under the write-up's first system in the taxonomy's order.
    const taxonomy = readSeedYaml<{ systems: { slug: string }[] }>("taxonomy.yaml").systems.map((s) => s.slug);
    for (const w of readSeedWriteups().filter((x) => expected.includes(x.slug))) {
      const first = [...w.systems].sort((a, b) => taxonomy.indexOf(a) - taxonomy.indexOf(b))[0];
      expect(sections.find((s) => s.entries.some((e) => e.slug === w.slug))!.slug).toBe(first);
    }
    // Sections follow the taxonomy's order.
    const order = sections.map((s) => taxonomy.indexOf(s.slug));
    expect(order).toEqual([...order].sort((a, b) => a - b));
  });
});

describe("the figures of the year", () => {
  it("match counts computed independently from the database and the demo files", async () => {
    // The demo seed has members marking some of the year's write-ups "done on my boat too"
    // (content-seed: the owners of hulls 147, 288, 402 and 61 on the stanchion write-up, of 356
    // and 468 on the forepeak bins); the author's own hull (523) is added here, and must not count.
    await t.db.execute(sql`
      insert into done_too (writeup_id, hull_number, user_id)
      select w.id, 523, (select bo.user_id from boat_owners bo join boats b on b.id = bo.boat_id where b.hull_number = 523 limit 1)
      from writeups w where w.slug = 'rebedding-stanchion-bases-with-butyl'`);
    const draft = await digests.getDraft(t.db, YEAR);
    const snapshot = await digests.buildSnapshot(t.db, draft!.edition.id);
    const f = snapshot.figures;

    // Write-ups published in the year: own SQL (by the year of the date in UTC) ...
    const [{ n: published }] = await rows<{ n: number }>(sql`
      select count(*)::int as n from writeups where status = 'published' and date_part('year', published_at at time zone 'UTC') = ${YEAR}`);
    expect(f.writeupsPublished).toBe(published);
    // ... and the demo files.
    expect(f.writeupsPublished).toBe(readSeedWriteups().filter((w) => w.status === "published" && inYear(w.publishedAt, YEAR)).length);

    // Per system: a write-up with two systems counts under each.
    const perSystem = await rows<{ slug: string; n: number }>(sql`
      select ws.system_slug as slug, count(*)::int as n
      from writeup_systems ws join writeups w on w.id = ws.writeup_id
      where w.status = 'published' and date_part('year', w.published_at at time zone 'UTC') = ${YEAR}
      group by ws.system_slug`);
    const fromFiles = new Map<string, number>();
    for (const w of readSeedWriteups().filter((x) => x.status === "published" && inYear(x.publishedAt, YEAR))) {
      for (const s of w.systems) fromFiles.set(s, (fromFiles.get(s) ?? 0) + 1);
    }
    for (const row of f.perSystem) {
      expect({ system: row.slug, count: row.count }).toEqual({ system: row.slug, count: perSystem.find((p) => p.slug === row.slug)?.n ?? 0 });
      expect({ system: row.slug, count: row.count }).toEqual({ system: row.slug, count: fromFiles.get(row.slug) ?? 0 });
    }
    const [{ n: systems }] = await rows<{ n: number }>(sql`select count(*)::int as n from systems`);
    expect(f.perSystem).toHaveLength(systems);
    expect(f.perSystem.reduce((n, r) => n + r.count, 0)).toBe([...fromFiles.values()].reduce((a, b) => a + b, 0));

    // Spaces measured and measurements added: by the date measured.
    const [m] = await rows<{ spaces: number; measurements: number }>(sql`
      select count(distinct space_id)::int as spaces, count(*)::int as measurements
      from space_measurements where date_part('year', measured_on) = ${YEAR}`);
    expect(f.spacesMeasured).toBe(m.spaces);
    expect(f.measurementsAdded).toBe(m.measurements);
    const seedSpaces = readSeedYaml<{ slug: string; measurements?: { date: string | Date }[] }[]>("spaces.yaml");
    const measuredInYear = (s: { measurements?: { date: string | Date }[] }) => (s.measurements ?? []).filter((x) => new Date(x.date).getUTCFullYear() === YEAR).length;
    expect(f.measurementsAdded).toBe(seedSpaces.reduce((n, s) => n + measuredInYear(s), 0));
    expect(f.spacesMeasured).toBe(seedSpaces.filter((s) => measuredInYear(s) > 0).length);
    expect(f.spacesMeasured).toBeGreaterThan(0);

    // New members: accounts opened in the year.
    const [{ n: members }] = await rows<{ n: number }>(sql`select count(*)::int as n from users where date_part('year', created_at at time zone 'UTC') = ${YEAR}`);
    expect(f.newMembers).toBe(members);
    const seedMembers = readSeedYaml<{ joined?: string | Date }[]>("members.yaml");
    expect(f.newMembers).toBe(seedMembers.filter((x) => x.joined && new Date(x.joined).getUTCFullYear() === YEAR).length);

    // Done on the most boats: other boats than the author's, most first.
    const done = await rows<{ slug: string; n: number }>(sql`
      select w.slug, count(*)::int as n from done_too d join writeups w on w.id = d.writeup_id
      where w.status = 'published' and date_part('year', w.published_at at time zone 'UTC') = ${YEAR}
        and not exists (select 1 from boats b where b.id = w.boat_id and b.hull_number = d.hull_number)
      group by w.slug order by n desc, w.slug`);
    expect(done.map((x) => [x.slug, x.n])).toEqual([["rebedding-stanchion-bases-with-butyl", 4], ["storage-bins-under-the-forepeak-infill", 2]]);
    expect(f.mostDoneToo.map((x) => [x.slug, x.count])).toEqual(done.slice(0, 5).map((x) => [x.slug, x.n]));
  });

  it("recount after a member records another boat", async () => {
    const [w] = await rows<{ id: number; slug: string }>(sql`
      select id, slug from writeups where slug = 'safety-gear-stowage-plan-and-bridge-deck-locker'`);
    const [owner] = await rows<{ id: number }>(sql`select u.id from users u where u.email = ${LENA}`);
    const before = (await digests.yearFigures(t.db, YEAR, [w.id])).mostDoneToo.find((x) => x.slug === w.slug)?.count ?? 0;
    await t.db.execute(sql`insert into done_too (writeup_id, hull_number, user_id) values (${w.id}, 318, ${owner.id})`);
    const after = (await digests.yearFigures(t.db, YEAR, [w.id])).mostDoneToo.find((x) => x.slug === w.slug)?.count ?? 0;
    expect(after).toBe(before + 1);
    await t.db.execute(sql`delete from done_too where writeup_id = ${w.id} and hull_number = 318`);
  });
});

describe("arranging, previewing and issuing", () => {
  let leftOut: { writeupId: number; slug: string; title: string };
  let expectedOrder: string[];

  it("leaves one write-up out and moves another within its system", async () => {
    let sections = await draftEntries(YEAR);
    const multi = sections.find((s) => s.entries.length >= 2)!;
    const [first, second] = multi.entries;
    expect((await postDraft(YEAR, { intent: "down", writeupId: String(first.writeupId) })).status).toBe(200);
    // Moving the first of a system up again does nothing.
    sections = await draftEntries(YEAR);
    const moved = sections.find((s) => s.slug === multi.slug)!.entries;
    expect(moved.slice(0, 2).map((e) => e.slug)).toEqual([second.slug, first.slug]);
    expect((await postDraft(YEAR, { intent: "up", writeupId: String(second.writeupId) })).status).toBe(200);
    expect((await draftEntries(YEAR)).find((s) => s.slug === multi.slug)!.entries[0].slug).toBe(second.slug);

    leftOut = sections.find((s) => s.slug !== multi.slug)!.entries[0];
    expect((await postDraft(YEAR, { intent: "leave-out", writeupId: String(leftOut.writeupId) })).status).toBe(200);
    sections = await draftEntries(YEAR);
    expect(sections.flatMap((s) => s.entries).find((e) => e.slug === leftOut.slug)!.included).toBe(false);
    expectedOrder = sections.flatMap((s) => s.entries.filter((e) => e.included).map((e) => e.title));

    const nonsense = await postDraft(YEAR, { intent: "sideways", writeupId: "1" });
    expect(nonsense.status).toBe(400);
  });

  it("keeps the letter, and gives a too-long one back with its error", async () => {
    const letter = "Dear members,\n\nA year of **careful** work. <script>alert(1)</script>\n\n- Ruth";
    const saved = await postDraft(YEAR, { intent: "letter", letter, correctionNote: "" });
    expect(saved.status).toBe(302);
    const tooLong = await postDraft(YEAR, { intent: "letter", letter: "x".repeat(20_001), correctionNote: "" });
    expect(tooLong.status).toBe(400);
    const result = (tooLong.data as { result: { error: Record<string, string[]>; initialValue: Record<string, string> } }).result;
    expect(result.error.letter[0]).toMatch(/under 20,000 characters/);
    expect(result.initialValue.letter).toHaveLength(20_001);
    const draft = await digests.getDraft(t.db, YEAR);
    expect(draft!.edition.editorLetter).toBe(letter);
  });

  it("previews exactly what will be issued, and issues it to every member who opted in", async () => {
    const cookie = await cookieOf(RUTH);
    const preview = await settle(() => previewPage.loader(args(getRequest(`/secretary/digest/${YEAR}/preview`, cookie), { year: String(YEAR) })));
    const snapshot = (preview.data as { snapshot: import("~/domain/digest").DigestSnapshot }).snapshot;
    const previewTitles = snapshot.sections.flatMap((s) => s.entries.map((e) => e.title));
    expect(previewTitles).toEqual(expectedOrder);
    expect(previewTitles).not.toContain(leftOut.title);
    // The letter's markup is sanitised (OWASP XSS Prevention Cheat Sheet: no script from user text).
    expect(snapshot.letterHtml).toContain("<strong>careful</strong>");
    expect(snapshot.letterHtml).not.toContain("<script");

    const unticked = await settle(() => previewPage.action(args(formRequest(`/secretary/digest/${YEAR}/preview`, { sendEmail: "on" }, { cookie }), { year: String(YEAR) })));
    expect(unticked.status).toBe(400);
    expect((unticked.data as { result: { error: Record<string, string[]> } }).result.error.confirm[0]).toMatch(/Tick the box/);

    const issued = await settle(() => previewPage.action(args(formRequest(`/secretary/digest/${YEAR}/preview`, { confirm: "on", sendEmail: "on" }, { cookie }), { year: String(YEAR) })));
    expect(issued.status).toBe(302);
    expect(issued.response!.headers.get("location")).toBe(`/digest/${YEAR}?edition=1`);

    // The public page shows the frozen edition, to anyone.
    const page = await settle(() => yearPage.loader(args(getRequest(`/digest/${YEAR}`), { year: String(YEAR) })));
    const shown = (page.data as { snapshot: import("~/domain/digest").DigestSnapshot }).snapshot;
    expect(shown.sections.flatMap((s) => s.entries.map((e) => e.title))).toEqual(expectedOrder);
    expect(shown.issuedAt).not.toBeNull();

    // One e-mail per member who asked for the digest and confirmed their address; no one else.
    const optedIn = readSeedYaml<{ email: string; digest?: boolean }[]>("members.yaml").filter((m) => m.digest !== false).map((m) => m.email).sort();
    const [{ n: optedInDb }] = await rows<{ n: number }>(sql`select count(*)::int as n from users where digest_opt_in and email_verified_at is not null`);
    expect(optedIn.length).toBe(optedInDb);
    const mail = await rows<{ to_address: string; subject: string; text_body: string; html_body: string }>(sql`
      select to_address, subject, text_body, html_body from outbox where kind = 'digest' order by to_address`);
    expect(mail.map((m) => m.to_address)).toEqual(optedIn);
    for (const m of mail) {
      expect(m.subject).toBe(`Brantwater 22 yearly digest ${YEAR}`);
      for (const title of expectedOrder) expect(m.text_body).toContain(title);
      expect(m.text_body).not.toContain(leftOut.title);
      // Each carries its own working unsubscribe link.
      const link = /https?:\/\/\S+\/digest\/unsubscribe\?token=(\S+)/.exec(m.text_body)!;
      const [{ id }] = await rows<{ id: number }>(sql`select id from users where email = ${m.to_address}`);
      expect(links.verifyUnsubscribeToken(decodeURIComponent(link[1]))).toBe(id);
      expect(m.html_body).toContain("/digest/unsubscribe?token=");
      expect(m.html_body).not.toContain("<script");
    }
    const [{ mailed }] = await rows<{ mailed: number }>(sql`select mailed_count as mailed from digest_editions where year = ${YEAR} and edition = 1`);
    expect(mailed).toBe(optedIn.length);
  });

  it("never changes once issued", async () => {
    const refusal = async (query: ReturnType<typeof sql>) => {
      const error = await t.db.execute(query).then(() => null, (e: { cause?: { message?: string }; message: string }) => e.cause?.message ?? e.message);
      return error;
    };
    expect(await refusal(sql`update digest_editions set editor_letter = 'changed' where year = ${YEAR} and edition = 1`)).toMatch(/issued and cannot be changed/);
    expect(await refusal(sql`update digest_editions set content = '{}'::jsonb where year = ${YEAR} and edition = 1`)).toMatch(/issued and cannot be changed/);
    expect(await refusal(sql`update digest_editions set status = 'draft' where year = ${YEAR} and edition = 1`)).toMatch(/issued and cannot be changed/);
    expect(await refusal(sql`delete from digest_editions where year = ${YEAR} and edition = 1`)).toMatch(/cannot be deleted/);
    // Only the PDF's bookkeeping may be filled in later.
    expect(await refusal(sql`update digest_editions set pdf_key = 'digests/x.pdf' where year = ${YEAR} and edition = 1`)).toBeNull();
    // The secretary's pages refuse too.
    const [{ id: editionId }] = await rows<{ id: number }>(sql`select id from digest_editions where year = ${YEAR} and edition = 1`);
    await expect(digests.changeEntry(t.db, editionId, { intent: "leave-out", writeupId: expectedOrder.length })).rejects.toThrow(/can no longer change/);
    // A write-up edited after the issue does not change the issued digest.
    const firstSlug = (await digests.getIssued(t.db, YEAR))!.snapshot.sections[0].entries[0].slug;
    await t.db.execute(sql`update writeups set title = 'Renamed after the digest' where slug = ${firstSlug}`);
    const issued = await digests.getIssued(t.db, YEAR);
    expect(issued!.snapshot.sections.flatMap((s) => s.entries.map((e) => e.title))).toEqual(expectedOrder);
  });

  it("corrects with a new edition that needs a note, keeping what was left out", async () => {
    const cookie = await cookieOf(RUTH);
    const r = await settle(() => compilePage.action(args(formRequest("/secretary/digest", { year: String(YEAR) }, { cookie }))));
    expect(r.status).toBe(302);
    const draft = await digests.getDraft(t.db, YEAR);
    expect(draft!.edition.edition).toBe(2);
    expect(draft!.entries.find((e) => e.slug === leftOut.slug)!.included).toBe(false);
    const noNote = await settle(() => previewPage.action(args(formRequest(`/secretary/digest/${YEAR}/preview`, { confirm: "on" }, { cookie }), { year: String(YEAR) })));
    expect(noNote.status).toBe(400);
    expect((noNote.data as { error: string }).error).toMatch(/correction note/);
    await postDraft(YEAR, { intent: "letter", letter: draft!.edition.editorLetter, correctionNote: "A write-up's title was changed by its author after the first edition." });
    const issued = await settle(() => previewPage.action(args(formRequest(`/secretary/digest/${YEAR}/preview`, { confirm: "on" }, { cookie }), { year: String(YEAR) })));
    expect(issued.status).toBe(302);
    const latest = await digests.getIssued(t.db, YEAR);
    expect(latest!.edition).toBe(2);
    expect(latest!.snapshot.correctionNote).toMatch(/title was changed/);
    expect(latest!.editions.map((e) => e.edition)).toEqual([1, 2]);
    expect((await digests.getIssued(t.db, YEAR, 1))!.snapshot.correctionNote).toBe("");
    // Not e-mailed this time (the box was not ticked).
    const [{ n }] = await rows<{ n: number }>(sql`select count(*)::int as n from outbox where kind = 'digest'`);
    expect(n).toBe(readSeedYaml<{ digest?: boolean }[]>("members.yaml").filter((m) => m.digest !== false).length);
  });
});

describe("the e-mail in batches", () => {
  it("queues batches of the given size, each due a gap after the previous one", async () => {
    const before = (await rows<{ n: number }>(sql`select count(*)::int as n from outbox`))[0].n;
    const { id } = await digests.compileDraft(t.db, { year: 2024, userId: 1 });
    const now = new Date("2027-01-10T09:00:00Z");
    const result = await digests.issueDraft(t.db, {
      editionId: id, userId: 1, now,
      mailing: {
        className: "Brantwater 22", batchSize: 4, batchGapMs: 60_000,
        links: (userId) => ({ web: "http://x/d", pdf: "http://x/p", unsubscribe: `http://x/u/${userId}`, account: "http://x/a", writeup: (s) => `http://x/w/${s}` }),
      },
    });
    const [{ n: recipients }] = await rows<{ n: number }>(sql`select count(*)::int as n from users where digest_opt_in and email_verified_at is not null`);
    expect(result.recipients).toBe(recipients);
    expect(result.batches).toBe(Math.ceil(recipients / 4));
    const due = await rows<{ at: string; n: number }>(sql`
      select next_attempt_at::text as at, count(*)::int as n from outbox where id > (select coalesce(max(id), 0) from outbox) - ${recipients}
      group by next_attempt_at order by next_attempt_at`);
    expect(due.map((d) => d.n)).toEqual(Array.from({ length: result.batches }, (_, i) => Math.min(4, recipients - i * 4)));
    const times = due.map((d) => new Date(d.at).getTime());
    expect(times.map((x) => x - times[0])).toEqual(times.map((_, i) => i * 60_000));
    expect((await rows<{ n: number }>(sql`select count(*)::int as n from outbox`))[0].n).toBe(before + recipients);
  });
});

describe("the unsubscribe link", () => {
  it("asks first, then turns the member's opt-in off, without signing in", async () => {
    const [nora] = await rows<{ id: number; digest_opt_in: boolean }>(sql`select id, digest_opt_in from users where email = 'nora.pelling@example.org'`);
    expect(nora.digest_opt_in).toBe(true);
    const token = links.unsubscribeToken(nora.id);
    const ask = await settle(() => unsubscribePage.loader(args(getRequest(`/digest/unsubscribe?token=${encodeURIComponent(token)}`))));
    expect(ask.data).toMatchObject({ state: "asking", email: "nora.pelling@example.org" });
    // Opening the link changes nothing (no state change on GET).
    expect((await rows<{ on: boolean }>(sql`select digest_opt_in as on from users where id = ${nora.id}`))[0].on).toBe(true);
    const done = await settle(() => unsubscribePage.action(args(formRequest("/digest/unsubscribe", { token }))));
    expect(done.data).toMatchObject({ state: "done" });
    expect((await rows<{ on: boolean }>(sql`select digest_opt_in as on from users where id = ${nora.id}`))[0].on).toBe(false);
    // One-click unsubscribe (RFC 8058): a POST to the link itself, token in the address.
    const [hal] = await rows<{ id: number }>(sql`select id from users where email = 'hal.dunmore@example.com'`);
    const oneClick = formRequest(`/digest/unsubscribe?token=${encodeURIComponent(links.unsubscribeToken(hal.id))}`, { "List-Unsubscribe": "One-Click" });
    expect((await settle(() => unsubscribePage.action(args(oneClick)))).data).toMatchObject({ state: "done" });
    expect((await rows<{ on: boolean }>(sql`select digest_opt_in as on from users where id = ${hal.id}`))[0].on).toBe(false);
  });

  it("refuses a link that was altered or made up", async () => {
    const token = links.unsubscribeToken(3);
    const otherUser = token.replace(/^3\./, "4.");
    for (const bad of [otherUser, `${token.slice(0, -1)}${token.endsWith("A") ? "B" : "A"}`, "4", "", "4.abc"]) {
      const r = await settle(() => unsubscribePage.action(args(formRequest("/digest/unsubscribe", { token: bad }))));
      expect({ bad, status: r.status }).toEqual({ bad, status: 400 });
    }
    // The signature is HMAC-SHA256 (RFC 2104); RFC 4231 test case 2 checks the primitive.
    const { createHmac } = await import("node:crypto");
    expect(createHmac("sha256", "Jefe").update("what do ya want for nothing?").digest("hex"))
      .toBe("5bdcc146bf60754e6a042426089575c75a003f089d2739839dec58b964ec3843");
    expect(links.unsubscribeToken(7, "k".repeat(32))).toBe(`7.${createHmac("sha256", "k".repeat(32)).update("digest-unsubscribe:7").digest("base64url")}`);
  });
});

describe("the PDF", () => {
  it("prints the titles in order, with the thumbnails inlined", async () => {
    const { buildDigestPdf, digestPrintHtml } = await import("~/services/digest-print.server");
    const issued = (await digests.getIssued(t.db, YEAR, 1))!;
    const snapshot = structuredClone(issued.snapshot);
    // Give the first entry a photo, served by a stand-in store.
    const key = "photos/2025/AAAAAAAAAAAAAAAAAAAAAA.thumb.webp";
    snapshot.sections[0].entries[0].thumbnailKey = key;
    const webp = await sharp({ create: { width: 48, height: 36, channels: 3, background: "#2f6f82" } }).webp().toBuffer();
    const fetchObject = async (k: string) => k === key
      ? { body: new Blob([new Uint8Array(webp)]).stream() as ReadableStream<Uint8Array>, contentType: "image/webp", contentLength: webp.length }
      : null;
    const html = digestPrintHtml(snapshot, { className: "Brantwater 22", appUrl: "http://127.0.0.1:3000", photos: new Map([[key, "data:image/webp;base64,AAAA"]]) });
    expect(html).toContain("data:font/woff2;base64,");
    expect(html).toContain('src="data:image/webp;base64,AAAA"');
    const pdf = await buildDigestPdf(snapshot, { className: "Brantwater 22", appUrl: "http://127.0.0.1:3000", fetchObject });
    expect(Buffer.from(pdf.subarray(0, 5)).toString()).toBe("%PDF-");
    fs.mkdirSync(ARTIFACTS_DIR, { recursive: true });
    fs.writeFileSync(path.join(ARTIFACTS_DIR, `digest-${YEAR}-integration.pdf`), pdf);
    const { text } = await extractText(await getDocumentProxy(pdf), { mergePages: true });
    const flat = text.replace(/\s+/g, " ");
    let at = flat.indexOf("the accounts opened in it."); // the last words before the entries
    expect(at).toBeGreaterThan(-1);
    for (const title of expectedTitles(issued.snapshot)) {
      const next = flat.indexOf(title, at);
      expect({ title, found: next > at }).toEqual({ title, found: true });
      at = next;
    }
  }, 60_000);

  it("starts the contents of a busy year on the cover, under 'In this digest', rather than on the next page", async () => {
    const { buildDigestPdf } = await import("~/services/digest-print.server");
    const { DIGEST_LARGE_ENTRIES } = await import("~/domain/digest");
    const issued = (await digests.getIssued(t.db, YEAR, 1))!;
    const snapshot = structuredClone(issued.snapshot);
    // One section longer than a page of contents: the year's entries repeated under new titles.
    const first = snapshot.sections[0];
    const template = first.entries[0];
    first.entries = Array.from({ length: DIGEST_LARGE_ENTRIES + 50 }, (_, i) => ({
      ...template, writeupId: 100_000 + i, slug: `${template.slug}-${i}`, title: `Busy year entry ${i + 1}`, thumbnailKey: null,
    }));
    const pdf = await buildDigestPdf(snapshot, { className: "Brantwater 22", appUrl: "http://127.0.0.1:3000", fetchObject: async () => null });
    const { text } = await extractText(await getDocumentProxy(pdf), { mergePages: false });
    const cover = text[0].replace(/\s+/g, " ");
    expect(cover).toContain("In this digest");
    expect(cover).toContain("Busy year entry 1 ");
    expect(cover).toContain("Busy year entry 2 ");
  }, 60_000);
});

function expectedTitles(s: import("~/domain/digest").DigestSnapshot) {
  return s.sections.flatMap((x) => x.entries.map((e) => e.title));
}
