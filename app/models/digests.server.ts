// The yearly digest: compiling a year's draft from the published record, arranging it, the year's
// figures, issuing (freezing the edition and queueing the e-mail in batches), the archive, and the
// unsubscribe link's one write. The rules of ordering and checking live in app/domain/digest.ts.
import { and, asc, desc, eq, sql } from "drizzle-orm";
import type { Db } from "~/db/client.server";
import * as s from "~/db/schema";
import {
  type DigestEntry, type DigestFigures, type DigestMeasurement, type DigestSnapshot, type DraftEntry,
  firstPhotoThumbnail, groupIntoSections, inBatches, initialArrangement, issueProblems, moveEntry,
  MOST_DONE_TOO_LIMIT, orderedEntries, sectionFor, UNFILED_SECTION,
} from "~/domain/digest";
import { composeDigestEmail, type DigestEmailLinks } from "~/domain/digest-email";
import { renderMarkdown } from "~/domain/markdown";
import type { DbOrTx } from "./outbox.server";

/** A refusal the secretary can act on; `field` names the form field it belongs beside. */
export class DigestError extends Error {
  constructor(message: string, readonly status = 400, readonly field: string | null = null) {
    super(message);
  }
}

/** The year's bounds, in UTC: a write-up belongs to the year its publication date falls in. */
function yearBounds(year: number) {
  return { from: new Date(Date.UTC(year, 0, 1)), to: new Date(Date.UTC(year + 1, 0, 1)) };
}

/** The systems in the taxonomy's order, and the sections a digest may have (systems, then "Other work"). */
export async function listSections(db: DbOrTx) {
  const systems = await db.select({ slug: s.systems.slug, name: s.systems.name }).from(s.systems).orderBy(asc(s.systems.sortOrder), asc(s.systems.slug));
  return [...systems, { ...UNFILED_SECTION }];
}

/** The years with published write-ups (newest first), each with its count and its editions. */
export async function listDigestYears(db: Db) {
  const years = await db.execute<{ year: number; writeups: number }>(sql`
    select extract(year from published_at at time zone 'UTC')::int as year, count(*)::int as writeups
    from writeups where status = 'published' and published_at is not null
    group by 1 order by 1 desc`);
  const editions = await db
    .select({ id: s.digestEditions.id, year: s.digestEditions.year, edition: s.digestEditions.edition, status: s.digestEditions.status, issuedAt: s.digestEditions.issuedAt, mailedCount: s.digestEditions.mailedCount })
    .from(s.digestEditions)
    .orderBy(desc(s.digestEditions.year), asc(s.digestEditions.edition));
  const known = new Set(years.rows.map((r) => r.year));
  // A year whose write-ups were all withdrawn since still lists its editions.
  const extra = [...new Set(editions.map((e) => e.year))].filter((y) => !known.has(y)).map((year) => ({ year, writeups: 0 }));
  return [...years.rows, ...extra]
    .sort((a, b) => b.year - a.year)
    .map((y) => ({ ...y, editions: editions.filter((e) => e.year === y.year) }));
}

type PublishedRow = { id: number; published_at: Date | string; systems: string[] };

async function publishedInYear(db: DbOrTx, year: number): Promise<PublishedRow[]> {
  const { from, to } = yearBounds(year);
  const r = await db.execute<PublishedRow>(sql`
    select w.id, w.published_at,
      coalesce(array(select ws.system_slug from writeup_systems ws join systems sy on sy.slug = ws.system_slug
                     where ws.writeup_id = w.id order by sy.sort_order, sy.slug), '{}') as systems
    from writeups w
    where w.status = 'published' and w.published_at >= ${from.toISOString()} and w.published_at < ${to.toISOString()}
    order by w.published_at, w.id`);
  return r.rows;
}

/**
 * The year's draft: the one being prepared, else a new one. The first edition of a year takes
 * every write-up published that year, by system; a correction (a year already issued) starts from
 * the latest issued edition's letter and order, the write-ups it left out still left out.
 */
