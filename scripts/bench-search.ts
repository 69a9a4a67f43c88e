// Benchmark of the search: 100,000 generated write-ups and 20,000 spaces in a database of their
// own, then, in one run and with a rotating set of at least 200 queries:
//   - the search: GET /api/search, server-side (the route's handler, from the request to the JSON);
//   - the baseline: the same words as ILIKE over the same rows (the same answer: a count and the
//     first 20), timed the same way;
//   - the floor: the health route (one round trip to the database), timed the same way;
// and, when the production build is there (`npm run build`), the same search and health routes
// over HTTP on loopback. Prints p50/p95/p99 and the ratios. Targets: search p95 at most 30 ms, at
// least 20 times faster than the baseline, at most 3 times the floor.
//
//   npx tsx scripts/bench-search.ts [--writeups=100000] [--spaces=20000] [--queries=1000] [--no-http] [--no-baseline] [--slowest] [--list-queries]
//
// With DATABASE_URL set, the database is made on that server (the role needs CREATEDB);
// otherwise a PostgreSQL cluster of its own is started in a temporary folder. On a server of
// DATABASE_URL, `--keep` only generates the content and keeps its database (to read query plans
// with EXPLAIN), and `--database=<name>` measures on such a database instead of generating one.
import { randomBytes } from "node:crypto";
import fs from "node:fs";
import path from "node:path";
import { spawn } from "node:child_process";
import { sql } from "drizzle-orm";
import { migrate } from "drizzle-orm/node-postgres/migrator";
import pg from "pg";
import YAML from "yaml";
import { createDb } from "../app/db/client.server";
import { renderMarkdown } from "../app/domain/markdown";
import { queryWords } from "../app/domain/search";
import { splitFrontMatter } from "./seed-content";
import { argNumber, benchDatabase, figure, percentile, random, type Target } from "./lib/bench-kit";
import { freePort } from "./lib/setup.mjs";

const WRITEUPS = argNumber("writeups", 100_000);
const SPACES = argNumber("spaces", 20_000);
const QUERIES = argNumber("queries", 1000);
const WARM_UP = 100;
const HTTP = !process.argv.includes("--no-http");
const BASELINE = !process.argv.includes("--no-baseline");
/** On the server of DATABASE_URL: generate, keep the database and stop; or measure on a kept one. */
const KEEP = process.argv.includes("--keep") && Boolean(process.env.DATABASE_URL);
const REUSE = process.env.DATABASE_URL ? (process.argv.find((a) => a.startsWith("--database="))?.split("=")[1] ?? null) : null;
const ROOT = path.resolve(import.meta.dirname, "..");
const SEED = path.join(ROOT, "content-seed");
const MM_PER_IN = 25.4; // exact (NIST Handbook 44, Appendix C)

type Db = ReturnType<typeof createDb>["db"];

const rnd = random(7);
const pick = <T>(list: readonly T[], r = rnd) => list[Math.floor(r() * list.length)];

// ---------------------------------------------------------------------------------------------
// The content: sentences of the demo class's own write-ups, spaces and items, recombined, under
// titles made from the class's jobs, things and places.

const ACTIONS = ["Relocating", "Replacing", "Building", "Re-bedding", "Fitting", "Moving", "Insulating", "Rewiring", "Sealing", "Adding", "Repairing", "Measuring", "Securing", "Venting", "Lining", "Refairing", "Strengthening", "Draining"];
const THINGS = [
  "the house battery", "a battery box", "a second battery", "the bilge pump", "a half shelf", "the water tank", "the chainplates",
  "the stanchion bases", "a cooler", "the holding tank", "LED cabin lights", "the outboard bracket", "storage bins",
  "the galley sink thru-hull", "a seacock", "the cushions", "a sliding tray", "the fuel can", "the anchor and chain",
  "the keel bolts", "a flare locker", "a tool drawer", "the shore power inlet", "the fresh-water pump", "a portable toilet",
  "the hatch seals", "the mast step", "a cable run", "the tiller", "the rudder gudgeons", "the pintles", "the companionway boards",
  "the sliding hatch", "the portlights", "the deck drains", "the cockpit scuppers", "the lifelines", "the jacklines",
  "the bow roller", "the windlass", "the spreaders", "the halyards", "the boom vang", "the mainsheet traveller",
  "the jib tracks", "the winches", "the cleats", "the compass", "the depth sounder", "the VHF radio", "the solar panel",
  "the charge controller", "the battery switch", "the fuse block", "the bus bars", "the navigation lights", "the masthead light",
  "the cabin heater", "the stove", "the ice box", "the sink drain", "the hull-deck joint", "the bottom paint", "the boot stripe",
  "the keel fairing", "the trailer winch", "the mooring cleat", "the fenders", "the dinghy chocks", "the hanging locker",
];
const PLACES = [
  "under the starboard settee", "under the port settee", "in the lazarette", "in the forepeak", "under the V-berth",
  "in the cockpit locker", "under the cockpit sole", "in the galley cabinet", "behind the quarter berth", "in the bilge",
  "on the bridge deck", "at the transom", "under the cabin sole", "in the anchor locker", "on the cabin top", "on the foredeck",
  "along the side deck", "at the mast", "in the companionway", "behind the bulkhead", "under the deckhead", "at the stern",
  "on the coachroof", "in the hanging locker", "by the chart table",
];
const VARIANT_NOTE = ["", "", "", " (Mk I)", " (Mk II)", " (hulls 1-119)", " (hulls 120-298)"];

