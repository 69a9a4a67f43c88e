import { data, Form, Link } from "react-router";
import type { Route } from "./+types/search";
import { SearchBox } from "~/components/search-box";
import { SnippetText } from "~/components/snippet";
import { buttonClass, FieldError, inputClass, quietButtonClass } from "~/components/ui/field";
import { formatDate, SystemChips } from "~/components/writeup-card";
import { db } from "~/db/index.server";
import { describeBox } from "~/domain/fit-search";
import { CLASS_NAME, describeHullRange, describeHullRangeInSentence, hullBesideCredit } from "~/domain/hulls";
import {
  hasFilters, hasSearchWords, KIND_LABEL, MATCH_CAP, pageCount, PAGE_SIZE, parseSearchParams, queryInQuotes, SEARCH_KINDS, searchHref,
  type LeftOut, type SearchKind,
} from "~/domain/search";
import type { LengthUnit } from "~/domain/units";
import { hullChoices, search, searchFacets, searchTaxonomy, type Facets, type SearchResult } from "~/models/search.server";
import { hullsOfUser } from "~/models/spaces.server";
import { getUser } from "~/services/session.server";
import { readerUnit } from "./reader-unit.server";

type Problem = { parameter: string; message: string };
/** Filters of the address that could not be read: the search runs without them, and says so beside each. */
type LeftOutFilters = LeftOut & { system?: { typed: string; choices: { slug: string; name: string }[] }; zone?: { typed: string; choices: { slug: string; name: string }[] } };

export async function loader({ request }: Route.LoaderArgs) {
  const url = new URL(request.url);
  const user = await getUser(request);
  const unit = await readerUnit(request, user);
  const params = url.searchParams.toString();
  // A system or zone that is not even the shape of one ("Electrical Things") is left out like one
  // the class does not have: the rest of the search is read without it.
  const readable = new URLSearchParams(url.searchParams);
  const unreadTags: { system?: string; zone?: string } = {};
  let parsed = parseSearchParams(readable, "page");
  while (!parsed.ok && (parsed.parameter === "system" || parsed.parameter === "zone") && unreadTags[parsed.parameter] === undefined) {
    unreadTags[parsed.parameter] = readable.get(parsed.parameter) ?? "";
    readable.delete(parsed.parameter);
    parsed = parseSearchParams(readable, "page");
  }
  const base = {
    params, unit, q: url.searchParams.get("q") ?? "",
    fitText: url.searchParams.get("fit") ?? "",
    fitUnit: (url.searchParams.get("unit") === "mm" ? "mm" : url.searchParams.get("unit") === "in" ? "in" : unit) as LengthUnit,
    fitUpright: url.searchParams.get("upright") === "true",
  };
  if (!parsed.ok) {
    return data({ ...base, state: "problem" as const, problem: { parameter: parsed.parameter, message: parsed.message } as Problem }, { status: 400 });
  }
  const leftOut: LeftOutFilters = { ...parsed.leftOut };
  const req = { ...parsed.request, filters: { ...parsed.request.filters } };
  // Sizes typed among the words go to the form's "must fit" field, so that searching again keeps them.
  const fit = req.filters.fit;
  if (fit && !url.searchParams.get("fit")) {
    base.fitText = fit.text;
    base.fitUnit = fit.unit;
    base.fitUpright = fit.orientation === "upright";
  }
  const taxonomy = await searchTaxonomy(db);
  // A system or zone that the class does not have is left out too, and the page lists those it has.
  if (req.filters.system && !taxonomy.systems.some((x) => x.slug === req.filters.system)) {
    leftOut.system = { typed: req.filters.system, choices: taxonomy.systems };
    req.filters.system = null;
  }
  if (req.filters.zone && !taxonomy.zones.some((x) => x.slug === req.filters.zone)) {
    leftOut.zone = { typed: req.filters.zone, choices: taxonomy.zones };
    req.filters.zone = null;
  }
  if (unreadTags.system !== undefined) leftOut.system = { typed: unreadTags.system, choices: taxonomy.systems };
  if (unreadTags.zone !== undefined) leftOut.zone = { typed: unreadTags.zone, choices: taxonomy.zones };
  const status = Object.keys(leftOut).length ? 400 : 200;
  if (!req.q && !hasFilters(req.filters)) return data({ ...base, leftOut, state: "start" as const }, { status });
  // Punctuation alone ("!!!") has nothing to look for: it must not list everything.
  if (req.q && !hasSearchWords(req.q)) return data({ ...base, leftOut, state: "no-words" as const, filtered: hasFilters(req.filters) }, { status });

  const ownHulls = user ? await hullsOfUser(db, user.id) : [];
  let answer = await search(db, req);
  let words = req.q;
  // A search that finds nothing, with a "did you mean" that finds something, shows what the
  // suggestion finds; `typed=1` (the link "Search for ... instead") runs the words as typed.
  let corrected: { typed: string } | null = null;
  if (answer.total === 0 && answer.suggestion && url.searchParams.get("typed") !== "1") {
    const instead = await search(db, { ...req, q: answer.suggestion });
    if (instead.total > 0) {
      corrected = { typed: req.q };
      words = answer.suggestion;
      answer = { ...instead, suggestion: null };
    }
  }
  const facets = await searchFacets(db, { ...req, q: answer.words }, hullChoices(ownHulls, req.filters.hull), taxonomy);
  const f = req.filters;
  const beyond = answer.total > 0 && parsed.page > pageCount(answer.total);
  return data({
    ...base,
    leftOut,
    state: "results" as const,
    words,
    corrected,
    beyond,
    page: parsed.page,
    filtered: hasFilters(req.filters),
    answer,
    facets,
    active: {
      system: f.system ? (taxonomy.systems.find((x) => x.slug === f.system)?.name ?? f.system) : null,
      zone: f.zone ? (taxonomy.zones.find((x) => x.slug === f.zone)?.name ?? f.zone) : null,
      hull: f.hull ? { text: f.hull.text, label: describeHullRangeInSentence(f.hull) } : null,
      measured: f.measured,
      year: f.year,
      kind: f.kind,
      fit: f.fit ? { text: describeBox(f.fit.box, f.fit.unit), upright: f.fit.orientation === "upright", fromWords: !url.searchParams.get("fit") } : null,
    },
  }, { status: beyond ? 404 : status });
}