export async function compileDraft(db: Db, input: { year: number; userId: number }): Promise<{ id: number; created: boolean }> {
  return db.transaction(async (tx) => {
    const [existing] = await tx.select({ id: s.digestEditions.id }).from(s.digestEditions)
      .where(and(eq(s.digestEditions.year, input.year), eq(s.digestEditions.status, "draft")));
    if (existing) return { id: existing.id, created: false };

    const writeups = await publishedInYear(tx, input.year);
    if (!writeups.length) throw new DigestError(`No write-ups were published in ${input.year}: there is nothing to compile.`, 400, "year");
    const sectionOrder = (await listSections(tx)).map((x) => x.slug);

    const [latest] = await tx.select().from(s.digestEditions)
      .where(and(eq(s.digestEditions.year, input.year), eq(s.digestEditions.status, "issued")))
      .orderBy(desc(s.digestEditions.edition)).limit(1);

    let entries: DraftEntry[];
    if (latest?.content) {
      // A correction: the issued order first, then the rest of the year's write-ups, left out.
      const issued = latest.content.sections.flatMap((x) => x.entries.map((e) => e.writeupId));
      const byId = new Map(writeups.map((w) => [w.id, w]));
      const kept = issued.filter((id) => byId.has(id));
      const rest = initialArrangement(writeups.filter((w) => !kept.includes(w.id)).map((w) => ({ writeupId: w.id, systems: w.systems, publishedAt: w.published_at })), sectionOrder);
      entries = orderedEntries([
        ...kept.map((id, position) => ({ writeupId: id, sectionSlug: sectionFor(byId.get(id)!.systems, sectionOrder), position, included: true })),
        ...rest.map((e) => ({ ...e, position: kept.length + e.position, included: false })),
      ], sectionOrder).map((e, position) => ({ ...e, position }));
    } else {
      entries = initialArrangement(writeups.map((w) => ({ writeupId: w.id, systems: w.systems, publishedAt: w.published_at })), sectionOrder);
    }

    const [{ next }] = (await tx.execute<{ next: number }>(sql`select coalesce(max(edition), 0)::int + 1 as next from digest_editions where year = ${input.year}`)).rows;
    const [edition] = await tx.insert(s.digestEditions).values({
      year: input.year,
      edition: next,
      editorLetter: latest?.editorLetter ?? "",
      compiledBy: input.userId,
    }).returning({ id: s.digestEditions.id });
    await tx.insert(s.digestEntries).values(entries.map((e) => ({ editionId: edition.id, ...e })));
    return { id: edition.id, created: true };
  });
}

export type DraftView = NonNullable<Awaited<ReturnType<typeof getDraft>>>;

/** The year's draft with its entries in printing order (left-out ones included, marked). */
export async function getDraft(db: Db, year: number) {
  const [edition] = await db.select().from(s.digestEditions)
    .where(and(eq(s.digestEditions.year, year), eq(s.digestEditions.status, "draft")));
  if (!edition) return null;
  const sections = await listSections(db);
  const rows = await db.execute<{
    writeup_id: number; section_slug: string; position: number; included: boolean; slug: string; title: string;
    credit: string; hull_number: number | null; published_at: Date | string | null; status: string;
  }>(sql`
    select e.writeup_id, e.section_slug, e.position, e.included, w.slug, w.title,
           coalesce(u.credit_as, u.display_name) as credit, b.hull_number, w.published_at, w.status::text as status
    from digest_entries e
    join writeups w on w.id = e.writeup_id
    join users u on u.id = w.author_id
    left join boats b on b.id = w.boat_id
    where e.edition_id = ${edition.id}`);
  const entries = orderedEntries(rows.rows.map((r) => ({
    writeupId: r.writeup_id, sectionSlug: r.section_slug, position: r.position, included: r.included,
    slug: r.slug, title: r.title, credit: r.credit, hullNumber: r.hull_number,
    publishedAt: r.published_at ? new Date(r.published_at).toISOString() : null,
    stillPublished: r.status === "published",
  })), sections.map((x) => x.slug));
  return { edition, sections, entries };
}

async function draftById(tx: DbOrTx, editionId: number) {
  const [edition] = await tx.select().from(s.digestEditions).where(eq(s.digestEditions.id, editionId)).for("update");
  if (!edition) throw new DigestError("There is no such digest.", 404);
  if (edition.status !== "draft") throw new DigestError("This edition has been issued and can no longer change. Prepare a correction instead.", 409);
  return edition;
}

