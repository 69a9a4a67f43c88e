import { describe, expect, it } from "vitest";
import { bciGroup } from "~/domain/battery-groups";
import { placeRow, rankSpaces, type Box, type Space } from "~/domain/fit";
import {
  candidateCorner, candidateRegions, CANDIDATE_SLACK_MM, describePlacement, fitAnswerJson, fitOpening, fitSections, inUnit,
  parseCheckParams, parseClearance, parseFitParams, readFitParams,
} from "~/domain/fit-search";
import { drawSpace } from "~/domain/drawing";

// 1 in = 25.4 mm, 1 ft = 12 in, 1 cm = 10 mm exactly (NIST Handbook 44, Appendix C).
const IN = 25.4;
const inches = (l: number, w: number, h: number): Box => ({ length: l * IN, width: w * IN, height: h * IN });
const q = (s: string) => new URLSearchParams(s);

function group(name: string): Box {
  const g = bciGroup(name); // BCI group size chart (maximum case sizes)
  if (!g) throw new Error(`no group ${name}`);
  return g.mm;
}

describe("parseFitParams (GET /api/fit)", () => {
  it("reads sizes as people type them, in the request's unit (NIST HB 44 App. C)", () => {
    const r = parseFitParams(q("length=13 1/2&width=343 mm&height=1 ft 1 1/2 in&unit=in"));
    if (!r.ok) throw new Error(r.message);
    expect(r.item.length).toBe(342.9); // 13.5 x 25.4
    expect(r.item.width).toBe(343);
    expect(r.item.height).toBe(342.9); // 12 + 1.5 = 13.5 in
    const mm = parseFitParams(q("length=330&width=34.3 cm&height=9 7/16 in&unit=mm"));
    if (!mm.ok) throw new Error(mm.message);
    expect(mm.item).toEqual({ length: 330, width: 343, height: 239.7125 }); // 9.4375 x 25.4
  });

  it("defaults: inches, any orientation, no clearance, one item, every hull", () => {
    const r = parseFitParams(q("length=13&width=7&height=9"));
    expect(r).toMatchObject({ ok: true, unit: "in", orientation: "any", clearanceMm: 0, count: 1, hull: null, limit: 50 });
  });

  it("refuses a hull number outside the class with a sentence that names the range (hulls 1-612 of the demo class)", () => {
    const r = parseFitParams(q("length=13&width=7&height=9&hull=9999"));
    expect(r).toEqual({ ok: false, parameter: "hull", message: "hull: must be a whole number from 1 to 612." });
  });

  it("reads upright, clearance, count and hull", () => {
    const r = parseFitParams(q("length=13&width=7&height=9&upright=true&clearance=1/2&count=2&hull=402"));
    expect(r).toMatchObject({ ok: true, orientation: "upright", clearanceMm: 12.7, count: 2, hull: 402 });
    expect(parseFitParams(q("length=13&width=7&height=9&upright=false"))).toMatchObject({ orientation: "any" });
  });

  it.each([
    ["width=7&height=9", "length"],
    ["length=13&width=seven&height=9", "width"],
    ["length=13&width=7&height=0", "height"],
    ["length=13&width=7&height=9&unit=cm", "unit"],
    ["length=13&width=7&height=9&upright=maybe", "upright"],
    ["length=13&width=7&height=9&clearance=-1", "clearance"],
    ["length=13&width=7&height=9&clearance=6", "clearance"],
    ["length=13&width=7&height=9&count=0", "count"],
    ["length=13&width=7&height=9&count=1.5", "count"],
    ["length=13&width=7&height=9&hull=613", "hull"],
    ["length=13&width=7&height=9&hull=abc", "hull"],
    ["length=13&width=7&height=9&limit=5000", "limit"],
  ])("%s is refused, naming %s", (query, parameter) => {
    const r = parseFitParams(q(query));
    expect(r.ok).toBe(false);
    if (!r.ok) {
      expect(r.parameter).toBe(parameter);
      expect(r.message.startsWith(`${parameter}: `)).toBe(true);
    }
  });
});

