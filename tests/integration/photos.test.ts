// Photo uploads against a real PostgreSQL and a real S3 server (the stand-in, in this process).
import fs from "node:fs";
import os from "node:os";
import path from "node:path";
import { crc32, deflateSync } from "node:zlib";
import { eq, sql } from "drizzle-orm";
import sharp from "sharp";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import * as s from "~/db/schema";
import { loader as mediaLoader } from "~/routes/media.$";
import {
  MAX_PHOTO_BYTES, parsePhotoUpload, PhotoRejectedError, storeUploadedPhoto, thumbnailKey,
} from "~/services/photos.server";
import { storage } from "~/services/storage.server";
import { startS3Standin } from "../../scripts/s3-standin";
import { createTestDatabase } from "../support/db";

let t: Awaited<ReturnType<typeof createTestDatabase>>;
let standin: Awaited<ReturnType<typeof startS3Standin>>;
let dir: string;
let userId: number;

beforeAll(async () => {
  t = await createTestDatabase("template_seeded");
  dir = fs.mkdtempSync(path.join(os.tmpdir(), "sistership-photos-s3-"));
  standin = await startS3Standin({ port: 0, dir, bucket: "photos-under-test" });
  // The app's store reads these when first used, which is after this.
  Object.assign(process.env, {
    S3_ENDPOINT: standin.endpoint,
    S3_REGION: "us-east-1",
    S3_BUCKET: "photos-under-test",
    S3_ACCESS_KEY_ID: "S3RVER",
    S3_SECRET_ACCESS_KEY: "S3RVER",
  });
  const [user] = await t.db.select({ id: s.users.id }).from(s.users).orderBy(s.users.id).limit(1);
  userId = user.id;
});
afterAll(async () => {
  storage().close();
  await standin?.close();
  await t?.drop();
  if (dir) fs.rmSync(dir, { recursive: true, force: true });
});

// ---------------------------------------------------------------------------------------------
// EXIF, written by hand so that the test knows exactly what the upload carries.
// Layout: CIPA DC-008-2023 / JEITA CP-3451 (Exif 3.0), §4.5.4: an APP1 segment (marker 0xFFE1)
// holding "Exif\0\0" and a TIFF structure (TIFF 6.0, §2: byte order "II", 42, offset of IFD0).
// Tags used (Exif 3.0, §4.6): Make 0x010F, Orientation 0x0112, Exif IFD pointer 0x8769,
// GPS Info IFD pointer 0x8825; in the Exif IFD, ExifVersion 0x9000 and BodySerialNumber 0xA431;
// in the GPS IFD (§4.6.6), GPSVersionID 0x0000, GPSLatitudeRef 0x0001, GPSLatitude 0x0002,
// GPSLongitudeRef 0x0003, GPSLongitude 0x0004.
// ---------------------------------------------------------------------------------------------
const TAG = {
  make: 0x010f, orientation: 0x0112, exifIfd: 0x8769, gpsIfd: 0x8825,
  exifVersion: 0x9000, bodySerialNumber: 0xa431,
  gpsVersionId: 0x0000, gpsLatitudeRef: 0x0001, gpsLatitude: 0x0002, gpsLongitudeRef: 0x0003, gpsLongitude: 0x0004,
} as const;
const TYPE = { byte: 1, ascii: 2, short: 3, long: 4, rational: 5, undefined: 7 } as const;
type Entry = { tag: number; type: number; count: number; value: Buffer };

const ascii = (tag: number, text: string): Entry => ({ tag, type: TYPE.ascii, count: text.length + 1, value: Buffer.from(`${text}\0`, "latin1") });
const short = (tag: number, n: number): Entry => {
  const value = Buffer.alloc(2);
  value.writeUInt16LE(n);
  return { tag, type: TYPE.short, count: 1, value };
};
const long = (tag: number, n: number): Entry => {
  const value = Buffer.alloc(4);
  value.writeUInt32LE(n);
  return { tag, type: TYPE.long, count: 1, value };
};
/** Degrees, minutes, seconds as three RATIONALs (numerator/denominator). */
const dms = (tag: number, [d, m, sec]: [number, number, number]): Entry => {
  const value = Buffer.alloc(24);
  [[d, 1], [m, 1], [Math.round(sec * 100), 100]].forEach(([num, den], i) => {
    value.writeUInt32LE(num, i * 8);
    value.writeUInt32LE(den, i * 8 + 4);
  });
  return { tag, type: TYPE.rational, count: 3, value };
};

