// While PostgreSQL cannot be reached, the app answers 503 instead of 500: a page that says so (and
// gives back what a posted form held), or JSON on /api/*, both with Retry-After. Once the database
// answers again, so does the app: the pool makes new connections on the next request.
import { data } from "react-router";
import { isDatabaseUnavailable, watchDatabase } from "~/db/client.server";
import { DATABASE_OUTAGE, type DatabaseOutage } from "~/domain/db-outage";

/** Seconds a client is asked to wait before trying again (RFC 9110 §10.2.3 Retry-After). */
export const RETRY_AFTER_SECONDS = 30;

// A posted form is copied so that the page can give it back; bigger bodies (photos) are not.
const MAX_FORM_BYTES = 256 * 1024;
// Never sent back, not even to the person who typed them.
const SECRET_FIELD = /password|secret|token|csrf/i;

/** Requests whose answers are JSON (resource routes under /api/). */
function wantsJson(request: Request): boolean {
  return new URL(request.url).pathname.startsWith("/api/");
}

function copyOfForm(request: Request): Request | null {
  if (request.method === "GET" || request.method === "HEAD") return null;
  const type = request.headers.get("content-type") ?? "";
  const length = Number(request.headers.get("content-length") ?? NaN);
  if (!/^application\/x-www-form-urlencoded|^multipart\/form-data/i.test(type)) return null;
  if (!(length <= MAX_FORM_BYTES)) return null;
  return request.clone();
}

async function fieldsOf(copy: Request | null): Promise<Pick<DatabaseOutage, "fields" | "secretsLeftOut">> {
  const fields: DatabaseOutage["fields"] = [];
  let secretsLeftOut = false;
  if (!copy) return { fields, secretsLeftOut };
  try {
    const form = await copy.formData();
    for (const [name, value] of form.entries()) {
      if (typeof value !== "string") continue;
      if (SECRET_FIELD.test(name)) {
        secretsLeftOut ||= value !== "";
        continue;
      }
      fields.push({ name, value });
    }
  } catch {
    // Not a readable form: nothing to give back.
  }
  return { fields, secretsLeftOut };
}

/**
 * The page the reader was on, for a request made from it (a fetcher's call to /api/...): the
 * Referer, when it is an address of this site.
 */
function pageOf(request: Request): string | null {
  const referer = request.headers.get("referer");
  if (!referer) return null;
  try {
    const from = new URL(referer);
    return from.origin === new URL(request.url).origin ? `${from.pathname}${from.search}` : null;
  } catch {
    return null;
  }
}

/**
 * The 503 answer: JSON `{ error, message, retryAfterSeconds }` for the API, otherwise the root
 * error boundary's outage page. The JSON carries the outage page's content as well: a page whose
 * fetcher met the outage shows the root error boundary, which then gives back what was typed.
 */
export async function outageResponse(request: Request, copy: Request | null = null): Promise<Response | ReturnType<typeof data<DatabaseOutage>>> {
  const headers = { "Retry-After": String(RETRY_AFTER_SECONDS), "Cache-Control": "no-store" };
  const url = new URL(request.url);
  const address = `${url.pathname.replace(/\.data$/, "")}${url.search}`;
  const outage: DatabaseOutage = {
    kind: DATABASE_OUTAGE.kind,
    posted: request.method !== "GET" && request.method !== "HEAD",
    action: address,
    page: wantsJson(request) ? pageOf(request) : address,
    ...(await fieldsOf(copy)),
    retryAfterSeconds: RETRY_AFTER_SECONDS,
  };
  if (wantsJson(request)) {
    return Response.json({ error: "database-unavailable", message: DATABASE_OUTAGE.apiMessage, ...outage }, { status: 503, headers });
  }
  return data(outage, { status: 503, headers });
}

/**
 * Root middleware: runs the request, and when it failed (5xx) because the database could not be
 * reached, answers 503 in its place. Requests that do not need the database (static pages, the
 * calculators) keep working during an outage.
 */
export async function databaseOutage({ request }: { request: Request }, next: () => Promise<Response>): Promise<Response> {
  const copy = copyOfForm(request);
  let watched: { result: Response; unavailable: unknown };
  try {
    watched = await watchDatabase(next);
  } catch (error) {
    if (isDatabaseUnavailable(error)) throw await outageResponse(request, copy);
    throw error;
  }
  const { result: response, unavailable } = watched;
  if (response.status >= 500 && response.status !== 503 && unavailable) {
    await response.body?.cancel().catch(() => {});
    throw await outageResponse(request, copy);
  }
  if (copy) await copy.body?.cancel().catch(() => {});
  return response;
}
