// The search over write-ups, spaces and items (app/models/search.server.ts and GET /api/search),
// against a copy of the seeded demo class.
import fs from "node:fs";
import path from "node:path";
import { sql } from "drizzle-orm";
import YAML from "yaml";
import { createElement } from "react";
import { renderToStaticMarkup } from "react-dom/server";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { SnippetText } from "~/components/snippet";
import { MATCH_CAP, NO_FILTERS, parseSearchParams, type SearchFilters, type SearchRequest } from "~/domain/search";
import { analyseQuery, doneTooBoost, hullChoices, search, searchFacets, suggest } from "~/models/search.server";
import { findFittingSpaces } from "~/models/spaces.server";
import { appDatabase } from "../support/app";
import { readSeedWriteups, SEED_DIR } from "../support/seed-files";

let t: Awaited<ReturnType<typeof appDatabase>>;
type Loader = (args: { request: Request; params: Record<string, string>; context: unknown }) => Promise<Response>;
let apiSearch: Loader;
let apiSuggest: Loader;
let appPool: { end(): Promise<void> } | undefined;

beforeAll(async () => {
  t = await appDatabase("template_seeded");
  apiSearch = ((await import("~/routes/api.search")) as unknown as { loader: Loader }).loader;
  apiSuggest = ((await import("~/routes/api.search.suggest")) as unknown as { loader: Loader }).loader;
  appPool = (await import("~/db/index.server")).pool;
});
afterAll(async () => {
  await appPool?.end();
  await t?.drop();
});

const seed = readSeedWriteups();
const published = seed.filter((w) => w.status === "published");

function req(q: string, filters: Partial<SearchFilters> = {}, limit = 100, offset = 0): SearchRequest {
  return { q, filters: { ...NO_FILTERS, ...filters }, limit, offset };
}
async function slugs(q: string, filters: Partial<SearchFilters> = {}) {
  return (await search(t.db, req(q, filters))).results.map((r) => `${r.type}:${r.slug}`);
}
async function api(query: string) {
  const response = await apiSearch({ request: new Request(`http://localhost/api/search?${query}`), params: {}, context: {} });
  return { status: response.status, body: (await response.json()) as any };
}

describe("the query builder against the PostgreSQL 15 documentation", () => {
  // PostgreSQL 15 documentation, chapter 12, section 12.3.2 "Parsing Queries": the examples of
  // websearch_to_tsquery, with the results the documentation prints. None of their words is a
  // synonym of the class, so expansion must leave them exactly as they are.
  const examples: [string, string][] = [
    ["The fat rats", "'fat' & 'rat'"],
    ['"supernovae stars" -crab', "'supernova' <-> 'star' & !'crab'"],
    ['"sad cat" or "fat rat"', "'sad' <-> 'cat' | 'fat' <-> 'rat'"],
    ['signal -"segmentation fault"', "'signal' & !( 'segment' <-> 'fault' )"],
  ];
  for (const [input, expected] of examples) {
    it(`websearch_to_tsquery('english', ${JSON.stringify(input)}) = ${expected}`, async () => {
      const a = await analyseQuery(t.db, input);
      expect(a.parsed).toBe(expected);
      expect(a.expanded).toBe(expected);
      expect(a.synonyms).toEqual([]);
    });
  }

  it("takes 'relocate' and 'reposition' for 'move', as owners write either", async () => {
    const expanded = (await analyseQuery(t.db, "relocate")).expanded;
    expect(expanded.split(" | ").sort()).toEqual(["'move'", "'reloc'", "'reposit'"]);
    expect((await analyseQuery(t.db, "moving")).expanded).toBe(expanded);
  });

  it("finds the house battery write-ups by the trade's other name, 'house bank', and offers no other word for it", async () => {
    const battery = ["writeup:group-27-battery-under-starboard-settee", "writeup:correcting-starboard-list-second-battery-mk2"];
    const answer = await search(t.db, req("house bank"));
    expect(answer.matched).toBe("all");
    expect(answer.suggestion).toBeNull();
    expect(battery.every((b) => answer.results.slice(0, 5).some((r) => `${r.type}:${r.slug}` === b))).toBe(true);
  });

  it("adds the class's synonyms to a word, a phrase and an exclusion (query expansion from the table)", async () => {
    expect((await analyseQuery(t.db, "settee")).expanded).toBe("'sette' | 'bunk' | 'berth'");
    const phrase = await analyseQuery(t.db, '"stern locker" shelf');
    expect(phrase.expanded).toBe("'shelf' & ( 'lazarett' | 'stern' <-> 'locker' )");
    // Typed loose, a term of the trade is the same query as any other term of its group.
    expect((await analyseQuery(t.db, "stern locker shelf")).expanded).toBe(phrase.expanded);
    expect(phrase.synonyms).toEqual(["lazarette", "stern locker"]);
    expect((await analyseQuery(t.db, "toilet -settee")).expanded).toBe(
      "!( 'sette' | 'bunk' | 'berth' ) & ( 'head' | 'toilet' | 'marin' <-> 'head' )",
    );
  });

  it("runs the documentation's syntax end to end: a phrase in quotes and a word left out", async () => {
    const all = await slugs("battery");
    const without = await slugs("battery -outboard");
    expect(without.length).toBeGreaterThan(0);
    expect(without.length).toBeLessThan(all.length);
    expect(without).not.toContain("writeup:outboard-bracket-replaced-and-transom-potted");
    const phrase = await slugs('"galley sink"');
    expect(phrase).toContain("writeup:galley-sink-thru-hull-and-seacock-mk1");
    expect(await slugs('"sink galley"')).not.toContain("writeup:galley-sink-thru-hull-and-seacock-mk1");
  });
});

