import { describe, expect, it } from "vitest";
import {
  awgCircularMils,
  awgDiameterIn,
  awgGaugeNumber,
  awgOhmsPerKft20C,
  requiredCircularMils,
  sizeCableRun,
  tableAmpacity,
  type CableRunInput,
  type CableRunResult,
} from "~/domain/cable";
import { AWG_SIZES, CFR_183_425_TABLE5, INSULATION_RATINGS_C, NEC_CH9_TABLE8 } from "~/domain/conductors";

function ok(input: CableRunInput): CableRunResult {
  const result = sizeCableRun(input);
  if (!result.ok) throw new Error(`expected a size, got ${result.reason}: ${result.message}`);
  return result;
}

const base: CableRunInput = {
  currentA: 10,
  oneWayLengthFt: 10.5,
  systemVoltage: 12,
  allowedDropPct: 3,
  insulationRatingC: 105,
  inEngineSpace: false,
};

describe("ASTM B258 AWG diameters and copper resistance", () => {
  it("gauge numbers: 1/0 is 0, 2/0 is −1", () => {
    // ASTM B258: n = 0 for 1/0, −1 for 2/0
    expect(awgGaugeNumber("1/0")).toBe(0);
    expect(awgGaugeNumber("2/0")).toBe(-1);
    expect(awgGaugeNumber("12")).toBe(12);
    expect(() => awgGaugeNumber("0/0")).toThrow(RangeError);
    expect(() => awgGaugeNumber("twelve")).toThrow(RangeError);
  });

  it("36 AWG is 0.005 in and 0000 AWG is 0.46 in", () => {
    // ASTM B258 formula: n = 36 gives 0.005 × 92^0 = 0.005 in; 4/0 (n = −3) gives 0.005 × 92 = 0.46 in
    expect(awgDiameterIn("36")).toBeCloseTo(0.005, 10);
    expect(awgDiameterIn("4/0")).toBeCloseTo(0.46, 10);
  });

  it.each([
    // ASTM B258 diameter with copper resistivity 10.371 ohm·cmil/ft at 20 °C (values as published)
    ["16", 4.016],
    ["14", 2.525],
    ["12", 1.588],
    ["10", 0.9989],
    ["2/0", 0.078],
  ])("%s AWG: %s ohm per 1000 ft within 0.2 %%", (awg, ohms) => {
    expect(Math.abs(awgOhmsPerKft20C(awg) / ohms - 1)).toBeLessThan(0.002);
  });

  it.each(AWG_SIZES.map((awg) => [awg]))(
    "NEC Chapter 9 Table 8 area for %s AWG is within 1 % of the ASTM B258 area",
    (awg) => {
      // NEC Ch. 9 Table 8 circular mils vs ASTM B258 d² (d in mils)
      expect(Math.abs(NEC_CH9_TABLE8[awg].circularMils / awgCircularMils(awg) - 1)).toBeLessThan(0.01);
    },
  );
});

describe("the published tables as data", () => {
  it("areas rise and resistances fall with size (NEC Ch. 9 Table 8)", () => {
    for (let i = 1; i < AWG_SIZES.length; i++) {
      const smaller = NEC_CH9_TABLE8[AWG_SIZES[i - 1]];
      const larger = NEC_CH9_TABLE8[AWG_SIZES[i]];
      expect(larger.circularMils).toBeGreaterThan(smaller.circularMils);
      expect(larger.ohmsPerKft).toBeLessThan(smaller.ohmsPerKft);
    }
  });

  it("ampacity never falls with size or rating, and is lower in engine spaces (33 CFR 183.425 Table 5)", () => {
    for (let i = 0; i < AWG_SIZES.length; i++) {
      const row = CFR_183_425_TABLE5[AWG_SIZES[i]];
      for (let r = 1; r < INSULATION_RATINGS_C.length; r++) {
        expect(row.outside[INSULATION_RATINGS_C[r]]).toBeGreaterThanOrEqual(row.outside[INSULATION_RATINGS_C[r - 1]]);
      }
      expect(row.engineSpace105).toBeLessThan(row.outside[105]);
      if (i > 0) {
        const prev = CFR_183_425_TABLE5[AWG_SIZES[i - 1]];
        for (const rating of INSULATION_RATINGS_C) {
          expect(row.outside[rating]).toBeGreaterThan(prev.outside[rating]);
        }
        expect(row.engineSpace105).toBeGreaterThan(prev.engineSpace105);
      }
    }
  });
});

