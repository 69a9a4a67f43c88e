// One-time links (e-mail verification, password reset): random tokens, stored only as a SHA-256 hash,
// that expire and work once.
import { createHash, randomBytes } from "node:crypto";
import { and, eq, gt, isNull, sql } from "drizzle-orm";
import type { Db } from "~/db/client.server";
import * as s from "~/db/schema";

export type TokenKind = "verify_email" | "reset_password";

export const TOKEN_LIFETIME_MINUTES: Record<TokenKind, number> = { verify_email: 48 * 60, reset_password: 60 };

const digest = (token: string) => createHash("sha256").update(token).digest("hex");

export async function issueToken(db: Db, userId: number, kind: TokenKind): Promise<string> {
  const token = randomBytes(32).toString("base64url");
  await db.insert(s.authTokens).values({
    userId,
    kind,
    tokenHash: digest(token),
    expiresAt: new Date(Date.now() + TOKEN_LIFETIME_MINUTES[kind] * 60_000),
  });
  return token;
}

/** Is the token valid right now (without using it)? Returns its user id. */
export async function peekToken(db: Db, token: string, kind: TokenKind): Promise<number | null> {
  const [row] = await db
    .select({ userId: s.authTokens.userId })
    .from(s.authTokens)
    .where(and(eq(s.authTokens.tokenHash, digest(token)), eq(s.authTokens.kind, kind), isNull(s.authTokens.usedAt), gt(s.authTokens.expiresAt, sql`now()`)));
  return row?.userId ?? null;
}

/** Uses the token: succeeds once, before it expires. Returns its user id. */
export async function consumeToken(db: Db, token: string, kind: TokenKind): Promise<number | null> {
  const [row] = await db
    .update(s.authTokens)
    .set({ usedAt: new Date() })
    .where(and(eq(s.authTokens.tokenHash, digest(token)), eq(s.authTokens.kind, kind), isNull(s.authTokens.usedAt), gt(s.authTokens.expiresAt, sql`now()`)))
    .returning({ userId: s.authTokens.userId });
  return row?.userId ?? null;
}
