// The e-mail outbox. A message is written here first, in the same transaction as the write that
// caused it, and a sender (app/services/outbox-worker.server.ts) delivers it later, retrying with
// exponential backoff, so that a write never fails, nor is a message lost, while SMTP is down.
// Delivery is at least once: a sender that dies between the SMTP server's "250 OK" and the
// update below sends that one message again once its claim expires.
import { and, asc, desc, eq, gt, inArray, isNull, lte, sql } from "drizzle-orm";
import { z } from "zod";
import type { Db } from "~/db/client.server";
import * as s from "~/db/schema";

/** The app's db or a transaction of it, so the message commits (or rolls back) with its cause. */
export type DbOrTx = Db | Parameters<Parameters<Db["transaction"]>[0]>[0];

/** Sends one message; rejects when the SMTP server did not accept it. */
export type Send = (mail: { to: string; subject: string; text: string; html?: string | null }) => Promise<unknown>;

/** The first retry after 5 s, then twice as long each time, never longer than 10 minutes. (common practice) */
export const RETRY_BASE_MS = 5_000;
export const RETRY_MAX_MS = 10 * 60_000;
/**
 * A message is no longer tried once it is this old. RFC 5321 §4.5.4.1: "the give-up time generally
 * needs to be at least 4-5 days". It stays in the table, with its last error, for the admin.
 */
export const GIVE_UP_AFTER_MS = 5 * 24 * 60 * 60_000;
/**
 * A sender claims a message for this long before it sends it; a sender that dies mid-send leaves
 * the message to another one after this. Far longer than one send can take (the transport gives
 * up after 5 s without a connection or greeting and after 30 s of silence).
 */
export const CLAIM_MS = 5 * 60_000;

/** Delay before the next try, after `attempts` failed tries (1, 2, 3 ...): 5 s × 2^(attempts−1), capped. */
export function retryDelayMs(attempts: number): number {
  return Math.min(RETRY_BASE_MS * 2 ** Math.max(0, attempts - 1), RETRY_MAX_MS);
}

const messageSchema = z.object({
  to: z.email(),
  subject: z.string().trim().min(1).max(300).refine((v) => !/[\r\n]/.test(v), "one line"),
  text: z.string().min(1),
  html: z.string().nullish(),
  kind: z.string().trim().min(1).max(40),
});
export type NewEmail = z.input<typeof messageSchema>;

/** Queues one message for one recipient. Pass the transaction of the write that causes it. */
export async function enqueueEmail(db: DbOrTx, message: NewEmail): Promise<number> {
  const m = messageSchema.parse(message);
  const [row] = await db
    .insert(s.outbox)
    // Due at once by the app's clock, the one the sender compares with. (The column's default, the
    // database's now(), counts microseconds: a sender asking "due by <this millisecond>" within the
    // same millisecond would pass the message over until its next run.)
    .values({ toAddress: m.to, subject: m.subject, textBody: m.text, htmlBody: m.html ?? null, kind: m.kind, nextAttemptAt: new Date() })
    .returning({ id: s.outbox.id });
  return row.id;
}

function describeError(error: unknown): string {
  const e = error as { message?: unknown; code?: unknown; responseCode?: unknown };
  const parts = [
    typeof e?.code === "string" ? e.code : null,
    typeof e?.responseCode === "number" ? String(e.responseCode) : null,
    typeof e?.message === "string" ? e.message : String(error),
  ].filter(Boolean);
  return parts.join(" ").slice(0, 1000);
}

/** Claims the next due message (one statement, so it commits at once), or returns null. */
async function claimNext(db: Db, now: Date) {
  // FOR UPDATE SKIP LOCKED: a row another sender is claiming right now is passed over instead of
  // waited for; once that sender commits, the row's next attempt lies in the future and no longer
  // matches. So two senders never hold, nor send, the same message.
  const due = db
    .select({ id: s.outbox.id })
    .from(s.outbox)
    .where(and(
      isNull(s.outbox.sentAt),
      lte(s.outbox.nextAttemptAt, now),
      gt(s.outbox.createdAt, new Date(now.getTime() - GIVE_UP_AFTER_MS)),
    ))
    .orderBy(asc(s.outbox.nextAttemptAt), asc(s.outbox.id))
    .limit(1)
    .for("update", { skipLocked: true });
  const [row] = await db
    .update(s.outbox)
    .set({ nextAttemptAt: new Date(now.getTime() + CLAIM_MS) })
    .where(inArray(s.outbox.id, due))
    .returning();
  return row ?? null;
}

/**
 * Sends up to `limit` due messages, one at a time. A message the server accepted is marked sent;
 * one it did not gets attempts + 1, the error, and a later next attempt. Returns the counts.
 * `now` is the sender's clock (tests move it forward).
 */
export async function deliverPending(
  db: Db,
  send: Send,
  options: { limit?: number; now?: Date } = {},
): Promise<{ sent: number; failed: number }> {
  const limit = options.limit ?? 20;
  const now = options.now ?? new Date();
  let sent = 0;
  let failed = 0;
  for (let i = 0; i < limit; i++) {
    const row = await claimNext(db, now);
    if (!row) break;
    try {
      await send({ to: row.toAddress, subject: row.subject, text: row.textBody, html: row.htmlBody });
    } catch (error) {
      const attempts = row.attempts + 1;
      await db
        .update(s.outbox)
        .set({
          attempts: sql`${s.outbox.attempts} + 1`,
          lastError: describeError(error),
          nextAttemptAt: new Date(now.getTime() + retryDelayMs(attempts)),
        })
        .where(eq(s.outbox.id, row.id));
      failed++;
      continue;
    }
    await db.update(s.outbox).set({ sentAt: now }).where(eq(s.outbox.id, row.id));
    sent++;
  }
  return { sent, failed };
}

export type OutboxStatus = "sent" | "waiting" | "retrying" | "given up";

/**
 * The newest messages for the admin's view, without their bodies: those hold the links that
 * verify an address or reset a password, which are for the recipient only.
 */
export async function listOutbox(db: Db, options: { limit?: number; now?: Date } = {}) {
  const now = options.now ?? new Date();
  const rows = await db
    .select({
      id: s.outbox.id,
      toAddress: s.outbox.toAddress,
      subject: s.outbox.subject,
      kind: s.outbox.kind,
      createdAt: s.outbox.createdAt,
      attempts: s.outbox.attempts,
      nextAttemptAt: s.outbox.nextAttemptAt,
      sentAt: s.outbox.sentAt,
      lastError: s.outbox.lastError,
    })
    .from(s.outbox)
    .orderBy(desc(s.outbox.createdAt), desc(s.outbox.id))
    .limit(options.limit ?? 100);
  return rows.map((r) => {
    const status: OutboxStatus = r.sentAt
      ? "sent"
      : now.getTime() - r.createdAt.getTime() >= GIVE_UP_AFTER_MS
        ? "given up"
        : r.attempts > 0 ? "retrying" : "waiting";
    return { ...r, status };
  });
}