describe("circular mils by voltage drop (ABYC E-11, as widely reproduced)", () => {
  it("worked example: 10 A, 21 ft round trip, 3 % of 12 V → CM 6,270.8 → 12 AWG by area", () => {
    // ABYC E-11 as reproduced: CM = 10.75 × 10 × 21 / 0.36 = 6,270.8; NEC Table 8: 12 AWG = 6,530 cmil
    const r = ok(base);
    expect(r.roundTripFt).toBe(21);
    expect(r.allowedDropV).toBeCloseTo(0.36, 12);
    expect(r.requiredCircularMils).toBeCloseTo(6270.8, 1);
    expect(r.sizes.byArea).toBe("12");
  });

  it("worked example by Table 8 resistance needs 10 AWG, which governs the drop size", () => {
    // NEC Ch. 9 Table 8 at 75 °C. By hand: 12 AWG: 10 A × 1.98 Ω/kft × 0.021 kft = 0.4158 V > 0.36 V;
    // 10 AWG: 10 × 1.24 × 0.021 = 0.2604 V ≤ 0.36 V → 2.17 % of 12 V.
    const r = ok(base);
    expect(r.sizes.byResistance).toBe("10");
    expect(r.dropSize).toBe("10");
    expect(r.dropGovernedBy).toBe("resistance");
    // 33 CFR 183.425 Table 5, 105 °C outside engine spaces: 16 AWG carries 25 A ≥ 10 A
    expect(r.sizes.byAmpacity).toBe("16");
    expect(r.chosen).toBe("10");
    expect(r.governedBy).toBe("voltage drop");
    expect(r.actualDropV).toBeCloseTo(0.2604, 4);
    expect(r.actualDropPct).toBeCloseTo(2.17, 2);
    expect(r.sizedAgainst).toMatch(/SAE/);
    expect(r.sizedAgainst).toMatch(/NEC Chapter 9, Table 8/);
  });

  it("24 V halves the circular mils", () => {
    // CM = K·I·L/E: E doubles from 0.36 V to 0.72 V at 3 % (ABYC E-11 as reproduced)
    const at12 = ok(base).requiredCircularMils;
    const at24 = ok({ ...base, systemVoltage: 24 }).requiredCircularMils;
    expect(at24 / at12).toBeCloseTo(0.5, 12);
    expect(requiredCircularMils(10, 21, 0.72)).toBeCloseTo(6270.8 / 2, 1);
  });

  it("drop governs a long run", () => {
    // By hand: 20 A, 25 ft one way (50 ft round trip), 3 % of 12 V:
    // CM = 10.75 × 20 × 50 / 0.36 = 29,861 → 4 AWG (41,740; 6 AWG 26,240 falls short), NEC Table 8;
    // resistance ≤ 0.36 × 1000 / (20 × 50) = 0.36 Ω/kft → 4 AWG (0.308);
    // ampacity 105 °C outside: 16 AWG (25 A), 33 CFR 183.425 Table 5.
    const r = ok({ ...base, currentA: 20, oneWayLengthFt: 25 });
    expect(r.requiredCircularMils).toBeCloseTo(29861.1, 1);
    expect(r.sizes).toEqual({ byArea: "4", byResistance: "4", byAmpacity: "16" });
    expect(r.dropGovernedBy).toBe("both");
    expect(r.chosen).toBe("4");
    expect(r.governedBy).toBe("voltage drop");
  });

  it("ampacity governs a short heavy run", () => {
    // By hand: 100 A, 3 ft one way (6 ft round trip), 10 % of 12 V, 60 °C insulation:
    // CM = 10.75 × 100 × 6 / 1.2 = 5,375 → 12 AWG; resistance ≤ 1.2 × 1000 / 600 = 2.0 → 12 AWG (1.98);
    // 33 CFR 183.425 Table 5, 60 °C: 6 AWG 80 A < 100 A, 4 AWG 105 A → 4 AWG.
    // Drop with 4 AWG: 100 × 0.308 × 0.006 = 0.1848 V = 1.54 % of 12 V.
    const r = ok({ ...base, currentA: 100, oneWayLengthFt: 3, allowedDropPct: 10, insulationRatingC: 60 });
    expect(r.sizes).toEqual({ byArea: "12", byResistance: "12", byAmpacity: "4" });
    expect(r.chosen).toBe("4");
    expect(r.governedBy).toBe("ampacity");
    expect(r.chosenAmpacityA).toBe(105);
    expect(r.actualDropV).toBeCloseTo(0.1848, 4);
    expect(r.actualDropPct).toBeCloseTo(1.54, 2);
  });
});

