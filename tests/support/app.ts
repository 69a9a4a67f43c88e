// Calling route modules directly in integration tests, against a database of the test file's own.
// The app's modules read DATABASE_URL once, at import: point it at the file's database first, then
// import the routes dynamically.
import { createTestDatabase } from "./db";

export async function appDatabase(template: "template_empty" | "template_seeded" = "template_seeded") {
  const t = await createTestDatabase(template);
  process.env.DATABASE_URL = t.url;
  return t;
}

/**
 * Closes what the app's modules opened against the file's database (its pool, and the fit
 * search's own), then drops the database: the afterAll of a file that imported the app's modules.
 */
export async function closeAppDatabase(t: { drop(): Promise<void> } | undefined) {
  const { db, pool } = await import("~/db/index.server");
  await (await import("~/models/spaces.server")).endFitSearchPool(db);
  await pool.end();
  await t?.drop();
}

export const ORIGIN = "http://127.0.0.1:3000";

export function formRequest(path: string, fields: Record<string, string | string[]>, opts: { cookie?: string; address?: string } = {}) {
  const body = new URLSearchParams();
  for (const [k, v] of Object.entries(fields)) for (const one of [v].flat()) body.append(k, one);
  const headers: Record<string, string> = { "Content-Type": "application/x-www-form-urlencoded", Origin: ORIGIN };
  if (opts.cookie) headers.Cookie = opts.cookie;
  headers["x-sistership-client"] = opts.address ?? "198.51.100.7"; // TEST-NET-2 (RFC 5737)
  return new Request(`${ORIGIN}${path}`, { method: "POST", headers, body });
}

export function getRequest(path: string, cookie?: string) {
  return new Request(`${ORIGIN}${path}`, { headers: cookie ? { Cookie: cookie } : {} });
}

/** The cookie pair ("name=value") from a response's Set-Cookie, to send back. */
export function cookieFrom(response: Response): string {
  const set = response.headers.get("set-cookie");
  if (!set) throw new Error("the response set no cookie");
  return set.split(";")[0];
}

/** Runs a loader or action and returns the Response it returned or threw. */
export async function settle(fn: () => Promise<unknown>): Promise<{ response?: Response; data?: unknown; status: number; thrown: boolean }> {
  try {
    const value = await fn();
    if (value instanceof Response) return { response: value, status: value.status, thrown: false };
    if (value && typeof value === "object" && "type" in value && (value as { type: string }).type === "DataWithResponseInit") {
      const d = value as unknown as { data: unknown; init: ResponseInit | null };
      return { data: d.data, status: d.init?.status ?? 200, thrown: false };
    }
    return { data: value, status: 200, thrown: false };
  } catch (error) {
    if (error instanceof Response) return { response: error, status: error.status, thrown: true };
    if (error && typeof error === "object" && "type" in error && (error as { type: string }).type === "DataWithResponseInit") {
      const d = error as unknown as { data: unknown; init: ResponseInit | null };
      return { data: d.data, status: d.init?.status ?? 500, thrown: true };
    }
    throw error;
  }
}
