// Benchmark of the yearly digest: a generated year of 2,000 published write-ups (on top of the
// demo class, in a database of its own), then
//   - compiling the draft (no target; for reference);
//   - the HTML: the edition's content from the database and the printable document rendered from
//     it, the work behind the web page and the PDF (target: at most 2 s);
//   - the PDF: Chromium printing that document, browser start included (target: at most 10 s).
// A quarter of the write-ups have a photo, whose thumbnail (a generated 480 x 360 WebP, like the
// photo store's) is inlined into the document as the PDF is made.
//
//   npx tsx scripts/bench-digest.ts [--writeups=2000] [--runs=3] [--keep-pdf]
//
// With DATABASE_URL set, the database is made on that server (the role needs CREATEDB);
// otherwise a PostgreSQL cluster of its own is started in a temporary folder.
import fs from "node:fs";
import os from "node:os";
import path from "node:path";
import { sql } from "drizzle-orm";
import { migrate } from "drizzle-orm/node-postgres/migrator";
import sharp from "sharp";
import { getDocumentProxy } from "unpdf";
import { createDb } from "../app/db/client.server";
import { renderMarkdown } from "../app/domain/markdown";
import { argNumber, benchDatabase, figure, random } from "./lib/bench-kit";
import { seedDemo, splitFrontMatter } from "./seed-content";

const WRITEUPS = argNumber("writeups", 2000);
const RUNS = argNumber("runs", 3);
const YEAR = 2030; // a year of its own: every count in it is what this script made
const ROOT = path.resolve(import.meta.dirname, "..");
const SEED = path.join(ROOT, "content-seed");

const rnd = random(2030);
const pick = <T>(list: readonly T[]) => list[Math.floor(rnd() * list.length)];

const ACTIONS = ["Relocating", "Replacing", "Building", "Re-bedding", "Fitting", "Moving", "Insulating", "Rewiring", "Sealing", "Adding", "Repairing", "Securing", "Venting", "Lining"];
const THINGS = ["the house battery", "a battery box", "the bilge pump", "a half shelf", "the water tank", "the chainplates", "the stanchion bases", "a cooler", "LED cabin lights", "the outboard bracket", "storage bins", "a seacock", "the cushions", "a sliding tray", "the keel bolts", "a flare locker", "the fuse block", "the navigation lights", "the stove", "the trailer winch"];
const PLACES = ["under the starboard settee", "under the port settee", "in the lazarette", "in the forepeak", "under the V-berth", "in the cockpit locker", "under the cockpit sole", "in the galley cabinet", "behind the quarter berth", "in the bilge", "on the bridge deck", "at the transom"];

function sentences(): string[] {
  const out: string[] = [];
  for (const file of fs.readdirSync(path.join(SEED, "writeups")).filter((f) => f.endsWith(".md"))) {
    const { body } = splitFrontMatter(fs.readFileSync(path.join(SEED, "writeups", file), "utf8"));
    out.push(...renderMarkdown(body).text.replace(/\s+/g, " ").split(/(?<=[.!?])\s+/).filter((s) => s.length > 30 && s.length < 220));
  }
  return out;
}