describe("overcurrent protection (33 CFR 183.455)", () => {
  it("the largest device is 150 % of the chosen conductor's Table 5 ampacity", () => {
    // 33 CFR 183.455(c): at most 150 % of Table 5 under 50 V. Short heavy run above: 4 AWG at 60 °C
    // carries 105 A (33 CFR 183.425 Table 5) → 157.5 A.
    const heavy = ok({ ...base, currentA: 100, oneWayLengthFt: 3, allowedDropPct: 10, insulationRatingC: 60 });
    expect(heavy.maxOvercurrentA).toBeCloseTo(1.5 * 105, 10);
    // Worked example: 10 AWG at 105 °C outside engine spaces carries 60 A → 90 A.
    expect(ok(base).maxOvercurrentA).toBeCloseTo(1.5 * 60, 10);
  });

  it("cautions name the 7 in / 40 in rule, the battery rules, and defer to ABYC E-11", () => {
    const text = ok(base).cautions.join("\n");
    expect(text).toMatch(/7 in/); // 33 CFR 183.455
    expect(text).toMatch(/40 in/); // 33 CFR 183.455
    expect(text).toMatch(/72 in/); // ABYC E-11 as reproduced (memory)
    expect(text).toMatch(/183\.420/); // battery securing and venting
    expect(text).toMatch(/qualified marine electrician/);
  });

  it("says the 150 % figure is the ceiling that protects the cable, not the fuse to fit", () => {
    // 33 CFR 183.455(c) sets only the most a device may be rated; choosing a rating at or just above
    // the load's draw is common practice.
    const r = ok(base);
    const text = r.cautions.join("\n");
    expect(text).toMatch(/150 % of the conductor's ampacity \(33 CFR 183\.455\(c\)/);
    expect(text).toMatch(/not the fuse to fit/);
    expect(text).toMatch(/at or just above what the load draws[^.]*\(common practice\)/);
    expect(text).not.toMatch(/at or below the maximum shown/);
    // What the sizes are sized against is said once, beside the table, not again among the cautions.
    expect(r.sizedAgainst).toMatch(/NEC Chapter 9, Table 8/);
    expect(r.cautions).not.toContain(r.sizedAgainst);
  });
});

describe("engine spaces (33 CFR 183.425 Table 5)", () => {
  it("uses the 105 °C engine-space column", () => {
    // By hand: 22 A, 2 ft one way, 10 % of 12 V: drop needs only 16 AWG (CM 788).
    // Table 5: outside at 105 °C, 16 AWG carries 25 A; inside engine spaces 21 A < 22 A → 14 AWG (30 A).
    const outside = ok({ ...base, currentA: 22, oneWayLengthFt: 2, allowedDropPct: 10 });
    const inside = ok({ ...base, currentA: 22, oneWayLengthFt: 2, allowedDropPct: 10, inEngineSpace: true });
    expect(outside.chosen).toBe("16");
    expect(inside.chosen).toBe("14");
    expect(inside.governedBy).toBe("ampacity");
    expect(inside.chosenAmpacityA).toBe(30);
    expect(inside.maxOvercurrentA).toBeCloseTo(1.5 * 30, 10); // 33 CFR 183.455(c)
    expect(inside.ampacityColumn).toMatch(/inside engine spaces/);
  });

  it("refuses other insulation ratings inside an engine space", () => {
    for (const rating of [60, 75, 90] as const) {
      const r = sizeCableRun({ ...base, insulationRatingC: rating, inEngineSpace: true });
      expect(r.ok).toBe(false);
      if (!r.ok) {
        expect(r.reason).toBe("engine-space-rating");
        expect(r.message).toMatch(/105 °C/);
      }
      expect(tableAmpacity("10", rating, true)).toBeNull();
    }
  });
});

describe("when nothing listed is large enough", () => {
  it("says so for the voltage drop", () => {
    // By hand: 200 A, 60 ft round trip, 3 % of 12 V: CM = 10.75 × 200 × 60 / 0.36 = 358,333,
    // more than 2/0 AWG's 133,100 cmil (NEC Ch. 9 Table 8)
    const r = sizeCableRun({ ...base, currentA: 200, oneWayLengthFt: 30 });
    expect(r.ok).toBe(false);
    if (!r.ok) {
      expect(r.reason).toBe("nothing-large-enough");
      expect(r.requiredCircularMils).toBeCloseTo(358333.3, 1);
      expect(r.sizes?.byArea).toBeNull();
      expect(r.message).toMatch(/2\/0 AWG/);
      expect(r.message).toMatch(/voltage drop/);
    }
  });

  it("says so for ampacity", () => {
    // 400 A exceeds 2/0 AWG's 330 A at 105 °C outside engine spaces (33 CFR 183.425 Table 5);
    // the drop alone (CM = 10.75 × 400 × 2 / 1.2 = 7,167) would take 10 AWG.
    const r = sizeCableRun({ ...base, currentA: 400, oneWayLengthFt: 1, allowedDropPct: 10 });
    expect(r.ok).toBe(false);
    if (!r.ok) {
      expect(r.reason).toBe("nothing-large-enough");
      expect(r.sizes?.byArea).toBe("10");
      expect(r.sizes?.byAmpacity).toBeNull();
      expect(r.message).toMatch(/ampacity/);
      expect(r.message).not.toMatch(/voltage drop/);
    }
  });

  it("rejects a zero current or a non-positive length", () => {
    expect(sizeCableRun({ ...base, currentA: 0 }).ok).toBe(false);
    const r = sizeCableRun({ ...base, oneWayLengthFt: -2 });
    expect(r.ok).toBe(false);
    if (!r.ok) expect(r.reason).toBe("invalid-input");
  });
});