type Taxonomy = { systems: { slug: string; name: string }[]; zones: { slug: string; name: string }[] };

function corpus() {
  const sentences: string[] = [];
  const split = (text: string) => text.replace(/\s+/g, " ").split(/(?<=[.!?])\s+/).filter((s) => s.length > 25);
  for (const file of fs.readdirSync(path.join(SEED, "writeups")).filter((f) => f.endsWith(".md"))) {
    const { data, body } = splitFrontMatter(fs.readFileSync(path.join(SEED, "writeups", file), "utf8"));
    sentences.push(...split(renderMarkdown(body).text), ...split(String((data as { summary?: string }).summary ?? "")));
  }
  const spaces = YAML.parse(fs.readFileSync(path.join(SEED, "spaces.yaml"), "utf8")) as { obstructions?: string }[];
  const obstructions = spaces.flatMap((s) => split(s.obstructions ?? ""));
  const words = [...new Set(sentences.join(" ").toLowerCase().match(/[a-z]{4,}/g) ?? [])];
  return { sentences, obstructions: obstructions.length ? obstructions : sentences, words };
}

/**
 * A topic model, so that words are spread over the write-ups as in a real collection: 400 topics,
 * each a thing, a place and 60 words of the class's vocabulary; a write-up takes most of its
 * words from its topic, some from anywhere, and a sentence of the demo write-ups. The queries are
 * made from the same topics, as an owner describes one job.
 */
type Topic = { thing: string; place: string; words: string[] };
function makeTopics(words: string[]): Topic[] {
  const r = random(11);
  return Array.from({ length: 400 }, () => ({
    thing: pick(THINGS, r), place: pick(PLACES, r), words: Array.from({ length: 60 }, () => pick(words, r)),
  }));
}

