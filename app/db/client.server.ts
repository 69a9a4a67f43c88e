import { AsyncLocalStorage } from "node:async_hooks";
import { drizzle, type NodePgDatabase } from "drizzle-orm/node-postgres";
import pg from "pg";
import * as schema from "./schema";

export type Db = NodePgDatabase<typeof schema>;

/**
 * How long a request waits for a connection from the pool before it gives up. Without a limit, a
 * request made while PostgreSQL cannot be reached (or while every connection is busy) would wait
 * for ever; with it, the app answers "the database is not answering" instead.
 */
export const CONNECT_TIMEOUT_MS = 10_000;

// SQLSTATE classes and codes that say "the server cannot be reached or went away", not "this
// statement is wrong" (PostgreSQL 15 documentation, Appendix A "PostgreSQL Error Codes"):
// class 08 connection exception, 57P01 admin shutdown, 57P02 crash shutdown, 57P03 cannot connect
// now (starting up or shutting down), 53300 too many connections.
const UNAVAILABLE_SQLSTATES = new Set(["57P01", "57P02", "57P03", "53300"]);
// Node's socket errors when nothing listens or the connection breaks.
const UNAVAILABLE_SYSCALL_CODES = new Set(["ECONNREFUSED", "ECONNRESET", "EPIPE", "ETIMEDOUT", "EHOSTUNREACH", "ENETUNREACH", "ENOTFOUND", "EAI_AGAIN", "ENOENT"]);
// pg's own messages for a connection that ended, never started, or timed out in the pool queue.
const UNAVAILABLE_MESSAGES = [
  /connection terminated/i,
  /terminating connection/i,
  /timeout exceeded when trying to connect/i,
  /client has encountered a connection error and is not queryable/i,
  /the database system is (starting up|shutting down|in recovery mode)/i,
];

/**
 * True when `error` (or any error in its `cause` chain: Drizzle wraps the driver's errors) means
 * the database cannot be reached, as opposed to a query that failed on its own account.
 */
export function isDatabaseUnavailable(error: unknown): boolean {
  for (let e = error, depth = 0; e && typeof e === "object" && depth < 6; e = (e as { cause?: unknown }).cause, depth++) {
    const { code, message } = e as { code?: unknown; message?: unknown };
    if (typeof code === "string" && (UNAVAILABLE_SQLSTATES.has(code) || code.startsWith("08") || UNAVAILABLE_SYSCALL_CODES.has(code))) return true;
    if (typeof message === "string" && UNAVAILABLE_MESSAGES.some((m) => m.test(message))) return true;
  }
  return false;
}

/**
 * Per request (or any other unit of work run inside `watchDatabase`): the first error that said
 * the database could not be reached, so the caller can answer 503 instead of 500.
 */
type Watch = { unavailable: unknown };
const watches = new AsyncLocalStorage<Watch>();

/** Runs `fn`, and reports whether any query it made found the database unreachable. */
export async function watchDatabase<T>(fn: () => Promise<T>): Promise<{ result: T; unavailable: unknown }> {
  const watch: Watch = { unavailable: null };
  const result = await watches.run(watch, fn);
  return { result, unavailable: watch.unavailable };
}

/**
 * Tells the current watch that `error` found the database unreachable, for errors from a
 * connection this module did not make (a pool of a model's own): entry.server's handleError passes
 * every error it sees here.
 */
export function noteIfDatabaseUnavailable(error: unknown): boolean {
  if (!isDatabaseUnavailable(error)) return false;
  const watch = watches.getStore();
  if (watch && !watch.unavailable) watch.unavailable = error;
  return true;
}

/** The state of one pool's database as its queries last found it. */
export type DatabaseState = { up: boolean; since: number; lastError: string | null };
const states = new WeakMap<pg.Pool, DatabaseState>();

export function databaseState(pool: pg.Pool): DatabaseState {
  return states.get(pool) ?? { up: true, since: Date.now(), lastError: null };
}

function isPromise(value: unknown): value is Promise<unknown> {
  return !!value && typeof (value as { then?: unknown }).then === "function";
}

export function createDb(url: string, max = 10) {
  const pool = new pg.Pool({ connectionString: url, max, allowExitOnIdle: true, connectionTimeoutMillis: CONNECT_TIMEOUT_MS });
  const state: DatabaseState = { up: true, since: Date.now(), lastError: null };
  states.set(pool, state);
  let lastWarning = 0;

  const noteFailure = (error: unknown) => {
    if (!isDatabaseUnavailable(error)) return;
    const watch = watches.getStore();
    if (watch && !watch.unavailable) watch.unavailable = error;
    const message = error instanceof Error ? error.message : String(error);
    if (state.up) {
      state.up = false;
      state.since = Date.now();
    }
    state.lastError = message;
    // One line when the database goes away, then at most one every 30 s while it stays away.
    if (Date.now() - lastWarning > 30_000) {
      lastWarning = Date.now();
      console.warn(`[db] the database is not answering: ${message}`);
    }
  };
  const noteSuccess = () => {
    if (state.up) return;
    state.up = true;
    state.since = Date.now();
    lastWarning = 0;
    console.warn("[db] the database answers again");
  };

  // An idle client that loses its connection (the server restarted) must not crash the app.
  pool.on("error", noteFailure);
  // Nor may a checked-out client between two queries of a transaction: the pool only listens while
  // a client is idle, and an 'error' event nobody listens to ends the process.
  pool.on("connect", (client) => {
    client.on("error", noteFailure);
    client.query = watched(client.query.bind(client) as (...args: unknown[]) => unknown) as typeof client.query;
  });

  // Every query and checkout passes here, so the pool knows when its database went away and when
  // it came back. The promise returned to the caller is the original one: errors still reach it.
  function watched(fn: (...args: unknown[]) => unknown) {
    return (...args: unknown[]) => {
      const result = fn(...args);
      if (isPromise(result)) result.then(noteSuccess, noteFailure);
      return result;
    };
  }
  pool.query = watched(pool.query.bind(pool) as (...args: unknown[]) => unknown) as typeof pool.query;
  pool.connect = watched(pool.connect.bind(pool) as (...args: unknown[]) => unknown) as typeof pool.connect;

  const db = drizzle(pool, { schema });
  return { db, pool };
}
