// Which database `npm run db:backup` and `npm run db:restore` work on, and the PostgreSQL tools to
// do it with: DATABASE_URL when set, otherwise the cluster `npm start` runs (.data/pg, port
// 54329, database "sistership"), started for the occasion when it is not running.
import { spawnSync } from "node:child_process";
import fs from "node:fs";
import path from "node:path";
import { ensurePostgres, root, startCluster } from "./setup.mjs";

export type DatabaseTarget = {
  url: string;
  /** Folder of pg_dump, pg_restore, pg_isready (Debian's /usr/lib/postgresql/<version>/bin). */
  bin: string;
  /** What to call it in messages (no password). */
  label: string;
  /** Stops a cluster that was started only for this command. */
  release: () => void;
};

export function describe(url: string): string {
  const u = new URL(url);
  return `database "${u.pathname.slice(1)}" on ${u.hostname}:${u.port || 5432}`;
}

function answers(bin: string, url: string): boolean {
  return spawnSync(path.join(bin, "pg_isready"), ["-d", url, "-t", "3"], { stdio: "ignore" }).status === 0;
}

export async function databaseTarget(): Promise<DatabaseTarget> {
  const bin = ensurePostgres();
  if (process.env.DATABASE_URL) {
    const url = process.env.DATABASE_URL;
    if (!answers(bin, url)) throw new Error(`The ${describe(url)} (DATABASE_URL) does not answer. Is PostgreSQL running there?`);
    return { url, bin, label: describe(url), release: () => {} };
  }
  const port = Number(process.env.SISTERSHIP_PG_PORT ?? 54329);
  const dir = process.env.SISTERSHIP_PG_DIR ?? path.join(root, ".data", "pg");
  const url = `postgres://postgres@127.0.0.1:${port}/sistership`;
  if (answers(bin, url)) return { url, bin, label: describe(url), release: () => {} };
  if (!fs.existsSync(path.join(dir, "data", "PG_VERSION"))) {
    throw new Error(`There is no database to work on: DATABASE_URL is not set and ${dir} holds no cluster (run npm start once, or set DATABASE_URL).`);
  }
  console.log(`[sistership] starting the cluster in ${path.relative(root, dir) || dir} for this command ...`);
  const cluster = await startCluster({ bin, dir, port });
  return { url, bin, label: describe(url), release: () => cluster.stop() };
}