describe("relevance on the demo class", () => {
  it("ranks a write-up with a word in its title above every write-up that has it only in the body", async () => {
    // Every word of every published title, searched for; each result classified by where the
    // (expanded) query matches: the title (weight A) or only the body (weight C).
    const words = [...new Set(published.flatMap((w) => w.title.toLowerCase().match(/[a-z]{4,}/g) ?? []))];
    let compared = 0;
    for (const word of words) {
      const a = await analyseQuery(t.db, word);
      if (!a.expanded) continue;
      const answer = await search(t.db, req(word, { kind: "writeup" }));
      if (answer.matched !== "all") continue;
      const where = await t.db.execute<{ id: number; title: boolean; above_body: boolean }>(sql`
        select id, ts_filter(search, '{a}') @@ ${a.expanded}::tsquery as title,
               ts_filter(search, '{a,b}') @@ ${a.expanded}::tsquery as above_body
          from writeups where id = any(${`{${answer.results.map((r) => r.id).join(",")}}`}::int[])`);
      const rankOf = new Map(answer.results.map((r, i) => [r.id, i]));
      const titled = where.rows.filter((r) => r.title).map((r) => rankOf.get(r.id)!);
      const bodyOnly = where.rows.filter((r) => !r.above_body).map((r) => rankOf.get(r.id)!);
      if (!titled.length || !bodyOnly.length) continue;
      expect({ word, lastTitle: Math.max(...titled) < Math.min(...bodyOnly) }).toEqual({ word, lastTitle: true });
      compared++;
    }
    expect(compared).toBeGreaterThan(20);
  });

  // Each pair: the two words find the same results, among them a document that uses only one of them.
  const pairs: [string, string, string][] = [
    ["settee", "berth", "writeup:chainplates-pulled-inspected-and-rebedded"],
    ["bunk", "settee", "writeup:correcting-starboard-list-second-battery-mk2"],
    ["forepeak", "V-berth", "writeup:safety-gear-stowage-plan-and-bridge-deck-locker"],
    ["stern locker", "lazarette", "space:transom-inspection-void"],
    ["floor", "sole", "writeup:correcting-starboard-list-second-battery-mk2"],
    ["thru-hull", "through-hull", "writeup:galley-sink-thru-hull-and-seacock-mk1"],
    ["head", "toilet", "item:portable-toilet"],
  ];
  for (const [a, b, expected] of pairs) {
    it(`"${a}" and "${b}" find the same results, ${expected} (which uses only one of them) among them`, async () => {
      const [kind, slug] = expected.split(":");
      const table = sql.raw(kind === "writeup" ? "writeups" : kind === "space" ? "spaces" : "items");
      const [uses] = (await t.db.execute<{ a: boolean; b: boolean }>(sql`
        select search @@ phraseto_tsquery('english', ${a}) as a, search @@ phraseto_tsquery('english', ${b}) as b
          from ${table} where slug = ${slug}`)).rows;
      expect(uses.a).not.toBe(uses.b);
      const [ra, rb] = [await slugs(a), await slugs(b)];
      expect(new Set(ra)).toEqual(new Set(rb));
      expect(ra).toContain(expected);
    });
  }

  it("finds a write-up by a word it does not use: its synonym", async () => {
    // The Mk II list write-up says "berth" and "settees", never "bunk".
    const w = published.find((x) => x.slug === "correcting-starboard-list-second-battery-mk2")!;
    expect(/\bbunks?\b/i.test(`${w.title} ${w.body}`)).toBe(false);
    expect(await slugs("bunk battery")).toContain("writeup:correcting-starboard-list-second-battery-mk2");
  });

  it("a hull filter removes the write-ups for the other variant", async () => {
    const mk2Only = published.filter((w) => appliesTo(w.slug) === "mk2");
    expect(mk2Only.length).toBeGreaterThan(0);
    const everyHull = await slugs("settee");
    expect(everyHull.some((s) => mk2Only.some((w) => s === `writeup:${w.slug}`))).toBe(true);
    for (const hull of [{ from: 1, to: 298, text: "mk1" }, { from: 147, to: 147, text: "147" }]) {
      const narrowed = await search(t.db, req("settee", { hull }));
      expect(narrowed.total).toBeGreaterThan(0);
      for (const r of narrowed.results) {
        if (r.detail.type === "item") continue;
        const hulls = "hulls" in r.detail ? r.detail.hulls : null;
        expect(hulls && hulls.from <= hull.to && hulls.to >= hull.from, r.slug).toBe(true);
      }
      for (const w of mk2Only) expect(narrowed.results.map((r) => r.slug)).not.toContain(w.slug);
    }
    // Hull 147 is outside "hulls 1-119" (the forepeak bins) but inside "120-298" (the settee battery).
    const h147 = (await search(t.db, req("forepeak bins", { hull: { from: 147, to: 147, text: "147" } }))).results.map((r) => r.slug);
    expect(h147).not.toContain("storage-bins-under-the-forepeak-infill");
    expect(await slugs("group 27 battery", { hull: { from: 147, to: 147, text: "147" } })).toContain("writeup:group-27-battery-under-starboard-settee");
  });

  it("finds the battery relocation write-ups from seven different phrasings", async () => {
    const battery = ["writeup:group-27-battery-under-starboard-settee", "writeup:correcting-starboard-list-second-battery-mk2"];
    for (const phrasing of [
      "battery box under the settee",
      "move the battery under a bunk",
      "house battery relocated to the berth",
      "battery berth",
      "where to put a second battery",
      // Neither write-up says "relocate" or "relocation": they say "moved" and "moving".
      "relocate the battery",
      "battery relocation",
    ]) {
      const answer = await search(t.db, req(phrasing));
      const found = answer.results.slice(0, 5).map((r) => `${r.type}:${r.slug}`);
      expect({ phrasing, found: battery.filter((b) => found.includes(b)).length > 0 }).toEqual({ phrasing, found: true });
    }
    // ... with every word they typed, not by dropping "relocate" or "relocation" as unknown.
    for (const phrasing of ["relocate the battery", "battery relocation"]) {
      const answer = await search(t.db, req(phrasing));
      expect({ phrasing, matched: answer.matched, both: battery.every((b) => answer.results.some((r) => `${r.type}:${r.slug}` === b)) })
        .toEqual({ phrasing, matched: "all", both: true });
    }
  });

  it("puts the write-ups about moving a battery above the catalogue's battery sizes for 'battery'", async () => {
    const { body } = await api("q=battery&limit=20");
    const order = body.results.map((r: any) => `${r.type}:${r.url}`);
    const firstItem = order.findIndex((x: string) => x.startsWith("item:"));
    expect(firstItem).toBeGreaterThan(-1);
    for (const slug of ["group-27-battery-under-starboard-settee", "correcting-starboard-list-second-battery-mk2"]) {
      const at = order.indexOf(`writeup:/writeups/${slug}`);
      expect({ slug, found: at > -1, beforeItems: at < firstItem }).toEqual({ slug, found: true, beforeItems: true });
    }
  });

  it("shows the beginning of a text, cut at a word, when the words are only in the title", async () => {
    // The BCI group sizes have "battery" in their names only (app/domain/items.ts).
    const answer = await search(t.db, req("battery"));
    const item = answer.results.find((r) => r.type === "item" && r.title === "Battery, BCI group 27")!;
    expect(item.snippet).toEqual({
      text: "Maximum case size from the BCI group size chart; cases vary by maker and are at or under it. Measure yours.",
      highlights: [],
    });
  });

  it("gives a mild boost to a write-up more boats have done too", async () => {
    const ids = await twinWriteups();
    const before = (await search(t.db, req("quadrant tiller sheave"))).results.filter((r) => ids.includes(r.id));
    expect(before.map((r) => r.score)[0]).toBeCloseTo(before[1].score, 10);
    const [, second] = ids;
    const [user] = (await t.db.execute<{ id: number }>(sql`select id from users order by id limit 1`)).rows;
    for (const hull of [12, 13, 14]) {
      await t.db.execute(sql`insert into done_too (writeup_id, hull_number, user_id) values (${second}, ${hull}, ${user.id})`);
    }
    const after = (await search(t.db, req("quadrant tiller sheave"))).results.filter((r) => ids.includes(r.id));
    expect(after[0].id).toBe(second);
    // 1 + ln(1 + 3) / 10 = 1.1386
    expect(after[0].score / after[1].score).toBeCloseTo(doneTooBoost(3), 6);
    expect(doneTooBoost(3)).toBeCloseTo(1.138629, 6);
  });
});

