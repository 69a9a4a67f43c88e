// Writing and reviewing write-ups: drafts, revisions, review decisions and their e-mails.
import { and, asc, desc, eq, sql } from "drizzle-orm";
import type { Db } from "~/db/client.server";
import * as s from "~/db/schema";
import type { PartRow } from "~/db/schema";
import { renderMarkdown } from "~/domain/markdown";
import { parseWeight } from "~/domain/units";
import { canEdit, type Decision, type RevisionState, transition } from "~/domain/writeup-lifecycle";
export { CHECKLIST } from "~/domain/writeup-lifecycle";
import { slugify, type WriteupFormValue } from "~/domain/writeup-form";
import { readCalculation, type Calculation } from "~/domain/calculations";
import { addWriteupCalculation, listWriteupCalculations, removeWriteupCalculation } from "./calculations.server";
import { enqueueEmail } from "./outbox.server";

type Tx = Parameters<Parameters<Db["transaction"]>[0]>[0];

export class EditingError extends Error {
  constructor(message: string, readonly status = 400) {
    super(message);
  }
}

function revisionFields(value: WriteupFormValue, weightUnit: "lb" | "kg") {
  const parts: PartRow[] = value.parts.map((p) => {
    const w = p.weight ? parseWeight(p.weight, weightUnit) : null;
    return { name: p.name, quantity: p.quantity, weightKg: w && w.ok ? w.kg : null, note: p.note ?? "" };
  });
  return {
    title: value.title,
    summary: value.summary,
    bodyMarkdown: value.body,
    systems: value.systems,
    zones: value.zones,
    hullFrom: value.appliesTo.from,
    hullTo: value.appliesTo.to,
    difficulty: value.difficulty ?? null,
    hoursSpent: value.hoursSpent ?? null,
    costUsd: value.costUsd ?? null,
    parts,
  };
}

async function uniqueSlug(tx: Tx, title: string, writeupId?: number): Promise<string> {
  const base = slugify(title);
  for (let n = 1; ; n++) {
    const candidate = n === 1 ? base : `${base}-${n}`;
    const [taken] = await tx.select({ id: s.writeups.id }).from(s.writeups).where(eq(s.writeups.slug, candidate));
    if (!taken || taken.id === writeupId) return candidate;
  }
}

/** Copies a revision onto the write-up row and its tag, zone and part tables (what readers see). */
async function showRevision(tx: Tx, writeupId: number, rev: typeof s.writeupRevisions.$inferSelect, status: RevisionState) {
  const text = renderMarkdown(rev.bodyMarkdown).text;
  await tx
    .update(s.writeups)
    .set({
      title: rev.title, summary: rev.summary, bodyMarkdown: rev.bodyMarkdown, bodyText: text, status,
      hullFrom: rev.hullFrom, hullTo: rev.hullTo, difficulty: rev.difficulty, hoursSpent: rev.hoursSpent,
      costUsd: rev.costUsd, boatId: rev.boatId, updatedAt: new Date(),
      ...(status === "published" ? { publishedAt: sql`coalesce(${s.writeups.publishedAt}, now())` } : {}),
    })
    .where(eq(s.writeups.id, writeupId));
  await tx.delete(s.writeupSystems).where(eq(s.writeupSystems.writeupId, writeupId));
  if (rev.systems.length) await tx.insert(s.writeupSystems).values(rev.systems.map((systemSlug) => ({ writeupId, systemSlug })));
  await tx.delete(s.writeupZones).where(eq(s.writeupZones.writeupId, writeupId));
  if (rev.zones.length) await tx.insert(s.writeupZones).values(rev.zones.map((zoneSlug) => ({ writeupId, zoneSlug })));
  await tx.delete(s.writeupParts).where(eq(s.writeupParts.writeupId, writeupId));
  if (rev.parts.length) {
    await tx.insert(s.writeupParts).values(rev.parts.map((p, i) => ({ writeupId, position: i, name: p.name, quantity: p.quantity, weightKg: p.weightKg, note: p.note })));
  }
}

async function everPublished(tx: Tx | Db, writeupId: number): Promise<boolean> {
  const [row] = await tx
    .select({ n: sql<number>`count(*)::int` })
    .from(s.writeupRevisions)
    .where(and(eq(s.writeupRevisions.writeupId, writeupId), eq(s.writeupRevisions.status, "published")));
  return row.n > 0;
}