describe("readFitParams (the fit page: every field checked at once)", () => {
  it("names every parameter that is wrong, in the order of the form, not only the first", () => {
    // Width a word, height empty, a hull past the last of the demo class (hulls 1-612), a count of 0.
    const r = readFitParams(q("length=13&width=seven&height=&hull=999&count=0&clearance=6"));
    expect(r.ok).toBe(false);
    if (r.ok) return;
    expect(r.problems.map((p) => p.parameter)).toEqual(["width", "height", "clearance", "count", "hull"]);
    expect(r.problems.find((p) => p.parameter === "width")?.message).toMatch(/^width: Could not read "seven" as a length/);
    expect(r.problems.find((p) => p.parameter === "hull")?.message).toBe("hull: must be a whole number from 1 to 612.");
  });

  it("the API still answers with the first of them", () => {
    expect(parseFitParams(q("length=13&width=seven&height=&hull=999"))).toMatchObject({ ok: false, parameter: "width" });
  });

  it("reads a good query as parseFitParams does", () => {
    const query = q("length=13&width=6 13/16&height=9 7/16&upright=true&clearance=1/2&count=2&hull=402");
    expect(readFitParams(query)).toEqual(parseFitParams(query));
  });
});

describe("parseClearance", () => {
  it("zero in any spelling, fractions, and a cap of 4 in a side", () => {
    for (const zero of ["", "0", "0.0", "0 in", "0mm"]) expect(parseClearance(zero, "in")).toEqual({ ok: true, mm: 0 });
    expect(parseClearance("1/2", "in")).toEqual({ ok: true, mm: 12.7 });
    expect(parseClearance("3", "mm")).toEqual({ ok: true, mm: 3 });
    expect(parseClearance("4", "in")).toEqual({ ok: true, mm: 101.6 });
    expect(parseClearance("4 1/16", "in").ok).toBe(false);
  });
});

describe("parseCheckParams (GET /api/fit/check)", () => {
  it("reads two boxes, an opening and its face", () => {
    const r = parseCheckParams(q("item=13 x 6 13/16 x 9 7/16&space=14x8x11&opening=12x10&face=top&upright=true&clearance=1/4"));
    if (!r.ok) throw new Error(r.message);
    expect(r.item).toEqual(group("31")); // BCI group size chart, group 31
    const space = inches(14, 8, 11);
    for (const axis of ["length", "width", "height"] as const) expect(r.space[axis]).toBeCloseTo(space[axis], 9);
    expect(r.opening).toEqual({ width: 304.8, height: 254, face: "top" }); // 12 and 10 in, exact
    expect(r.orientation).toBe("upright");
    expect(r.clearanceMm).toBe(6.35);
  });

  it.each([
    ["space=14x8x11", "item"],
    ["item=13x7&space=14x8x11", "item"],
    ["item=13x7x9", "space"],
    ["item=13x7x9&space=14x8x11&opening=12", "opening"],
    ["item=13x7x9&space=14x8x11&opening=12x10&face=bottom", "face"],
    ["item=13x7x9&space=14x8x11&unit=ft", "unit"],
  ])("%s is refused, naming %s", (query, parameter) => {
    const r = parseCheckParams(q(query));
    expect(r.ok).toBe(false);
    if (!r.ok) expect(r.parameter).toBe(parameter);
  });
});

describe("fitSections: the consensus of the measurements replaces the main section", () => {
  it("medians by hand, the other sections as described", () => {
    const described = [inches(26.5, 14.5, 11.75), inches(26.5, 4.5, 6)];
    // Heights 11.75, 11.75, 12.75, 11.732 in: sorted 11.732, 11.75, 11.75, 12.75 -> median 11.75 (by hand).
    // Lengths 26.5, 26.375, 26.5, 26.496: sorted 26.375, 26.496, 26.5, 26.5 -> (26.496 + 26.5) / 2 = 26.498.
    const measured = [inches(26.5, 14.5, 11.75), inches(26.375, 14.625, 11.75), inches(26.5, 14.5, 12.75), inches(26.496, 14.528, 11.732)];
    const [main, shelf] = fitSections(described, measured);
    expect(main.height).toBeCloseTo(11.75 * IN, 9);
    expect(main.length).toBeCloseTo(26.498 * IN, 9);
    // Widths 14.5, 14.625, 14.5, 14.528: sorted 14.5, 14.5, 14.528, 14.625 -> 14.514.
    expect(main.width).toBeCloseTo(14.514 * IN, 9);
    expect(shelf).toEqual(described[1]);
  });

  it("no measurements: as described", () => {
    const described = [inches(10, 10, 10)];
    expect(fitSections(described, [])).toEqual(described);
  });
});

