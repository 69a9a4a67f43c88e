// `npm run bench:load`: the production build (scripts/serve.mjs, one process) on loopback, with the
// demo content in a PostgreSQL cluster of its own, under a mixed load from autocannon:
//   pages     GET home, write-up, system, spaces and space pages
//   search    GET /api/search?q=... (words and numbers)
//   fit       GET /api/fit?length=&width=&height=&unit=in (random items)
//   comments  POST /api/writeups/:slug/comments as signed-in members (round robin over the load
//             members, each within the per-account comment limit)
//   drafts    POST /my/writeups/:id.data (the editor's save, as the hydrated page sends it), each
//             connection saving the draft of a member of its own
// For each kind: requests per second, p50/p99 latency, errors (socket errors and timeouts) and
// non-2xx answers. Every write carries an identifying value; at the end, the writes the server
// acknowledged (2xx/3xx) are looked up in the database: none may be missing.
//
// Runs (--fault=all, the default, runs the three in turn; or --fault=none|db|smtp):
//   none  the plain load for --seconds (60).
//   db    the load for --fault-seconds (40); PostgreSQL stopped (pg_ctl stop -m fast) at
//         --down-at (15 s) for --down-for (10 s), then started: 503s counted, the page and the API
//         checked while it is down, the same server process alive and serving afterwards, 0 lost.
//   smtp  the SMTP stand-in stopped while --signups (12) people sign up (each from a loopback
//         address of its own, so the per-address limit is not what is measured) under the load:
//         every sign-up succeeds; once the stand-in is back, every queued message is delivered.
//
//   npm run bench:load -- [--fault=all] [--seconds=60] [--connections=200] [--users=400]
//
// Sessions of the load members are made up front by the app's own signIn() (a session row and the
// signed cookie, exactly what signing in makes), so that argon2 sign-ins are not part of the mix.
import http from "node:http";
import autocannon from "autocannon";
import pg from "pg";
import { argNumber, figure, random } from "./lib/bench-kit";
import { type BenchApp, countMail, ensureBenchBuild, startBenchApp } from "./lib/bench-app";

const SECONDS = argNumber("seconds", 60);
const FAULT_SECONDS = argNumber("fault-seconds", 40);
const DOWN_AT = argNumber("down-at", 15);
const DOWN_FOR = argNumber("down-for", 10);
const CONNECTIONS = argNumber("connections", 200);
const USERS = argNumber("users", 400);
const SIGNUPS = argNumber("signups", 12);
const faultArg = process.argv.find((a) => a.startsWith("--fault="))?.slice("--fault=".length) ?? "all";
const RUNS = faultArg === "all" ? ["none", "db", "smtp"] : faultArg.split(",");
for (const r of RUNS) if (!["none", "db", "smtp"].includes(r)) throw new Error(`--fault=${faultArg}: use none, db, smtp or all`);

// Share of the connections per kind (the rest goes to pages).
const MIX = { search: 0.2, fit: 0.15, comments: 0.1, drafts: 0.1 } as const;
type Kind = "pages" | "search" | "fit" | "comments" | "drafts";
const KINDS: Kind[] = ["pages", "search", "fit", "comments", "drafts"];

const SEARCH_TERMS = [
  "battery", "bilge pump", "chainplate", "epoxy", "rudder", "mast step", "stanchion", "shore power", "12v",
  "group 27", "through-hull", "keel bolt", "outboard bracket", "cockpit drain", "deck leak", "wiring", "lazarette",
  "anchor locker", "tiller", "winch", "solar panel", "head", "galley", "cushion", "gelcoat", "varnish",
];

type Member = { id: number; cookie: string; draftId: number; seq: number; acked: number };

const out = (line: string) => console.log(line);

// ---------------------------------------------------------------------------------------------