/** The revision the author works on: the latest one, if it is still theirs to edit. */
async function workingRevision(tx: Tx | Db, writeupId: number) {
  const [latest] = await tx
    .select()
    .from(s.writeupRevisions)
    .where(eq(s.writeupRevisions.writeupId, writeupId))
    .orderBy(desc(s.writeupRevisions.number))
    .limit(1);
  return latest ?? null;
}

/**
 * Saves the author's work. A new write-up gets its first revision; a published one gets a new
 * revision (the published text stays visible); a draft or a revision sent back is updated in place.
 */
export async function saveDraft(
  db: Db,
  input: { authorId: number; writeupId: number | null; value: WriteupFormValue; weightUnit: "lb" | "kg"; boatId?: number | null },
): Promise<{ writeupId: number; revisionId: number }> {
  const fields = revisionFields(input.value, input.weightUnit);
  return db.transaction(async (tx) => {
    if (input.writeupId === null) {
      const slug = await uniqueSlug(tx, fields.title);
      const [w] = await tx
        .insert(s.writeups)
        .values({ slug, title: fields.title, summary: fields.summary, bodyMarkdown: fields.bodyMarkdown, authorId: input.authorId, status: "draft", hullFrom: fields.hullFrom, hullTo: fields.hullTo, boatId: input.boatId ?? null })
        .returning({ id: s.writeups.id });
      const [rev] = await tx
        .insert(s.writeupRevisions)
        .values({ ...fields, writeupId: w.id, number: 1, authorId: input.authorId, status: "draft", boatId: input.boatId ?? null })
        .returning();
      await showRevision(tx, w.id, rev, "draft");
      return { writeupId: w.id, revisionId: rev.id };
    }
    const [w] = await tx.select().from(s.writeups).where(eq(s.writeups.id, input.writeupId)).for("update");
    if (!w) throw new EditingError("No such write-up.", 404);
    if (w.authorId !== input.authorId) throw new EditingError("Only the author can edit this write-up.", 403);
    const latest = await workingRevision(tx, w.id);
    let revisionId: number;
    if (latest && canEdit(latest.status)) {
      await tx.update(s.writeupRevisions).set({ ...fields, updatedAt: new Date() }).where(eq(s.writeupRevisions.id, latest.id));
      revisionId = latest.id;
    } else if (latest && (latest.status === "published" || latest.status === "declined")) {
      const [rev] = await tx
        .insert(s.writeupRevisions)
        .values({ ...fields, writeupId: w.id, number: latest.number + 1, authorId: input.authorId, status: "draft", boatId: latest.boatId })
        .returning({ id: s.writeupRevisions.id });
      revisionId = rev.id;
    } else {
      throw new EditingError(latest?.status === "awaiting_review" ? "This write-up is with the moderators; you can edit it again once they have replied." : "This write-up can no longer be edited.");
    }
    if (!(await everPublished(tx, w.id))) {
      const [rev] = await tx.select().from(s.writeupRevisions).where(eq(s.writeupRevisions.id, revisionId));
      await showRevision(tx, w.id, rev, rev.status);
      // Before its first publication the address follows the title.
      await tx.update(s.writeups).set({ slug: await uniqueSlug(tx, fields.title, w.id) }).where(eq(s.writeups.id, w.id));
    }
    return { writeupId: w.id, revisionId };
  });
}

export async function submitForReview(db: Db, writeupId: number, authorId: number) {
  return db.transaction(async (tx) => {
    const latest = await workingRevision(tx, writeupId);
    if (!latest) throw new EditingError("No such write-up.", 404);
    if (latest.authorId !== authorId) throw new EditingError("Only the author can send this write-up for review.", 403);
    const t = transition(latest.status, "submit", { isAuthor: true, isModerator: false });
    if (!t.ok) throw new EditingError(t.reason);
    await tx.update(s.writeupRevisions).set({ status: t.to, submittedAt: new Date() }).where(eq(s.writeupRevisions.id, latest.id));
    if (!(await everPublished(tx, writeupId))) await tx.update(s.writeups).set({ status: t.to }).where(eq(s.writeups.id, writeupId));
    return latest.id;
  });
}


