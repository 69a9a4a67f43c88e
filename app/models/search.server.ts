// One search over published write-ups, spaces and catalogue items, on PostgreSQL full-text
// search: the weighted `search` columns (app/db/schema.ts), the class's synonyms added to the
// query by search_expand() (drizzle/*_search_vocabulary.sql), ranking with ts_rank_cd and a mild
// boost for write-ups that other boats have done too, snippets with ts_headline for the rows
// shown only; facets with counts, type-ahead suggestions and "did you mean".
// Every function takes the db (or a transaction) first.
import { createHash } from "node:crypto";
import { sql, type SQL } from "drizzle-orm";
import { PgDialect } from "drizzle-orm/pg-core";
import type pg from "pg";
import { MAX_LIMIT } from "~/domain/fit-search";
import { describeHullRange, LAST_HULL, VARIANTS, type HullRange } from "~/domain/hulls";
import {
  anyOfWords, FEW_RESULTS, hasSearchWords, HIT_END, HIT_START, MATCH_CAP, queryWords, TITLE_CANDIDATES, wordStarts, readHeadline, replaceWords, typeaheadWords,
  type SearchFilters, type SearchKind, type SearchRequest, type Snippet,
} from "~/domain/search";
import type { Box } from "~/domain/units";
import { findFittingSpaces, type DbOrTx } from "./spaces.server";

/** The text search configuration of every `search` column (and so of every query). */
const CONFIG = sql.raw("'english'::regconfig");

/**
 * ts_rank_cd's weights for D, C, B, A (body C, tags and summary B, title A). PostgreSQL's defaults
 * are {0.1, 0.2, 0.4, 1.0}; the body counts half of that here, so that a word in a title
 * outranks the same word only in the body of another write-up (on the demo class, for every such
 * pair, by a factor of 1.6 or more) even when the body repeats it.
 */
const WEIGHTS = sql.raw("'{0.05, 0.1, 0.4, 1.0}'::float4[]");
/** Normalisation 1: the rank divided by 1 + the logarithm of the document's length. */
const NORMALISATION = sql.raw("1");

/**
 * The mild boost for a write-up that other boats have done too: 1 + ln(1 + n) / 10, so 1 boat
 * adds 7 %, 10 boats 24 %, 100 boats 46 %: it orders near-equal matches, never a weak match
 * above a strong one. n counts at most the class's hulls, so the boost is at most MAX_BOOST.
 */
export function doneTooBoost(n: number): number {
  return 1 + Math.log(1 + Math.min(n, LAST_HULL)) / 10;
}
export const MAX_BOOST = doneTooBoost(LAST_HULL);
const DONE_TOO_BOOST = (writeupId: SQL) =>
  sql`(1 + ln(1 + least(${LAST_HULL}::int, (select count(*) from done_too d where d.writeup_id = ${writeupId}))) / 10)`;

const HEADLINE_OPTIONS = `StartSel=${HIT_START}, StopSel=${HIT_END}, MaxFragments=2, MaxWords=28, MinWords=12, ShortWord=3, FragmentDelimiter=" … "`;

/**
 * The part of a document's text that a snippet is made from: ts_headline parses (and stems)
 * every word it is given, which for 20 long write-ups costs more than the rest of the search, so
 * it gets HEADLINE_WINDOW characters, from a little before the first place where the text has
 * the beginning of one of the words typed (`starts`, lower case and capitalised; the text's start
 * when none is there), cut at whole words. ts_headline then marks the real matches in it.
 */
const HEADLINE_WINDOW = 400;
const HEADLINE_LEAD = 100;
const headlineWindow = (text: SQL, starts: string[]) => {
  // One parameter for any number of words, so that the statement's text (and its prepared plan)
  // does not change with how many words were typed.
  const first = sql`(select min(nullif(strpos(x.t, s), 0)) from unnest(${arrayLiteral(starts)}::text[]) s)`;
  return sql`(
  select case when length(t) <= ${HEADLINE_WINDOW}::int then t
              else regexp_replace(regexp_replace(substr(t, a, ${HEADLINE_WINDOW}::int), '\\s\\S*$', ''),
                                  case when a > 1 then '^\\S*\\s' else '^' end, '') end
    from (select x.t, greatest(1, coalesce(${first}, 1) - ${HEADLINE_LEAD}::int) as a
            from (select ${text} as t offset 0) x offset 0) y)`;
// (OFFSET 0 keeps each subquery whole: flattened, PostgreSQL would read the text back from its
// TOAST table once for every place that uses it, a dozen times a row.)
};


/**
 * A document's text with the hit markers removed, so only the database's markers mark hits.
 * Applied to the part shown only: translate() takes some 25 µs per kilobyte of text.
 */
const unmarked = (text: SQL) => sql`translate(${text}, ${HIT_START + HIT_END}, '')`;

export type SearchResult = {
  type: SearchKind;
  id: number;
  slug: string;
  title: string;
  url: string;
  snippet: Snippet;
  systems: { slug: string; name: string }[];
  score: number;
  /** What the page shows beside the title. */
  detail: WriteupDetail | SpaceDetail | ItemDetail;
};

export type WriteupDetail = {
  type: "writeup";
  author: string;
  hullNumber: number | null;
  publishedAt: string | null;
  hulls: HullRange;
  doneToo: number;
};
export type SpaceDetail = { type: "space"; zone: string; hulls: HullRange; measurements: number };
export type ItemDetail = { type: "item"; box: Box; upright: boolean; battery: boolean };