describe("no markup from a document reaches the page through a snippet", () => {
  // Markup a member might paste into a write-up (OWASP XSS Filter Evasion Cheat Sheet style
  // vectors), a tag PostgreSQL's parser does not recognise as one, an entity, and the two marker
  // characters the highlights use.
  const HOSTILE = [
    "Hostile hatch <script>window.__hit = 1</script>",
    `and <img src=x onerror="window.__hit = 2">`,
    "<svg/onload=window.__hit=3>",
    "<img src=x onerror=window.__hit=4//",
    "&lt;b&gt;bold&lt;/b&gt; hostile",
    "\u0002gotcha\u0003 end of the hostile hatch",
  ].join(" ");

  it("the API gives the snippet as escaped text with only <mark> elements", async () => {
    await hostileWriteup(HOSTILE);
    const { status, body } = await api("q=hostile%20hatch%20gotcha%20onerror%20bold");
    expect(status).toBe(200);
    const r = body.results.find((x: any) => x.url === "/writeups/hostile-hatch");
    expect(r).toBeDefined();
    // Nothing but <mark> and </mark> opens a tag; what looked like markup is escaped text.
    expect(r.snippet).not.toMatch(/<(?!\/?mark>)/);
    expect(r.snippet).toMatch(/&lt;img src=x (<mark>)?onerror/);
    expect(r.snippet).toContain("&lt;svg/onload=window.__hit=3&gt;");
    // An entity in the document stays the text it was: its ampersand is escaped again.
    expect(r.snippet).toContain("&amp;lt;b&amp;gt;");
    // The document's own marker characters are removed: only the database marks the words found.
    expect(r.snippet).not.toMatch(/[\u0002\u0003]/);
    expect(r.snippet).toContain("<mark>gotcha</mark>");
    expect(r.snippet).toContain("<mark>Hostile</mark>");
  });

  it("the page renders the same snippet as text", async () => {
    await hostileWriteup(HOSTILE);
    const answer = await search(t.db, req("hostile hatch onerror"));
    const r = answer.results.find((x) => x.slug === "hostile-hatch")!;
    const html = renderToStaticMarkup(createElement(SnippetText, { snippet: r.snippet }));
    expect(html).not.toMatch(/<(script|img|svg)/i);
    expect(html).toContain("&lt;img src=x ");
    expect(html).toContain("&lt;svg/onload=window.__hit=3&gt;");
    expect(html).toMatch(/<mark[^>]*>Hostile<\/mark>/);
  });
});