const ifdSize = (entries: Entry[]) =>
  2 + entries.length * 12 + 4 + entries.reduce((n, e) => n + (e.value.length > 4 ? e.value.length + (e.value.length % 2) : 0), 0);

/** One IFD starting at `start` (from the TIFF header), its out-of-line values right after it. */
function writeIfd(entries: Entry[], start: number): Buffer {
  const sorted = [...entries].sort((a, b) => a.tag - b.tag);
  const head = Buffer.alloc(2 + sorted.length * 12 + 4);
  const data: Buffer[] = [];
  let dataOffset = start + head.length;
  head.writeUInt16LE(sorted.length, 0);
  sorted.forEach((e, i) => {
    const at = 2 + i * 12;
    head.writeUInt16LE(e.tag, at);
    head.writeUInt16LE(e.type, at + 2);
    head.writeUInt32LE(e.count, at + 4);
    if (e.value.length <= 4) {
      e.value.copy(head, at + 8);
    } else {
      head.writeUInt32LE(dataOffset, at + 8);
      const padded = e.value.length % 2 ? Buffer.concat([e.value, Buffer.alloc(1)]) : e.value;
      data.push(padded);
      dataOffset += padded.length;
    }
  });
  return Buffer.concat([head, ...data]); // next-IFD offset stays 0: no IFD1
}

const SERIAL = "DEMO-CAM-0047113";
const LATITUDE: [number, number, number] = [44, 12, 30.5];
const LONGITUDE: [number, number, number] = [76, 29, 10.25];

/** An APP1 Exif payload with an orientation, a camera serial number and a GPS position. */
function exifPayload(orientation: number): Buffer {
  const exifEntries = [
    { tag: TAG.exifVersion, type: TYPE.undefined, count: 4, value: Buffer.from("0232", "latin1") },
    ascii(TAG.bodySerialNumber, SERIAL),
  ];
  const gpsEntries = [
    { tag: TAG.gpsVersionId, type: TYPE.byte, count: 4, value: Buffer.from([2, 3, 0, 0]) },
    ascii(TAG.gpsLatitudeRef, "N"),
    dms(TAG.gpsLatitude, LATITUDE),
    ascii(TAG.gpsLongitudeRef, "W"),
    dms(TAG.gpsLongitude, LONGITUDE),
  ];
  const ifd0Entries = (exifAt: number, gpsAt: number) => [
    ascii(TAG.make, "Demo Camera Works"),
    short(TAG.orientation, orientation),
    long(TAG.exifIfd, exifAt),
    long(TAG.gpsIfd, gpsAt),
  ];
  const exifAt = 8 + ifdSize(ifd0Entries(0, 0));
  const gpsAt = exifAt + ifdSize(exifEntries);
  const header = Buffer.from([0x49, 0x49, 42, 0, 8, 0, 0, 0]); // "II", 42, IFD0 at 8
  return Buffer.concat([
    Buffer.from("Exif\0\0", "latin1"),
    header,
    writeIfd(ifd0Entries(exifAt, gpsAt), 8),
    writeIfd(exifEntries, exifAt),
    writeIfd(gpsEntries, gpsAt),
  ]);
}

/** The JPEG with an APP1 segment inserted right after SOI (0xFFD8), as cameras write it. */
function withApp1(jpeg: Buffer, payload: Buffer): Buffer {
  expect(jpeg.subarray(0, 2)).toEqual(Buffer.from([0xff, 0xd8]));
  const length = Buffer.alloc(2);
  length.writeUInt16BE(payload.length + 2); // the length counts itself, not the marker
  return Buffer.concat([jpeg.subarray(0, 2), Buffer.from([0xff, 0xe1]), length, payload, jpeg.subarray(2)]);
}

