// Reading a posted form. A body that is not a form (JSON, plain text, no content type), a form that
// cannot be parsed (a broken multipart body) or one that holds a NUL character (which PostgreSQL
// cannot store in text) is answered with a 4xx and a message, never a 500: JSON { error, message }
// under /api/, otherwise the message on the error page.
import { data } from "react-router";

const FORM_TYPE = /^\s*(application\/x-www-form-urlencoded|multipart\/form-data)\s*(;|$)/i;

function refusal(request: Request, status: number, message: string) {
  if (new URL(request.url).pathname.startsWith("/api/")) {
    return Response.json({ error: status === 415 ? "not-a-form" : "unreadable-form", message }, { status });
  }
  return data(message, { status });
}

/** Throws when the request does not carry a form (before any body is read). */
export function checkFormType(request: Request): void {
  if (!FORM_TYPE.test(request.headers.get("content-type") ?? "")) {
    throw refusal(request, 415, "This address takes a form (application/x-www-form-urlencoded or multipart/form-data). Send it again from the page.");
  }
  if (/^\s*multipart\//i.test(request.headers.get("content-type") ?? "") && !/;\s*boundary=/i.test(request.headers.get("content-type") ?? "")) {
    throw refusal(request, 400, "The form could not be read (a multipart body needs a boundary). Send it again from the page.");
  }
}

/** Throws when a field holds a character that cannot be stored. */
export function checkFormValues(request: Request, form: FormData): void {
  for (const [name, value] of form.entries()) {
    if (typeof value === "string" && value.includes("\u0000")) {
      throw refusal(request, 400, `The field “${name.slice(0, 40)}” holds a NUL character, which cannot be stored. Remove it and send the form again.`);
    }
  }
}

/** The posted form, or a thrown 4xx answer that says what is wrong with it. */
export async function readForm(request: Request): Promise<FormData> {
  checkFormType(request);
  let form: FormData;
  try {
    form = await request.formData();
  } catch {
    throw refusal(request, 400, "The form could not be read: it arrived incomplete or malformed. Send it again from the page.");
  }
  checkFormValues(request, form);
  return form;
}

/** Throws when the address holds a NUL (%00): no page, parameter or slug here can contain one. */
export function checkAddress(request: Request): void {
  const url = new URL(request.url);
  if (/%00/.test(url.pathname + url.search)) {
    throw refusal(request, 400, "This address holds a NUL character (%00), which no page or parameter here can contain. Check the link.");
  }
}

/** Root middleware: refuses an address with a NUL before any route reads it (PostgreSQL cannot take one). */
export async function refuseUnreadableAddress({ request }: { request: Request }, next: () => Promise<Response>): Promise<Response> {
  checkAddress(request);
  return next();
}