async function generate(db: Db, pool: pg.Pool, writeups: number, spaces: number) {
  const taxonomy = YAML.parse(fs.readFileSync(path.join(SEED, "taxonomy.yaml"), "utf8")) as Taxonomy;
  for (const [i, s] of taxonomy.systems.entries()) await db.execute(sql`insert into systems (slug, name, sort_order) values (${s.slug}, ${s.name}, ${i})`);
  for (const [i, z] of taxonomy.zones.entries()) await db.execute(sql`insert into zones (slug, name, sort_order) values (${z.slug}, ${z.name}, ${i})`);
  await db.execute(sql`insert into users (email, display_name) select 'member' || g || '@example.org', 'Member ' || g from generate_series(1, 50) g`);
  const users = (await db.execute<{ id: number }>(sql`select id from users order by id`)).rows.map((r) => r.id);
  const { sentences, obstructions, words } = corpus();
  const some = (list: string[], n: number) => Array.from({ length: n }, () => pick(list)).join(" ");
  // A bulk load: the search triggers (tags, vocabulary) are off while it runs; the tags are
  // written as the triggers would write them, and the vocabulary is counted once at the end,
  // as the migration does.
  const TRIGGERS = ["writeups", "spaces", "items", "writeup_systems", "writeup_zones"];
  for (const table of TRIGGERS) await db.execute(sql.raw(`alter table ${table} disable trigger user`));

  const topics = makeTopics(words);
  const prose = (topic: (typeof topics)[number], n: number) => {
    const out: string[] = [];
    for (let i = 0; i < n; i++) {
      out.push(rnd() < 0.8 ? pick(topic.words) : pick(words));
      if (i % 12 === 11) out[out.length - 1] += ".";
    }
    return out.join(" ");
  };

  const BATCH = 2000;
  for (let start = 0; start < writeups; start += BATCH) {
    const rows = Array.from({ length: Math.min(BATCH, writeups - start) }, (_, k) => {
      const i = start + k;
      const topic = pick(topics);
      const systems = [...new Set([Math.floor(rnd() * taxonomy.systems.length), ...(rnd() < 0.4 ? [Math.floor(rnd() * taxonomy.systems.length)] : [])])].sort((a, b) => a - b);
      const zones = [...new Set([Math.floor(rnd() * taxonomy.zones.length), ...(rnd() < 0.5 ? [Math.floor(rnd() * taxonomy.zones.length)] : [])])].sort((a, b) => a - b);
      const variant = pick(VARIANT_NOTE);
      const [from, to] = variant.includes("Mk I)") ? [1, 298] : variant.includes("Mk II") ? [299, 612] : variant.includes("1-119") ? [1, 119] : variant.includes("120-298") ? [120, 298] : [1, 612];
      return {
        slug: `bench-w-${i}`,
        title: `${pick(ACTIONS)} ${topic.thing} ${topic.place}${variant}`,
        summary: `${pick(sentences)} ${prose(topic, 12)}`,
        body: prose(topic, 60 + Math.floor(rnd() * 120)),
        status: rnd() < 0.95 ? "published" : "draft",
        author: pick(users),
        from, to,
        published: new Date(Date.UTC(2019 + Math.floor(rnd() * 8), Math.floor(rnd() * 12), 1 + Math.floor(rnd() * 28))).toISOString(),
        // What the tag triggers would write (names by the taxonomy's order), so they have nothing to change.
        tags: [...systems.map((s) => taxonomy.systems[s].name), ...zones.map((z) => taxonomy.zones[z].name)].join(" "),
        // ... and the filter words (writeups.search_filters), in order.
        filters: [...systems.map((s) => `system:${taxonomy.systems[s].slug}`), ...zones.map((z) => `zone:${taxonomy.zones[z].slug}`)].sort().join(","),
        systems: systems.map((s) => taxonomy.systems[s].slug),
        zones: zones.map((z) => taxonomy.zones[z].slug),
      };
    });
    const col = <K extends keyof (typeof rows)[number]>(k: K) => rows.map((r) => r[k]);
    // Arrays go to PostgreSQL as one parameter each (node-postgres sends a JavaScript array as an array).
    await pool.query(
      `insert into writeups (slug, title, summary, body_text, status, author_id, hull_from, hull_to, published_at, search_tags, search_filters)
       select slug, title, summary, body, status::writeup_status, author, h_from, h_to, case when status = 'published' then published::timestamptz end, tags,
              string_to_array(filters, ',')
         from unnest($1::text[], $2::text[], $3::text[], $4::text[], $5::text[], $6::int[], $7::int[], $8::int[], $9::text[], $10::text[], $11::text[])
              as x(slug, title, summary, body, status, author, h_from, h_to, published, tags, filters)`,
      [col("slug"), col("title"), col("summary"), col("body"), col("status"), col("author"), col("from"), col("to"), col("published"), col("tags"), col("filters")],
    );
    const pairs = (key: "systems" | "zones") => rows.flatMap((r) => r[key].map((v) => [r.slug, v]));
    for (const [table, column, list] of [["writeup_systems", "system_slug", pairs("systems")], ["writeup_zones", "zone_slug", pairs("zones")]] as const) {
      await pool.query(
        `insert into ${table} (writeup_id, ${column})
         select w.id, x.v from unnest($1::text[], $2::text[]) as x(slug, v) join writeups w on w.slug = x.slug`,
        [list.map((p) => p[0]), list.map((p) => p[1])],
      );
    }
  }
  // "Done on my boat too": a fifth of the write-ups, by 1 to 30 other hulls.
  await db.execute(sql`select setseed(0.31)`);
  await db.execute(sql`
    insert into done_too (writeup_id, hull_number, user_id)
    select w.id, h, ${users[0]}::int from writeups w
      cross join lateral generate_series(1, 1 + (w.id * 7919 % 30)) h
     where w.id % 5 = 0
    on conflict do nothing`);

  for (let start = 0; start < spaces; start += BATCH) {
    const rows = Array.from({ length: Math.min(BATCH, spaces - start) }, (_, k) => {
      const zone = pick(taxonomy.zones);
      return {
        slug: `bench-s-${start + k}`,
        name: `${pick(["Under", "Behind", "Inside", "Beside", "Above"])} the ${zone.name.toLowerCase()}, ${pick(["forward", "aft", "outboard", "inboard", "lower", "upper"])} bay ${start + k}`,
        zone: zone.slug,
        obstructions: some(obstructions, 1 + Math.floor(rnd() * 3)),
        l: (4 + rnd() * 36) * MM_PER_IN, w: (4 + rnd() * 24) * MM_PER_IN, h: (4 + rnd() * 16) * MM_PER_IN,
        aft: 300 + rnd() * 6000,
      };
    });
    const col = <K extends keyof (typeof rows)[number]>(k: K) => rows.map((r) => r[k]);
    await pool.query(
      `with s as (
         insert into spaces (slug, name, zone_slug, aft_of_bow_mm, obstructions)
         select * from unnest($1::text[], $2::text[], $3::text[], $4::float8[], $5::text[])
         returning id, slug)
       insert into space_sections (space_id, position, label, length_mm, width_mm, height_mm)
       select s.id, 0, 'main', x.l, x.w, x.h
         from unnest($1::text[], $6::float8[], $7::float8[], $8::float8[]) as x(slug, l, w, h)
         join s on s.slug = x.slug`,
      [col("slug"), col("name"), col("zone"), col("aft"), col("obstructions"), col("l"), col("w"), col("h")],
    );
  }
  await db.execute(sql`
    insert into items (slug, name, kind, length_mm, width_mm, height_mm, orientation, note)
    select 'bench-i-' || g, (array['Cooler', 'Tool box', 'Water container', 'Battery box', 'Storage bin', 'Fuel can'])[1 + g % 6] || ' ' || g,
           'member-item', 200 + g, 150 + g % 50, 180 + g % 70, 'any', 'A member''s item for the benchmark.'
      from generate_series(1, 200) g`);
  for (const table of TRIGGERS) await db.execute(sql.raw(`alter table ${table} enable trigger user`));
  const [wrong] = (await db.execute<{ n: number }>(sql`
    select count(*)::int as n from writeups w
     where w.search_tags <> concat_ws(' ',
       (select string_agg(s.name, ' ' order by s.sort_order, s.slug) from writeup_systems ws join systems s on s.slug = ws.system_slug where ws.writeup_id = w.id),
       (select string_agg(z.name, ' ' order by z.sort_order, z.slug) from writeup_zones wz join zones z on z.slug = wz.zone_slug where wz.writeup_id = w.id))
        or not exists (select from (select array(select 'system:' || system_slug from writeup_systems where writeup_id = w.id
                                                  union all select 'zone:' || zone_slug from writeup_zones where writeup_id = w.id) as f) x
                        where x.f @> w.search_filters and w.search_filters @> x.f)`)).rows;
  if (wrong.n > 0) throw new Error(`${wrong.n} generated write-ups have tags other than the triggers would write`);
  await db.execute(sql`delete from search_vocabulary`);
  await db.execute(sql`
    insert into search_vocabulary (word, documents)
    select w.word, count(*)::int
      from (select search_vocabulary_text('writeups', to_jsonb(t)) as body from writeups t
            union all select search_vocabulary_text('spaces', to_jsonb(t)) from spaces t
            union all select search_vocabulary_text('items', to_jsonb(t)) from items t) d
      cross join lateral search_words(d.body) as w(word)
     where d.body is not null
     group by w.word`);
  await db.execute(sql`vacuum analyze`);
  // Read the tables once, as a server that has been answering for a while would have them.
  await db.execute(sql`select sum(length(search)), sum(length(body_text)) from writeups`);
  await db.execute(sql`select sum(length(search)) from spaces`);
}

