import { describe, expect, it } from "vitest";
import { BCI_GROUPS, bciGroup } from "~/domain/battery-groups";
import {
  fitItem,
  fitsSorted,
  passesOpening,
  rankSpaces,
  sortedDims,
  VERDICT_TEXT,
  type Box,
  type FitRequest,
  type Space,
} from "~/domain/fit";
import { parseDimensions } from "~/domain/units";

// 1 in = 25.4 mm exactly (NIST Handbook 44 Appendix C).
const IN = 25.4;
const SIXTEENTH = IN / 16;
const inches = (length: number, width: number, height: number): Box => ({
  length: length * IN,
  width: width * IN,
  height: height * IN,
});

// BCI group size chart (Battery Council International), maximum case size L x W x H.
// The mm values for 4D and 8D are from memory, not read in the chart.
const CHART: Record<string, { inches: string; mm: string }> = {
  "24": { inches: "10 1/4 x 6 13/16 x 8 7/8 in", mm: "260 x 173 x 225 mm" },
  "27": { inches: "12 1/16 x 6 13/16 x 8 7/8 in", mm: "306 x 173 x 225 mm" },
  "31": { inches: "13 x 6 13/16 x 9 7/16 in", mm: "330 x 173 x 240 mm" },
  GC2: { inches: "10 3/8 x 7 3/16 x 10 5/8 in", mm: "264 x 183 x 270 mm" },
  "4D": { inches: "20 3/4 x 8 3/4 x 9 7/8 in", mm: "527 x 222 x 250 mm" }, // mm (memory)
  "8D": { inches: "20 3/4 x 11 1/8 x 9 7/8 in", mm: "527 x 283 x 250 mm" }, // mm (memory)
};

function group(name: string): Box {
  const g = bciGroup(name);
  if (!g) throw new Error(`no group ${name}`);
  return g.mm;
}

function request(item: Box, section: Box, extra: Partial<FitRequest> = {}): FitRequest {
  return { item, orientation: "upright", clearanceMm: 0, space: { sections: [section] }, ...extra };
}

/** Deterministic pseudo-random numbers (mulberry32), so a failing case can be replayed. */
function random(seed: number): () => number {
  return () => {
    seed = (seed + 0x6d2b79f5) | 0;
    let t = Math.imul(seed ^ (seed >>> 15), 1 | seed);
    t = (t + Math.imul(t ^ (t >>> 7), 61 | t)) ^ t;
    return ((t ^ (t >>> 14)) >>> 0) / 4294967296;
  };
}

const AXES = ["length", "width", "height"] as const;

describe("BCI group sizes (data)", () => {
  it("lists the six groups of the chart", () => {
    expect(BCI_GROUPS.map((g) => g.group)).toEqual(Object.keys(CHART)); // BCI group size chart
  });

  it.each(Object.entries(CHART))("group %s matches the chart in inches, and mm within 1 mm", (name, row) => {
    // BCI group size chart; 4D and 8D mm (memory)
    const fromInches = parseDimensions(row.inches, "in");
    const fromMm = parseDimensions(row.mm, "mm");
    if (!fromInches.ok || !fromMm.ok) throw new Error("chart row did not parse");
    const box = group(name);
    AXES.forEach((axis, i) => {
      expect(box[axis]).toBeCloseTo(fromInches.mm[i], 9);
      expect(Math.abs(box[axis] - fromMm.mm[i])).toBeLessThanOrEqual(1);
    });
  });

  it("finds a group by name in any case", () => {
    expect(bciGroup("gc2")?.group).toBe("GC2");
    expect(bciGroup(" 4d ")?.group).toBe("4D");
    expect(bciGroup("99")).toBeUndefined();
  });
});

