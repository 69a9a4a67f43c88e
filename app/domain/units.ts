/**
 * Units of length and weight: reading what members type, and showing stored values.
 *
 * Every length is stored in millimetres (a number, may be fractional) and every weight in
 * kilograms. The reader chooses inches or millimetres, pounds or kilograms, for display.
 *
 * The conversion factors are exact by definition (NIST Handbook 44 Appendix C; NIST SP 811):
 * 1 in = 25.4 mm, 1 ft = 12 in, 1 lb = 0.45359237 kg, 1 oz = 1/16 lb.
 *
 * Parsing works in exact fractions (numerator / denominator) and divides once at the end, so
 * "13.5 in" gives the same number as the literal 342.9 and "1 lb" the literal 0.45359237.
 */

/** The three dimensions of a box (an item or a space), millimetres. */
export interface Box {
  length: number;
  width: number;
  height: number;
}

export type LengthUnit = "in" | "mm";
export type WeightUnit = "lb" | "kg";

export type ParsedLength = { ok: true; mm: number } | { ok: false; message: string };
export type ParsedWeight = { ok: true; kg: number } | { ok: false; message: string };
export type ParsedDimensions = { ok: true; mm: number[] } | { ok: false; message: string };

export const MM_PER_INCH = 25.4;
export const INCHES_PER_FOOT = 12;
export const MM_PER_FOOT = 304.8;
export const KG_PER_POUND = 0.45359237;
export const OUNCES_PER_POUND = 16;

/** Nothing on a 20-to-25-foot boat is longer than this; a bigger number is a typing slip. */
export const MAX_LENGTH_MM = 10_000;
/** Ten tonnes: well above the whole boat's displacement. */
export const MAX_WEIGHT_KG = 10_000;

// ---------------------------------------------------------------------------------------------
// Plain conversions. Multiply by the integer part of the factor first, then divide once.

export function inchesToMm(inches: number): number {
  return (inches * 254) / 10;
}

export function mmToInches(mm: number): number {
  return (mm * 10) / 254;
}

export function poundsToKg(lb: number): number {
  return (lb * 45_359_237) / 100_000_000;
}

export function kgToPounds(kg: number): number {
  return (kg * 100_000_000) / 45_359_237;
}

// ---------------------------------------------------------------------------------------------
// Exact fractions.

type Fraction = { n: number; d: number };

function gcd(a: number, b: number): number {
  a = Math.abs(a);
  b = Math.abs(b);
  while (b) [a, b] = [b, a % b];
  return a || 1;
}

function frac(n: number, d: number): Fraction {
  const g = gcd(n, d);
  return { n: n / g, d: d / g };
}

function add(a: Fraction, b: Fraction): Fraction {
  return frac(a.n * b.d + b.n * a.d, a.d * b.d);
}

function mul(a: Fraction, b: Fraction): Fraction {
  // Cross-reduce first to keep the integers small.
  const g1 = gcd(a.n, b.d);
  const g2 = gcd(b.n, a.d);
  return frac((a.n / g1) * (b.n / g2), (a.d / g2) * (b.d / g1));
}

function isSafe(f: Fraction): boolean {
  return Number.isSafeInteger(f.n) && Number.isSafeInteger(f.d) && f.d > 0;
}

/** "13.5" -> 135/10; "2,850" -> 2850/1. */
function decimalFraction(text: string): Fraction {
  const plain = text.replace(/,/g, "");
  const [whole = "", decimals = ""] = plain.split(".");
  const digits = (whole + decimals).replace(/^0+(?=\d)/, "") || "0";
  return frac(Number(digits), 10 ** decimals.length);
}

// ---------------------------------------------------------------------------------------------
// The reader.

type UnitDef = { pattern: string; factor: Fraction };

interface Quantity {
  /** Human words for messages. */
  noun: "length" | "weight";
  /** Units by key, each with its spelling(s) as a regular-expression alternative and its
   * factor to the canonical unit. */
  units: Record<string, UnitDef>;
  /** A larger unit that may be followed by a smaller one: 1 ft 6 in, 1 lb 4 oz. */
  compound: Record<string, string>;
  max: number;
  maxText: string;
  examples: string;
}

const LENGTH: Quantity = {
  noun: "length",
  units: {
    mm: { pattern: "millimet(?:er|re)s?|mm", factor: frac(1, 1) },
    cm: { pattern: "centimet(?:er|re)s?|cm", factor: frac(10, 1) },
    m: { pattern: "met(?:er|re)s?|m", factor: frac(1000, 1) },
    in: { pattern: 'inch(?:es)?|ins?|"', factor: frac(254, 10) },
    ft: { pattern: "feet|foot|ft|'", factor: frac(3048, 10) },
  },
  compound: { ft: "in" },
  max: MAX_LENGTH_MM,
  maxText: "10 m (about 33 ft)",
  examples: "13 1/2, 13.5 in, 343 mm or 1 ft 1 1/2 in",
};