// ---------------------------------------------------------------------------------------------
// The queries: what owners type, the syntax, and combinations of the class's words; some narrowed.

function queries(): string[] {
  const r = random(99);
  const typed = [
    "battery box under the settee", "bunk storage", "lazarette shelf", "stern locker", "battery under a bunk",
    "thru-hull", "through-hull seacock", '"cockpit locker" tray', "battery -outboard", "holding tank or toilet",
    "chainplate leak", "forepeak bins", "v-berth storage", "floor boards keel bolts", "where to put a second battery",
    "cooler in the cockpit locker", "galley shelf", "led lights wiring", "bow down trim anchor chain", "starboard list battery",
    "fuel can locker", "outboard bracket transom", "cushions for the berths", "bilge pump", "stanchion butyl",
    "quarter berth leak", "water tank under settee", "head toilet", "shore power", "mast step",
  ];
  // One job described in two or three words of its topic (the thing, the place, a word of its
  // text); some with the syntax, some narrowed by a filter.
  const topics = makeTopics(corpus().words);
  const noun = (phrase: string) => phrase.replace(/^(the|a|an) /, "").split(" ").filter((w) => w.length > 2);
  const generated: string[] = [];
  while (generated.length < 200) {
    const t = pick(topics, r);
    const thing = noun(t.thing);
    const place = noun(t.place.replace(/^(under|in|on|at|behind|along|by) the /, ""));
    const shape = r();
    let q: string;
    if (shape < 0.3) q = `${pick(thing, r)} ${pick(t.words, r)}`;
    else if (shape < 0.5) q = `${pick(thing, r)} ${pick(place, r)}`;
    else if (shape < 0.6) q = `${pick(t.words, r)} ${pick(t.words, r)} ${pick(place, r)}`;
    else if (shape < 0.7) q = `"${thing.join(" ")}" ${pick(t.words, r)}`;
    else if (shape < 0.78) q = `${pick(thing, r)} -${pick(pick(topics, r).words, r)}`;
    else if (shape < 0.86) q = `${pick(thing, r)} or ${pick(noun(pick(topics, r).thing), r)}`;
    else q = pick(thing, r);
    const params = new URLSearchParams({ q });
    const narrow = r();
    if (narrow < 0.15) params.set("system", pick(["electrical", "joinery", "plumbing", "interior"], r));
    else if (narrow < 0.3) params.set("hull", pick(["mk1", "mk2", "147", "402"], r));
    else if (narrow < 0.35) params.set("zone", pick(["starboard-settee", "lazarette", "v-berth"], r));
    generated.push(params.toString());
  }
  return [...typed.map((q) => new URLSearchParams({ q }).toString()), ...generated];
}

