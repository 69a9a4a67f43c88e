// Fixed-window rate limits kept in PostgreSQL, so they hold across processes and restarts.
import { sql } from "drizzle-orm";
import type { Db } from "~/db/client.server";
import * as s from "~/db/schema";

export type Limit = { max: number; windowSeconds: number };

export const LIMITS = {
  signInPerAddress: { max: 20, windowSeconds: 15 * 60 },
  signInPerAccount: { max: 8, windowSeconds: 15 * 60 },
  signUpPerAddress: { max: 10, windowSeconds: 60 * 60 },
  resetPerAddress: { max: 10, windowSeconds: 60 * 60 },
  resetPerAccount: { max: 3, windowSeconds: 60 * 60 },
  commentPerAccount: { max: 20, windowSeconds: 60 * 60 },
} satisfies Record<string, Limit>;

export type LimitResult = { allowed: true } | { allowed: false; retryAfterSeconds: number };

/** Counts one attempt against `key`; refuses once the window's maximum is passed. */
export async function hitLimit(db: Db, key: string, limit: Limit, now = new Date()): Promise<LimitResult> {
  const windowMs = limit.windowSeconds * 1000;
  const windowStart = new Date(Math.floor(now.getTime() / windowMs) * windowMs);
  const [row] = await db
    .insert(s.rateLimits)
    .values({ key, windowStart, count: 1 })
    .onConflictDoUpdate({ target: [s.rateLimits.key, s.rateLimits.windowStart], set: { count: sql`${s.rateLimits.count} + 1` } })
    .returning({ count: s.rateLimits.count });
  if (row.count <= limit.max) return { allowed: true };
  return { allowed: false, retryAfterSeconds: Math.ceil((windowStart.getTime() + windowMs - now.getTime()) / 1000) };
}

/** Has `key` already used up the current window (without counting a new attempt)? */
export async function checkLimit(db: Db, key: string, limit: Limit, now = new Date()): Promise<LimitResult> {
  const windowMs = limit.windowSeconds * 1000;
  const windowStart = new Date(Math.floor(now.getTime() / windowMs) * windowMs);
  const rows = await db
    .select({ count: s.rateLimits.count })
    .from(s.rateLimits)
    .where(sql`${s.rateLimits.key} = ${key} and ${s.rateLimits.windowStart} = ${windowStart}`);
  if ((rows[0]?.count ?? 0) < limit.max) return { allowed: true };
  return { allowed: false, retryAfterSeconds: Math.ceil((windowStart.getTime() + windowMs - now.getTime()) / 1000) };
}

/** The client's address as the server sees it (no proxy headers are trusted). */
export function clientAddress(request: Request): string {
  return request.headers.get("x-sistership-client") ?? "local";
}