/** The tags of IFD0, the Exif IFD and the GPS IFD of an "Exif\0\0" + TIFF payload. */
function readExifTags(payload: Buffer) {
  expect(payload.subarray(0, 6).toString("latin1")).toBe("Exif\0\0");
  const tiff = payload.subarray(6);
  const le = tiff.toString("latin1", 0, 2) === "II";
  const u16 = (at: number) => (le ? tiff.readUInt16LE(at) : tiff.readUInt16BE(at));
  const u32 = (at: number) => (le ? tiff.readUInt32LE(at) : tiff.readUInt32BE(at));
  const entries = (at: number) =>
    Array.from({ length: u16(at) }, (_, i) => ({ tag: u16(at + 2 + i * 12), at: at + 2 + i * 12 }));
  const ifd0 = entries(u32(4));
  const pointer = (tag: number) => ifd0.find((e) => e.tag === tag);
  const exif = pointer(TAG.exifIfd);
  const gps = pointer(TAG.gpsIfd);
  const gpsEntries = gps ? entries(u32(gps.at + 8)) : [];
  const rationals = (tag: number) => {
    const e = gpsEntries.find((g) => g.tag === tag);
    if (!e) return null;
    const at = u32(e.at + 8);
    return [0, 1, 2].map((i) => u32(at + i * 8) / u32(at + i * 8 + 4));
  };
  return {
    ifd0: ifd0.map((e) => e.tag),
    exif: exif ? entries(u32(exif.at + 8)).map((e) => e.tag) : [],
    gps: gpsEntries.map((e) => e.tag),
    latitude: rationals(TAG.gpsLatitude),
  };
}

/** The chunk ids of a WebP file (RFC 9649, §2: a RIFF container, "WEBP", then chunks). */
function webpChunks(file: Buffer): string[] {
  expect(file.toString("latin1", 0, 4)).toBe("RIFF");
  expect(file.toString("latin1", 8, 12)).toBe("WEBP");
  const ids: string[] = [];
  for (let at = 12; at + 8 <= file.length;) {
    const size = file.readUInt32LE(at + 4);
    ids.push(file.toString("latin1", at, at + 4));
    at += 8 + size + (size % 2); // chunks are padded to an even size
  }
  return ids;
}

/** A photo 300 × 200 as stored by the camera: left half red, right half blue. */
async function redLeftBlueRight(): Promise<Buffer> {
  const blue = await sharp({ create: { width: 150, height: 200, channels: 3, background: "#0000ff" } }).png().toBuffer();
  return sharp({ create: { width: 300, height: 200, channels: 3, background: "#ff0000" } })
    .composite([{ input: blue, left: 150, top: 0 }])
    .jpeg({ quality: 92 })
    .toBuffer();
}

async function pixel(image: Buffer, x: number, y: number) {
  const { data, info } = await sharp(image).removeAlpha().raw().toBuffer({ resolveWithObject: true });
  const at = (y * info.width + x) * info.channels;
  return { r: data[at], g: data[at + 1], b: data[at + 2] };
}

async function fetchObject(key: string): Promise<Buffer> {
  const object = await storage().getObject(key);
  expect(object, `object ${key}`).not.toBeNull();
  return Buffer.from(await new Response(object!.body).arrayBuffer());
}

const photoCount = async () =>
  (await t.db.execute<{ n: number }>(sql`select count(*)::int as n from photos`)).rows[0].n;

async function refusal(file: File): Promise<string> {
  const before = await photoCount();
  const error = await storeUploadedPhoto(t.db, { file, userId, caption: "" }).then(
    () => null,
    (e: unknown) => e,
  );
  expect(error).toBeInstanceOf(PhotoRejectedError);
  expect(await photoCount()).toBe(before); // nothing recorded
  return (error as Error).message;
}

function callMedia(key: string) {
  const request = new Request(`http://127.0.0.1/media/${key}`);
  return mediaLoader({ request, params: { "*": key }, context: {} } as unknown as Parameters<typeof mediaLoader>[0]);
}