async function prepare(app: BenchApp) {
  // The app's own modules read their settings once, at import: point them at the bench's database.
  process.env.DATABASE_URL = app.databaseUrl;
  process.env.SESSION_SECRET = app.sessionSecret;
  process.env.APP_URL = app.baseUrl;
  process.env.NODE_ENV = "production";
  const { db, pool } = await import("../app/db/index.server");
  const { signIn } = await import("../app/services/session.server");
  const { createMember, markEmailVerified } = await import("../app/models/users.server");
  const { hashPassword } = await import("../app/services/password.server");
  const { listSystemAndZoneChoices, saveDraft } = await import("../app/models/writeup-editing.server");
  const { writeupFormSchema } = await import("../app/domain/writeup-form");

  const choices = await listSystemAndZoneChoices(db);
  const systems = choices.systems.map((x) => x.slug);
  const schema = writeupFormSchema({ systems, zones: choices.zones.map((x) => x.slug), weightUnit: "lb" });
  const passwordHash = await hashPassword("load-member-password-not-used");
  const members: Member[] = [];
  const started = Date.now();
  for (let i = 0; i < USERS; i++) {
    const id = await createMember(db, { email: `load.member.${i}@load.example`, displayName: `Load member ${i}`, passwordHash });
    if (id === null) throw new Error("a load member already exists: the database is not fresh");
    await markEmailVerified(db, id);
    const response = await signIn(new Request(`${app.baseUrl}/sign-in`, { headers: { "user-agent": "bench-load" } }), id, "/");
    const cookie = (response.headers.get("set-cookie") ?? "").split(";")[0];
    if (!cookie.includes("=")) throw new Error("signIn() set no session cookie");
    const value = schema.parse(draftFields(i, 0, systems[i % systems.length]));
    const saved = await saveDraft(db, { authorId: id, writeupId: null, value, weightUnit: "lb", boatId: null });
    members.push({ id, cookie, draftId: saved.writeupId, seq: 0, acked: 0 });
  }
  await pool.end();
  out(`[bench] ${USERS} load members with a session and a draft each, in ${((Date.now() - started) / 1000).toFixed(1)} s`);

  const client = new pg.Client({ connectionString: app.databaseUrl });
  await client.connect();
  const writeups = (await client.query<{ slug: string }>("select slug from writeups where status = 'published' order by id")).rows.map((r) => r.slug);
  const systemPages = (await client.query<{ slug: string }>("select slug from systems order by sort_order")).rows.map((r) => r.slug);
  const spaces = (await client.query<{ slug: string }>("select slug from spaces order by id")).rows.map((r) => r.slug);
  await client.end();
  if (!writeups.length || !spaces.length) throw new Error("the demo content is missing");
  const pages = [
    "/",
    ...writeups.map((s) => `/writeups/${s}`),
    ...systemPages.slice(0, 6).map((s) => `/systems/${s}`),
    "/spaces",
    ...spaces.slice(0, 8).map((s) => `/spaces/${s}`),
  ];
  return { members, writeups, pages, systems };
}

function draftFields(member: number, seq: number, system: string) {
  return {
    intent: "save",
    title: `Cockpit locker drain, load member ${member}`,
    summary: "Rerouted the locker drain hose so that it no longer kinks behind the battery box.",
    body: `Saved by the load benchmark. [ld-${member}-${seq}]\n\nThe hose ran under the box and kinked when the lid closed.`,
    systems: [system],
    appliesTo: "all",
  };
}

function form(fields: Record<string, string | string[]>): string {
  const body = new URLSearchParams();
  for (const [k, v] of Object.entries(fields)) for (const one of [v].flat()) body.append(k, one);
  return body.toString();
}

// ---------------------------------------------------------------------------------------------

type Ledger = {
  run: string;
  /** 503 answers seen by the load, and how many of them said what they should (text, Retry-After). */
  outage: { pages: number; pagesRight: number; api: number; apiRight: number };
  sentComments: number;
  ackedComments: Set<string>;
  draftUsers: Set<Member>;
};

/** What autocannon keeps per connection between a request and its answer. */
type Ctx = { marker?: string; member?: Member; seq?: number };

type KindResult = { kind: Kind; connections: number; result: autocannon.Result };

