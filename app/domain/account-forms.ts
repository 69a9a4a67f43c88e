// The zod schemas of the account forms: one per form, used in the browser (conform) and on the server.
import { z } from "zod";
import { FIRST_HULL, LAST_HULL, CLASS_NAME } from "./hulls";
import { MAX_PASSWORD_LENGTH, passwordProblem } from "./password-rules";
import { ROLES } from "./permissions";

const email = z
  .string({ error: "Enter your e-mail address." })
  .trim()
  .max(254, { message: "That e-mail address is too long." })
  .pipe(z.email({ message: "Enter an e-mail address such as name@example.org." }))
  .transform((v) => v.toLowerCase());

// Honeypot: a field people never see; software that fills in every field does.
const honeypot = z.string().max(0, { message: "Leave this field empty." }).optional();

const displayName = z
  .string({ error: "Enter the name other members will see." })
  .trim()
  .min(2, { message: "Use at least 2 characters." })
  .max(80, { message: "Use at most 80 characters." });

export const signUpSchema = z
  .object({
    email,
    displayName,
    password: z.string({ error: "Choose a password." }).max(MAX_PASSWORD_LENGTH),
    website: honeypot,
  })
  .superRefine((v, ctx) => {
    const problem = passwordProblem(v.password, { email: v.email, name: v.displayName });
    if (problem) ctx.addIssue({ code: "custom", path: ["password"], message: problem });
  });

export const signInSchema = z.object({
  email,
  password: z.string({ error: "Enter your password." }).max(MAX_PASSWORD_LENGTH, { message: "That password is too long." }),
  redirectTo: z.string().optional(),
  website: honeypot,
});

export const forgotPasswordSchema = z.object({ email, website: honeypot });

export const resetPasswordSchema = z
  .object({
    token: z.string().min(10).max(200),
    password: z.string({ error: "Choose a new password." }).max(MAX_PASSWORD_LENGTH),
    confirm: z.string({ error: "Type the new password again." }),
  })
  .superRefine((v, ctx) => {
    const problem = passwordProblem(v.password);
    if (problem) ctx.addIssue({ code: "custom", path: ["password"], message: problem });
    else if (v.password !== v.confirm) ctx.addIssue({ code: "custom", path: ["confirm"], message: "The two passwords are not the same." });
  });

export const profileSchema = z.object({
  intent: z.literal("profile"),
  displayName,
  creditAs: z.string().trim().max(120, { message: "Use at most 120 characters." }).optional(),
  units: z.enum(["in", "mm"], { error: "Choose inches or millimetres." }),
  digestOptIn: z.preprocess((v) => v === "on" || v === "true", z.boolean()),
});

export const hullNumberField = z.coerce
  .number({ error: `Enter the hull number, ${FIRST_HULL} to ${LAST_HULL}.` })
  .int({ message: "A hull number is a whole number." })
  .min(FIRST_HULL, { message: `${CLASS_NAME} hull numbers run from ${FIRST_HULL} to ${LAST_HULL}.` })
  .max(LAST_HULL, { message: `${CLASS_NAME} hull numbers run from ${FIRST_HULL} to ${LAST_HULL}.` });

export const addBoatSchema = z.object({
  intent: z.literal("add-boat"),
  hullNumber: hullNumberField,
  boatName: z.string().trim().max(60, { message: "Use at most 60 characters." }).optional(),
});

export const rolesSchema = z.object({
  userId: z.coerce.number().int().positive(),
  roles: z.array(z.enum(ROLES)).default([]),
});
