// A production server of a browser test file's own, on its own fresh copy of the seeded template
// database: a journey starts from the demo content as it ships, whatever other test files changed.
// It runs the build `npm test` made (scripts/serve.mjs), with the run's SMTP and S3 stand-ins.
import { type ChildProcess, spawn } from "node:child_process";
import crypto from "node:crypto";
import fs from "node:fs";
import net from "node:net";
import path from "node:path";
import { createTestDatabase } from "./db";

const ROOT = path.resolve(import.meta.dirname, "../..");

export type AppServer = {
  baseUrl: string;
  /** The file's own database (Drizzle and a pg pool), to count what the journey stored. */
  database: Awaited<ReturnType<typeof createTestDatabase>>;
  /** What the server printed, for the failure message. */
  output: () => string;
  stop: () => Promise<void>;
};

async function freePort(): Promise<number> {
  return new Promise((resolve, reject) => {
    const s = net.createServer();
    s.once("error", reject);
    s.listen(0, "127.0.0.1", () => {
      const { port } = s.address() as net.AddressInfo;
      s.close(() => resolve(port));
    });
  });
}

async function waitForHealth(url: string, child: ChildProcess, output: () => string, seconds = 30) {
  const until = Date.now() + seconds * 1000;
  while (Date.now() < until) {
    if (child.exitCode !== null) throw new Error(`the app server exited (code ${child.exitCode}) before it was ready:\n${output()}`);
    try {
      if ((await fetch(url)).ok) return;
    } catch {
      // not listening yet
    }
    await new Promise((r) => setTimeout(r, 150));
  }
  throw new Error(`the app server did not answer ${url} within ${seconds} s:\n${output()}`);
}

export async function startAppServer(): Promise<AppServer> {
  if (!fs.existsSync(path.join(ROOT, "build/server/index.js"))) {
    throw new Error("There is no production build: run the browser tests through `npm test`, which builds first.");
  }
  const database = await createTestDatabase("template_seeded");
  const port = await freePort();
  const baseUrl = `http://127.0.0.1:${port}`;
  const lines: string[] = [];
  const child = spawn(process.execPath, [path.join(ROOT, "scripts/serve.mjs")], {
    cwd: ROOT,
    env: {
      ...process.env,
      NODE_ENV: "production",
      DATABASE_URL: database.url,
      SESSION_SECRET: crypto.randomBytes(32).toString("hex"),
      HOST: "127.0.0.1",
      PORT: String(port),
      APP_URL: baseUrl,
    },
    stdio: ["ignore", "pipe", "pipe"],
  });
  const keep = (chunk: Buffer) => { lines.push(chunk.toString()); if (lines.length > 400) lines.shift(); };
  child.stdout?.on("data", keep);
  child.stderr?.on("data", keep);
  const output = () => lines.join("");
  const stop = async () => {
    if (child.exitCode === null) {
      const exited = new Promise((r) => child.once("exit", r));
      child.kill("SIGTERM");
      await Promise.race([exited, new Promise((r) => setTimeout(r, 5000))]);
      if (child.exitCode === null) child.kill("SIGKILL");
    }
    await database.drop();
  };
  try {
    await waitForHealth(`${baseUrl}/api/health`, child, output);
  } catch (error) {
    await stop();
    throw error;
  }
  return { baseUrl, database, output, stop };
}
