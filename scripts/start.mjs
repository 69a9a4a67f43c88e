// `npm start` (production build) and `npm run dev` (development server), with their own PostgreSQL.
import path from "node:path";
import {
  bin, ensureDependencies, ensurePostgres, fail, log, portIsFree, root, runTs, SetupError,
  spawnChild, startCluster,
} from "./lib/setup.mjs";

const dev = process.argv.includes("--dev");
const migrateOnly = process.argv.includes("--migrate-only");

async function main() {
  ensureDependencies();
  const host = process.env.HOST ?? "127.0.0.1";
  const port = Number(process.env.PORT ?? 3000);

  let cluster = null;
  let databaseUrl = process.env.DATABASE_URL;
  if (databaseUrl) {
    log("using the database in DATABASE_URL (PostgreSQL is not managed by this script)");
  } else {
    const pgBin = ensurePostgres();
    cluster = await startCluster({
      bin: pgBin,
      dir: process.env.SISTERSHIP_PG_DIR ?? path.join(root, ".data", "pg"),
      port: Number(process.env.SISTERSHIP_PG_PORT ?? 54329),
    });
    cluster.createDatabase("sistership");
    databaseUrl = cluster.url("sistership");
    log(`PostgreSQL is listening on 127.0.0.1:${cluster.port}`);
  }
  const stopAll = () => cluster?.stop();
  process.on("exit", stopAll);

  const env = { ...process.env, DATABASE_URL: databaseUrl };
  runTs("scripts/migrate.ts", [], env);
  if (migrateOnly) return;
  runTs("scripts/seed.ts", ["--if-empty"], env);

  if (!(await portIsFree(port, host))) {
    throw new SetupError(
      `Port ${port} on ${host} is busy: another program (perhaps an earlier npm start) is using it. ` +
        "Stop it, or choose another port: PORT=3001 npm start",
    );
  }

  let server;
  if (dev) {
    server = spawnChild(bin("react-router"), ["dev", "--host", host, "--port", String(port)], {
      ...env, NODE_ENV: "development",
    });
  } else {
    log("building the app ...");
    const build = spawnChild(bin("react-router"), ["build"], { ...env, NODE_ENV: "production" });
    if ((await build.done) !== 0) throw new SetupError("The build failed (see above).");
    server = spawnChild(bin("react-router-serve"), ["./build/server/index.js"], {
      ...env, NODE_ENV: "production", HOST: host, PORT: String(port),
    });
    log(`serving Sistership on http://${host}:${port} (Ctrl-C stops the app and its PostgreSQL)`);
  }
  for (const signal of ["SIGINT", "SIGTERM"]) {
    process.on(signal, () => server.child.kill("SIGTERM"));
  }
  const code = await server.done;
  stopAll();
  process.exit(code);
}

main().catch(fail);