export function meta({ loaderData }: Route.MetaArgs) {
  // The words the results are for (a corrected search's correction), else the words typed.
  const q = (loaderData?.state === "results" ? loaderData.words : loaderData?.q)?.trim();
  return [
    { title: q ? `${queryInQuotes(q)} · Sistership search` : "Search · Sistership" },
    { name: "description", content: `Search the ${CLASS_NAME} owners' write-ups, measured spaces and catalogue items.` },
  ];
}

// ---------------------------------------------------------------------------------------------

export default function SearchPage({ loaderData }: Route.ComponentProps) {
  const d = loaderData;
  const params = new URLSearchParams(d.params);
  const leftOut: LeftOutFilters = "leftOut" in d ? d.leftOut : {};
  // The links of the page leave out what could not be read (the form keeps it, to be corrected).
  const links = new URLSearchParams(params);
  for (const key of Object.keys(leftOut)) links.delete(key);
  return (
    <div>
      <h1 className="text-step-3 font-semibold leading-tight">
        {d.state !== "results"
          ? "Search the class's knowledge"
          : d.words
            ? <>Write-ups, spaces and items matching {queryInQuotes(d.words)}</>
            : d.active.fit
              ? <>What takes {d.active.fit.text}{d.active.fit.upright ? ", upright" : ""}</>
              : "Write-ups, spaces and items"}
      </h1>
      <SearchForm
        params={params}
        links={links}
        q={d.state === "results" ? d.words : d.q}
        fit={{ text: d.fitText, unit: d.fitUnit, upright: d.fitUpright }}
        errors={{ hull: leftOut.hull, fit: leftOut.fit }}
      />
      {d.state !== "results" && (leftOut.system || leftOut.zone) && (
        <div className="mt-6 max-w-2xl text-step--1">
          <UnknownTag leftOut={leftOut} which="system" links={links} />
          <UnknownTag leftOut={leftOut} which="zone" links={links} />
        </div>
      )}
      {d.state === "no-words" && (
        <div className="mt-6 max-w-2xl rounded-lg bg-cloth-100 p-5" id="search-no-words">
          <p className="font-medium">
            There is nothing to look for in {queryInQuotes(d.q)}: a search needs a word. Add one that says what the job is about.
          </p>
          {d.filtered && (
            <p className="mt-2"><Link to={searchHref(links, { q: null })}>Search with the filters alone</Link></p>
          )}
          <SyntaxHelp />
        </div>
      )}
      {d.state === "problem" && (
        <div role="alert" className="mt-6 max-w-2xl rounded-lg border-l-4 border-bootstripe-600 bg-bootstripe-50 p-4 text-bootstripe-800">
          <p className="font-medium">That search could not be read: {d.problem.message}</p>
          <p className="mt-2 text-step--1">
            <Link to={searchHref(params, { [d.problem.parameter]: null })}>Search again without it</Link>
          </p>
        </div>
      )}
      {d.state === "start" && <SyntaxHelp intro />}
      {d.state === "results" && <Results d={d} params={links} leftOut={leftOut} />}
    </div>
  );
}