async function generate(db: ReturnType<typeof createDb>["db"]) {
  await seedDemo(db, SEED);
  const lines = sentences();
  const systems = (await db.execute<{ slug: string }>(sql`select slug from systems order by sort_order`)).rows.map((r) => r.slug);
  const spaces = (await db.execute<{ id: number }>(sql`select id from spaces order by id`)).rows.map((r) => r.id);
  // Members who joined in the year, with boats of their own.
  await db.execute(sql`
    insert into users (email, display_name, credit_as, created_at, email_verified_at, digest_opt_in)
    select 'owner' || g || '@example.org', 'Owner ' || g, case when g % 3 = 0 then 'Owner ' || g || ', hull ' || (g % 600 + 1) end,
           ${`${YEAR}-01-01T00:00:00Z`}::timestamptz + (g * interval '20 hours'), now(), g % 5 <> 0
    from generate_series(1, 400) g`);
  await db.execute(sql`insert into boats (hull_number, name) select h, 'Boat ' || h from generate_series(1, 612) h on conflict (hull_number) do nothing`);
  await db.execute(sql`
    insert into boat_owners (boat_id, user_id)
    select b.id, u.id from users u join boats b on b.hull_number = (substring(u.email from 'owner(\\d+)@')::int % 600 + 1)
    where u.email like 'owner%' on conflict do nothing`);
  const authors = (await db.execute<{ id: number; boat_id: number | null }>(sql`
    select u.id, (select bo.boat_id from boat_owners bo where bo.user_id = u.id limit 1) as boat_id from users u order by u.id`)).rows;

  const photoKeys: string[] = [];
  for (let start = 0; start < WRITEUPS; start += 500) {
    const rows = Array.from({ length: Math.min(500, WRITEUPS - start) }, (_, k) => {
      const i = start + k;
      const author = pick(authors);
      const photo = i % 4 === 0 ? `photos/${YEAR}/${String(i).padStart(22, "b")}` : null;
      if (photo) photoKeys.push(`${photo}.thumb.webp`);
      const body = `${pick(lines)} ${pick(lines)}\n\n${photo ? `![The finished job](/media/${photo}.webp)\n\n` : ""}${pick(lines)}`;
      return {
        slug: `bench-digest-${i}`,
        title: `${pick(ACTIONS)} ${pick(THINGS)} ${pick(PLACES)} (${i + 1})`,
        summary: `${pick(lines)} ${rnd() < 0.5 ? pick(lines) : ""}`.trim(),
        body_markdown: body,
        body_text: body,
        author_id: author.id,
        boat_id: author.boat_id,
        published_at: new Date(Date.UTC(YEAR, 0, 1) + Math.floor(rnd() * 364 * 24) * 3600_000).toISOString(),
      };
    });
    const inserted = await db.execute<{ id: number }>(sql`
      insert into writeups (slug, title, summary, body_markdown, body_text, status, author_id, boat_id, published_at, created_at, updated_at)
      select r.slug, r.title, r.summary, r.body_markdown, r.body_text, 'published', r.author_id, r.boat_id, r.published_at, r.published_at, r.published_at
      from json_to_recordset(${JSON.stringify(rows)}::json) as r(slug text, title text, summary text, body_markdown text, body_text text, author_id int, boat_id int, published_at timestamptz)
      returning id`);
    const ids = inserted.rows.map((r) => r.id);
    const tags = ids.flatMap((id) => [...new Set([pick(systems), ...(rnd() < 0.35 ? [pick(systems)] : [])])].map((slug) => ({ id, slug })));
    await db.execute(sql`insert into writeup_systems (writeup_id, system_slug) select r.id, r.slug from json_to_recordset(${JSON.stringify(tags)}::json) as r(id int, slug text)`);
    const used = ids.flatMap((id) => (rnd() < 0.6 ? [...new Set([pick(spaces), ...(rnd() < 0.3 ? [pick(spaces)] : [])])] : []).map((space) => ({ id, space })));
    if (used.length) await db.execute(sql`insert into writeup_spaces (writeup_id, space_id) select r.id, r.space from json_to_recordset(${JSON.stringify(used)}::json) as r(id int, space int)`);
  }
  // Measurements taken in the year, and boats that did the same job too.
  await db.execute(sql`
    insert into space_measurements (space_id, user_id, hull_number, method, measured_on, length_mm, width_mm, height_mm)
    select s.id, u.id, (g % 600) + 1, 'tape', ${`${YEAR}-01-01`}::date + (g % 360), 500 + g % 40, 300 + g % 30, 250 + g % 20
    from generate_series(1, 900) g
    join lateral (select id from spaces order by id offset (g % (select count(*) from spaces)) limit 1) s on true
    join lateral (select id from users where email like 'owner%' order by id offset (g % 400) limit 1) u on true`);
  await db.execute(sql`
    insert into done_too (writeup_id, hull_number, user_id)
    select w.id, b.hull_number, bo.user_id
    from (select id from writeups where slug like 'bench-digest-%' order by random() limit 600) w
    join lateral (select * from boats order by random() limit 1 + (floor(random() * 6))::int) b on true
    join lateral (select user_id from boat_owners where boat_id = b.id limit 1) bo on true
    on conflict do nothing`);
  return photoKeys;
}

