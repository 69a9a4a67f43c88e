import { getFormProps, useForm } from "@conform-to/react";
import { getZodConstraint, parseWithZod } from "@conform-to/zod/v4";
import { data, Form } from "react-router";
import type { Route } from "./+types/forgot-password";
import { buttonClass, FormMessage, Honeypot, Notice, TextField } from "~/components/ui/field";
import { db } from "~/db/index.server";
import { forgotPasswordSchema } from "~/domain/account-forms";
import { queueResetEmail } from "~/models/account-emails.server";
import { clientAddress, hitLimit, LIMITS } from "~/models/rate-limits.server";
import { issueToken } from "~/models/tokens.server";
import { findUserByEmail } from "~/models/users.server";
import { env } from "~/services/env.server";
import { kickOutbox } from "~/services/outbox-worker.server";
import { readForm } from "~/services/form-body.server";

export function meta() {
  return [{ title: "Reset your password · Sistership" }];
}

/** The same answer whether or not an account uses the address. */
export const RESET_SENT = "If an account uses that address, we have sent it a link to choose a new password. It works once, for an hour.";

export async function action({ request }: Route.ActionArgs) {
  const submission = parseWithZod(await readForm(request), { schema: forgotPasswordSchema });
  if (submission.status !== "success") return data({ result: submission.reply(), sent: false }, { status: 400 });
  const { email } = submission.value;
  for (const [key, limit] of [
    [`reset:address:${clientAddress(request)}`, LIMITS.resetPerAddress],
    [`reset:account:${email}`, LIMITS.resetPerAccount],
  ] as const) {
    const verdict = await hitLimit(db, key, limit);
    if (!verdict.allowed) {
      return data(
        { result: submission.reply({ formErrors: ["Too many reset requests. Wait an hour and try again."] }), sent: false },
        { status: 429, headers: { "Retry-After": String(verdict.retryAfterSeconds) } },
      );
    }
  }
  const user = await findUserByEmail(db, email);
  if (user) {
    await db.transaction(async (tx) => {
      const token = await issueToken(tx, user.id, "reset_password");
      await queueResetEmail(tx, user.email, user.displayName, `${env.APP_URL}/reset-password?token=${token}`);
    });
    kickOutbox();
  }
  return { result: submission.reply({ resetForm: true }), sent: true };
}

export default function ForgotPassword({ actionData }: Route.ComponentProps) {
  const [form, fields] = useForm({
    lastResult: actionData?.result,
    constraint: getZodConstraint(forgotPasswordSchema),
    onValidate: ({ formData }) => parseWithZod(formData, { schema: forgotPasswordSchema }),
    shouldValidate: "onBlur",
  });
  return (
    <div className="mx-auto max-w-md">
      <h1 className="text-step-3 font-semibold">Reset your password</h1>
      <p className="mt-2 text-ink-soft">Type the e-mail address of your account and we will send you a link to choose a new password.</p>
      {actionData?.sent && <div className="mt-6"><Notice>{RESET_SENT}</Notice></div>}
      <Form method="post" {...getFormProps(form)} className="relative mt-6 space-y-4">
        <FormMessage id={form.errorId} errors={form.errors} />
        <Honeypot />
        <TextField field={fields.email} label="E-mail address" type="email" autoComplete="email" />
        <button type="submit" className={buttonClass}>Send me a link</button>
      </Form>
    </div>
  );
}
