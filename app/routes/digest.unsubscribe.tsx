import { data, Form, Link, useNavigation } from "react-router";
import type { Route } from "./+types/digest.unsubscribe";
import { buttonClass } from "~/components/ui/field";
import { db } from "~/db/index.server";
import { findDigestSubscriber, unsubscribeFromDigest } from "~/models/digests.server";
import { verifyUnsubscribeToken } from "~/services/unsubscribe.server";

// The unsubscribe link of the digest e-mail: it works without signing in. Opening it (GET) only
// asks; the button (POST) stops the digest. A POST straight to the link also works, which is what
// one-click unsubscribe in mail programs sends (RFC 8058).

export function meta() {
  return [{ title: "Stop the yearly digest · Sistership" }, { name: "robots", content: "noindex" }];
}

function tokenFrom(request: Request, form?: FormData): string {
  const fromForm = form?.get("token");
  return typeof fromForm === "string" && fromForm ? fromForm : (new URL(request.url).searchParams.get("token") ?? "");
}

export async function loader({ request }: Route.LoaderArgs) {
  const token = tokenFrom(request);
  const userId = verifyUnsubscribeToken(token);
  const member = userId === null ? null : await findDigestSubscriber(db, userId);
  if (!member) return data({ state: "invalid" as const, token: "", email: "" }, { status: 400 });
  return { state: member.digestOptIn ? ("asking" as const) : ("already" as const), token, email: member.email };
}

export async function action({ request }: Route.ActionArgs) {
  const form = await request.formData().catch(() => new FormData());
  const token = tokenFrom(request, form);
  const userId = verifyUnsubscribeToken(token);
  if (userId === null || !(await unsubscribeFromDigest(db, userId))) {
    return data({ state: "invalid" as const, token: "", email: "" }, { status: 400 });
  }
  const member = await findDigestSubscriber(db, userId);
  return { state: "done" as const, token, email: member?.email ?? "" };
}

export default function Unsubscribe({ loaderData, actionData }: Route.ComponentProps) {
  const view = actionData ?? loaderData;
  const navigation = useNavigation();
  return (
    <div className="mx-auto max-w-xl space-y-4 py-6">
      {view.state === "invalid" && (
        <>
          <h1 className="text-step-3 font-semibold">This link does not work</h1>
          <p>It may have been cut short by your mail program. Copy the whole link from the e-mail, or sign in and untick “Send me the class's yearly digest by e-mail” on <Link to="/account">your account page</Link>.</p>
        </>
      )}
      {view.state === "asking" && (
        <>
          <h1 className="text-step-3 font-semibold">Stop the yearly digest?</h1>
          <p>We will no longer e-mail the class's yearly digest to <strong>{view.email}</strong>. Every issue stays in the <Link to="/digest">archive</Link>.</p>
          <Form method="post">
            <input type="hidden" name="token" value={view.token} />
            <button type="submit" className={buttonClass} disabled={navigation.state !== "idle"}>Stop sending me the digest</button>
          </Form>
        </>
      )}
      {(view.state === "done" || view.state === "already") && (
        <>
          <h1 className="text-step-3 font-semibold">You will not receive the digest</h1>
          <p role="status"><strong>{view.email}</strong> is off the digest's list. Other e-mail from Sistership (replies about your write-ups, password resets) is not affected.</p>
          <p>Changed your mind? Tick “Send me the class's yearly digest by e-mail” on <Link to="/account">your account page</Link>. Past issues are in the <Link to="/digest">archive</Link>.</p>
        </>
      )}
    </div>
  );
}
