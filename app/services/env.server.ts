import { z } from "zod";

// Environment variables, parsed once at start.
const schema = z.object({
  NODE_ENV: z.enum(["development", "production", "test"]).default("development"),
  DATABASE_URL: z
    .string({ error: "DATABASE_URL is not set. `npm start` sets it for its own PostgreSQL; in a custom set-up, set it to postgres://user@host:port/db" })
    .url({ message: "DATABASE_URL must be a URL such as postgres://user@127.0.0.1:5432/sistership" }),
  // Signs the session cookie. `npm start` makes one and keeps it in .data/; production must set its own.
  SESSION_SECRET: z.string().min(32, { message: "SESSION_SECRET must be at least 32 characters" }).default("development-only-secret-change-me-0123456789"),
  // The public address of the app, used in links sent by e-mail.
  APP_URL: z.string().url().default("http://127.0.0.1:3000"),
  // Outgoing mail (SMTP). `npm start` and `npm test` run a local stand-in and set these.
  SMTP_HOST: z.string().default("127.0.0.1"),
  SMTP_PORT: z.coerce.number().int().positive().default(2525),
  MAIL_FROM: z.string().default("Sistership <no-reply@sistership.example>"),
  // Where the SMTP stand-in keeps what it receives (development and tests only).
  MAIL_STANDIN_DIR: z.string().optional(),
}).superRefine((value, ctx) => {
  if (value.NODE_ENV === "production" && value.SESSION_SECRET.startsWith("development-only")) {
    ctx.addIssue({ code: "custom", path: ["SESSION_SECRET"], message: "set SESSION_SECRET in production (npm start makes one for you)" });
  }
});

export type Env = z.infer<typeof schema>;

function parse(): Env {
  const result = schema.safeParse(process.env);
  if (!result.success) {
    const lines = result.error.issues.map((i) => `  ${i.path.join(".")}: ${i.message}`);
    throw new Error(`Sistership cannot start: the environment is not valid.\n${lines.join("\n")}`);
  }
  return result.data;
}

export const env = parse();
