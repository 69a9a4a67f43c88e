// The search's pure parts: reading its parameters, sizes among the words, snippets and their
// highlights, the words behind "did you mean".
import fc from "fast-check";
import { describe, expect, it } from "vitest";
import {
  anyOfWords, dimensionsInQuery, escapeHtml, hasSearchWords, HIT_END, HIT_START, parseHullFilter, parseSearchParams, queryInQuotes,
  queryWords, readHeadline, replaceWords, searchHref, snippetHtml, snippetParts, typeaheadWords, usesSyntax, wordStarts,
} from "~/domain/search";
import { describeHullRangeInSentence, parseAppliesTo } from "~/domain/hulls";

const IN = 25.4; // mm, exact by definition (NIST Handbook 44, Appendix C)

function parse(query: string, mode: "api" | "page" = "api") {
  return parseSearchParams(new URLSearchParams(query), mode);
}

describe("the query as the page shows it", () => {
  it("has words to look for only with a letter or a digit: punctuation alone, or 'or' alone, has none", () => {
    for (const q of ["!!!", "?", "-- ...", '""', "or", "  "]) expect(hasSearchWords(q), q).toBe(false);
    for (const q of ["battery", "12v", "the", "\"house battery\"", "-outboard"]) expect(hasSearchWords(q), q).toBe(true);
  });

  it("is quoted once: a quoted query keeps its own quotes, made curly, and gets no second pair", () => {
    expect(queryInQuotes("battery box")).toBe("“battery box”");
    expect(queryInQuotes('"house battery"')).toBe("“house battery”");
    expect(queryInQuotes('"cockpit locker" tray')).toBe("“cockpit locker” tray");
    expect(queryInQuotes("“house battery”")).toBe("“house battery”");
  });

  it("names hulls in lower case in the middle of a sentence, the variants as they are written", () => {
    expect(describeHullRangeInSentence({ from: 318, to: 318 })).toBe("hull 318");
    expect(describeHullRangeInSentence({ from: 120, to: 298 })).toBe("hulls 120–298");
    expect(describeHullRangeInSentence({ from: 299, to: 612 })).toBe("Mk II (hulls 299–612)");
    expect(describeHullRangeInSentence({ from: 1, to: 612 })).toBe("all hulls");
  });
});

