/**
 * Calculations attached to a write-up: a weight move (heel and trim before and after) and a cable
 * run. What is stored is the input, in canonical units (kg, mm), with the class figures and the
 * ledger it was worked out against; the numbers are computed again each time they are shown, by
 * the same code as the boat page and the tools, so a reader sees what the author saw.
 */
import { z } from "zod";
import { INSULATION_RATINGS_C } from "./conductors";

const positive = z.number().positive().finite();
const finite = z.number().finite();

const classFiguresSchema = z.object({
  lightDisplacementKg: positive,
  gmMm: positive,
  lwlMm: positive,
  beamMm: positive,
  loaMm: positive,
  lcfAftOfBowMm: z.number().nonnegative(),
  waterlineForwardEndMm: z.number().nonnegative().default(0),
  gmLongitudinalMm: positive.nullable().default(null),
  mct1FtLbPerIn: positive.nullable().default(null),
  demo: z.boolean().default(false),
});

const entrySchema = z.object({
  id: z.string().min(1),
  name: z.string().min(1).max(80),
  weightKg: positive,
  aftOfBowMm: z.number().nonnegative(),
  offCentreMm: finite,
  heightMm: finite.nullable().default(null),
});

const positionSchema = z.object({
  aftOfBowMm: z.number().nonnegative(),
  offCentreMm: finite,
  heightMm: finite.nullable().default(null),
});

export const weightMoveInputSchema = z
  .object({
    /** The boat it was worked out on, when there was one. */
    boat: z.object({ hullNumber: z.number().int(), name: z.string().nullable() }).nullable().default(null),
    particulars: classFiguresSchema,
    /** The GM used, mm; "calibrated" when it came from the boat's own inclining. */
    gmMm: positive,
    gmSource: z.enum(["class", "calibrated"]).default("class"),
    items: z.array(entrySchema).min(1).max(200),
    moved: z.string().min(1),
    to: positionSchema,
    note: z.string().max(500).default(""),
  })
  .refine((v) => v.items.some((i) => i.id === v.moved), { message: "The moved item must be one of the items.", path: ["moved"] });

export type WeightMoveInput = z.infer<typeof weightMoveInputSchema>;

export const cableRunInputSchema = z.object({
  currentA: positive,
  oneWayLengthMm: positive,
  systemVoltage: z.union([z.literal(12), z.literal(24)]),
  allowedDropPct: z.union([z.literal(3), z.literal(10)]),
  insulationRatingC: z.number().refine((n) => (INSULATION_RATINGS_C as number[]).includes(n)),
  inEngineSpace: z.boolean().default(false),
  /** What the run feeds, in the author's words: "House battery to the switch". */
  label: z.string().max(120).default(""),
});

export type CableRunStored = z.infer<typeof cableRunInputSchema>;

export type CalculationKind = "weight-move" | "cable-run";

export type Calculation =
  | { kind: "weight-move"; input: WeightMoveInput }
  | { kind: "cable-run"; input: CableRunStored };

/** Reads a stored calculation; null when its input no longer reads (it is then not shown). */
export function readCalculation(kind: string, input: unknown): Calculation | null {
  if (kind === "weight-move") {
    const r = weightMoveInputSchema.safeParse(input);
    return r.success ? { kind, input: r.data } : null;
  }
  if (kind === "cable-run") {
    const r = cableRunInputSchema.safeParse(input);
    return r.success ? { kind, input: r.data } : null;
  }
  return null;
}

// Working the numbers out needs no zod: it lives in calculation-results.ts, which the write-up
// page's script loads without the schemas above.
export { computeCableRun, computeWeightMove, toCableRunInput, type WeightMoveComputed } from "./calculation-results";
