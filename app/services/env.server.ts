import { z } from "zod";

// Environment variables, parsed once at start.
const schema = z.object({
  NODE_ENV: z.enum(["development", "production", "test"]).default("development"),
  DATABASE_URL: z
    .string({ error: "DATABASE_URL is not set. `npm start` sets it for its own PostgreSQL; in a custom set-up, set it to postgres://user@host:port/db" })
    .url({ message: "DATABASE_URL must be a URL such as postgres://user@127.0.0.1:5432/sistership" }),
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
