import { data, Form, Link } from "react-router";
import type { Route } from "./+types/verify-email";
import { buttonClass } from "~/components/ui/field";
import { db } from "~/db/index.server";
import { consumeToken, peekToken } from "~/models/tokens.server";
import { markEmailVerified } from "~/models/users.server";
import { getUser, redirectWithNotice } from "~/services/session.server";
import { readForm } from "~/services/form-body.server";

export function meta() {
  return [{ title: "Confirm your e-mail address · Sistership" }];
}

// Opening the link only shows a button: the change happens on POST (links get prefetched by mail scanners).
export async function loader({ request }: Route.LoaderArgs) {
  const token = new URL(request.url).searchParams.get("token") ?? "";
  const valid = token.length > 10 && (await peekToken(db, token, "verify_email")) !== null;
  return { token, valid };
}

export async function action({ request }: Route.ActionArgs) {
  const token = String((await readForm(request)).get("token") ?? "");
  const userId = token ? await consumeToken(db, token, "verify_email") : null;
  if (userId === null) {
    return data({ error: "This link has expired or has already been used. Sign in and ask for a new one from your account page." }, { status: 400 });
  }
  await markEmailVerified(db, userId);
  const user = await getUser(request);
  return redirectWithNotice(request, user ? "/account" : "/sign-in", "Thank you: your e-mail address is confirmed.");
}

export default function VerifyEmail({ loaderData, actionData }: Route.ComponentProps) {
  const error = actionData?.error ?? (loaderData.valid ? null : "This link has expired or has already been used. Sign in and ask for a new one from your account page.");
  return (
    <div className="mx-auto max-w-md">
      <h1 className="text-step-3 font-semibold">Confirm your e-mail address</h1>
      {error ? (
        <>
          <p className="mt-4" role="alert">{error}</p>
          <p className="mt-4"><Link to="/account">Go to your account</Link></p>
        </>
      ) : (
        <Form method="post" className="mt-6">
          <input type="hidden" name="token" value={loaderData.token} />
          <button type="submit" className={buttonClass}>Confirm my address</button>
        </Form>
      )}
    </div>
  );
}