function SearchForm({
  params, links, q, fit, errors,
}: {
  params: URLSearchParams;
  links: URLSearchParams;
  q: string;
  fit: { text: string; unit: LengthUnit; upright: boolean };
  errors: { hull?: string; fit?: string };
}) {
  const keep = ["system", "zone", "measured", "year", "type"].filter((k) => links.get(k));
  return (
    <Form method="get" action="/search" role="search" aria-label="Search and narrow" className="mt-5 rounded-lg border border-cloth-200 bg-white/70 p-4">
      {keep.map((k) => <input key={k} type="hidden" name={k} value={links.get(k) ?? ""} />)}
      <div className="flex flex-wrap items-end gap-3">
        <div className="flex min-w-[16rem] flex-1 flex-col">
          <SearchBox
            key={q}
            id="search-words"
            label="Words to search for"
            labelClassName="mb-1 block font-medium text-ink"
            defaultValue={q}
            placeholder="battery box under the settee"
            inputClassName={inputClass}
          />
        </div>
        <button type="submit" className={buttonClass}>Search</button>
      </div>
      <details className="mt-3 text-step--1" open={Boolean(params.get("hull") || fit.text)}>
        <summary className="cursor-pointer font-medium text-deep-700">My hull, and what must fit</summary>
        <div className="mt-3 flex flex-wrap items-start gap-4">
          <div className="w-full sm:w-60">
            <label htmlFor="search-hull" className="block font-medium text-ink">Applies to hull</label>
            <input
              id="search-hull" name="hull" defaultValue={params.get("hull") ?? ""} placeholder="147, mk1 or 120-298"
              aria-invalid={errors.hull ? true : undefined}
              aria-describedby={errors.hull ? "search-hull-error search-hull-hint" : "search-hull-hint"}
              className={inputClass}
            />
            <FieldError id="search-hull-error" errors={errors.hull ? [errors.hull] : undefined} />
            <p id="search-hull-hint" className="mt-1 text-ink-soft">A hull number, Mk I / Mk II, or a range.</p>
          </div>
          <div className="w-full sm:w-72">
            <label htmlFor="search-fit" className="block font-medium text-ink">Must fit (length × width × height)</label>
            <input
              id="search-fit" name="fit" defaultValue={fit.text} placeholder="13 x 7 x 9 1/2"
              aria-invalid={errors.fit ? true : undefined}
              aria-describedby={errors.fit ? "search-fit-error search-fit-hint" : "search-fit-hint"}
              className={inputClass}
            />
            <FieldError id="search-fit-error" errors={errors.fit ? [errors.fit] : undefined} />
            <p id="search-fit-hint" className="mt-1 text-ink-soft">Spaces it fits, through their opening, and the write-ups that used them.</p>
          </div>
          <div>
            <label htmlFor="search-unit" className="block font-medium text-ink">Unit</label>
            <select id="search-unit" name="unit" defaultValue={fit.unit} className={`${inputClass} w-28`}>
              <option value="in">inches</option>
              <option value="mm">mm</option>
            </select>
          </div>
          <label className="flex items-center gap-2 font-medium text-ink sm:mt-8">
            <input type="checkbox" name="upright" value="true" defaultChecked={fit.upright} className="size-5 accent-deep-700" />
            Upright only
          </label>
          <button type="submit" className={`${quietButtonClass} sm:mt-6`}>Apply</button>
        </div>
      </details>
    </Form>
  );
}

type ResultsData = Extract<Route.ComponentProps["loaderData"], { state: "results" }>;

