// Bad input everywhere: malformed, oversized and hostile values sent to every form action and API
// route, through the route modules, against a database of this file's own. Never a 500; a value
// that cannot be right gets a 4xx with a message that says what is wrong (JSON with `error` on the
// API, the field's message on a form), and nothing is stored. Hostile values that are still valid
// text (SQL and HTML fragments, invalid UTF-8 turned into U+FFFD by the decoder) may be stored
// as typed, or refused; never a 500.
// The routes come from app/routes.ts: a route with an action, or a resource route under /api/ or
// /media/, with no case below fails the test.
// Vectors: OWASP Testing Guide (WSTG-INPV-05 SQL injection, WSTG-INPV-01 reflected XSS); invalid
// UTF-8 sequences from the Unicode Standard, ch. 3, Table 3-7 (well-formed byte sequences): 0xC0,
// 0xFF and a lone continuation byte 0x80 are never well-formed.
import fs from "node:fs";
import path from "node:path";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { appDatabase, cookieFrom, formRequest, ORIGIN, settle } from "../support/app";

let checkAddress: (request: Request) => void;

type Who = "visitor" | "member" | "moderator" | "admin" | "secretary";
const PEOPLE: Record<Exclude<Who, "visitor">, string> = {
  member: "hal.dunmore@example.com", // invented demo member, hull 211 (content-seed/members.yaml)
  moderator: "nora.pelling@example.org",
  admin: "tomasz.wren@example.org",
  secretary: "ruth.ambler@example.org",
};

type Module = { loader?: (args: never) => unknown; action?: (args: never) => unknown };
type FormTarget = {
  kind: "form";
  path: string;
  params?: Record<string, string>;
  as: Who;
  /** A valid submission: each attack changes one thing in it. */
  fields: Record<string, string | string[]>;
  /** Fields that must be numbers. */
  numeric?: string[];
  /** Fields free text may go in (long text is refused, fragments may be stored as text). */
  text?: string[];
  multipart?: boolean;
  /** Hidden fields: a wrong value gets a message on the form rather than beside a field. */
  hidden?: string[];
  /** After the attacks, the valid submission must succeed (proves the attacks failed on their bad value). */
  baseline?: boolean;
  /** Values of the final valid submission that must differ from the attacked one (an address, a hull already used). */
  baselineFields?: Record<string, string | string[]>;
  /** An empty submission is a valid one (the live preview of an empty draft). */
  emptyOk?: boolean;
  /** Why a refusal carries no message in its data (the page shows one for the state it returns). */
  messageOnPage?: string;
};
type QueryTarget = {
  kind: "query"; path: string; params?: Record<string, string>; as: Who; query: Record<string, string>; numeric?: string[];
  /** Without its parameters the query means nothing: a 400 naming one. */
  required?: boolean;
};
type Case = { load: () => Promise<Module>; targets: (FormTarget | QueryTarget)[]; badParams?: string[] } | { skip: string };

// For the params of a route (:slug, :id, ...): wrong type, out of range, hostile.
const BAD_PARAMS = ["abc", "-1", "0", "99999999999999999999", "1.5", "1; drop table users", "<script>", "%00", "\u0000", "..%2F..%2Fetc%2Fpasswd"];