describe("storing an uploaded photo", () => {
  it("strips the GPS position, the serial number and all other metadata, and turns the photo upright", async () => {
    // Orientation 6: "the 0th row is the visual right-hand side of the image, and the 0th column
    // is the visual top" (Exif 3.0, Orientation tag): shown turned 90° clockwise, left becomes top.
    const upload = withApp1(await redLeftBlueRight(), exifPayload(6));
    const before = await sharp(upload).metadata();
    // What goes in carries it all, as read back by the image library itself.
    expect(before.orientation).toBe(6);
    const tagsIn = readExifTags(before.exif!);
    expect(tagsIn.ifd0).toEqual(expect.arrayContaining([TAG.make, TAG.orientation, TAG.exifIfd, TAG.gpsIfd]));
    expect(tagsIn.exif).toContain(TAG.bodySerialNumber);
    expect(tagsIn.gps).toEqual(expect.arrayContaining([TAG.gpsLatitudeRef, TAG.gpsLatitude, TAG.gpsLongitudeRef, TAG.gpsLongitude]));
    expect(tagsIn.latitude).toEqual([44, 12, 30.5]);
    expect(upload.includes(SERIAL)).toBe(true);

    const file = new File([new Uint8Array(upload)], "hull-17-lazarette.jpg", { type: "image/jpeg" });
    const photo = await storeUploadedPhoto(t.db, { file, userId, caption: "  Lazarette, port side  " });
    expect(photo.url).toBe(`/media/${photo.storageKey}`);
    expect(photo.storageKey).toMatch(/^photos\/\d{4}\/[A-Za-z0-9_-]{22}\.webp$/);
    expect(photo.thumbUrl).toBe(`/media/${thumbnailKey(photo.storageKey)}`);
    expect(thumbnailKey(photo.storageKey)).toMatch(/\.thumb\.webp$/);

    const stored = await fetchObject(photo.storageKey);
    const after = await sharp(stored).metadata();
    expect(after.format).toBe("webp");
    // No EXIF (hence no GPS IFD, no serial number), no XMP, no IPTC, no ICC profile.
    expect(after.exif).toBeUndefined();
    expect(after.xmp).toBeUndefined();
    expect(after.iptc).toBeUndefined();
    expect(after.icc).toBeUndefined();
    expect(after.orientation).toBeUndefined();
    // The container itself has only image chunks: no 'EXIF', 'XMP ' or 'ICCP' chunk (RFC 9649, §2.7).
    expect(webpChunks(stored).filter((id) => !["VP8 ", "VP8L", "VP8X", "ALPH"].includes(id))).toEqual([]);
    expect(stored.includes(SERIAL)).toBe(false);
    expect(stored.includes(Buffer.from("Exif\0\0", "latin1"))).toBe(false);

    // Upright: 200 wide, 300 high, red on top and blue below.
    expect([after.width, after.height]).toEqual([200, 300]);
    const top = await pixel(stored, 100, 40);
    const bottom = await pixel(stored, 100, 260);
    expect(top.r).toBeGreaterThan(200);
    expect(top.b).toBeLessThan(60);
    expect(bottom.b).toBeGreaterThan(200);
    expect(bottom.r).toBeLessThan(60);

    const [row] = await t.db.select().from(s.photos).where(eq(s.photos.id, photo.id));
    expect(row).toMatchObject({
      storageKey: photo.storageKey, uploadedBy: userId, contentType: "image/webp",
      widthPx: 200, heightPx: 300, bytes: stored.length, caption: "Lazarette, port side",
    });

    // The thumbnail is stripped and upright too.
    const thumb = await fetchObject(thumbnailKey(photo.storageKey));
    const thumbMeta = await sharp(thumb).metadata();
    expect(thumbMeta.exif).toBeUndefined();
    expect([thumbMeta.format, thumbMeta.width, thumbMeta.height]).toEqual(["webp", 200, 300]);
  });

  it("keeps the longest side at 2000 px and makes a 480 px thumbnail", async () => {
    const png = await sharp({ create: { width: 3000, height: 1500, channels: 3, background: "#2a6f97" } }).png().toBuffer();
    const photo = await storeUploadedPhoto(t.db, { file: new File([png], "cockpit.png", { type: "image/png" }), userId });
    expect([photo.widthPx, photo.heightPx]).toEqual([2000, 1000]);
    const full = await sharp(await fetchObject(photo.storageKey)).metadata();
    expect([full.format, full.width, full.height]).toEqual(["webp", 2000, 1000]);
    const thumb = await sharp(await fetchObject(thumbnailKey(photo.storageKey))).metadata();
    expect([thumb.format, thumb.width, thumb.height]).toEqual(["webp", 480, 240]);
  });

  it("accepts WebP and HEIF (AV1-coded) photos, read by their content", async () => {
    const base = await redLeftBlueRight();
    const webp = await sharp(base).webp().toBuffer();
    const heif = await sharp(base).heif({ compression: "av1" }).toBuffer();
    // Names and declared types that say otherwise do not matter.
    for (const [bytes, name] of [[webp, "a.jpg"], [heif, "b.heic"]] as const) {
      const photo = await storeUploadedPhoto(t.db, { file: new File([bytes], name, { type: "application/octet-stream" }), userId });
      const meta = await sharp(await fetchObject(photo.storageKey)).metadata();
      expect([meta.format, meta.width, meta.height]).toEqual(["webp", 300, 200]);
    }
  });

  it("refuses a file that is not a photo, whatever its name says", async () => {
    const text = new File(["Lazarette: 410 mm deep, 380 mm wide.\n"], "lazarette.jpg", { type: "image/jpeg" });
    expect(await refusal(text)).toBe("This file is not a photo that can be read. Upload a JPEG, PNG, WebP or HEIC photo.");
  });

  it("refuses images of other formats, such as SVG", async () => {
    const svg = '<svg xmlns="http://www.w3.org/2000/svg" width="40" height="40"><rect width="40" height="40" fill="red"/></svg>';
    const file = new File([svg], "diagram.png", { type: "image/png" });
    expect(await refusal(file)).toBe("SVG files are not accepted. Upload a JPEG, PNG, WebP or HEIC photo.");
  });

  it("refuses a file over 15 MB before reading it", async () => {
    expect(MAX_PHOTO_BYTES).toBe(15 * 1024 * 1024);
    const file = new File([new Uint8Array(MAX_PHOTO_BYTES + 1)], "huge.jpg", { type: "image/jpeg" });
    expect(await refusal(file)).toBe("The photo is 15.1 MB; a photo may be at most 15 MB. Save a smaller copy and upload that.");
    // At the limit, the size is no reason to refuse (these bytes are refused for what they are).
    const atLimit = new File([new Uint8Array(MAX_PHOTO_BYTES)], "limit.jpg", { type: "image/jpeg" });
    expect(await refusal(atLimit)).toMatch(/^This file is not a photo/);
  });

  it("refuses a photo over 40 megapixels from its header, without decoding it", async () => {
    // A PNG of a few bytes that announces 8000 × 5001 pixels (PNG, ISO/IEC 15948: signature, then
    // chunks of length, type, data and CRC-32 of type and data; IHDR first, IEND last).
    const chunk = (type: string, data: Buffer) => {
      const length = Buffer.alloc(4);
      length.writeUInt32BE(data.length);
      const body = Buffer.concat([Buffer.from(type, "latin1"), data]);
      const crc = Buffer.alloc(4);
      crc.writeUInt32BE(crc32(body));
      return Buffer.concat([length, body, crc]);
    };
    const ihdr = Buffer.alloc(13);
    ihdr.writeUInt32BE(8000, 0);
    ihdr.writeUInt32BE(5001, 4);
    ihdr.set([8, 2, 0, 0, 0], 8); // 8 bits, truecolour, deflate, no filter method 0, no interlace
    const png = Buffer.concat([
      Buffer.from([0x89, 0x50, 0x4e, 0x47, 0x0d, 0x0a, 0x1a, 0x0a]),
      chunk("IHDR", ihdr),
      chunk("IDAT", deflateSync(Buffer.alloc(64))),
      chunk("IEND", Buffer.alloc(0)),
    ]);
    expect(png.length).toBeLessThan(200);
    const meta = await sharp(png).metadata();
    expect([meta.format, meta.width, meta.height]).toEqual(["png", 8000, 5001]);
    expect(await refusal(new File([png], "bomb.png", { type: "image/png" }))).toBe(
      "The photo is 8000 × 5001 pixels, more than the 40 megapixels allowed. Save a smaller copy and upload that.",
    );
  });

  it("refuses an HEVC-coded HEIC photo with a way out, since the image library here cannot decode HEVC", async () => {
    // The smallest HEIF container (ISO/IEC 23008-12) sharp reads the header of: 'ftyp' brand heic,
    // a 'meta' box with one 'hvc1' item, its 'hvcC' (ISO/IEC 14496-15, §8.3.3) and 'ispe' size.
    const u8 = (n: number) => Buffer.from([n]);
    const u16 = (n: number) => { const b = Buffer.alloc(2); b.writeUInt16BE(n); return b; };
    const u32 = (n: number) => { const b = Buffer.alloc(4); b.writeUInt32BE(n); return b; };
    const box = (type: string, ...parts: Buffer[]) => {
      const body = Buffer.concat(parts);
      return Buffer.concat([u32(8 + body.length), Buffer.from(type, "latin1"), body]);
    };
    const full = (type: string, version: number, ...parts: Buffer[]) => box(type, u8(version), Buffer.alloc(3), ...parts);
    const payload = Buffer.alloc(16);
    const meta = (dataAt: number) => full("meta", 0,
      full("hdlr", 0, u32(0), Buffer.from("pict"), Buffer.alloc(12), u8(0)),
      full("pitm", 0, u16(1)),
      full("iloc", 0, Buffer.from([0x44, 0x00]), u16(1), u16(1), u16(0), u16(1), u32(dataAt), u32(payload.length)),
      full("iinf", 0, u16(1), full("infe", 2, u16(1), u16(0), Buffer.from("hvc1"), u8(0))),
      box("iprp",
        box("ipco",
          box("hvcC", Buffer.from([1, 0x01, 0x60, 0, 0, 0, 0x90, 0, 0, 0, 0, 0, 0x5d, 0xf0, 0, 0xfc, 0xfd, 0xf8, 0xf8, 0, 0, 0x0f, 0])),
          full("ispe", 0, u32(4032), u32(3024))),
        full("ipma", 0, u32(1), u16(1), u8(2), u8(0x81), u8(0x02))));
    const ftyp = box("ftyp", Buffer.from("heic"), u32(0), Buffer.from("mif1heic"));
    const heic = Buffer.concat([ftyp, meta(ftyp.length + meta(0).length + 8), box("mdat", payload)]);
    const header = await sharp(heic).metadata();
    expect([header.format, header.compression, header.width, header.height]).toEqual(["heif", "hevc", 4032, 3024]);
    expect(await refusal(new File([heic], "IMG_0001.HEIC", { type: "image/heic" }))).toBe(
      "This HEIC photo is compressed in a way the server cannot read (HEVC). Save or export it as JPEG and upload that.",
    );
  });

  it("refuses a caption over 300 characters", async () => {
    const png = await sharp({ create: { width: 10, height: 10, channels: 3, background: "#ffffff" } }).png().toBuffer();
    const error = await storeUploadedPhoto(t.db, { file: new File([png], "a.png"), userId, caption: "x".repeat(301) }).catch((e: unknown) => e);
    expect(error).toBeInstanceOf(PhotoRejectedError);
    expect((error as Error).message).toBe("A caption may be at most 300 characters.");
  });
});

