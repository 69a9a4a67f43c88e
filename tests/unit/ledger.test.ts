// The weight ledger in canonical units (kg, mm) and its words: conversions against NIST Handbook 44
// (exact by definition), heel and trim against the relations checked in stability.test.ts, and the
// write-up calculation seeded in content-seed/ledger.yaml worked by hand.
import { describe, expect, it } from "vitest";
import { computeCableRun, computeWeightMove, readCalculation, weightMoveInputSchema } from "~/domain/calculations";
import {
  boatCondition,
  boatWhatIf,
  describeDraftChange,
  describeHeel,
  describeOffset,
  describePosition,
  describeTrim,
  formatGm,
  formatMct1,
  formatMoment,
  levelPlans,
  toStabilityItem,
  toStabilityParticulars,
  weightToLevelAt,
  type ClassFigures,
  type LedgerEntry,
} from "~/domain/ledger";
import { readSeedYaml } from "../support/seed-files";

// NIST Handbook 44, Appendix C (exact): 1 in = 25.4 mm, 1 ft = 304.8 mm, 1 lb = 0.45359237 kg.
const IN = 25.4;
const FT = 304.8;
const LB = 0.45359237;

// Invented demo particulars (product brief; LCF, waterline end and GM_L invented).
const demo: ClassFigures = {
  lightDisplacementKg: 2850 * LB,
  gmMm: 2.8 * FT,
  lwlMm: 230 * IN,
  beamMm: 94 * IN,
  loaMm: 264 * IN,
  lcfAftOfBowMm: 150 * IN,
  waterlineForwardEndMm: 12 * IN,
  gmLongitudinalMm: 36 * FT,
  mct1FtLbPerIn: null,
  demo: true,
};

const battery: LedgerEntry = { id: "1", name: "House battery", weightKg: 58 * LB, aftOfBowMm: 150 * IN, offCentreMm: 0, heightMm: 10 * IN };

describe("conversions to the stability units (NIST Handbook 44, exact by definition)", () => {
  it("kg and mm become lb, in and ft without loss", () => {
    const p = toStabilityParticulars(demo);
    expect(p.lightDisplacementLb).toBeCloseTo(2850, 10);
    expect(p.gmFt).toBeCloseTo(2.8, 12);
    expect(p.lwlFt).toBeCloseTo(19 + 2 / 12, 12);
    expect(p.beamFt).toBeCloseTo(7 + 10 / 12, 12);
    expect(p.lcfAftOfBowIn).toBeCloseTo(150, 10);
    const item = toStabilityItem({ ...battery, offCentreMm: -635 });
    expect(item.weightLb).toBeCloseTo(58, 10);
    expect(item.offCentreIn).toBeCloseTo(-25, 12); // 635 mm = 25 in exactly
    expect(item.heightIn).toBeCloseTo(10, 12);
  });

  it("a calibrated GM overrides the class's", () => {
    expect(toStabilityParticulars(demo, 2.86 * FT).gmFt).toBeCloseTo(2.86, 12);
  });
});

