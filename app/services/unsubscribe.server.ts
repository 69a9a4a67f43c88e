// The digest's unsubscribe link: a token signed with the app's secret (HMAC-SHA256, RFC 2104) that
// names the member, so the link works without signing in and cannot be made up for someone else.
// It does not expire: a member may act on an old digest (common practice for unsubscribe links).
import { createHmac, timingSafeEqual } from "node:crypto";
import { env } from "./env.server";

const PURPOSE = "digest-unsubscribe";

function mac(secret: string, userId: number): string {
  return createHmac("sha256", secret).update(`${PURPOSE}:${userId}`).digest("base64url");
}

/** "<user id>.<signature>". */
export function unsubscribeToken(userId: number, secret: string = env.SESSION_SECRET): string {
  return `${userId}.${mac(secret, userId)}`;
}

/** The member a token names, or null when it was not made with our secret. */
export function verifyUnsubscribeToken(token: string, secret: string = env.SESSION_SECRET): number | null {
  const m = /^([1-9][0-9]{0,9})\.([A-Za-z0-9_-]{43})$/.exec(token.trim());
  if (!m) return null;
  const userId = Number(m[1]);
  const expected = Buffer.from(mac(secret, userId));
  const given = Buffer.from(m[2]);
  return expected.length === given.length && timingSafeEqual(expected, given) ? userId : null;
}

export function unsubscribeUrl(appUrl: string, userId: number, secret?: string): string {
  return new URL(`/digest/unsubscribe?token=${encodeURIComponent(unsubscribeToken(userId, secret))}`, appUrl).toString();
}