function startLoad(app: BenchApp, ctx: Awaited<ReturnType<typeof prepare>>, ledger: Ledger, seconds: number): Promise<KindResult[]> {
  const rnd = random(20261201 + ledger.run.length);
  const pick = <T>(list: readonly T[]) => list[Math.floor(rnd() * list.length)];
  const counts: Record<Kind, number> = {
    search: Math.round(CONNECTIONS * MIX.search),
    fit: Math.round(CONNECTIONS * MIX.fit),
    comments: Math.round(CONNECTIONS * MIX.comments),
    drafts: Math.round(CONNECTIONS * MIX.drafts),
    pages: 0,
  };
  counts.pages = CONNECTIONS - counts.search - counts.fit - counts.comments - counts.drafts;
  const origin = app.baseUrl;
  let commentNo = 0;
  let nextCommenter = 0;
  // A draft is saved by one request at a time: a saver takes a member from this queue and gives it
  // back with the answer (a request that never gets one keeps its member out for good), so that
  // the order of a draft's saves is the order of their acknowledgements.
  const freeDrafters = ctx.members.slice();

  // Every 503 the load meets is checked: the page says what happened, the API answers { error },
  // both with Retry-After.
  const checkPage = (status: number, body: string, _c: object, headers?: Record<string, unknown>) => {
    if (status !== 503) return;
    ledger.outage.pages++;
    if (body.includes("The database is not answering") && headers?.["retry-after"]) ledger.outage.pagesRight++;
  };
  const checkApi = (status: number, body: string, _c: object, headers?: Record<string, unknown>) => {
    if (status !== 503) return;
    ledger.outage.api++;
    try {
      if (typeof JSON.parse(body).error === "string" && headers?.["retry-after"]) ledger.outage.apiRight++;
    } catch { /* not JSON */ }
  };
  const requests: Record<Kind, autocannon.Request[]> = {
    pages: ctx.pages.map((path) => ({ method: "GET", path, onResponse: checkPage })),
    search: [{ method: "GET", setupRequest: (req) => ({ ...req, path: `/api/search?q=${encodeURIComponent(pick(SEARCH_TERMS))}` }), onResponse: checkApi }],
    fit: [{
      method: "GET",
      setupRequest: (req) => {
        const l = (4 + rnd() * 20).toFixed(1), w = (3 + rnd() * 12).toFixed(1), h = (2 + rnd() * 12).toFixed(1);
        return { ...req, path: `/api/fit?length=${l}&width=${w}&height=${h}&unit=in` };
      },
    }],
    comments: [{
      method: "POST",
      setupRequest: (req, c) => {
        const context = c as Ctx;
        const member = ctx.members[nextCommenter++ % ctx.members.length];
        const marker = `lc-${ledger.run}-${++commentNo}`;
        context.marker = marker;
        ledger.sentComments++;
        return {
          ...req,
          path: `/api/writeups/${encodeURIComponent(pick(ctx.writeups))}/comments`,
          headers: { "content-type": "application/x-www-form-urlencoded", accept: "application/json", cookie: member.cookie, origin },
          body: form({ intent: "post", body: `Did the same on my boat last spring; it held through a wet autumn. [${marker}]` }),
        };
      },
      onResponse: (status, _body, c) => {
        const context = c as Ctx;
        if (status >= 200 && status < 400 && typeof context.marker === "string") ledger.ackedComments.add(context.marker);
      },
    }],
    drafts: [{
      method: "POST",
      setupRequest: (req, c) => {
        const context = c as Ctx;
        const member = freeDrafters.shift();
        if (!member) throw new Error("more draft savers than load members: raise --users");
        context.member = member;
        ledger.draftUsers.add(member);
        context.seq = ++member.seq;
        const i = ctx.members.indexOf(member);
        return {
          ...req,
          path: `/my/writeups/${member.draftId}.data`,
          headers: { "content-type": "application/x-www-form-urlencoded", cookie: member.cookie, origin },
          body: form(draftFields(i, member.seq, ctx.systems[i % ctx.systems.length])),
        };
      },
      onResponse: (status, body, c) => {
        const context = c as Ctx;
        const member = context.member!;
        // The editor's action answers { saved: true, savedAt } once the draft is committed.
        if (status >= 200 && status < 400 && body.includes("savedAt")) member.acked = Math.max(member.acked, context.seq ?? 0);
        freeDrafters.push(member);
      },
    }],
  };

  return Promise.all(KINDS.filter((k) => counts[k] > 0).map((kind) => new Promise<KindResult>((resolve, reject) => {
    autocannon(
      { url: app.baseUrl, connections: counts[kind], duration: seconds, timeout: 20, requests: requests[kind] },
      (error, result) => (error ? reject(error) : resolve({ kind, connections: counts[kind], result })),
    );
  })));
}

function statusCount(result: autocannon.Result, predicate: (code: number) => boolean): number {
  const stats = (result as unknown as { statusCodeStats?: Record<string, { count: number }> }).statusCodeStats ?? {};
  return Object.entries(stats).filter(([code]) => predicate(Number(code))).reduce((n, [, v]) => n + v.count, 0);
}

