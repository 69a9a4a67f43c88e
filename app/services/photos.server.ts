// Photos that members upload (measurement photos, write-up images): checked by their content,
// re-encoded without any metadata, kept in the object store (storage.server.ts) with a thumbnail,
// recorded in the `photos` table and served by /media/* (routes/media.$.ts).
import { randomBytes } from "node:crypto";
import {
  FormDataParseError, MaxFileSizeExceededError, MaxFilesExceededError, MultipartParseError, parseFormData,
} from "@mjackson/form-data-parser";
import sharp, { type Metadata, type OutputInfo } from "sharp";
import { z } from "zod";
import type { Db } from "~/db/client.server";
import * as s from "~/db/schema";
import { type Storage, storage } from "~/services/storage.server";
import { checkFormType, checkFormValues } from "./form-body.server";

type DbOrTx = Db | Parameters<Parameters<Db["transaction"]>[0]>[0];

const MB = 1024 * 1024;
/** The largest file accepted, in bytes (15 MB, counted as 15 × 1024 × 1024 bytes). */
export const MAX_PHOTO_BYTES = 15 * MB;
/** The most pixels accepted (40 megapixels), checked before the image is decoded. */
export const MAX_PHOTO_PIXELS = 40_000_000;
/** The longest side of the stored photo and of its thumbnail. */
export const PHOTO_MAX_SIDE_PX = 2000;
export const THUMB_MAX_SIDE_PX = 480;
export const MAX_CAPTION_LENGTH = 300;
export const STORED_CONTENT_TYPE = "image/webp";

/** The formats accepted, by the name sharp gives them after reading the file's content. */
const ACCEPTED_FORMATS: Record<string, string> = { jpeg: "JPEG", png: "PNG", webp: "WebP", heif: "HEIC/HEIF" };
const ACCEPTED_LIST = "JPEG, PNG, WebP or HEIC";

/** A photo refused for what it is (type, size, content); the message is written for the member. */
export class PhotoRejectedError extends Error {
  constructor(message: string) {
    super(message);
    this.name = "PhotoRejectedError";
  }
}

/** "15 MB", "15.1 MB": rounded up to a tenth, so that a file over a limit never reads as at it. */
function megabytes(bytes: number): string {
  const tenths = Math.ceil((bytes / MB) * 10);
  return `${tenths % 10 === 0 ? tenths / 10 : (tenths / 10).toFixed(1)} MB`;
}

function tooLargeMessage(size: number | null, limit: number): string {
  const what = size === null ? "The photo is too large" : `The photo is ${megabytes(size)}`;
  return `${what}; a photo may be at most ${megabytes(limit)}. Save a smaller copy and upload that.`;
}

// Keys: photos/<year>/<22 random characters>.webp, and .thumb.webp beside it for the thumbnail.
const KEY_PATTERN = /^photos\/\d{4}\/[A-Za-z0-9_-]{22}(\.thumb)?\.webp$/;

/** True for a key this module makes (the full photo or its thumbnail). */
export function isPhotoKey(key: string): boolean {
  return KEY_PATTERN.test(key);
}

export function thumbnailKey(storageKey: string): string {
  return storageKey.replace(/\.webp$/, ".thumb.webp");
}

export function mediaUrl(key: string): string {
  return `/media/${key}`;
}

function newStorageKey(now: Date): string {
  // 16 random bytes: nobody can guess the address of a photo they were not shown.
  return `photos/${now.getUTCFullYear()}/${randomBytes(16).toString("base64url")}.webp`;
}

export type StoredPhoto = {
  id: number;
  storageKey: string;
  url: string;
  thumbUrl: string;
  widthPx: number;
  heightPx: number;
};

const captionSchema = z
  .string()
  .trim()
  .max(MAX_CAPTION_LENGTH, `A caption may be at most ${MAX_CAPTION_LENGTH} characters.`);

/** Reads the file's header and refuses what is not an accepted photo; does not decode the pixels. */
async function checkPhoto(bytes: Uint8Array) {
  let meta: Metadata;
  try {
    meta = await sharp(bytes).metadata();
  } catch {
    throw new PhotoRejectedError(`This file is not a photo that can be read. Upload a ${ACCEPTED_LIST} photo.`);
  }
  if (!Object.hasOwn(ACCEPTED_FORMATS, meta.format)) {
    throw new PhotoRejectedError(`${meta.format.toUpperCase()} files are not accepted. Upload a ${ACCEPTED_LIST} photo.`);
  }
  if (meta.format === "heif" && meta.compression === "hevc") {
    // The image library here decodes AV1-coded HEIF only; HEVC needs a decoder it does not include.
    throw new PhotoRejectedError("This HEIC photo is compressed in a way the server cannot read (HEVC). Save or export it as JPEG and upload that.");
  }
  const width = meta.width ?? 0;
  const height = meta.height ?? 0;
  if (width * height > MAX_PHOTO_PIXELS) {
    throw new PhotoRejectedError(
      `The photo is ${width} × ${height} pixels, more than the ${MAX_PHOTO_PIXELS / 1_000_000} megapixels allowed. Save a smaller copy and upload that.`,
    );
  }
}