const CASES: Record<string, Case> = {
  "routes/sign-in.tsx": {
    load: () => import("~/routes/sign-in"),
    targets: [{ kind: "form", path: "/sign-in", as: "visitor", fields: { email: "hal.dunmore@example.com", password: "brantwater-demo", redirectTo: "/" }, text: ["email", "password"], hidden: ["redirectTo"], baseline: true }],
  },
  "routes/sign-up.tsx": {
    load: () => import("~/routes/sign-up"),
    targets: [{ kind: "form", path: "/sign-up", as: "visitor", fields: { email: "new.owner.bad-input@example.com", displayName: "Ada Quillon", password: "a long harbour wall at dusk", website: "" }, text: ["email", "displayName", "password"], baseline: true, baselineFields: { email: "another.new.owner@example.com" } }],
  },
  "routes/sign-out.tsx": { skip: "takes no input: any POST signs out (the session cookie is its only input)" },
  "routes/verify-email.tsx": {
    load: () => import("~/routes/verify-email"),
    targets: [{ kind: "form", path: "/verify-email", as: "visitor", fields: { token: "a".repeat(43) }, text: ["token"] }],
  },
  "routes/forgot-password.tsx": {
    load: () => import("~/routes/forgot-password"),
    targets: [{ kind: "form", path: "/forgot-password", as: "visitor", fields: { email: "hal.dunmore@example.com", website: "" }, text: ["email"], baseline: true }],
  },
  "routes/reset-password.tsx": {
    load: () => import("~/routes/reset-password"),
    targets: [{ kind: "form", path: "/reset-password", as: "visitor", fields: { token: "b".repeat(43), password: "a long harbour wall at dusk", confirm: "a long harbour wall at dusk" }, text: ["token", "password", "confirm"] }],
  },
  "routes/account.tsx": {
    load: () => import("~/routes/account"),
    targets: [
      { kind: "form", path: "/account", as: "member", fields: { intent: "profile", displayName: "Hal Dunmore", creditAs: "Hal D., hull 211", units: "in", digestOptIn: "on" }, text: ["displayName", "creditAs"], baseline: true },
      { kind: "form", path: "/account", as: "member", fields: { intent: "add-boat", hullNumber: "212", boatName: "Second Wind" }, numeric: ["hullNumber"], text: ["boatName"], baseline: true, baselineFields: { hullNumber: "213" } },
    ],
  },
  "routes/admin.users.tsx": {
    load: () => import("~/routes/admin.users"),
    targets: [{ kind: "form", path: "/admin/users", as: "admin", fields: { userId: "USER:lena.marchetti@example.com", roles: ["member"] }, numeric: ["userId"], baseline: true }],
  },
  "routes/my.writeups.$id.tsx": {
    load: () => import("~/routes/my.writeups.$id"),
    targets: [{
      kind: "form", path: "/my/writeups/new", params: { id: "new" }, as: "member",
      fields: {
        intent: "save", title: "A drawer under the chart table", summary: "A shallow drawer fitted into the dead space under the chart table.",
        body: "## What I measured\n\nThe space is 14 x 9 x 3 in.", systems: ["joinery"], appliesTo: "all",
        "parts[0].name": "Drawer slides", "parts[0].quantity": "2", "parts[0].weight": "1 lb", hoursSpent: "6", costUsd: "40",
      },
      numeric: ["hoursSpent", "costUsd", "parts[0].quantity"], text: ["title", "summary", "body", "appliesTo", "parts[0].name"], baseline: true,
    }],
    badParams: ["id"],
  },
  "routes/review.$revisionId.tsx": {
    load: () => import("~/routes/review.$revisionId"),
    targets: [{ kind: "form", path: "/review/REVISION", params: { revisionId: "REVISION" }, as: "moderator", fields: { decision: "request_changes", reason: "Please say which sealant you used and how the tray drains." }, text: ["reason"] }],
    badParams: ["revisionId"],
  },
  "routes/api.preview.ts": {
    load: () => import("~/routes/api.preview"),
    targets: [{ kind: "form", path: "/api/preview", as: "member", fields: { title: "A drawer", summary: "A drawer.", body: "## Heading\n\nText.", systems: ["joinery"] }, text: ["title", "summary", "body"], emptyOk: true, baseline: true }],
  },
  "routes/api.photos.ts": {
    load: () => import("~/routes/api.photos"),
    targets: [{ kind: "form", path: "/api/photos", as: "member", multipart: true, fields: { caption: "The tray in place", alt: "A grey plastic tray under a hand pump" }, text: ["caption", "alt"] }],
  },
  "routes/media.$.ts": {
    load: () => import("~/routes/media.$"),
    targets: [{ kind: "query", path: "/media/photos/x.webp", params: { "*": "photos/x.webp" }, as: "visitor", query: {} }],
    badParams: ["*"],
  },
  "routes/api.writeups.$slug.comments.ts": {
    load: () => import("~/routes/api.writeups.$slug.comments"),
    targets: [
      { kind: "form", path: "/api/writeups/group-27-battery-under-starboard-settee/comments", params: { slug: "group-27-battery-under-starboard-settee" }, as: "member", fields: { intent: "post", body: "Did you fuse the cable at the battery end?", website: "" }, text: ["body"], baseline: true },
      { kind: "form", path: "/api/writeups/group-27-battery-under-starboard-settee/comments", params: { slug: "group-27-battery-under-starboard-settee" }, as: "member", fields: { intent: "delete", commentId: "987654" }, numeric: ["commentId"] },
      { kind: "query", path: "/api/writeups/group-27-battery-under-starboard-settee/comments", params: { slug: "group-27-battery-under-starboard-settee" }, as: "visitor", query: {} },
    ],
    badParams: ["slug"],
  },
  "routes/api.writeups.$slug.done-too.ts": {
    load: () => import("~/routes/api.writeups.$slug.done-too"),
    targets: [
      { kind: "form", path: "/api/writeups/group-27-battery-under-starboard-settee/done-too", params: { slug: "group-27-battery-under-starboard-settee" }, as: "member", fields: { intent: "record", hullNumber: "211" }, numeric: ["hullNumber"], baseline: true },
      { kind: "query", path: "/api/writeups/group-27-battery-under-starboard-settee/done-too", params: { slug: "group-27-battery-under-starboard-settee" }, as: "visitor", query: {} },
    ],
    badParams: ["slug"],
  },
  "routes/admin.tags.tsx": {
    load: () => import("~/routes/admin.tags"),
    targets: [{ kind: "form", path: "/admin/tags", as: "admin", fields: { name: "Ventilation", slug: "ventilation", description: "Vents, cowls and fans." }, text: ["name", "slug", "description"], baseline: true, baselineFields: { name: "Ventilation fans", slug: "ventilation-fans" } }],
  },
  "routes/space.tsx": {
    load: () => import("~/routes/space"),
    targets: [{
      kind: "form", path: "/spaces/starboard-settee-aft-late-mk1", params: { slug: "starboard-settee-aft-late-mk1" }, as: "member", multipart: true,
      fields: { unit: "in", section: "0", length: "24 3/4", width: "14 1/4", height: "11 1/2", method: "tape", hullNumber: "211", measuredOn: "2025-06-01" },
      numeric: ["hullNumber", "section"], text: ["length", "width", "height", "measuredOn"], baseline: true,
    }],
    badParams: ["slug"],
  },
  "routes/items.tsx": {
    load: () => import("~/routes/items"),
    targets: [{ kind: "form", path: "/items", as: "member", fields: { unit: "in", name: "Cool box, 25 qt", length: "19 1/2", width: "12 1/2", height: "14", weight: "9 lb", orientation: "upright", note: "Lid opens on the long side." }, text: ["name", "length", "width", "height", "weight", "note"], baseline: true }],
  },
  "routes/boat.tsx": {
    load: () => import("~/routes/boat"),
    targets: [{ kind: "form", path: "/boats/211", params: { hull: "211" }, as: "member", fields: { intent: "add-item", unit: "in", name: "Second house battery", weight: "62 lb", aftOfBow: "11 ft", side: "port", offCentre: "2 ft", height: "1 ft" }, text: ["name", "weight", "aftOfBow", "offCentre", "height"], baseline: true }],
    badParams: ["hull"],
  },
  "routes/tools.cable.tsx": {
    load: () => import("~/routes/tools.cable"),
    // Attaching the answer to a write-up that is not the member's (none has this number): refused
    // at the last step too, so no case here can store anything.
    targets: [{ kind: "form", path: "/tools/cable", as: "member", fields: { writeupId: "987654", current: "10", length: "21 ft", voltage: "12", drop: "3", insulation: "105", title: "House battery feed" }, numeric: ["writeupId", "current", "voltage", "drop", "insulation"], text: ["title", "length"] }],
  },
  "routes/admin.class.tsx": {
    load: () => import("~/routes/admin.class"),
    targets: [{ kind: "form", path: "/admin/class", as: "admin", fields: { unit: "in", lightDisplacement: "2850", gm: "2.8 ft", loa: "22 ft", lwl: "19 ft 2 in", beam: "7 ft 10 in", lcf: "11 ft 6 in", mct1: "250", demo: "on" }, text: ["lightDisplacement", "gm", "loa", "lwl", "beam", "lcf"], baseline: true }],
  },
  // The yearly digest (a draft for 2025 is compiled before the tests; see beforeAll).
  "routes/secretary.digest.tsx": {
    load: () => import("~/routes/secretary.digest"),
    targets: [{ kind: "form", path: "/secretary/digest", as: "secretary", fields: { year: "2025" }, numeric: ["year"], baseline: true, baselineFields: { year: "2024" } }],
  },
  "routes/secretary.digest.$year.tsx": {
    load: () => import("~/routes/secretary.digest.$year"),
    targets: [
      { kind: "form", path: "/secretary/digest/2025", params: { year: "2025" }, as: "secretary", fields: { intent: "letter", letter: "A good year on the water, and a busy one in the lockers.", correctionNote: "" }, text: ["letter"], baseline: true },
      { kind: "form", path: "/secretary/digest/2025", params: { year: "2025" }, as: "secretary", fields: { intent: "up", writeupId: "987654" }, numeric: ["writeupId"] },
    ],
    badParams: ["year"],
  },
  "routes/digest.$year.pdf.ts": {
    load: () => import("~/routes/digest.$year.pdf"),
    // No edition is issued while this runs (the preview case below issues one last), so no PDF is built.
    targets: [{ kind: "form", path: "/digest/2025/pdf", params: { year: "2025" }, as: "visitor", fields: { edition: "1" }, numeric: ["edition"] }],
    badParams: ["year"],
  },
  "routes/digest.unsubscribe.tsx": {
    load: () => import("~/routes/digest.unsubscribe"),
    targets: [{ kind: "form", path: "/digest/unsubscribe", as: "visitor", fields: { token: "not-a-signed-token-0123456789" }, text: ["token"], messageOnPage: "the page shows “This link does not work” for the invalid state it returns" }],
  },
  "routes/secretary.digest.$year.preview.tsx": {
    load: () => import("~/routes/secretary.digest.$year.preview"),
    targets: [{ kind: "form", path: "/secretary/digest/2025/preview", params: { year: "2025" }, as: "secretary", fields: { confirm: "on", sendEmail: "" } }],
    badParams: ["year"],
  },
  "routes/api.search.ts": {
    load: () => import("~/routes/api.search"),
    targets: [{ kind: "query", path: "/api/search", as: "visitor", query: { q: "battery", system: "electrical", hull: "147", limit: "10", offset: "0" }, numeric: ["limit", "offset"] }],
  },
  "routes/api.search.suggest.ts": {
    load: () => import("~/routes/api.search.suggest"),
    targets: [{ kind: "query", path: "/api/search/suggest", as: "visitor", query: { q: "batt" } }],
  },
  "routes/api.health.ts": { skip: "takes no input" },
  "routes/api.fit.ts": {
    load: () => import("~/routes/api.fit"),
    targets: [{ kind: "query", path: "/api/fit", as: "visitor", required: true, query: { length: "13", width: "6 13/16", height: "9 7/16", unit: "in", upright: "true", clearance: "1/2", count: "1", hull: "147", limit: "10" }, numeric: ["length", "width", "height", "count", "hull", "limit"] }],
  },
  "routes/api.fit.check.ts": {
    load: () => import("~/routes/api.fit.check"),
    targets: [{ kind: "query", path: "/api/fit/check", as: "visitor", required: true, query: { item: "13x6.8x9.4", space: "24x14x11", unit: "in", upright: "true", clearance: "1/2", opening: "16x12", face: "top" }, numeric: [] }],
  },
  "routes/api.spaces.ts": {
    load: () => import("~/routes/api.spaces"),
    targets: [{ kind: "query", path: "/api/spaces", as: "visitor", query: { unit: "in", hull: "147" }, numeric: ["hull"] }],
  },
  "routes/api.space.ts": {
    load: () => import("~/routes/api.space"),
    targets: [{ kind: "query", path: "/api/spaces/lazarette", params: { id: "lazarette" }, as: "visitor", query: { unit: "mm" } }],
    badParams: ["id"],
  },
  "routes/api.heel.ts": {
    load: () => import("~/routes/api.heel"),
    targets: [{ kind: "query", path: "/api/heel", as: "visitor", required: true, query: { displacement: "3300", gm: "2.8", weight: "62", distance: "4.25" }, numeric: ["displacement", "gm", "weight", "distance"] }],
  },
  "routes/api.cable.ts": {
    load: () => import("~/routes/api.cable"),
    targets: [{ kind: "query", path: "/api/cable", as: "visitor", required: true, query: { current: "10", length: "21", voltage: "12", drop: "3", insulation: "105", engineSpace: "false" }, numeric: ["current", "length", "voltage", "drop", "insulation"] }],
  },
};