describe("fitItem: BCI cases against boxes just large enough and 1/16 in too small", () => {
  for (const name of Object.keys(CHART)) {
    // BCI group size chart (case maxima)
    it(`group ${name}`, () => {
      const item = group(name);
      for (const orientation of ["upright", "any"] as const) {
        const exact = fitItem(request(item, { ...item }, { orientation }));
        expect(exact.verdict).toBe("fits");
        expect(exact.sections[0].leftoverMm).toEqual({ length: 0, width: 0, height: 0 });
        for (const axis of AXES) {
          const small = { ...item, [axis]: item[axis] - SIXTEENTH };
          const r = fitItem(request(item, small, { orientation }));
          expect(r.verdict).toBe("does-not-fit");
          expect(r.sections[0].fits).toBe(false);
          // The best placement misses by the 1/16 in taken off.
          expect(Math.min(...Object.values(r.sections[0].leftoverMm))).toBeCloseTo(-SIXTEENTH, 9);
        }
      }
    });
  }

  it("with 1/4 in clearance each side a box 1/2 in larger fits, 1/16 in less does not", () => {
    const item = group("27"); // BCI group size chart
    const c = IN / 4;
    const roomy = { length: item.length + 2 * c, width: item.width + 2 * c, height: item.height + 2 * c };
    expect(fitItem(request(item, roomy, { clearanceMm: c })).verdict).toBe("fits");
    for (const axis of AXES) {
      const tight = { ...roomy, [axis]: roomy[axis] - SIXTEENTH };
      expect(fitItem(request(item, tight, { clearanceMm: c })).verdict).toBe("does-not-fit");
    }
  });
});

describe("fitItem: orientation", () => {
  // Section 14 x 10 x 7 1/2 in; group 31 is 13 x 6 13/16 x 9 7/16 in (BCI group size chart).
  // Upright it is 9 7/16 in tall: 1 15/16 in too tall. On its side, 6 13/16 in up (11/16 in to
  // spare), 13 in along the 14 in (1 in spare), 9 7/16 in across the 10 in (9/16 in spare).
  const section = inches(14, 10, 7.5);
  const item = group("31");

  it("a space that takes a group 31 only on its side", () => {
    const upright = fitItem(request(item, section, { orientation: "upright" }));
    expect(upright.verdict).toBe("does-not-fit");
    // The upright placement misses in height by 1 15/16 in (by hand).
    expect(upright.sections[0].leftoverMm.height).toBeCloseTo(-(1 + 15 / 16) * IN, 9);

    const any = fitItem(request(item, section, { orientation: "any" }));
    expect(any.verdict).toBe("fits");
    expect(any.sections[0].placement).toEqual({ length: "length", width: "height", height: "width" });
    const left = any.sections[0].leftoverMm;
    expect(left.length).toBeCloseTo(1 * IN, 9);
    expect(left.width).toBeCloseTo((9 / 16) * IN, 9);
    expect(left.height).toBeCloseTo((11 / 16) * IN, 9);
  });

  it("chooses the placement with the most room on its tightest side", () => {
    const box = inches(10, 6, 8);
    // Section 11 x 10 1/2 x 9: length along length leaves 1, 4 1/2, 1 (tightest 1);
    // turned, 5, 1/2, 1 (tightest 1/2). The first wins (by hand).
    const a = fitItem(request(box, inches(11, 10.5, 9)));
    expect(a.sections[0].placement).toEqual({ length: "length", width: "width", height: "height" });
    // Section 10 1/2 x 11 x 9: length along length leaves 1/2, 5, 1 (tightest 1/2);
    // turned, 4 1/2, 1, 1 (tightest 1). The turned placement wins (by hand).
    const b = fitItem(request(box, inches(10.5, 11, 9)));
    expect(b.sections[0].placement).toEqual({ length: "width", width: "length", height: "height" });
    const left = b.sections[0].leftoverMm;
    expect([left.length, left.width, left.height].map((v) => v / IN)).toEqual([
      expect.closeTo(4.5, 9),
      expect.closeTo(1, 9),
      expect.closeTo(1, 9),
    ]);
  });

  it("prefers upright among equally even placements when any is allowed", () => {
    const cube = inches(10, 10, 10);
    const r = fitItem(request(cube, inches(11, 11, 11), { orientation: "any" }));
    expect(r.sections[0].placement.height).toBe("height");
  });
});

describe("fitItem: clearance", () => {
  const item = inches(10, 6, 8);

  it("an exact box fits with no clearance and not with any", () => {
    expect(fitItem(request(item, { ...item })).verdict).toBe("fits");
    expect(fitItem(request(item, { ...item }, { clearanceMm: 1 })).verdict).toBe("does-not-fit");
  });

  it("needs twice the clearance along every axis", () => {
    const c = 3;
    const just = { length: item.length + 2 * c, width: item.width + 2 * c, height: item.height + 2 * c };
    expect(fitItem(request(item, just, { clearanceMm: c })).verdict).toBe("fits");
    for (const axis of AXES) {
      const short = { ...just, [axis]: just[axis] - 0.01 };
      expect(fitItem(request(item, short, { clearanceMm: c })).verdict).toBe("does-not-fit");
    }
  });

  it("refuses impossible inputs", () => {
    expect(() => fitItem(request(item, item, { clearanceMm: -1 }))).toThrow(RangeError);
    expect(() => fitItem(request({ ...item, width: 0 }, item))).toThrow(RangeError);
    expect(() => fitItem(request(item, { ...item, height: Number.NaN }))).toThrow(RangeError);
    expect(() =>
      fitItem({
        item,
        orientation: "any",
        clearanceMm: 0,
        space: { sections: [item], opening: { width: -5, height: 100 } },
      }),
    ).toThrow(RangeError);
  });
});

