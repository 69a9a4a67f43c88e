import { env } from "~/services/env.server";
import { createDb } from "./client.server";

// The app's one pool, made once per process.
const globalForDb = globalThis as unknown as { __sistershipDb?: ReturnType<typeof createDb> };
const instance = (globalForDb.__sistershipDb ??= createDb(env.DATABASE_URL));

export const db = instance.db;
export const pool = instance.pool;
