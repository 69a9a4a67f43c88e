// `npm run bench`: every benchmark in turn; each prints its figures beside its target.
import { spawnSync } from "node:child_process";
import path from "node:path";

const benches = [
  { name: "Fit search over 50,000 generated spaces (target p95 <= 10 ms)", script: "bench-fit.ts" },
  { name: "Search by words (targets printed by the script)", script: "bench-search.ts" },
];
const tsx = path.resolve(import.meta.dirname, "../node_modules/.bin/tsx");
let failed = 0;
for (const bench of benches) {
  console.log(`\n=== ${bench.name} ===`);
  const r = spawnSync(tsx, [path.join(import.meta.dirname, bench.script), ...process.argv.slice(2)], { stdio: "inherit" });
  if (r.status !== 0) failed++;
}
process.exit(failed ? 1 : 0);
