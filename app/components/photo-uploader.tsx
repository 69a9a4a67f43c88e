import { useRef, useState } from "react";
import { FieldError, inputClass, quietButtonClass } from "./ui/field";

type Result = { ok: true; markdown: string } | { ok: false; errors: Record<string, string> };

/**
 * Uploads one photo with its caption and description, showing the upload's progress, and hands
 * back the Markdown that shows it. XMLHttpRequest, because fetch() cannot report upload progress.
 */
export function PhotoUploader({ onUploaded }: { onUploaded: (markdown: string) => void }) {
  const [open, setOpen] = useState(false);
  const [progress, setProgress] = useState<number | null>(null);
  const [errors, setErrors] = useState<Record<string, string>>({});
  const fileRef = useRef<HTMLInputElement>(null);
  const captionRef = useRef<HTMLInputElement>(null);
  const altRef = useRef<HTMLInputElement>(null);

  function upload() {
    const file = fileRef.current?.files?.[0];
    const fd = new FormData();
    if (file) fd.set("photo", file);
    fd.set("caption", captionRef.current?.value ?? "");
    fd.set("alt", altRef.current?.value ?? "");
    const xhr = new XMLHttpRequest();
    xhr.open("POST", "/api/photos");
    xhr.upload.onprogress = (e) => { if (e.lengthComputable) setProgress(Math.round((e.loaded / e.total) * 100)); };
    xhr.onload = () => {
      setProgress(null);
      let result: Result;
      try {
        result = JSON.parse(xhr.responseText) as Result;
      } catch {
        setErrors({ photo: `The upload failed (${xhr.status}). Try again.` });
        return;
      }
      if (result.ok) {
        onUploaded(result.markdown);
        setErrors({});
        if (fileRef.current) fileRef.current.value = "";
        if (captionRef.current) captionRef.current.value = "";
        if (altRef.current) altRef.current.value = "";
        setOpen(false);
      } else {
        setErrors(result.errors);
      }
    };
    xhr.onerror = () => { setProgress(null); setErrors({ photo: "The connection dropped during the upload. Your text is kept; try again." }); };
    setProgress(0);
    xhr.send(fd);
  }

  if (!open) {
    return <button type="button" className={`mt-2 ${quietButtonClass}`} onClick={() => setOpen(true)}>Add a photo</button>;
  }
  return (
    <div className="mt-3 space-y-3 rounded-md border border-cloth-200 bg-cloth-50 p-3" role="group" aria-label="Add a photo">
      <div>
        <label htmlFor="photo-file" className="block font-medium">Photo</label>
        <p className="text-step--1 text-ink-soft">JPEG, PNG or WebP, up to 15 MB. Location and camera data are removed before it is stored.</p>
        <input id="photo-file" ref={fileRef} type="file" accept="image/jpeg,image/png,image/webp,image/heic,image/heif" aria-invalid={errors.photo ? true : undefined} aria-describedby={errors.photo ? "photo-file-error" : undefined} />
        <FieldError id="photo-file-error" errors={errors.photo ? [errors.photo] : undefined} />
      </div>
      <div>
        <label htmlFor="photo-caption" className="block font-medium">Caption</label>
        <input id="photo-caption" ref={captionRef} type="text" className={inputClass} aria-invalid={errors.caption ? true : undefined} aria-describedby={errors.caption ? "photo-caption-error" : undefined} />
        <FieldError id="photo-caption-error" errors={errors.caption ? [errors.caption] : undefined} />
      </div>
      <div>
        <label htmlFor="photo-alt" className="block font-medium">What the photo shows (for readers who cannot see it)</label>
        <input id="photo-alt" ref={altRef} type="text" className={inputClass} aria-invalid={errors.alt ? true : undefined} aria-describedby={errors.alt ? "photo-alt-error" : undefined} />
        <FieldError id="photo-alt-error" errors={errors.alt ? [errors.alt] : undefined} />
      </div>
      {progress !== null && (
        <div>
          <label htmlFor="photo-progress" className="text-step--1">Uploading… {progress} %</label>
          <progress id="photo-progress" max={100} value={progress} className="block w-full" />
        </div>
      )}
      <div className="flex gap-2">
        <button type="button" className={quietButtonClass} onClick={upload} disabled={progress !== null}>Upload and insert</button>
        <button type="button" className={quietButtonClass} onClick={() => setOpen(false)}>Cancel</button>
      </div>
    </div>
  );
}
