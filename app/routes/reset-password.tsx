import { getFormProps, useForm } from "@conform-to/react";
import { getZodConstraint, parseWithZod } from "@conform-to/zod/v4";
import { data, Form, Link } from "react-router";
import type { Route } from "./+types/reset-password";
import { buttonClass, FormMessage, TextField } from "~/components/ui/field";
import { db } from "~/db/index.server";
import { resetPasswordSchema } from "~/domain/account-forms";
import { MIN_PASSWORD_LENGTH } from "~/domain/password-rules";
import { deleteOtherSessions } from "~/models/sessions.server";
import { consumeToken, peekToken } from "~/models/tokens.server";
import { markEmailVerified, setPassword } from "~/models/users.server";
import { hashPassword } from "~/services/password.server";
import { redirectWithNotice } from "~/services/session.server";
import { readForm } from "~/services/form-body.server";

export function meta() {
  return [{ title: "Choose a new password · Sistership" }];
}

const EXPIRED = "This link has expired or has already been used.";

export async function loader({ request }: Route.LoaderArgs) {
  const token = new URL(request.url).searchParams.get("token") ?? "";
  const valid = token.length > 10 && (await peekToken(db, token, "reset_password")) !== null;
  return { token, valid };
}

export async function action({ request }: Route.ActionArgs) {
  const submission = parseWithZod(await readForm(request), { schema: resetPasswordSchema });
  if (submission.status !== "success") {
    return data({ result: submission.reply({ hideFields: ["password", "confirm"] }) }, { status: 400 });
  }
  const passwordHash = await hashPassword(submission.value.password);
  const userId = await consumeToken(db, submission.value.token, "reset_password");
  if (userId === null) {
    return data({ result: submission.reply({ formErrors: [EXPIRED], hideFields: ["password", "confirm"] }) }, { status: 400 });
  }
  await setPassword(db, userId, passwordHash);
  // The link proved the address; every browser signed in with the old password is signed out.
  await markEmailVerified(db, userId);
  await deleteOtherSessions(db, userId);
  return redirectWithNotice(request, "/sign-in", "Your password is changed. Sign in with the new one.");
}

export default function ResetPassword({ loaderData, actionData }: Route.ComponentProps) {
  const [form, fields] = useForm({
    lastResult: actionData?.result,
    constraint: getZodConstraint(resetPasswordSchema),
    onValidate: ({ formData }) => parseWithZod(formData, { schema: resetPasswordSchema }),
    shouldValidate: "onBlur",
    shouldRevalidate: "onInput",
  });
  if (!loaderData.valid && !actionData) {
    return (
      <div className="mx-auto max-w-md">
        <h1 className="text-step-3 font-semibold">Choose a new password</h1>
        <p className="mt-4" role="alert">{EXPIRED} <Link to="/forgot-password">Ask for a new link</Link>.</p>
      </div>
    );
  }
  return (
    <div className="mx-auto max-w-md">
      <h1 className="text-step-3 font-semibold">Choose a new password</h1>
      <Form method="post" {...getFormProps(form)} className="mt-6 space-y-4">
        <FormMessage id={form.errorId} errors={form.errors} />
        <input type="hidden" name="token" value={loaderData.token} />
        <TextField field={fields.password} label="New password" type="password" autoComplete="new-password" hint={`At least ${MIN_PASSWORD_LENGTH} characters.`} />
        <TextField field={fields.confirm} label="The new password again" type="password" autoComplete="new-password" />
        <button type="submit" className={buttonClass}>Save the new password</button>
      </Form>
    </div>
  );
}