// --- the routes of app/routes.ts that take input -------------------------------------------------
type RouteEntry = { path?: string; file: string; children?: RouteEntry[] };
const APP = path.resolve(import.meta.dirname, "../../app");
function inputRoutes(list: RouteEntry[]): string[] {
  return list.flatMap((r) => {
    const source = fs.readFileSync(path.join(APP, r.file), "utf8");
    const takesInput = /export (async )?function action|export const action/.test(source) || /^(api|media)\//.test(r.path ?? "");
    return [...(takesInput ? [r.file] : []), ...inputRoutes(r.children ?? [])];
  });
}

// --- what was stored ---------------------------------------------------------------------------
let t: Awaited<ReturnType<typeof appDatabase>>;
// Written on every request by design: attempts counted for rate limits, sessions touched. The
// search vocabulary is derived by triggers from the tables that are compared.
const VOLATILE = new Set(["rate_limits", "sessions", "__drizzle_migrations", "search_vocabulary"]);
let tables: string[] = [];

async function snapshot(): Promise<Record<string, string>> {
  // Rows counted, and a sum of a hash of every row's content (order does not matter).
  const sql = tables.map((name) => `select '${name}' as t, count(*)::text || ':' || coalesce(sum(hashtext(x::text)::bigint), 0)::text as h from "${name}" x`).join(" union all ");
  const r = await t.pool.query(sql);
  return Object.fromEntries(r.rows.map((row: { t: string; h: string }) => [row.t, row.h]));
}