function Results({ d, params, leftOut }: { d: ResultsData; params: URLSearchParams; leftOut: LeftOutFilters }) {
  const { answer, facets, active } = d;
  const pages = pageCount(answer.total);
  // Each kind's results together: the write-ups (the known fixes) first, or, when something must
  // fit, the spaces that take it; then the other kinds in the order of their best result on this page.
  const lead: SearchKind = active.fit ? "space" : "writeup";
  const byKind = SEARCH_KINDS.map((k) => ({ kind: k, results: answer.results.filter((r) => r.type === k) }))
    .filter((g) => g.results.length)
    .sort((a, b) => Number(b.kind === lead) - Number(a.kind === lead) || answer.results.indexOf(a.results[0]) - answer.results.indexOf(b.results[0]));
  const kindCount = (k: SearchKind) => facets.kinds.find((x) => x.value === k)?.count ?? 0;
  const first = (d.page - 1) * PAGE_SIZE + 1;
  return (
    // The results come first in the page (and on a phone's one column); from md up, the filters
    // stand in the left column.
    <div className="mt-6 grid gap-8 md:grid-cols-[15rem_1fr]">
      <div className="min-w-0">
        <ActiveFilters active={active} params={params} words={d.words} />
        <div aria-live="polite">
          <LeftOutSentences leftOut={leftOut} />
          {d.corrected && (
            <p className="mb-2 font-medium" id="search-corrected">
              Showing results for <em>{d.words}</em>. Search for{" "}
              <Link to={searchHref(params, { q: d.corrected.typed, typed: "1" })} className="italic">{d.corrected.typed}</Link> instead.
            </p>
          )}
          {d.beyond ? (
            <div className="rounded-md bg-cloth-100 p-3" id="search-beyond">
              <p className="font-medium">
                There is no page {d.page}: these results have {pages} {pages === 1 ? "page" : "pages"}.
              </p>
              <p className="mt-2 flex flex-wrap gap-x-4 gap-y-1">
                {pages > 1 && <Link to={searchHref(params, { page: String(pages) })}>Go to the last page ({pages})</Link>}
                <Link to={searchHref(params, { page: null })}>Go to the first page</Link>
              </p>
            </div>
          ) : answer.total > 0 ? (
            <p className="flex flex-wrap items-baseline justify-between gap-x-4 gap-y-1 text-ink-soft">
              <span id="search-summary">
                {answer.capped ? `More than ${answer.total.toLocaleString("en-US")} results` : `${answer.total} ${answer.total === 1 ? "result" : "results"}`}
                {pages > 1 ? `, ${first}–${Math.min(first + PAGE_SIZE - 1, answer.total)} shown (page ${d.page} of ${pages})` : ""}
                {answer.matched !== "none" ? ", best matches first" : active.fit ? ", tightest fit first" : ""}.
              </span>
              {/* On a phone the filters come after the results: a way to them without scrolling past every result. */}
              <a href="#narrow" className="font-medium md:hidden" id="search-jump-narrow">Narrow the results</a>
            </p>
          ) : null}
          {answer.capped && (
            <p className="mt-2 rounded-md bg-cloth-100 p-3 text-step--1" id="search-capped">
              That search matches too much to read it all: these are the best of the first {MATCH_CAP.toLocaleString("en-US")} of
              each kind that it read, with those that have your words in their title. Add a word, or narrow by system, zone or
              hull, to see everything that matches.
            </p>
          )}
          {answer.suggestion && (
            <p className="mt-2 font-medium">
              Did you mean{" "}
              <Link to={searchHref(params, { q: answer.suggestion, fit: params.get("fit"), typed: null })} className="italic">{answer.suggestion}</Link>?
            </p>
          )}
          {answer.matched === "any" && (
            <p className="mt-2 rounded-md bg-cloth-100 p-3 text-step--1">
              Nothing has all of your words, so these have some of them. Fewer, plainer words often find more.
            </p>
          )}
          {answer.synonyms.length > 0 && answer.total > 0 && (
            <p className="mt-2 text-step--1 text-ink-soft">
              Also found by the class's other words for the same thing: {answer.synonyms.join(", ")}.
            </p>
          )}
        </div>
        {answer.total === 0 && <NothingFound d={d} />}
        {byKind.map((g) => (
          <section key={g.kind} aria-labelledby={`group-${g.kind}`} className="mt-6">
            <h2 id={`group-${g.kind}`} className="text-step-1 font-semibold text-deep-900">
              {KIND_LABEL[g.kind].many}
              {facets.counted && <> <span className="text-step--1 font-normal text-ink-soft">({kindCount(g.kind)} in all)</span></>}
            </h2>
            <ol className="mt-3 grid gap-3">
              {g.results.map((r) => <ResultCard key={`${r.type}-${r.id}`} r={r} unit={d.unit} />)}
            </ol>
          </section>
        ))}
        {pages > 1 && !d.beyond && <Pager page={d.page} pages={pages} params={params} />}
      </div>
      {/* Nothing to narrow when nothing was found and no filter is set. */}
      {(answer.total > 0 || d.filtered || leftOut.system || leftOut.zone) && (
        <FacetPanel facets={facets} active={active} params={params} leftOut={leftOut} />
      )}
    </div>
  );
}

