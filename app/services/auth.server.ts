// Sign-in with remix-auth v4 and the form strategy (e-mail + password).
import { Authenticator } from "remix-auth";
import { FormStrategy } from "remix-auth-form";
import { db } from "~/db/index.server";
import { signInSchema } from "~/domain/account-forms";
import { findUserByEmail } from "~/models/users.server";
import { verifyPassword } from "./password.server";

/** The one message for every failed sign-in: it never tells whether the e-mail is registered. */
export const SIGN_IN_FAILED = "That e-mail and password do not match an account.";

export class SignInError extends Error {}

export const authenticator = new Authenticator<{ id: number }>();

authenticator.use(
  new FormStrategy(async ({ form }) => {
    const parsed = signInSchema.safeParse(Object.fromEntries(form));
    if (!parsed.success) throw new SignInError(SIGN_IN_FAILED);
    const user = await findUserByEmail(db, parsed.data.email);
    const ok = await verifyPassword(user?.passwordHash ?? null, parsed.data.password);
    if (!user || !ok) throw new SignInError(SIGN_IN_FAILED);
    return { id: user.id };
  }),
  "password",
);
