// `npm run db:backup [-- --out=FILE]`: a full copy of the database in pg_dump's custom format
// (compressed; restored with `npm run db:restore FILE`), by default in backups/ (gitignored) as
// sistership-YYYY-MM-DDTHH-MM-SSZ.dump. Which database: see scripts/lib/database-target.ts.
import { spawnSync } from "node:child_process";
import fs from "node:fs";
import path from "node:path";
import { databaseTarget } from "./lib/database-target";
import { root } from "./lib/setup.mjs";

const outArg = process.argv.find((a) => a.startsWith("--out="))?.slice("--out=".length);
const stamp = new Date().toISOString().replace(/\.\d+Z$/, "Z").replace(/:/g, "-");
const file = path.resolve(outArg ?? path.join(root, "backups", `sistership-${stamp}.dump`));

try {
  const target = await databaseTarget();
  try {
    fs.mkdirSync(path.dirname(file), { recursive: true });
    const partial = `${file}.partial`;
    const started = Date.now();
    // --format=custom: compressed, and pg_restore can pick, reorder and --clean its contents.
    const r = spawnSync(path.join(target.bin, "pg_dump"), ["--format=custom", "--no-owner", "--file", partial, target.url], { stdio: ["ignore", "inherit", "inherit"] });
    if (r.status !== 0) {
      fs.rmSync(partial, { force: true });
      throw new Error(`pg_dump failed on the ${target.label} (see above); no backup was written.`);
    }
    // Renamed only once complete: a file named *.dump is always a whole backup.
    fs.renameSync(partial, file);
    const kb = fs.statSync(file).size / 1024;
    console.log(`[sistership] backup of the ${target.label}: ${path.relative(process.cwd(), file) || file} (${kb.toFixed(0)} kB, ${((Date.now() - started) / 1000).toFixed(1)} s)`);
    console.log(`[sistership] restore it with: npm run db:restore ${path.relative(process.cwd(), file)}`);
  } finally {
    target.release();
  }
} catch (error) {
  console.error(`[sistership] ${error instanceof Error ? error.message : String(error)}`);
  process.exitCode = 1;
}
