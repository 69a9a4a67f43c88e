/**
 * The search over write-ups, spaces and catalogue items: reading its parameters (the page's
 * address and the API's), numbers typed among the words ("what fits 13 x 7 x 9 1/2 in,
 * upright?"), the highlights of a snippet, the words behind "did you mean", and pages.
 * Pure: the queries are in app/models/search.server.ts.
 */
import { z } from "zod";
import type { Orientation } from "./fit";
import { FIRST_HULL, LAST_HULL, parseAppliesTo, VARIANTS, type HullRange } from "./hulls";
import { parseDimensions, type Box, type LengthUnit } from "./units";

export const SEARCH_KINDS = ["writeup", "space", "item"] as const;
export type SearchKind = (typeof SEARCH_KINDS)[number];

export const KIND_LABEL: Record<SearchKind, { one: string; many: string }> = {
  writeup: { one: "write-up", many: "Write-ups" },
  space: { one: "space", many: "Spaces" },
  item: { one: "item", many: "Catalogue items" },
};

export const MAX_QUERY_LENGTH = 200;
export const PAGE_SIZE = 10;
export const API_DEFAULT_LIMIT = 20;
export const API_MAX_LIMIT = 100;
export const MAX_OFFSET = 10_000;
/** A query that finds fewer than this many results gets a "did you mean" when there is one. */
export const FEW_RESULTS = 3;
/**
 * How many matches of each kind a search reads, counts and ranks
 * (docs/decisions/0008-search-reads-a-bounded-set-of-matches.md). A search that matches more
 * reads the first MATCH_CAP that the index gives, plus up to TITLE_CANDIDATES write-ups with its
 * words in their title, ranks those, and says "more than" its total instead of counting on.
 */
export const MATCH_CAP = 100;
export const TITLE_CANDIDATES = 25;

/** The box a result must take (the fit check's "must fit"), in millimetres. */
export type FitFilter = { box: Box; orientation: Orientation; unit: LengthUnit; text: string };

/** A hull filter: one hull, a variant or a range, with the words it was given in. */
export type HullFilter = HullRange & { text: string };

export type SearchFilters = {
  system: string | null;
  zone: string | null;
  hull: HullFilter | null;
  measured: boolean;
  year: number | null;
  kind: SearchKind | null;
  fit: FitFilter | null;
};

export const NO_FILTERS: SearchFilters = {
  system: null, zone: null, hull: null, measured: false, year: null, kind: null, fit: null,
};

export type SearchRequest = { q: string; filters: SearchFilters; limit: number; offset: number };

export type ParamProblem = { ok: false; parameter: string; message: string };

export function hasFilters(f: SearchFilters): boolean {
  return Boolean(f.system || f.zone || f.hull || f.measured || f.year || f.kind || f.fit);
}

// ---------------------------------------------------------------------------------------------
// Parameters.

const HULL_CHOICES = `a hull number from ${FIRST_HULL} to ${LAST_HULL}, a variant (Mk I, Mk II) or a range such as 120-298`;

/**
 * "147" (one hull), "mk1" / "mk2" (a variant) or "120-298" (a range; "298-120" is the same
 * hulls). The error is a sentence to show beside the field.
 */
