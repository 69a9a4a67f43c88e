// The boat and tool forms: what members type, read into canonical mm and kg (NIST Handbook 44,
// exact by definition), and a clear message beside the field when it cannot be read.
import { getZodConstraint } from "@conform-to/zod/v4";
import { describe, expect, it } from "vitest";
import {
  addWeightSchema,
  boatLimits,
  cableToolSchema,
  calibrationSchema,
  fieldsOf,
  classParticularsSchema,
  firstErrors,
  heelToolSchema,
  ledgerItemSchema,
  parseDegrees,
  parseMetacentricHeight,
  unitsFor,
  whatIfSchema,
} from "~/domain/boat-forms";
import { calibrateGm } from "~/domain/stability";
import { kgToPounds, mmToInches } from "~/domain/units";

const IN = 25.4;
const FT = 304.8;
const LB = 0.45359237;

// Invented demo class: 22 ft overall, 7 ft 10 in beam (product brief).
const limits = boatLimits({ loaMm: 264 * IN, beamMm: 94 * IN });
const inches = unitsFor("in");
const metric = unitsFor("mm");

function errorsOf(r: { success: boolean; error?: unknown }): Record<string, string> {
  if (r.success) return {};
  return firstErrors(r.error as Parameters<typeof firstErrors>[0]);
}

describe("the ledger item form", () => {
  const schema = ledgerItemSchema(inches, limits);

  it("reads a weight and a place in words: 62 lb, 11 ft 3 in aft, 25 in to port", () => {
    const r = schema.safeParse({ intent: "add-item", name: "House battery", weight: "62", aftOfBow: "11 ft 3 in", side: "port", offCentre: "25", height: "14" });
    expect(r.success).toBe(true);
    if (!r.success) return;
    expect(r.data.weightKg).toBe(62 * LB);
    expect(r.data.aftOfBowMm).toBeCloseTo(135 * IN, 9);
    expect(r.data.offCentreMm).toBeCloseTo(-25 * IN, 9);
    expect(r.data.heightMm).toBeCloseTo(14 * IN, 9);
  });

  it("on the centreline needs no distance; a side does", () => {
    const centre = schema.safeParse({ intent: "add-item", name: "Water", weight: "103 lb", aftOfBow: "64", side: "centre" });
    expect(centre.success && centre.data.offCentreMm).toBe(0);
    const side = schema.safeParse({ intent: "add-item", name: "Water", weight: "103 lb", aftOfBow: "64", side: "starboard" });
    expect(errorsOf(side).offCentre).toMatch(/How far to starboard/);
  });

  it("says what is wrong beside each field", () => {
    const e = errorsOf(schema.safeParse({ intent: "add-item", name: "Battery", weight: "heavy", aftOfBow: "64", side: "port", offCentre: "3" }));
    expect(e.weight).toMatch(/Could not read "heavy" as a weight/);
    const far = errorsOf(schema.safeParse({ intent: "add-item", name: "Battery", weight: "62", aftOfBow: "26 ft", side: "port", offCentre: "3" }));
    expect(far.aftOfBow).toMatch(/more than 300 in aft of the bow/); // 264 in overall + 36 in for an outboard bracket
    const wide = errorsOf(schema.safeParse({ intent: "add-item", name: "Battery", weight: "62", aftOfBow: "64", side: "port", offCentre: "50" }));
    expect(wide.offCentre).toMatch(/more than half the beam \(47 in\)/);
    const none = errorsOf(schema.safeParse({ intent: "add-item", name: "Battery", weight: "62" }));
    expect(none.aftOfBow).toMatch(/How far aft of the bow/);
    expect(errorsOf(schema.safeParse({ intent: "add-item", weight: "62", aftOfBow: "64", side: "centre" })).name).toMatch(/Name the item/);
  });

  it("a space stands in for the place", () => {
    const r = schema.safeParse({ intent: "add-item", name: "Cooler", weight: "14.5 kg", spaceId: "7" });
    expect(r.success).toBe(true);
    if (r.success) {
      expect(r.data.spaceId).toBe(7);
      expect(r.data.aftOfBowMm).toBeNull();
      expect(r.data.weightKg).toBe(14.5);
    }
  });

  it("reads millimetres and kilograms for a metric reader; an outboard on its bracket may hang past the transom", () => {
    const r = ledgerItemSchema(metric, limits).safeParse({ intent: "add-item", name: "Outboard", weight: "26.3", aftOfBow: "6858", side: "port", offCentre: "356" });
    expect(r.success).toBe(true);
    if (r.success) {
      expect(r.data.weightKg).toBe(26.3);
      expect(r.data.aftOfBowMm).toBe(6858); // 270 in: 6 in past the 264 in length overall
      expect(r.data.offCentreMm).toBe(-356);
    }
  });
});