function changed(a: Record<string, string>, b: Record<string, string>): string[] {
  return Object.keys(a).filter((k) => a[k] !== b[k]);
}

// --- requests ----------------------------------------------------------------------------------
const cookies = new Map<Who, string>();
let revisionId = "";
let laterUserId = "";

function headersFor(as: Who, contentType?: string): Record<string, string> {
  const h: Record<string, string> = { Origin: ORIGIN, "x-sistership-client": `198.18.${Math.floor(Math.random() * 250)}.${Math.floor(Math.random() * 250)}` };
  if (contentType) h["Content-Type"] = contentType;
  const cookie = cookies.get(as);
  if (cookie) h.Cookie = cookie;
  return h;
}

function resolve(value: string): string {
  return value.replace("REVISION", revisionId).replace("USER:lena.marchetti@example.com", laterUserId);
}

function urlencoded(fields: Record<string, string | string[]>): string {
  const body = new URLSearchParams();
  for (const [k, v] of Object.entries(fields)) for (const one of [v].flat()) body.append(k, resolve(one));
  return body.toString();
}

function multipart(fields: Record<string, string | string[]>): FormData {
  const body = new FormData();
  for (const [k, v] of Object.entries(fields)) for (const one of [v].flat()) body.append(k, resolve(one));
  return body;
}

