// `npm start` (production build) and `npm run dev` (development server), with their own PostgreSQL.
import crypto from "node:crypto";
import fs from "node:fs";
import path from "node:path";
import {
  bin, ensureDependencies, ensurePostgres, fail, isLoopbackHost, log, portIsFree, root, runTs, SetupError,
  spawnChild, startCluster, startMailStandin, photoStandinEnv, startPhotoStandin,
} from "./lib/setup.mjs";

const dev = process.argv.includes("--dev");
const migrateOnly = process.argv.includes("--migrate-only");

/** SESSION_SECRET from the environment, or one made once and kept in .data/ (gitignored). */
function sessionSecret() {
  if (process.env.SESSION_SECRET) return process.env.SESSION_SECRET;
  const file = path.join(root, ".data", "session-secret");
  if (!fs.existsSync(file)) {
    fs.mkdirSync(path.dirname(file), { recursive: true });
    fs.writeFileSync(file, crypto.randomBytes(32).toString("hex"), { mode: 0o600 });
  }
  return fs.readFileSync(file, "utf8").trim();
}

/**
 * Outgoing mail. With SMTP_HOST naming another machine, the app sends through that relay. Otherwise
 * the SMTP stand-in runs on 127.0.0.1:SMTP_PORT (2525) and keeps every message in .data/mail.
 * Returns the stand-in (or null) and the variables the app needs.
 */
async function startMail() {
  const host = process.env.SMTP_HOST;
  if (host && !isLoopbackHost(host)) {
    log(`sending mail through the SMTP relay ${host}:${process.env.SMTP_PORT ?? 2525} (no local stand-in)`);
    return { standin: null, env: {} };
  }
  const port = Number(process.env.SMTP_PORT ?? 2525);
  if (!Number.isInteger(port) || port < 1 || port > 65535) {
    throw new SetupError(`SMTP_PORT=${process.env.SMTP_PORT} is not a port number.`);
  }
  if (!(await portIsFree(port))) {
    throw new SetupError(
      `Port ${port} on 127.0.0.1 is busy, so the mail stand-in (a local SMTP server that keeps the ` +
        "app's outgoing mail) cannot listen there: another program (perhaps an earlier npm start) is using it. " +
        `Stop it, or choose another port: SMTP_PORT=${port + 1} npm start`,
    );
  }
  const dir = path.resolve(process.env.MAIL_STANDIN_DIR ?? path.join(root, ".data", "mail"));
  const standin = await startMailStandin({ port, dir });
  return { standin, env: { SMTP_HOST: "127.0.0.1", SMTP_PORT: String(port), MAIL_STANDIN_DIR: dir } };
}

/**
 * Photo storage. With S3_ENDPOINT naming another machine, the app stores photos in that S3 service.
 * Otherwise the S3 stand-in runs on the port of S3_ENDPOINT (default 127.0.0.1:4569) and keeps the
 * objects in .data/s3 (S3_STANDIN_DIR). Returns the stand-in (or null) and the variables the app needs.
 */
async function startPhotoStore() {
  const endpoint = process.env.S3_ENDPOINT;
  let url = null;
  if (endpoint) {
    try {
      url = new URL(endpoint);
    } catch {
      throw new SetupError(`S3_ENDPOINT=${endpoint} is not a URL such as http://127.0.0.1:4569.`);
    }
  }
  const bucket = process.env.S3_BUCKET ?? "sistership-photos";
  if (url && !isLoopbackHost(url.hostname.replace(/^\[(.*)\]$/, "$1"))) {
    log(`storing photos in the S3 service at ${url.origin}, bucket ${bucket} (no local stand-in)`);
    return { standin: null, env: {} };
  }
  if (url && url.protocol !== "http:") {
    throw new SetupError(`S3_ENDPOINT=${endpoint}: the local photo store stand-in speaks plain http, e.g. http://127.0.0.1:4569.`);
  }
  const port = Number(url ? url.port || 80 : 4569);
  if (!(await portIsFree(port))) {
    throw new SetupError(
      `Port ${port} on 127.0.0.1 is busy, so the photo store stand-in (a local S3 server that keeps the ` +
        "app's photos) cannot listen there: another program (perhaps an earlier npm start) is using it. " +
        `Stop it, or choose another port: S3_ENDPOINT=http://127.0.0.1:${port + 1} npm start`,
    );
  }
  const dir = path.resolve(process.env.S3_STANDIN_DIR ?? path.join(root, ".data", "s3"));
  const standin = await startPhotoStandin({ port, dir, bucket });
  return { standin, env: { ...photoStandinEnv(port, bucket), S3_REGION: process.env.S3_REGION ?? "us-east-1" } };
}

async function main() {
  ensureDependencies();
  const host = process.env.HOST ?? "127.0.0.1";
  const port = Number(process.env.PORT ?? 3000);

  let cluster = null;
  let standin = null;
  let photoStandin = null;
  let stopping = false;
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
  const stopAll = () => {
    stopping = true;
    standin?.child.kill("SIGTERM");
    photoStandin?.child.kill("SIGTERM");
    cluster?.stop();
  };
  process.on("exit", stopAll);

  const env = { ...process.env, DATABASE_URL: databaseUrl, SESSION_SECRET: sessionSecret(), APP_URL: process.env.APP_URL ?? `http://${host}:${port}` };
  runTs("scripts/migrate.ts", [], env);
  if (migrateOnly) return;
  runTs("scripts/seed.ts", ["--if-empty"], env);

  if (!(await portIsFree(port, host))) {
    throw new SetupError(
      `Port ${port} on ${host} is busy: another program (perhaps an earlier npm start) is using it. ` +
        "Stop it, or choose another port: PORT=3001 npm start",
    );
  }
  const mail = await startMail();
  standin = mail.standin;
  standin?.done.then((code) => {
    if (!stopping) log(`the mail stand-in stopped (exit code ${code}); outgoing mail waits in the outbox until it runs again`);
  });
  Object.assign(env, mail.env);
  const photos = await startPhotoStore();
  photoStandin = photos.standin;
  photoStandin?.done.then((code) => {
    if (!stopping) log(`the photo store stand-in stopped (exit code ${code}); photos cannot be uploaded or shown until it runs again`);
  });
  Object.assign(env, photos.env);

  let server;
  if (dev) {
    server = spawnChild(bin("react-router"), ["dev", "--host", host, "--port", String(port)], {
      ...env, NODE_ENV: "development",
    });
  } else {
    log("building the app ...");
    const build = spawnChild(bin("react-router"), ["build"], { ...env, NODE_ENV: "production" });
    if ((await build.done) !== 0) throw new SetupError("The build failed (see above).");
    server = spawnChild(process.execPath, ["scripts/serve.mjs"], {
      ...env, NODE_ENV: "production", HOST: host, PORT: String(port),
    });
    log(`serving Sistership on http://${host}:${port} (Ctrl-C stops the app, its PostgreSQL and its mail and photo store stand-ins)`);
  }
  for (const signal of ["SIGINT", "SIGTERM"]) {
    process.on(signal, () => {
      stopping = true;
      server.child.kill("SIGTERM");
    });
  }
  const code = await server.done;
  stopAll();
  process.exit(code);
}

main().then(() => process.exit(0), fail);