describe("GET /api/search", () => {
  it("answers { total, results: [{ type, id, title, url, snippet, systems, score }], suggestion }", async () => {
    const { status, body } = await api("q=settee&limit=5");
    expect(status).toBe(200);
    expect(Object.keys(body).sort()).toEqual(["matched", "results", "suggestion", "total", "totalCapped"]);
    expect(body.total).toBeGreaterThan(5);
    expect(body.totalCapped).toBe(false);
    expect(body.results).toHaveLength(5);
    for (const r of body.results) {
      expect(Object.keys(r).sort()).toEqual(["id", "score", "snippet", "systems", "title", "type", "url"]);
      expect(["writeup", "space", "item"]).toContain(r.type);
    }
    const scores = body.results.map((r: any) => r.score);
    expect(scores).toEqual([...scores].sort((a, b) => b - a));
    expect(body.suggestion).toBeNull();
  });

  it("pages with limit and offset: two pages are the first two of one longer page", async () => {
    const whole = (await api("q=settee&limit=10")).body;
    const one = (await api("q=settee&limit=5&offset=0")).body;
    const two = (await api("q=settee&limit=5&offset=5")).body;
    expect([...one.results, ...two.results].map((r: any) => r.url)).toEqual(whole.results.map((r: any) => r.url));
    expect(two.total).toBe(whole.total);
    const past = (await api(`q=settee&offset=${whole.total}`)).body;
    expect(past).toMatchObject({ total: whole.total, results: [] });
  });

  it("narrows by system, zone and hull", async () => {
    const electrical = (await api("q=battery&system=electrical")).body;
    expect(electrical.total).toBeGreaterThan(0);
    for (const r of electrical.results) {
      expect(r.type).toBe("writeup");
      expect(r.systems).toContain("electrical");
    }
    const zone = (await api("q=battery&zone=starboard-settee&hull=mk1")).body;
    expect(zone.results.map((r: any) => r.url)).toContain("/writeups/group-27-battery-under-starboard-settee");
    expect(zone.results.map((r: any) => r.url)).not.toContain("/writeups/correcting-starboard-list-second-battery-mk2");
  });

  it("says which parameter is wrong, with status 400", async () => {
    const cases: [string, string][] = [
      ["", "q"],
      ["q=", "q"],
      [`q=${"a".repeat(201)}`, "q"],
      ["q=battery&limit=0", "limit"],
      ["q=battery&limit=101", "limit"],
      ["q=battery&limit=ten", "limit"],
      ["q=battery&offset=-1", "offset"],
      ["q=battery&hull=613", "hull"],
      ["q=battery&hull=mk3", "hull"],
      ["q=battery&hull=200-613", "hull"], // "300-200" is a range written the other way round, read as 200-300
      ["q=battery&system=sails", "system"],
      ["q=battery&system=<b>", "system"],
      ["q=battery&zone=attic", "zone"],
      ["q=battery&year=last", "year"],
      ["q=battery&type=boat", "type"],
      ["q=battery&fit=13x7", "fit"],
      ["q=battery&fit=13x7x9&unit=ft", "unit"],
      ["q=battery&measured=maybe", "measured"],
    ];
    for (const [query, parameter] of cases) {
      const { status, body } = await api(query);
      expect({ query, status, parameter: body.parameter }).toEqual({ query, status: 400, parameter });
      expect(body.error).toBe("bad-parameter");
      expect(body.message).toMatch(new RegExp(`^${parameter}: `));
    }
  });

  it("offers a correction when a misspelt query finds little", async () => {
    expect((await api("q=baterry")).body).toMatchObject({ total: 0, suggestion: "battery" });
    expect((await api("q=chianplates")).body.suggestion).toBe("chainplates");
    expect((await api("q=lazzarette%20shelf")).body.suggestion).toBe("lazarette shelf");
    // A word the texts use is never "corrected".
    expect((await api("q=battery")).body.suggestion).toBeNull();
    // A correctly spelled word that no write-up uses is not "corrected" into another word that
    // merely starts the same way (pg_trgm similarity of relocate/related: 4 shared trigrams of 13, 0.31).
    expect((await api("q=relocate%20battery")).body.suggestion).toBeNull();
  });

  it("loosens a query none of whose results has all the words, and says so", async () => {
    const { body } = await api("q=lazarette%20shelf");
    expect(body.matched).toBe("any");
    expect(body.results[0].url).toBe("/spaces/lazarette");
    // With the syntax, the query is kept as typed.
    expect((await api("q=%22lazarette%20shelf%22")).body).toMatchObject({ total: 0, matched: "all" });
  });
});

