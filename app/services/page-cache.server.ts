// A short-lived copy of the public pages as a visitor who is not signed in sees them (the home
// page, write-ups, spaces ...), so that a rush of readers (the digest has just gone out) is
// answered from memory instead of by the database and React for every one of them.
//
// - Only documents are kept (scripts/serve.mjs marks them: the `.data` requests of client-side
//   navigation are normalised to the same address by React Router), only for GET requests that
//   carry no cookie and no Authorization (anyone signed in, or with a notice or a draft on its way,
//   gets the page made for them), and only answers 200 in HTML that set no cookie and do not say
//   no-store or private.
// - Every form or API request that could change something (any method but GET and HEAD) forgets
//   every kept page once it has been answered; a page rendered while such a request ran is not
//   kept. Changes made by another process (a second server, a restore) show within MAX_AGE_MS.
// - A page's script nonce is never reused: each answer from memory gets a fresh one, in the page
//   and in its Content-Security-Policy.
// See docs/decisions/0014-page-cache-for-visitors.md.
import type { MiddlewareFunction } from "react-router";
import { createNonce } from "./security-headers.server";

/** How long a kept page is served, at most. */
export const MAX_AGE_MS = 10_000;
const MAX_ENTRIES = 300;
const MAX_BODY_CHARS = 1_000_000;
/** The header scripts/serve.mjs sets on every request: "yes" for a document, "no" for data. */
export const DOCUMENT_HEADER = "x-sistership-document";
/** Says whether an answer came from memory ("hit") or was made for this request ("miss"). */
export const CACHE_HEADER = "x-sistership-page-cache";

type Entry = { status: number; headers: [string, string][]; body: string; nonce: string | null; storedAt: number };

const entries = new Map<string, Entry>();
/** Counts the writes: a page rendered across a write may show the state before it. */
let generation = 0;

/** Forgets every kept page (after a write, and in tests). */
export function forgetKeptPages(): void {
  entries.clear();
  generation++;
}

export function keptPageCount(): number {
  return entries.size;
}

function keepable(request: Request): boolean {
  return (
    request.method === "GET" &&
    request.headers.get(DOCUMENT_HEADER) === "yes" &&
    !request.headers.has("cookie") &&
    !request.headers.has("authorization")
  );
}

function storable(response: Response): boolean {
  const control = response.headers.get("cache-control") ?? "";
  return (
    response.status === 200 &&
    (response.headers.get("content-type") ?? "").startsWith("text/html") &&
    !response.headers.has("set-cookie") &&
    !/no-store|private/i.test(control)
  );
}

const NONCE_IN_POLICY = /'nonce-([^']+)'/;

function answer(entry: Entry, state: "hit" | "miss"): Response {
  const headers = new Headers(entry.headers);
  let body = entry.body;
  if (state === "hit" && entry.nonce) {
    const fresh = createNonce();
    body = body.replaceAll(entry.nonce, fresh);
    const policy = headers.get("content-security-policy");
    if (policy) headers.set("content-security-policy", policy.replace(NONCE_IN_POLICY, `'nonce-${fresh}'`));
  }
  headers.set(CACHE_HEADER, state);
  return new Response(body, { status: entry.status, headers });
}

/** Route middleware of the public pages: answers from memory when it may, and keeps what it may. */
export const keepPageForVisitors: MiddlewareFunction<Response> = async ({ request }, next) => {
  if (!keepable(request)) return next();
  const url = new URL(request.url);
  const key = `${url.pathname}${url.search}`;
  const kept = entries.get(key);
  if (kept && Date.now() - kept.storedAt < MAX_AGE_MS) return answer(kept, "hit");
  if (kept) entries.delete(key);

  const before = generation;
  const response = await next();
  if (!storable(response)) return response;
  const body = await response.text();
  const headers = [...response.headers.entries()];
  const nonce = NONCE_IN_POLICY.exec(response.headers.get("content-security-policy") ?? "")?.[1] ?? null;
  const entry: Entry = { status: response.status, headers, body, nonce, storedAt: Date.now() };
  if (generation === before && body.length <= MAX_BODY_CHARS) {
    entries.set(key, entry);
    // The oldest kept page goes first (a Map keeps the order of insertion).
    while (entries.size > MAX_ENTRIES) entries.delete(entries.keys().next().value!);
  }
  return answer(entry, "miss");
};

/** Root middleware: a request that may have changed something forgets every kept page once answered. */
export const forgetPagesAfterWrites: MiddlewareFunction<Response> = async ({ request }, next) => {
  if (request.method === "GET" || request.method === "HEAD") return next();
  try {
    return await next();
  } finally {
    forgetKeptPages();
  }
};