function ResultCard({ r, unit }: { r: SearchResult; unit: LengthUnit }) {
  const det = r.detail;
  return (
    <li>
      <article className="rounded-lg border border-cloth-200 bg-white/70 p-4 shadow-xs">
        <h3 className="text-step-0 font-semibold leading-snug">
          <Link to={r.url} className="text-deep-900 no-underline hover:underline">{r.title}</Link>
        </h3>
        <p className="mt-1 text-step--1 text-ink-soft">
          {det.type === "writeup" && (
            <>
              {det.author}
              {hullBesideCredit(det.author, det.hullNumber) ? ` · hull ${det.hullNumber}` : ""}
              {det.publishedAt ? ` · ${formatDate(det.publishedAt)}` : ""}
              {` · ${describeHullRange(det.hulls)}`}
              {det.doneToo > 0 ? ` · done on ${det.doneToo} more ${det.doneToo === 1 ? "boat" : "boats"}` : ""}
            </>
          )}
          {det.type === "space" && (
            <>
              Space · {det.zone} · {describeHullRange(det.hulls)}
              {det.measurements > 0 ? ` · measured by members ${det.measurements} ${det.measurements === 1 ? "time" : "times"}` : ""}
            </>
          )}
          {det.type === "item" && (
            <>Catalogue item · {describeBox(det.box, unit)}{det.upright ? " · stays upright" : ""}</>
          )}
        </p>
        {r.snippet.text && <SnippetText snippet={r.snippet} />}
        {r.systems.length > 0 && <div className="mt-3"><SystemChips systems={r.systems} /></div>}
      </article>
    </li>
  );
}

function Pager({ page, pages, params }: { page: number; pages: number; params: URLSearchParams }) {
  const to = (n: number) => searchHref(params, { page: n === 1 ? null : String(n) });
  const numbers = Array.from({ length: pages }, (_, i) => i + 1).filter((n) => n === 1 || n === pages || Math.abs(n - page) <= 2);
  return (
    <nav aria-label="Pages of results" className="mt-8 flex flex-wrap items-center gap-2 text-step--1">
      {page > 1 ? <Link to={to(page - 1)} rel="prev" className={quietButtonClass}>Previous page</Link> : null}
      <ul className="flex flex-wrap gap-1">
        {numbers.map((n, i) => (
          <li key={n} className="flex items-center gap-1">
            {i > 0 && numbers[i - 1] !== n - 1 && <span aria-hidden="true">…</span>}
            {n === page ? (
              <span aria-current="page" className="rounded-md bg-deep-700 px-3 py-2 font-medium text-cloth-50">{n}</span>
            ) : (
              <Link to={to(n)} aria-label={`Page ${n}`} className="rounded-md px-3 py-2 hover:bg-cloth-100">{n}</Link>
            )}
          </li>
        ))}
      </ul>
      {page < pages ? <Link to={to(page + 1)} rel="next" className={quietButtonClass}>Next page</Link> : null}
    </nav>
  );
}

// ---------------------------------------------------------------------------------------------
// Narrowing: each choice is a link (no script needed) with the number of results it would give.