describe("what if and the weight to add", () => {
  it("keeps what is left empty; a side needs its distance", () => {
    const r = whatIfSchema(inches, limits).safeParse({ move: "3", toSide: "port", toOffCentre: "26" });
    expect(r.success && r.data).toMatchObject({ itemId: 3, aftOfBowMm: null, heightMm: null });
    expect(r.success && r.data.offCentreMm).toBeCloseTo(-26 * IN, 9);
    expect(errorsOf(whatIfSchema(inches, limits).safeParse({ move: "3", toSide: "port" })).toOffCentre).toMatch(/How far to port/);
    expect(errorsOf(whatIfSchema(inches, limits).safeParse({ toSide: "port", toOffCentre: "2" })).move).toMatch(/Choose the item/);
  });

  it("reads where a weight would be added", () => {
    const r = addWeightSchema(inches, limits).safeParse({ addSide: "port", addOffCentre: "30" });
    expect(r.success && r.data.offCentreMm).toBeCloseTo(-30 * IN, 9);
    expect(errorsOf(addWeightSchema(inches, limits).safeParse({ addSide: "port", addOffCentre: "60" })).addOffCentre).toMatch(/half the beam/);
  });
});

describe("GM from a measured list (Nicholls: 3 t moved 40 ft, W 2600 t, plumb 29 ft 6 in deflecting 2 in → GM 8.17 ft)", () => {
  it("reads the plumb line's deflection and length, and the inclining relation gives 8.17 ft", () => {
    // Tons stand in for pounds: the weight unit cancels in GM = w·d / (W·tan θ). The form takes at most
    // 10 m, so the 3 t moved 40 ft is entered as 12 moved 10 ft (the same w·d = 120).
    const r = calibrationSchema(inches).safeParse({ intent: "calibrate", weight: "12 lb", shift: "10 ft", displacement: "2600 lb", method: "plumb", deflection: "2", plumbLength: "29 ft 6 in" });
    expect(r.success).toBe(true);
    if (!r.success || !("deflectionMm" in r.data.heel)) return;
    const gmFt = calibrateGm({
      weightLb: kgToPounds(r.data.weightKg),
      shiftIn: mmToInches(r.data.shiftMm),
      displacementLb: kgToPounds(r.data.displacementKg),
      heel: { deflection: r.data.heel.deflectionMm, plumbLength: r.data.heel.plumbLengthMm },
    });
    expect(gmFt).toBeCloseTo(8.17, 2);
  });

  it("reads an angle (Nicholls: 100 t moved 30 ft, 8 degrees, W 9000 t → 2.37 ft); the weights here are within the form's limits, so scaled by 1/10", () => {
    // Scaling w and W together leaves GM unchanged: 10 × 30 / (900 × tan 8°) = 2.3718 ft.
    const r = calibrationSchema(inches).safeParse({ intent: "calibrate", weight: "10", shift: "30 ft", displacement: "900", method: "angle", heel: "8°" });
    expect(r.success).toBe(true);
    if (!r.success || !("degrees" in r.data.heel)) return;
    const gmFt = calibrateGm({ weightLb: kgToPounds(r.data.weightKg), shiftIn: mmToInches(r.data.shiftMm), displacementLb: kgToPounds(r.data.displacementKg), heel: { degrees: r.data.heel.degrees } });
    expect(gmFt).toBeCloseTo(2.3718, 4);
  });

  it("asks for the list in the way chosen", () => {
    expect(errorsOf(calibrationSchema(inches).safeParse({ intent: "calibrate", weight: "62", shift: "51", displacement: "3300", method: "angle" })).heel).toMatch(/Enter the list/);
    expect(errorsOf(calibrationSchema(inches).safeParse({ intent: "calibrate", weight: "62", shift: "51", displacement: "3300", method: "plumb", deflection: "40", plumbLength: "30" })).deflection).toMatch(/less than/);
    expect(parseDegrees("1.6 deg")).toEqual({ ok: true, degrees: 1.6 });
    expect(parseDegrees("0").ok).toBe(false);
    expect(parseDegrees("50").ok).toBe(false);
  });
});

