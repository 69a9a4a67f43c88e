// The catalogue of items and the two forms of the spaces pages (a measurement, an item): one
// zod schema per form, used in the browser (conform) and on the server.
import { z } from "zod";
import { BCI_GROUPS } from "./battery-groups";
import { CAUTIONS, type Caution } from "./cautions";
import type { Orientation } from "./fit";
import { FIRST_HULL, LAST_HULL } from "./hulls";
import { parseLength, parseWeight, type Box, type LengthUnit } from "./units";

/** "Cooler, 24 qt (soft)" -> "cooler-24-qt-soft". */
export function slugify(name: string): string {
  const slug = name
    .normalize("NFKD")
    .replace(/[\u0300-\u036f]/g, "")
    .toLowerCase()
    .replace(/[^a-z0-9]+/g, "-")
    .replace(/^-+|-+$/g, "")
    .slice(0, 60)
    .replace(/-+$/g, "");
  return slug || "item";
}

export type CatalogueEntry = {
  slug: string;
  name: string;
  kind: "battery-group";
  box: Box;
  orientation: Orientation;
  note: string;
};

/**
 * The BCI groups as catalogue items, at their maximum case sizes. A flooded battery must stay
 * upright (its vent caps are on top), so they are upright only (common practice).
 */
export function batteryGroupItems(): CatalogueEntry[] {
  return BCI_GROUPS.map((g) => ({
    slug: `bci-group-${g.group.toLowerCase()}`,
    name: `Battery, BCI group ${g.group}`,
    kind: "battery-group",
    box: { ...g.mm },
    orientation: "upright",
    note: "Maximum case size from the BCI group size chart; cases vary by maker and are at or under it. Measure yours.",
  }));
}

/** Whether an item is a battery: a BCI group, or a member's item named as one. */
export function isBattery(item: { kind: string; name: string }): boolean {
  return item.kind === "battery-group" || /\bbatter(y|ies)\b/i.test(item.name);
}

/** The cautions to show beside a placement: batteries and wiring for a battery; weight always. */
export function cautionsForItem(item: { kind: string; name: string } | null): Caution[] {
  const keys = item && isBattery(item) ? ["battery", "wiring", "stability"] : ["stability"];
  return keys.map((k) => CAUTIONS[k]);
}

// ---------------------------------------------------------------------------------------------
// Forms.

export const METHODS = ["tape", "story_stick", "template", "laser"] as const;
export type MeasureMethod = (typeof METHODS)[number];

export const METHOD_LABELS: Record<MeasureMethod, string> = {
  tape: "Tape",
  story_stick: "Story stick",
  template: "Template",
  laser: "Laser",
};

function lengthField(label: string, unit: LengthUnit) {
  return z
    .string({ error: `Enter the ${label}.` })
    .trim()
    .transform((value, ctx) => {
      const r = parseLength(value, unit);
      if (!r.ok) {
        ctx.addIssue({ code: "custom", message: r.message });
        return z.NEVER;
      }
      return r.mm;
    });
}

/** Dates are checked as text: YYYY-MM-DD, from the class's first year to tomorrow (time zones). */
function measuredOn(today: string) {
  return z
    .string({ error: "Enter the date you measured." })
    .trim()
    .regex(/^\d{4}-\d{2}-\d{2}$/, { message: "Enter a date such as 2025-06-14." })
    .refine((v) => !Number.isNaN(Date.parse(`${v}T00:00:00Z`)), { message: "That is not a date." })
    .refine((v) => v >= "1971-01-01", { message: "The class was first built in 1971." })
    .refine((v) => Date.parse(`${v}T00:00:00Z`) <= Date.parse(`${today}T00:00:00Z`) + 86_400_000, {
      message: "That date is in the future.",
    });
}

/**
 * A measurement of one section of a space (its position; 0, the main section, when the space
 * has only one). Sizes are typed as people write them ("13 1/2", "343 mm"); a number alone is in
 * the reader's unit. The same fields add a measurement and change one.
 */
export function measurementSchema(
  unit: LengthUnit,
  today: string = new Date().toISOString().slice(0, 10),
  sectionCount = 1,
) {
  return z.object({
    section: z.coerce
      .number({ error: "Choose the part of the space you measured." })
      .int({ message: "Choose the part of the space you measured." })
      .min(0, { message: "Choose the part of the space you measured." })
      .max(Math.max(0, sectionCount - 1), { message: "Choose one of this space's parts." }),
    length: lengthField("length (fore and aft)", unit),
    width: lengthField("width (athwartships)", unit),
    height: lengthField("height", unit),
    method: z.enum(METHODS, { error: "Choose how you measured." }),
    hullNumber: z.coerce
      .number({ error: "Enter the hull number of the boat you measured." })
      .int({ message: "A hull number is a whole number." })
      .min(FIRST_HULL, { message: `Hull numbers run from ${FIRST_HULL} to ${LAST_HULL}.` })
      .max(LAST_HULL, { message: `Hull numbers run from ${FIRST_HULL} to ${LAST_HULL}.` }),
    measuredOn: measuredOn(today),
  });
}

const measurementId = z.coerce
  .number({ error: "Choose a measurement." })
  .int({ message: "Choose a measurement." })
  .positive({ message: "Choose a measurement." });

/** Why a measurement was changed or removed: optional for its author, asked of a moderator. */
const changeReason = z
  .string()
  .trim()
  .max(300, { message: "Use at most 300 characters." })
  .optional()
  .default("");

/** Changing a measurement: its fields again, which one, and optionally why; a photo may be removed. */
export function measurementEditSchema(unit: LengthUnit, today?: string, sectionCount = 1) {
  return measurementSchema(unit, today, sectionCount).extend({
    measurementId,
    reason: changeReason,
    removePhoto: z.boolean().optional().default(false),
  });
}

/** Removing a measurement. */
export const measurementDeleteSchema = z.object({ measurementId, reason: changeReason });

/** A member's item for the catalogue. The weight is optional; a number alone is in lb (or kg with mm). */
export function itemSchema(unit: LengthUnit) {
  return z.object({
    name: z
      .string({ error: "Name the item." })
      .trim()
      .min(3, { message: "Use at least 3 characters." })
      .max(80, { message: "Use at most 80 characters." }),
    length: lengthField("length", unit),
    width: lengthField("width", unit),
    height: lengthField("height", unit),
    weight: z
      .string()
      .trim()
      .optional()
      .transform((value, ctx) => {
        if (!value) return null;
        const r = parseWeight(value, unit === "mm" ? "kg" : "lb");
        if (!r.ok) {
          ctx.addIssue({ code: "custom", message: r.message });
          return z.NEVER;
        }
        return r.kg;
      }),
    orientation: z.enum(["any", "upright"], { error: "Say whether it must stay upright." }),
    note: z.string().trim().max(500, { message: "Use at most 500 characters." }).optional().default(""),
  });
}
