import { redirect } from "react-router";
import type { Route } from "./+types/sign-out";
import { signOut } from "~/services/session.server";

// Signing out changes state, so it only happens on POST (the header's button).
export function loader() {
  return redirect("/");
}

export async function action({ request }: Route.ActionArgs) {
  return signOut(request);
}