function report(run: string, results: KindResult[], targets: { errors: boolean }) {
  out(`\n  ${"kind".padEnd(9)} ${"conns".padStart(5)} ${"req/s".padStart(8)} ${"p50 ms".padStart(7)} ${"p99 ms".padStart(7)} ${"errors".padStart(6)} ${"non-2xx".padStart(7)} ${"503".padStart(6)} ${"429".padStart(5)}  answers by status`);
  let total = 0;
  for (const { kind, connections, result: r } of results) {
    total += r.requests.average;
    const s503 = statusCount(r, (c) => c === 503);
    const s429 = statusCount(r, (c) => c === 429);
    const codes = Object.entries((r as unknown as { statusCodeStats?: Record<string, { count: number }> }).statusCodeStats ?? {}).map(([c, v]) => `${c}:${v.count}`).join(" ");
    out(`  ${kind.padEnd(9)} ${String(connections).padStart(5)} ${r.requests.average.toFixed(1).padStart(8)} ${String(r.latency.p50).padStart(7)} ${String(r.latency.p99).padStart(7)} ${String(r.errors + r.timeouts).padStart(6)} ${String(r.non2xx).padStart(7)} ${String(s503).padStart(6)} ${String(s429).padStart(5)}  ${codes}`);
  }
  out("");
  figure(`load ${run}: all kinds, requests per second`, total, "req/s");
  for (const { kind, result: r } of results) {
    figure(`load ${run}: ${kind}, requests per second`, r.requests.average, "req/s");
    figure(`load ${run}: ${kind}, p50 latency`, r.latency.p50, "ms");
    figure(`load ${run}: ${kind}, p99 latency`, r.latency.p99, "ms");
    figure(`load ${run}: ${kind}, errors and timeouts`, r.errors + r.timeouts, "count", targets.errors ? { op: "<=", value: 0 } : undefined);
    figure(`load ${run}: ${kind}, non-2xx answers`, r.non2xx, "count");
    const s5xx = statusCount(r, (c) => c >= 500 && c !== 503);
    figure(`load ${run}: ${kind}, 5xx answers other than 503`, s5xx, "count", { op: "<=", value: 0 });
    if (run === "db") figure(`load ${run}: ${kind}, 503 answers`, statusCount(r, (c) => c === 503), "count");
  }
}

/** Acknowledged writes against the database's rows; returns how many acknowledged writes are missing. */
async function verify(app: BenchApp, ledger: Ledger): Promise<number> {
  const client = new pg.Client({ connectionString: app.databaseUrl });
  await client.connect();
  try {
    const rows = await client.query<{ body: string }>("select body from comments where body like $1", [`%[lc-${ledger.run}-%`]);
    const stored = new Set(rows.rows.map((r) => /\[(lc-[^\]]+)\]/.exec(r.body)?.[1]).filter(Boolean) as string[]);
    const lostComments = [...ledger.ackedComments].filter((m) => !stored.has(m));
    const unacked = [...stored].filter((m) => !ledger.ackedComments.has(m)).length;
    figure(`load ${ledger.run}: comments acknowledged`, ledger.ackedComments.size, "count");
    figure(`load ${ledger.run}: comments stored (rows)`, stored.size, "count");
    out(`  comments: ${ledger.sentComments} sent, ${ledger.ackedComments.size} acknowledged, ${stored.size} rows, ${unacked} stored without an acknowledgement (answer lost or refused after commit)`);

    const members = [...ledger.draftUsers];
    const drafts = await client.query<{ writeup_id: number; body_markdown: string }>(
      "select distinct on (writeup_id) writeup_id, body_markdown from writeup_revisions where writeup_id = any($1::int[]) order by writeup_id, id desc",
      [members.map((m) => m.draftId)],
    );
    const seqOf = new Map(drafts.rows.map((r) => [r.writeup_id, Number(/\[ld-\d+-(\d+)\]/.exec(r.body_markdown)?.[1] ?? -1)]));
    const lostDrafts = members.filter((m) => (seqOf.get(m.draftId) ?? -1) < m.acked);
    const ackedSaves = members.reduce((n, m) => n + (m.acked > 0 ? 1 : 0), 0);
    out(`  drafts: ${members.length} drafts written to under load; ${ackedSaves} with an acknowledged save; ${lostDrafts.length} whose stored text is older than the last acknowledged save`);
    figure(`load ${ledger.run}: drafts whose last acknowledged save is stored`, members.length - lostDrafts.length, "count");
    const lost = lostComments.length + lostDrafts.length;
    if (lostComments.length) out(`  MISSING comments: ${lostComments.slice(0, 10).join(", ")}${lostComments.length > 10 ? " ..." : ""}`);
    if (lostDrafts.length) out(`  MISSING draft saves: ${lostDrafts.slice(0, 10).map((m) => `${m.draftId} (acked ${m.acked}, stored ${seqOf.get(m.draftId)})`).join(", ")}`);
    figure(`load ${ledger.run}: acknowledged writes lost`, lost, "count", { op: "<=", value: 0 });
    return lost;
  } finally {
    await client.end();
  }
}