/**
 * CPU seconds used by this process's descendants (Chromium's processes), sampled from /proc every
 * 100 ms while `work` runs: a figure the machine's other load does not inflate as it does the
 * wall-clock time. Linux only; null elsewhere.
 */
async function descendantsCpu<T>(work: () => Promise<T>): Promise<{ result: T; cpuSeconds: number | null }> {
  if (!fs.existsSync("/proc/self/stat")) return { result: await work(), cpuSeconds: null };
  const seen = new Map<number, number>();
  const tick = Number(process.env.CLK_TCK ?? 100); // USER_HZ, 100 on Linux (man 5 proc)
  const sample = () => {
    const parent = new Map<number, number>();
    const cpu = new Map<number, number>();
    for (const entry of fs.readdirSync("/proc")) {
      if (!/^\d+$/.test(entry)) continue;
      try {
        const fields = fs.readFileSync(`/proc/${entry}/stat`, "utf8").split(") ")[1].split(" ");
        parent.set(Number(entry), Number(fields[1]));
        cpu.set(Number(entry), (Number(fields[11]) + Number(fields[12])) / tick);
      } catch { /* gone */ }
    }
    const mine = new Set([process.pid]);
    for (let grew = true; grew;) {
      grew = false;
      for (const [pid, ppid] of parent) if (!mine.has(pid) && mine.has(ppid)) { mine.add(pid); grew = true; }
    }
    mine.delete(process.pid);
    for (const pid of mine) seen.set(pid, Math.max(seen.get(pid) ?? 0, cpu.get(pid) ?? 0));
  };
  const before = new Set<number>();
  sample();
  for (const pid of seen.keys()) before.add(pid);
  const timer = setInterval(sample, 100);
  try {
    const result = await work();
    sample();
    return { result, cpuSeconds: [...seen].filter(([pid]) => !before.has(pid)).reduce((n, [, c]) => n + c, 0) };
  } finally {
    clearInterval(timer);
  }
}

