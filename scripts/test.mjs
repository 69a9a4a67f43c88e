// `npm test`: its own throwaway PostgreSQL, then typecheck, unit, integration and browser tests.
import crypto from "node:crypto";
import fs from "node:fs";
import os from "node:os";
import path from "node:path";
import {
  bin, ensureChromium, ensureDependencies, ensurePostgres, fail, freePort, log, root, runTs,
  SetupError, spawnChild, startCluster, startMailStandin, photoStandinEnv, startPhotoStandin,
} from "./lib/setup.mjs";

async function step(name, cmd, args, env) {
  log(`${name} ...`);
  const started = Date.now();
  const { done } = spawnChild(cmd, args, env);
  const code = await done;
  if (code !== 0) throw new SetupError(`${name} failed (exit code ${code}).`);
  log(`${name}: passed in ${((Date.now() - started) / 1000).toFixed(1)} s`);
}

async function waitForHealth(url, server, seconds = 30) {
  const until = Date.now() + seconds * 1000;
  while (Date.now() < until) {
    if (server.child.exitCode !== null) throw new SetupError("The app server exited before it was ready.");
    try {
      const r = await fetch(url);
      if (r.ok) return;
    } catch {
      // not listening yet
    }
    await new Promise((r) => setTimeout(r, 200));
  }
  throw new SetupError(`The app server did not answer ${url} within ${seconds} s.`);
}

// `npm test -- --only=e2e` (or unit, integration, typecheck; comma-separated) runs only those stages.
const only = process.argv.find((a) => a.startsWith("--only="))?.slice("--only=".length).split(",");
const wanted = (stage) => !only || only.includes(stage);
// Other arguments are file filters for vitest: `npm test -- --only=e2e writeup-journey`.
const filters = process.argv.slice(2).filter((a) => !a.startsWith("--"));

async function main() {
  const started = Date.now();
  ensureDependencies();
  const pgBin = ensurePostgres();
  const dir = fs.mkdtempSync(path.join(os.tmpdir(), "sistership-test-"));
  fs.chmodSync(dir, 0o755);
  const cluster = await startCluster({ bin: pgBin, dir, port: await freePort(), throwaway: true });
  let server = null;
  let standin = null;
  let photoStandin = null;
  const cleanup = () => {
    server?.child.kill("SIGTERM");
    standin?.child.kill("SIGTERM");
    photoStandin?.child.kill("SIGTERM");
    cluster.stop();
    if (!process.env.SISTERSHIP_KEEP_TEST_DB) fs.rmSync(dir, { recursive: true, force: true });
  };
  process.on("exit", cleanup);
  for (const signal of ["SIGINT", "SIGTERM"]) process.on(signal, () => process.exit(130));

  // Two templates: migrated and empty; migrated and seeded. Test files copy one of them.
  cluster.createDatabase("template_empty");
  runTs("scripts/migrate.ts", [], { ...process.env, DATABASE_URL: cluster.url("template_empty") });
  cluster.createDatabase("template_seeded", "template_empty");
  runTs("scripts/seed.ts", [], { ...process.env, DATABASE_URL: cluster.url("template_seeded") });

  // The SMTP stand-in of this run, on a free port, keeping mail in a folder of its own; every test
  // layer and the app under test send to it (never to a relay named in SMTP_HOST) and read it.
  const mailDir = path.join(dir, "mail");
  const smtpPort = await freePort();
  standin = await startMailStandin({ port: smtpPort, dir: mailDir });
  const mailEnv = { SMTP_HOST: "127.0.0.1", SMTP_PORT: String(smtpPort), MAIL_STANDIN_DIR: mailDir };

  // The S3 stand-in of this run, likewise: on a free port, its objects in a folder of its own; the
  // app under test and every test layer store photos there (never in a service named in S3_ENDPOINT).
  const s3Port = await freePort();
  photoStandin = await startPhotoStandin({ port: s3Port, dir: path.join(dir, "s3"), bucket: "sistership-test-photos" });
  const photoEnv = photoStandinEnv(s3Port, "sistership-test-photos");

  const env = {
    ...process.env,
    ...mailEnv,
    ...photoEnv,
    NODE_ENV: "test",
    TEST_PG_ADMIN_URL: cluster.url("postgres"),
    DATABASE_URL: cluster.url("template_seeded"),
  };
  if (wanted("typecheck")) {
    await step("typecheck", bin("react-router"), ["typegen"], env);
    await step("typecheck (tsc)", bin("tsc"), [], env);
  }
  if (wanted("unit")) await step("unit tests", bin("vitest"), ["run", "--project", "unit", ...filters], env);
  if (wanted("integration")) await step("integration tests", bin("vitest"), ["run", "--project", "integration", ...filters], env);
  if (!wanted("e2e")) return;

  // Browser tests: the production build against a seeded database of its own.
  const chromium = ensureChromium();
  cluster.createDatabase("e2e", "template_seeded");
  const e2eEnv = {
    ...process.env, ...mailEnv, ...photoEnv, NODE_ENV: "production", DATABASE_URL: cluster.url("e2e"),
    SESSION_SECRET: crypto.randomBytes(32).toString("hex"),
  };
  await step("build", bin("react-router"), ["build"], e2eEnv);
  const port = await freePort();
  const baseUrl = `http://127.0.0.1:${port}`;
  // APP_URL: the links the app mails (verification, password reset) must lead back to this server.
  server = spawnChild(process.execPath, ["scripts/serve.mjs"], { ...e2eEnv, HOST: "127.0.0.1", PORT: String(port), APP_URL: baseUrl });
  await waitForHealth(`${baseUrl}/api/health`, server);
  await step("browser tests", bin("vitest"), ["run", "--project", "e2e", ...filters], {
    ...env, E2E_BASE_URL: baseUrl, CHROMIUM_PATH: chromium, E2E_DATABASE_URL: cluster.url("e2e"),
    ARTIFACTS_DIR: path.join(root, "test-artifacts"),
  });
  log(`all tests passed in ${((Date.now() - started) / 1000).toFixed(0)} s`);
}

main().then(() => process.exit(0), fail);