/** `count` published write-ups "<prefix>-<n>" with `body`, then, if given, one more titled `title` with the same body. */
async function insertJobs(prefix: string, body: string, count: number, slug?: string, title?: string) {
  const author = await authorId();
  await t.db.execute(sql`
    insert into writeups (slug, title, summary, body_text, status, author_id, published_at)
    select ${prefix} || '-' || g, 'Job ' || g, 'A job.', ${body}, 'published', ${author}, '2024-01-01'
      from generate_series(1, ${count}::int) g`);
  if (slug && title) {
    await t.db.execute(sql`
      insert into writeups (slug, title, summary, body_text, status, author_id, published_at)
      values (${slug}, ${title}, 'A job.', ${body}, 'published', ${author}, '2024-01-01')`);
  }
}

describe("who a result is credited to", () => {
  it("shows each write-up's author as they asked to be credited (content-seed/members.yaml), never their full name instead", async () => {
    const members = YAML.parse(fs.readFileSync(path.join(SEED_DIR, "members.yaml"), "utf8")) as { email: string; credit?: string; displayName: string }[];
    const answer = await search(t.db, req("battery"));
    const writeups = answer.results.filter((r) => r.detail.type === "writeup");
    expect(writeups.length).toBeGreaterThan(1);
    for (const r of writeups) {
      const [row] = (await t.db.execute<{ email: string }>(sql`
        select u.email from writeups w join users u on u.id = w.author_id where w.id = ${r.id}`)).rows;
      const member = members.find((m) => m.email === row.email)!;
      expect({ writeup: r.slug, author: r.detail.type === "writeup" ? r.detail.author : "" }).toEqual({ writeup: r.slug, author: member.credit ?? member.displayName });
    }
  });
});