describe("the candidate region", () => {
  it("is the sorted item plus twice the clearance, less the slack", () => {
    const corner = candidateCorner(inches(7, 13, 9), "any", 12.7);
    expect(corner[0]).toBeCloseTo(14 * IN - CANDIDATE_SLACK_MM, 9); // 13 + 2 x 1/2
    expect(corner[1]).toBeCloseTo(10 * IN - CANDIDATE_SLACK_MM, 9);
    expect(corner[2]).toBeCloseTo(8 * IN - CANDIDATE_SLACK_MM, 9);
    const upright = candidateCorner(inches(7, 13, 9), "upright", 0);
    expect(upright.map((v) => (v + CANDIDATE_SLACK_MM) / IN)).toEqual([expect.closeTo(13, 9), expect.closeTo(7, 9), expect.closeTo(9, 9)]);
  });
});

describe("the candidate regions for a row", () => {
  it("one region each way the row can stand, searched upright: the row is a box n·d + (n − 1)·c long", () => {
    // Group 31 upright (13 x 6 13/16 x 9 7/16 in, BCI chart), two in a row, 1/2 in clearance (by hand):
    //   along the length: 2 x 13 + 1/2 = 26 1/2 by 6 13/16 by 9 7/16, plus 1 in each way -> 27 1/2, 7 13/16, 10 7/16;
    //   along the width: 13 by 2 x 6 13/16 + 1/2 = 14 1/8 -> sorted footprint 15 1/8, 14; height 10 7/16.
    const upright = candidateRegions(group("31"), "upright", IN / 2, 2);
    expect(upright.index).toBe("upright");
    expect(upright.corners.map((c) => c.map((v) => (v + CANDIDATE_SLACK_MM) / IN))).toEqual([
      [expect.closeTo(27.5, 9), expect.closeTo(7 + 13 / 16, 9), expect.closeTo(10 + 7 / 16, 9)],
      [expect.closeTo(15 + 1 / 8, 9), expect.closeTo(14, 9), expect.closeTo(10 + 7 / 16, 9)],
    ]);
    // Any way up: each of the three dimensions up, each of the other two along the row.
    const any = candidateRegions(group("31"), "any", 0, 2);
    expect(any.index).toBe("upright");
    expect(any.corners).toHaveLength(6);
    expect(candidateRegions(inches(10, 10, 10), "any", 0, 3).corners).toHaveLength(1); // a cube: one row shape
    expect(candidateRegions(group("31"), "any", IN / 2, 1)).toEqual({ index: "any", corners: [candidateCorner(group("31"), "any", IN / 2)] });
  });
});

describe("words and numbers", () => {
  it("describes placements in the space's terms", () => {
    expect(describePlacement({ length: "length", width: "width", height: "height" })).toBe("Upright, length fore and aft");
    expect(describePlacement({ length: "width", width: "length", height: "height" })).toBe("Upright, turned: width fore and aft");
    expect(describePlacement({ length: "length", width: "height", height: "width" })).toBe("On its side (width up), length fore and aft");
    expect(describePlacement({ length: "width", width: "height", height: "length" })).toBe("On its end (length up), width fore and aft");
  });

  it("numbers in the unit: 1/10,000 in or 1/100 mm", () => {
    expect(inUnit(342.9, "in")).toBe(13.5);
    expect(inUnit(1, "in")).toBe(0.0394); // 1 / 25.4 = 0.03937...
    expect(inUnit(342.9, "mm")).toBe(342.9);
    expect(inUnit(-0.000001, "in")).toBe(0);
    expect(Object.is(inUnit(-0.000001, "in"), -0)).toBe(false);
  });

  it("openings: a lid is a top face; a door in any side is a front face", () => {
    expect(fitOpening(100, 50, "top")).toEqual({ width: 100, height: 50, face: "top" });
    expect(fitOpening(100, 50, "side")).toEqual({ width: 100, height: 50, face: "front" });
    expect(fitOpening(100, 50, null)).toEqual({ width: 100, height: 50, face: "front" });
    expect(fitOpening(null, 50, "top")).toBeUndefined();
  });
});