describe("reading the parameters", () => {
  it("defaults: 20 results from the first for the API, pages of 10 for the page", () => {
    const api = parse("q=settee");
    expect(api).toMatchObject({ ok: true, request: { q: "settee", limit: 20, offset: 0 } });
    const page = parse("q=settee&page=3", "page");
    expect(page).toMatchObject({ ok: true, page: 3, request: { limit: 10, offset: 20 } });
  });

  it("reads every filter", () => {
    const r = parse("q=battery&system=electrical&zone=starboard-settee&hull=mk2&measured=true&year=2025&type=writeup&limit=5&offset=10");
    expect(r).toMatchObject({
      ok: true,
      request: {
        q: "battery", limit: 5, offset: 10,
        filters: { system: "electrical", zone: "starboard-settee", hull: { from: 299, to: 612, text: "mk2" }, measured: true, year: 2025, kind: "writeup", fit: null },
      },
    });
  });

  it("treats an empty value as absent", () => {
    expect(parse("q=battery&system=&hull=&limit=")).toMatchObject({ ok: true, request: { limit: 20, filters: { system: null, hull: null } } });
  });

  it("names the parameter that is wrong", () => {
    for (const [query, parameter] of [
      ["q=" + "x".repeat(201), "q"], ["limit=0", "limit"], ["limit=2.5", "limit"], ["offset=-3", "offset"],
      ["hull=0", "hull"], ["hull=mk9", "hull"], ["system=Electrical Things", "system"], ["zone=%3Cb%3E", "zone"],
      ["year=99999", "year"], ["type=boats", "type"], ["fit=13", "fit"], ["unit=cm", "unit"], ["upright=perhaps", "upright"],
      ["page=0", "page"],
    ] as const) {
      const r = parse(query, parameter === "page" ? "page" : "api");
      expect(r, query).toMatchObject({ ok: false, parameter });
      if (!r.ok) expect(r.message.startsWith(`${parameter}: `)).toBe(true);
    }
  });

  it("reads a hull as one hull, a variant or a range (the demo class: Mk I hulls 1-298, Mk II 299-612)", () => {
    expect(parseHullFilter("147")).toEqual({ from: 147, to: 147, text: "147" });
    expect(parseHullFilter("Hull #402")).toEqual({ from: 402, to: 402, text: "402" });
    expect(parseHullFilter("Mk I")).toEqual({ from: 1, to: 298, text: "mk1" });
    expect(parseHullFilter("mk2")).toEqual({ from: 299, to: 612, text: "mk2" });
    expect(parseHullFilter("120-298")).toEqual({ from: 120, to: 298, text: "120-298" });
    for (const bad of ["613", "0", "200-613", "all", "big"]) expect(parseHullFilter(bad)).toHaveProperty("error");
  });

  it("reads a range written the other way round as the same hulls (\"298-120\" is 120-298; common practice: a range is its two ends)", () => {
    expect(parseHullFilter("298-120")).toEqual({ from: 120, to: 298, text: "120-298" });
    expect(parseAppliesTo("298-120")).toEqual({ from: 120, to: 298 });
    expect(parseAppliesTo("612 to 299")).toEqual({ from: 299, to: 612 });
    expect(parseAppliesTo("613-1")).toHaveProperty("error"); // the demo class's hulls are 1-612
  });

  it("on the page, leaves out a hull or a size it cannot read and says why in a sentence for the field; the API refuses them", () => {
    const hull = parse("q=battery&hull=999&system=electrical", "page");
    expect(hull).toMatchObject({ ok: true, request: { q: "battery", filters: { hull: null, system: "electrical" } } });
    if (!hull.ok) return;
    expect(hull.leftOut.hull).toBe("There is no hull 999: the class's hulls are numbered 1 to 612. Give one of those, a variant (Mk I, Mk II) or a range such as 120-298.");
    const fit = parse("q=battery&fit=13 by seven", "page");
    expect(fit).toMatchObject({ ok: true, fitTyped: "13 by seven", request: { q: "battery", filters: { fit: null } } });
    if (!fit.ok) return;
    expect(fit.leftOut.fit).toBe('Enter 3 sizes separated by "x", like 13 x 7 x 9 1/2 in.');
    expect(fit.leftOut.fit?.startsWith("fit:")).toBe(false);
    expect(parse("q=battery&fit=" + "9 ".repeat(50), "page")).toMatchObject({ ok: true, leftOut: { fit: expect.any(String) } });
    expect(parse("q=battery", "page")).toMatchObject({ ok: true, leftOut: {} });
    expect(parse("q=battery&hull=999")).toMatchObject({ ok: false, parameter: "hull" });
    expect(parse("q=battery&fit=13 by seven")).toMatchObject({ ok: false, parameter: "fit" });
  });

  it("reads the dimension filter in the unit given", () => {
    const r = parse("fit=13 x 6 13/16 x 9 7/16&upright=true");
    if (!r.ok) throw new Error(r.message);
    // BCI group size chart, group 31: 13 x 6 13/16 x 9 7/16 in = 330.2 x 173.0375 x 239.7125 mm.
    expect(r.request.filters.fit?.box.length).toBeCloseTo(13 * IN, 9);
    expect(r.request.filters.fit?.box.width).toBeCloseTo((6 + 13 / 16) * IN, 9);
    expect(r.request.filters.fit?.box.height).toBeCloseTo((9 + 7 / 16) * IN, 9);
    expect(r.request.filters.fit?.orientation).toBe("upright");
    const mm = parse("fit=330 x 173 x 240&unit=mm");
    if (!mm.ok) throw new Error(mm.message);
    expect(mm.request.filters.fit?.box).toEqual({ length: 330, width: 173, height: 240 });
    expect(mm.request.filters.fit?.orientation).toBe("any");
  });
});

describe("sizes among the words", () => {
  it('reads "what fits 13 x 7 x 9 1/2 in, upright?" as a box and no words', () => {
    const r = dimensionsInQuery("what fits 13 x 7 x 9 1/2 in, upright?", "in");
    expect(r?.words).toBe("");
    expect(r?.fit.orientation).toBe("upright");
    expect(r?.fit.box.length).toBeCloseTo(330.2, 9);
    expect(r?.fit.box.width).toBeCloseTo(177.8, 9);
    expect(r?.fit.box.height).toBeCloseTo(241.3, 9);
  });

  it("keeps the other words, reads millimetres and the word 'by'", () => {
    const r = dimensionsInQuery("cooler 500 by 300 by 350 mm under the cockpit", "in");
    expect(r?.words).toBe("cooler under the cockpit");
    expect(r?.fit).toMatchObject({ unit: "mm", orientation: "any", box: { length: 500, width: 300, height: 350 } });
  });

  it("leaves words without three sizes alone", () => {
    for (const q of ["group 27 battery", "battery 13 x 7", "1/2 in plywood", "6 AWG cable 12 ft"]) expect(dimensionsInQuery(q, "in")).toBeNull();
  });

  it("turns sizes in q into the dimension filter when no fit parameter is given", () => {
    const r = parse("q=battery 13x7x9.5 upright");
    if (!r.ok) throw new Error(r.message);
    expect(r.request.q).toBe("battery");
    expect(r.request.filters.fit?.box.height).toBeCloseTo(9.5 * IN, 9);
  });
});