describe("a search that matches more than it reads (docs/decisions/0008)", () => {
  it("counts up to MATCH_CAP of a kind, says 'more than', ranks a title match it reads through the title index, and offers the filters without counts", async () => {
    // MATCH_CAP + 20 write-ups with a word of their own in the body; the last one written also has it in its title.
    await insertJobs("gunwale", "The quillwort gasket was replaced.", MATCH_CAP + 19, "quillwort-title", "Quillwort gasket renewed");
    const { body } = await api("q=quillwort&limit=5");
    expect(body).toMatchObject({ total: MATCH_CAP, totalCapped: true });
    expect(body.results).toHaveLength(5);
    expect(body.results[0].url).toBe("/writeups/quillwort-title");
    const facets = await searchFacets(t.db, req("quillwort"), hullChoices([], null));
    expect(facets.counted).toBe(false);
    expect(facets.systems.length).toBeGreaterThan(0);
    // Narrowed below the cap, the total is exact again.
    const narrowed = (await api("q=quillwort%20renewed")).body;
    expect(narrowed).toMatchObject({ total: 1, totalCapped: false });
    await t.db.execute(sql`delete from writeups where slug like 'gunwale-%' or slug = 'quillwort-title'`);
  });

  it("reads its matches through the index when the table's first rows hold too few of them, with the same answer", async () => {
    // The first rows a search tries hold none of the matches (app/models/search.server.ts, PROBE_ROWS).
    await insertJobs("filler", "The hatch seal was replaced.", 1200);
    await insertJobs("sedgewick", "The sedgewick fitting was replaced.", MATCH_CAP + 19, "sedgewick-title", "Sedgewick fitting renewed");
    const { body } = await api("q=sedgewick&limit=5");
    expect(body).toMatchObject({ total: MATCH_CAP, totalCapped: true });
    expect(body.results[0].url).toBe("/writeups/sedgewick-title");
    // A word of every filler row: the first rows hold enough of its matches.
    const broad = (await api("q=hatch%20seal&limit=5")).body;
    expect(broad).toMatchObject({ total: MATCH_CAP, totalCapped: true });
    expect(broad.results).toHaveLength(5);
    // Below the cap, every match is counted, wherever it lies.
    expect((await api("q=sedgewick%20renewed")).body).toMatchObject({ total: 1, totalCapped: false });
    await t.db.execute(sql`delete from writeups where slug like 'filler-%' or slug like 'sedgewick-%'`);
  });

  it("reads the same matches, in the same order, whether it finds them in the table's first rows or through the index", async () => {
    // One job in five has the word: too few in the first PROBE_FIRST rows to stop there, enough
    // to read on through PROBE_ROWS (app/models/search.server.ts). A filter that keeps every
    // write-up (all hulls) sends the same words through the index instead.
    const author = await authorId();
    await t.db.execute(sql`
      insert into writeups (slug, title, summary, body_text, status, author_id, published_at)
      select 'marline-' || g, 'Job ' || g, 'A job.',
             case when g % 5 = 0 then 'The marlinspike hitch held the fender.' else 'The fender was moved.' end,
             'published', ${author}, '2024-01-01'
        from generate_series(1, 1200) g`);
    const [first] = (await t.db.execute<{ n: number }>(sql`
      select count(*)::int as n from (select * from writeups limit 250) w
       where w.status = 'published' and w.search @@ to_tsquery('english', 'marlinspike')`)).rows;
    expect(first.n).toBeGreaterThanOrEqual(25);
    expect(first.n).toBeLessThanOrEqual(MATCH_CAP);
    const probed = (await api("q=marlinspike&limit=50")).body;
    const indexed = (await api("q=marlinspike&limit=50&hull=1-612")).body;
    expect(probed).toMatchObject({ total: MATCH_CAP, totalCapped: true });
    expect(probed.results).toHaveLength(50);
    expect(probed.results.map((r: any) => r.url)).toEqual(indexed.results.map((r: any) => r.url));
    await t.db.execute(sql`delete from writeups where slug like 'marline-%'`);
  });

  it("makes the snippet of a long write-up from around the first word found, far into its body", async () => {
    const author = await authorId();
    const filler = "The hull was sanded, faired and painted again before launch. ".repeat(60);
    await t.db.execute(sql`
      insert into writeups (slug, title, summary, body_text, status, author_id, published_at)
      values ('long-body', 'A long job', 'Sanding.', ${`${filler}Then the Quillback cleat was bedded in butyl. ${filler}`}, 'published', ${author}, now())`);
    const { body } = await api("q=quillback%20cleat");
    const r = body.results.find((x: any) => x.url === "/writeups/long-body");
    expect(r.snippet).toContain("<mark>Quillback</mark> <mark>cleat</mark>");
    expect(r.snippet.length).toBeLessThan(600);
    await t.db.execute(sql`delete from writeups where slug = 'long-body'`);
  });

  it("keeps a write-up's filter words with its tags, and narrows by them", async () => {
    const [w] = (await t.db.execute<{ id: number; search_filters: string[] }>(sql`
      select id, search_filters from writeups where slug = 'group-27-battery-under-starboard-settee'`)).rows;
    expect(w.search_filters).toContain("zone:starboard-settee");
    expect(w.search_filters.some((f) => f.startsWith("system:"))).toBe(true);
    await t.db.execute(sql`insert into writeup_zones (writeup_id, zone_slug) values (${w.id}, 'lazarette')`);
    const [after] = (await t.db.execute<{ search_filters: string[] }>(sql`select search_filters from writeups where id = ${w.id}`)).rows;
    expect(after.search_filters).toContain("zone:lazarette");
    expect(await slugs("battery", { zone: "lazarette" })).toContain("writeup:group-27-battery-under-starboard-settee");
    await t.db.execute(sql`delete from writeup_zones where writeup_id = ${w.id} and zone_slug = 'lazarette'`);
    expect(await slugs("battery", { zone: "lazarette" })).not.toContain("writeup:group-27-battery-under-starboard-settee");
  });
});

