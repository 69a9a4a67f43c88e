// Set-up shared by `npm start`, `npm run dev` and `npm test`.
// Uses only Node's own modules: it runs before node_modules exists.
import { execFileSync, spawn, spawnSync } from "node:child_process";
import fs from "node:fs";
import net from "node:net";
import path from "node:path";
import { fileURLToPath } from "node:url";

export const root = path.resolve(path.dirname(fileURLToPath(import.meta.url)), "../..");
const isRoot = typeof process.getuid === "function" && process.getuid() === 0;

export class SetupError extends Error {}

export function log(message) {
  console.log(`[sistership] ${message}`);
}

export function fail(error) {
  if (error instanceof SetupError) {
    console.error(`\n[sistership] ${error.message}\n`);
  } else {
    console.error(error);
  }
  process.exit(1);
}

function run(cmd, args, opts = {}) {
  const r = spawnSync(cmd, args, { stdio: "inherit", cwd: root, ...opts });
  return r.status ?? 1;
}

/** npm ci when node_modules is missing or older than the lock file. */
export function ensureDependencies() {
  const lock = path.join(root, "package-lock.json");
  const marker = path.join(root, "node_modules", ".package-lock.json");
  const stale =
    !fs.existsSync(marker) || fs.statSync(marker).mtimeMs < fs.statSync(lock).mtimeMs;
  if (!stale) return;
  // One install at a time: a second `npm test` started meanwhile waits for the first one's npm ci
  // instead of emptying node_modules under it.
  const lockDir = path.join(root, ".npm-ci.lock");
  const waitUntil = Date.now() + 15 * 60_000;
  for (;;) {
    try {
      fs.mkdirSync(lockDir);
      break;
    } catch (error) {
      if (error.code !== "EEXIST") throw error;
      const age = Date.now() - fs.statSync(lockDir).mtimeMs;
      if (age > 15 * 60_000) fs.rmSync(lockDir, { recursive: true, force: true });
      else if (Date.now() > waitUntil) throw new SetupError(`another npm ci has held ${lockDir} for too long; remove it if no install is running`);
      else Atomics.wait(new Int32Array(new SharedArrayBuffer(4)), 0, 0, 2000);
    }
  }
  try {
    const stillStale = !fs.existsSync(marker) || fs.statSync(marker).mtimeMs < fs.statSync(lock).mtimeMs;
    if (!stillStale) return;
    log("installing dependencies (npm ci) ...");
    if (run("npm", ["ci", "--no-audit", "--no-fund"]) !== 0) {
      throw new SetupError("npm ci failed (see above). Is the npm registry reachable?");
    }
  } finally {
    fs.rmSync(lockDir, { recursive: true, force: true });
  }
}

function aptInstall(packages, why) {
  if (!isRoot) {
    throw new SetupError(
      `${why} is missing. Install it with: sudo apt-get install -y ${packages.join(" ")}`,
    );
  }
  log(`installing ${packages.join(", ")} from Debian's packages (${why}) ...`);
  const env = { ...process.env, DEBIAN_FRONTEND: "noninteractive" };
  // The package lists of a fresh machine may be empty or stale: update once, then install.
  if (run("apt-get", ["update", "-q"], { env }) !== 0 ||
      run("apt-get", ["install", "-y", "-q", "--no-install-recommends", ...packages], { env }) !== 0) {
    throw new SetupError(
      `apt-get could not install ${packages.join(" ")} (see the messages above). ` +
        "Check that Debian's package mirrors are reachable, then run the command again.",
    );
  }
}

/** The directory holding initdb, pg_ctl and postgres; installs PostgreSQL when missing. */
export function ensurePostgres() {
  const find = () => {
    const base = "/usr/lib/postgresql";
    if (!fs.existsSync(base)) return null;
    const versions = fs
      .readdirSync(base)
      .filter((v) => fs.existsSync(path.join(base, v, "bin", "postgres")))
      .sort((a, b) => Number(b) - Number(a));
    return versions.length ? path.join(base, versions[0], "bin") : null;
  };
  let bin = find();
  if (!bin) {
    aptInstall(["postgresql", "postgresql-contrib"], "the PostgreSQL server");
    bin = find();
    if (!bin) throw new SetupError("PostgreSQL was installed but its binaries were not found in /usr/lib/postgresql.");
  }
  return bin;
}

/** Debian's Chromium for the browser tests. */
export function ensureChromium() {
  const exe = process.env.CHROMIUM_PATH ?? "/usr/bin/chromium";
  if (fs.existsSync(exe)) return exe;
  aptInstall(["chromium"], "Chromium (for the browser tests)");
  if (!fs.existsSync(exe)) throw new SetupError(`Chromium was installed but ${exe} does not exist.`);
  return exe;
}