function postRequest(target: FormTarget, body: BodyInit, contentType?: string): Request {
  return new Request(`${ORIGIN}${resolve(target.path)}`, { method: "POST", headers: headersFor(target.as, contentType), body });
}

function formBody(target: FormTarget, fields: Record<string, string | string[]>): Request {
  return target.multipart
    ? new Request(`${ORIGIN}${resolve(target.path)}`, { method: "POST", headers: headersFor(target.as), body: multipart(fields) })
    : postRequest(target, urlencoded(fields), "application/x-www-form-urlencoded");
}

type Outcome = { status: number; message: string; fieldKeys: string[]; body: unknown };

function stringsIn(value: unknown, keys = /error|message/i, under = false): string[] {
  if (typeof value === "string") return under ? [value] : [];
  if (Array.isArray(value)) return value.flatMap((v) => stringsIn(v, keys, under));
  if (value && typeof value === "object") return Object.entries(value).flatMap(([k, v]) => stringsIn(v, keys, under || keys.test(k)));
  return [];
}

async function outcome(r: Awaited<ReturnType<typeof settle>>): Promise<Outcome> {
  let body: unknown = r.data;
  if (r.response) {
    const text = await r.response.text().catch(() => "");
    const type = r.response.headers.get("content-type") ?? "";
    body = type.includes("json") ? JSON.parse(text || "null") : text;
  }
  const message = typeof body === "string" ? body : stringsIn(body).join(" | ");
  const conform = (body as { result?: { error?: Record<string, string[] | null> } } | null)?.result?.error ?? {};
  return { status: r.status, message, fieldKeys: Object.keys(conform).filter((k) => conform[k]?.length), body };
}