describe("filters, facets and numbers", () => {
  it("counts each choice as the results it would give", async () => {
    const base = req("battery");
    const facets = await searchFacets(t.db, base, hullChoices([147], null));
    expect(facets.counted).toBe(true);
    const total = (await search(t.db, base)).total;
    expect(facets.kinds.reduce((n, k) => n + k.count, 0)).toBe(total);
    for (const s of facets.systems) expect({ s: s.value, n: (await search(t.db, req("battery", { system: s.value }))).total }).toEqual({ s: s.value, n: s.count });
    for (const z of facets.zones) expect({ z: z.value, n: (await search(t.db, req("battery", { zone: z.value }))).total }).toEqual({ z: z.value, n: z.count });
    for (const h of facets.hulls) expect({ h: h.value, n: (await search(t.db, req("battery", { hull: { from: h.from, to: h.to, text: h.value } }))).total }).toEqual({ h: h.value, n: h.count });
    for (const y of facets.years) expect((await search(t.db, req("battery", { year: Number(y.value) }))).total).toBe(y.count);
    expect((await search(t.db, req("battery", { measured: true }))).total).toBe(facets.measured);
    // With a system chosen, the other facets count within it; the system facet still offers the others.
    const within = await searchFacets(t.db, req("battery", { system: "electrical" }), hullChoices([], null));
    expect(within.kinds.reduce((n, k) => n + k.count, 0)).toBe((await search(t.db, req("battery", { system: "electrical" }))).total);
    expect(within.systems.map((s) => s.value)).toEqual(facets.systems.map((s) => s.value));
  });

  it("reads sizes among the words as the fit check's 'must fit', and joins them with the words", async () => {
    const parsed = parseSearchParams(new URLSearchParams({ q: "what fits 13 x 6 13/16 x 9 7/16 in, upright?" }), "api");
    if (!parsed.ok) throw new Error(parsed.message);
    expect(parsed.request.q).toBe("");
    const answer = await search(t.db, parsed.request);
    // BCI group size chart: group 31 is 13 x 6 13/16 x 9 7/16 in. The same question to the fit check:
    const fits = (await findFittingSpaces(t.db, {
      item: parsed.request.filters.fit!.box, orientation: "upright", clearanceMm: 0, count: 1, hull: null, limit: 1000,
    })).filter((h) => h.verdict === "fits");
    expect(fits.length).toBeGreaterThan(2);
    const spaces = answer.results.filter((r) => r.type === "space");
    expect(spaces.map((r) => r.slug)).toEqual(fits.slice(0, spaces.length).map((h) => h.slug));
    expect(answer.results.some((r) => r.type === "item")).toBe(false);
    // With words: only what matches both.
    const withWords = await search(t.db, { ...parsed.request, q: "settee" });
    expect(withWords.total).toBeGreaterThan(0);
    expect(withWords.total).toBeLessThan((await search(t.db, req("settee"))).total);
    for (const r of withWords.results.filter((x) => x.type === "space")) expect(fits.map((h) => h.slug)).toContain(r.slug);
  });
});

