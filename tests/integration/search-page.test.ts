// The search page (/search) through its route module: what its loader finds for an address, and
// the HTML its component renders for that (React's server renderer, as the page's first answer is
// made), against a database of this file's own with the demo content.
import { createElement } from "react";
import { renderToString } from "react-dom/server";
import { createRoutesStub } from "react-router";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { appDatabase, closeAppDatabase, getRequest, settle } from "../support/app";

let t: Awaited<ReturnType<typeof appDatabase>>;
let route: typeof import("~/routes/search");

beforeAll(async () => {
  t = await appDatabase("template_seeded");
  route = await import("~/routes/search");
});
afterAll(() => closeAppDatabase(t));

type Loaded = { status: number; data: any };

async function load(query: string): Promise<Loaded> {
  const r = await settle(() => route.loader({ request: getRequest(`/search?${query}`), params: {}, context: {} } as never));
  if (r.thrown || r.response) throw new Error(`the loader answered ${r.status} with a Response`);
  return { status: r.status, data: r.data };
}

/** The page's HTML for an address, as the server renders it (the loader's data given to the component). */
async function render(query: string): Promise<{ status: number; data: any; html: string; text: string }> {
  const { status, data } = await load(query);
  const Stub = createRoutesStub([{ id: "search", path: "/search", Component: route.default as never, loader: () => data, HydrateFallback: () => null }]);
  const html = renderToString(
    createElement(Stub, { initialEntries: [`/search?${query}`], hydrationData: { loaderData: { search: data } } } as never),
  );
  return { status, data, html, text: textOf(html) };
}