export type SearchAnswer = {
  /** How many results; with `capped`, a lower bound: more than this many match (MATCH_CAP). */
  total: number;
  /** More results match than were read and counted: narrow the search to see them all. */
  capped: boolean;
  results: SearchResult[];
  /** A query with misspelt words replaced, when the query finds little and the replacement finds more. */
  suggestion: string | null;
  /** "all": results have all the words; "any": none had all, these have some; "none": no words were asked. */
  matched: "all" | "any" | "none";
  /** The query as PostgreSQL ran it, with the synonyms added (empty: no words). */
  tsquery: string;
  /** The class's other words for what was asked, also searched for ("berth", "bunk" for "settee"). */
  synonyms: string[];
  /** The words the results match (the query, or its words joined by "or" when loosened). */
  words: string;
  /** Only common words ("the", "under"): nothing to search for. */
  onlyCommonWords: boolean;
};

// ---------------------------------------------------------------------------------------------
// The query.

/** The words as a tsquery with the class's synonyms: websearch_to_tsquery, then search_expand. */
export function tsqueryOf(words: string): SQL {
  return sql`search_expand(websearch_to_tsquery(${CONFIG}, ${words}))`;
}

type Branch = { kind: SearchKind; conditions: SQL[] };

/** Any list of strings as the text of a PostgreSQL array (each element quoted, `"` and `\\` escaped). */
const arrayLiteral = (list: string[]) => `{${list.map((x) => `"${x.replace(/["\\]/g, "\\$&")}"`).join(",")}}`;

/** A list of words (slugs) as a PostgreSQL text[]. */
const textArray = (list: string[]) => sql`${arrayLiteral(list)}::text[]`;

/** The filters as SQL, per kind; a kind a filter cannot apply to is left out. */
function branches(f: SearchFilters, fitSpaceIds: number[] | null): Branch[] {
  const ids = fitSpaceIds === null ? null : sql`${`{${fitSpaceIds.join(",")}}`}::int[]`;
  const w: SQL[] = [sql`w.status = 'published'`];
  // System and zone are filter words of the write-up (writeups.search_filters), the second column
  // of the words' GIN index, so only write-ups with both are read instead of every match.
  const tags = [...(f.system ? [`system:${f.system}`] : []), ...(f.zone ? [`zone:${f.zone}`] : [])];
  if (tags.length) w.push(sql`w.search_filters @> ${textArray(tags)}`);
  if (f.hull) w.push(sql`w.hull_from <= ${f.hull.to}::int and w.hull_to >= ${f.hull.from}::int`);
  if (f.measured) w.push(sql`exists (select 1 from writeup_spaces x where x.writeup_id = w.id)`);
  if (f.year) w.push(sql`w.published_at >= make_timestamptz(${f.year}::int, 1, 1, 0, 0, 0, 'UTC') and w.published_at < make_timestamptz(${f.year + 1}::int, 1, 1, 0, 0, 0, 'UTC')`);
  if (ids) w.push(sql`exists (select 1 from writeup_spaces x where x.writeup_id = w.id and x.space_id = any(${ids}))`);

  const sp: SQL[] = [];
  if (f.zone) sp.push(sql`sp.zone_slug = ${f.zone}`);
  if (f.hull) sp.push(sql`sp.hull_from <= ${f.hull.to}::int and sp.hull_to >= ${f.hull.from}::int`);
  if (f.measured) sp.push(sql`exists (select 1 from space_measurements m where m.space_id = sp.id)`);
  if (ids) sp.push(sql`sp.id = any(${ids})`);

  const out: Branch[] = [{ kind: "writeup", conditions: w }];
  // Spaces have no system and no date; catalogue items no system, zone, hull range, measurement or date.
  if (!f.system && !f.year) out.push({ kind: "space", conditions: sp });
  if (!f.system && !f.zone && !f.measured && !f.year && !ids) out.push({ kind: "item", conditions: [] });
  return out.filter((b) => f.kind === null || b.kind === f.kind);
}

/**
 * A catalogue item's rank counts ITEM_WEIGHT of a write-up's or a space's. An item is a size to
 * check against, not an owner's account of a job, and its few words rank high under the length
 * normalisation ("battery" put seven battery sizes above the second write-up about moving one);
 * an item whose name matches much better than any write-up still comes first.
 */
export const ITEM_WEIGHT = 0.6;

const TABLE: Record<SearchKind, { from: SQL; alias: SQL; dated: SQL; boost: SQL | null; weight: number }> = {
  writeup: { from: sql.raw("writeups w"), alias: sql.raw("w"), dated: sql.raw("w.published_at"), boost: DONE_TOO_BOOST(sql.raw("w.id")), weight: 1 },
  space: { from: sql.raw("spaces sp"), alias: sql.raw("sp"), dated: sql.raw("null::timestamptz"), boost: null, weight: 1 },
  item: { from: sql.raw("items i"), alias: sql.raw("i"), dated: sql.raw("null::timestamptz"), boost: null, weight: ITEM_WEIGHT },
};


/**
 * The common table expressions of a search, per kind: `m_<kind>`, the matches of the words (if
 * any) and the filters, each with its raw score (before the done-too boost) and whether the
 * boost applies; `c_<kind>`, the first MATCH_CAP + 1 of them. A materialized CTE is read only as
 * far as its readers ask, so PostgreSQL stops reading the index's matches there. Then `hits`, the
 * rows to rank, and `totals`. Without words, a box to fit orders the spaces snuggest first (the
 * fit check's order), each write-up just after the snuggest space it used; otherwise write-ups
 * more boats have done first.
 */