describe("type-ahead and the vocabulary", () => {
  it("suggests titles, zones, spaces and items for the words typed so far", async () => {
    const response = await apiSuggest({ request: new Request("http://localhost/api/search/suggest?q=group%2027%20batt"), params: {}, context: {} });
    const { suggestions } = (await response.json()) as any;
    expect(suggestions[0]).toEqual({ type: "writeup", label: "Group 27 battery moved under the starboard settee", url: "/writeups/group-27-battery-under-starboard-settee" });
    const lazar = await suggest(t.db, "lazar");
    expect(lazar).toEqual(expect.arrayContaining([
      { type: "zone", label: "Lazarette", url: "/search?zone=lazarette" },
      { type: "space", label: "Lazarette (stern locker)", url: "/spaces/lazarette" },
    ]));
    // The class's other words, as the search has them: a settee's and a berth's titles for "bunk".
    for (const typed of ["bunk", "bunk "]) {
      const labels = (await suggest(t.db, typed)).map((x) => x.label);
      expect({ typed, labels }).toEqual({ typed, labels: expect.arrayContaining([
        "Trailer bunks rebuilt, keel pad reset, and new lights with a proper ground",
        "Group 27 battery moved under the starboard settee",
        "Correcting a starboard list by moving the second battery to the port berth (Mk II)",
      ]) });
    }
    expect(await suggest(t.db, "l")).toEqual([]);
    expect(await suggest(t.db, "the ")).toEqual([]);
    expect((await suggest(t.db, "zzqx")).length).toBe(0);
  });

  it("keeps the tags of a write-up and the vocabulary up to date as write-ups change", async () => {
    const [w] = (await t.db.execute<{ id: number; search_tags: string }>(sql`select id, search_tags from writeups where slug = 'trailer-bunks-keel-pad-and-lights'`)).rows;
    expect(w.search_tags).toBe("Trailer");
    await t.db.execute(sql`insert into writeup_zones (writeup_id, zone_slug) values (${w.id}, 'lazarette')`);
    expect(await slugs("trailer lazarette")).toContain("writeup:trailer-bunks-keel-pad-and-lights");
    await t.db.execute(sql`update zones set name = 'Aft locker (lazarette)' where slug = 'lazarette'`);
    const [renamed] = (await t.db.execute<{ search_tags: string }>(sql`select search_tags from writeups where id = ${w.id}`)).rows;
    expect(renamed.search_tags).toBe("Trailer Aft locker (lazarette)");
    await t.db.execute(sql`delete from writeup_zones where writeup_id = ${w.id} and zone_slug = 'lazarette'`);
    await t.db.execute(sql`update zones set name = 'Lazarette' where slug = 'lazarette'`);

    // A word enters the vocabulary when a write-up using it is published, and leaves when it is withdrawn.
    const count = async (word: string) =>
      (await t.db.execute<{ n: number }>(sql`select coalesce((select documents from search_vocabulary where word = ${word}), 0) as n`)).rows[0].n;
    expect(await count("quillbrace")).toBe(0);
    expect((await api("q=quilbrace")).body.suggestion).toBeNull();
    await t.db.execute(sql`update writeups set body_text = body_text || ' A quillbrace holds the lower gudgeon.' where id = ${w.id}`);
    expect(await count("quillbrace")).toBe(1);
    expect((await api("q=quilbrace")).body.suggestion).toBe("quillbrace");
    await t.db.execute(sql`update writeups set status = 'withdrawn' where id = ${w.id}`);
    expect(await count("quillbrace")).toBe(0);
    await t.db.execute(sql`update writeups set status = 'published' where id = ${w.id}`);
    // Counting matches a count from scratch.
    const drift = await t.db.execute<{ word: string }>(sql`
      with fresh as (
        select w.word, count(*)::int as documents
          from (select search_vocabulary_text('writeups', to_jsonb(x)) as body from writeups x
                union all select search_vocabulary_text('spaces', to_jsonb(x)) from spaces x
                union all select search_vocabulary_text('items', to_jsonb(x)) from items x) d
          cross join lateral search_words(d.body) as w(word)
         where d.body is not null group by w.word)
      select coalesce(f.word, v.word) as word from fresh f full join search_vocabulary v on v.word = f.word
       where f.documents is distinct from v.documents`);
    expect(drift.rows).toEqual([]);
  });
});

// ---------------------------------------------------------------------------------------------

/** The hull range a seed write-up's front matter says it applies to ("all", "mk1", "120-298"). */
function appliesTo(slug: string): string {
  const text = fs.readFileSync(path.join(SEED_DIR, "writeups", `${slug}.md`), "utf8");
  return String(YAML.parse(text.split(/^---\s*$/m)[1]).appliesTo ?? "all");
}

async function authorId(): Promise<number> {
  return (await t.db.execute<{ id: number }>(sql`select id from users order by id limit 1`)).rows[0].id;
}

async function hostileWriteup(text: string) {
  const author = await authorId();
  await t.db.execute(sql`
    insert into writeups (slug, title, summary, body_markdown, body_text, status, author_id, published_at)
    values ('hostile-hatch', ${text}, ${text}, ${text}, ${text}, 'published', ${author}, now())
    on conflict (slug) do nothing`);
}

/** Two published write-ups with the same words; returns their ids. */
async function twinWriteups(): Promise<number[]> {
  const author = await authorId();
  const ids: number[] = [];
  for (const slug of ["quadrant-one", "quadrant-two"]) {
    const r = await t.db.execute<{ id: number }>(sql`
      insert into writeups (slug, title, summary, body_text, status, author_id, published_at)
      values (${slug}, 'Quadrant tiller sheave', 'A new sheave.', 'The quadrant tiller sheave was worn.', 'published', ${author}, '2025-01-01')
      returning id`);
    ids.push(r.rows[0].id);
  }
  return ids;
}