async function run(mod: Module, kind: "loader" | "action", request: Request, params: Record<string, string>): Promise<Outcome> {
  const fn = mod[kind];
  if (!fn) throw new Error(`the module has no ${kind}`);
  const resolved = Object.fromEntries(Object.entries(params).map(([k, v]) => [k, resolve(v)]));
  try {
    // The root middleware that refuses unreadable addresses runs before every route (app/root.tsx).
    return await outcome(await settle(async () => { checkAddress(request); return fn({ request, params: resolved, context: {} } as never); }));
  } catch (error) {
    // What React Router would answer with a 500.
    const cause = error instanceof Error && error.cause instanceof Error ? ` (${error.cause.message})` : "";
    return { status: 500, message: `${error instanceof Error ? error.message.split("\n")[0] : String(error)}${cause}`, fieldKeys: [], body: null };
  }
}

// --- the values --------------------------------------------------------------------------------
const LONG = "x".repeat(1_000_001);
const SQL = ["' OR '1'='1", "'; drop table users; --"];
const HTML = ["<script>alert(1)</script>", "\"><img src=x onerror=alert(1)>"];
const NOT_NUMBERS = ["abc", "1e309", "12abc", "١٢٣"];
const ODD = ["\u202etxt.exe", "\ud83d", "🚣".repeat(50)];
// Invalid UTF-8 as raw bytes (Unicode Standard, Table 3-7): overlong 0xC0 0xAF, 0xFF, a lone
// continuation byte, a truncated 3-byte sequence.
const BAD_UTF8 = Uint8Array.from([0xc0, 0xaf, 0xff, 0x80, 0xe2, 0x82]);

function rawUtf8Body(fields: Record<string, string | string[]>, name: string): ArrayBuffer {
  const before = new TextEncoder().encode(`${urlencoded({ ...fields, [name]: [] })}&${encodeURIComponent(name)}=ok`);
  const out = new Uint8Array(before.length + BAD_UTF8.length);
  out.set(before);
  out.set(BAD_UTF8, before.length);
  return out.buffer as ArrayBuffer;
}

// --- the test ----------------------------------------------------------------------------------
beforeAll(async () => {
  t = await appDatabase("template_seeded");
  const r = await t.pool.query(`select tablename from pg_tables where schemaname = 'public' order by 1`);
  tables = r.rows.map((row: { tablename: string }) => row.tablename).filter((n: string) => !VOLATILE.has(n));
  const rev = await t.pool.query(
    `select r.id from writeup_revisions r join users u on u.id = r.author_id where r.status = 'awaiting_review' and u.email <> $1 order by r.id limit 1`, [PEOPLE.moderator]);
  revisionId = String(rev.rows[0].id);
  const lena = await t.pool.query(`select id from users where email = 'lena.marchetti@example.com'`);
  laterUserId = String(lena.rows[0].id);
  ({ checkAddress } = await import("~/services/form-body.server"));
  const signIn = await import("~/routes/sign-in");
  const compile = await import("~/routes/secretary.digest");
  const { DEMO_PASSWORD } = await import("../../scripts/seed-content");
  for (const [who, email] of Object.entries(PEOPLE)) {
    const res = await settle(() => signIn.action({ request: formRequest("/sign-in", { email, password: DEMO_PASSWORD, redirectTo: "/" }, { address: `198.19.0.${cookies.size + 1}` }), params: {}, context: {} } as never));
    expect(res.status).toBe(302);
    cookies.set(who as Who, cookieFrom(res.response!));
  }
  const compiled = await settle(() => compile.action({ request: formRequest("/secretary/digest", { year: "2025" }, { cookie: cookies.get("secretary") }), params: {}, context: {} } as never));
  expect(compiled.status).toBe(302);
});
afterAll(async () => {
  await (await import("~/db/index.server")).pool.end();
  await t?.drop();
});