function hitsSql(words: boolean, list: Branch[], fitIds: number[] | null): SQL {
  const ids = fitIds === null ? null : sql`${`{${fitIds.join(",")}}`}::int[]`;
  if (!list.length) {
    return sql`hits as (select null::text as type, null::int as id, null::float8 as raw, false as boosted, null::timestamptz as dated where false),
      totals as (select 0::int as total, false as capped)`;
  }
  const ctes: SQL[] = [];
  const hits: SQL[] = [];
  const counts: SQL[] = [];
  const cap = sql.raw(String(MATCH_CAP));
  for (const b of list) {
    const t = TABLE[b.kind];
    const [m, c] = [sql.raw(`m_${b.kind}`), sql.raw(`c_${b.kind}`)];
    const conditions = [...b.conditions];
    let score: SQL = sql`0::float8`;
    let boosted = false;
    if (words) {
      conditions.push(sql`${t.alias}.search @@ (select query from q)`);
      score = sql`ts_rank_cd(${WEIGHTS}, ${t.alias}.search, (select query from q), ${NORMALISATION})`;
      if (t.weight !== 1) score = sql`${score} * ${sql.raw(String(t.weight))}`;
      boosted = t.boost !== null;
    } else if (ids && b.kind === "space") {
      score = sql`1.0 / array_position(${ids}, sp.id)`;
    } else if (ids && b.kind === "writeup") {
      score = sql`0.999 * (select max(1.0 / array_position(${ids}, x.space_id)) from writeup_spaces x
                            where x.writeup_id = w.id and x.space_id = any(${ids}))`;
    } else if (t.boost) {
      score = sql`(${t.boost} - 1)`;
    }
    const select = (where: SQL[], from = t.from) =>
      sql`select ${t.alias}.id, ${t.dated} as dated, (${score})::float8 as raw, ${sql.raw(boosted ? "true" : "false")} as boosted
            from ${from} where ${where.length ? sql.join(where, sql` and `) : sql`true`}`;
    ctes.push(sql`${m} as materialized (${select(conditions)})`);
    if (words && b.kind === "writeup" && b.conditions.length === 1) {
      // A word that many write-ups use: the GIN index must list every one of its matches before
      // the first is read (4 to 8 ms at 10,000 to 30,000 matches), while the first PROBE_ROWS rows
      // of the table, read in the same order as the index's matches, already hold MATCH_CAP + 1 of
      // them. So those rows are tried first; only when they hold too few is the index used. The
      // matches read are the same either way. The first PROBE_FIRST rows say whether the rest are
      // worth trying (at least PROBE_DENSE matches in them); a rarer word goes to the index at
      // once. Not with a filter (system, zone, hull ...), which leaves too few matches in so few
      // rows: the index has the filter words too.
      const rows = (offset: number, limit: number) => sql.raw(`(select * from writeups offset ${offset} limit ${limit}) w`);
      ctes.push(sql`p1_writeup as materialized (${select(conditions, rows(0, PROBE_FIRST))} limit ${cap} + 1)`);
      ctes.push(sql`p2_writeup as materialized (
        select * from (${select(conditions, rows(PROBE_FIRST, PROBE_ROWS - PROBE_FIRST))} limit ${cap} + 1) x
         where (select count(*) from p1_writeup) between ${PROBE_DENSE} and ${cap})`);
      ctes.push(sql`p_writeup as materialized (select * from p1_writeup union all select * from p2_writeup)`);
      ctes.push(sql`${c} as materialized (
        (select * from p_writeup where (select count(*) from p_writeup) > ${cap} limit ${cap} + 1)
        union all
        (select * from ${m} where (select count(*) from p_writeup) <= ${cap} limit ${cap} + 1))`);
    } else {
      ctes.push(sql`${c} as materialized (select * from ${m} limit ${cap} + 1)`);
    }
    hits.push(sql`select ${b.kind}::text as type, id, raw, boosted, dated from (select * from ${c} limit ${cap}) ${sql.raw(`h_${b.kind}`)}`);
    counts.push(sql`(select count(*) from ${c})`);
    if (words && b.kind === "writeup") {
      // When the matches are more than the cap: write-ups with the words in their title too
      // (read through the title index, and only then).
      // (The titles are read in a subquery of their own, so that PostgreSQL cannot take the
      // words' index for them instead: that lists every match and reads each to test its title.)
      const titled = sql`(select * from writeups w
                            where w.status = 'published' and to_tsvector(${CONFIG}, w.title) @@ (select query from q) offset 0) w`;
      ctes.push(sql`t_writeup as materialized (${select(conditions, titled)})`);
      hits.push(sql`select 'writeup'::text, id, raw, boosted, dated
                      from (select * from t_writeup where (select count(*) from c_writeup) > ${cap} limit ${TITLE_CANDIDATES}) t
                     where t.id not in (select id from (select id from c_writeup limit ${cap}) c)`);
    }
  }
  return sql`${sql.join(ctes, sql`, `)},
    hits as materialized (${sql.join(hits, sql` union all `)}),
    totals as (select ${sql.join(counts.map((n) => sql`least(${n}, ${cap})`), sql` + `)} as total,
                      ${sql.join(counts.map((n) => sql`${n} > ${cap}`), sql` or `)} as capped)`;
}

/** How near (pg_trgm similarity) a word of the vocabulary must be to a word typed to be suggested for it. */
const SUGGESTION_SIMILARITY = 0.4;

