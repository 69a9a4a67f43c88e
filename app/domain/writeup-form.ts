// The write-up editor's form: one zod schema, used in the browser and on the server.
import { z } from "zod";
import { parseAppliesTo } from "./hulls";
import { parseWeight } from "./units";

export const TITLE_MAX = 140;
export const SUMMARY_MAX = 400;
export const BODY_MAX = 60_000;
export const MAX_PARTS = 40;

const optionalNumber = (label: string, max: number) =>
  z.preprocess(
    (v) => (v === "" || v === undefined || v === null ? undefined : v),
    z.coerce
      .number({ error: `${label} must be a number.` })
      .min(0, { message: `${label} cannot be negative.` })
      .max(max, { message: `${label} looks too large (at most ${max.toLocaleString("en-US")}).` })
      .optional(),
  );

export const partRowSchema = z.object({
  name: z.string().trim().min(1, { message: "Name the part, or remove the row." }).max(120, { message: "Use at most 120 characters." }),
  quantity: z.coerce.number({ error: "Quantity must be a number." }).positive({ message: "Quantity must be more than 0." }).max(10_000, { message: "That quantity looks too large." }),
  weight: z.string().trim().max(40).optional(),
  note: z.string().trim().max(200, { message: "Use at most 200 characters." }).optional(),
});

/**
 * `draft: true` is the schema of "Save draft": a title is enough, so that an owner can start a
 * write-up and come back to it; summary, body and systems are asked for when it is sent for review.
 */
export function writeupFormSchema(options: { systems: readonly string[]; zones: readonly string[]; weightUnit: "lb" | "kg"; draft?: boolean }) {
  const summary = z.string({ error: "Sum it up in a sentence or two." }).trim().max(SUMMARY_MAX, { message: `Use at most ${SUMMARY_MAX} characters.` });
  const body = z.string({ error: "Write the body of the write-up." }).max(BODY_MAX, { message: `The body is too long (at most ${BODY_MAX.toLocaleString("en-US")} characters).` });
  const systems = z.array(z.string()).refine((list) => list.every((s) => options.systems.includes(s)), { message: "Choose systems from the list." });
  return z.object({
    title: z.string({ error: "Give the write-up a title." }).trim().min(5, { message: "Use at least 5 characters for the title." }).max(TITLE_MAX, { message: `Use at most ${TITLE_MAX} characters.` }),
    summary: options.draft ? summary.default("") : summary.min(10, { message: "Sum it up in at least 10 characters." }),
    body: options.draft ? body.default("") : body,
    systems: options.draft ? systems.default([]) : systems.refine((list) => list.length > 0, { message: "Choose at least one boat system." }),
    zones: z
      .array(z.string())
      .default([])
      .refine((list) => list.every((s) => options.zones.includes(s)), { message: "Choose zones from the list." }),
    appliesTo: z
      .string({ error: "Say which hulls this applies to." })
      .trim()
      .transform((v, ctx) => {
        const r = parseAppliesTo(v);
        if ("error" in r) {
          ctx.addIssue({ code: "custom", message: r.error });
          return z.NEVER;
        }
        return r;
      }),
    difficulty: z.enum(["easy", "moderate", "hard"], { error: "Choose how hard it was." }).optional(),
    hoursSpent: optionalNumber("Time spent", 2000),
    costUsd: optionalNumber("Cost", 1_000_000),
    parts: z
      .array(partRowSchema)
      .max(MAX_PARTS, { message: `At most ${MAX_PARTS} parts.` })
      .default([])
      .superRefine((rows, ctx) => {
        rows.forEach((row, i) => {
          if (row.weight) {
            const w = parseWeight(row.weight, options.weightUnit);
            if (!w.ok) ctx.addIssue({ code: "custom", path: [i, "weight"], message: w.message });
          }
        });
      }),
  });
}

export type WriteupFormValue = z.output<ReturnType<typeof writeupFormSchema>>;

/** A URL-safe slug from a title ("Group 27 battery, moved!" -> "group-27-battery-moved"). */
export function slugify(title: string): string {
  return (
    title
      .normalize("NFKD")
      .replace(/[\u0300-\u036f]/g, "")
      .toLowerCase()
      .replace(/[^a-z0-9]+/g, "-")
      .replace(/^-+|-+$/g, "")
      .slice(0, 80)
      .replace(/-+$/g, "") || "write-up"
  );
}