describe("bad input", () => {
  it("has a case for every route of app/routes.ts that takes input", async () => {
    const routes = (await import("~/routes")).default as RouteEntry[];
    const taking = inputRoutes(routes);
    expect(taking.length).toBeGreaterThan(20);
    expect(taking.filter((f) => !(f in CASES))).toEqual([]);
    expect(Object.keys(CASES).filter((f) => !taking.includes(f))).toEqual([]);
  });

  for (const [file, c] of Object.entries(CASES)) {
    if ("skip" in c) {
      it.skip(`${file}: ${c.skip}`, () => {});
      continue;
    }
    it(`${file}: no 500, a message for what is wrong, nothing stored`, async () => {
      const mod = await c.load();
      const problems: string[] = [];
      const quietOk = c.targets.some((x) => x.kind === "form" && x.messageOnPage);
      const expectRefused = async (label: string, request: () => Request, kind: "loader" | "action", params: Record<string, string>, field?: string) => {
        const before = await snapshot();
        const o = await run(mod, kind, request(), params);
        const after = await snapshot();
        if (o.status >= 500) problems.push(`${label}: ${o.status} ${o.message.slice(0, 200)}`);
        else if (o.status < 400) problems.push(`${label}: accepted (${o.status})`);
        else if (o.message.trim().length < 8 && !quietOk) problems.push(`${label}: ${o.status} without a message`);
        else if (field && o.fieldKeys.length && !o.fieldKeys.some((k) => k === field || k.startsWith(`${field}.`) || k.startsWith(`${field}[`))) problems.push(`${label}: the message is not on the field (${o.fieldKeys.join(", ")})`);
        const diff = changed(before, after);
        if (diff.length) problems.push(`${label}: stored a change in ${diff.join(", ")}`);
      };
      const expectNo500 = async (label: string, request: () => Request, kind: "loader" | "action", params: Record<string, string>) => {
        const before = await snapshot();
        const o = await run(mod, kind, request(), params);
        if (o.status >= 500) problems.push(`${label}: ${o.status} ${o.message.slice(0, 200)}`);
        if (o.status >= 400 && o.status < 500) {
          if (o.message.trim().length < 8 && !quietOk) problems.push(`${label}: ${o.status} without a message`);
          const diff = changed(before, await snapshot());
          if (diff.length) problems.push(`${label}: refused but stored a change in ${diff.join(", ")}`);
        }
        return o;
      };

      for (const target of c.targets) {
        const params = target.params ?? {};
        if (target.kind === "query") {
          const url = (q: Record<string, string>) => `${ORIGIN}${target.path}?${new URLSearchParams(q)}`;
          const get = (q: Record<string, string>) => () => new Request(url(q), { headers: headersFor(target.as) });
          const ok = await run(mod, "loader", get(target.query)(), params);
          if (target.path.startsWith("/api/") && ok.status !== 200) problems.push(`the valid query answered ${ok.status}`);
          for (const name of Object.keys(target.query)) {
            for (const v of [LONG, ...SQL, ...HTML, ...ODD]) await expectNo500(`${name}=${JSON.stringify(v.slice(0, 30))}`, get({ ...target.query, [name]: v }), "loader", params);
            for (const v of target.numeric?.includes(name) ? NOT_NUMBERS : []) await expectRefused(`${name}=${v}`, get({ ...target.query, [name]: v }), "loader", params);
            await expectRefused(`${name}: a NUL character`, get({ ...target.query, [name]: "a\u0000b" }), "loader", params);
            await expectNo500(`${name} twice`, () => new Request(`${url(target.query)}&${name}=2&${name}=zz`, { headers: headersFor(target.as) }), "loader", params);
          }
          await expectNo500("raw invalid UTF-8 percent-encoded in the query", () => new Request(`${url(target.query)}&q=%C0%AF%FF%80`, { headers: headersFor(target.as) }), "loader", params);
          if (target.required) await expectRefused("no parameters", get({}), "loader", params);
          continue;
        }

        // Whole requests that cannot be a submission of this form. Everything that must be refused
        // goes first: a hostile value that is valid text may be stored and change what follows.
        const bulkField = target.text?.[0] ?? Object.keys(target.fields)[0];
        if (!target.emptyOk) await expectRefused("empty body", () => formBody(target, {}), "action", params);
        await expectRefused("JSON instead of a form", () => postRequest(target, JSON.stringify(target.fields), "application/json"), "action", params);
        await expectRefused("text/plain", () => postRequest(target, "title=hello", "text/plain"), "action", params);
        await expectRefused("no content type", () => new Request(`${ORIGIN}${resolve(target.path)}`, { method: "POST", headers: headersFor(target.as), body: new Blob([urlencoded(target.fields)]) }), "action", params);
        await expectRefused("multipart without a boundary", () => postRequest(target, "--x\r\nContent-Disposition: form-data; name=\"a\"\r\n\r\nb\r\n--x--\r\n", "multipart/form-data"), "action", params);
        await expectRefused("broken multipart", () => postRequest(target, "--zz\r\nContent-Disposition: form-data; name=\"title\"\r\n\r\nunterminated", "multipart/form-data; boundary=zz"), "action", params);
        await expectRefused("a 12 MB body", () => formBody(target, { ...target.fields, [bulkField]: "y".repeat(12_000_000) }), "action", params);
        for (const name of Object.keys(target.fields)) {
          const on = target.hidden?.includes(name) ? undefined : name;
          if (target.text?.includes(name)) {
            await expectRefused(`${name}: a million characters`, () => formBody(target, { ...target.fields, [name]: LONG }), "action", params, on);
          }
          for (const v of target.numeric?.includes(name) ? NOT_NUMBERS : []) {
            await expectRefused(`${name}=${v}`, () => formBody(target, { ...target.fields, [name]: v }), "action", params, on);
          }
          await expectRefused(`${name}: a NUL character`, () => formBody(target, { ...target.fields, [name]: "a\u0000b" }), "action", params);
        }
        // Hostile values that may be valid text: never a 500.
        for (const name of Object.keys(target.fields)) {
          for (const v of [...SQL, ...HTML, ...ODD, ""]) {
            await expectNo500(`${name}=${JSON.stringify(v.slice(0, 30))}`, () => formBody(target, { ...target.fields, [name]: v }), "action", params);
          }
          await expectNo500(`${name} twice`, () => formBody(target, { ...target.fields, [name]: [String([target.fields[name]].flat()[0] ?? ""), "zz"] }), "action", params);
          if (!target.multipart) {
            await expectNo500(`${name}: raw invalid UTF-8`, () => postRequest(target, rawUtf8Body(target.fields, name), "application/x-www-form-urlencoded"), "action", params);
          }
        }
        if (target.baseline) {
          await t.pool.query("delete from rate_limits"); // the attempts above were counted, rightly
          const o = await run(mod, "action", formBody(target, { ...target.fields, ...target.baselineFields }), params);
          if (o.status >= 400) problems.push(`the valid submission was refused (${o.status}: ${o.message.slice(0, 200)}); fix the case`);
        }
      }
      for (const name of "badParams" in c ? c.badParams ?? [] : []) {
        const target = c.targets[0];
        for (const v of BAD_PARAMS) {
          const params = { ...target.params, [name]: v };
          const address = resolve(target.path).replace(resolve(target.params?.[name] ?? ""), encodeURIComponent(v));
          const request = () => target.kind === "form"
            ? new Request(`${ORIGIN}${address}`, { method: "POST", headers: headersFor(target.as, target.multipart ? undefined : "application/x-www-form-urlencoded"), body: target.multipart ? multipart(target.fields) : urlencoded(target.fields) })
            : new Request(`${ORIGIN}${address}`, { headers: headersFor(target.as) });
          const o = await expectNo500(`:${name}=${JSON.stringify(v)}`, request, target.kind === "form" ? "action" : "loader", params);
          if (o.status < 400 && target.kind === "form") problems.push(`:${name}=${JSON.stringify(v)}: accepted (${o.status})`);
        }
      }
      expect(problems).toEqual([]);
    }, 120_000);
  }
});