/** How much of a text's beginning a snippet without the words shows (characters, cut at a word). */
const LEAD_CHARS = 280;

/** How many rows of the write-ups table a search with words reads before it turns to the index. */
const PROBE_ROWS = 1000;
/** ... of which the first PROBE_FIRST must hold PROBE_DENSE matches for the rest to be read (10 %). */
const PROBE_FIRST = 250;
const PROBE_DENSE = 25;

const dialect = new PgDialect();

/**
 * Runs a statement as a prepared statement of its connection, named after its text: PostgreSQL
 * parses and plans it once per connection, not on every search (the words, filters' values,
 * limit and offset are its parameters; the text differs only with the set of filters used).
 * Inside a transaction (no pool at hand) it is run as an ordinary statement.
 */
async function prepared<T>(db: DbOrTx, query: SQL): Promise<T[]> {
  const pool = (db as { $client?: pg.Pool }).$client;
  if (!pool || typeof pool.query !== "function") return (await db.execute(query)).rows as T[];
  const { sql: text, params } = dialect.sqlToQuery(query);
  const name = `search_${createHash("sha1").update(text).digest("hex").slice(0, 20)}`;
  return (await pool.query({ name, text, values: params as unknown[] })).rows as T[];
}

/** The spaces that take the box outright (the fit check's candidate query and exact check). */
async function fittingSpaceIds(db: DbOrTx, f: SearchFilters): Promise<number[] | null> {
  if (!f.fit) return null;
  const hits = await findFittingSpaces(db, {
    item: f.fit.box, orientation: f.fit.orientation, clearanceMm: 0, count: 1, hull: null, limit: MAX_LIMIT,
  });
  return hits.filter((h) => h.verdict === "fits").map((h) => h.spaceId);
}

type Row = {
  total: number; capped: boolean; parsed: string; expanded: string; synonyms: string[];
  type: SearchKind | null; id: number | null; score: number | null; info: Info | null;
};
type Info = { lead: string | null } & (
  | { slug: string; title: string; headline: string | null; author: string; hull_number: number | null; published_at: string | null; hull_from: number; hull_to: number; done_too: number; systems: { slug: string; name: string }[] }
  | { slug: string; title: string; headline: string | null; zone: string; hull_from: number; hull_to: number; measurements: number }
  | { slug: string; title: string; headline: string | null; kind: string; length_mm: number; width_mm: number; height_mm: number; orientation: string });

type Page = { rows: SearchResult[]; total: number; capped: boolean; analysis: QueryAnalysis | null };

/**
 * One statement: the words parsed and expanded with the synonyms, the matches (at most MATCH_CAP
 * of each kind, see hitsSql), their ranks, the done-too boost for those that could reach the page
 * (their rank times MAX_BOOST at least the rank at the page's last place), and, for the rows
 * shown only, their titles, details and snippets (ts_headline).
 */