describe("GET /media/*", () => {
  it("serves a stored photo with its content type, for ever cacheable, not to be sniffed", async () => {
    const photo = await storeUploadedPhoto(t.db, { file: new File([new Uint8Array(await redLeftBlueRight())], "a.jpg"), userId });
    const response = await callMedia(photo.storageKey);
    expect(response.status).toBe(200);
    expect(response.headers.get("Content-Type")).toBe("image/webp");
    expect(response.headers.get("Cache-Control")).toBe("public, max-age=31536000, immutable");
    expect(response.headers.get("X-Content-Type-Options")).toBe("nosniff");
    const body = Buffer.from(await response.arrayBuffer());
    expect(body.equals(await fetchObject(photo.storageKey))).toBe(true);
    expect(response.headers.get("Content-Length")).toBe(String(body.length));

    const thumb = await callMedia(thumbnailKey(photo.storageKey));
    expect(thumb.status).toBe(200);
    expect((await sharp(Buffer.from(await thumb.arrayBuffer())).metadata()).format).toBe("webp");
  });

  it("answers 404 for a key that is not there, and for objects that are not photos", async () => {
    const missing = await callMedia("photos/2024/AAAAAAAAAAAAAAAAAAAAAA.webp");
    expect(missing.status).toBe(404);
    expect(missing.headers.get("X-Content-Type-Options")).toBe("nosniff");
    // Something else in the bucket (put there by hand) is not served.
    await storage().putObject("notes/readme.html", new TextEncoder().encode("<p>hi</p>"), "text/html");
    expect((await fetchObject("notes/readme.html")).toString()).toBe("<p>hi</p>");
    expect((await callMedia("notes/readme.html")).status).toBe(404);
    expect((await callMedia("photos/2024/../../notes/readme.html")).status).toBe(404);
  });
});

