import { data } from "react-router";
import type { Route } from "./+types/api.photos";
import { db } from "~/db/index.server";
import { parsePhotoUpload, PhotoRejectedError, storeUploadedPhoto } from "~/services/photos.server";
import { requireUser } from "~/services/session.server";

// POST /api/photos (multipart: photo, caption, alt): stores a member's photo for a write-up and
// answers with the Markdown that shows it.
export async function action({ request }: Route.ActionArgs) {
  const user = await requireUser(request);
  const upload = await parsePhotoUpload(request, { fieldName: "photo" });
  const caption = String(upload.formData.get("caption") ?? "").trim();
  const alt = String(upload.formData.get("alt") ?? "").trim();
  const errors: Record<string, string> = {};
  if (upload.error) errors.photo = upload.error;
  else if (!upload.file) errors.photo = "Choose a photo to upload.";
  if (alt.length < 3) errors.alt = "Describe what the photo shows, for readers who cannot see it.";
  if (alt.length > 200) errors.alt = "Use at most 200 characters.";
  if (caption.length < 3) errors.caption = "Give the photo a caption.";
  if (Object.keys(errors).length) return data({ ok: false as const, errors }, { status: 400 });
  try {
    const photo = await storeUploadedPhoto(db, { file: upload.file!, userId: user.id, caption });
    const safeAlt = alt.replace(/[[\]\\]/g, " ");
    const safeCaption = caption.replace(/["\\]/g, "'");
    return { ok: true as const, url: photo.url, thumbUrl: photo.thumbUrl, markdown: `![${safeAlt}](${photo.url} "${safeCaption}")` };
  } catch (error) {
    if (error instanceof PhotoRejectedError) return data({ ok: false as const, errors: { photo: error.message } }, { status: 400 });
    throw error;
  }
}