describe("metacentric heights and the class particulars", () => {
  it("reads GM in feet or metres by default, and GM_L beyond 10 m", () => {
    expect(parseMetacentricHeight("2.8", "in")).toEqual({ ok: true, mm: 2.8 * FT });
    expect(parseMetacentricHeight("0.85", "mm")).toEqual({ ok: true, mm: 850 });
    expect(parseMetacentricHeight("36 ft", "mm")).toEqual({ ok: true, mm: 36 * FT });
    const mixed = parseMetacentricHeight("2 ft 9 5/8 in", "in");
    expect(mixed.ok && mixed.mm).toBeCloseTo((33 + 5 / 8) * IN, 9);
    expect(parseMetacentricHeight("tall", "in").ok).toBe(false);
  });

  it("takes the brief's demo values as typed, and needs GM_L or MCT1", () => {
    const typed = { lightDisplacement: "2,850 lb", gm: "2.8 ft", loa: "22 ft", lwl: "19 ft 2 in", beam: "7 ft 10 in", lcf: "12 ft 6 in", waterlineForwardEnd: "1 ft", gmLongitudinal: "36" };
    const r = classParticularsSchema(inches).safeParse(typed);
    expect(r.success).toBe(true);
    if (r.success) {
      expect(r.data.lightDisplacementKg).toBeCloseTo(2850 * LB, 9);
      expect(r.data.lwlMm).toBeCloseTo(230 * IN, 9);
      expect(r.data.beamMm).toBeCloseTo(94 * IN, 9);
      expect(r.data.gmLongitudinalMm).toBeCloseTo(36 * FT, 9);
      expect(r.data.demo).toBe(false);
    }
    const { gmLongitudinal: _, ...noTrim } = typed;
    expect(errorsOf(classParticularsSchema(inches).safeParse(noTrim)).gmLongitudinal).toMatch(/GM_L or MCT1/);
    const withMct1 = classParticularsSchema(inches).safeParse({ ...noTrim, mct1: "470 ft·lb per inch" });
    expect(withMct1.success && withMct1.data.mct1FtLbPerIn).toBe(470);
    expect(errorsOf(classParticularsSchema(inches).safeParse({ ...typed, lwl: "23 ft" })).lwl).toMatch(/longer than the boat/);
  });
});

describe("the tools' forms", () => {
  it("the heel tool needs a GM to find the heel, and a list to find the GM", () => {
    expect(errorsOf(heelToolSchema(inches).safeParse({ find: "heel", displacement: "3300", weight: "62", distance: "51" })).gm).toMatch(/Enter the GM/);
    expect(errorsOf(heelToolSchema(inches).safeParse({ find: "gm", displacement: "3300", weight: "62", distance: "51", method: "angle" })).heel).toMatch(/Enter the list/);
  });

  it("the cable tool reads a bare run length in feet (or metres), and its choices", () => {
    const r = cableToolSchema("in").safeParse({ current: "30 A", length: "11", voltage: "12", drop: "3", insulation: "105" });
    expect(r.success && r.data).toMatchObject({ currentA: 30, systemVoltage: 12, allowedDropPct: 3, insulationRatingC: 105, inEngineSpace: false });
    expect(r.success && r.data.oneWayLengthFt).toBeCloseTo(11, 12);
    const m = cableToolSchema("mm").safeParse({ current: "30", length: "3.353", voltage: "24", drop: "10", insulation: "90", engineSpace: "true" });
    expect(m.success && m.data.oneWayLengthFt).toBeCloseTo(3353 / FT, 9);
    expect(m.success && m.data.inEngineSpace).toBe(true);
    const bad = errorsOf(cableToolSchema("in").safeParse({ current: "lots", length: "140 ft", voltage: "36", drop: "5", insulation: "80" }));
    expect(bad.current).toMatch(/amps/);
    expect(bad.length).toBe("That is more than 100 ft (about 30 m) one way: check the number and the unit.");
    expect(bad.voltage).toMatch(/12 V or 24 V/);
    expect(bad.drop).toMatch(/3 % or 10 %/);
    expect(bad.insulation).toMatch(/temperature rating/);
  });
});

describe("the cable tool's longest run", () => {
  const run = (unit: "in" | "mm", length: string) => cableToolSchema(unit).safeParse({ current: "2", length, voltage: "12", drop: "3", insulation: "105" });

  it("takes the runs a small boat has: a masthead light some 40 ft one way, up to 100 ft (30.48 m)", () => {
    // A 22 ft boat (product brief): panel to masthead about 40 ft one way (common practice: mast
    // height plus the run along the deck and bilge). 1 ft = 304.8 mm exactly (NIST Handbook 44).
    for (const [unit, text, ft] of [["in", "40", 40], ["in", "40 ft", 40], ["in", "100 ft", 100], ["mm", "12.2", 12_200 / FT], ["mm", "30.48 m", 100]] as const) {
      const r = run(unit, text);
      expect(r.success, text).toBe(true);
      expect(r.success && r.data.oneWayLengthFt, text).toBeCloseTo(ft, 9);
    }
  });

  it("still refuses a run past 100 ft, as a slip of the unit, with the message beside the field", () => {
    for (const [unit, text] of [["in", "101 ft"], ["in", "480"], ["mm", "31 m"], ["mm", "4000"]] as const) {
      expect(errorsOf(run(unit, text)).length, text).toBe("That is more than 100 ft (about 30 m) one way: check the number and the unit.");
    }
  });
});

describe("the forms' HTML constraints (conform)", () => {
  it("can be read from every form schema", () => {
    for (const schema of [ledgerItemSchema(inches, limits), calibrationSchema(inches), classParticularsSchema(metric), whatIfSchema(inches, limits)]) {
      const c = getZodConstraint(fieldsOf(schema));
      expect(Object.keys(c).length).toBeGreaterThan(2);
    }
    expect(getZodConstraint(fieldsOf(ledgerItemSchema(inches, limits))).weight?.required).toBe(true);
  });
});