/** The baseline: the same words as ILIKE over the same rows, and the same answer (a count and the first 20). */
async function ilikeSearch(db: Db, q: URLSearchParams) {
  const text = q.get("q") ?? "";
  const phrases = [...text.matchAll(/"([^"]+)"/g)].map((m) => m[1]);
  const rest = text.replace(/"[^"]*"/g, " ");
  const excluded = [...rest.matchAll(/(?:^|\s)-(\S+)/g)].map((m) => m[1]);
  const anyOf = /\sor\s/i.test(rest);
  const words = queryWords(rest.replace(/(?:^|\s)-\S+/g, " ")).filter((w) => w.length > 2 || /\d/.test(w));
  const like = (col: string, w: string) => sql`${sql.raw(col)} ilike ${`%${w.replace(/[%_\\]/g, "\\$&")}%`}`;
  const cond = (cols: string[]) => {
    const has = (w: string) => sql`(${sql.join(cols.map((c) => like(c, w)), sql` or `)})`;
    const must = [...phrases, ...words].map(has);
    const parts = [must.length ? sql.join(must, anyOf ? sql` or ` : sql` and `) : sql`true`, ...excluded.map((w) => sql`not ${has(w)}`)];
    return sql.join(parts.map((p) => sql`(${p})`), sql` and `);
  };
  const hull = q.get("hull");
  const range = hull === "mk1" ? [1, 298] : hull === "mk2" ? [299, 612] : hull ? [Number(hull), Number(hull)] : null;
  const system = q.get("system");
  const zone = q.get("zone");
  const w = [sql`w.status = 'published'`, cond(["w.title", "w.summary", "w.body_text"])];
  if (range) w.push(sql`w.hull_from <= ${range[1]} and w.hull_to >= ${range[0]}`);
  if (system) w.push(sql`exists (select 1 from writeup_systems ws where ws.writeup_id = w.id and ws.system_slug = ${system})`);
  if (zone) w.push(sql`exists (select 1 from writeup_zones wz where wz.writeup_id = w.id and wz.zone_slug = ${zone})`);
  const s = [cond(["s.name", "s.obstructions"])];
  if (range) s.push(sql`s.hull_from <= ${range[1]} and s.hull_to >= ${range[0]}`);
  if (zone) s.push(sql`s.zone_slug = ${zone}`);
  const parts = [sql`select 'writeup' as type, w.id, w.title, w.published_at as dated from writeups w where ${sql.join(w, sql` and `)}`];
  if (!system) parts.push(sql`select 'space', s.id, s.name, null from spaces s where ${sql.join(s, sql` and `)}`);
  if (!system && !zone) parts.push(sql`select 'item', i.id, i.name, null from items i where ${cond(["i.name", "i.note"])}`);
  const r = await db.execute<{ type: string; id: number; title: string; total: number }>(sql`
    select type, id, title, count(*) over ()::int as total from (${sql.join(parts, sql` union all `)}) h
     order by dated desc nulls last, id limit 20`);
  return JSON.stringify({ total: r.rows[0]?.total ?? 0, results: r.rows.map(({ type, id, title }) => ({ type, id, title })) });
}