describe("reading an upload form", () => {
  const MB = 1024 * 1024;
  const form = (photo: File | null, extra: File | null = null) => {
    const fd = new FormData();
    fd.append("title", "Lazarette shelf");
    if (photo) fd.append("photo", photo);
    if (extra) fd.append("second", extra);
    fd.append("caption", "Port side, looking aft");
    return new Request("http://127.0.0.1/photos/new", { method: "POST", body: fd });
  };

  it("returns the photo and the typed fields", async () => {
    const jpeg = await redLeftBlueRight();
    const upload = await parsePhotoUpload(form(new File([new Uint8Array(jpeg)], "shelf.jpg", { type: "image/jpeg" })), { maxBytes: MB });
    expect(upload.error).toBeNull();
    expect(upload.file?.name).toBe("shelf.jpg");
    expect(upload.file?.size).toBe(jpeg.length);
    expect(upload.formData.get("title")).toBe("Lazarette shelf");
    expect(upload.formData.get("caption")).toBe("Port side, looking aft");
    const photo = await storeUploadedPhoto(t.db, { file: upload.file!, userId, caption: String(upload.formData.get("caption")) });
    expect([photo.widthPx, photo.heightPx]).toEqual([300, 200]);
  });

  it("drops a photo over the limit with a message and keeps the typed fields, also those after it", async () => {
    const upload = await parsePhotoUpload(form(new File([new Uint8Array(1.5 * MB)], "big.jpg")), { maxBytes: MB });
    expect(upload.file).toBeNull();
    expect(upload.error).toBe("The photo is 1.5 MB; a photo may be at most 1 MB. Save a smaller copy and upload that.");
    expect(upload.formData.get("title")).toBe("Lazarette shelf");
    expect(upload.formData.get("caption")).toBe("Port side, looking aft");
    expect(upload.formData.get("photo")).toBeNull();
  });

  it("stops reading a photo over twice the limit, with a message", async () => {
    const upload = await parsePhotoUpload(form(new File([new Uint8Array(3 * MB)], "huge.jpg")), { maxBytes: MB });
    expect(upload.file).toBeNull();
    expect(upload.error).toBe("The photo is too large; a photo may be at most 1 MB. Save a smaller copy and upload that.");
  });

  it("takes an empty file input as no photo", async () => {
    const upload = await parsePhotoUpload(form(new File([], "")), { maxBytes: MB });
    expect(upload).toMatchObject({ file: null, error: null });
    expect(upload.formData.get("caption")).toBe("Port side, looking aft");
  });

  it("refuses a second file", async () => {
    const a = new File([new Uint8Array(10)], "a.jpg");
    const upload = await parsePhotoUpload(form(a, new File([new Uint8Array(10)], "b.jpg")), { maxBytes: MB });
    expect(upload).toMatchObject({ file: null, error: "Send one photo at a time." });
  });
});