export function parseHullFilter(raw: string): HullFilter | { error: string } {
  const text = raw.trim().toLowerCase().replace(/^hull\s*/, "").replace(/^#/, "");
  if (/^\d+$/.test(text)) {
    const n = Number(text);
    if (n < FIRST_HULL || n > LAST_HULL) return { error: `There is no hull ${n}: the class's hulls are numbered ${FIRST_HULL} to ${LAST_HULL}. Give one of those, a variant (Mk I, Mk II) or a range such as 120-298.` };
    return { from: n, to: n, text };
  }
  const variant = VARIANTS.find((v) => v.key === text.replace(/\s+/g, "") || v.label.toLowerCase() === text);
  if (variant) return { from: variant.from, to: variant.to, text: variant.key };
  if (text === "all") return { error: "Leave it empty to search every hull." };
  const r = parseAppliesTo(text);
  if ("error" in r) return { error: `Give ${HULL_CHOICES}.` };
  return { ...r, text: `${r.from}-${r.to}` };
}

const TRUE_WORDS = ["true", "1", "yes", "on"];
const FALSE_WORDS = ["", "false", "0", "no", "off"];

const flag = (name: string) =>
  z.string().trim().toLowerCase().refine((v) => [...TRUE_WORDS, ...FALSE_WORDS].includes(v), `${name}: use "true" or "false".`)
    .transform((v) => TRUE_WORDS.includes(v));

const wholeNumber = (name: string, min: number, max: number) =>
  z.string().trim().regex(/^\d+$/, `${name}: a whole number from ${min} to ${max}.`)
    .transform(Number)
    .refine((n) => n >= min && n <= max, `${name}: a whole number from ${min} to ${max}.`);

const tagSlug = (name: string) =>
  z.string().trim().toLowerCase().regex(/^[a-z0-9][a-z0-9-]{0,59}$/, `${name}: a ${name} such as ${name === "system" ? "electrical" : "starboard-settee"}.`);

/** One zod schema for the search's parameters: the page's address and the API's query. */
const paramsSchema = z.object({
  q: z.string().max(MAX_QUERY_LENGTH, `q: at most ${MAX_QUERY_LENGTH} characters.`).transform((v) => v.trim()).default(""),
  system: tagSlug("system").optional(),
  zone: tagSlug("zone").optional(),
  hull: z.string().optional(),
  measured: flag("measured").optional(),
  year: wholeNumber("year", 1900, 2999).optional(),
  type: z.string().trim().toLowerCase().refine((v) => v === "" || (SEARCH_KINDS as readonly string[]).includes(v), 'type: use "writeup", "space" or "item".').optional(),
  fit: z.string().optional(),
  unit: z.string().trim().toLowerCase().refine((v) => v === "" || v === "in" || v === "mm", 'unit: use "in" or "mm".').optional(),
  upright: flag("upright").optional(),
  limit: wholeNumber("limit", 1, API_MAX_LIMIT).optional(),
  offset: wholeNumber("offset", 0, MAX_OFFSET).optional(),
  page: wholeNumber("page", 1, MAX_OFFSET / PAGE_SIZE).optional(),
});

/** The page's filters that could not be read, each with the sentence to show beside its field. */
export type LeftOut = { hull?: string; fit?: string };

export type ParsedSearch = { ok: true; request: SearchRequest; page: number; unit: LengthUnit; fitTyped: string; leftOut: LeftOut };

const FIT_TOO_LONG = "Give the length, width and height, such as 13 x 7 x 9 1/2.";

/**
 * Reads the search's parameters. `mode: "api"` reads limit and offset; `"page"` reads page (10
 * a page). Empty values count as absent. Numbers typed among the words ("13 x 7 x 9.5 in
 * upright") become the dimension filter when no `fit` is given. On the page (`"page"`), a hull or
 * a size that cannot be read does not stop the search: it is left out, and `leftOut` says why
 * (the API answers 400 instead).
 */
export function parseSearchParams(params: URLSearchParams, mode: "api" | "page"): ParsedSearch | ParamProblem {
  const raw: Record<string, string> = {};
  for (const [key, value] of params) {
    if (key in paramsSchema.shape && value.trim() !== "") raw[key] = value;
  }
  if (params.has("q")) raw.q = params.get("q") ?? "";
  const parsed = paramsSchema.safeParse(raw);
  if (!parsed.success) {
    const issue = parsed.error.issues[0];
    const parameter = String(issue.path[0] ?? "q");
    const message = issue.message.startsWith(`${parameter}:`) ? issue.message : `${parameter}: ${issue.message}`;
    return { ok: false, parameter, message };
  }
  const p = parsed.data;
  const unit: LengthUnit = p.unit === "mm" ? "mm" : "in";

  const leftOut: LeftOut = {};
  let hull: HullFilter | null = null;
  if (p.hull !== undefined) {
    const h = parseHullFilter(p.hull);
    if ("error" in h) {
      if (mode === "api") return { ok: false, parameter: "hull", message: `hull: ${h.error}` };
      leftOut.hull = h.error;
    } else {
      hull = h;
    }
  }

  let q = p.q;
  let fit: FitFilter | null = null;
  let fitTyped = "";
  if (p.fit !== undefined) {
    const r = p.fit.length > 80 ? { ok: false as const, message: FIT_TOO_LONG } : parseDimensions(p.fit, unit, 3);
    if (!r.ok) {
      if (mode === "api") return { ok: false, parameter: "fit", message: `fit: ${r.message}` };
      leftOut.fit = r.message;
    } else {
      fit = { box: { length: r.mm[0], width: r.mm[1], height: r.mm[2] }, orientation: p.upright ? "upright" : "any", unit, text: p.fit.trim() };
    }
    fitTyped = p.fit.trim();
  } else {
    const found = dimensionsInQuery(q, unit);
    if (found) {
      q = found.words;
      fit = found.fit;
      if (p.upright) fit.orientation = "upright";
    }
  }

  let limit = PAGE_SIZE;
  let offset = 0;
  let page = 1;
  if (mode === "api") {
    limit = p.limit ?? API_DEFAULT_LIMIT;
    offset = p.offset ?? 0;
  } else {
    page = p.page ?? 1;
    offset = (page - 1) * PAGE_SIZE;
  }
  return {
    ok: true,
    page,
    unit,
    fitTyped,
    leftOut,
    request: {
      q,
      limit,
      offset,
      filters: {
        system: p.system ?? null,
        zone: p.zone ?? null,
        hull,
        measured: p.measured ?? false,
        year: p.year ?? null,
        kind: (p.type || null) as SearchKind | null,
        fit,
      },
    },
  };
}

// ---------------------------------------------------------------------------------------------
// Numbers among the words: "battery 13 x 7 x 9 1/2 in upright", "what fits 330 x 173 x 240 mm?".

const NUMBER = String.raw`\d+(?:[.,]\d+)?(?:\s+\d+/\d+)?|\d+/\d+`;
const UNIT = String.raw`(?:mm|millimet(?:er|re)s?|in(?:ch(?:es)?)?\.?|")`;
const DIMENSIONS = new RegExp(
  String.raw`(?<![\w/.])((?:${NUMBER})\s*${UNIT}?\s*(?:x|×|by)\s*(?:${NUMBER})\s*${UNIT}?\s*(?:x|×|by)\s*(?:${NUMBER})(?:\s*${UNIT})?)(?![\w/])`,
  "i",
);
/** Words that only ask the question ("what fits ...?", "will it fit ...") once the numbers are taken out. */
const QUESTION_WORDS = /\b(?:what|which|will|would|does|do|it|fits?|fitting|where|can|take|takes|upright)\b/gi;

export function dimensionsInQuery(q: string, defaultUnit: LengthUnit): { words: string; fit: FitFilter } | null {
  const m = DIMENSIONS.exec(q);
  if (!m) return null;
  const r = parseDimensions(m[1], defaultUnit, 3);
  if (!r.ok) return null;
  const upright = /\bupright\b/i.test(q);
  const unit: LengthUnit = /mm|millimet/i.test(m[1]) ? "mm" : /in|"/i.test(m[1]) ? "in" : defaultUnit;
  const rest = (q.slice(0, m.index) + " " + q.slice(m.index + m[0].length))
    .replace(QUESTION_WORDS, " ")
    .replace(/[?,;:!]+/g, " ")
    .replace(/\s+/g, " ")
    .trim();
  return {
    words: rest,
    fit: {
      box: { length: r.mm[0], width: r.mm[1], height: r.mm[2] },
      orientation: upright ? "upright" : "any",
      unit,
      text: m[1].trim(),
    },
  };
}

// ---------------------------------------------------------------------------------------------
// Snippets. The database marks the words it found with two control characters that cannot be
// markup (and are removed from the document first); the page turns the marked parts into <mark>
// elements as text, so nothing in a document is ever read as HTML.

export const HIT_START = "\u0002";
export const HIT_END = "\u0003";

export type Snippet = { text: string; highlights: [number, number][] };

/** A headline with hit markers -> plain text and the [start, end) of each hit in it. */
export function readHeadline(marked: string): Snippet {
  let text = "";
  const highlights: [number, number][] = [];
  let start = -1;
  for (const ch of marked) {
    if (ch === HIT_START) {
      start = text.length;
    } else if (ch === HIT_END) {
      if (start >= 0 && text.length > start) highlights.push([start, text.length]);
      start = -1;
    } else {
      text += ch;
    }
  }
  const clean = text.replace(/\s+/g, " ");
  if (clean === text) return { text, highlights };
  // Collapse whitespace and move the highlights with it. A line break between two of the text's
  // blocks (a heading and the paragraph after it) becomes " · ", so they do not read as one sentence.
  const inHit = (i: number) => highlights.some(([a, b]) => a <= i && i < b);
  const map: number[] = [];
  let out = "";
  for (let i = 0; i < text.length; i++) {
    map[i] = out.length;
    if (!/\s/.test(text[i])) {
      out += text[i];
      continue;
    }
    if (out.length === 0 || out.endsWith(" ")) continue;
    let end = i;
    while (end < text.length && /\s/.test(text[end])) end++;
    const blocks = end < text.length && !inHit(i) && text.slice(i, end).includes("\n");
    out += blocks ? " · " : " ";
  }
  map[text.length] = out.length;
  const trimmed = out.trimEnd();
  return {
    text: trimmed,
    highlights: highlights
      .map(([a, b]) => [Math.min(map[a], trimmed.length), Math.min(map[b], trimmed.length)] as [number, number])
      .filter(([a, b]) => b > a),
  };
}

/** The pieces of a snippet in order, each a hit or not (for rendering as text). */
export function snippetParts(s: Snippet): { text: string; hit: boolean }[] {
  const parts: { text: string; hit: boolean }[] = [];
  let at = 0;
  for (const [a, b] of [...s.highlights].sort((x, y) => x[0] - y[0])) {
    if (a < at) continue;
    if (a > at) parts.push({ text: s.text.slice(at, a), hit: false });
    parts.push({ text: s.text.slice(a, b), hit: true });
    at = b;
  }
  if (at < s.text.length) parts.push({ text: s.text.slice(at), hit: false });
  return parts;
}

// ---------------------------------------------------------------------------------------------
// The query's words, for "did you mean" and for loosening a query that finds nothing.

/** Whether the query uses the syntax (quotes, a leading minus, "or"): such a query is kept as typed. */
export function usesSyntax(q: string): boolean {
  return /["“”]/.test(q) || /(^|\s)-\S/.test(q) || /(^|\s)or(\s|$)/i.test(q);
}

/** The plain words of a query, lower case, in order (letters, digits and inner hyphens). */
export function queryWords(q: string): string[] {
  return (q.toLowerCase().match(/[\p{L}\p{N}]+(?:['’-][\p{L}\p{N}]+)*/gu) ?? []).filter((w) => w !== "or");
}

/** Whether a query has anything to look for: a letter or a digit ("!!!" or "or" alone has not). */
export function hasSearchWords(q: string): boolean {
  return queryWords(q).length > 0;
}

/**
 * The query as a heading shows it: in curly quotes ("battery box" -> “battery box”), or, when it
 * has quotes of its own, as typed with those made curly (“house battery” once, not “"house battery"”).
 */
export function queryInQuotes(q: string): string {
  const text = q.trim();
  if (!/["“”]/.test(text)) return `“${text}”`;
  let open = true;
  return text.replace(/["“”]/g, (c) => {
    const curly = c === '"' ? (open ? "“" : "”") : c;
    open = curly === "”";
    return curly;
  });
}

/** The query with some words replaced (as they appear, whole words, any case), the rest as typed. */
export function replaceWords(q: string, replacements: ReadonlyMap<string, string>): string {
  return q.replace(/[\p{L}\p{N}]+(?:['’-][\p{L}\p{N}]+)*/gu, (w) => replacements.get(w.toLowerCase()) ?? w);
}

/** The beginnings of the words typed (4 letters, lower case and capitalised), where a snippet should start (app/models/search.server.ts). */
export function wordStarts(words: string): string[] {
  const starts = new Set<string>();
  for (const w of queryWords(words).slice(0, 6)) {
    const p = w.length > 4 ? w.slice(0, 4) : w;
    starts.add(p);
    starts.add(p[0].toUpperCase() + p.slice(1));
  }
  return [...starts];
}

/** Any of the words: "battery box settee" -> "battery or box or settee" (websearch syntax). */
export function anyOfWords(q: string): string | null {
  if (usesSyntax(q)) return null;
  const words = queryWords(q);
  return words.length > 1 ? words.join(" or ") : null;
}

/** Words for type-ahead: all but the last are whole words; the last may be a beginning. */
export function typeaheadWords(text: string): { whole: string[]; prefix: string | null } {
  const words = (text.toLowerCase().match(/[\p{L}\p{N}]+/gu) ?? []).slice(0, 8);
  if (!words.length) return { whole: [], prefix: null };
  if (/\s$/.test(text)) return { whole: words, prefix: null };
  return { whole: words.slice(0, -1), prefix: words[words.length - 1] };
}

// ---------------------------------------------------------------------------------------------
// Pages.

export function pageCount(total: number, size = PAGE_SIZE): number {
  return Math.max(1, Math.ceil(total / size));
}

/** The search's address with some parameters changed (null removes one); the page goes back to 1 unless given. */
export function searchHref(current: URLSearchParams, changes: Record<string, string | null>): string {
  const next = new URLSearchParams(current);
  if (!("page" in changes)) next.delete("page");
  for (const [key, value] of Object.entries(changes)) {
    if (value === null || value === "") next.delete(key);
    else next.set(key, value);
  }
  const s = next.toString();
  return s ? `/search?${s}` : "/search";
}

/** A snippet as HTML for the API: the hits in <mark> elements, everything else escaped text. */
export function snippetHtml(s: Snippet): string {
  return snippetParts(s)
    .map((p) => (p.hit ? `<mark>${escapeHtml(p.text)}</mark>` : escapeHtml(p.text)))
    .join("");
}

export function escapeHtml(text: string): string {
  return text.replace(/[&<>"']/g, (c) => ({ "&": "&amp;", "<": "&lt;", ">": "&gt;", '"': "&quot;", "'": "&#39;" })[c] as string);
}
