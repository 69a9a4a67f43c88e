import { getFormProps, useForm } from "@conform-to/react";
import { getZodConstraint, parseWithZod } from "@conform-to/zod/v4";
import { data, Form, Link, useNavigation, useSearchParams } from "react-router";
import type { Route } from "./+types/sign-in";
import { buttonClass, FormMessage, Honeypot, TextField } from "~/components/ui/field";
import { db } from "~/db/index.server";
import { signInSchema } from "~/domain/account-forms";
import { checkLimit, clientAddress, hitLimit, LIMITS } from "~/models/rate-limits.server";
import { authenticator, SIGN_IN_FAILED, SignInError } from "~/services/auth.server";
import { requireAnonymous, safeRedirect, signIn } from "~/services/session.server";
import { readForm } from "~/services/form-body.server";

export function meta() {
  return [{ title: "Sign in · Sistership" }];
}

export async function loader({ request }: Route.LoaderArgs) {
  await requireAnonymous(request);
  return null;
}

export async function action({ request }: Route.ActionArgs) {
  // Validate a copy: the authenticator reads the original body.
  const submission = parseWithZod(await readForm(request.clone()), { schema: signInSchema });
  if (submission.status !== "success") {
    return data({ result: submission.reply({ hideFields: ["password"] }) }, { status: 400 });
  }
  const { email, redirectTo } = submission.value;
  // Failed attempts count against the address and the account; a locked-out pair waits for the window.
  const limits = [
    [`sign-in:address:${clientAddress(request)}`, LIMITS.signInPerAddress],
    [`sign-in:account:${email}`, LIMITS.signInPerAccount],
  ] as const;
  for (const [key, limit] of limits) {
    const verdict = await checkLimit(db, key, limit);
    if (!verdict.allowed) {
      const minutes = Math.ceil(verdict.retryAfterSeconds / 60);
      return data(
        { result: submission.reply({ formErrors: [`Too many sign-in attempts. Wait ${minutes} minute${minutes === 1 ? "" : "s"} and try again, or reset your password.`], hideFields: ["password"] }) },
        { status: 429, headers: { "Retry-After": String(verdict.retryAfterSeconds) } },
      );
    }
  }
  try {
    const user = await authenticator.authenticate("password", request);
    return signIn(request, user.id, safeRedirect(redirectTo, "/"));
  } catch (error) {
    if (error instanceof SignInError) {
      for (const [key, limit] of limits) await hitLimit(db, key, limit);
      return data({ result: submission.reply({ formErrors: [SIGN_IN_FAILED], hideFields: ["password"] }) }, { status: 400 });
    }
    throw error;
  }
}

export default function SignIn({ actionData }: Route.ComponentProps) {
  const [params] = useSearchParams();
  const navigation = useNavigation();
  const [form, fields] = useForm({
    lastResult: actionData?.result,
    constraint: getZodConstraint(signInSchema),
    onValidate: ({ formData }) => parseWithZod(formData, { schema: signInSchema }),
    shouldValidate: "onBlur",
    shouldRevalidate: "onInput",
  });
  return (
    <div className="mx-auto max-w-md">
      <h1 className="text-step-3 font-semibold">Sign in</h1>
      <p className="mt-2 text-ink-soft">Members sign in to add measurements, write up their work and register their boats.</p>
      <Form method="post" {...getFormProps(form)} className="relative mt-6 space-y-4">
        <FormMessage id={form.errorId} errors={form.errors} />
        <Honeypot />
        <input type="hidden" name="redirectTo" value={params.get("redirectTo") ?? "/"} />
        <TextField field={fields.email} label="E-mail address" type="email" autoComplete="email" />
        <TextField field={fields.password} label="Password" type="password" autoComplete="current-password" />
        <button type="submit" className={`${buttonClass} w-full`} disabled={navigation.state === "submitting"}>
          {navigation.state === "submitting" ? "Signing in…" : "Sign in"}
        </button>
      </Form>
      <p className="mt-6 text-step--1">
        <Link to="/forgot-password">Forgotten your password?</Link>
        {" · "}
        New to the class? <Link to="/sign-up">Make an account</Link>
      </p>
    </div>
  );
}
