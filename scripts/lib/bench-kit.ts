// What every benchmark script shares: arguments, deterministic random numbers, percentiles, a
// PostgreSQL server of its own, and the figure lines that `npm run bench` gathers into one report.
import { randomBytes } from "node:crypto";
import fs from "node:fs";
import os from "node:os";
import path from "node:path";
import pg from "pg";
import { ensurePostgres, freePort, startCluster } from "./setup.mjs";

/** `--name=value` from the command line, as a number. */
export function argNumber(name: string, fallback: number): number {
  const found = process.argv.find((a) => a.startsWith(`--${name}=`));
  return found ? Number(found.split("=")[1]) : fallback;
}

/** Deterministic pseudo-random numbers (mulberry32): the same content and queries on every run. */
export function random(seed: number): () => number {
  return () => {
    seed = (seed + 0x6d2b79f5) | 0;
    let x = Math.imul(seed ^ (seed >>> 15), 1 | seed);
    x = (x + Math.imul(x ^ (x >>> 7), 61 | x)) ^ x;
    return ((x ^ (x >>> 14)) >>> 0) / 4294967296;
  };
}

/** The nearest-rank percentile of an ascending list. */
export function percentile(sorted: number[], p: number): number {
  const i = Math.min(sorted.length - 1, Math.max(0, Math.ceil((p / 100) * sorted.length) - 1));
  return sorted[i];
}

/**
 * A PostgreSQL server for a benchmark: the one in DATABASE_URL when set (its role needs CREATEDB),
 * otherwise a cluster of its own in a temporary folder, removed by stop(). With `sharedBuffers`,
 * the own cluster is restarted with that much memory for the data set.
 */
export async function benchServer(options: { sharedBuffers?: string } = {}): Promise<{ adminUrl: string; stop: () => void }> {
  if (process.env.DATABASE_URL) {
    const url = new URL(process.env.DATABASE_URL);
    url.pathname = "/postgres";
    return { adminUrl: url.toString(), stop: () => {} };
  }
  const dir = fs.mkdtempSync(path.join(os.tmpdir(), "sistership-bench-"));
  fs.chmodSync(dir, 0o755);
  const bin = ensurePostgres();
  const port = await freePort();
  let cluster = await startCluster({ bin, dir, port, throwaway: true });
  if (options.sharedBuffers) {
    const set = cluster.psql(`alter system set shared_buffers = '${options.sharedBuffers}'`);
    if (set.status === 0) {
      cluster.stop();
      cluster = await startCluster({ bin, dir, port, throwaway: true });
    }
  }
  return {
    adminUrl: cluster.url("postgres"),
    stop: () => {
      cluster.stop();
      fs.rmSync(dir, { recursive: true, force: true });
    },
  };
}

/**
 * A database of a benchmark's own on benchServer()'s server, named `<prefix>_<random>`: its URL,
 * and `finish()`, which drops it (unless kept) and stops the server the benchmark started. Close
 * the pools on it first. `reuse`: an existing database of that name, measured and kept.
 */
export async function benchDatabase(
  prefix: string, options: { sharedBuffers?: string; reuse?: string | null; keep?: boolean } = {},
): Promise<{ url: string; finish: () => Promise<void> }> {
  const { adminUrl, stop } = await benchServer({ sharedBuffers: options.sharedBuffers });
  const name = options.reuse ?? `${prefix}_${randomBytes(4).toString("hex")}`;
  const admin = new pg.Client({ connectionString: adminUrl });
  await admin.connect();
  if (!options.reuse) await admin.query(`create database "${name}"`);
  const url = new URL(adminUrl);
  url.pathname = `/${name}`;
  return {
    url: url.toString(),
    finish: async () => {
      if (options.keep || options.reuse) console.log(`[bench] the database is kept: ${url}`);
      else {
        // Let the pools' connections close before the database goes.
        await new Promise((r) => setTimeout(r, 200));
        await admin.query(`drop database if exists "${name}" with (force)`);
      }
      await admin.end();
      stop();
    },
  };
}

export type Target = { op: "<=" | ">="; value: number };

/**
 * Prints one figure as a line that `npm run bench` gathers into its report:
 *   FIGURE<TAB>label<TAB>value<TAB>unit<TAB>target (e.g. "<= 30") or "-"<TAB>met: yes|no|-
 * A figure without a target (a baseline, a floor, a count) prints "-" for both.
 */
export function figure(label: string, value: number, unit: string, target?: Target): boolean | null {
  const met = target ? (target.op === "<=" ? value <= target.value : value >= target.value) : null;
  const shown = Number.isInteger(value) ? String(value) : value.toFixed(2);
  console.log(["FIGURE", label, shown, unit, target ? `${target.op} ${target.value}` : "-", met === null ? "-" : met ? "yes" : "no"].join("\t"));
  return met;
}

export type Figure = { label: string; value: string; unit: string; target: string; met: string };

/** Reads the FIGURE lines back out of a benchmark's output. */
export function parseFigures(output: string): Figure[] {
  return output
    .split("\n")
    .filter((line) => line.startsWith("FIGURE\t"))
    .map((line) => {
      const [, label, value, unit, target, met] = line.split("\t");
      return { label, value, unit, target, met };
    });
}