describe("fitItem: how many in a row", () => {
  const g24 = group("24"); // BCI group size chart: 10 1/4 x 6 13/16 x 8 7/8 in
  const c = IN / 4;

  it("3 group 24 in a 33 in long space with 1/4 in clearance", () => {
    // By hand: n items need n x 10 1/4 + (n + 1) x 1/4 in along the row.
    //   n = 3: 30 3/4 + 1 = 31 3/4 in <= 33 in;  n = 4: 41 + 1 1/4 = 42 1/4 in > 33 in.
    //   Across: 6 13/16 + 1/2 = 7 5/16 in; up: 8 7/8 + 1/2 = 9 3/8 in.
    const section = inches(33, 7 + 5 / 16, 9 + 3 / 8);
    const r = fitItem(request(g24, section, { clearanceMm: c }));
    expect(r.sections[0].row).toEqual({
      count: 3,
      axis: "length",
      placement: { length: "length", width: "width", height: "height" },
    });
  });

  it("the row count changes exactly at 31 3/4 in", () => {
    const row = (length: number) =>
      fitItem(request(g24, inches(length, 7 + 5 / 16, 9 + 3 / 8), { clearanceMm: c })).sections[0]
        .row?.count;
    expect(row(31.75)).toBe(3); // 31 3/4 in, by hand above
    expect(row(31.75 - 1 / 16)).toBe(2);
  });

  it("turns the item when that puts more in the row", () => {
    // Section 21 x 11 x 9 1/2 in, no clearance. Length along length: 21 / 10 1/4 -> 2 in a row.
    // Turned, the 6 13/16 in side along the 21 in: 3 x 6 13/16 = 20 7/16 in <= 21 -> 3 (by hand).
    const r = fitItem(request(g24, inches(21, 11, 9.5)));
    expect(r.sections[0].row).toEqual({
      count: 3,
      axis: "length",
      placement: { length: "width", width: "length", height: "height" },
    });
  });

  it("no row when the item does not fit", () => {
    const r = fitItem(request(g24, inches(10, 7, 9)));
    expect(r.sections[0].row).toBeNull();
  });
});

describe("fitItem: sections of one space", () => {
  it("an item must fit wholly in one section", () => {
    // A space lowered at one end: 30 x 12 x 8 in under the cockpit floor, and 14 x 12 x 11 in at
    // full headroom. An upright group 31 (9 7/16 in tall, BCI group size chart) fits only the
    // second.
    const space: Space = { sections: [inches(30, 12, 8), inches(14, 12, 11)] };
    const r = fitItem({ item: group("31"), orientation: "upright", clearanceMm: 0, space });
    expect(r.sections.map((s) => s.fits)).toEqual([false, true]);
    expect(r.verdict).toBe("fits");
    expect(r.snuggestSection).toBe(1);
  });

  it("no sections, no fit", () => {
    const r = fitItem({ item: group("24"), orientation: "any", clearanceMm: 0, space: { sections: [] } });
    expect(r.verdict).toBe("does-not-fit");
    expect(r.snuggestSection).toBeNull();
  });
});

