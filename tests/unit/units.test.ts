import { describe, expect, it } from "vitest";
import {
  editableLength,
  formatDimensions,
  formatLength,
  formatWeight,
  inchesToMm,
  kgToPounds,
  KG_PER_POUND,
  MM_PER_FOOT,
  MM_PER_INCH,
  mmToInches,
  parseDimensions,
  parseLength,
  parseWeight,
  poundsToKg,
} from "~/domain/units";

// Exact definitions: NIST Handbook 44 Appendix C and NIST SP 811 (Appendix B):
// 1 in = 25.4 mm, 1 ft = 12 in = 304.8 mm, 1 lb = 0.45359237 kg, 1 oz = 1/16 lb.

function mm(input: string, unit: "in" | "mm" = "in"): number {
  const r = parseLength(input, unit);
  if (!r.ok) throw new Error(`expected "${input}" to parse: ${r.message}`);
  return r.mm;
}

function kg(input: string, unit: "lb" | "kg" = "lb"): number {
  const r = parseWeight(input, unit);
  if (!r.ok) throw new Error(`expected "${input}" to parse: ${r.message}`);
  return r.kg;
}

function lengthError(input: string, unit: "in" | "mm" = "in"): string {
  const r = parseLength(input, unit);
  if (r.ok) throw new Error(`expected "${input}" to be rejected, got ${r.mm} mm`);
  return r.message;
}