/** Moves an entry up or down within its section, or leaves it out / puts it back. */
export async function changeEntry(db: Db, editionId: number, change: { intent: "up" | "down" | "leave-out" | "put-back"; writeupId: number }) {
  await db.transaction(async (tx) => {
    await draftById(tx, editionId);
    const entries = await tx.select({
      writeupId: s.digestEntries.writeupId, sectionSlug: s.digestEntries.sectionSlug,
      position: s.digestEntries.position, included: s.digestEntries.included,
    }).from(s.digestEntries).where(eq(s.digestEntries.editionId, editionId));
    if (!entries.some((e) => e.writeupId === change.writeupId)) throw new DigestError("That write-up is not in this digest.", 404);
    if (change.intent === "leave-out" || change.intent === "put-back") {
      await tx.update(s.digestEntries).set({ included: change.intent === "put-back" })
        .where(and(eq(s.digestEntries.editionId, editionId), eq(s.digestEntries.writeupId, change.writeupId)));
    } else {
      const order = (await listSections(tx)).map((x) => x.slug);
      const moved = moveEntry(entries, change.writeupId, change.intent, order);
      if (!moved) return; // already first or last of its section: nothing to do
      // Positions are rewritten for the whole draft, so no two entries ever share one.
      await tx.execute(sql`
        update digest_entries e set position = v.position
        from (select unnest(${sql.raw(`ARRAY[${moved.map((m) => m.writeupId).join(",")}]::int[]`)}) as writeup_id,
                     unnest(${sql.raw(`ARRAY[${moved.map((m) => m.position).join(",")}]::int[]`)}) as position) v
        where e.edition_id = ${editionId} and e.writeup_id = v.writeup_id`);
    }
    await tx.update(s.digestEditions).set({ updatedAt: new Date() }).where(eq(s.digestEditions.id, editionId));
  });
}

export async function saveLetter(db: Db, editionId: number, input: { letter: string; correctionNote: string }) {
  await db.transaction(async (tx) => {
    await draftById(tx, editionId);
    await tx.update(s.digestEditions)
      .set({ editorLetter: input.letter, correctionNote: input.correctionNote, updatedAt: new Date() })
      .where(eq(s.digestEditions.id, editionId));
  });
}

/** Throws the draft away (only a draft; an issued edition stays for ever). */
export async function discardDraft(db: Db, editionId: number) {
  await db.transaction(async (tx) => {
    await draftById(tx, editionId);
    await tx.delete(s.digestEditions).where(eq(s.digestEditions.id, editionId));
  });
}

/**
 * The class's figures for a year. Write-ups and systems count every write-up published in the
 * year (a write-up with two systems counts under each); spaces and measurements count the
 * measurements taken in the year (their date measured); new members count the accounts made in
 * the year; "done on the most boats" ranks the write-ups in the digest (`digestWriteupIds`) by the
 * boats other than the author's own that members marked as done too.
 */
export async function yearFigures(db: DbOrTx, year: number, digestWriteupIds: readonly number[]): Promise<DigestFigures> {
  const { from, to } = yearBounds(year);
  const fromIso = from.toISOString();
  const toIso = to.toISOString();
  const [counts] = (await db.execute<{ writeups: number; spaces: number; measurements: number; members: number }>(sql`
    select
      (select count(*) from writeups where status = 'published' and published_at >= ${fromIso} and published_at < ${toIso})::int as writeups,
      (select count(distinct space_id) from space_measurements where measured_on >= ${`${year}-01-01`}::date and measured_on < ${`${year + 1}-01-01`}::date)::int as spaces,
      (select count(*) from space_measurements where measured_on >= ${`${year}-01-01`}::date and measured_on < ${`${year + 1}-01-01`}::date)::int as measurements,
      (select count(*) from users where created_at >= ${fromIso} and created_at < ${toIso})::int as members`)).rows;
  const perSystem = await db.execute<{ slug: string; name: string; count: number }>(sql`
    select sy.slug, sy.name, count(w.id)::int as count
    from systems sy
    left join writeup_systems ws on ws.system_slug = sy.slug
    left join writeups w on w.id = ws.writeup_id and w.status = 'published'
      and w.published_at >= ${fromIso} and w.published_at < ${toIso}
    group by sy.slug, sy.name, sy.sort_order
    order by sy.sort_order, sy.slug`);
  let mostDoneToo: DigestFigures["mostDoneToo"] = [];
  if (digestWriteupIds.length) {
    const ids = sql.raw(`ARRAY[${digestWriteupIds.map((id) => Number(id)).join(",")}]::int[]`);
    const r = await db.execute<{ slug: string; title: string; count: number }>(sql`
      select w.slug, w.title, count(distinct d.hull_number)::int as count
      from writeups w
      join done_too d on d.writeup_id = w.id
      left join boats b on b.id = w.boat_id
      where w.id = any(${ids}) and d.hull_number is distinct from b.hull_number
      group by w.id, w.slug, w.title, w.published_at
      order by count desc, w.published_at, w.id
      limit ${MOST_DONE_TOO_LIMIT}`);
    mostDoneToo = r.rows;
  }
  return {
    writeupsPublished: counts.writeups,
    perSystem: perSystem.rows,
    spacesMeasured: counts.spaces,
    measurementsAdded: counts.measurements,
    mostDoneToo,
    newMembers: counts.members,
  };
}