describe("opening", () => {
  const g27 = group("27"); // BCI group size chart: 12 1/16 x 6 13/16 x 8 7/8 in
  const section = inches(14, 8, 10);
  const withOpening = (opening: Space["opening"], orientation: "any" | "upright" = "upright", clearanceMm = 0) =>
    fitItem({ item: g27, orientation, clearanceMm, space: { sections: [section], opening } });

  it("no opening recorded: nothing to pass", () => {
    const r = withOpening(undefined);
    expect(r.passesOpening).toBeNull();
    expect(r.verdict).toBe("fits");
  });

  it("opening too small: fits the space but the opening must be enlarged", () => {
    // Front opening 6 x 10 in: the narrow side 6 13/16 in is wider than 6 in; on any side too.
    const upright = withOpening({ width: 6 * IN, height: 10 * IN });
    expect(upright.sections[0].fits).toBe(true);
    expect(upright.passesOpening).toBe(false);
    expect(upright.verdict).toBe("opening-too-small");
    expect(VERDICT_TEXT[upright.verdict]).toContain("the opening must be enlarged");
    expect(withOpening({ width: 6 * IN, height: 10 * IN }, "any").verdict).toBe("opening-too-small");
  });

  it("a front opening takes an upright item by narrow side x height", () => {
    // 7 x 9 in: 6 13/16 <= 7 across, 8 7/8 <= 9 up (by hand).
    expect(withOpening({ width: 7 * IN, height: 9 * IN }).verdict).toBe("fits");
    // 9 wide x 7 high: too low for 8 7/8 in upright; on its side it goes (smallest face 6 13/16 x 8 7/8).
    expect(withOpening({ width: 9 * IN, height: 7 * IN, face: "front" }).passesOpening).toBe(false);
    expect(withOpening({ width: 9 * IN, height: 7 * IN }, "any").passesOpening).toBe(true);
  });

  it("a top opening takes an upright item by its footprint", () => {
    // 13 x 7 in: footprint 12 1/16 x 6 13/16 passes; 12 x 7 in: 12 1/16 > 12, it does not.
    expect(withOpening({ width: 13 * IN, height: 7 * IN, face: "top" }).passesOpening).toBe(true);
    expect(withOpening({ width: 7 * IN, height: 13 * IN, face: "top" }).passesOpening).toBe(true);
    expect(withOpening({ width: 12 * IN, height: 7 * IN, face: "top" }).passesOpening).toBe(false);
    // Any orientation: it goes in end first, smallest face 6 13/16 x 8 7/8 through 7 x 12.
    expect(withOpening({ width: 12 * IN, height: 7 * IN, face: "top" }, "any").passesOpening).toBe(true);
  });

  it("keeps the clearance on each side in the opening too", () => {
    // 6 13/16 + 2 x 1/8 = 7 1/16 in > 7 in (by hand)
    expect(withOpening({ width: 7 * IN, height: 9.5 * IN }, "upright", IN / 8).passesOpening).toBe(false);
    expect(withOpening({ width: 7 * IN, height: 9.5 * IN }, "upright", IN / 16).passesOpening).toBe(true);
  });

  it("does not fit beats a small opening", () => {
    const r = fitItem({
      item: g27,
      orientation: "upright",
      clearanceMm: 0,
      space: { sections: [inches(12, 8, 10)], opening: { width: 6 * IN, height: 6 * IN } },
    });
    expect(r.verdict).toBe("does-not-fit");
  });
});

describe("rankSpaces", () => {
  const g27 = group("27"); // BCI group size chart: 12 1/16 x 6 13/16 x 8 7/8 in
  type Named = Space & { name: string };
  const spaces: Named[] = [
    { name: "roomy", sections: [inches(20, 12, 12)] },
    { name: "too short", sections: [inches(12, 7, 9)] },
    { name: "snug", sections: [inches(13, 7.5, 9.5)] },
    { name: "small hatch", sections: [inches(12.5, 7, 9)], opening: { width: 6 * IN, height: 6 * IN } },
    { name: "stepped", sections: [inches(20, 12, 12), inches(12.5, 7, 9)] },
  ];

  it("snuggest first, a space whose opening must be enlarged after those that fit, misfits left out", () => {
    // Section volumes (in^3, by hand): stepped 12.5 x 7 x 9 = 787.5; snug 13 x 7.5 x 9.5 = 926.25;
    // roomy 20 x 12 x 12 = 2880; small hatch 787.5 but its 6 x 6 in hatch is too small.
    const ranked = rankSpaces(g27, spaces, { orientation: "upright" });
    expect(ranked.map((r) => r.space.name)).toEqual(["stepped", "snug", "roomy", "small hatch"]);
    expect(ranked[0].section).toBe(1);
    expect(ranked[0].index).toBe(4);
    // Stepped: 787.5 - 12 1/16 x 6 13/16 x 8 7/8 = 787.5 - 729.31005859375 = 58.18994140625 in^3
    //   x 16387.064 mm^3/in^3 (NIST HB 44 App. C: 1 in^3 = 16.387064 cm^3) = 953,562.29 mm^3
    expect(ranked[0].leftoverVolumeMm3).toBeCloseTo(953_562.29, 1);
  });

  it("defaults to any orientation and no clearance", () => {
    // Only on its side does a group 31 go in 14 x 10 x 7 1/2 in (see above).
    const side: Space[] = [{ sections: [inches(14, 10, 7.5)] }];
    expect(rankSpaces(group("31"), side)).toHaveLength(1);
    expect(rankSpaces(group("31"), side, { orientation: "upright" })).toHaveLength(0);
    expect(rankSpaces(group("31"), side, { clearanceMm: IN / 2 })).toHaveLength(0);
  });
});