export function portIsFree(port, host = "127.0.0.1") {
  return new Promise((resolve) => {
    const srv = net.createServer();
    srv.once("error", () => resolve(false));
    srv.listen(port, host, () => srv.close(() => resolve(true)));
  });
}

export async function freePort() {
  return new Promise((resolve, reject) => {
    const srv = net.createServer();
    srv.once("error", reject);
    srv.listen(0, "127.0.0.1", () => {
      const { port } = srv.address();
      srv.close(() => resolve(port));
    });
  });
}

/** Runs a PostgreSQL binary as the postgres system user when we are root (initdb refuses root). */
export function pgCommand(bin, tool, args) {
  const exe = path.join(bin, tool);
  return isRoot ? ["runuser", ["-u", "postgres", "--", exe, ...args]] : [exe, args];
}

function pgRun(bin, tool, args, opts = {}) {
  const [cmd, argv] = pgCommand(bin, tool, args);
  return spawnSync(cmd, argv, { encoding: "utf8", cwd: "/", ...opts });
}

function tail(file, lines = 25) {
  try {
    return fs.readFileSync(file, "utf8").trimEnd().split("\n").slice(-lines).join("\n");
  } catch {
    return "(no log written)";
  }
}

/**
 * pg_ctl's arguments that start the cluster in `dir` on 127.0.0.1:port (as startCluster does).
 * A throwaway cluster (tests, benchmarks) skips flushing to disk, which is faster and loses only
 * what a crash of the machine would lose anyway; the cluster `npm start` keeps members' posts in
 * stays durable.
 */
export function clusterStartArgs(dir, port, { throwaway = false } = {}) {
  dir = path.resolve(dir);
  const speed = throwaway ? " -c fsync=off -c full_page_writes=off" : "";
  const opts = `-c listen_addresses=127.0.0.1 -p ${port} -k ${dir}${speed}`;
  return ["-D", path.join(dir, "data"), "-l", path.join(dir, "postgres.log"), "-o", opts, "-w", "-t", "30", "start"];
}

/**
 * A PostgreSQL cluster of the project's own: created when missing, started on 127.0.0.1:port
 * with its socket inside the cluster folder. Returns { url(db), stop() }.
 */
export async function startCluster({ bin, dir, port, throwaway = false }) {
  dir = path.resolve(dir);
  const data = path.join(dir, "data");
  const logFile = path.join(dir, "postgres.log");
  fs.mkdirSync(dir, { recursive: true });
  if (isRoot) {
    // The postgres user must be able to enter every folder on the way to the cluster.
    const probe = spawnSync("runuser", ["-u", "postgres", "--", "test", "-w", dir], { cwd: "/" });
    if (probe.status !== 0) {
      execFileSync("chown", ["postgres:postgres", dir]);
      const again = spawnSync("runuser", ["-u", "postgres", "--", "test", "-w", dir], { cwd: "/" });
      if (again.status !== 0) {
        throw new SetupError(
          `The postgres system user cannot reach ${dir} (a parent folder is closed to it). ` +
            "Set SISTERSHIP_PG_DIR to a folder it can reach, e.g. /tmp/sistership-pg.",
        );
      }
    }
  }

  if (!fs.existsSync(path.join(data, "PG_VERSION"))) {
    log(`creating a PostgreSQL cluster in ${data} ...`);
    const r = pgRun(bin, "initdb", ["-D", data, "-U", "postgres", "--auth=trust", "-E", "UTF8", "--locale=C.UTF-8"]);
    if (r.status !== 0) {
      throw new SetupError(`initdb failed:\n${r.stdout}\n${r.stderr}`);
    }
  }

  // A cluster left running by an earlier run (a crash or kill -9): stop it first.
  if (fs.existsSync(path.join(data, "postmaster.pid"))) {
    pgRun(bin, "pg_ctl", ["-D", data, "-m", "fast", "-w", "stop"]);
  }
  if (!(await portIsFree(port))) {
    throw new SetupError(
      `Port ${port} on 127.0.0.1 is busy, so PostgreSQL cannot listen there. ` +
        "Stop whatever uses it, or pick another port with SISTERSHIP_PG_PORT.",
    );
  }
  const r = pgRun(bin, "pg_ctl", clusterStartArgs(dir, port, { throwaway }));
  if (r.status !== 0) {
    throw new SetupError(
      `PostgreSQL would not start. The last lines of its log (${logFile}):\n\n${tail(logFile)}`,
    );
  }
  let stopped = false;
  const stop = () => {
    if (stopped) return;
    stopped = true;
    pgRun(bin, "pg_ctl", ["-D", data, "-m", "fast", "-w", "stop"], { stdio: "ignore" });
  };
  const psql = (sql, db = "postgres") =>
    pgRun(bin, "psql", ["-h", "127.0.0.1", "-p", String(port), "-U", "postgres", "-d", db, "-v", "ON_ERROR_STOP=1", "-qAtc", sql]);
  return {
    port,
    url: (db) => `postgres://postgres@127.0.0.1:${port}/${db}`,
    stop,
    psql,
    createDatabase(name, template) {
      const exists = psql(`select 1 from pg_database where datname = '${name}'`);
      if (exists.stdout.trim() === "1") return false;
      const r2 = psql(`create database "${name}"${template ? ` template "${template}"` : ""}`);
      if (r2.status !== 0) throw new SetupError(`Could not create database ${name}: ${r2.stderr}`);
      return true;
    },
  };
}

