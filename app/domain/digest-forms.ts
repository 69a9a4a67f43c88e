// The secretary's forms for the yearly digest: one zod schema each, used by conform in the browser
// and by the actions on the server.
import { z } from "zod";
import { DIGEST_FIRST_YEAR, DIGEST_LAST_YEAR } from "./digest";

export const LETTER_MAX = 20_000;
export const CORRECTION_NOTE_MAX = 2_000;

/** Pick a year and compile its draft. */
export const compileSchema = z.object({
  year: z.coerce
    .number({ error: "Give the year as four digits, e.g. 2025." })
    .int("Give the year as four digits, e.g. 2025.")
    .min(DIGEST_FIRST_YEAR, `The class's first boats were built in ${DIGEST_FIRST_YEAR}.`)
    .max(DIGEST_LAST_YEAR, "That year is too far ahead."),
});

/** The editor's letter (Markdown), and for a correction, what it corrects. */
export const letterSchema = z.object({
  letter: z.string().max(LETTER_MAX, `Keep the letter under ${LETTER_MAX.toLocaleString("en-GB")} characters.`).default(""),
  correctionNote: z.string().trim().max(CORRECTION_NOTE_MAX, `Keep the note under ${CORRECTION_NOTE_MAX.toLocaleString("en-GB")} characters.`).default(""),
});

/** Moving an entry, or leaving it out and putting it back. */
export const entrySchema = z.object({
  intent: z.enum(["up", "down", "leave-out", "put-back"]),
  writeupId: z.coerce.number().int().positive(),
});

/** Issuing: a deliberate tick, and whether to e-mail the members who opted in. */
export const issueSchema = z.object({
  confirm: z.literal("on", { error: "Tick the box to confirm: an issued digest cannot be changed." }),
  sendEmail: z.preprocess((v) => v === "on" || v === "true", z.boolean()),
});