async function status(url: string, init?: RequestInit, timeoutMs = 15_000): Promise<{ status: number; text: string; retryAfter: string | null }> {
  try {
    const r = await fetch(url, { ...init, signal: AbortSignal.timeout(timeoutMs) });
    return { status: r.status, text: await r.text(), retryAfter: r.headers.get("retry-after") };
  } catch (error) {
    return { status: 0, text: String(error), retryAfter: null };
  }
}

/**
 * After a run: the same process answers a page and takes a comment. Requests still queued from the
 * load are served first, so it is given up to 60 s.
 */
async function servesAgain(app: BenchApp, ctx: Awaited<ReturnType<typeof prepare>>, run: string) {
  const pid = app.server.pid;
  const started = Date.now();
  let page = { status: 0 };
  let comment = { status: 0 };
  while (Date.now() - started < 60_000) {
    page = await status(`${app.baseUrl}/writeups/${ctx.writeups[0]}`);
    if (page.status === 200) {
      comment = await status(`${app.baseUrl}/api/writeups/${ctx.writeups[0]}/comments`, {
        method: "POST",
        headers: { "content-type": "application/x-www-form-urlencoded", accept: "application/json", cookie: ctx.members[ctx.members.length - 1].cookie, origin: app.baseUrl },
        body: form({ intent: "post", body: `Checking the app answers after the ${run} run.` }),
      });
      if (comment.status === 201) break;
    }
    await new Promise((r) => setTimeout(r, 1000));
  }
  const ok = page.status === 200 && comment.status === 201 && app.server.pid === pid && app.serverAlive();
  out(`  afterwards: page ${page.status}, comment ${comment.status}, ${((Date.now() - started) / 1000).toFixed(1)} s after the load stopped`);
  figure(`load ${run}: server process alive afterwards (1 = yes)`, app.serverAlive() ? 1 : 0, "bool", { op: ">=", value: 1 });
  figure(`load ${run}: page and comment answered afterwards without a restart (1 = yes)`, ok ? 1 : 0, "bool", { op: ">=", value: 1 });
}

// ---------------------------------------------------------------------------------------------

async function runPlain(app: BenchApp, ctx: Awaited<ReturnType<typeof prepare>>) {
  out(`\n=== load, no fault: ${CONNECTIONS} connections for ${SECONDS} s ===`);
  const ledger: Ledger = { run: "none", outage: { pages: 0, pagesRight: 0, api: 0, apiRight: 0 }, sentComments: 0, ackedComments: new Set(), draftUsers: new Set() };
  const results = await startLoad(app, ctx, ledger, SECONDS);
  report("none", results, { errors: true });
  await verify(app, ledger);
  await servesAgain(app, ctx, "none");
}

