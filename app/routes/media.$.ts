import { isPhotoKey } from "~/services/photos.server";
import { getObject } from "~/services/storage.server";
import type { Route } from "./+types/media.$";

// GET /media/<key>: a stored photo or thumbnail, straight from the object store.
export async function loader({ params }: Route.LoaderArgs) {
  const key = params["*"] ?? "";
  // Only keys of the photo store's own making; anything else is not ours to serve.
  const object = isPhotoKey(key) ? await getObject(key) : null;
  if (!object) {
    return new Response("No such photo.", {
      status: 404,
      headers: { "Content-Type": "text/plain; charset=utf-8", "X-Content-Type-Options": "nosniff", "Cache-Control": "no-store" },
    });
  }
  const headers = new Headers({
    "Content-Type": object.contentType,
    // Keys are random and never reused: what is under one never changes.
    "Cache-Control": "public, max-age=31536000, immutable",
    "X-Content-Type-Options": "nosniff",
    // Opened on its own, the response may run nothing and load nothing.
    "Content-Security-Policy": "default-src 'none'; sandbox",
  });
  if (object.contentLength !== null) headers.set("Content-Length", String(object.contentLength));
  return new Response(object.body, { headers });
}