const WEIGHT: Quantity = {
  noun: "weight",
  units: {
    kg: { pattern: "kilogram(?:me)?s?|kilos?|kgs?", factor: frac(1, 1) },
    g: { pattern: "gram(?:me)?s?|g", factor: frac(1, 1000) },
    lb: { pattern: "pounds?|lbs?", factor: frac(45_359_237, 100_000_000) },
    oz: { pattern: "ounces?|oz", factor: frac(45_359_237, 1_600_000_000) },
  },
  compound: { lb: "oz" },
  max: MAX_WEIGHT_KG,
  maxText: "10,000 kg (about 22,000 lb)",
  examples: "58 lb, 26.3 kg or 1 lb 4 oz",
};

const unitRegexCache = new WeakMap<Quantity, RegExp>();

function unitRegex(q: Quantity): RegExp {
  let re = unitRegexCache.get(q);
  if (!re) {
    // Word units must not run on into letters ("13 min" is not "13 m" + "in").
    const alternatives = Object.entries(q.units).map(
      ([key, u]) => `(?<${key}>(?:${u.pattern})(?![a-z]))`,
    );
    re = new RegExp(`\\s*(?:${alternatives.join("|")})\\.?`, "y");
    unitRegexCache.set(q, re);
  }
  return re;
}

const VULGAR: Record<string, string> = {
  "¼": "1/4",
  "½": "1/2",
  "¾": "3/4",
  "⅛": "1/8",
  "⅜": "3/8",
  "⅝": "5/8",
  "⅞": "7/8",
  "⅓": "1/3",
  "⅔": "2/3",
};

/** Lower case, one kind of quote, minus and slash, fractions like ½ spelled out. */
function normalise(input: string): string {
  return input
    .replace(/[¼½¾⅛⅜⅝⅞⅓⅔]/g, (c) => ` ${VULGAR[c]}`)
    .replace(/[\u2044\u2215]/g, "/")
    .replace(/[\u201c\u201d\u2033\u02ba]/g, '"')
    .replace(/[\u2018\u2019\u2032\u02b9]/g, "'")
    .replace(/''/g, '"')
    .replace(/[\u2212\u2013\u2014]/g, "-")
    .replace(/\s+/g, " ")
    .trim()
    .toLowerCase();
}

class ReadError extends Error {}

const TOO_MANY_DIGITS = "That number has too many digits.";

class Reader {
  pos = 0;
  constructor(
    readonly text: string,
    readonly q: Quantity,
  ) {}

  private match(re: RegExp): RegExpExecArray | null {
    re.lastIndex = this.pos;
    const m = re.exec(this.text);
    if (m) this.pos = re.lastIndex;
    return m;
  }

  atEnd(): boolean {
    this.match(/\s*/y);
    return this.pos >= this.text.length;
  }

  /** A decimal number, a fraction (3/4) or a mixed number (13 1/2, 13-1/2). */
  number(): Fraction {
    const first = this.match(/\s*(\d{1,3}(?:,\d{3})+(?![\d,])(?:\.\d*)?|\d+(?:\.\d*)?|\.\d+)/y);
    if (!first) throw new ReadError(this.nonsense());
    if (this.text[this.pos] === ",") {
      throw new ReadError("Write decimals with a point (34.3), not a comma.");
    }
    const text = first[1];
    if (text.replace(/\D/g, "").length > 15) throw new ReadError(TOO_MANY_DIGITS);
    const isWhole = /^\d+$/.test(text);

    const fraction = this.match(/\s*\/\s*(\d+)/y);
    if (fraction) {
      if (!isWhole) throw new ReadError("Write a fraction with whole numbers, like 13 1/2.");
      return this.fraction(Number(text), Number(fraction[1]));
    }
    const mixed = this.match(/(?:\s+|\s*-\s*)(\d+)\s*\/\s*(\d+)/y);
    if (mixed) {
      if (!isWhole) throw new ReadError("Write a fraction with whole numbers, like 13 1/2.");
      return add(frac(Number(text), 1), this.fraction(Number(mixed[1]), Number(mixed[2])));
    }
    return decimalFraction(text);
  }

  private fraction(n: number, d: number): Fraction {
    if (d === 0) throw new ReadError("A fraction cannot have 0 below the line (as in 1/0).");
    return frac(n, d);
  }

  /** A unit key, or null when no unit follows. */
  unit(): string | null {
    const m = this.match(unitRegex(this.q));
    if (!m?.groups) return null;
    return Object.keys(this.q.units).find((key) => m.groups?.[key] !== undefined) ?? null;
  }