async function runDatabaseFault(app: BenchApp, ctx: Awaited<ReturnType<typeof prepare>>) {
  out(`\n=== load with PostgreSQL stopped at ${DOWN_AT} s for ${DOWN_FOR} s: ${CONNECTIONS} connections for ${FAULT_SECONDS} s ===`);
  const ledger: Ledger = { run: "db", outage: { pages: 0, pagesRight: 0, api: 0, apiRight: 0 }, sentComments: 0, ackedComments: new Set(), draftUsers: new Set() };
  const pid = app.server.pid;
  const load = startLoad(app, ctx, ledger, FAULT_SECONDS);
  const fault = (async () => {
    await new Promise((r) => setTimeout(r, DOWN_AT * 1000));
    const stopped = Date.now();
    await app.stopDatabase();
    out(`  [fault] PostgreSQL stopped (pg_ctl stop -m fast took ${Date.now() - stopped} ms)`);
    // What a reader and an API client see while it is down: asked 1 s into the outage, side by
    // side with the load, and given until the database starts again (the outage is not stretched
    // to wait for them).
    await new Promise((r) => setTimeout(r, 1000));
    const until = Math.max(1000, DOWN_FOR * 1000 - (Date.now() - stopped) - 200);
    const [page, api, posted] = await Promise.all([
      status(`${app.baseUrl}/writeups/${ctx.writeups[0]}`, undefined, until),
      status(`${app.baseUrl}/api/search?q=battery`, undefined, until),
      status(`${app.baseUrl}/api/writeups/${ctx.writeups[0]}/comments`, {
        method: "POST",
        headers: { "content-type": "application/x-www-form-urlencoded", accept: "application/json", cookie: ctx.members[0].cookie, origin: app.baseUrl },
        body: form({ intent: "post", body: "Posted while the database is down." }),
      }, until),
    ]);
    const pageOk = page.status === 503 && page.text.includes("The database is not answering") && page.retryAfter !== null;
    let apiOk = false;
    try {
      apiOk = api.status === 503 && typeof JSON.parse(api.text).error === "string" && api.retryAfter !== null;
    } catch { /* not JSON */ }
    const postOk = posted.status === 503;
    out(`  [fault] while down (status 0: no answer before the database came back): page ${page.status} (Retry-After ${page.retryAfter}), /api/search ${api.status}: ${api.text.slice(0, 120)}, comment POST ${posted.status}`);
    out(`  [fault] single checks while down: page ${pageOk ? "right" : "not checked or wrong"}, API ${apiOk ? "right" : "not checked or wrong"}, comment ${postOk ? "503" : "not checked"} (the load's own 503 answers are checked below)`);
    const wait = DOWN_FOR * 1000 - (Date.now() - stopped);
    if (wait > 0) await new Promise((r) => setTimeout(r, wait));
    await app.startDatabase();
    const restarted = Date.now();
    out(`  [fault] PostgreSQL started again after ${((restarted - stopped) / 1000).toFixed(1)} s`);
    let healthy = -1;
    while (Date.now() - restarted < 30_000) {
      if ((await status(`${app.baseUrl}/api/health`)).status === 200) {
        healthy = Date.now() - restarted;
        break;
      }
      await new Promise((r) => setTimeout(r, 100));
    }
    out(`  [fault] /api/health answered 200 ${healthy} ms after the start`);
    figure("load db: time from PostgreSQL's start to a healthy answer", healthy / 1000, "s", { op: "<=", value: 5 });
  })();
  const [results] = await Promise.all([load, fault]);
  report("db", results, { errors: false });
  const o = ledger.outage;
  out(`  503 answers met by the load: ${o.pages} pages (${o.pagesRight} with the outage text and Retry-After), ${o.api} search API answers (${o.apiRight} JSON { error } with Retry-After)`);
  figure("load db: 503 pages met by the load", o.pages, "count", { op: ">=", value: 1 });
  figure("load db: of those, the outage page with Retry-After", o.pagesRight, "count", { op: ">=", value: Math.max(1, o.pages) });
  figure("load db: 503 search API answers met by the load", o.api, "count", { op: ">=", value: 1 });
  figure("load db: of those, JSON { error } with Retry-After", o.apiRight, "count", { op: ">=", value: Math.max(1, o.api) });
  figure("load db: same server process before and after (1 = yes)", app.server.pid === pid && app.serverAlive() ? 1 : 0, "bool", { op: ">=", value: 1 });
  await verify(app, ledger);
  await servesAgain(app, ctx, "db");
}

/** POST /sign-up from a loopback address of its own (127.0.0.x): the server sees a distinct client. */
function signUp(app: BenchApp, i: number): Promise<number> {
  const url = new URL(`${app.baseUrl}/sign-up`);
  const body = form({ email: `smtp.fault.${i}@load.example`, displayName: `Sign-up ${i}`, password: "a long enough passphrase 42", website: "" });
  return new Promise((resolve) => {
    const req = http.request({
      host: url.hostname, port: url.port, path: url.pathname, method: "POST", localAddress: `127.0.0.${10 + i}`,
      headers: { "content-type": "application/x-www-form-urlencoded", "content-length": Buffer.byteLength(body), origin: app.baseUrl, accept: "text/html" },
    }, (res) => {
      res.resume();
      res.on("end", () => resolve(res.statusCode ?? 0));
    });
    req.on("error", () => resolve(0));
    req.end(body);
  });
}