describe("placeRow and rankSpaces with a count", () => {
  const g24 = group("24"); // BCI group size chart: 10 1/4 x 6 13/16 x 8 7/8 in
  const c = IN / 4;
  // 3 x 10 1/4 + 4 x 1/4 = 31 3/4 in along; 6 13/16 + 1/2 = 7 5/16 across; 8 7/8 + 1/2 = 9 3/8 up (by hand).
  const section = inches(33, 7 + 5 / 16, 9 + 3 / 8);

  it("three group 24 cases in a row, and the room left with them in place", () => {
    const row = placeRow(g24, section, "upright", c, 3);
    expect(row?.axis).toBe("length");
    expect(row?.placement).toEqual({ length: "length", width: "width", height: "height" });
    // 33 - 3 x 10 1/4 = 2 1/4 in along (the four gaps of 1/4 in are part of it); 1/2 across and up.
    expect(row!.leftoverMm.length / IN).toBeCloseTo(2.25, 9);
    expect(row!.leftoverMm.width / IN).toBeCloseTo(0.5, 9);
    expect(row!.leftoverMm.height / IN).toBeCloseTo(0.5, 9);
    expect(placeRow(g24, section, "upright", c, 4)).toBeNull();
  });

  it("rankSpaces leaves out a space that takes one but not the row asked for", () => {
    type Named = Space & { name: string };
    const spaces: Named[] = [
      { name: "one only", sections: [inches(12, 8, 10)] },
      { name: "two in a row", sections: [inches(22, 8, 10)] },
      { name: "two across", sections: [inches(11, 15, 10)] },
    ];
    expect(rankSpaces(g24, spaces, { orientation: "upright" }).map((r) => r.space.name)).toEqual(["one only", "two across", "two in a row"]);
    const two = rankSpaces(g24, spaces, { orientation: "upright", count: 2 });
    expect(two.map((r) => r.space.name)).toEqual(["two across", "two in a row"]);
    // 2 x 10 1/4 = 20 1/2 <= 22 along; 2 x 6 13/16 = 13 5/8 <= 15 across (by hand).
    expect(two[0].row).toMatchObject({ count: 2, axis: "width" });
    expect(two[1].row).toMatchObject({ count: 2, axis: "length" });
  });
});

describe("the API's answer", () => {
  it("gives clearances in the request's unit", () => {
    const params = parseFitParams(q("length=13&width=6 13/16&height=9 7/16&upright=true&clearance=1/2"));
    if (!params.ok) throw new Error(params.message);
    const section = inches(15.5, 13.5, 14.75);
    const row = placeRow(params.item, section, "upright", params.clearanceMm, 1)!;
    const answer = fitAnswerJson(params, [{
      spaceId: 1, slug: "s", name: "S", zone: { slug: "z", name: "Z" }, hulls: { from: 1, to: 612 },
      verdict: "fits", throughOpening: true, opening: { width: 12.5 * IN, height: 12 * IN, face: "front" },
      section: { position: 0, label: "main", box: section }, row,
    }]);
    expect(answer.item).toEqual({ length: 13, width: 6.8125, height: 9.4375 });
    expect(answer.clearance).toBe(0.5);
    // 15.5 - 13 = 2.5; 13.5 - 6 13/16 = 6 11/16 = 6.6875; 14.75 - 9 7/16 = 5 5/16 = 5.3125 (by hand).
    expect(answer.results[0].clearances).toEqual({ length: 2.5, width: 6.6875, height: 5.3125 });
    expect(answer.results[0].orientation).toMatchObject({ upright: true, text: "Upright, length fore and aft" });
    expect(answer.results[0].opening).toEqual({ width: 12.5, height: 12, face: "front" });
  });
});

describe("drawSpace", () => {
  it("puts a lid in the view from above, centred, and a row of items a clearance in from the corner", () => {
    const main = inches(26.5, 14.5, 11.75);
    const item = inches(10, 6, 8);
    const row = placeRow(item, main, "upright", IN / 2, 2)!;
    expect(row.axis).toBe("length");
    const [above, side] = drawSpace({
      sections: [{ label: "main", box: main }, { label: "shelf", box: inches(26.5, 4.5, 6) }],
      opening: { width: 15 * IN, height: 11 * IN, face: "top" },
      item: { box: item, row, section: 0, clearanceMm: IN / 2 },
    });
    const opening = above.shapes.find((s) => s.kind === "opening")!;
    // Centred: (26.5 - 15) / 2 = 5.75 in along, (14.5 - 11) / 2 = 1.75 in across (by hand).
    expect(opening.x / IN).toBeCloseTo(5.75, 9);
    expect(opening.y / IN).toBeCloseTo(1.75, 9);
    expect(side.shapes.some((s) => s.kind === "opening")).toBe(false);
    const items = above.shapes.filter((s) => s.kind === "item");
    // Items at 1/2 in and 1/2 + 10 + 1/2 = 11 in from the end (by hand).
    expect(items.map((s) => s.x / IN)).toEqual([expect.closeTo(0.5, 9), expect.closeTo(11, 9)]);
    expect(side.shapes.filter((s) => s.kind === "item")).toHaveLength(2);
    expect(above.shapes.filter((s) => s.kind === "section")).toHaveLength(1);
    expect(above.width).toBeCloseTo(26.5 * IN, 9);
    expect(side.height).toBeCloseTo(11.75 * IN, 9);
  });
});