/** The details each entry prints, for the given write-ups (any order), keyed by id. */
async function entryDetails(db: DbOrTx, ids: readonly number[]): Promise<Map<number, DigestEntry>> {
  const out = new Map<number, DigestEntry>();
  if (!ids.length) return out;
  const arr = sql.raw(`ARRAY[${ids.map((id) => Number(id)).join(",")}]::int[]`);
  const [base, systems, measured, doneToo] = await Promise.all([
    db.execute<{ id: number; slug: string; title: string; summary: string; body_markdown: string; published_at: Date | string | null; credit: string; hull_number: number | null; boat_name: string | null }>(sql`
      select w.id, w.slug, w.title, w.summary, w.body_markdown, w.published_at,
             coalesce(u.credit_as, u.display_name) as credit, b.hull_number, b.name as boat_name
      from writeups w join users u on u.id = w.author_id left join boats b on b.id = w.boat_id
      where w.id = any(${arr})`),
    db.execute<{ writeup_id: number; name: string }>(sql`
      select ws.writeup_id, sy.name from writeup_systems ws join systems sy on sy.slug = ws.system_slug
      where ws.writeup_id = any(${arr}) order by ws.writeup_id, sy.sort_order, sy.slug`),
    db.execute<{ writeup_id: number; name: string; length_mm: number; width_mm: number; height_mm: number; measurements: number }>(sql`
      select wsp.writeup_id, sp.name,
             coalesce(sec.consensus_length_mm, sec.length_mm) as length_mm,
             coalesce(sec.consensus_width_mm, sec.width_mm) as width_mm,
             coalesce(sec.consensus_height_mm, sec.height_mm) as height_mm,
             (select count(*) from space_measurements m where m.space_id = sp.id)::int as measurements
      from writeup_spaces wsp
      join spaces sp on sp.id = wsp.space_id
      join lateral (select * from space_sections x where x.space_id = sp.id order by x.position limit 1) sec on true
      where wsp.writeup_id = any(${arr})
      order by wsp.writeup_id, sp.name`),
    db.execute<{ writeup_id: number; boats: number }>(sql`
      select d.writeup_id, count(distinct d.hull_number)::int as boats
      from done_too d join writeups w on w.id = d.writeup_id left join boats b on b.id = w.boat_id
      where d.writeup_id = any(${arr}) and d.hull_number is distinct from b.hull_number
      group by d.writeup_id`),
  ]);
  const systemsOf = new Map<number, string[]>();
  for (const r of systems.rows) systemsOf.set(r.writeup_id, [...(systemsOf.get(r.writeup_id) ?? []), r.name]);
  const spacesOf = new Map<number, DigestMeasurement[]>();
  for (const r of measured.rows) {
    spacesOf.set(r.writeup_id, [...(spacesOf.get(r.writeup_id) ?? []), {
      space: r.name, lengthMm: Number(r.length_mm), widthMm: Number(r.width_mm), heightMm: Number(r.height_mm), measurements: r.measurements,
    }]);
  }
  const doneOf = new Map(doneToo.rows.map((r) => [r.writeup_id, r.boats]));
  for (const w of base.rows) {
    const photo = firstPhotoThumbnail(w.body_markdown);
    out.set(w.id, {
      writeupId: w.id,
      slug: w.slug,
      title: w.title,
      credit: w.credit,
      hullNumber: w.hull_number,
      boatName: w.boat_name,
      summary: w.summary,
      publishedAt: w.published_at ? new Date(w.published_at).toISOString() : "",
      systems: systemsOf.get(w.id) ?? [],
      thumbnailKey: photo?.key ?? null,
      thumbnailAlt: photo?.alt || w.title,
      measurements: spacesOf.get(w.id) ?? [],
      doneToo: doneOf.get(w.id) ?? 0,
    });
  }
  return out;
}

