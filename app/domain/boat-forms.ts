/**
 * The zod schemas of the boat and tool forms: one per form, used in the browser (conform) and on
 * the server. What members type is read by units.ts (lengths, weights) and turned into canonical
 * millimetres and kilograms here; a message says what is wrong beside the field.
 *
 * The schemas depend on the reader's units (a number without a unit is in their unit) and, for
 * positions aboard, on the class's size; each is made by a function of those.
 */
import { z } from "zod";
import { AWG_SIZES, INSULATION_RATINGS_C, type AllowedDropPct, type InsulationRatingC } from "./conductors";
import type { CableRunInput, SystemVoltage } from "./cable";
import type { ClassFigures } from "./ledger";
import {
  formatLength,
  MM_PER_FOOT,
  parseLength,
  parseWeight,
  type LengthUnit,
  type WeightUnit,
} from "./units";

export type Units = { length: LengthUnit; weight: WeightUnit };

export function unitsFor(length: LengthUnit): Units {
  return { length, weight: length === "mm" ? "kg" : "lb" };
}

type Ctx = z.RefinementCtx;

function fail(ctx: Ctx, message: string, path?: (string | number)[]): never {
  ctx.addIssue({ code: "custom", message, path });
  return z.NEVER as never;
}

/** Reads a length; `zero` allows 0 (an offset on the centreline, a shift of nothing). */
export function readLength(text: string, unit: LengthUnit, opts: { zero?: boolean } = {}) {
  if (opts.zero && /^\s*0*(?:\.0*)?\s*(?:mm|in|ft|m|cm|"|')?\s*$/i.test(text) && /0/.test(text)) {
    return { ok: true as const, mm: 0 };
  }
  return parseLength(text, unit);
}

const length = (unit: LengthUnit, missing: string, opts: { max?: { mm: number; message: string } } = {}) =>
  z.string({ error: missing }).transform((v, ctx) => {
    const r = parseLength(v, unit);
    if (!r.ok) return fail(ctx, r.message);
    if (opts.max && r.mm > opts.max.mm + 1e-9) return fail(ctx, opts.max.message);
    return r.mm;
  });

const optionalLength = (unit: LengthUnit) =>
  z
    .string()
    .optional()
    .transform((v, ctx) => {
      if (v === undefined || v.trim() === "") return null;
      const r = parseLength(v, unit);
      if (!r.ok) return fail(ctx, r.message);
      return r.mm;
    });

const weight = (unit: WeightUnit, missing: string) =>
  z.string({ error: missing }).transform((v, ctx) => {
    const r = parseWeight(v, unit);
    if (!r.ok) return fail(ctx, r.message);
    return r.kg;
  });

/**
 * A metacentric height (GM, GM_L): as designers give them, a number without a unit is in feet
 * (or metres for a reader who works in millimetres); "2.8 ft", "0.85 m", "2 ft 9 5/8 in" also read.
 * Up to 100 m: a longitudinal GM is several times the boat's length.
 */
export function parseMetacentricHeight(text: string, unit: LengthUnit): { ok: true; mm: number } | { ok: false; message: string } {
  const t = text.trim().replace(/,/g, "");
  if (t === "") return { ok: false, message: "Enter a height." };
  const m = /^(\d*\.?\d+)\s*(ft|feet|foot|'|m|metres?|meters?)?\.?$/i.exec(t);
  let mm: number;
  if (m) {
    const value = Number(m[1]);
    const u = m[2]?.toLowerCase();
    const inFeet = u ? !u.startsWith("m") : unit === "in";
    mm = inFeet ? value * MM_PER_FOOT : value * 1000;
  } else {
    const r = parseLength(t, unit);
    if (!r.ok) return { ok: false, message: `${r.message.replace(/ Try .*$/, "")} Try 2.8 ft or 0.85 m.` };
    mm = r.mm;
  }
  if (!(mm > 0)) return { ok: false, message: "A metacentric height must be more than zero." };
  if (mm > 100_000) return { ok: false, message: "That is more than 100 m. Check the number and the unit." };
  return { ok: true, mm };
}

const metacentric = (unit: LengthUnit, missing: string) =>
  z.string({ error: missing }).transform((v, ctx) => {
    const r = parseMetacentricHeight(v, unit);
    if (!r.ok) return fail(ctx, r.message);
    return r.mm;
  });

/** An angle in degrees: "1.3", "1.3°", "1.3 deg". */
export function parseDegrees(text: string): { ok: true; degrees: number } | { ok: false; message: string } {
  const m = /^\s*(\d*\.?\d+)\s*(°|deg|degrees?)?\s*$/i.exec(text);
  if (!m) return { ok: false, message: `Could not read "${text.trim()}" as an angle. Try 1.5 (degrees).` };
  const degrees = Number(m[1]);
  if (degrees === 0) return { ok: false, message: "The angle must be more than zero." };
  if (degrees >= 45) return { ok: false, message: "Enter an angle under 45 degrees; these relations hold only for small angles." };
  return { ok: true, degrees };
}

const sideField = z.enum(["port", "centre", "starboard"], { error: "Choose port, the centreline or starboard." });

// ---------------------------------------------------------------------------------------------
// The weight ledger.

export interface BoatLimits {
  /** Furthest aft an item may be: the length overall plus room for an outboard on its bracket. */
  maxAftMm: number;
  halfBeamMm: number;
}

/** An outboard on its bracket hangs past the transom; nothing else aboard is further aft. */
export const BRACKET_OVERHANG_MM = 36 * 25.4;

export function boatLimits(c: { loaMm: number; beamMm: number }): BoatLimits {
  return { maxAftMm: c.loaMm + BRACKET_OVERHANG_MM, halfBeamMm: c.beamMm / 2 };
}

export type LedgerItemInput = {
  itemId: number | null;
  name: string;
  weightKg: number;
  spaceId: number | null;
  /** Null when the position is to be taken from the space. */
  aftOfBowMm: number | null;
  offCentreMm: number | null;
  heightMm: number | null;
};

/**
 * A position aboard from three fields (aft of the bow, side, off the centreline) and an optional
 * height. Blank position fields are allowed only when `spaceId` is set (the space gives them).
 */
function positionFields(unit: LengthUnit, limits: BoatLimits, prefix = "") {
  const key = (k: string) => (prefix ? `${prefix}${k[0].toUpperCase()}${k.slice(1)}` : k);
  return {
    keys: { aft: key("aftOfBow"), side: key("side"), off: key("offCentre"), height: key("height") },
    /** Blank fields are allowed where `optional` says so (a space, or the item's own place, fills them). */
    check(
      v: Record<string, unknown>,
      ctx: Ctx,
      optional: { aft: boolean; offset: boolean },
    ): { aftOfBowMm: number | null; offCentreMm: number | null; heightMm: number | null } {
      const k = this.keys;
      const aftText = String(v[k.aft] ?? "").trim();
      const offText = String(v[k.off] ?? "").trim();
      const heightText = String(v[k.height] ?? "").trim();
      const side = v[k.side] as "port" | "centre" | "starboard" | undefined;
      let aftOfBowMm: number | null = null;
      let offCentreMm: number | null = null;
      let heightMm: number | null = null;
      if (aftText) {
        const r = parseLength(aftText, unit);
        if (!r.ok) ctx.addIssue({ code: "custom", path: [k.aft], message: r.message });
        else if (r.mm > limits.maxAftMm + 1e-9) {
          ctx.addIssue({
            code: "custom",
            path: [k.aft],
            message: `That is more than ${formatLength(limits.maxAftMm, unit)} aft of the bow, past an outboard on its bracket. Check the number and the unit.`,
          });
        } else aftOfBowMm = r.mm;
      } else if (!optional.aft) {
        ctx.addIssue({ code: "custom", path: [k.aft], message: "How far aft of the bow is it? Or pick a space." });
      }
      if (side === "centre") {
        offCentreMm = 0;
      } else if (side && offText) {
        const r = readLength(offText, unit, { zero: true });
        if (!r.ok) ctx.addIssue({ code: "custom", path: [k.off], message: r.message });
        else if (r.mm > limits.halfBeamMm + 1e-9) {
          ctx.addIssue({
            code: "custom",
            path: [k.off],
            message: `That is more than half the beam (${formatLength(limits.halfBeamMm, unit)}) off the centreline.`,
          });
        } else offCentreMm = side === "port" ? -r.mm : r.mm;
      } else if (side && !optional.offset) {
        ctx.addIssue({ code: "custom", path: [k.off], message: `How far to ${side} of the centreline? Or choose "on the centreline".` });
      } else if (!side && !optional.offset) {
        ctx.addIssue({ code: "custom", path: [k.side], message: "Choose port, the centreline or starboard." });
      }
      if (heightText) {
        const r = parseLength(heightText, unit);
        if (!r.ok) ctx.addIssue({ code: "custom", path: [k.height], message: r.message });
        else heightMm = r.mm;
      }
      return { aftOfBowMm, offCentreMm, heightMm };
    },
  };
}

export function ledgerItemSchema(units: Units, limits: BoatLimits) {
  const position = positionFields(units.length, limits);
  return z
    .object({
      intent: z.enum(["add-item", "edit-item"]),
      itemId: z.coerce.number().int().positive().optional(),
      name: z
        .string({ error: "Name the item, e.g. House battery." })
        .trim()
        .min(1, { message: "Name the item, e.g. House battery." })
        .max(80, { message: "Use at most 80 characters." }),
      weight: weight(units.weight, "Enter its weight."),
      spaceId: z.coerce.number().int().positive().optional(),
      aftOfBow: z.string().optional(),
      side: sideField.optional(),
      offCentre: z.string().optional(),
      height: z.string().optional(),
    })
    .transform((v, ctx): LedgerItemInput => {
      const fromSpace = v.spaceId !== undefined;
      const pos = position.check(v, ctx, { aft: fromSpace, offset: fromSpace });
      if (v.intent === "edit-item" && v.itemId === undefined) ctx.addIssue({ code: "custom", path: ["name"], message: "Which item?" });
      return { itemId: v.itemId ?? null, name: v.name, weightKg: v.weight, spaceId: v.spaceId ?? null, ...pos };
    });
}

// ---------------------------------------------------------------------------------------------
// What if: move one item (a GET form on the boat page; also the inverse "add weight at").

export type WhatIfInput = {
  itemId: number;
  spaceId: number | null;
  aftOfBowMm: number | null;
  offCentreMm: number | null;
  heightMm: number | null;
};

export function whatIfSchema(units: Units, limits: BoatLimits) {
  const position = positionFields(units.length, limits, "to");
  return z
    .object({
      move: z.coerce.number({ error: "Choose the item to move." }).int().positive({ message: "Choose the item to move." }),
      toSpace: z.coerce.number().int().positive().optional(),
      toAftOfBow: z.string().optional(),
      toSide: sideField.optional(),
      toOffCentre: z.string().optional(),
      toHeight: z.string().optional(),
    })
    .transform((v, ctx): WhatIfInput => {
      // Blank fields keep the item where it is (or take the space's figures); a side needs its distance.
      const fromSpace = v.toSpace !== undefined;
      const pos = position.check(v, ctx, { aft: true, offset: fromSpace || v.toSide === undefined });
      return { itemId: v.move, spaceId: v.toSpace ?? null, ...pos };
    });
}

export function addWeightSchema(units: Units, limits: BoatLimits) {
  return z
    .object({
      addSide: z.enum(["port", "starboard"], { error: "Choose port or starboard." }),
      addOffCentre: length(units.length, "How far off the centreline would it go?", {
        max: { mm: limits.halfBeamMm, message: `That is more than half the beam (${formatLength(limits.halfBeamMm, units.length)}) off the centreline.` },
      }),
    })
    .transform((v) => ({ offCentreMm: v.addSide === "port" ? -v.addOffCentre : v.addOffCentre }));
}

// ---------------------------------------------------------------------------------------------
// GM from a measured list (the inclining relation, ASTM F1321).

export type CalibrationInput = {
  weightKg: number;
  shiftMm: number;
  displacementKg: number;
  heel: { degrees: number } | { deflectionMm: number; plumbLengthMm: number };
};

export function calibrationSchema(units: Units) {
  return z
    .object({
      intent: z.literal("calibrate"),
      weight: weight(units.weight, "Enter the weight you moved."),
      shift: length(units.length, "How far across did it move?"),
      displacement: weight(units.weight, "Enter the displacement during the test."),
      method: z.enum(["angle", "plumb"], { error: "Choose how you measured the list." }),
      heel: z.string().optional(),
      deflection: z.string().optional(),
      plumbLength: z.string().optional(),
    })
    .transform((v, ctx): CalibrationInput => {
      let heel: CalibrationInput["heel"] = { degrees: 1 };
      if (v.method === "angle") {
        const r = parseDegrees(v.heel ?? "");
        if (!v.heel?.trim()) ctx.addIssue({ code: "custom", path: ["heel"], message: "Enter the list you measured, in degrees." });
        else if (!r.ok) ctx.addIssue({ code: "custom", path: ["heel"], message: r.message });
        else heel = { degrees: r.degrees };
      } else {
        const d = parseLength(v.deflection ?? "", units.length);
        const l = parseLength(v.plumbLength ?? "", units.length);
        if (!v.deflection?.trim()) ctx.addIssue({ code: "custom", path: ["deflection"], message: "How far did the plumb line move along the batten?" });
        else if (!d.ok) ctx.addIssue({ code: "custom", path: ["deflection"], message: d.message });
        if (!v.plumbLength?.trim()) ctx.addIssue({ code: "custom", path: ["plumbLength"], message: "How long is the plumb line, from its pivot to the batten?" });
        else if (!l.ok) ctx.addIssue({ code: "custom", path: ["plumbLength"], message: l.message });
        if (d.ok && l.ok) {
          if (d.mm >= l.mm) ctx.addIssue({ code: "custom", path: ["deflection"], message: "The deflection must be less than the plumb line's length." });
          else heel = { deflectionMm: d.mm, plumbLengthMm: l.mm };
        }
      }
      return { weightKg: v.weight, shiftMm: v.shift, displacementKg: v.displacement, heel };
    });
}

// ---------------------------------------------------------------------------------------------
// Class particulars (administrators).

/** What the form yields is what is stored: the class figures of the ledger. */
export type ClassParticularsInput = ClassFigures;

export function classParticularsSchema(units: Units) {
  return z
    .object({
      lightDisplacement: weight(units.weight, "Enter the light displacement."),
      gm: metacentric(units.length, "Enter the class GM, e.g. 2.8 ft."),
      loa: length(units.length, "Enter the length overall."),
      lwl: length(units.length, "Enter the waterline length."),
      beam: length(units.length, "Enter the beam."),
      lcf: length(units.length, "Where is the centre of flotation, aft of the bow?"),
      waterlineForwardEnd: z.string().optional(),
      gmLongitudinal: z.string().optional(),
      mct1: z.string().optional(),
      demo: z.preprocess((v) => v === "on" || v === "true", z.boolean()),
    })
    .transform((v, ctx): ClassParticularsInput => {
      let waterlineForwardEndMm = 0;
      if (v.waterlineForwardEnd?.trim()) {
        const r = readLength(v.waterlineForwardEnd, units.length, { zero: true });
        if (!r.ok) ctx.addIssue({ code: "custom", path: ["waterlineForwardEnd"], message: r.message });
        else waterlineForwardEndMm = r.mm;
      }
      let gmLongitudinalMm: number | null = null;
      if (v.gmLongitudinal?.trim()) {
        const r = parseMetacentricHeight(v.gmLongitudinal, units.length);
        if (!r.ok) ctx.addIssue({ code: "custom", path: ["gmLongitudinal"], message: r.message });
        else gmLongitudinalMm = r.mm;
      }
      let mct1FtLbPerIn: number | null = null;
      if (v.mct1?.trim()) {
        const m = /^\s*([\d,]*\.?\d+)\s*(?:ft[·.\s-]?lbs?\s*(?:\/|per)\s*in(?:ch)?)?\s*$/i.exec(v.mct1);
        const n = m ? Number(m[1].replace(/,/g, "")) : Number.NaN;
        if (!(n > 0)) ctx.addIssue({ code: "custom", path: ["mct1"], message: "Enter the moment to change trim one inch in ft·lb per inch, e.g. 450." });
        else mct1FtLbPerIn = n;
      }
      if (gmLongitudinalMm === null && mct1FtLbPerIn === null && !v.gmLongitudinal?.trim() && !v.mct1?.trim()) {
        ctx.addIssue({ code: "custom", path: ["gmLongitudinal"], message: "Give GM_L or MCT1, or trim cannot be worked out." });
      }
      if (v.lwl > v.loa) ctx.addIssue({ code: "custom", path: ["lwl"], message: "The waterline cannot be longer than the boat." });
      if (v.lcf > v.loa) ctx.addIssue({ code: "custom", path: ["lcf"], message: "The centre of flotation must lie within the length overall." });
      if (waterlineForwardEndMm + v.lwl > v.loa + 1e-9) {
        ctx.addIssue({ code: "custom", path: ["waterlineForwardEnd"], message: "The waterline would end past the stern: check this and the waterline length." });
      }
      return {
        lightDisplacementKg: v.lightDisplacement,
        gmMm: v.gm,
        lwlMm: v.lwl,
        beamMm: v.beam,
        loaMm: v.loa,
        lcfAftOfBowMm: v.lcf,
        waterlineForwardEndMm,
        gmLongitudinalMm,
        mct1FtLbPerIn,
        demo: v.demo,
      };
    });
}

// ---------------------------------------------------------------------------------------------
// The stand-alone tools (GET forms).

export type HeelToolInput =
  | { find: "heel"; displacementKg: number; weightKg: number; distanceMm: number; gmMm: number }
  | { find: "gm"; displacementKg: number; weightKg: number; distanceMm: number; heel: { degrees: number } | { deflectionMm: number; plumbLengthMm: number } };

export function heelToolSchema(units: Units) {
  return z
    .object({
      find: z.enum(["heel", "gm"]).default("heel"),
      displacement: weight(units.weight, "Enter the boat's displacement, with everything aboard."),
      weight: weight(units.weight, "Enter the weight that moves."),
      distance: length(units.length, "How far across does it move?"),
      gm: z.string().optional(),
      method: z.enum(["angle", "plumb"]).default("angle"),
      heel: z.string().optional(),
      deflection: z.string().optional(),
      plumbLength: z.string().optional(),
    })
    .transform((v, ctx): HeelToolInput => {
      if (v.find === "heel") {
        const r = parseMetacentricHeight(v.gm ?? "", units.length);
        if (!v.gm?.trim()) ctx.addIssue({ code: "custom", path: ["gm"], message: "Enter the GM, e.g. 2.8 ft." });
        else if (!r.ok) ctx.addIssue({ code: "custom", path: ["gm"], message: r.message });
        return { find: "heel", displacementKg: v.displacement, weightKg: v.weight, distanceMm: v.distance, gmMm: r.ok ? r.mm : 1 };
      }
      const c = calibrationSchema(units).safeParse({
        intent: "calibrate",
        weight: "1",
        shift: "1",
        displacement: "1",
        method: v.method,
        heel: v.heel,
        deflection: v.deflection,
        plumbLength: v.plumbLength,
      });
      if (!c.success) {
        for (const issue of c.error.issues) ctx.addIssue({ code: "custom", path: issue.path as string[], message: issue.message });
        return z.NEVER;
      }
      return { find: "gm", displacementKg: v.displacement, weightKg: v.weight, distanceMm: v.distance, heel: c.data.heel };
    });
}

/** A cable run is measured in feet (or metres): a bare number is read in those, not in inches or mm. */
export function withRunUnit(text: string, unit: LengthUnit): string {
  return /^\s*[\d.,]+(?:\s+\d+\/\d+)?\s*$/.test(text) ? `${text.trim()} ${unit === "mm" ? "m" : "ft"}` : text;
}

/**
 * The longest run, one way, the cable tool takes: 100 ft (30.48 m). On a boat of 20 to 25 ft the
 * longest runs go from the panel up the mast: a masthead light or a wind instrument on a 22 ft
 * boat is some 40 ft one way (the mast, the deck and the bilge to the panel), and a run to the
 * bow and back aft again about as much. Past 100 ft the number is a slip of the unit (inches or
 * millimetres typed as feet or metres), and the tool says so.
 */
export const MAX_CABLE_RUN_MM = 100 * MM_PER_FOOT;
export const MAX_CABLE_RUN_TEXT = "100 ft (about 30 m)";

export const SYSTEM_VOLTAGES: readonly SystemVoltage[] = [12, 24];
export const ALLOWED_DROPS: readonly AllowedDropPct[] = [3, 10];

export function cableToolSchema(unit: LengthUnit) {
  return z
    .object({
      current: z
        .string({ error: "Enter the current the load draws, in amps." })
        .transform((v, ctx) => {
          const m = /^\s*(\d*\.?\d+)\s*(a|amps?)?\s*$/i.exec(v);
          const n = m ? Number(m[1]) : Number.NaN;
          if (!(n > 0)) return fail(ctx, "Enter the current in amps, e.g. 30.");
          if (n > 1000) return fail(ctx, "That is more than 1,000 A: check the number.");
          return n;
        }),
      length: z
        .string({ error: "How long is the run, one way from the source to the load?" })
        .transform((v, ctx) => {
          const r = parseLength(withRunUnit(v, unit), unit, { mm: MAX_CABLE_RUN_MM, text: MAX_CABLE_RUN_TEXT });
          if (!r.ok) return fail(ctx, r.message.replace(/Try .*$/, `Try ${unit === "mm" ? "3.4 m" : "11 ft"}.`).replace(/\. Check the number/, " one way: check the number"));
          return r.mm;
        }),
      voltage: z.coerce.number().refine((n) => n === 12 || n === 24, { message: "Choose 12 V or 24 V." }),
      drop: z.coerce.number().refine((n) => n === 3 || n === 10, { message: "Choose 3 % or 10 %." }),
      insulation: z.coerce.number().refine((n) => (INSULATION_RATINGS_C as number[]).includes(n), { message: "Choose the insulation's temperature rating." }),
      engineSpace: z.preprocess((v) => v === "on" || v === "true", z.boolean()),
    })
    .transform(
      (v): CableRunInput => ({
        currentA: v.current,
        oneWayLengthFt: v.length / MM_PER_FOOT,
        systemVoltage: v.voltage as SystemVoltage,
        allowedDropPct: v.drop as AllowedDropPct,
        insulationRatingC: v.insulation as InsulationRatingC,
        inEngineSpace: v.engineSpace,
      }),
    );
}

export { AWG_SIZES };

/**
 * The object a form schema reads, before its transform (conform's getZodConstraint cannot read a
 * transform at the root; the HTML constraints come from the fields).
 */
export function fieldsOf(schema: z.ZodType): z.ZodType {
  const def = (schema as unknown as { _zod: { def: { type: string; in?: z.ZodType } } })._zod.def;
  return def.type === "pipe" && def.in ? fieldsOf(def.in) : schema;
}

/** Zod issues as one message per field (the first), for forms that are not run through conform. */
export function firstErrors(error: z.ZodError): Record<string, string> {
  const out: Record<string, string> = {};
  for (const issue of error.issues) {
    const key = String(issue.path[0] ?? "form");
    if (!(key in out)) out[key] = issue.message;
  }
  return out;
}

/** A URLSearchParams as the plain object zod reads (empty fields left out, as conform does). */
export function queryObject(q: URLSearchParams, keys: readonly string[]): Record<string, string> {
  const out: Record<string, string> = {};
  for (const k of keys) {
    const v = q.get(k);
    if (v !== null && v.trim() !== "") out[k] = v;
  }
  return out;
}
