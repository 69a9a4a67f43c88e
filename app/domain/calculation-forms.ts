/**
 * The forms that attach numbers to a write-up ("Numbers for readers" in the editor): a cable run
 * and a weight move. One zod schema per form; each turns what the author typed into the stored
 * input of app/domain/calculations.ts (canonical mm and kg), with a message beside the field when
 * something does not read.
 */
import { z } from "zod";
import { boatLimits, cableToolSchema, readLength, type Units } from "./boat-forms";
import { cableRunInputSchema, type Calculation, weightMoveInputSchema } from "./calculations";
import type { ClassFigures } from "./ledger";
import { formatLength, MM_PER_FOOT, parseLength, parseWeight } from "./units";

export const CALCULATION_TITLE_MAX = 120;
export const MOVED_ITEM_ID = "moved";

/** What a form gives: the calculation to store and the title readers see above it. */
export type CalculationFormValue = { calc: Calculation; title: string };

const label = z
  .string()
  .trim()
  .max(CALCULATION_TITLE_MAX, { message: `Use at most ${CALCULATION_TITLE_MAX} characters.` })
  .optional();

/** The cable-run form: the fields of /tools/cable (same schema) and what the run feeds. */
export function cableRunFormSchema(units: Units) {
  const run = cableToolSchema(units.length);
  return z
    .object({ label, current: z.string().optional(), length: z.string().optional() })
    .loose()
    .transform((v, ctx): CalculationFormValue => {
      const r = run.safeParse(v);
      if (!r.success) {
        for (const issue of r.error.issues) ctx.addIssue({ code: "custom", path: issue.path as string[], message: issue.message });
        return z.NEVER;
      }
      if (!v.label) ctx.addIssue({ code: "custom", path: ["label"], message: "Say what the run feeds, e.g. House battery to the switch panel." });
      const input = cableRunInputSchema.parse({
        currentA: r.data.currentA,
        oneWayLengthMm: r.data.oneWayLengthFt * MM_PER_FOOT,
        systemVoltage: r.data.systemVoltage,
        allowedDropPct: r.data.allowedDropPct,
        insulationRatingC: r.data.insulationRatingC,
        inEngineSpace: r.data.inEngineSpace,
        label: v.label ?? "",
      });
      return { calc: { kind: "cable-run", input }, title: v.label ?? "" };
    });
}

type Side = "port" | "centre" | "starboard";
const SIDES: Side[] = ["port", "centre", "starboard"];

/**
 * The weight-move form: one weight, where it was and where it went (aft of the bow; side and
 * distance off the centreline), worked out with the class particulars and the class GM.
 */
export function weightMoveFormSchema(units: Units, particulars: ClassFigures) {
  const limits = boatLimits(particulars);
  const position = (v: Record<string, string | undefined>, ctx: z.RefinementCtx, prefix: "from" | "to") => {
    const aftKey = `${prefix}Aft`;
    const sideKey = `${prefix}Side`;
    const offKey = `${prefix}Off`;
    const where = prefix === "from" ? "was it" : "does it go";
    let aftOfBowMm = 0;
    let offCentreMm = 0;
    const aftText = (v[aftKey] ?? "").trim();
    if (!aftText) ctx.addIssue({ code: "custom", path: [aftKey], message: `How far aft of the bow ${where}?` });
    else {
      const r = parseLength(aftText, units.length);
      if (!r.ok) ctx.addIssue({ code: "custom", path: [aftKey], message: r.message });
      else if (r.mm > limits.maxAftMm + 1e-9) {
        ctx.addIssue({ code: "custom", path: [aftKey], message: `That is more than ${formatLength(limits.maxAftMm, units.length)} aft of the bow. Check the number and the unit.` });
      } else aftOfBowMm = r.mm;
    }
    const side = v[sideKey] as Side | undefined;
    const offText = (v[offKey] ?? "").trim();
    if (!side || !SIDES.includes(side)) ctx.addIssue({ code: "custom", path: [sideKey], message: "Choose port, the centreline or starboard." });
    else if (side !== "centre") {
      if (!offText) ctx.addIssue({ code: "custom", path: [offKey], message: `How far to ${side} of the centreline?` });
      else {
        const r = readLength(offText, units.length, { zero: true });
        if (!r.ok) ctx.addIssue({ code: "custom", path: [offKey], message: r.message });
        else if (r.mm > limits.halfBeamMm + 1e-9) {
          ctx.addIssue({ code: "custom", path: [offKey], message: `That is more than half the beam (${formatLength(limits.halfBeamMm, units.length)}) off the centreline.` });
        } else offCentreMm = side === "port" ? -r.mm : r.mm;
      }
    }
    return { aftOfBowMm, offCentreMm, heightMm: null };
  };
  return z
    .object({
      label,
      name: z.string({ error: "Name the weight, e.g. House battery." }).trim().min(1, { message: "Name the weight, e.g. House battery." }).max(80, { message: "Use at most 80 characters." }),
      weight: z.string({ error: "Enter its weight." }),
      fromAft: z.string().optional(),
      fromSide: z.string().optional(),
      fromOff: z.string().optional(),
      toAft: z.string().optional(),
      toSide: z.string().optional(),
      toOff: z.string().optional(),
    })
    .transform((v, ctx): CalculationFormValue => {
      const w = parseWeight(v.weight, units.weight);
      if (!v.weight.trim()) ctx.addIssue({ code: "custom", path: ["weight"], message: "Enter its weight." });
      else if (!w.ok) ctx.addIssue({ code: "custom", path: ["weight"], message: w.message });
      else if (!(w.kg > 0)) ctx.addIssue({ code: "custom", path: ["weight"], message: "The weight must be more than zero." });
      const from = position(v, ctx, "from");
      const to = position(v, ctx, "to");
      const weightKg = w.ok && w.kg > 0 ? w.kg : 1;
      if (from.aftOfBowMm === to.aftOfBowMm && from.offCentreMm === to.offCentreMm && v.toAft?.trim() && v.toSide) {
        ctx.addIssue({ code: "custom", path: ["toAft"], message: "The new place is the same as the old one." });
      }
      const parsed = weightMoveInputSchema.safeParse({
        boat: null,
        particulars,
        gmMm: particulars.gmMm,
        gmSource: "class",
        items: [{ id: MOVED_ITEM_ID, name: v.name, weightKg, ...from }],
        moved: MOVED_ITEM_ID,
        to,
        note: "",
      });
      if (!parsed.success) {
        ctx.addIssue({ code: "custom", path: ["name"], message: "These figures do not make a weight move." });
        return z.NEVER;
      }
      return { calc: { kind: "weight-move", input: parsed.data }, title: v.label ?? "" };
    });
}