/**
 * Everything the edition shows, as it stands now: the entries that are in and still published,
 * in order, under their systems; the figures; the letter. Issuing freezes exactly this.
 */
export async function buildSnapshot(db: DbOrTx, editionId: number, issuedAt: Date | null = null): Promise<DigestSnapshot> {
  const [edition] = await db.select().from(s.digestEditions).where(eq(s.digestEditions.id, editionId));
  if (!edition) throw new DigestError("There is no such digest.", 404);
  if (edition.status === "issued" && edition.content) return edition.content;
  const sections = await listSections(db);
  const entries = await db.select({
    writeupId: s.digestEntries.writeupId, sectionSlug: s.digestEntries.sectionSlug,
    position: s.digestEntries.position, included: s.digestEntries.included,
  }).from(s.digestEntries)
    .innerJoin(s.writeups, eq(s.writeups.id, s.digestEntries.writeupId))
    .where(and(eq(s.digestEntries.editionId, editionId), eq(s.writeups.status, "published")));
  const groups = groupIntoSections(entries, sections);
  const ids = groups.flatMap((g) => g.entries.map((e) => e.writeupId));
  const [details, figures] = await Promise.all([entryDetails(db, ids), yearFigures(db, edition.year, ids)]);
  return {
    year: edition.year,
    edition: edition.edition,
    issuedAt: issuedAt ? issuedAt.toISOString() : null,
    letterMarkdown: edition.editorLetter,
    letterHtml: renderMarkdown(edition.editorLetter).html,
    correctionNote: edition.correctionNote,
    figures,
    sections: groups.map((g) => ({ slug: g.slug, name: g.name, entries: g.entries.map((e) => details.get(e.writeupId)!).filter(Boolean) })),
  };
}

export type MailingOptions = {
  className: string;
  /** Links for one member (the unsubscribe link is theirs alone). */
  links: (userId: number) => DigestEmailLinks;
  /** Messages per batch, and how long after the previous batch each next one is due. */
  batchSize: number;
  batchGapMs: number;
};

/** The members the digest goes to: those who asked for it, with a confirmed address. */
export async function digestRecipients(db: DbOrTx) {
  return db.select({ id: s.users.id, email: s.users.email }).from(s.users)
    .where(and(eq(s.users.digestOptIn, true), sql`${s.users.emailVerifiedAt} is not null`))
    .orderBy(asc(s.users.id));
}

/**
 * Issues the draft: freezes its content, and (with `mailing`) queues one e-mail per member who
 * opted in, in batches whose due times are `batchGapMs` apart, all in the same transaction.
 */
export async function issueDraft(
  db: Db,
  input: { editionId: number; userId: number; correctionNote?: string; now?: Date; mailing: MailingOptions | null },
): Promise<{ year: number; edition: number; recipients: number; batches: number }> {
  const now = input.now ?? new Date();
  return db.transaction(async (tx) => {
    const edition = await draftById(tx, input.editionId);
    const correctionNote = input.correctionNote ?? edition.correctionNote;
    if (correctionNote !== edition.correctionNote) {
      await tx.update(s.digestEditions).set({ correctionNote }).where(eq(s.digestEditions.id, edition.id));
    }
    const snapshot = await buildSnapshot(tx, edition.id, now);
    const included = snapshot.sections.reduce((n, x) => n + x.entries.length, 0);
    const problems = issueProblems({ edition: edition.edition, included, correctionNote });
    if (problems.length) throw new DigestError(problems.join(" "), 400);

    let recipients = 0;
    let batches = 0;
    if (input.mailing) {
      const m = input.mailing;
      const members = await digestRecipients(tx);
      for (const [i, batch] of inBatches(members, m.batchSize).entries()) {
        const due = new Date(now.getTime() + i * m.batchGapMs);
        await tx.insert(s.outbox).values(batch.map((member) => {
          const mail = composeDigestEmail(snapshot, m.className, m.links(member.id));
          return { toAddress: member.email, subject: mail.subject, textBody: mail.text, htmlBody: mail.html, kind: "digest", nextAttemptAt: due };
        }));
        batches++;
      }
      recipients = members.length;
    }
    await tx.update(s.digestEditions).set({
      status: "issued", content: snapshot, issuedAt: now, issuedBy: input.userId, updatedAt: now,
      mailedCount: input.mailing ? recipients : null,
    }).where(eq(s.digestEditions.id, edition.id));
    return { year: edition.year, edition: edition.edition, recipients, batches };
  });
}