async function page(db: DbOrTx, words: string | null, f: SearchFilters, fitIds: number[] | null, limit: number, offset: number): Promise<Page> {
  const hits = hitsSql(words !== null, branches(f, fitIds), fitIds);
  const starts = words === null ? [] : wordStarts(words);
  const headline = (text: SQL, fallback: SQL) =>
    words === null
      ? unmarked(sql`left(${fallback}, 280)`)
      : sql`ts_headline(${CONFIG}, ${unmarked(headlineWindow(text, starts))}, (select query from q), ${HEADLINE_OPTIONS})`;
  // The text's beginning, cut at a word: the snippet when the words are not in the text shown
  // (only in the title, or through a synonym far into the body), where ts_headline gives its
  // first MinWords words, cut mid-phrase.
  const lead = (text: SQL) =>
    words === null
      ? sql`null::text`
      : sql`(select case when length(x) <= ${LEAD_CHARS}::int then x
                         else regexp_replace(left(x, ${LEAD_CHARS + 1}::int), '\s+\S*$', '') || ' …' end
               from (select ${unmarked(sql`left(${text}, ${LEAD_CHARS + 20}::int)`)} as x) l)`;
  const analysis = words === null
    ? sql`select ''::text as parsed, ''::text as expanded, '{}'::text[] as synonyms`
    : sql`select p.parsed::text as parsed, e.query::text as expanded,
                 coalesce((select array_agg(distinct s.term order by s.term)
                             from search_synonym_rules r join search_synonyms s on s.group_name = r.group_name, marked m
                            where strpos(m.marked, r.placeholder::text) > 0), '{}') as synonyms
            from p, e`;
  const rows = await prepared<Row>(db, sql`
    with p as materialized (select ${words === null ? sql`null::tsquery` : sql`websearch_to_tsquery(${CONFIG}, ${words})`} as parsed),
    e as materialized (select search_expand(p.parsed) as query from p),
    marked as (select ts_rewrite(p.parsed, 'SELECT target, placeholder FROM search_synonym_rules ORDER BY n')::text as marked from p),
    -- Only common words ("the", "under") leave nothing to search for: no row, so nothing matches.
    q as materialized (select query from e where numnode(query) > 0),
    ${hits},
    cut as (select raw from hits order by raw desc offset ${offset + Math.max(limit, 1) - 1} limit 1),
    scored as (
      select type, id, dated,
             case when boosted and raw * ${MAX_BOOST}::float8 >= coalesce((select raw from cut), 0)
                  then raw * ${DONE_TOO_BOOST(sql.raw("hits.id"))}
                  else raw end as score
        from hits
    ),
    shown as (select * from scored order by score desc, dated desc nulls last, type, id limit ${limit} offset ${offset})
    select t.total::int as total, t.capped, a.parsed, a.expanded, a.synonyms, s.type, s.id, s.score,
           coalesce(dw.info, ds.info, di.info) as info
      from totals t
      cross join (${analysis}) a
      left join shown s on true
      left join lateral (
        select json_build_object(
                 'slug', w.slug, 'title', w.title, 'headline', ${headline(sql`w.summary || E'\n' || w.body_text`, sql`w.summary`)},
                 'lead', ${lead(sql`w.summary || E'\n' || w.body_text`)},
                 'author', coalesce(u.credit_as, u.display_name), 'hull_number', b.hull_number, 'published_at', w.published_at,
                 'hull_from', w.hull_from, 'hull_to', w.hull_to,
                 'done_too', (select count(*) from done_too d where d.writeup_id = w.id),
                 'systems', coalesce((select json_agg(json_build_object('slug', sy.slug, 'name', sy.name) order by sy.sort_order, sy.slug)
                                        from writeup_systems ws join systems sy on sy.slug = ws.system_slug
                                       where ws.writeup_id = w.id), '[]'::json)) as info
          from writeups w
          join users u on u.id = w.author_id
          left join boats b on b.id = w.boat_id
         where w.id = case when s.type = 'writeup' then s.id end) dw on true
      left join lateral (
        select json_build_object(
                 'slug', sp.slug, 'title', sp.name, 'headline', ${headline(sql`sp.obstructions`, sql`sp.obstructions`)}, 'lead', ${lead(sql`sp.obstructions`)},
                 'zone', z.name, 'hull_from', sp.hull_from, 'hull_to', sp.hull_to,
                 'measurements', (select count(*) from space_measurements m where m.space_id = sp.id)) as info
          from spaces sp join zones z on z.slug = sp.zone_slug
         where sp.id = case when s.type = 'space' then s.id end) ds on true
      left join lateral (
        select json_build_object(
                 'slug', i.slug, 'title', i.name, 'headline', ${headline(sql`i.note`, sql`i.note`)}, 'lead', ${lead(sql`i.note`)}, 'kind', i.kind,
                 'length_mm', i.length_mm, 'width_mm', i.width_mm, 'height_mm', i.height_mm, 'orientation', i.orientation) as info
          from items i
         where i.id = case when s.type = 'item' then s.id end) di on true
     order by s.score desc, s.dated desc nulls last, s.type, s.id`);
  const first = rows[0];
  const results: SearchResult[] = [];
  for (const x of rows) {
    if (x.type === null || x.id === null || x.info === null) continue;
    const score = Number(x.score);
    const info = x.info;
    const marked = readHeadline(info.headline ?? "");
    const snippet = marked.highlights.length || !info.lead ? marked : readHeadline(info.lead);
    if (x.type === "writeup" && "author" in info) {
      results.push({
        type: "writeup", id: x.id, slug: info.slug, title: info.title, url: `/writeups/${info.slug}`, snippet, systems: info.systems, score,
        detail: {
          type: "writeup", author: info.author, hullNumber: info.hull_number,
          publishedAt: info.published_at ? new Date(info.published_at).toISOString() : null,
          hulls: { from: info.hull_from, to: info.hull_to }, doneToo: Number(info.done_too),
        },
      });
    } else if (x.type === "space" && "zone" in info) {
      results.push({
        type: "space", id: x.id, slug: info.slug, title: info.title, url: `/spaces/${info.slug}`, snippet, systems: [], score,
        detail: { type: "space", zone: info.zone, hulls: { from: info.hull_from, to: info.hull_to }, measurements: Number(info.measurements) },
      });
    } else if (x.type === "item" && "kind" in info) {
      results.push({
        type: "item", id: x.id, slug: info.slug, title: info.title, url: `/items#item-${info.slug}`, snippet, systems: [], score,
        detail: {
          type: "item", box: { length: Number(info.length_mm), width: Number(info.width_mm), height: Number(info.height_mm) },
          upright: info.orientation === "upright", battery: info.kind === "battery-group" || /\bbatter(y|ies)\b/i.test(info.title),
        },
      });
    }
  }
  return {
    rows: results,
    total: first?.total ?? 0,
    capped: first?.capped ?? false,
    analysis: words === null || !first ? null : { parsed: first.parsed, expanded: first.expanded, synonyms: first.synonyms ?? [] },
  };
}

export type QueryAnalysis = {
  /** websearch_to_tsquery of the words (empty: only common words such as "the", "under"). */
  parsed: string;
  /** The same with the class's synonyms added. */
  expanded: string;
  /** The terms of every synonym group the words used ("settee" -> berth, bunk, settee). */
  synonyms: string[];
};

/** What PostgreSQL makes of the words: parsed, expanded, and the synonym groups they touched. */
export async function analyseQuery(db: DbOrTx, words: string): Promise<QueryAnalysis> {
  const r = await db.execute<QueryAnalysis>(sql`
    with p as (select websearch_to_tsquery(${CONFIG}, ${words}) as parsed),
    m as (select ts_rewrite(p.parsed, 'SELECT target, placeholder FROM search_synonym_rules ORDER BY n')::text as marked from p)
    select p.parsed::text as parsed, search_expand(p.parsed)::text as expanded,
           coalesce((select array_agg(distinct s.term order by s.term)
                       from search_synonym_rules r join search_synonyms s on s.group_name = r.group_name, m
                      where strpos(m.marked, r.placeholder::text) > 0), '{}') as synonyms
      from p`);
  return r.rows[0];
}