describe("sortedDims", () => {
  it("any: largest first; upright: footprint larger first, height kept", () => {
    const box = { length: 10, width: 30, height: 20 };
    expect(sortedDims(box)).toEqual([30, 20, 10]);
    expect(sortedDims(box, "any")).toEqual([30, 20, 10]);
    expect(sortedDims(box, "upright")).toEqual([30, 10, 20]);
  });
});

describe("properties", () => {
  const next = random(31);
  const randomBox = (min: number, max: number): Box => ({
    length: min + next() * (max - min),
    width: min + next() * (max - min),
    height: min + next() * (max - min),
  });
  const rotations = (b: Box): Box[] => [
    { length: b.length, width: b.width, height: b.height },
    { length: b.width, width: b.length, height: b.height },
    { length: b.length, width: b.height, height: b.width },
    { length: b.height, width: b.length, height: b.width },
    { length: b.width, width: b.height, height: b.length },
    { length: b.height, width: b.width, height: b.length },
  ];
  const fits = (item: Box, section: Box, orientation: "any" | "upright", clearanceMm = 0) =>
    fitItem({ item, orientation, clearanceMm, space: { sections: [section] } }).sections[0].fits;

  // Items and sections of similar size, so that both outcomes are common.
  const cases = Array.from({ length: 3000 }, () => ({
    item: randomBox(100, 400),
    section: randomBox(150, 450),
    clearance: next() < 0.5 ? 0 : next() * 10,
  }));

  it("both outcomes occur in the sample", () => {
    const outcomes = cases.map((c) => fits(c.item, c.section, "any", c.clearance));
    expect(outcomes.some(Boolean)).toBe(true);
    expect(outcomes.some((f) => !f)).toBe(true);
  });

  it("turning the space's dimensions never changes an any-orientation fit", () => {
    for (const { item, section, clearance } of cases) {
      const expected = fits(item, section, "any", clearance);
      for (const turned of rotations(section)) expect(fits(item, turned, "any", clearance)).toBe(expected);
    }
  });

  it("swapping a space's length and width never changes an upright fit", () => {
    for (const { item, section, clearance } of cases) {
      const swapped = { length: section.width, width: section.length, height: section.height };
      expect(fits(item, swapped, "upright", clearance)).toBe(fits(item, section, "upright", clearance));
    }
  });

  it("what fits upright fits in any orientation", () => {
    for (const { item, section, clearance } of cases) {
      if (fits(item, section, "upright", clearance)) expect(fits(item, section, "any", clearance)).toBe(true);
    }
  });

  it("the sorted-dimension test agrees with the full fit, both orientations", () => {
    for (const { item, section, clearance } of cases) {
      for (const o of ["any", "upright"] as const) {
        expect(fitsSorted(sortedDims(item, o), sortedDims(section, o), clearance)).toBe(
          fits(item, section, o, clearance),
        );
      }
    }
  });

  it("a fitting placement leaves at least twice the clearance on every axis, and a row of one or more", () => {
    for (const { item, section, clearance } of cases) {
      const s = fitItem({ item, orientation: "any", clearanceMm: clearance, space: { sections: [section] } })
        .sections[0];
      if (!s.fits) continue;
      for (const axis of AXES) expect(s.leftoverMm[axis]).toBeGreaterThanOrEqual(2 * clearance - 1e-6);
      expect(s.row?.count).toBeGreaterThanOrEqual(1);
    }
  });

  it("an any-orientation opening passes exactly when some turned item's face fits", () => {
    for (const { item, section, clearance } of cases.slice(0, 500)) {
      const opening = { width: section.length, height: section.width };
      const bySomeFace = rotations(item).some(
        (r) => r.length + 2 * clearance <= opening.width + 1e-6 && r.width + 2 * clearance <= opening.height + 1e-6,
      );
      expect(passesOpening(item, "any", opening, clearance)).toBe(bySomeFace);
    }
  });
});
