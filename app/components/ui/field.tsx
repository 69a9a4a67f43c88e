import type { FieldMetadata } from "@conform-to/react";
import { getInputProps } from "@conform-to/react";
import type { ReactNode } from "react";
import { FieldError, inputClass } from "./form-basics";

// The parts without conform live in ./form-basics.tsx; a page that has no conform form (the
// write-up page, the root's outage page) imports them from there, so conform stays out of its script.
export { buttonClass, FieldError, FormMessage, Honeypot, inputClass, Notice, quietButtonClass } from "./form-basics";

type InputType = "text" | "email" | "password" | "number" | "search" | "url" | "tel" | "date";

/** A labelled input bound to a conform field: its error sits right under it. */
export function TextField({
  field, label, type = "text", hint, autoComplete, inputMode,
}: {
  field: FieldMetadata<any>;
  label: ReactNode;
  type?: InputType;
  hint?: ReactNode;
  autoComplete?: string;
  inputMode?: "text" | "decimal" | "numeric" | "email";
}) {
  const props = getInputProps(field, { type, ariaDescribedBy: hint ? `${field.id}-hint` : undefined });
  return (
    <div>
      <label htmlFor={field.id} className="block font-medium text-ink">{label}</label>
      {hint && <p id={`${field.id}-hint`} className="text-step--1 text-ink-soft">{hint}</p>}
      <input {...props} key={props.key} autoComplete={autoComplete} inputMode={inputMode} className={`mt-1 ${inputClass}`} />
      <FieldError id={field.errorId} errors={field.errors} />
    </div>
  );
}