/**
 * The search: up to `limit` results from `offset`, best first, with the total (at most
 * MATCH_CAP of each kind are read: `capped` then says there are more). A query whose words are
 * not all found anywhere is loosened to any of its words (when it uses no syntax); a query that
 * finds little gets a "did you mean" from the vocabulary. Most searches are one statement.
 */
export async function search(db: DbOrTx, req: SearchRequest): Promise<SearchAnswer> {
  const words = hasSearchWords(req.q) ? req.q : null;
  const fitIds = await fittingSpaceIds(db, req.filters);
  let ranked = await page(db, words, req.filters, fitIds, req.limit, req.offset);
  let analysis = ranked.analysis;
  const onlyCommonWords = analysis !== null && analysis.parsed === "";
  let matched: SearchAnswer["matched"] = words === null || onlyCommonWords ? "none" : "all";
  let used = words;

  let suggestion: string | null = null;
  if (words !== null && !onlyCommonWords && ranked.total < FEW_RESULTS) {
    const loose = ranked.total === 0 ? anyOfWords(words) : null;
    const [better, relaxed] = await Promise.all([
      didYouMean(db, words, req.filters, fitIds, ranked.total),
      loose ? page(db, loose, req.filters, fitIds, req.limit, req.offset) : null,
    ]);
    suggestion = better;
    if (loose && relaxed && relaxed.total > 0) {
      ranked = relaxed;
      used = loose;
      matched = "any";
      analysis = relaxed.analysis;
    }
  }

  const typed = new Set(queryWords(req.q));
  return {
    total: ranked.total,
    capped: ranked.capped,
    results: ranked.rows,
    suggestion,
    matched,
    tsquery: analysis?.expanded ?? "",
    synonyms: (analysis?.synonyms ?? []).filter((t) => !t.toLowerCase().split(/\s+/).every((w) => typed.has(w))),
    words: used ?? "",
    onlyCommonWords,
  };
}

/** How many results the words would give (at most MATCH_CAP of each kind). */
async function countOf(db: DbOrTx, words: string, filters: SearchFilters, fitIds: number[] | null): Promise<number> {
  return (await page(db, words, filters, fitIds, 0, 0)).total;
}

// ---------------------------------------------------------------------------------------------
// "Did you mean": each word of the query that finds nothing anywhere (not even through its stem),
// that no published text uses and that is no word of the class's synonyms is replaced by the nearest word of the vocabulary (pg_trgm
// similarity, the more used first), when the new query finds more than the old one (all words,
// or else any of them).

export async function didYouMean(
  db: DbOrTx, words: string, filters: SearchFilters, fitIds: number[] | null, found: number,
): Promise<string | null> {
  const list = [...new Set(queryWords(words))].filter((w) => w.length >= 3 && !/^\d+$/.test(w));
  if (!list.length) return null;
  const r = await db.execute<{ word: string; better: string | null }>(sql`
    select q.word,
           (select v.word from search_vocabulary v
             -- pg_trgm's % is similarity 0.3 or more; a typo of a word is nearer than that
             -- ("baterry"/"battery" 0.45), a different word of the same start is not ("relocate"/"related" 0.31).
             where v.word % q.word and v.word <> q.word and similarity(v.word, q.word) >= ${SUGGESTION_SIMILARITY}
             order by similarity(v.word, q.word) desc, v.documents desc, v.word
             limit 1) as better
      from unnest(${arrayLiteral(list)}::text[]) as q(word)
      cross join lateral (select plainto_tsquery(${CONFIG}, q.word) as lexemes) l
     where not exists (select 1 from search_vocabulary v where v.word = q.word)
       -- A word of the class's synonyms ("bank" of "house bank") is a word of the trade, not a slip.
       and not exists (select 1 from search_synonyms s where q.word = any(regexp_split_to_array(lower(s.term), '[^a-z0-9]+')))
       and numnode(l.lexemes) > 0
       and not exists (select 1 from writeups w where w.status = 'published' and w.search @@ l.lexemes)
       and not exists (select 1 from spaces sp where sp.search @@ l.lexemes)
       and not exists (select 1 from items i where i.search @@ l.lexemes)`);
  const replacements = new Map(r.rows.filter((x) => x.better).map((x) => [x.word, x.better as string]));
  if (!replacements.size) return null;
  const better = replaceWords(words, replacements);
  if (better === words) return null;
  if ((await countOf(db, better, filters, fitIds)) > found) return better;
  const [looseBetter, looseWords] = [anyOfWords(better), anyOfWords(words)];
  if (!looseBetter || !looseWords) return null;
  const [b, w] = await Promise.all([countOf(db, looseBetter, filters, fitIds), countOf(db, looseWords, filters, fitIds)]);
  return b > w ? better : null;
}

// ---------------------------------------------------------------------------------------------
// Facets: for each way of narrowing, how many results each choice would give, counted with the
// words and every other filter that is set (so a choice never promises results it cannot give).

export type FacetCount = { value: string; label: string; count: number };
export type Facets = {
  /**
   * False when the words match more than MATCH_CAP of a kind: the choices are offered without
   * counts (they would count only the matches read), and every count below is 0.
   */
  counted: boolean;
  kinds: FacetCount[];
  systems: FacetCount[];
  zones: FacetCount[];
  hulls: (FacetCount & { from: number; to: number })[];
  measured: number;
  years: FacetCount[];
};