  nonsense(): string {
    return `Could not read "${this.text}" as a ${this.q.noun}. Try ${this.q.examples}.`;
  }
}

type Read = { ok: true; value: number } | { ok: false; message: string };

function read(input: string, defaultUnit: string, q: Quantity): Read {
  const text = normalise(input);
  if (text === "") return { ok: false, message: `Enter a ${q.noun}.` };
  if (text.startsWith("-")) return { ok: false, message: `A ${q.noun} cannot be negative.` };

  const r = new Reader(text, q);
  let total: Fraction;
  try {
    const first = r.number();
    const firstUnit = r.unit();
    total = mul(first, q.units[firstUnit ?? defaultUnit].factor);
    const smaller = firstUnit ? q.compound[firstUnit] : undefined;
    if (!r.atEnd()) {
      if (!smaller) return { ok: false, message: r.nonsense() };
      // 1 ft 1 1/2 in, 1' 6, 1 lb 4 oz: the second part is in the smaller unit.
      const second = r.number();
      const secondUnit = r.unit() ?? smaller;
      if (secondUnit !== smaller || !r.atEnd()) return { ok: false, message: r.nonsense() };
      total = add(total, mul(second, q.units[smaller].factor));
    }
  } catch (e) {
    if (e instanceof ReadError) return { ok: false, message: e.message };
    throw e;
  }

  if (!isSafe(total)) {
    return { ok: false, message: TOO_MANY_DIGITS };
  }
  const value = total.n / total.d;
  if (value === 0) return { ok: false, message: `A ${q.noun} must be more than zero.` };
  if (value > q.max) {
    return {
      ok: false,
      message: `That is more than ${q.maxText}. Check the number and the unit.`,
    };
  }
  return { ok: true, value };
}

/**
 * Reads a length as people type it: "13 1/2", "13.5 in", `13.5"`, "343 mm", "34.3 cm",
 * "0.5 m", "1 ft 1 1/2 in", `1' 1 1/2"`, "13-1/2", "3/4". A number without a unit is in
 * `defaultUnit`. Returns millimetres, or a message saying what is wrong.
 */
export function parseLength(input: string, defaultUnit: LengthUnit, limit?: { mm: number; text: string }): ParsedLength {
  // `limit` replaces the usual 10 m for a length that may be longer (a cable run, one way).
  const r = read(input, defaultUnit, limit ? { ...LENGTH, max: limit.mm, maxText: limit.text } : LENGTH);
  return r.ok ? { ok: true, mm: r.value } : r;
}

/**
 * Reads a weight: "58 lb", "58 lbs", "58", "26.3 kg", "12 oz", "1 lb 4 oz", "500 g".
 * A number without a unit is in `defaultUnit`. Returns kilograms, or a message.
 */
export function parseWeight(input: string, defaultUnit: WeightUnit): ParsedWeight {
  const r = read(input, defaultUnit, WEIGHT);
  return r.ok ? { ok: true, kg: r.value } : r;
}

/**
 * Reads several lengths separated by "x", "×", "*" or "by": "13 x 7 x 9.5 in",
 * "330 x 173 x 240 mm", "12 x 8". A unit written only after the last number applies to all
 * the numbers that have none. `count` is how many numbers are expected (3 for a box, 2 for an
 * opening).
 */
export function parseDimensions(
  input: string,
  defaultUnit: LengthUnit,
  count = 3,
): ParsedDimensions {
  const parts = normalise(input)
    // No unit is spelled with an "x" or "by", so these always separate.
    .split(/\s*(?:x|×|\*|by)\s*/)
    .filter((p) => p !== "");
  if (parts.length !== count) {
    const example = count === 3 ? "13 x 7 x 9 1/2 in" : "12 x 8 in";
    return {
      ok: false,
      message: `Enter ${count} sizes separated by "x", like ${example}.`,
    };
  }
  // The unit at the end of the last part, if any, is the default for the others.
  const trailing = new RegExp(
    `(${Object.entries(LENGTH.units)
      .map(([key, u]) => `(?<${key}>${u.pattern})`)
      .join("|")})\\.?$`,
  ).exec(parts[parts.length - 1]);
  const unit =
    (trailing?.groups && Object.keys(LENGTH.units).find((k) => trailing.groups?.[k])) ||
    defaultUnit;
  const mm: number[] = [];
  for (const part of parts) {
    const r = read(part, unit, LENGTH);
    if (!r.ok) return r;
    mm.push(r.value);
  }
  return { ok: true, mm };
}

// ---------------------------------------------------------------------------------------------
// Display.

