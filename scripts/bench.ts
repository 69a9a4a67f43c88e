// `npm run bench`: every benchmark in turn, their output shown as it comes, then ONE report: every
// figure they printed (FIGURE lines, see figure() in scripts/lib/bench-kit.ts) beside its target,
// met or not, with the time it was measured and the machine's load average.
//
//   npm run bench [-- --with-load] [--only=fit,search,digest,pages,load] [other arguments, passed on]
//
// bench:load (scripts/bench-load.ts) takes minutes, so it joins only with --with-load.
import { spawn } from "node:child_process";
import fs from "node:fs";
import os from "node:os";
import path from "node:path";
import { type Figure, parseFigures } from "./lib/bench-kit";

type Bench = { key: string; name: string; script: string; heavy?: boolean };
const BENCHES: Bench[] = [
  { key: "fit", name: "Fit search", script: "bench-fit.ts" },
  { key: "search", name: "Search by words", script: "bench-search.ts" },
  { key: "digest", name: "Digest", script: "bench-digest.ts" },
  { key: "pages", name: "Pages: first-load JavaScript and write-up page throughput", script: "bench-pages.ts" },
  { key: "load", name: "Mixed load and fault runs (bench:load)", script: "bench-load.ts", heavy: true },
];

const args = process.argv.slice(2);
const withLoad = args.includes("--with-load");
const only = args.find((a) => a.startsWith("--only="))?.slice("--only=".length).split(",");
const passed = args.filter((a) => a !== "--with-load" && !a.startsWith("--only="));
const tsx = path.resolve(import.meta.dirname, "../node_modules/.bin/tsx");

type Outcome = { bench: Bench; figures: Figure[]; status: number | null; measuredAt: string; load: string; seconds: number };

const loadAverage = () => os.loadavg().map((x) => x.toFixed(2)).join(" ");

function runBench(bench: Bench): Promise<Outcome> {
  return new Promise((resolve) => {
    const started = Date.now();
    const loadBefore = loadAverage();
    let output = "";
    const child = spawn(tsx, [path.join(import.meta.dirname, bench.script), ...passed], { stdio: ["ignore", "pipe", "inherit"] });
    child.stdout.on("data", (chunk: Buffer) => {
      process.stdout.write(chunk);
      output += chunk.toString();
    });
    child.on("close", (code) => {
      resolve({
        bench,
        figures: parseFigures(output),
        status: code,
        measuredAt: new Date().toISOString().replace(/\.\d+Z$/, "Z"),
        load: `${loadBefore} -> ${loadAverage()}`,
        seconds: (Date.now() - started) / 1000,
      });
    });
  });
}

const outcomes: Outcome[] = [];
for (const bench of BENCHES) {
  if (only && !only.includes(bench.key)) continue;
  if (bench.heavy && !withLoad && !only?.includes(bench.key)) {
    console.log(`\n=== ${bench.name}: skipped (add --with-load; it takes minutes) ===`);
    continue;
  }
  if (!fs.existsSync(path.join(import.meta.dirname, bench.script))) {
    console.log(`\n=== ${bench.name}: scripts/${bench.script} does not exist yet, skipped ===`);
    continue;
  }
  console.log(`\n=== ${bench.name} (scripts/${bench.script}) ===`);
  outcomes.push(await runBench(bench));
}

// The report.
const rows: string[][] = [["benchmark", "figure", "value", "unit", "target", "met", "measured (UTC)"]];
for (const o of outcomes) {
  for (const f of o.figures) rows.push([o.bench.key, f.label, f.value, f.unit, f.target, f.met, o.measuredAt]);
  if (!o.figures.length) rows.push([o.bench.key, `(no figures: exit code ${o.status})`, "", "", "", "", o.measuredAt]);
}
const widths = rows[0].map((_, c) => Math.min(c === 1 ? 80 : 40, Math.max(...rows.map((r) => r[c].length))));
const line = (r: string[]) => r.map((cell, c) => (c === 2 ? cell.padStart(widths[c]) : cell.padEnd(widths[c]))).join("  ").trimEnd();
console.log("\n\n================================ benchmark report ================================");
console.log(`machine: ${os.cpus().length} cores, ${(os.totalmem() / 2 ** 30).toFixed(1)} GiB, Node ${process.version}; load average (1, 5, 15 min) per benchmark below`);
console.log(line(rows[0]));
console.log(widths.map((w) => "-".repeat(w)).join("  "));
for (const r of rows.slice(1)) console.log(line(r));
console.log("");
for (const o of outcomes) {
  console.log(`${o.bench.key}: scripts/${o.bench.script}, exit code ${o.status}, ${o.seconds.toFixed(0)} s, load average ${o.load}`);
}
const targeted = outcomes.flatMap((o) => o.figures).filter((f) => f.met === "yes" || f.met === "no");
const missed = targeted.filter((f) => f.met === "no");
console.log(`\n${targeted.length - missed.length} of ${targeted.length} targets met${missed.length ? `; missed: ${missed.map((f) => f.label).join("; ")}` : ""}.`);
const failed = outcomes.filter((o) => o.status !== 0);
if (failed.length) console.log(`Failed to run: ${failed.map((o) => o.bench.script).join(", ")}.`);
process.exit(failed.length ? 1 : 0);
