// The parts of a form that need no form library: the classes of fields and buttons, the message
// beside a field, the form's own message, the honeypot and the notice. Every page's script carries
// these (the outage page, which the root can show on any page, uses them); ./field.tsx adds the
// conform-bound fields.
import type { ReactNode } from "react";

export const inputClass =
  "w-full rounded-md border border-cloth-300 bg-white px-3 py-2.5 text-step-0 text-ink shadow-xs " +
  "aria-[invalid=true]:border-bootstripe-600 aria-[invalid=true]:bg-bootstripe-50";

export const buttonClass =
  "inline-flex items-center justify-center rounded-md bg-deep-700 px-4 py-2.5 font-medium text-cloth-50 hover:bg-deep-800 disabled:opacity-60";

export const quietButtonClass =
  "inline-flex items-center justify-center rounded-md border border-deep-200 bg-white px-3 py-2 font-medium text-deep-700 hover:border-deep-500";

export function FieldError({ id, errors }: { id: string; errors?: string[] }) {
  if (!errors?.length) return null;
  return (
    <p id={id} className="mt-1 text-step--1 font-medium text-bootstripe-600" role="alert">
      {errors.join(" ")}
    </p>
  );
}

/** The honeypot: hidden from people and from assistive technology; software that fills every field fills it. */
export function Honeypot() {
  return (
    <div aria-hidden="true" className="absolute -left-[9999px] h-px w-px overflow-hidden">
      <label htmlFor="website">Leave this field empty</label>
      <input id="website" name="website" type="text" tabIndex={-1} autoComplete="off" defaultValue="" />
    </div>
  );
}

export function FormMessage({ errors, id }: { errors?: string[]; id?: string }) {
  if (!errors?.length) return null;
  return (
    <div id={id} role="alert" className="rounded-md border-l-4 border-bootstripe-600 bg-bootstripe-50 p-3 text-bootstripe-800">
      {errors.join(" ")}
    </div>
  );
}

export function Notice({ children }: { children: ReactNode }) {
  return (
    <div role="status" className="rounded-md border-l-4 border-deep-500 bg-deep-50 p-3 text-deep-900">
      {children}
    </div>
  );
}
