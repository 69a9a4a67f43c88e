import { getFormProps, useForm } from "@conform-to/react";
import { getZodConstraint, parseWithZod } from "@conform-to/zod/v4";
import { data, Form, Link, useNavigation } from "react-router";
import type { Route } from "./+types/sign-up";
import { buttonClass, FormMessage, Honeypot, TextField } from "~/components/ui/field";
import { db } from "~/db/index.server";
import { signUpSchema } from "~/domain/account-forms";
import { MIN_PASSWORD_LENGTH } from "~/domain/password-rules";
import { queueVerificationEmail } from "~/models/account-emails.server";
import { clientAddress, hitLimit, LIMITS } from "~/models/rate-limits.server";
import { issueToken } from "~/models/tokens.server";
import { createMember } from "~/models/users.server";
import { env } from "~/services/env.server";
import { kickOutbox } from "~/services/outbox-worker.server";
import { hashPassword } from "~/services/password.server";
import { requireAnonymous, signIn } from "~/services/session.server";
import { readForm } from "~/services/form-body.server";

export function meta() {
  return [{ title: "Make an account · Sistership" }];
}

export async function loader({ request }: Route.LoaderArgs) {
  await requireAnonymous(request);
  return null;
}

export async function action({ request }: Route.ActionArgs) {
  const submission = parseWithZod(await readForm(request), { schema: signUpSchema });
  if (submission.status !== "success") {
    return data({ result: submission.reply({ hideFields: ["password"] }) }, { status: 400 });
  }
  const verdict = await hitLimit(db, `sign-up:address:${clientAddress(request)}`, LIMITS.signUpPerAddress);
  if (!verdict.allowed) {
    return data(
      { result: submission.reply({ formErrors: ["Too many new accounts from this connection. Try again in an hour."], hideFields: ["password"] }) },
      { status: 429, headers: { "Retry-After": String(verdict.retryAfterSeconds) } },
    );
  }
  const { email, displayName, password } = submission.value;
  const passwordHash = await hashPassword(password);
  const userId = await db.transaction(async (tx) => {
    const id = await createMember(tx, { email, displayName, passwordHash });
    if (id === null) return null;
    const token = await issueToken(tx, id, "verify_email");
    await queueVerificationEmail(tx, email, displayName, `${env.APP_URL}/verify-email?token=${token}`);
    return id;
  });
  if (userId === null) {
    return data(
      { result: submission.reply({ fieldErrors: { email: ["An account with this e-mail address already exists. Sign in, or reset your password."] }, hideFields: ["password"] }) },
      { status: 400 },
    );
  }
  kickOutbox();
  return signIn(request, userId, "/account", `Welcome aboard. We sent a link to ${email}: open it to confirm your address.`);
}

export default function SignUp({ actionData }: Route.ComponentProps) {
  const navigation = useNavigation();
  const [form, fields] = useForm({
    lastResult: actionData?.result,
    constraint: getZodConstraint(signUpSchema),
    onValidate: ({ formData }) => parseWithZod(formData, { schema: signUpSchema }),
    shouldValidate: "onBlur",
    shouldRevalidate: "onInput",
  });
  return (
    <div className="mx-auto max-w-md">
      <h1 className="text-step-3 font-semibold">Make an account</h1>
      <p className="mt-2 text-ink-soft">
        Anyone can read the published write-ups. An account lets you register your boat by its hull number,
        add measurements and write up your own work.
      </p>
      <Form method="post" {...getFormProps(form)} className="relative mt-6 space-y-4">
        <FormMessage id={form.errorId} errors={form.errors} />
        <Honeypot />
        <TextField field={fields.email} label="E-mail address" type="email" autoComplete="email" hint="We send a link to confirm it. It is never shown to other members." />
        <TextField field={fields.displayName} label="Your name" autoComplete="name" hint="As other members will see it." />
        <TextField field={fields.password} label="Password" type="password" autoComplete="new-password" hint={`At least ${MIN_PASSWORD_LENGTH} characters. A few ordinary words strung together are easy to remember and hard to guess.`} />
        <button type="submit" className={`${buttonClass} w-full`} disabled={navigation.state === "submitting"}>
          {navigation.state === "submitting" ? "Making your account…" : "Make my account"}
        </button>
      </Form>
      <p className="mt-6 text-step--1">Already a member? <Link to="/sign-in">Sign in</Link></p>
    </div>
  );
}