export type HullChoice = { value: string; label: string; from: number; to: number };

/** The hull choices offered: the variants, the reader's own boats, and the hull asked for. */
export function hullChoices(ownHulls: number[], asked: SearchFilters["hull"]): HullChoice[] {
  const choices: HullChoice[] = VARIANTS.map((v) => ({ value: v.key, label: describeHullRange(v), from: v.from, to: v.to }));
  for (const h of ownHulls) choices.push({ value: String(h), label: `Hull ${h} (your boat)`, from: h, to: h });
  if (asked && !choices.some((c) => c.from === asked.from && c.to === asked.to)) {
    choices.push({ value: asked.text, label: describeHullRange(asked), from: asked.from, to: asked.to });
  }
  return choices;
}

/**
 * The counts are made from the matches of the words (and the box to fit), at most MATCH_CAP + 1
 * of each kind read: when there are more, `counted` is false and the choices come without counts.
 */
export async function searchFacets(
  db: DbOrTx, req: SearchRequest, choices: HullChoice[], taxonomy?: Awaited<ReturnType<typeof searchTaxonomy>>,
): Promise<Facets> {
  const f = req.filters;
  const fitIds = await fittingSpaceIds(db, f);
  const words = hasSearchWords(req.q) ? req.q : null;
  const match = (alias: string) => (words === null ? sql`true` : sql`${sql.raw(alias)}.search @@ (select query from q)`);
  const ids = fitIds === null ? null : sql`${`{${fitIds.join(",")}}`}::int[]`;
  const fits = (expr: SQL) => (ids === null ? sql`true` : expr);
  const cap = sql.raw(String(MATCH_CAP + 1));

  const ok = {
    system: f.system ? sql`${f.system} = any(systems)` : sql`true`,
    zone: f.zone ? sql`${f.zone} = any(zones)` : sql`true`,
    hull: f.hull ? sql`(hull_from <= ${f.hull.to}::int and hull_to >= ${f.hull.from}::int)` : sql`true`,
    measured: f.measured ? sql`measured` : sql`true`,
    year: f.year ? sql`year = ${f.year}::int` : sql`true`,
    kind: f.kind ? sql`type = ${f.kind}` : sql`true`,
    fit: sql`fits`,
  };
  type Key = keyof typeof ok;
  const except = (...skip: Key[]) => sql.join((Object.keys(ok) as Key[]).filter((k) => !skip.includes(k)).map((k) => ok[k]), sql` and `);
  const hullValues = choices.length
    ? sql.join(choices.map((c) => sql`(${c.value}::text, ${c.from}::int, ${c.to}::int)`), sql`, `)
    : sql`(null::text, 0, 0)`;

  const r = await db.execute<{ facet: string; value: string | null; count: number }>(sql`
    with q as materialized (select ${words === null ? sql`null::tsquery` : tsqueryOf(words)} as query),
    m as materialized (
      select * from (
        select 'writeup'::text as type,
               array(select substr(t, 8) from unnest(w.search_filters) t where t like 'system:%') as systems,
               array(select substr(t, 6) from unnest(w.search_filters) t where t like 'zone:%') as zones,
               w.hull_from, w.hull_to,
               exists (select 1 from writeup_spaces x where x.writeup_id = w.id) as measured,
               extract(year from w.published_at at time zone 'UTC')::int as year,
               ${fits(sql`exists (select 1 from writeup_spaces x where x.writeup_id = w.id and x.space_id = any(${ids}))`)} as fits
          from writeups w
         where w.status = 'published' and ${match("w")}
         limit ${cap}) mw
      union all
      select * from (
        select 'space', '{}'::text[], array[sp.zone_slug], sp.hull_from, sp.hull_to,
               exists (select 1 from space_measurements sm where sm.space_id = sp.id), null::int,
               ${fits(sql`sp.id = any(${ids})`)}
          from spaces sp
         where ${match("sp")}
         limit ${cap}) ms
      union all
      select * from (
        select 'item', '{}'::text[], '{}'::text[], 1, 2147483647, false, null::int, ${ids === null ? sql`true` : sql`false`}
          from items i
         where ${match("i")}
         limit ${cap}) mi
    )
    select 'capped' as facet, null as value, count(*)::int as count from (select type from m group by type having count(*) >= ${cap}) c
    union all
    select 'kind' as facet, type as value, count(*)::int as count from m where ${except("kind")} group by type
    union all
    select 'system', s, count(*)::int from m, unnest(systems) s where ${except("system")} group by s
    union all
    select 'zone', z, count(*)::int from m, unnest(zones) z where ${except("zone")} group by z
    union all
    select 'hull', c.value, count(m.type)::int
      from (values ${hullValues}) as c(value, a, b)
      left join m on m.hull_from <= c.b and m.hull_to >= c.a and ${except("hull")}
     where c.value is not null
     group by c.value
    union all
    select 'measured', null, count(*)::int from m where measured and ${except("measured")}
    union all
    select 'year', year::text, count(*)::int from m where year is not null and ${except("year")} group by year`);

  // The systems and zones, unless the caller has read them already.
  const names = taxonomy ?? (await searchTaxonomy(db));
  const counted = (r.rows.find((c) => c.facet === "capped")?.count ?? 0) === 0;
  const counts = counted ? r.rows : [];
  const pick = (facet: string) => counts.filter((c) => c.facet === facet);
  const ordered = (list: { slug: string; name: string }[], facet: string) =>
    list
      .map((x) => ({ value: x.slug, label: x.name, count: pick(facet).find((c) => c.value === x.slug)?.count ?? 0 }))
      .filter((x) => !counted || x.count > 0 || x.value === (facet === "system" ? f.system : f.zone));
  return {
    counted,
    kinds: (["writeup", "space", "item"] as const).map((k) => ({
      value: k, label: k, count: pick("kind").find((c) => c.value === k)?.count ?? 0,
    })),
    systems: ordered(names.systems, "system"),
    zones: ordered(names.zones, "zone"),
    hulls: choices.map((c) => ({ ...c, count: pick("hull").find((x) => x.value === c.value)?.count ?? 0 })),
    measured: pick("measured")[0]?.count ?? 0,
    years: counted
      ? pick("year")
        .map((c) => ({ value: c.value ?? "", label: c.value ?? "", count: c.count }))
        .sort((a, b) => Number(b.value) - Number(a.value))
      : [],
  };
}