type Loader = (args: { request: Request; params: Record<string, string>; context: unknown }) => Promise<Response> | Response;

async function timeHandler(loader: Loader, url: string): Promise<number> {
  const t0 = performance.now();
  const response = await loader({ request: new Request(url), params: {}, context: {} });
  await response.text();
  const ms = performance.now() - t0;
  if (response.status !== 200) throw new Error(`${url} answered ${response.status}`);
  return ms;
}

async function httpServer(databaseUrl: string): Promise<{ base: string; stop: () => void } | null> {
  if (!HTTP) return null;
  if (!fs.existsSync(path.join(ROOT, "build/server/index.js"))) {
    console.log("[bench] no production build (npm run build): the HTTP figures are left out");
    return null;
  }
  const port = await freePort();
  const child = spawn(process.execPath, ["scripts/serve.mjs"], {
    cwd: ROOT,
    stdio: "ignore",
    env: { ...process.env, NODE_ENV: "production", DATABASE_URL: databaseUrl, HOST: "127.0.0.1", PORT: String(port), SESSION_SECRET: randomBytes(32).toString("hex") },
  });
  const base = `http://127.0.0.1:${port}`;
  for (let i = 0; i < 150; i++) {
    try {
      if ((await fetch(`${base}/api/health`)).ok) return { base, stop: () => child.kill("SIGTERM") };
    } catch {
      // not listening yet
    }
    await new Promise((r) => setTimeout(r, 100));
  }
  child.kill("SIGTERM");
  console.log("[bench] the production server did not start: the HTTP figures are left out");
  return null;
}

async function timeHttp(url: string): Promise<number> {
  const t0 = performance.now();
  const r = await fetch(url);
  await r.text();
  const ms = performance.now() - t0;
  if (r.status !== 200) throw new Error(`${url} answered ${r.status}`);
  return ms;
}

/** p50, p95 and p99 of a list of times, printed as figures (`label` p50 ...). */
function report(label: string, times: number[], p95Target?: Target) {
  const s = [...times].sort((a, b) => a - b);
  const r = { p50: percentile(s, 50), p95: percentile(s, 95), p99: percentile(s, 99) };
  figure(`${label} p50`, r.p50, "ms");
  figure(`${label} p95`, r.p95, "ms", p95Target);
  figure(`${label} p99`, r.p99, "ms");
  return r;
}