const SUBJECT_PREFIX: Record<Decision, string> = { publish: "Published", request_changes: "Changes asked", decline: "Not published" };

/** A moderator's decision on the revision awaiting review; recorded, and mailed to the author. */
export async function decide(
  db: Db,
  input: { revisionId: number; moderatorId: number; decision: Decision; reason: string; checklist: Record<string, boolean>; appUrl: string },
) {
  return db.transaction(async (tx) => {
    const [rev] = await tx.select().from(s.writeupRevisions).where(eq(s.writeupRevisions.id, input.revisionId)).for("update");
    if (!rev) throw new EditingError("No such revision.", 404);
    const t = transition(rev.status, input.decision, { isAuthor: rev.authorId === input.moderatorId, isModerator: true });
    if (!t.ok) throw new EditingError(t.reason);
    if (input.decision !== "publish" && input.reason.trim().length < 10) {
      throw new EditingError("Tell the author why, in a sentence or more.");
    }
    const published = await everPublished(tx, rev.writeupId);
    await tx.update(s.writeupRevisions).set({ status: t.to, decidedAt: new Date() }).where(eq(s.writeupRevisions.id, rev.id));
    if (input.decision === "publish") {
      await showRevision(tx, rev.writeupId, { ...rev, status: "published" }, "published");
    } else if (!published) {
      await tx.update(s.writeups).set({ status: t.to }).where(eq(s.writeups.id, rev.writeupId));
    }
    await tx.insert(s.reviewDecisions).values({ revisionId: rev.id, decidedBy: input.moderatorId, decision: input.decision, reason: input.reason.trim(), checklist: input.checklist });
    const [author] = await tx.select({ email: s.users.email, name: s.users.displayName }).from(s.users).where(eq(s.users.id, rev.authorId));
    const [w] = await tx.select({ slug: s.writeups.slug }).from(s.writeups).where(eq(s.writeups.id, rev.writeupId));
    const where = input.decision === "publish" ? `${input.appUrl}/writeups/${w.slug}` : `${input.appUrl}/my/writeups/${rev.writeupId}`;
    const lines: Record<Decision, string> = {
      publish: `Your write-up “${rev.title}” is published. Thank you for sharing it with the class.`,
      request_changes: `A moderator has read your write-up “${rev.title}” and asks for some changes before it is published.`,
      decline: `A moderator has read your write-up “${rev.title}” and decided not to publish it.`,
    };
    await enqueueEmail(tx, {
      to: author.email,
      kind: `review_${input.decision}`,
      subject: `${SUBJECT_PREFIX[input.decision]}: ${rev.title}`.slice(0, 200),
      text: `Hello ${author.name},\n\n${lines[input.decision]}\n\n${input.reason.trim() ? `The moderator wrote:\n\n${input.reason.trim()}\n\n` : ""}${where}\n`,
    });
    return { writeupId: rev.writeupId, status: t.to };
  });
}

export async function withdraw(db: Db, writeupId: number, actor: { id: number; isModerator: boolean }) {
  return db.transaction(async (tx) => {
    const [w] = await tx.select().from(s.writeups).where(eq(s.writeups.id, writeupId)).for("update");
    if (!w) throw new EditingError("No such write-up.", 404);
    const t = transition(w.status, "withdraw", { isAuthor: w.authorId === actor.id, isModerator: actor.isModerator });
    if (!t.ok) throw new EditingError(t.reason);
    await tx.update(s.writeups).set({ status: "withdrawn" }).where(eq(s.writeups.id, writeupId));
    const latest = await workingRevision(tx, writeupId);
    if (latest) {
      await tx.update(s.writeupRevisions).set({ status: "withdrawn" }).where(eq(s.writeupRevisions.id, latest.id));
      await tx.insert(s.reviewDecisions).values({ revisionId: latest.id, decidedBy: actor.id, decision: "withdraw", reason: "" });
    }
  });
}

/** The author's write-ups with the state of each one's latest revision. */
export async function listMyWriteups(db: Db, authorId: number) {
  return db
    .select({
      id: s.writeups.id, slug: s.writeups.slug, title: s.writeups.title, status: s.writeups.status, updatedAt: s.writeups.updatedAt,
      latestStatus: sql<RevisionState>`(select r.status from ${s.writeupRevisions} r where r.writeup_id = "writeups"."id" order by r.number desc limit 1)`,
      latestTitle: sql<string>`(select r.title from ${s.writeupRevisions} r where r.writeup_id = "writeups"."id" order by r.number desc limit 1)`,
    })
    .from(s.writeups)
    .where(eq(s.writeups.authorId, authorId))
    .orderBy(desc(s.writeups.updatedAt));
}