function FacetPanel({ facets, active, params, leftOut }: { facets: Facets; active: ResultsData["active"]; params: URLSearchParams; leftOut: LeftOutFilters }) {
  return (
    <aside id="narrow" aria-label="Narrow the results" className="scroll-mt-4 text-step--1 md:order-first">
      <h2 className="text-step-0 font-semibold text-deep-900">Narrow the results</h2>
      {!facets.counted && (
        <p className="mt-1 text-ink-soft">Too many matches to count for each choice; choose one to narrow.</p>
      )}
      <FacetList
        title="Kind"
        param="type"
        current={active.kind}
        anyLabel="All kinds"
        options={facets.kinds.map((k) => ({ value: k.value, label: KIND_LABEL[k.value as SearchKind].many, count: k.count }))}
        params={params}
        counted={facets.counted}
      />
      <FacetList title="System" param="system" current={params.get("system")} anyLabel="Any system" options={facets.systems} params={params} counted={facets.counted}>
        <UnknownTag leftOut={leftOut} which="system" links={params} />
      </FacetList>
      <FacetList title="Zone of the boat" param="zone" current={params.get("zone")} anyLabel="Anywhere aboard" options={facets.zones} params={params} counted={facets.counted}>
        <UnknownTag leftOut={leftOut} which="zone" links={params} />
      </FacetList>
      <FacetList
        title="Applies to"
        param="hull"
        current={active.hull?.text ?? null}
        anyLabel="Every hull"
        options={facets.hulls.map((h) => ({ value: h.value, label: h.label, count: h.count }))}
        params={params}
        counted={facets.counted}
      />
      <FacetList
        title="Measurements"
        param="measured"
        current={active.measured ? "true" : null}
        anyLabel="With or without"
        options={[{ value: "true", label: "With measured spaces", count: facets.measured }]}
        params={params}
        counted={facets.counted}
      />
      {facets.years.length > 0 && (
        <FacetList title="Published in" param="year" current={active.year ? String(active.year) : null} anyLabel="Any year" options={facets.years} params={params} counted={facets.counted} />
      )}
    </aside>
  );
}

function FacetList({
  title, param, current, anyLabel, options, params, counted, children,
}: {
  children?: React.ReactNode;
  title: string;
  param: string;
  current: string | null;
  anyLabel: string;
  options: { value: string; label: string; count: number }[];
  params: URLSearchParams;
  /** False: the choices are offered without counts (too many matches to count). */
  counted: boolean;
}) {
  const id = `facet-${param}`;
  return (
    <section aria-labelledby={id} className="mt-5">
      <h3 id={id} className="font-semibold uppercase tracking-wide text-ink-soft">{title}</h3>
      {children}
      <ul className="mt-1.5 grid gap-0.5">
        <li>
          {current ? (
            <Link to={searchHref(params, { [param]: null })} className="block rounded px-2 py-1 hover:bg-cloth-100">{anyLabel}</Link>
          ) : (
            <span className="block rounded px-2 py-1 font-medium text-deep-900" aria-current="true">{anyLabel}</span>
          )}
        </li>
        {/* A choice that would give nothing is left out (as the systems and zones with no result are). */}
        {options.filter((o) => !counted || o.count > 0 || current === o.value).map((o) => {
          const on = current === o.value;
          const label = counted ? `${o.label} (${o.count})` : o.label;
          return (
            <li key={o.value}>
              {on ? (
                <span aria-current="true" className="flex justify-between gap-2 rounded bg-deep-700 px-2 py-1 font-medium text-cloth-50">
                  <span>{o.label}</span>{counted && <span>({o.count})</span>}
                </span>
              ) : (
                <Link to={searchHref(params, { [param]: o.value })} aria-label={label} className="flex justify-between gap-2 rounded px-2 py-1 hover:bg-cloth-100">
                  <span>{o.label}</span>{counted && <span className="text-ink-soft">({o.count})</span>}
                </Link>
              )}
            </li>
          );
        })}
      </ul>
    </section>
  );
}

function ActiveFilters({ active, params, words }: { active: ResultsData["active"]; params: URLSearchParams; words: string }) {
  const chips: { label: string; remove: Record<string, string | null> }[] = [];
  if (active.kind) chips.push({ label: `Only ${KIND_LABEL[active.kind].many.toLowerCase()}`, remove: { type: null } });
  if (active.system) chips.push({ label: `System: ${active.system}`, remove: { system: null } });
  if (active.zone) chips.push({ label: `Zone: ${active.zone}`, remove: { zone: null } });
  if (active.hull) chips.push({ label: `Applies to ${active.hull.label}`, remove: { hull: null } });
  if (active.measured) chips.push({ label: "With measured spaces", remove: { measured: null } });
  if (active.year) chips.push({ label: `Published in ${active.year}`, remove: { year: null } });
  if (active.fit) {
    chips.push({
      label: `Must fit ${active.fit.text}${active.fit.upright ? ", upright" : ""}`,
      remove: active.fit.fromWords ? { q: words || null, fit: null, upright: null } : { fit: null, upright: null },
    });
  }
  if (!chips.length) return null;
  return (
    <ul aria-label="Narrowed by" className="mb-3 flex flex-wrap gap-2 text-step--1">
      {chips.map((c) => (
        <li key={c.label} className="flex items-center gap-2 rounded-sm border border-deep-200 bg-deep-50 px-2 py-1 text-deep-700">
          {c.label}
          <Link to={searchHref(params, c.remove)} aria-label={`Remove: ${c.label}`} className="font-semibold no-underline">×</Link>
        </li>
      ))}
    </ul>
  );
}

