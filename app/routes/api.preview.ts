import { data } from "react-router";
import type { Route } from "./+types/api.preview";
import { BODY_MAX, SUMMARY_MAX, TITLE_MAX } from "~/domain/writeup-form";
import { renderMarkdown } from "~/domain/markdown";
import { writeupWarnings } from "~/domain/writeup-checks";
import { requireUser } from "~/services/session.server";
import { readForm } from "~/services/form-body.server";

// POST /api/preview: the editor's live preview, rendered by the same pipeline as the published page.
export async function action({ request }: Route.ActionArgs) {
  await requireUser(request);
  const form = await readForm(request);
  const body = String(form.get("body") ?? "");
  if (body.length > BODY_MAX) return data({ error: "The body is too long to preview." }, { status: 400 });
  const title = String(form.get("title") ?? "");
  const summary = String(form.get("summary") ?? "");
  if (title.length > TITLE_MAX || summary.length > SUMMARY_MAX) return data({ error: "The title or the summary is too long to preview." }, { status: 400 });
  const systems = form.getAll("systems").map(String);
  return {
    html: renderMarkdown(body).html,
    warnings: writeupWarnings({ systems, title, summary, body }),
  };
}
