// Sign-in sessions: a signed cookie carries the id of a server-side session row, so sessions can be
// listed and revoked. Access checks (requireUser, requirePermission) live here and nowhere else.
import { randomBytes } from "node:crypto";
import { createCookieSessionStorage, data, redirect } from "react-router";
import { db } from "~/db/index.server";
import { can, type Permission, type Role } from "~/domain/permissions";
import { createSession, deleteSession, findSessionUser, type SessionUser } from "~/models/sessions.server";
import { env } from "./env.server";

const SESSION_DAYS = 30;
const loopback = /^https?:\/\/(127\.0\.0\.1|localhost|\[::1\])(:\d+)?(\/|$)/.test(env.APP_URL);

export const sessionStorage = createCookieSessionStorage<{ sid: string }, { notice: string }>({
  cookie: {
    name: "__sistership",
    httpOnly: true,
    sameSite: "lax",
    path: "/",
    // Secure in production; a production build served on loopback (npm start) is plain HTTP.
    secure: env.NODE_ENV === "production" && !loopback,
    secrets: [env.SESSION_SECRET],
    maxAge: SESSION_DAYS * 24 * 3600,
  },
});

function cookieSession(request: Request) {
  return sessionStorage.getSession(request.headers.get("Cookie"));
}

export type { SessionUser };

/**
 * Who a page's request is from, asked once per request: the root's loader, the route's and the
 * helpers they call all ask, and each answer costs a signature check and a database query. Only
 * for GET and HEAD, which change no session; an action that signs someone in or out asks afresh.
 */
const usersOfReads = new WeakMap<Request, Promise<SessionUser | null>>();

/** The signed-in user with their roles, or null. */
export function getUser(request: Request): Promise<SessionUser | null> {
  if (request.method !== "GET" && request.method !== "HEAD") return lookUpUser(request);
  let user = usersOfReads.get(request);
  if (!user) {
    user = lookUpUser(request);
    usersOfReads.set(request, user);
  }
  return user;
}

async function lookUpUser(request: Request): Promise<SessionUser | null> {
  const session = await cookieSession(request);
  const sid = session.get("sid");
  if (!sid) return null;
  return findSessionUser(db, sid);
}

function signInRedirect(request: Request): never {
  const url = new URL(request.url);
  const back = `${url.pathname}${url.search}`;
  throw redirect(`/sign-in?redirectTo=${encodeURIComponent(back)}`);
}

/** The signed-in user, or a redirect to the sign-in page that comes back here afterwards. */
export async function requireUser(request: Request): Promise<SessionUser> {
  const user = await getUser(request);
  if (!user) signInRedirect(request);
  return user;
}

/** The signed-in user if they hold the permission; otherwise sign-in, or a 403 page. */
export async function requirePermission(request: Request, permission: Permission): Promise<SessionUser> {
  const user = await requireUser(request);
  if (!can(user.roles, permission)) {
    throw data("Your account does not have the role this page needs. Ask an administrator if you think it should.", { status: 403 });
  }
  return user;
}

export async function requireRole(request: Request, role: Role): Promise<SessionUser> {
  const user = await requireUser(request);
  if (!user.roles.includes(role)) {
    throw data("Your account does not have the role this page needs. Ask an administrator if you think it should.", { status: 403 });
  }
  return user;
}

/** Only where it matters: a page is for people who are not signed in (sign-in, sign-up). */
export async function requireAnonymous(request: Request) {
  if (await getUser(request)) throw redirect("/account");
}

export function safeRedirect(to: FormDataEntryValue | string | null | undefined, fallback = "/"): string {
  if (!to || typeof to !== "string" || !to.startsWith("/") || to.startsWith("//") || to.startsWith("/\\")) return fallback;
  return to;
}

export async function signIn(request: Request, userId: number, redirectTo: string, notice?: string) {
  const session = await cookieSession(request);
  const sid = randomBytes(24).toString("base64url");
  await createSession(db, {
    id: sid,
    userId,
    expiresAt: new Date(Date.now() + SESSION_DAYS * 24 * 3600 * 1000),
    userAgent: (request.headers.get("user-agent") ?? "").slice(0, 300),
  });
  session.set("sid", sid);
  if (notice) session.flash("notice", notice);
  return redirect(safeRedirect(redirectTo), { headers: { "Set-Cookie": await sessionStorage.commitSession(session) } });
}

export async function signOut(request: Request) {
  const session = await cookieSession(request);
  const sid = session.get("sid");
  if (sid) await deleteSession(db, sid);
  return redirect("/", { headers: { "Set-Cookie": await sessionStorage.destroySession(session) } });
}

export async function currentSessionId(request: Request): Promise<string | undefined> {
  return (await cookieSession(request)).get("sid");
}

/** A one-time message shown on the next page (after a redirect). */
export async function redirectWithNotice(request: Request, to: string, notice: string) {
  const session = await cookieSession(request);
  session.flash("notice", notice);
  return redirect(to, { headers: { "Set-Cookie": await sessionStorage.commitSession(session) } });
}

export async function readNotice(request: Request): Promise<{ notice: string | null; headers?: HeadersInit }> {
  const session = await cookieSession(request);
  const notice = session.get("notice") ?? null;
  if (!notice) return { notice: null };
  return { notice, headers: { "Set-Cookie": await sessionStorage.commitSession(session) } };
}
