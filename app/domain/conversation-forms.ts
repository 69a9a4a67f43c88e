// The zod schemas of the conversation under a write-up (comments, "done on my boat too") and of the
// admins' form for boat systems: one per form. The comment and done-too schemas are the server's
// check only: the write-up page keeps zod out of its script
// (docs/decisions/0013-write-up-page-script-within-budget.md). The systems schema is used in the
// browser (conform) and on the server.
import { z } from "zod";
import { hullNumberField } from "./account-forms";
import { COMMENT_MAX, COMMENT_MESSAGES, COMMENT_MIN, commentText } from "./comment-rules";

// The limits and messages live in comment-rules.ts (no zod), which the write-up page's script uses.
export { COMMENT_MAX, COMMENT_MIN, normaliseLineBreaks } from "./comment-rules";

const commentBody = z.preprocess(
  (v) => (typeof v === "string" ? commentText(v) : v),
  z
    .string({ error: COMMENT_MESSAGES.missing })
    .min(COMMENT_MIN, { message: COMMENT_MESSAGES.tooShort })
    .max(COMMENT_MAX, { message: COMMENT_MESSAGES.tooLong }),
);

export const commentSchema = z.object({
  intent: z.literal("post"),
  body: commentBody,
});

export const deleteCommentSchema = z.object({
  intent: z.literal("delete"),
  commentId: z.coerce.number({ error: "Choose a comment." }).int().positive({ message: "Choose a comment." }),
});

export const doneTooSchema = z.object({
  intent: z.enum(["record", "take-back"], { error: "Say whether to record the boat or take it back." }),
  hullNumber: hullNumberField,
});

export const SYSTEM_SLUG_MAX = 40;

/** A slug made from a system's name: lower-case words joined by hyphens ("Deck hardware" -> "deck-hardware"). */
export function systemSlugFrom(name: string): string {
  return name
    .normalize("NFKD")
    .replace(/[\u0300-\u036f]/g, "")
    .toLowerCase()
    .replace(/&/g, " and ")
    .replace(/[^a-z0-9]+/g, "-")
    .replace(/^-+|-+$/g, "")
    .slice(0, SYSTEM_SLUG_MAX)
    .replace(/-+$/g, "");
}

/** The fields as typed (also what the browser checks before sending). */
export const systemFieldsSchema = z.object({
  name: z
    .string({ error: "Give the system a name, such as Ventilation." })
    .trim()
    .min(2, { message: "Use at least 2 characters." })
    .max(40, { message: "Use at most 40 characters." }),
  slug: z
    .string()
    .trim()
    .toLowerCase()
    .max(SYSTEM_SLUG_MAX, { message: `Use at most ${SYSTEM_SLUG_MAX} characters.` })
    .regex(/^[a-z0-9]+(?:-[a-z0-9]+)*$/, { message: "Use lower-case letters, digits and single hyphens, such as deck-hardware." })
    .optional(),
  description: z
    .string()
    .trim()
    .max(200, { message: "Use at most 200 characters." })
    .optional(),
});

export const systemSchema = systemFieldsSchema.transform((v, ctx) => {
  const slug = v.slug || systemSlugFrom(v.name);
  if (!slug) {
    ctx.addIssue({ code: "custom", path: ["slug"], message: "The name has no letters or digits to make an address from; type one, such as ventilation." });
    return z.NEVER;
  }
  return { name: v.name, slug, description: v.description ?? "" };
});
