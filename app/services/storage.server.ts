// Object storage for photos over the S3 protocol (@aws-sdk/client-s3). `npm start` and `npm test`
// run a local S3 stand-in (scripts/s3-standin.ts) and point S3_ENDPOINT at it; in production,
// S3_ENDPOINT names any S3-compatible service. Keys are path-style (http://host/bucket/key), which
// the stand-in and every S3-compatible service understand.
import {
  CreateBucketCommand,
  DeleteObjectCommand,
  GetObjectCommand,
  HeadBucketCommand,
  PutObjectCommand,
  S3Client,
} from "@aws-sdk/client-s3";
import { z } from "zod";

/** The credentials the local stand-in accepts (it checks signatures made with them). */
export const STANDIN_CREDENTIALS = { accessKeyId: "S3RVER", secretAccessKey: "S3RVER" } as const;
export const DEFAULT_ENDPOINT = "http://127.0.0.1:4569";
export const DEFAULT_BUCKET = "sistership-photos";

function isLoopbackHost(host: string): boolean {
  const h = host.replace(/^\[(.*)\]$/, "$1");
  return h === "localhost" || h === "::1" || /^127\.\d{1,3}\.\d{1,3}\.\d{1,3}$/.test(h);
}

const envSchema = z
  .object({
    S3_ENDPOINT: z
      .url({ protocol: /^https?$/, error: "S3_ENDPOINT must be an http(s) URL such as http://127.0.0.1:4569" })
      .default(DEFAULT_ENDPOINT),
    S3_REGION: z.string().min(1).default("us-east-1"),
    // Bucket names: 3 to 63 lower-case letters, digits, dots and hyphens (the S3 naming rules).
    S3_BUCKET: z
      .string()
      .regex(/^[a-z0-9][a-z0-9.-]{1,61}[a-z0-9]$/, "S3_BUCKET must be 3 to 63 lower-case letters, digits, dots or hyphens")
      .default(DEFAULT_BUCKET),
    S3_ACCESS_KEY_ID: z.string().min(1).optional(),
    S3_SECRET_ACCESS_KEY: z.string().min(1).optional(),
  })
  .superRefine((value, ctx) => {
    // Only the local stand-in may be used without credentials of one's own.
    if (isLoopbackHost(new URL(value.S3_ENDPOINT).hostname)) return;
    for (const name of ["S3_ACCESS_KEY_ID", "S3_SECRET_ACCESS_KEY"] as const) {
      if (!value[name]) {
        ctx.addIssue({ code: "custom", path: [name], message: `set ${name} for the photo store at ${value.S3_ENDPOINT}` });
      }
    }
  });

export type StorageConfig = {
  endpoint: string;
  region: string;
  bucket: string;
  credentials: { accessKeyId: string; secretAccessKey: string };
};

/** The storage settings from S3_ENDPOINT, S3_REGION, S3_BUCKET, S3_ACCESS_KEY_ID, S3_SECRET_ACCESS_KEY. */
export function storageConfigFromEnv(source: Record<string, string | undefined> = process.env): StorageConfig {
  const result = envSchema.safeParse(source);
  if (!result.success) {
    const lines = result.error.issues.map((i) => `  ${i.path.join(".")}: ${i.message}`);
    throw new Error(`Sistership cannot store photos: the environment is not valid.\n${lines.join("\n")}`);
  }
  const e = result.data;
  return {
    endpoint: e.S3_ENDPOINT,
    region: e.S3_REGION,
    bucket: e.S3_BUCKET,
    credentials: {
      accessKeyId: e.S3_ACCESS_KEY_ID ?? STANDIN_CREDENTIALS.accessKeyId,
      secretAccessKey: e.S3_SECRET_ACCESS_KEY ?? STANDIN_CREDENTIALS.secretAccessKey,
    },
  };
}

export type StoredObject = {
  body: ReadableStream<Uint8Array>;
  contentType: string;
  contentLength: number | null;
};

export type Storage = {
  readonly bucket: string;
  putObject(key: string, body: Uint8Array, contentType: string): Promise<void>;
  /** The object, or null when there is none under `key`. */
  getObject(key: string): Promise<StoredObject | null>;
  /** Removes the object; removing one that is not there is not an error (as in S3). */
  deleteObject(key: string): Promise<void>;
  /** Creates the bucket when it is missing. */
  ensureBucket(): Promise<"created" | "exists">;
  /** Closes the client's connections. */
  close(): void;
};

function statusOf(error: unknown): number | undefined {
  return (error as { $metadata?: { httpStatusCode?: number } })?.$metadata?.httpStatusCode;
}
function nameOf(error: unknown): string | undefined {
  return (error as { name?: string })?.name;
}

export function createStorage(config: StorageConfig): Storage {
  // The SDK is pinned in package.json and runs on the project's Node 20; its notice that its releases
  // from 2027 on need Node 22 concerns whoever upgrades it, and would otherwise print on every start.
  process.env.AWS_SDK_JS_NODE_VERSION_SUPPORT_WARNING_DISABLED ??= "true";
  const client = new S3Client({
    endpoint: config.endpoint,
    region: config.region,
    credentials: config.credentials,
    forcePathStyle: true,
  });
  const Bucket = config.bucket;

  async function ensureBucket(): Promise<"created" | "exists"> {
    try {
      await client.send(new HeadBucketCommand({ Bucket }));
      return "exists";
    } catch (error) {
      if (statusOf(error) !== 404) throw error;
    }
    try {
      await client.send(new CreateBucketCommand({ Bucket }));
      return "created";
    } catch (error) {
      // Another process created it in between.
      if (nameOf(error) === "BucketAlreadyOwnedByYou") return "exists";
      throw error;
    }
  }

  async function putObject(key: string, body: Uint8Array, contentType: string): Promise<void> {
    const put = () =>
      client.send(new PutObjectCommand({
        Bucket,
        Key: key,
        Body: body,
        ContentType: contentType,
        // Keys are random and never reused, so a copy may be kept for ever (also by a CDN in front).
        CacheControl: "public, max-age=31536000, immutable",
      }));
    try {
      await put();
    } catch (error) {
      // A new store (or a wiped stand-in) has no bucket yet: make it, then try once more.
      if (nameOf(error) !== "NoSuchBucket") throw error;
      await ensureBucket();
      await put();
    }
  }

  async function getObject(key: string): Promise<StoredObject | null> {
    try {
      const res = await client.send(new GetObjectCommand({ Bucket, Key: key }));
      if (!res.Body) return null;
      return {
        body: res.Body.transformToWebStream() as ReadableStream<Uint8Array>,
        contentType: res.ContentType ?? "application/octet-stream",
        contentLength: res.ContentLength ?? null,
      };
    } catch (error) {
      if (nameOf(error) === "NoSuchKey" || statusOf(error) === 404) return null;
      throw error;
    }
  }

  async function deleteObject(key: string): Promise<void> {
    await client.send(new DeleteObjectCommand({ Bucket, Key: key }));
  }

  return { bucket: Bucket, putObject, getObject, deleteObject, ensureBucket, close: () => client.destroy() };
}

let appStorage: Storage | undefined;

/** The app's store, configured from the environment when first used. */
export function storage(): Storage {
  appStorage ??= createStorage(storageConfigFromEnv());
  return appStorage;
}

export const putObject = (key: string, body: Uint8Array, contentType: string) => storage().putObject(key, body, contentType);
export const getObject = (key: string) => storage().getObject(key);
export const deleteObject = (key: string) => storage().deleteObject(key);
export const ensureBucket = () => storage().ensureBucket();