describe("the boat's condition (tan θ = Σ w·y / (Δ·GM), ASTM F1321)", () => {
  it("58 lb moved 44 in to starboard heels her 1.496° (same hand figures as stability.test.ts)", () => {
    // By hand: Δ = 2908 lb; M = 58 × 44 / 12 = 212.667 ft·lb; tan θ = 212.667 / (2908 × 2.8) → 1.496°
    const r = boatWhatIf(demo, [battery], "1", { aftOfBowMm: 150 * IN, offCentreMm: 44 * IN, heightMm: 10 * IN });
    expect(r.before.heelDeg).toBeCloseTo(0, 10);
    expect(r.after.heelDeg).toBeCloseTo(1.496, 3);
    expect(describeHeel(r.after.heelDeg)).toBe("1.5° to starboard");
  });

  it("levels by moving each item, or by adding weight on the high side", () => {
    // By hand: Σ w·y = 58 × 22 − 120 × 10 = 76 in·lb to starboard: the battery moves 76/58 = 1.3103 in
    // to port; or 76/30 = 2.5333 lb goes 30 in to port; nothing on the starboard side can help.
    const entries: LedgerEntry[] = [
      { ...battery, offCentreMm: 22 * IN },
      { id: "2", name: "Water", weightKg: 120 * LB, aftOfBowMm: 100 * IN, offCentreMm: -10 * IN, heightMm: null },
    ];
    const plans = levelPlans(demo, entries);
    expect(plans[0].shiftMm).toBeCloseTo(-1.3103 * IN, 2);
    expect(plans[0].newOffCentreMm).toBeCloseTo(20.6897 * IN, 2);
    expect(plans[0].withinBeam).toBe(true);
    // The water alone: 76/120 = 0.6333 in further to port.
    expect(plans[1].shiftMm).toBeCloseTo(-0.6333 * IN, 2);
    expect(weightToLevelAt(entries, -30 * IN)).toBeCloseTo(2.5333 * LB, 4);
    expect(weightToLevelAt(entries, 30 * IN)).toBeNull();
  });

  it("flags a levelling move that would leave the hull", () => {
    // By hand: 200 lb at 40 in to starboard against a 5 lb item: 8000 in·lb / 5 lb = 1600 in, far past the 47 in half-beam.
    const entries: LedgerEntry[] = [
      { id: "a", name: "Heavy", weightKg: 200 * LB, aftOfBowMm: 150 * IN, offCentreMm: 40 * IN, heightMm: null },
      { id: "b", name: "Light", weightKg: 5 * LB, aftOfBowMm: 150 * IN, offCentreMm: 0, heightMm: null },
    ];
    expect(levelPlans(demo, entries)[1].withinBeam).toBe(false);
  });

  it("trims with GM_L 36 ft: MCT1 = Δ·GM_L / (12·L) (Nicholls)", () => {
    // By hand: Δ = 2850 + 150 = 3000 lb; MCT1 = 3000 × 36 / (12 × 230/12) = 469.565 ft·lb/in;
    // 150 lb 24 in aft of the LCF: 300 ft·lb → 0.6389 in by the stern.
    const c = boatCondition(demo, [{ id: "t", name: "Tank", weightKg: 150 * LB, aftOfBowMm: 174 * IN, offCentreMm: 0, heightMm: null }]);
    expect(c.trim?.mct1FtLbPerIn).toBeCloseTo(469.565, 3);
    expect(c.trim?.changeIn).toBeCloseTo(0.6389, 4);
    expect(describeTrim(c.trim?.changeIn as number, "in")).toBe("5/8 in by the stern"); // 0.6389 × 32 = 20.4 → 20/32
    expect(describeTrim(c.trim?.changeIn as number, "mm")).toBe("16 mm by the stern");
  });
});

describe("words, never signs", () => {
  it("says port and starboard", () => {
    expect(describeOffset(25 * IN, "in")).toBe("25 in to starboard");
    expect(describeOffset(-635, "mm")).toBe("635 mm to port");
    expect(describeOffset(0, "in")).toBe("on the centreline");
    expect(describeHeel(-0.748)).toBe("0.75° to port");
    expect(describeHeel(0.0001)).toBe("upright");
    expect(describeDraftChange(-0.6, "in")).toBe("19/32 in higher");
    expect(describeDraftChange(0.0001, "in")).toBe("no change");
    expect(describePosition({ aftOfBowMm: 135 * IN, offCentreMm: -25 * IN, heightMm: null }, "in")).toBe("135 in aft of the bow, 25 in to port");
    for (const s of [describeOffset(-10, "mm"), describeHeel(-3), describeTrim(-1, "in")]) expect(s).not.toMatch(/-/);
  });

  it("shows GM, moments and MCT1 in the reader's units (NIST Handbook 44 factors)", () => {
    expect(formatGm(2.8 * FT, "in")).toBe("2.80 ft");
    expect(formatGm(2.8 * FT, "mm")).toBe("0.853 m"); // 2.8 × 0.3048 = 0.85344 m
    expect(formatMoment(-212.667, "in")).toBe("212.7 ft·lb");
    // 1 ft·lb = 0.3048 m × 0.45359237 kg = 0.138255 kg·m; 212.667 ft·lb = 29.40 kg·m
    expect(formatMoment(212.667, "mm")).toBe("29.4 kg·m");
    // 469.565 ft·lb per inch = 64.92 kg·m per inch = 25.56 kg·m per cm
    expect(formatMct1(469.565, "mm")).toBe("25.6 kg·m per cm");
  });
});

type SeedCalc = { writeup: string; kind: string; items?: { id: string; weightLb: number; position: { aftOfBowIn: number; offCentreIn: number; side: string; heightIn?: number } }[]; moved?: string; to?: { aftOfBowIn: number; offCentreIn: number; side: string; heightIn?: number } };

