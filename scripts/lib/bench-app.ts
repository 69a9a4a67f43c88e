// The production build on loopback for the HTTP benchmarks (bench-load, bench-pages): a private
// build of the current sources, a PostgreSQL cluster of its own that can be stopped and started,
// the demo content, the mail and photo stand-ins, and scripts/serve.mjs.
import { spawn, spawnSync, type ChildProcess } from "node:child_process";
import crypto from "node:crypto";
import fs from "node:fs";
import os from "node:os";
import path from "node:path";
import {
  bin, clusterStartArgs, ensurePostgres, freePort, pgCommand, photoStandinEnv, root, runTs, startCluster, startMailStandin, startPhotoStandin,
} from "./setup.mjs";

/** pg_ctl without blocking the event loop (the load generator runs in the same process). */
function pgCtl(pgBin: string, args: string[]): Promise<number> {
  const [cmd, argv] = pgCommand(pgBin, "pg_ctl", args) as [string, string[]];
  return new Promise((resolve) => {
    const child = spawn(cmd, argv, { cwd: "/", stdio: "ignore" });
    child.on("exit", (code) => resolve(code ?? 1));
  });
}

const SOURCES = ["app", "public", "react-router.config.ts", "vite.config.ts", "tsconfig.json", "package.json", "package-lock.json"];

function filesUnder(p: string): string[] {
  const full = path.join(root, p);
  if (!fs.existsSync(full)) return [];
  if (fs.statSync(full).isFile()) return [p];
  return fs.readdirSync(full, { recursive: true, encoding: "utf8" })
    .map((f) => path.join(p, f))
    .filter((f) => fs.statSync(path.join(root, f)).isFile())
    .sort();
}

/**
 * A production build of the sources as they are now, in .data/bench/ (gitignored), made only when
 * no build of exactly these sources exists yet. It is built from a copy of the sources, so that the
 * shared build/ folder (served by other people's test runs) is never touched. Returns its folder.
 */
export function ensureBenchBuild(): string {
  const files = SOURCES.flatMap(filesUnder);
  const hash = crypto.createHash("sha256");
  for (const f of files) hash.update(f).update("\0").update(fs.readFileSync(path.join(root, f)));
  const key = hash.digest("hex").slice(0, 16);
  const base = path.join(root, ".data", "bench");
  const out = path.join(base, `build-${key}`);
  if (fs.existsSync(path.join(out, "server", "index.js"))) {
    console.log(`[bench] using the production build of these sources in ${path.relative(root, out)}`);
    return out;
  }
  const src = path.join(base, `src-${key}`);
  fs.rmSync(src, { recursive: true, force: true });
  for (const f of files) {
    fs.mkdirSync(path.dirname(path.join(src, f)), { recursive: true });
    fs.copyFileSync(path.join(root, f), path.join(src, f));
  }
  // No node_modules of its own: resolution walks up from .data/bench/ to the project's.
  console.log("[bench] building the app (react-router build) ...");
  const r = spawnSync(bin("react-router"), ["build"], { cwd: src, stdio: ["ignore", "ignore", "inherit"], env: { ...process.env, NODE_ENV: "production" } });
  if (r.status !== 0) throw new Error("the build failed (see above)");
  fs.rmSync(out, { recursive: true, force: true });
  fs.renameSync(path.join(src, "build"), out);
  fs.rmSync(src, { recursive: true, force: true });
  // Builds of other sources are removed once they are a day old (a bench still running may use one).
  for (const old of fs.readdirSync(base)) {
    const full = path.join(base, old);
    if (old.startsWith("build-") && old !== `build-${key}` && Date.now() - fs.statSync(full).mtimeMs > 24 * 3600_000) {
      fs.rmSync(full, { recursive: true, force: true });
    }
  }
  return out;
}

export type BenchApp = {
  baseUrl: string;
  databaseUrl: string;
  sessionSecret: string;
  mailDir: string;
  /** The server's process; `exitCode`/`signalCode` stay null while it lives. */
  server: ChildProcess;
  serverAlive: () => boolean;
  /** The server's output so far (it is also kept in serverLog). */
  serverLog: string;
  /** pg_ctl stop -m fast: every connection is ended at once. */
  stopDatabase: () => Promise<void>;
  startDatabase: () => Promise<void>;
  stopMail: () => Promise<void>;
  startMail: () => Promise<void>;
  stop: () => Promise<void>;
};

async function waitForHealth(url: string, child: ChildProcess, seconds = 30) {
  const until = Date.now() + seconds * 1000;
  while (Date.now() < until) {
    if (child.exitCode !== null || child.signalCode !== null) throw new Error("the server exited before it was ready");
    try {
      if ((await fetch(url)).ok) return;
    } catch {
      // not listening yet
    }
    await new Promise((r) => setTimeout(r, 200));
  }
  throw new Error(`the server did not answer ${url} within ${seconds} s`);
}

/**
 * Starts everything on loopback: a cluster in a temporary folder, a database with the migrations
 * and the demo content (scripts/seed.ts), the stand-ins, and the server from `buildDir`.
 */