async function main() {
  if (process.argv.includes("--list-queries")) {
    console.log(queries().join("\n"));
    return;
  }
  const database = await benchDatabase("bench_search", { sharedBuffers: "1GB", reuse: REUSE, keep: KEEP });
  const databaseUrl = database.url;
  // The app's modules read DATABASE_URL once, when first imported.
  process.env.DATABASE_URL = databaseUrl;
  const { db, pool } = createDb(databaseUrl, 4);
  let http: Awaited<ReturnType<typeof httpServer>> = null;
  let appPool: { end(): Promise<void> } | null = null;
  try {
    await migrate(db, { migrationsFolder: path.join(ROOT, "drizzle") });
    const started = performance.now();
    if (!REUSE) await generate(db, pool, WRITEUPS, SPACES);
    const [counts] = (await db.execute<{ w: number; p: number; s: number; v: number }>(sql`
      select (select count(*) from writeups)::int as w, (select count(*) from writeups where status = 'published')::int as p,
             (select count(*) from spaces)::int as s, (select count(*) from search_vocabulary)::int as v`)).rows;
    console.log(`[bench] ${counts.w} write-ups (${counts.p} published), ${counts.s} spaces, a vocabulary of ${counts.v} words, generated in ${((performance.now() - started) / 1000).toFixed(1)} s`);

    if (KEEP) return;

    const search = ((await import("../app/routes/api.search")) as unknown as { loader: Loader }).loader;
    const health = ((await import("../app/routes/api.health")) as unknown as { loader: Loader }).loader;
    appPool = (await import("../app/db/index.server")).pool;
    const list = queries();
    console.log(`[bench] ${list.length} distinct queries, rotated: ${WARM_UP} to warm up, then ${QUERIES} searches and ${QUERIES} health checks; the baseline runs each distinct query once`);
    const at = (i: number) => list[i % list.length];

    const times = { search: [] as number[], baseline: [] as number[], floor: [] as number[] };
    const perQuery = new Map<string, number[]>();
    for (let i = 0; i < WARM_UP + QUERIES; i++) {
      const q = at(i);
      const a = await timeHandler(search, `http://bench.local/api/search?${q}`);
      const c = await timeHandler(health, "http://bench.local/api/health");
      if (i >= WARM_UP) {
        times.search.push(a);
        times.floor.push(c);
        perQuery.set(q, [...(perQuery.get(q) ?? []), a]);
      }
    }
    if (process.argv.includes("--slowest")) {
      const slowest = [...perQuery].map(([q, t]) => ({ q, ms: Math.max(...t) })).sort((a, b) => b.ms - a.ms).slice(0, 15);
      for (const x of slowest) console.log(`[bench]   slowest: ${x.ms.toFixed(1).padStart(7)} ms  ${decodeURIComponent(x.q.replace(/\+/g, " "))}`);
    }
    // The baseline reads every row for every query (about a second each at 100,000 write-ups):
    // each distinct query once, after a few to warm up. `--no-baseline` leaves it out (while
    // working on the search: the targets against it are then not printed).
    let totals = 0;
    for (let i = 0; BASELINE && i < list.length + 5; i++) {
      const t0 = performance.now();
      const baseline = JSON.parse(await ilikeSearch(db, new URLSearchParams(at(i)))) as { total: number };
      if (i >= 5) {
        times.baseline.push(performance.now() - t0);
        totals += baseline.total;
      }
    }
    console.log(`[bench] server-side (the route's handler, in process${BASELINE ? `; the baseline's ${list.length} queries match ${(totals / list.length).toFixed(0)} rows on average` : ""}):`);
    const s = report("search server-side", times.search, { op: "<=", value: 30 });
    if (BASELINE) {
      const b = report("baseline ILIKE server-side", times.baseline);
      figure("baseline / search p95", b.p95 / s.p95, "x", { op: ">=", value: 20 });
      figure("baseline / search p50", b.p50 / s.p50, "x");
    }
    const f = report("floor health server-side", times.floor);
    figure("search / floor p95 server-side", s.p95 / f.p95, "x", { op: "<=", value: 3 });
    figure("search / floor p50 server-side", s.p50 / f.p50, "x");

    http = await httpServer(databaseUrl);
    if (http && (await fetch(`${http.base}/api/search?q=battery`)).status !== 200) {
      console.log("[bench] the production build has no search API (build it again: npm run build): the HTTP figures are left out");
      http.stop();
      http = null;
    }
    if (http) {
      const ht = { search: [] as number[], floor: [] as number[] };
      for (let i = 0; i < WARM_UP + QUERIES; i++) {
        const a = await timeHttp(`${http.base}/api/search?${at(i)}`);
        const c = await timeHttp(`${http.base}/api/health`);
        if (i >= WARM_UP) {
          ht.search.push(a);
          ht.floor.push(c);
        }
      }
      console.log("[bench] over HTTP on loopback (the production build in build/, keep-alive):");
      const hs = report("search over HTTP", ht.search);
      const hf = report("floor health over HTTP", ht.floor);
      figure("search / floor p95 over HTTP", hs.p95 / hf.p95, "x");
    }
  } finally {
    http?.stop();
    await appPool?.end();
    await pool.end();
    await database.finish();
  }
}

main().catch((error) => {
  console.error(`[bench] failed: ${error instanceof Error ? error.stack : error}`);
  process.exitCode = 1;
});