/** Everything the editor needs: the working (or latest) revision of the author's write-up. */
export async function getForEditing(db: Db, writeupId: number) {
  const [w] = await db.select().from(s.writeups).where(eq(s.writeups.id, writeupId));
  if (!w) return null;
  const latest = await workingRevision(db, writeupId);
  if (!latest) return null;
  const decisions = await listDecisions(db, writeupId);
  return { writeup: w, revision: latest, decisions, published: await everPublished(db, writeupId) };
}

export async function listDecisions(db: Db, writeupId: number) {
  return db
    .select({
      id: s.reviewDecisions.id, decision: s.reviewDecisions.decision, reason: s.reviewDecisions.reason, checklist: s.reviewDecisions.checklist,
      createdAt: s.reviewDecisions.createdAt, by: s.users.displayName, revisionNumber: s.writeupRevisions.number,
    })
    .from(s.reviewDecisions)
    .innerJoin(s.writeupRevisions, eq(s.writeupRevisions.id, s.reviewDecisions.revisionId))
    .innerJoin(s.users, eq(s.users.id, s.reviewDecisions.decidedBy))
    .where(eq(s.writeupRevisions.writeupId, writeupId))
    .orderBy(desc(s.reviewDecisions.createdAt), desc(s.reviewDecisions.id));
}

export type QueueSort = "waiting" | "title" | "author";

/** Revisions awaiting review, oldest first by default; filter by system and author. */
export async function reviewQueue(db: Db, opts: { system?: string; author?: string; sort?: QueueSort; desc?: boolean } = {}) {
  const filters = [eq(s.writeupRevisions.status, "awaiting_review")];
  if (opts.system) filters.push(sql`${opts.system} = any(${s.writeupRevisions.systems})`);
  if (opts.author) filters.push(sql`${s.users.displayName} ilike ${`%${opts.author.replace(/[\\%_]/g, (c) => `\\${c}`)}%`}`);
  const column = opts.sort === "title" ? s.writeupRevisions.title : opts.sort === "author" ? s.users.displayName : s.writeupRevisions.submittedAt;
  return db
    .select({
      revisionId: s.writeupRevisions.id, writeupId: s.writeupRevisions.writeupId, number: s.writeupRevisions.number,
      title: s.writeupRevisions.title, systems: s.writeupRevisions.systems, submittedAt: s.writeupRevisions.submittedAt,
      author: s.users.displayName,
    })
    .from(s.writeupRevisions)
    .innerJoin(s.users, eq(s.users.id, s.writeupRevisions.authorId))
    .where(and(...filters))
    .orderBy(opts.desc ? desc(column) : asc(column), asc(s.writeupRevisions.id));
}

/** A revision for review, with the revision readers see now (for the diff). */
export async function getForReview(db: Db, revisionId: number) {
  const [rev] = await db
    .select({ rev: s.writeupRevisions, author: s.users.displayName })
    .from(s.writeupRevisions)
    .innerJoin(s.users, eq(s.users.id, s.writeupRevisions.authorId))
    .where(eq(s.writeupRevisions.id, revisionId));
  if (!rev) return null;
  const [previous] = await db
    .select()
    .from(s.writeupRevisions)
    .where(and(eq(s.writeupRevisions.writeupId, rev.rev.writeupId), eq(s.writeupRevisions.status, "published"), sql`${s.writeupRevisions.number} < ${rev.rev.number}`))
    .orderBy(desc(s.writeupRevisions.number))
    .limit(1);
  const history = await db
    .select({ id: s.writeupRevisions.id, number: s.writeupRevisions.number, status: s.writeupRevisions.status, updatedAt: s.writeupRevisions.updatedAt })
    .from(s.writeupRevisions)
    .where(eq(s.writeupRevisions.writeupId, rev.rev.writeupId))
    .orderBy(asc(s.writeupRevisions.number));
  return { revision: rev.rev, author: rev.author, previous: previous ?? null, history, decisions: await listDecisions(db, rev.rev.writeupId) };
}