/** The words of some HTML as a reader sees them. */
function textOf(html: string): string {
  return html.replace(/<!-- -->/g, "").replace(/<\/?(?:a|em|span|mark|strong|code)\b[^>]*>/g, "").replace(/<[^>]+>/g, " ")
    .replace(/&quot;/g, '"').replace(/&#x27;/g, "'").replace(/&amp;/g, "&").replace(/\s+/g, " ");
}

const titles = (data: any): string[] => data.answer.results.map((r: { type: string; id: number }) => `${r.type}:${r.id}`);

describe("a hull or a size that cannot be read (the rule: a message beside the field, nothing typed lost)", () => {
  it("runs the rest of the search without the hull, and says so beside the hull field", async () => {
    const without = await load("q=battery");
    const page = await render("q=battery&hull=999");
    expect(page.status).toBe(400);
    expect(page.data.state).toBe("results");
    expect(page.data.answer.total).toBe(without.data.answer.total);
    expect(titles(page.data)).toEqual(titles(without.data));
    expect(page.data.answer.total).toBeGreaterThan(0);

    // The field: marked invalid, described by its message, and still holding what was typed.
    const input = /<input[^>]*id="search-hull"[^>]*>/.exec(page.html)?.[0] ?? "";
    expect(input).toContain('aria-invalid="true"');
    expect(input).toContain('aria-describedby="search-hull-error search-hull-hint"');
    expect(input).toContain('value="999"');
    expect(page.html).toMatch(/<p id="search-hull-error"[^>]*>There is no hull 999: the class&#x27;s hulls are numbered 1 to 612\. Give one of those/);
    expect(page.text).not.toMatch(/hull: (a hull|there)/i);
    expect(page.text).not.toContain("could not be read:");
    expect(page.text).toContain("This search is for every hull: the hull you gave could not be read, so it is left out until you correct it above.");
    // The page's links do not carry the bad hull on.
    expect(page.html).not.toMatch(/href="[^"]*hull=999/);
  });

  it("runs the rest of the search without the size, and says so beside the 'must fit' field", async () => {
    const without = await load("q=battery");
    const page = await render("q=battery&fit=13+by+seven");
    expect(page.status).toBe(400);
    expect(titles(page.data)).toEqual(titles(without.data));
    const input = /<input[^>]*id="search-fit"[^>]*>/.exec(page.html)?.[0] ?? "";
    expect(input).toContain('aria-invalid="true"');
    expect(input).toContain('aria-describedby="search-fit-error search-fit-hint"');
    expect(input).toContain('value="13 by seven"');
    expect(page.html).toMatch(/<p id="search-fit-error"[^>]*>Enter 3 sizes separated by &quot;x&quot;, like 13 x 7 x 9 1\/2 in\.<\/p>/);
    expect(page.text).not.toMatch(/fit: enter/i);
    expect(page.text).toContain("the size you gave could not be read, so it is left out until you correct it above");
  });

  it("marks the field even when the hull was the only thing asked", async () => {
    const page = await render("hull=999");
    expect(page.status).toBe(400);
    expect(page.data.state).toBe("start");
    expect(/<input[^>]*id="search-hull"[^>]*>/.exec(page.html)?.[0]).toContain('aria-invalid="true"');
  });

  it("reads a range written the other way round", async () => {
    const a = await load("q=battery&hull=298-120");
    const b = await load("q=battery&hull=120-298");
    expect(a.status).toBe(200);
    expect(a.data.active.hull.label).toBe("hulls 120–298");
    expect(titles(a.data)).toEqual(titles(b.data));
  });
});

describe("a page past the last", () => {
  it("says there is no such page and links to the last and the first, with no range of results", async () => {
    const first = await load("q=battery");
    const pages = Math.ceil(first.data.answer.total / 10);
    expect(pages).toBeGreaterThan(1); // the demo content has more than one page of battery results
    const page = await render(`q=battery&page=${pages + 3}`);
    expect(page.status).toBe(404);
    expect(page.text).toContain(`There is no page ${pages + 3}: these results have ${pages} pages.`);
    expect(page.html).toContain(`href="/search?q=battery&amp;page=${pages}"`);
    expect(page.html).toContain('href="/search?q=battery"');
    expect(page.text).not.toMatch(/\d+–\d+ shown/);
    expect(page.text).not.toContain(`of ${pages})`);
    // The last page itself is still a page.
    const last = await render(`q=battery&page=${pages}`);
    expect(last.status).toBe(200);
    expect(last.text).toContain(`(page ${pages} of ${pages})`);
  });
});

describe("a query with no words", () => {
  it("does not list everything for punctuation alone, and says there is nothing to look for", async () => {
    for (const q of ["!!!", "?%3F", "or"]) {
      const page = await render(`q=${q}`);
      expect(page.data.state, q).toBe("no-words");
      expect(page.text).toContain(": a search needs a word. Add one that says what the job is about.");
      expect(page.html).not.toContain("search-summary");
    }
  });
});

describe("the page's words", () => {
  it("quotes a quoted query once in its heading", async () => {
    const page = await render("q=%22house+battery%22");
    expect(page.html).toMatch(/<h1[^>]*>Write-ups, spaces and items matching (<!-- -->)?“house battery”<\/h1>/);
  });

  it("names a hull in lower case in its filter chip", async () => {
    const page = await render("q=battery&hull=318");
    expect(page.text).toContain("Applies to hull 318");
    expect(page.text).not.toContain("Applies to Hull 318");
  });

  it("leaves out every choice that would give nothing, and shows the others' counts alike", async () => {
    const page = await render("q=battery&hull=318");
    const facets = page.data.facets;
    expect(facets.counted).toBe(true);
    const aside = /<aside[^>]*id="narrow"[\s\S]*?<\/aside>/.exec(page.html)?.[0] ?? "";
    // The kinds with no battery result in hull 318 (worked out from the loader's own counts).
    const zero = facets.kinds.filter((k: { count: number }) => k.count === 0);
    const some = facets.kinds.filter((k: { count: number }) => k.count > 0);
    expect(some.length).toBeGreaterThan(0);
    for (const k of some) expect(aside).toContain(`(${k.count})`);
    expect(aside).not.toMatch(/<span>0<\/span>/);
    // The choice in force shows its count as the others do, in brackets.
    const chosen = facets.hulls.find((h: { value: string }) => h.value === "318");
    expect(textOf(/<span aria-current="true"[^>]*>[\s\S]*?<\/span><\/span>/.exec(aside)?.[0] ?? "").trim()).toBe(`Hull 318(${chosen.count})`); // two spans, side by side
    const labels = { writeup: "Write-ups", space: "Spaces", item: "Catalogue items" } as Record<string, string>;
    for (const k of zero) expect(aside).not.toContain(`aria-label="${labels[k.value]} (0)"`);
  });

  it("says 'tightest fit first' for a size alone", async () => {
    const page = await render("fit=13+x+7+x+9");
    expect(page.text).toContain("tightest fit first");
    expect(page.text).not.toContain("snuggest");
  });

  it("offers a link to the filters beside the count (for a phone, where they come after the results)", async () => {
    const page = await render("q=battery");
    expect(page.html).toMatch(/<a href="#narrow"[^>]*>Narrow the results<\/a>/);
    expect(page.html).toMatch(/<aside id="narrow"/);
    expect(page.html).toContain('role="search"');
  });
});

describe("a system or zone the class does not have", () => {
  it("names the systems there are beside the system filter, and still shows the results", async () => {
    const without = await load("q=battery");
    const page = await render("q=battery&system=nope");
    expect(page.status).toBe(400);
    expect(titles(page.data)).toEqual(titles(without.data));
    const { db } = await import("~/db/index.server");
    const { searchTaxonomy } = await import("~/models/search.server");
    const { systems } = await searchTaxonomy(db);
    const aside = /<aside[^>]*id="narrow"[\s\S]*?<\/aside>/.exec(page.html)?.[0] ?? "";
    const systemSection = /<section aria-labelledby="facet-system"[\s\S]*?<\/section>/.exec(aside)?.[0] ?? "";
    expect(textOf(systemSection)).toContain("There is no system “nope”. The systems are:");
    for (const s of systems) expect(systemSection).toContain(`href="/search?q=battery&amp;system=${s.slug}"`);
    expect(page.text).not.toContain("There is no such system.");
    expect(page.text).toContain("This search is for every system");
  });

  it("treats a system or zone that is not even the shape of one the same way", async () => {
    const without = await load("q=battery");
    const page = await render("q=battery&system=Electrical+Things&zone=%3Cb%3E");
    expect(page.status).toBe(400);
    expect(page.data.state).toBe("results");
    expect(titles(page.data)).toEqual(titles(without.data));
    expect(page.text).toContain("There is no system “Electrical Things”. The systems are:");
    expect(page.text).toContain("There is no zone “&lt;b&gt;”. The zones are:"); // shown as text, not markup
    expect(page.html).not.toContain("<b>");
  });
});

describe("a query that finds nothing, with a 'did you mean' that finds something", () => {
  it("shows what the suggestion finds, with a link that searches the words as typed", async () => {
    const typed = await load("q=chianplates&typed=1");
    expect(typed.data.answer.total).toBe(0);
    const suggestion = typed.data.answer.suggestion as string;
    expect(suggestion).toBeTruthy();
    const instead = await load(`q=${encodeURIComponent(suggestion)}`);
    expect(instead.data.answer.total).toBeGreaterThan(0);

    const page = await render("q=chianplates");
    expect(titles(page.data)).toEqual(titles(instead.data));
    expect(page.text).toContain(`Showing results for ${suggestion}. Search for chianplates instead.`);
    expect(page.html).toContain('href="/search?q=chianplates&amp;typed=1"');
  });
});

describe("the order of the kinds on a page", () => {
  it("puts the write-ups first for words, and the spaces that take the box first when something must fit", async () => {
    // Each kind's group of results has a heading with the id group-<kind>.
    const heading = (html: string, kind: string) => html.indexOf(`id="group-${kind}"`);
    const words = await render("q=battery");
    expect(heading(words.html, "space")).toBeGreaterThan(-1);
    expect(heading(words.html, "writeup")).toBeGreaterThan(-1);
    expect(heading(words.html, "writeup")).toBeLessThan(heading(words.html, "space"));
    const sized = await render(`q=${encodeURIComponent("what fits 13 x 7 x 9 1/2 in upright")}`);
    expect(heading(sized.html, "writeup")).toBeGreaterThan(-1);
    expect(heading(sized.html, "space")).toBeGreaterThan(-1);
    expect(heading(sized.html, "space")).toBeLessThan(heading(sized.html, "writeup"));
  });
});