/** Every issued edition, newest year first, for the public archive. */
export async function listIssued(db: Db) {
  const r = await db.execute<{ year: number; edition: number; issued_at: Date | string; correction_note: string; entries: number }>(sql`
    select year, edition, issued_at, correction_note,
           (select coalesce(sum(jsonb_array_length(x->'entries')), 0) from jsonb_array_elements(content->'sections') x)::int as entries
    from digest_editions where status = 'issued'
    order by year desc, edition desc`);
  return r.rows.map((row) => ({ year: row.year, edition: row.edition, issuedAt: new Date(row.issued_at).toISOString(), correctionNote: row.correction_note, entries: row.entries }));
}

/** An issued edition of a year (the latest when `edition` is not given), with the year's other editions. */
export async function getIssued(db: Db, year: number, edition?: number) {
  const editions = await db.select({
    id: s.digestEditions.id, edition: s.digestEditions.edition, issuedAt: s.digestEditions.issuedAt,
    correctionNote: s.digestEditions.correctionNote, pdfKey: s.digestEditions.pdfKey,
  }).from(s.digestEditions)
    .where(and(eq(s.digestEditions.year, year), eq(s.digestEditions.status, "issued")))
    .orderBy(asc(s.digestEditions.edition));
  const chosen = edition === undefined ? editions.at(-1) : editions.find((e) => e.edition === edition);
  if (!chosen) return null;
  const [row] = await db.select({ content: s.digestEditions.content }).from(s.digestEditions).where(eq(s.digestEditions.id, chosen.id));
  return {
    id: chosen.id,
    edition: chosen.edition,
    pdfKey: chosen.pdfKey,
    snapshot: row.content!,
    latest: chosen.edition === editions.at(-1)!.edition,
    editions: editions.map((e) => ({ edition: e.edition, issuedAt: e.issuedAt!.toISOString(), correctionNote: e.correctionNote })),
  };
}

/** Records where the built PDF of an issued edition is stored. */
export async function recordPdf(db: Db, editionId: number, key: string) {
  await db.update(s.digestEditions).set({ pdfKey: key, pdfBuiltAt: new Date() }).where(eq(s.digestEditions.id, editionId));
}

/** The member an unsubscribe link names: their address and whether they still receive the digest. */
export async function findDigestSubscriber(db: Db, userId: number) {
  const [row] = await db.select({ id: s.users.id, email: s.users.email, digestOptIn: s.users.digestOptIn }).from(s.users).where(eq(s.users.id, userId));
  return row ?? null;
}

/** Stops the digest for one member (the unsubscribe link). Returns false when there is no such member. */
export async function unsubscribeFromDigest(db: Db, userId: number): Promise<boolean> {
  const rows = await db.update(s.users).set({ digestOptIn: false }).where(eq(s.users.id, userId)).returning({ id: s.users.id });
  return rows.length > 0;
}

/** The write-ups of the year the draft does not hold yet (published after it was compiled). */
export async function addNewlyPublished(db: Db, editionId: number): Promise<number> {
  return db.transaction(async (tx) => {
    const edition = await draftById(tx, editionId);
    const have = new Set((await tx.select({ id: s.digestEntries.writeupId }).from(s.digestEntries).where(eq(s.digestEntries.editionId, editionId))).map((r) => r.id));
    const fresh = (await publishedInYear(tx, edition.year)).filter((w) => !have.has(w.id));
    if (!fresh.length) return 0;
    const order = (await listSections(tx)).map((x) => x.slug);
    const [{ max }] = (await tx.execute<{ max: number }>(sql`select coalesce(max(position), -1)::int as max from digest_entries where edition_id = ${editionId}`)).rows;
    const added = initialArrangement(fresh.map((w) => ({ writeupId: w.id, systems: w.systems, publishedAt: w.published_at })), order);
    await tx.insert(s.digestEntries).values(added.map((e) => ({ ...e, editionId, position: max + 1 + e.position })));
    return added.length;
  });
}

