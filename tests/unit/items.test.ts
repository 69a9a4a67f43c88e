import { describe, expect, it } from "vitest";
import { batteryGroupItems, cautionsForItem, isBattery, itemSchema, measurementSchema, slugify } from "~/domain/items";
import { parseDimensions } from "~/domain/units";

// BCI group size chart (Battery Council International), maximum case size L x W x H, inches.
const CHART: Record<string, string> = {
  "24": "10 1/4 x 6 13/16 x 8 7/8",
  "27": "12 1/16 x 6 13/16 x 8 7/8",
  "31": "13 x 6 13/16 x 9 7/16",
  GC2: "10 3/8 x 7 3/16 x 10 5/8",
  "4D": "20 3/4 x 8 3/4 x 9 7/8",
  "8D": "20 3/4 x 11 1/8 x 9 7/8",
};

describe("the catalogue's battery groups", () => {
  const items = batteryGroupItems();

  it("one item a group, at the chart's maximum case size (BCI group size chart), upright only", () => {
    expect(items.map((i) => i.name)).toEqual(Object.keys(CHART).map((g) => `Battery, BCI group ${g}`));
    for (const item of items) {
      const group = item.name.replace("Battery, BCI group ", "");
      const chart = parseDimensions(CHART[group], "in");
      if (!chart.ok) throw new Error(chart.message);
      expect([item.box.length, item.box.width, item.box.height]).toEqual(chart.mm.map((v) => expect.closeTo(v, 9)));
      expect(item.orientation).toBe("upright"); // flooded batteries stand upright: common practice
      expect(item.kind).toBe("battery-group");
    }
  });

  it("groups 27 and 31 share a width; a 31 is longer and taller (common practice; BCI chart: +15/16 in, +9/16 in)", () => {
    const g27 = items.find((i) => i.slug === "bci-group-27")!.box;
    const g31 = items.find((i) => i.slug === "bci-group-31")!.box;
    expect(g31.width).toBe(g27.width);
    expect((g31.length - g27.length) / 25.4).toBeCloseTo(15 / 16, 9);
    expect((g31.height - g27.height) / 25.4).toBeCloseTo(9 / 16, 9);
  });

  it("slugs are unique and plain", () => {
    const slugs = items.map((i) => i.slug);
    expect(new Set(slugs).size).toBe(slugs.length);
    for (const slug of slugs) expect(slug).toMatch(/^[a-z0-9-]+$/);
  });
});

describe("cautions beside a placement", () => {
  it("a battery gets the battery cautions (33 CFR 183.420) and wiring; everything gets weight and stability", () => {
    const battery = cautionsForItem({ kind: "battery-group", name: "Battery, BCI group 31" });
    expect(battery.map((c) => c.key)).toEqual(["battery", "wiring", "stability"]);
    expect(battery[0].source).toContain("33 CFR 183.420");
    expect(cautionsForItem({ kind: "member-item", name: "Spare house battery, AGM" }).map((c) => c.key)).toContain("battery");
    expect(cautionsForItem({ kind: "member-item", name: "Cooler, 24 quart" }).map((c) => c.key)).toEqual(["stability"]);
    expect(cautionsForItem(null).map((c) => c.key)).toEqual(["stability"]);
    expect(isBattery({ kind: "member-item", name: "Battery box for a group 27" })).toBe(true);
    expect(isBattery({ kind: "member-item", name: "Batteryless lamp" })).toBe(false);
  });
});

describe("slugify", () => {
  it("lower case words joined by hyphens, accents dropped", () => {
    expect(slugify("Cooler, hard-sided, 24 quart")).toBe("cooler-hard-sided-24-quart");
    expect(slugify("  Crème brûlée box!  ")).toBe("creme-brulee-box");
    expect(slugify("!!!")).toBe("item");
    expect(slugify("a".repeat(100))).toHaveLength(60);
  });
});

describe("the measurement form", () => {
  const today = "2026-03-20";
  const schema = measurementSchema("in", today);
  const valid = { section: "0", length: "13 1/2", width: "343 mm", height: "1 ft 1 1/2 in", method: "story_stick", hullNumber: "402", measuredOn: "2025-06-14" };

  it("reads sizes as typed, in millimetres exactly (NIST Handbook 44 Appendix C: 1 in = 25.4 mm)", () => {
    const r = schema.safeParse(valid);
    expect(r.success).toBe(true);
    if (r.success) expect(r.data).toEqual({ ...valid, section: 0, length: 342.9, width: 343, height: 342.9, hullNumber: 402 });
    const mm = measurementSchema("mm", today).safeParse({ ...valid, length: "343", width: "34.3 cm", height: "13 1/2 in" });
    expect(mm.success && [mm.data.length, mm.data.width, mm.data.height]).toEqual([343, 343, 342.9]);
  });

  it("names the field of each problem", () => {
    const r = schema.safeParse({ ...valid, width: "wide", hullNumber: "700", measuredOn: "2026-03-22", method: "ruler" });
    expect(r.success).toBe(false);
    const fields = Object.fromEntries((r.error?.issues ?? []).map((i) => [String(i.path[0]), i.message]));
    expect(Object.keys(fields).sort()).toEqual(["hullNumber", "measuredOn", "method", "width"]);
    expect(fields.width).toContain("Could not read");
    expect(fields.hullNumber).toBe("Hull numbers run from 1 to 612.");
    expect(fields.measuredOn).toBe("That date is in the future.");
  });

  it("takes a part of the space it has, and only those", () => {
    const twoParts = measurementSchema("in", today, 2);
    expect(twoParts.safeParse({ ...valid, section: "1" }).success).toBe(true);
    const beyond = twoParts.safeParse({ ...valid, section: "2" });
    expect(beyond.success).toBe(false);
    expect(beyond.error?.issues[0]).toMatchObject({ path: ["section"], message: "Choose one of this space's parts." });
    expect(schema.safeParse({ ...valid, section: undefined }).success).toBe(false);
  });

  it("accepts tomorrow (time zones) but not before the class was built", () => {
    expect(schema.safeParse({ ...valid, measuredOn: "2026-03-21" }).success).toBe(true);
    expect(schema.safeParse({ ...valid, measuredOn: "1970-12-31" }).success).toBe(false);
    expect(schema.safeParse({ ...valid, measuredOn: "2025-02-30x" }).success).toBe(false);
  });
});

describe("the item form", () => {
  it("weights in lb with inches, kg with millimetres (NIST HB 44 App. C: 1 lb = 0.45359237 kg)", () => {
    const base = { name: "Cooler, 24 quart", length: "19 1/2", width: "13 1/4", height: "14", orientation: "upright" };
    const lb = itemSchema("in").safeParse({ ...base, weight: "11" });
    expect(lb.success && lb.data.weight).toBeCloseTo(11 * 0.45359237, 12);
    const kg = itemSchema("mm").safeParse({ ...base, length: "495", width: "337", height: "356", weight: "5" });
    expect(kg.success && kg.data.weight).toBe(5);
    const none = itemSchema("in").safeParse(base);
    expect(none.success && none.data.weight).toBeNull();
    expect(none.success && none.data.length).toBe(495.3); // 19.5 x 25.4
  });

  it("refuses a short name, a bad size and an unknown orientation", () => {
    const r = itemSchema("in").safeParse({ name: "x", length: "0", width: "7", height: "9", orientation: "sideways" });
    expect((r.error?.issues ?? []).map((i) => String(i.path[0])).sort()).toEqual(["length", "name", "orientation"]);
  });
});