/** Runs a TypeScript script of ours with tsx. */
export function runTs(script, args = [], env = process.env) {
  const tsx = path.join(root, "node_modules", ".bin", "tsx");
  const status = run(tsx, [script, ...args], { env });
  if (status !== 0) throw new SetupError(`${script} failed (see above).`);
}

export function bin(name) {
  return path.join(root, "node_modules", ".bin", name);
}

/** True for a host name or address of this machine's loopback interface. */
export function isLoopbackHost(host) {
  return host === "localhost" || host === "::1" || /^127\.\d{1,3}\.\d{1,3}\.\d{1,3}$/.test(host);
}

/** Resolves once something accepts connections on host:port; fails when `child` exits first. */
export async function waitForPort(port, host, child, what, seconds = 20) {
  const until = Date.now() + seconds * 1000;
  while (Date.now() < until) {
    if (child.exitCode !== null || child.signalCode !== null) {
      throw new SetupError(`${what} exited before it was ready (see above).`);
    }
    const open = await new Promise((resolve) => {
      const socket = net.connect(port, host);
      socket.once("connect", () => { socket.destroy(); resolve(true); });
      socket.once("error", () => resolve(false));
    });
    if (open) return;
    await new Promise((r) => setTimeout(r, 100));
  }
  throw new SetupError(`${what} did not listen on ${host}:${port} within ${seconds} s.`);
}

/**
 * The SMTP stand-in (scripts/smtp-standin.ts) as a child on 127.0.0.1:port, keeping what it
 * receives in `dir`; resolves once it accepts connections. Returns what spawnChild returns.
 */
export async function startMailStandin({ port, dir, env = process.env }) {
  const standin = spawnChild(bin("tsx"), ["scripts/smtp-standin.ts", "--port", String(port), "--dir", dir], env);
  try {
    await waitForPort(port, "127.0.0.1", standin.child, "The mail stand-in");
  } catch (error) {
    standin.child.kill("SIGTERM");
    throw error;
  }
  return standin;
}

/**
 * The S3 stand-in (scripts/s3-standin.ts) as a child on 127.0.0.1:port, keeping its objects in `dir`,
 * with `bucket` made at start; resolves once it accepts connections. Returns what spawnChild returns.
 */
export async function startPhotoStandin({ port, dir, bucket, env = process.env }) {
  const standin = spawnChild(bin("tsx"), ["scripts/s3-standin.ts", "--port", String(port), "--dir", dir, "--bucket", bucket], env);
  try {
    await waitForPort(port, "127.0.0.1", standin.child, "The photo store stand-in");
  } catch (error) {
    standin.child.kill("SIGTERM");
    throw error;
  }
  return standin;
}

/** The variables that point the app at a photo store stand-in on 127.0.0.1:port. */
export function photoStandinEnv(port, bucket) {
  return {
    S3_ENDPOINT: `http://127.0.0.1:${port}`,
    S3_REGION: "us-east-1",
    S3_BUCKET: bucket,
    // The credentials s3rver accepts.
    S3_ACCESS_KEY_ID: "S3RVER",
    S3_SECRET_ACCESS_KEY: "S3RVER",
  };
}

/** Starts a long-running child that shares our terminal; resolves its exit code. */
export function spawnChild(cmd, args, env) {
  const child = spawn(cmd, args, { stdio: "inherit", cwd: root, env });
  const done = new Promise((resolve) => child.on("exit", (code, signal) => resolve(code ?? (signal ? 1 : 0))));
  return { child, done };
}