/**
 * Checks an uploaded photo by its content, re-encodes it (turned upright from its EXIF orientation,
 * without any metadata: no GPS position, no camera serial number, no EXIF, XMP, IPTC or ICC data),
 * longest side at most 2000 px, as WebP, with a 480 px thumbnail; stores both and records the photo.
 * Throws PhotoRejectedError, with a message for the member, for a file that is not accepted.
 */
export async function storeUploadedPhoto(
  db: DbOrTx,
  input: { file: File; userId: number; caption?: string },
  store: Storage = storage(),
): Promise<StoredPhoto> {
  const { file, userId } = input;
  const caption = captionSchema.safeParse(input.caption ?? "");
  if (!caption.success) throw new PhotoRejectedError(caption.error.issues[0].message);
  if (file.size === 0) throw new PhotoRejectedError("The file is empty. Choose a photo to upload.");
  if (file.size > MAX_PHOTO_BYTES) throw new PhotoRejectedError(tooLargeMessage(file.size, MAX_PHOTO_BYTES));

  const bytes = new Uint8Array(await file.arrayBuffer());
  await checkPhoto(bytes);

  // limitInputPixels guards the decoder too, whatever the header said. Metadata is left out of the
  // output unless asked for (keepMetadata/withMetadata/keepExif), and nothing here asks for it.
  const upright = sharp(bytes, { limitInputPixels: MAX_PHOTO_PIXELS, failOn: "error" }).autoOrient();
  const encode = (side: number, quality: number) =>
    upright
      .clone()
      .resize({ width: side, height: side, fit: "inside", withoutEnlargement: true })
      .webp({ quality })
      .toBuffer({ resolveWithObject: true });
  let full: { data: Buffer; info: OutputInfo };
  let thumb: { data: Buffer; info: OutputInfo };
  try {
    [full, thumb] = await Promise.all([encode(PHOTO_MAX_SIDE_PX, 82), encode(THUMB_MAX_SIDE_PX, 75)]);
  } catch {
    throw new PhotoRejectedError(`This photo could not be read; the file may be damaged. Upload a ${ACCEPTED_LIST} photo.`);
  }

  const key = newStorageKey(new Date());
  const thumbKey = thumbnailKey(key);
  await Promise.all([
    store.putObject(key, full.data, STORED_CONTENT_TYPE),
    store.putObject(thumbKey, thumb.data, STORED_CONTENT_TYPE),
  ]);
  let id: number;
  try {
    const [row] = await db
      .insert(s.photos)
      .values({
        storageKey: key,
        uploadedBy: userId,
        contentType: STORED_CONTENT_TYPE,
        widthPx: full.info.width,
        heightPx: full.info.height,
        bytes: full.data.length,
        caption: caption.data,
      })
      .returning({ id: s.photos.id });
    id = row.id;
  } catch (error) {
    // No row, no photo: take the objects back out of the store (they could not be reached anyway).
    await Promise.allSettled([store.deleteObject(key), store.deleteObject(thumbKey)]);
    throw error;
  }
  return {
    id,
    storageKey: key,
    url: mediaUrl(key),
    thumbUrl: mediaUrl(thumbKey),
    widthPx: full.info.width,
    heightPx: full.info.height,
  };
}

export type PhotoUpload = {
  /** The form's fields (and the photo, when one was accepted). */
  formData: FormData;
  /** The photo, or null when none was chosen or it was refused. */
  file: File | null;
  /** Why the photo was refused, for the member, shown beside the field; null when it was not. */
  error: string | null;
};

/**
 * Reads a multipart form with one photo in `fieldName`, streaming, with a size limit. A photo over
 * `maxBytes` (and up to twice that) is dropped with a message while the other fields are kept, so
 * the form can be shown again as it was typed. A photo larger still stops the reading at once, to
 * spare the server's memory; the message comes back then, but not the fields.
 */
export async function parsePhotoUpload(
  request: Request,
  options: { maxBytes?: number; fieldName?: string } = {},
): Promise<PhotoUpload> {
  const maxBytes = options.maxBytes ?? MAX_PHOTO_BYTES;
  const fieldName = options.fieldName ?? "photo";
  const hardLimit = 2 * maxBytes;
  checkFormType(request);
  let file: File | null = null;
  let error: string | null = null;
  try {
    const formData = await parseFormData(request, { maxFiles: 1, maxFileSize: hardLimit }, (upload) => {
      if (upload.fieldName !== fieldName) return null;
      // An empty file input is sent as a part with no content (and no file name, from a browser).
      if (upload.size === 0) return null;
      if (upload.size > maxBytes) {
        error = tooLargeMessage(upload.size, maxBytes);
        return null;
      }
      file = upload;
      return upload;
    });
    checkFormValues(request, formData);
    return { formData, file, error };
  } catch (e) {
    if (e instanceof MaxFileSizeExceededError) {
      return { formData: new FormData(), file: null, error: tooLargeMessage(null, maxBytes) };
    }
    if (e instanceof MaxFilesExceededError) {
      return { formData: new FormData(), file: null, error: "Send one photo at a time." };
    }
    if (e instanceof FormDataParseError || e instanceof MultipartParseError) {
      return { formData: new FormData(), file: null, error: "The form could not be read. Please send it again." };
    }
    throw e;
  }
}