function NothingFound({ d }: { d: ResultsData }) {
  return (
    <div className="mt-4 max-w-2xl rounded-lg bg-cloth-100 p-5">
      <p className="font-medium">
        {d.answer.onlyCommonWords
          ? "Those are all very common words, so there is nothing to look for. Add a word that says what the job is about."
          : "Nothing published matches that search yet."}
      </p>
      {d.filtered && d.words && (
        <p className="mt-2">
          <Link to={searchHref(new URLSearchParams({ q: d.words }), {})}>Search for the words without the filters</Link>
        </p>
      )}
      <SyntaxHelp />
    </div>
  );
}

function SyntaxHelp({ intro = false }: { intro?: boolean }) {
  const example = (q: string) => (
    <Link to={`/search?q=${encodeURIComponent(q)}`} className="font-mono text-[0.95em]">{q}</Link>
  );
  return (
    <div className={intro ? "mt-6 max-w-2xl" : "mt-4"}>
      {intro && (
        <p className="text-ink-soft">
          Type what you would ask another owner. One search looks through the published write-ups, the measured spaces
          and the catalogue of items.
        </p>
      )}
      <h2 className={intro ? "mt-5 text-step-1 font-semibold" : "mt-3 font-semibold"}>How to search</h2>
      <ul className="mt-2 grid gap-1.5 text-step--1">
        <li>Plain words find what has all of them: {example("battery box under the settee")}</li>
        <li>Quotes keep words together as a phrase: {example('"cockpit locker" tray')}</li>
        <li>A minus leaves a word out: {example("battery -outboard")}</li>
        <li>“or” finds either word: {example("lazarette or transom")}</li>
        <li>Sizes find what fits: {example("what fits 13 x 7 x 9 1/2 in upright")}</li>
        <li>
          The class's other words for the same thing are searched too: a settee is also a berth or a bunk, the forepeak
          the V-berth, the stern locker the lazarette, the head the toilet.
        </li>
      </ul>
    </div>
  );
}

/** What was left out of this search because it could not be read, in a sentence each. */
function LeftOutSentences({ leftOut }: { leftOut: LeftOutFilters }) {
  const sentences = [
    leftOut.hull && "This search is for every hull: the hull you gave could not be read, so it is left out until you correct it above.",
    leftOut.fit && "This search does not check what fits: the size you gave could not be read, so it is left out until you correct it above.",
    leftOut.system && "This search is for every system: the system asked for is not one of the class's, so it is left out until you choose one under Narrow the results.",
    leftOut.zone && "This search is for anywhere aboard: the zone asked for is not one of the class's, so it is left out until you choose one under Narrow the results.",
  ].filter(Boolean);
  if (!sentences.length) return null;
  return (
    <div id="search-left-out" className="mb-3 rounded-md border-l-4 border-bootstripe-600 bg-bootstripe-50 p-3 text-step--1 text-bootstripe-800">
      {sentences.map((x) => <p key={x as string}>{x}</p>)}
    </div>
  );
}

/** A system or zone of the address that the class does not have, with those it has. */
function UnknownTag({ leftOut, which, links }: { leftOut: LeftOutFilters; which: "system" | "zone"; links: URLSearchParams }) {
  const unknown = leftOut[which];
  if (!unknown) return null;
  return (
    <div id={`search-${which}-error`} role="alert" className="mt-1.5 rounded-md border-l-4 border-bootstripe-600 bg-bootstripe-50 p-2 text-bootstripe-800">
      <p className="font-medium">
        There is no {which} “{unknown.typed}”. The {which === "system" ? "systems" : "zones"} are:
      </p>
      <ul className="mt-1 flex flex-wrap gap-x-3 gap-y-0.5">
        {unknown.choices.map((c) => (
          <li key={c.slug}><Link to={searchHref(links, { [which]: c.slug })}>{c.name}</Link></li>
        ))}
      </ul>
    </div>
  );
}