async function main() {
  // Rendered as the production server renders (React's production build).
  process.env.NODE_ENV = "production";
  const database = await benchDatabase("bench_digest");
  process.env.DATABASE_URL = database.url;
  const { db, pool } = createDb(database.url, 4);
  // The app's modules, imported once DATABASE_URL points at the benchmark's database.
  const digests = await import("../app/models/digests.server");
  const print = await import("../app/services/digest-print.server");
  const pdfService = await import("../app/services/pdf.server");
  try {
    await migrate(db, { migrationsFolder: path.join(ROOT, "drizzle") });
    const started = performance.now();
    const photoKeys = new Set(await generate(db));
    const [{ n }] = (await db.execute<{ n: number }>(sql`select count(*)::int as n from writeups where status = 'published' and published_at >= ${`${YEAR}-01-01T00:00:00Z`} and published_at < ${`${YEAR + 1}-01-01T00:00:00Z`}`)).rows;
    console.log(`[bench] ${n} write-ups published in ${YEAR} (${photoKeys.size} with a photo), generated in ${((performance.now() - started) / 1000).toFixed(1)} s`);

    // A thumbnail like the photo store's: 480 x 360 WebP at quality 75.
    const thumb = await sharp({ create: { width: 480, height: 360, channels: 3, background: "#2f6f82" } })
      .composite([{ input: Buffer.from('<svg xmlns="http://www.w3.org/2000/svg" width="480" height="360"><rect y="220" width="480" height="140" fill="#ece3cc"/><circle cx="360" cy="90" r="40" fill="#d9954a"/></svg>') }])
      .webp({ quality: 75 }).toBuffer();
    const fetchObject = async (key: string) => photoKeys.has(key)
      ? { body: new Blob([new Uint8Array(thumb)]).stream() as ReadableStream<Uint8Array>, contentType: "image/webp", contentLength: thumb.length }
      : null;

    let t0 = performance.now();
    const { id } = await digests.compileDraft(db, { year: YEAR, userId: 1 });
    figure(`compile the draft of ${n} write-ups`, performance.now() - t0, "ms");

    const htmlTimes: number[] = [];
    const contentTimes: number[] = [];
    let html = "";
    let photos = new Map<string, string>();
    for (let run = 0; run < RUNS; run++) {
      t0 = performance.now();
      const snapshot = await digests.buildSnapshot(db, id);
      contentTimes.push(performance.now() - t0);
      html = print.digestPrintHtml(snapshot, { className: "Brantwater 22", appUrl: "https://sistership.example" });
      htmlTimes.push(performance.now() - t0);
      if (run === 0) {
        const entries = snapshot.sections.reduce((k, s) => k + s.entries.length, 0);
        console.log(`[bench] HTML of ${entries} entries in ${snapshot.sections.length} sections: ${(html.length / 1e6).toFixed(1)} MB`);
        photos = await print.loadThumbnails(snapshot, fetchObject);
      }
    }
    htmlTimes.sort((a, b) => a - b);
    contentTimes.sort((a, b) => a - b);
    figure(`digest content from the database, median of ${RUNS}`, contentTimes[Math.floor(contentTimes.length / 2)], "ms");
    figure(`digest HTML, ${n} write-ups (content + render), median of ${RUNS}`, htmlTimes[Math.floor(htmlTimes.length / 2)] / 1000, "s");
    figure(`digest HTML, ${n} write-ups (content + render), slowest of ${RUNS}`, htmlTimes.at(-1)! / 1000, "s", { op: "<=", value: 2 });

    // The PDF: inlining the thumbnails, then Chromium's print, browser start included.
    const snapshot = await digests.buildSnapshot(db, id);
    t0 = performance.now();
    const { result: pdf, cpuSeconds } = await descendantsCpu(() => print.buildDigestPdf(snapshot, { className: "Brantwater 22", appUrl: "https://sistership.example", fetchObject }));
    const pdfSeconds = (performance.now() - t0) / 1000;
    const bytes = pdf.byteLength;
    if (process.argv.includes("--keep-pdf")) {
      const file = path.join(os.tmpdir(), `bench-digest-${YEAR}.pdf`);
      fs.writeFileSync(file, pdf);
      fs.writeFileSync(file.replace(/\.pdf$/, ".html"), print.digestPrintHtml(snapshot, { className: "Brantwater 22", appUrl: "https://sistership.example", photos }));
      console.log(`[bench] PDF and its HTML kept at ${file}`);
    }
    const pages = (await getDocumentProxy(pdf)).numPages; // (pdf.js takes the buffer over)
    console.log(`[bench] PDF: ${pages} pages, ${(bytes / 1e6).toFixed(1)} MB, ${photos.size} thumbnails inlined`);
    figure(`digest PDF, ${n} write-ups (Chromium print, browser start included)`, pdfSeconds, "s", { op: "<=", value: 10 });
    figure("digest PDF pages", pages, "pages");
    if (cpuSeconds !== null) figure("digest PDF, Chromium's CPU time (all its processes)", cpuSeconds, "s");
    console.log(`[bench] load average while measuring: ${os.loadavg().map((x) => x.toFixed(1)).join(" ")} on ${os.cpus().length} cores`);
  } finally {
    await pdfService.closePdfBrowser();
    await pool.end();
    await database.finish();
  }
}

await main();