export async function getRevision(db: Db, revisionId: number) {
  const [rev] = await db.select().from(s.writeupRevisions).where(eq(s.writeupRevisions.id, revisionId));
  return rev ?? null;
}

export async function listSystemAndZoneChoices(db: Db) {
  const [systems, zones] = await Promise.all([
    db.select({ slug: s.systems.slug, name: s.systems.name }).from(s.systems).orderBy(asc(s.systems.sortOrder)),
    db.select({ slug: s.zones.slug, name: s.zones.name }).from(s.zones).orderBy(asc(s.zones.sortOrder)),
  ]);
  return { systems, zones };
}

export async function addSystem(db: Db, slug: string, name: string, description: string) {
  const [{ n }] = await db.select({ n: sql<number>`coalesce(max(${s.systems.sortOrder}), 0)::int + 1` }).from(s.systems);
  const inserted = await db.insert(s.systems).values({ slug, name, description, sortOrder: n }).onConflictDoNothing().returning();
  return inserted.length > 0;
}


// ---------------------------------------------------------------------------------------------
// Numbers for readers: calculations the author attaches to a write-up (app/domain/calculations.ts).

/** The states in which the author may change a write-up's numbers: those in which the editor lets them edit. */
function numbersOpen(state: RevisionState): boolean {
  return canEdit(state) || state === "published" || state === "declined";
}

/** The author's write-ups that can take numbers now (for "attach to a write-up of mine" on the tools). */
export async function listWriteupsOpenForNumbers(db: Db, authorId: number): Promise<{ id: number; title: string }[]> {
  const mine = await listMyWriteups(db, authorId);
  return mine.filter((w) => numbersOpen(w.latestStatus)).map((w) => ({ id: w.id, title: w.latestTitle ?? w.title }));
}

/**
 * The author's write-up, while its numbers may change: the same states in which the editor lets
 * them edit (a draft, one sent back, a published or declined one). Not while the moderators have it,
 * nor once withdrawn. Anyone else gets "no such write-up" (404), as in the editor.
 */
export async function requireAuthorsWriteupForNumbers(tx: Tx | Db, writeupId: number, userId: number) {
  const [w] = await tx.select({ id: s.writeups.id, authorId: s.writeups.authorId }).from(s.writeups).where(eq(s.writeups.id, writeupId));
  if (!w || w.authorId !== userId) throw new EditingError("No such write-up of yours.", 404);
  const latest = await workingRevision(tx, writeupId);
  const state = latest?.status as RevisionState | undefined;
  if (!state || !numbersOpen(state)) {
    throw new EditingError(
      state === "awaiting_review"
        ? "This write-up is with the moderators; you can change its numbers once they have replied."
        : "This write-up can no longer be changed.",
      409,
    );
  }
}

/** Attaches a calculation to the author's write-up; its input is checked again before it is stored. */
export async function attachCalculation(
  db: Db,
  input: { writeupId: number; userId: number; calc: Calculation; title: string },
): Promise<number> {
  const checked = readCalculation(input.calc.kind, input.calc.input);
  if (!checked) throw new EditingError("These figures do not make a calculation we can show.");
  return db.transaction(async (tx) => {
    await requireAuthorsWriteupForNumbers(tx, input.writeupId, input.userId);
    const count = (await listWriteupCalculations(tx, input.writeupId)).length;
    if (count >= MAX_CALCULATIONS) throw new EditingError(`A write-up carries at most ${MAX_CALCULATIONS} sets of numbers.`);
    return addWriteupCalculation(tx, input.writeupId, checked, { title: input.title.slice(0, 120), userId: input.userId });
  });
}

export const MAX_CALCULATIONS = 12;

/** Removes one of the write-up's calculations; only its author, and only one of this write-up's. */
export async function detachCalculation(db: Db, input: { writeupId: number; userId: number; calculationId: number }): Promise<void> {
  await db.transaction(async (tx) => {
    await requireAuthorsWriteupForNumbers(tx, input.writeupId, input.userId);
    const removed = await removeWriteupCalculation(tx, input.writeupId, input.calculationId);
    if (!removed) throw new EditingError("Those numbers are not attached to this write-up.", 404);
  });
}