describe("the seeded write-up calculations (content-seed/ledger.yaml, invented demo data)", () => {
  const seed = readSeedYaml<{ calculations: SeedCalc[] }>("ledger.yaml");
  const signed = (p: { offCentreIn: number; side: string }) => (p.side === "port" ? -1 : p.side === "starboard" ? 1 : 0) * p.offCentreIn;

  it("moving the second battery 51 in across takes her from 1.30° to starboard to 0.33° to port", () => {
    const calc = seed.calculations.find((c) => c.kind === "weight-move") as Required<SeedCalc>;
    // By hand from the yaml: Σ w = 450 lb, Δ = 3300 lb, Δ·GM = 9240 ft·lb.
    const total = calc.items.reduce((s, i) => s + i.weightLb, 0);
    expect(total).toBe(450);
    const m0 = calc.items.reduce((s, i) => s + (i.weightLb * signed(i.position)) / 12, 0);
    expect(m0).toBeCloseTo(209.833, 3); // −67.667 + 125 + 129.167 + 93.333 − 55 − 15
    const moved = calc.items.find((i) => i.id === calc.moved)!;
    const m1 = m0 + (moved.weightLb * (signed(calc.to) - signed(moved.position))) / 12; // − 62 × 51 / 12 = −263.5
    expect(m1).toBeCloseTo(-53.667, 3);
    const heel = (m: number) => (Math.atan(m / 9240) * 180) / Math.PI;
    expect(heel(m0)).toBeCloseTo(1.3009, 3);
    expect(heel(m1)).toBeCloseTo(-0.3328, 3);

    const input = weightMoveInputSchema.parse({
      particulars: demo,
      gmMm: demo.gmMm,
      items: calc.items.map((i) => ({ id: i.id, name: i.id, weightKg: i.weightLb * LB, aftOfBowMm: i.position.aftOfBowIn * IN, offCentreMm: signed(i.position) * IN, heightMm: (i.position.heightIn ?? 0) * IN })),
      moved: calc.moved,
      to: { aftOfBowMm: calc.to.aftOfBowIn * IN, offCentreMm: signed(calc.to) * IN, heightMm: (calc.to.heightIn ?? 0) * IN },
    });
    const r = computeWeightMove(input);
    expect(r.before.heelDeg).toBeCloseTo(heel(m0), 8);
    expect(r.after.heelDeg).toBeCloseTo(heel(m1), 8);
    expect(describeHeel(r.before.heelDeg)).toBe("1.3° to starboard");
    expect(describeHeel(r.after.heelDeg)).toBe("0.33° to port");
    expect(r.acrossMm).toBeCloseTo(-51 * IN, 9);
  });

  it("refuses a stored input that does not read, and one whose moved item is missing", () => {
    expect(readCalculation("weight-move", { items: [] })).toBeNull();
    expect(readCalculation("cable-run", { currentA: -1 })).toBeNull();
    expect(readCalculation("nonsense", {})).toBeNull();
    const bad = { particulars: demo, gmMm: 800, items: [{ ...battery }], moved: "nope", to: { aftOfBowMm: 0, offCentreMm: 0 } };
    expect(readCalculation("weight-move", bad)).toBeNull();
    expect(readCalculation("weight-move", { ...bad, moved: "1" })?.kind).toBe("weight-move");
  });

  it("the cable run for the longer lead: 30 A, 11 ft one way, 3 % of 12 V → 6 AWG (ABYC E-11; NEC Ch. 9 Table 8)", () => {
    // ABYC E-11 as reproduced: CM = 10.75 × 30 × 22 / 0.36 = 19,708 → 6 AWG (26,240 CM; 8 AWG has 16,510).
    // NEC Table 8: 6 AWG 0.491 Ω/kft → 30 × 0.491 × 22 / 1000 = 0.3241 V = 2.70 % of 12 V.
    // 33 CFR 183.425 Table 5, 105 °C outside engine spaces: 6 AWG 120 A → at most 180 A of fuse (183.455(c)).
    const r = computeCableRun({ currentA: 30, oneWayLengthMm: 11 * FT, systemVoltage: 12, allowedDropPct: 3, insulationRatingC: 105, inEngineSpace: false, label: "" });
    if (!r.ok) throw new Error(r.message);
    expect(r.requiredCircularMils).toBeCloseTo(19708.3, 1);
    expect(r.chosen).toBe("6");
    expect(r.actualDropPct).toBeCloseTo(2.7005, 3);
    expect(r.maxOvercurrentA).toBe(180);
  });
});
