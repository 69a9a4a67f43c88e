// `npm run db:restore FILE [-- --yes]`: puts the database back as it was in a backup made by
// `npm run db:backup`. Every object in the backup is dropped and made again from it
// (pg_restore --clean --if-exists), in one transaction: if anything fails, nothing has changed.
// Asks before it starts unless --yes. Stop the app first: open connections hold locks the
// restore has to wait for.
import { spawnSync } from "node:child_process";
import fs from "node:fs";
import path from "node:path";
import readline from "node:readline/promises";
import { databaseTarget } from "./lib/database-target";

const args = process.argv.slice(2);
const yes = args.includes("--yes") || args.includes("-y");
const file = args.find((a) => !a.startsWith("-"));

async function confirm(question: string): Promise<boolean> {
  if (!process.stdin.isTTY) return false;
  const rl = readline.createInterface({ input: process.stdin, output: process.stdout });
  try {
    return (await rl.question(question)).trim().toLowerCase() === "yes";
  } finally {
    rl.close();
  }
}

try {
  if (!file) throw new Error("Name the backup to restore: npm run db:restore backups/sistership-<date>.dump");
  const full = path.resolve(file);
  if (!fs.existsSync(full) || !fs.statSync(full).isFile()) throw new Error(`There is no file ${file}.`);
  const target = await databaseTarget();
  try {
    // A quick look inside first: is it a backup pg_restore can read, and from when?
    const list = spawnSync(path.join(target.bin, "pg_restore"), ["--list", full], { encoding: "utf8" });
    if (list.status !== 0) throw new Error(`${file} is not a backup made by npm run db:backup (pg_restore cannot read it): ${list.stderr.trim()}`);
    const made = /Archive created at (.+)/.exec(list.stdout)?.[1]?.trim() ?? "an unknown date";
    const question =
      `This replaces everything in the ${target.label} with the backup ${file} (made ${made}).\n` +
      "Whatever was written since that backup will be gone. Type yes to go on: ";
    if (!yes && !(await confirm(question))) {
      throw new Error(process.stdin.isTTY ? "Nothing was restored." : "Nothing was restored: confirm with --yes when there is no terminal to ask on.");
    }
    const started = Date.now();
    const r = spawnSync(
      path.join(target.bin, "pg_restore"),
      ["--clean", "--if-exists", "--no-owner", "--single-transaction", "--exit-on-error", "--dbname", target.url, full],
      { stdio: ["ignore", "inherit", "inherit"] },
    );
    if (r.status !== 0) throw new Error(`pg_restore failed (see above); the transaction was rolled back, so the ${target.label} is as it was before.`);
    console.log(`[sistership] restored the ${target.label} from ${file} in ${((Date.now() - started) / 1000).toFixed(1)} s`);
  } finally {
    target.release();
  }
} catch (error) {
  console.error(`[sistership] ${error instanceof Error ? error.message : String(error)}`);
  process.exitCode = 1;
}