describe("snippets", () => {
  const marked = `the ${HIT_START}battery${HIT_END} box under the ${HIT_START}settee${HIT_END}`;

  it("turns the database's markers into highlights of plain text", () => {
    const s = readHeadline(marked);
    expect(s.text).toBe("the battery box under the settee");
    expect(s.highlights.map(([a, b]) => s.text.slice(a, b))).toEqual(["battery", "settee"]);
    expect(snippetParts(s)).toEqual([
      { text: "the ", hit: false }, { text: "battery", hit: true }, { text: " box under the ", hit: false }, { text: "settee", hit: true },
    ]);
  });

  it("marks where one block of the text ends and the next begins, and keeps the highlights on their words", () => {
    const s = readHeadline("Why move it\nOn a Mk I the \u0002battery\u0003 sat forward.\n\n");
    expect(s.text).toBe("Why move it · On a Mk I the battery sat forward.");
    expect(s.highlights.map(([a, b]) => s.text.slice(a, b))).toEqual(["battery"]);
  });

  it("collapses whitespace and keeps each highlight on its word", () => {
    fc.assert(
      fc.property(
        fc.array(fc.tuple(fc.stringMatching(/^[a-z<>&"' ]{0,6}$/), fc.boolean(), fc.constantFrom(" ", "\n", "\t ", "  ")), { maxLength: 12 }),
        (pieces) => {
          const words = pieces.map(([w, hit, gap]) => (hit && w.trim() ? `${HIT_START}${w.trim()}${HIT_END}` : w) + gap);
          const s = readHeadline(words.join(""));
          expect(s.text).not.toMatch(/\s\s|[\u0002\u0003]/);
          const hits = pieces.filter(([w, hit]) => hit && w.trim()).map(([w]) => w.trim().replace(/\s+/g, " "));
          expect(s.highlights.map(([a, b]) => s.text.slice(a, b))).toEqual(hits);
        },
      ),
    );
  });

  it("gives the API HTML in which only <mark> is markup (OWASP XSS Filter Evasion vectors as text)", () => {
    const hostile = `<script>alert(1)</script> <IMG SRC=x onerror=alert(1)> ${HIT_START}"><svg/onload=alert(1)>${HIT_END} &amp; '`;
    const html = snippetHtml(readHeadline(hostile));
    expect(html).toBe(
      "&lt;script&gt;alert(1)&lt;/script&gt; &lt;IMG SRC=x onerror=alert(1)&gt; <mark>&quot;&gt;&lt;svg/onload=alert(1)&gt;</mark> &amp;amp; &#39;",
    );
    expect(escapeHtml(`<a href="x">'&'</a>`)).toBe("&lt;a href=&quot;x&quot;&gt;&#39;&amp;&#39;&lt;/a&gt;");
  });
});

describe("the query's words", () => {
  it("knows the syntax", () => {
    expect(usesSyntax('"cockpit locker"')).toBe(true);
    expect(usesSyntax("battery -outboard")).toBe(true);
    expect(usesSyntax("bunk or berth")).toBe(true);
    expect(usesSyntax("v-berth shelf")).toBe(false);
    expect(usesSyntax("battery box under the settee")).toBe(false);
  });

  it("loosens plain words to any of them, never a query with syntax", () => {
    expect(anyOfWords("Lazarette shelf")).toBe("lazarette or shelf");
    expect(anyOfWords("battery")).toBeNull();
    expect(anyOfWords('"stern locker" shelf')).toBeNull();
  });

  it("replaces whole words and keeps the rest as typed", () => {
    expect(queryWords('Baterry "V-berth" -outboard or')).toEqual(["baterry", "v-berth", "outboard"]);
    expect(replaceWords('Baterry "V-berth" -outboard', new Map([["baterry", "battery"]]))).toBe('battery "V-berth" -outboard');
  });

  it("splits type-ahead into whole words and a beginning", () => {
    expect(typeaheadWords("group 27 batt")).toEqual({ whole: ["group", "27"], prefix: "batt" });
    expect(typeaheadWords("settee ")).toEqual({ whole: ["settee"], prefix: null });
    expect(typeaheadWords("'); drop--")).toEqual({ whole: [], prefix: "drop" });
  });

  it("gives the beginnings of the typed words where a snippet should start (lower case and capitalised)", () => {
    // Our own rule (docs/decisions/0008): four letters of a longer word, a short word whole.
    expect(wordStarts("battery box -outboard")).toEqual(["batt", "Batt", "box", "Box", "outb", "Outb"]);
    expect(wordStarts("the \"V-berth\"")).toEqual(["the", "The", "v-be", "V-be"]);
    expect(wordStarts("   ")).toEqual([]);
  });

  it("builds the page's links: changes a parameter and goes back to page 1", () => {
    const now = new URLSearchParams("q=battery&system=electrical&page=3");
    expect(searchHref(now, { hull: "mk1" })).toBe("/search?q=battery&system=electrical&hull=mk1");
    expect(searchHref(now, { system: null })).toBe("/search?q=battery");
    expect(searchHref(now, { page: "4" })).toBe("/search?q=battery&system=electrical&page=4");
  });
});