async function runMailFault(app: BenchApp, ctx: Awaited<ReturnType<typeof prepare>>) {
  const seconds = Math.min(FAULT_SECONDS, 30);
  out(`\n=== load with the SMTP stand-in stopped: ${CONNECTIONS} connections for ${seconds} s, ${SIGNUPS} sign-ups while it is down ===`);
  const ledger: Ledger = { run: "smtp", outage: { pages: 0, pagesRight: 0, api: 0, apiRight: 0 }, sentComments: 0, ackedComments: new Set(), draftUsers: new Set() };
  const before = countMail(app.mailDir);
  const load = startLoad(app, ctx, ledger, seconds);
  const fault = (async () => {
    await new Promise((r) => setTimeout(r, 3000));
    await app.stopMail();
    out("  [fault] SMTP stand-in stopped");
    const statuses = await Promise.all(Array.from({ length: SIGNUPS }, (_, i) => signUp(app, i)));
    const accepted = statuses.filter((s) => s >= 200 && s < 400).length;
    out(`  [fault] sign-ups while the SMTP server is down: ${statuses.join(" ")}`);
    figure("load smtp: sign-ups accepted while SMTP is down", accepted, "count", { op: ">=", value: SIGNUPS });
    await new Promise((r) => setTimeout(r, 8000));
    const client = new pg.Client({ connectionString: app.databaseUrl });
    await client.connect();
    const waiting = await client.query<{ n: number; tried: number }>(
      "select count(*)::int as n, count(*) filter (where attempts > 0)::int as tried from outbox where to_address like 'smtp.fault.%' and sent_at is null",
    );
    out(`  [fault] after 8 s: ${waiting.rows[0].n} messages waiting in the outbox, ${waiting.rows[0].tried} of them tried and failed`);
    await app.startMail();
    const restarted = Date.now();
    out("  [fault] SMTP stand-in started again");
    let delivered = -1;
    let rows = { queued: 0, sent: 0 };
    // The sender retries after 5 s, then twice as long each time (app/models/outbox.server.ts).
    while (Date.now() - restarted < 120_000) {
      const r = await client.query<{ queued: number; sent: number }>(
        "select count(*)::int as queued, count(*) filter (where sent_at is not null)::int as sent from outbox where to_address like 'smtp.fault.%'",
      );
      rows = r.rows[0];
      if (rows.queued > 0 && rows.sent === rows.queued) {
        delivered = Date.now() - restarted;
        break;
      }
      await new Promise((r) => setTimeout(r, 500));
    }
    await client.end();
    const files = countMail(app.mailDir) - before;
    out(`  [fault] outbox: ${rows.sent} of ${rows.queued} sent, ${delivered >= 0 ? `${(delivered / 1000).toFixed(1)} s after the stand-in came back` : "not all within 120 s"}; ${files} messages in the stand-in's folder`);
    figure("load smtp: messages queued while SMTP was down", rows.queued, "count", { op: ">=", value: SIGNUPS });
    figure("load smtp: of those, delivered once SMTP is back", rows.sent, "count", { op: ">=", value: rows.queued });
    figure("load smtp: messages received by the stand-in", files, "count", { op: ">=", value: rows.queued });
    if (delivered >= 0) figure("load smtp: time from SMTP's return to the last delivery", delivered / 1000, "s");
  })();
  const [results] = await Promise.all([load, fault]);
  report("smtp", results, { errors: true });
  await verify(app, ledger);
  await servesAgain(app, ctx, "smtp");
}

// ---------------------------------------------------------------------------------------------

const buildDir = ensureBenchBuild();
const app = await startBenchApp({ buildDir, quiet: true });
let failed = false;
try {
  const ctx = await prepare(app);
  for (const run of RUNS) {
    if (run === "none") await runPlain(app, ctx);
    if (run === "db") await runDatabaseFault(app, ctx);
    if (run === "smtp") await runMailFault(app, ctx);
  }
  const errors = app.serverLog.split("\n").filter((l) => /error/i.test(l) && !/\[db\]|\[outbox\]/.test(l));
  out(`\n[bench] server log: ${app.serverLog.split("\n").length} lines, ${errors.length} naming an error other than the database or mail warnings`);
  for (const l of errors.slice(0, 10)) out(`  ${l}`);
} catch (error) {
  failed = true;
  console.error(error);
  out(`[bench] last lines of the server's output:\n${app.serverLog.split("\n").slice(-30).join("\n")}`);
} finally {
  await app.stop();
}
process.exit(failed ? 1 : 0);