function weightError(input: string, unit: "lb" | "kg" = "lb"): string {
  const r = parseWeight(input, unit);
  if (r.ok) throw new Error(`expected "${input}" to be rejected, got ${r.kg} kg`);
  return r.message;
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

describe("exact conversion factors", () => {
  it("1 in is 25.4 mm and 1 ft is 304.8 mm exactly", () => {
    expect(MM_PER_INCH).toBe(25.4); // NIST HB 44 App. C
    expect(MM_PER_FOOT).toBe(304.8); // 1 ft = 12 in = 12 x 25.4 mm, NIST HB 44 App. C
    expect(inchesToMm(1)).toBe(25.4); // NIST HB 44 App. C
    expect(mm("1 in")).toBe(25.4); // NIST HB 44 App. C
    expect(mm("1 ft")).toBe(304.8); // NIST HB 44 App. C: 12 x 25.4
    expect(mmToInches(25.4)).toBe(1); // NIST HB 44 App. C
  });

  it("1 lb is 0.45359237 kg exactly, 1 oz is 1/16 of it", () => {
    expect(KG_PER_POUND).toBe(0.45359237); // NIST HB 44 App. C
    expect(poundsToKg(1)).toBe(0.45359237); // NIST HB 44 App. C
    expect(kg("1 lb")).toBe(0.45359237); // NIST HB 44 App. C
    expect(kg("16 oz")).toBe(0.45359237); // NIST HB 44 App. C: 1 lb = 16 oz avoirdupois
    expect(kgToPounds(0.45359237)).toBe(1); // NIST HB 44 App. C
  });

  it("decimal and fractional inputs land on the same number as the decimal literal", () => {
    // 13.5 x 25.4 = 342.9 exactly (by hand)
    expect(mm("13.5 in")).toBe(342.9);
    // 3/4 x 25.4 = 19.05 (by hand)
    expect(mm("3/4")).toBe(19.05);
    // 12 oz = 0.75 lb = 0.75 x 0.45359237 = 0.3401942775 kg (by hand, NIST HB 44 App. C)
    expect(kg("12 oz")).toBe(0.3401942775);
    // 58 lb = 58 x 0.45359237 = 26.30835746 kg (by hand)
    expect(kg("58 lb")).toBe(26.30835746);
  });

  it("BCI group 27 in inches and in millimetres agree within 1 mm", () => {
    // BCI group size chart, group 27 maximum case size
    const inches = parseDimensions("12 1/16 x 6 13/16 x 8 7/8 in", "mm");
    const metric = parseDimensions("306 x 173 x 225 mm", "in");
    expect(inches.ok && metric.ok).toBe(true);
    if (!inches.ok || !metric.ok) return;
    expect(metric.mm).toEqual([306, 173, 225]);
    inches.mm.forEach((v, i) => expect(Math.abs(v - metric.mm[i])).toBeLessThanOrEqual(1));
    // 12 1/16 in = 306.3875 mm (by hand: 193/16 x 25.4)
    expect(inches.mm[0]).toBeCloseTo(306.3875, 9);
  });
});

describe("parseLength: accepted forms", () => {
  // 13 1/2 in = 342.9 mm (by hand: 13.5 x 25.4)
  it.each([
    ["13 1/2", "in"],
    ["13.5 in", "in"],
    ['13.5"', "in"],
    ["13.5 inches", "mm"],
    ["13-1/2", "in"],
    ["13 - 1/2 in", "in"],
    ["13½", "in"],
    ["13 ½ in", "in"],
    ["13 1⁄2 in", "in"],
    ["13.5 IN", "mm"],
    ["13.5in", "mm"],
    ["13.5 in.", "mm"],
    ["  13 1/2  ", "in"],
    ["1 ft 1 1/2 in", "mm"],
    ["1' 1 1/2\"", "mm"],
    ["1′ 1½″", "mm"],
    ["1'1.5''", "mm"],
    ["1 foot 1.5 inch", "mm"],
    ["1 ft 1 1/2", "mm"],
    ["27/2", "in"],
    ["342.9 mm", "in"],
    ["342.9", "mm"],
    ["34.29 cm", "in"],
    ["0.3429 m", "in"],
  ] as const)("%j (default %s) is 13 1/2 in", (input, unit) => {
    expect(mm(input, unit)).toBeCloseTo(13.5 * 25.4, 9);
  });

  it("reads the metric forms", () => {
    expect(mm("343 mm")).toBe(343);
    expect(mm("34.3 cm")).toBe(343); // 34.3 x 10 (by hand)
    expect(mm("0.5 m")).toBe(500); // 0.5 x 1000 (by hand)
    expect(mm("0.5 metres")).toBe(500);
    expect(mm("343 millimeters")).toBe(343);
    expect(mm("2,850 mm")).toBe(2850);
  });

  it("reads a bare number in the default unit", () => {
    expect(mm("343", "mm")).toBe(343);
    expect(mm("3/4", "in")).toBe(19.05); // 0.75 x 25.4 (by hand)
    expect(mm("3/4", "mm")).toBe(0.75);
    expect(mm(".5", "in")).toBe(12.7); // 0.5 x 25.4 (by hand)
  });

  it("reads feet alone and feet with inches", () => {
    expect(mm("2 ft")).toBe(609.6); // 24 x 25.4 (by hand)
    expect(mm("1' 6")).toBe(457.2); // 18 x 25.4 (by hand)
    expect(mm("1.5 ft")).toBe(457.2);
  });
});

describe("parseLength: rejections", () => {
  it("empty", () => {
    expect(lengthError("")).toBe("Enter a length.");
    expect(lengthError("   ")).toBe("Enter a length.");
  });

  it("negative", () => {
    expect(lengthError("-3")).toBe("A length cannot be negative.");
    expect(lengthError("−3 in")).toBe("A length cannot be negative.");
  });

  it("zero", () => {
    expect(lengthError("0")).toBe("A length must be more than zero.");
    expect(lengthError("0 ft 0 in")).toBe("A length must be more than zero.");
  });

  it("zero denominator", () => {
    const message = "A fraction cannot have 0 below the line (as in 1/0).";
    expect(lengthError("1/0")).toBe(message);
    expect(lengthError("13 1/0 in")).toBe(message);
  });

  it("absurd sizes over 10 m", () => {
    const message = "That is more than 10 m (about 33 ft). Check the number and the unit.";
    expect(lengthError("11 m")).toBe(message);
    expect(lengthError("10001 mm")).toBe(message);
    expect(lengthError("400")).toBe(message); // 400 in = 10,160 mm (by hand)
    expect(mm("10 m")).toBe(10_000); // the limit itself is allowed
  });

  it("too many digits", () => {
    expect(lengthError("12345678901234567")).toBe("That number has too many digits.");
  });

  it("decimal comma", () => {
    expect(lengthError("34,3 cm")).toBe("Write decimals with a point (34.3), not a comma.");
  });

  it("decimals inside a fraction", () => {
    expect(lengthError("13.5 1/2")).toBe("Write a fraction with whole numbers, like 13 1/2.");
    expect(lengthError("1.5/2")).toBe("Write a fraction with whole numbers, like 13 1/2.");
  });

  it.each(["abc", "13 x 7", "13 min", "1 1", "in", "1 in 6", "1 ft 6 mm", "13 in 1/2", "1/", "+3"])(
    "nonsense %j",
    (input) => {
      expect(lengthError(input)).toBe(
        `Could not read "${input.toLowerCase()}" as a length. ` +
          "Try 13 1/2, 13.5 in, 343 mm or 1 ft 1 1/2 in.",
      );
    },
  );
});

describe("formatLength", () => {
  it("inches to the nearest 1/16, reduced", () => {
    expect(formatLength(13.5 * 25.4, "in")).toBe("13 1/2 in");
    expect(formatLength((6 + 13 / 16) * 25.4, "in")).toBe("6 13/16 in");
    expect(formatLength(25.4 / 16, "in")).toBe("1/16 in");
    expect(formatLength(14 * 25.4, "in")).toBe("14 in");
    expect(formatLength(0, "in")).toBe("0 in");
    // 343 mm = 13.5039 in, nearest sixteenth 216/16 = 13 1/2 (by hand)
    expect(formatLength(343, "in")).toBe("13 1/2 in");
    // 3/8 in short
    expect(formatLength(-(3 / 8) * 25.4, "in")).toBe("-3/8 in");
  });

  it("rounds to the nearer sixteenth", () => {
    const sixteenth = 25.4 / 16;
    expect(formatLength(10 * sixteenth + 0.4 * sixteenth, "in")).toBe("5/8 in");
    expect(formatLength(10 * sixteenth + 0.6 * sixteenth, "in")).toBe("11/16 in");
    expect(formatLength(15.6 * sixteenth, "in")).toBe("1 in");
  });

  it("takes another denominator", () => {
    // 6.8225 in x 8 = 54.58 eighths, nearest 55 = 6 7/8 (by hand)
    expect(formatLength((6 + 13 / 16 + 0.01) * 25.4, "in", { denominator: 8 })).toBe("6 7/8 in");
    expect(formatLength((1 + 1 / 32) * 25.4, "in", { denominator: 32 })).toBe("1 1/32 in");
  });

  it("millimetres to the whole millimetre", () => {
    expect(formatLength(342.9, "mm")).toBe("343 mm");
    expect(formatLength(306.3875, "mm")).toBe("306 mm");
    expect(formatLength(-0.2, "mm")).toBe("0 mm");
  });

  it("formats a box", () => {
    // BCI group size chart, group 27
    const box = {
      length: (12 + 1 / 16) * 25.4,
      width: (6 + 13 / 16) * 25.4,
      height: (8 + 7 / 8) * 25.4,
    };
    expect(formatDimensions(box, "in")).toBe("12 1/16 x 6 13/16 x 8 7/8 in");
    expect(formatDimensions(box, "mm")).toBe("306 x 173 x 225 mm");
  });
});

describe("length round trips (property)", () => {
  it("every sixteenth from 1/16 in to 100 in survives format then parse", () => {
    for (let n = 1; n <= 1600; n++) {
      const value = (n * 25.4) / 16;
      expect(mm(formatLength(value, "in"), "mm")).toBeCloseTo(value, 9);
    }
  });

  it("any length comes back within half a sixteenth (inches) or half a millimetre", () => {
    const next = random(27);
    for (let i = 0; i < 2000; i++) {
      const value = 0.8 + next() * 9000;
      expect(Math.abs(mm(formatLength(value, "in"), "mm") - value)).toBeLessThanOrEqual(
        25.4 / 32 + 1e-9,
      );
      expect(Math.abs(mm(formatLength(value, "mm"), "in") - value)).toBeLessThanOrEqual(0.5);
    }
  });

  it("whole millimetres survive exactly", () => {
    for (let v = 1; v <= 3000; v += 7) expect(mm(formatLength(v, "mm"), "in")).toBe(v);
  });
});

describe("parseWeight", () => {
  it("reads the usual forms", () => {
    // 58 lb = 26.30835746 kg (by hand, NIST HB 44 App. C)
    expect(kg("58 lb")).toBe(26.30835746);
    expect(kg("58 lbs")).toBe(26.30835746);
    expect(kg("58 pounds")).toBe(26.30835746);
    expect(kg("58", "lb")).toBe(26.30835746);
    expect(kg("26.3 kg")).toBe(26.3);
    expect(kg("26.3", "kg")).toBe(26.3);
    expect(kg("26.3 kilos")).toBe(26.3);
    expect(kg("500 g")).toBe(0.5);
    expect(kg("12 oz")).toBe(0.3401942775); // 0.75 lb (by hand)
    // 1 lb 4 oz = 1.25 lb = 0.5669904625 kg (by hand)
    expect(kg("1 lb 4 oz")).toBe(0.5669904625);
    expect(kg("1 lb 4")).toBe(0.5669904625);
    expect(kg("2,850 lb")).toBeCloseTo(2850 * 0.45359237, 9);
    expect(kg("58 1/2 lb")).toBeCloseTo(58.5 * 0.45359237, 12);
  });

  it("rejects what is not a weight, each with its message", () => {
    expect(weightError("")).toBe("Enter a weight.");
    expect(weightError("-5 lb")).toBe("A weight cannot be negative.");
    expect(weightError("0 kg")).toBe("A weight must be more than zero.");
    expect(weightError("1/0 lb")).toBe("A fraction cannot have 0 below the line (as in 1/0).");
    expect(weightError("26,3 kg")).toBe("Write decimals with a point (34.3), not a comma.");
    expect(weightError("10001 kg")).toBe(
      "That is more than 10,000 kg (about 22,000 lb). Check the number and the unit.",
    );
    expect(weightError("58 in")).toBe(
      'Could not read "58 in" as a weight. Try 58 lb, 26.3 kg or 1 lb 4 oz.',
    );
    expect(weightError("1 kg 4 oz")).toBe(
      'Could not read "1 kg 4 oz" as a weight. Try 58 lb, 26.3 kg or 1 lb 4 oz.',
    );
  });
});

describe("formatWeight", () => {
  it("pounds to 0.1 lb, ounces under a pound", () => {
    expect(formatWeight(58 * 0.45359237, "lb")).toBe("58 lb");
    expect(formatWeight(57.3 * 0.45359237, "lb")).toBe("57.3 lb");
    expect(formatWeight(0.75 * 0.45359237, "lb")).toBe("12 oz");
    expect(formatWeight((15.7 / 16) * 0.45359237, "lb")).toBe("1 lb"); // 15.7 oz rounds to 16
    expect(formatWeight(0, "lb")).toBe("0 lb");
    // A part of 0.01 lb is 0.16 oz (16 oz to the pound, NIST Handbook 44 Appendix C): shown, not "0 oz".
    expect(formatWeight(0.01 * 0.45359237, "lb")).toBe("0.16 oz");
    expect(formatWeight(0.0004 * 0.45359237, "lb")).toBe("0.01 oz");
    // What the editor shows, it reads back: the tiny part keeps a weight above zero.
    const back = parseWeight(formatWeight(0.01 * 0.45359237, "lb"), "lb");
    expect(back.ok && back.kg).toBeCloseTo(0.16 / 16 * 0.45359237, 9);
  });

  it("kilograms to 0.1 kg, grams under a kilogram", () => {
    expect(formatWeight(26.3, "kg")).toBe("26.3 kg");
    expect(formatWeight(26.30835746, "kg")).toBe("26.3 kg");
    expect(formatWeight(0.34, "kg")).toBe("340 g");
    expect(formatWeight(0.0005, "kg")).toBe("0.5 g");
    expect(formatWeight(0.9996, "kg")).toBe("1 kg");
  });

  it("round trips within the display precision (property)", () => {
    const next = random(58);
    for (let i = 0; i < 2000; i++) {
      const value = 0.05 + next() * 5000;
      const lb = kg(formatWeight(value, "lb"), "kg");
      // half of 0.1 lb, or half an ounce below a pound
      expect(Math.abs(lb - value)).toBeLessThanOrEqual(0.05 * 0.45359237 + 1e-9);
      const metric = kg(formatWeight(value, "kg"), "lb");
      expect(Math.abs(metric - value)).toBeLessThanOrEqual(0.05 + 1e-9);
    }
  });
});

describe("parseDimensions", () => {
  it("applies a trailing unit to every number", () => {
    const r = parseDimensions("13 x 7 x 9.5 in", "mm");
    // 13, 7 and 9.5 x 25.4 (by hand)
    expect(r).toEqual({ ok: true, mm: [330.2, 177.8, 241.3] });
    const compact = parseDimensions("13x7x9 1/2", "in");
    expect(compact).toEqual(r);
    expect(parseDimensions("330 × 173 × 240 mm", "in")).toEqual({ ok: true, mm: [330, 173, 240] });
    expect(parseDimensions("12 by 8", "in", 2)).toEqual({ ok: true, mm: [304.8, 203.2] });
  });

  it("keeps a unit written on a part", () => {
    expect(parseDimensions("1 ft x 200 mm x 8 in", "mm")).toEqual({
      ok: true,
      mm: [304.8, 200, 203.2],
    });
  });

  it("rejects the wrong count and a bad part", () => {
    expect(parseDimensions("12 x 8", "in")).toEqual({
      ok: false,
      message: 'Enter 3 sizes separated by "x", like 13 x 7 x 9 1/2 in.',
    });
    expect(parseDimensions("12 x 1/0 x 8", "in")).toEqual({
      ok: false,
      message: "A fraction cannot have 0 below the line (as in 1/0).",
    });
  });
});

describe("editableLength: a stored length as text to edit again", () => {
  // 1 in = 25.4 mm exactly (NIST Handbook 44, Appendix C).
  it("a sixteenth of an inch as its fraction, decimal inches as typed, millimetres to 1/100 mm", () => {
    expect(editableLength(13.5 * 25.4, "in")).toBe("13 1/2");
    expect(editableLength((6 + 13 / 16) * 25.4, "in")).toBe("6 13/16");
    expect(editableLength(13.478 * 25.4, "in")).toBe("13.478");
    expect(editableLength(343, "in")).toBe("343 mm"); // 13.5039... in: neither a sixteenth nor 4 decimals
    expect(editableLength(342.9, "mm")).toBe("342.9");
    expect(editableLength(343, "mm")).toBe("343");
  });

  it("reads back to the stored value within 1/200 mm, in either unit (property)", () => {
    const next = random(91);
    for (let i = 0; i < 3000; i++) {
      const value = 1 + next() * 3000;
      const sixteenth = (Math.round(next() * 1600) * 25.4) / 16;
      for (const v of [value, sixteenth, Math.round(value), Math.round(next() * 10_000) / 10_000 * 25.4 * 40]) {
        if (v <= 0) continue;
        expect(Math.abs(mm(editableLength(v, "in"), "in") - v)).toBeLessThanOrEqual(0.005 + 1e-9);
        expect(Math.abs(mm(editableLength(v, "mm"), "mm") - v)).toBeLessThanOrEqual(0.005 + 1e-9);
      }
    }
  });
});