export async function startBenchApp(options: { buildDir: string; quiet?: boolean; serverEnv?: NodeJS.ProcessEnv }): Promise<BenchApp> {
  const dir = fs.mkdtempSync(path.join(os.tmpdir(), "sistership-bench-app-"));
  fs.chmodSync(dir, 0o755);
  const pgBin = ensurePostgres();
  const pgPort = await freePort();
  const pgDir = path.join(dir, "pg");
  // Whatever has been started so far, stopped again when start-up fails or the bench is interrupted.
  let cluster: Awaited<ReturnType<typeof startCluster>> | null = null;
  let mail: Awaited<ReturnType<typeof startMailStandin>> | null = null;
  let photos: Awaited<ReturnType<typeof startPhotoStandin>> | null = null;
  let server: ChildProcess | null = null;
  let tornDown = false;
  const teardown = async () => {
    if (tornDown) return;
    tornDown = true;
    if (server && server.exitCode === null && server.signalCode === null) {
      const exited = new Promise((r) => server!.once("exit", r));
      server.kill("SIGTERM");
      await exited;
    }
    mail?.child.kill("SIGTERM");
    photos?.child.kill("SIGTERM");
    await Promise.all([mail?.done, photos?.done]);
    cluster?.stop();
    if (!process.env.SISTERSHIP_KEEP_BENCH) fs.rmSync(dir, { recursive: true, force: true });
    else console.log(`[bench] kept ${dir}`);
  };
  const interrupted = () => void teardown().then(() => process.exit(130));
  process.once("SIGINT", interrupted);
  process.once("SIGTERM", interrupted);

  try {
    cluster = await startCluster({ bin: pgBin, dir: pgDir, port: pgPort, throwaway: true });
    cluster.createDatabase("bench");
    const databaseUrl = cluster.url("bench");
    const sessionSecret = crypto.randomBytes(32).toString("hex");
    const env: NodeJS.ProcessEnv = { ...process.env, DATABASE_URL: databaseUrl, SESSION_SECRET: sessionSecret };
    runTs("scripts/migrate.ts", [], env);
    runTs("scripts/seed.ts", [], env);

    const mailPort = await freePort();
    const mailDir = path.join(dir, "mail");
    mail = await startMailStandin({ port: mailPort, dir: mailDir, env });
    const s3Port = await freePort();
    photos = await startPhotoStandin({ port: s3Port, dir: path.join(dir, "s3"), bucket: "sistership-photos", env });

    const port = await freePort();
    const baseUrl = `http://127.0.0.1:${port}`;
    const serverEnv: NodeJS.ProcessEnv = {
      ...env,
      ...photoStandinEnv(s3Port, "sistership-photos"),
      NODE_ENV: "production",
      HOST: "127.0.0.1",
      PORT: String(port),
      APP_URL: baseUrl,
      SMTP_HOST: "127.0.0.1",
      SMTP_PORT: String(mailPort),
      MAIL_STANDIN_DIR: mailDir,
      SISTERSHIP_BUILD_DIR: options.buildDir,
      // e.g. NODE_OPTIONS=--cpu-prof to profile the server under load
      ...options.serverEnv,
    };
    const child = spawn(process.execPath, [path.join(root, "scripts", "serve.mjs")], { cwd: root, env: serverEnv, stdio: ["ignore", "pipe", "pipe"] });
    server = child;
    const logFile = path.join(dir, "server.log");
    const app: BenchApp = {
      baseUrl,
      databaseUrl,
      sessionSecret,
      mailDir,
      server: child,
      serverAlive: () => child.exitCode === null && child.signalCode === null,
      serverLog: "",
      stopDatabase: async () => {
        const code = await pgCtl(pgBin, ["-D", path.join(pgDir, "data"), "-m", "fast", "-w", "stop"]);
        if (code !== 0) throw new Error(`pg_ctl stop failed (exit code ${code})`);
      },
      startDatabase: async () => {
        const code = await pgCtl(pgBin, clusterStartArgs(pgDir, pgPort, { throwaway: true }));
        if (code !== 0) throw new Error(`pg_ctl start failed (exit code ${code}); see ${pgDir}/postgres.log`);
      },
      stopMail: async () => {
        mail!.child.kill("SIGTERM");
        await mail!.done;
      },
      startMail: async () => {
        mail = await startMailStandin({ port: mailPort, dir: mailDir, env });
      },
      stop: teardown,
    };
    const keep = (chunk: Buffer) => {
      const text = chunk.toString();
      app.serverLog += text;
      if (app.serverLog.length > 2_000_000) app.serverLog = app.serverLog.slice(-1_000_000);
      fs.appendFileSync(logFile, text);
      if (!options.quiet) process.stdout.write(text.replace(/^(?=.)/gm, "  [server] "));
    };
    child.stdout!.on("data", keep);
    child.stderr!.on("data", keep);
    await waitForHealth(`${baseUrl}/api/health`, child);
    return app;
  } catch (error) {
    await teardown();
    throw error;
  }
}

/** The stand-in's messages so far (one JSON file each). */
export function countMail(dir: string): number {
  if (!fs.existsSync(dir)) return 0;
  return fs.readdirSync(dir).filter((f) => f.endsWith(".json") && !f.startsWith(".")).length;
}