/**
 * A length for display. Inches to the nearest 1/16 in (or `denominator`), the fraction
 * reduced: "13 1/2 in", "6 13/16 in", "1/16 in", "14 in". Millimetres to the whole
 * millimetre: "343 mm". Negative values (a shortfall) keep their sign.
 */
export function formatLength(
  mm: number,
  unit: LengthUnit,
  options: { denominator?: 2 | 4 | 8 | 16 | 32 | 64 } = {},
): string {
  if (!Number.isFinite(mm)) throw new RangeError(`Not a length: ${mm}`);
  if (unit === "mm") {
    const whole = Math.round(mm);
    return `${whole === 0 ? 0 : whole} mm`;
  }
  const den = options.denominator ?? 16;
  const steps = Math.round(Math.abs(mmToInches(mm)) * den);
  if (steps === 0) return "0 in";
  const sign = mm < 0 ? "-" : "";
  const whole = Math.floor(steps / den);
  const rest = steps % den;
  const g = gcd(rest, den);
  const fraction = rest ? `${rest / g}/${den / g}` : "";
  return `${sign}${[whole || "", fraction].filter(Boolean).join(" ")} in`;
}

/**
 * A stored length as text to edit again, which `parseLength` reads back to the same value (within
 * 1/200 mm): in inches, the fraction to 1/16 in where it is exact ("13 1/2"), else decimal inches
 * to 1/10,000 in where those are exact ("13.478"), else millimetres to 1/100 mm ("342.34 mm"); in
 * millimetres, to 1/100 mm ("342.9"). A number alone is in the reader's unit.
 */
export function editableLength(mm: number, unit: LengthUnit): string {
  if (!Number.isFinite(mm)) throw new RangeError(`Not a length: ${mm}`);
  const trim = (s: string) => s.replace(/\.?0+$/, "");
  const millimetres = trim(mm.toFixed(2));
  if (unit === "mm") return millimetres;
  const inches = mmToInches(mm);
  if (Math.abs(Math.round(inches * 16) / 16 - inches) * MM_PER_INCH < 1e-6) return formatLength(mm, "in").replace(/ in$/, "");
  const decimal = Math.round(inches * 10_000) / 10_000;
  if (Math.abs(decimal - inches) * MM_PER_INCH < 1e-6) return trim(decimal.toFixed(4));
  return `${millimetres} mm`;
}

/** "12 1/16 x 6 13/16 x 8 7/8 in", "306 x 173 x 225 mm". */
export function formatDimensions(box: Box, unit: LengthUnit): string {
  const strip = (s: string) => s.replace(/ (in|mm)$/, "");
  const parts = [box.length, box.width, box.height].map((v) => strip(formatLength(v, unit)));
  return `${parts.join(" x ")} ${unit}`;
}

function oneDecimal(value: number): string {
  const s = value.toFixed(1);
  return s.endsWith(".0") ? s.slice(0, -2) : s;
}

/** At most `places` decimals, without trailing zeros, and never below the smallest step shown. */
function trimDecimals(value: number, places: number): string {
  const step = 10 ** -places;
  return String(Number(Math.max(value, step).toFixed(places)));
}

/**
 * A weight for display. Pounds to 0.1 lb ("58 lb", "57.3 lb"), and below 1 lb in whole
 * ounces ("12 oz"). Kilograms to 0.1 kg ("26.3 kg"), and below 1 kg in whole grams ("340 g"); under an ounce or a gram, two decimals ("0.16 oz").
 */
export function formatWeight(kg: number, unit: WeightUnit): string {
  if (!Number.isFinite(kg)) throw new RangeError(`Not a weight: ${kg}`);
  const sign = kg < 0 ? "-" : "";
  const size = Math.abs(kg);
  if (unit === "kg") {
    if (size > 0 && size < 1) {
      const grams = size * 1000;
      // Under a gram, two decimals: a tiny part must not come back as "0 g", which reads as nothing.
      if (grams < 1) return `${sign}${trimDecimals(grams, 2)} g`;
      const g = Math.round(grams);
      if (g < 1000) return `${sign}${g} g`;
    }
    const text = oneDecimal(size);
    return text === "0" ? "0 kg" : `${sign}${text} kg`;
  }
  const lb = kgToPounds(size);
  if (lb > 0 && lb < 1) {
    const ounces = lb * OUNCES_PER_POUND;
    // Under an ounce, two decimals: a tiny part must not come back as "0 oz", which reads as nothing.
    if (ounces < 1) return `${sign}${trimDecimals(ounces, 2)} oz`;
    const oz = Math.round(ounces);
    if (oz < OUNCES_PER_POUND) return `${sign}${oz} oz`;
  }
  const text = oneDecimal(lb);
  return text === "0" ? "0 lb" : `${sign}${text} lb`;
}