/** The systems and zones, in the class's order (for the filters and to check a parameter). */
export async function searchTaxonomy(db: DbOrTx) {
  const r = await db.execute<{ kind: "system" | "zone"; slug: string; name: string }>(sql`
    select 'system' as kind, slug, name, sort_order from systems
    union all
    select 'zone', slug, name, sort_order from zones
     order by kind, sort_order, slug`);
  const of = (kind: "system" | "zone") => r.rows.filter((x) => x.kind === kind).map(({ slug, name }) => ({ slug, name }));
  return { systems: of("system"), zones: of("zone") };
}

// ---------------------------------------------------------------------------------------------
// Type-ahead: titles of published write-ups, systems, zones, spaces and items whose words begin
// with what has been typed so far.

export type Suggestion = { type: "writeup" | "system" | "zone" | "space" | "item"; label: string; url: string };

/**
 * A tsquery of the words: whole words stemmed, with the class's synonyms (a "bunk" also suggests
 * the settee's and the berth's titles, as the search finds them), the last as a beginning.
 */
function prefixQuery(words: { whole: string[]; prefix: string | null }): SQL | null {
  // The words hold only letters and digits (typeaheadWords), so quoting them is enough.
  const terms: SQL[] = words.whole.map((w) => sql`search_expand(to_tsquery(${CONFIG}, ${`'${w}'`}))`);
  if (words.prefix) {
    const p = `'${words.prefix}':*`;
    // ... and, if it is already a whole word, that word with its synonyms.
    terms.push(sql`(to_tsquery('simple'::regconfig, ${p}) || to_tsquery(${CONFIG}, ${p}) || search_expand(to_tsquery(${CONFIG}, ${`'${words.prefix}'`})))`);
  }
  if (!terms.length) return null;
  return sql.join(terms.map((t) => sql`(${t})`), sql` || `);
}

export async function suggest(db: DbOrTx, text: string, limit = 8): Promise<Suggestion[]> {
  const words = typeaheadWords(text);
  const all = [...words.whole, ...(words.prefix ? [words.prefix] : [])];
  if (!all.length || all.join("").length < 2) return [];
  const anyName = prefixQuery(words);
  if (!anyName) return [];
  const r = await db.execute<{ type: Suggestion["type"]; label: string; slug: string; n: number }>(sql`
    with t as materialized (select ${anyName} as name_q),
    titles as (
      -- The titles alone (their own GIN index, writeups_title_search_idx).
      select 'writeup'::text as type, w.title as label, w.slug,
             ts_rank(to_tsvector(${CONFIG}, w.title), (select name_q from t)) * ${DONE_TOO_BOOST(sql.raw("w.id"))} as n
        from writeups w
       where w.status = 'published' and to_tsvector(${CONFIG}, w.title) @@ (select name_q from t)
       order by n desc, w.published_at desc
       limit 5
    ),
    tags as (
      select x.type, x.label, x.slug, ts_rank(to_tsvector(${CONFIG}, x.label), (select name_q from t)) as n
        from (select 'system'::text as type, name as label, slug from systems
              union all select 'zone', name, slug from zones) x
       where to_tsvector(${CONFIG}, x.label) @@ (select name_q from t)
       order by n desc, x.label
       limit 3
    ),
    named as (
      (select 'space'::text as type, sp.name as label, sp.slug, ts_rank(sp.search, (select name_q from t)) as n
         from spaces sp where sp.search @@ (select name_q from t) order by n desc, sp.name limit 2)
      union all
      (select 'item', i.name, i.slug, ts_rank(i.search, (select name_q from t)) as n
         from items i where i.search @@ (select name_q from t) order by n desc, i.name limit 2)
    )
    select type, label, slug, n from titles
    union all select type, label, slug, n from tags
    union all select type, label, slug, n from named`);
  const url = (s: { type: Suggestion["type"]; slug: string }) =>
    s.type === "writeup" ? `/writeups/${s.slug}`
      : s.type === "system" ? `/search?system=${s.slug}`
      : s.type === "zone" ? `/search?zone=${s.slug}`
      : s.type === "space" ? `/spaces/${s.slug}`
      : `/items#item-${s.slug}`;
  const order: Suggestion["type"][] = ["writeup", "zone", "system", "space", "item"];
  return r.rows
    .sort((a, b) => order.indexOf(a.type) - order.indexOf(b.type) || Number(b.n) - Number(a.n))
    .slice(0, limit)
    .map((s) => ({ type: s.type, label: s.label, url: url(s) }));
}
