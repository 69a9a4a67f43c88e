// The local stand-in for an S3 photo store: s3rver, a real S3 server on loopback keeping its objects
// as files in a folder of its own. As a program:
//   tsx scripts/s3-standin.ts [--port 4569] [--dir .data/s3] [--bucket sistership-photos]
// Defaults come from the port of S3_ENDPOINT, S3_STANDIN_DIR and S3_BUCKET, then the values above.
// `npm start`, `npm run dev` and `npm test` run it; tests start it in-process with startS3Standin().
import fs from "node:fs";
import type { AddressInfo } from "node:net";
import { createRequire } from "node:module";
import path from "node:path";
import { option, runStandin } from "./lib/standin-cli";

// s3rver ships no types: these are the parts of its API used here (see its README).
type S3rverOptions = {
  address: string;
  port: number;
  directory: string;
  silent: boolean;
  configureBuckets: { name: string }[];
  vhostBuckets: boolean;
};
type S3rverInstance = { run(): Promise<AddressInfo>; close(): Promise<void> };
const S3rver = createRequire(import.meta.url)("s3rver") as new (options: S3rverOptions) => S3rverInstance;

export const DEFAULT_STANDIN_PORT = 4569;

/** Starts the stand-in on host:`port` (0 picks a free port) with `bucket` made if missing. */
export async function startS3Standin(options: { port: number; dir: string; bucket: string; host?: string }) {
  const dir = path.resolve(options.dir);
  fs.mkdirSync(dir, { recursive: true });
  const host = options.host ?? "127.0.0.1";
  const server = new S3rver({
    address: host,
    port: options.port,
    directory: dir,
    silent: true,
    configureBuckets: [{ name: options.bucket }],
    // Path-style addresses only (http://host:port/bucket/key), as the app's client uses.
    vhostBuckets: false,
  });
  const address = await server.run();
  let closed: Promise<void> | null = null;
  return {
    host,
    port: address.port,
    dir,
    bucket: options.bucket,
    endpoint: `http://${host}:${address.port}`,
    close(): Promise<void> {
      closed ??= server.close();
      return closed;
    },
  };
}

function endpointPort(): string | undefined {
  try {
    return process.env.S3_ENDPOINT ? new URL(process.env.S3_ENDPOINT).port || undefined : undefined;
  } catch {
    return undefined;
  }
}

async function main() {
  const port = Number(option("port") ?? endpointPort() ?? DEFAULT_STANDIN_PORT);
  const dir = path.resolve(option("dir") ?? process.env.S3_STANDIN_DIR ?? ".data/s3");
  const bucket = option("bucket") ?? process.env.S3_BUCKET ?? "sistership-photos";
  await runStandin({
    label: "photo store stand-in",
    port,
    start: () => startS3Standin({ port, dir, bucket }),
    started: (standin) => `S3 on ${standin.endpoint}, bucket ${bucket}, keeping the objects in ${dir}`,
    busyHint: (p) => `S3_ENDPOINT=http://127.0.0.1:${p + 1}`,
  });
}

// Run as a program, not when a test imports startS3Standin().
if (process.argv[1] && path.resolve(process.argv[1]) === import.meta.filename) await main();
