import { parseWithZod } from "@conform-to/zod/v4";
import type { Route } from "./+types/api.writeups.$slug.done-too";
import { db } from "~/db/index.server";
import { doneTooSchema } from "~/domain/conversation-forms";
import { findPublishedWriteupRef } from "~/models/comments.server";
import { doneTooSummary, ownsHull, recordDoneToo, takeBackDoneToo } from "~/models/done-too.server";
import { redirectWithNotice } from "~/services/session.server";
import { notFound } from "./api-errors.server";
import { conversationPoster, json, writeupPath } from "./conversation.server";
import { readForm } from "~/services/form-body.server";

function summaryJson(summary: Awaited<ReturnType<typeof doneTooSummary>>) {
  return { count: summary.count, hulls: summary.hulls.map(({ hullNumber, boatName, isAuthors }) => ({ hullNumber, boatName, isAuthors })) };
}

// GET /api/writeups/:slug/done-too: how many boats the change was done on, and which.
export async function loader({ params }: Route.LoaderArgs) {
  const writeup = await findPublishedWriteupRef(db, params.slug);
  if (!writeup) return notFound("There is no published write-up at this address.");
  return json(summaryJson(await doneTooSummary(db, writeup)));
}

// POST /api/writeups/:slug/done-too  intent=record|take-back, hullNumber=...
// A signed-in member counts one of their own registered hulls (or takes it back).
export async function action({ request, params }: Route.ActionArgs) {
  const poster = await conversationPoster(request, params.slug, "done-too", "Sign in to count your boat.");
  if ("answer" in poster) return poster.answer;
  const { document, writeup, user } = poster;
  const back = writeupPath(writeup.slug, "done-too");
  const answer = async (status: number, body: Record<string, unknown>) => {
    if (document) return redirectWithNotice(request, back, String(body.message));
    return json({ ...body, ...summaryJson(await doneTooSummary(db, writeup)) }, status);
  };

  const submission = parseWithZod(await readForm(request), { schema: doneTooSchema });
  if (submission.status !== "success") {
    const [field, messages] = Object.entries(submission.error ?? {}).find(([, m]) => m?.length) ?? ["hullNumber", ["Choose one of your boats."]];
    return answer(400, { error: "bad-parameter", parameter: field, message: messages?.[0] ?? "Choose one of your boats." });
  }
  const { intent, hullNumber } = submission.value;
  if (!(await ownsHull(db, user.id, hullNumber))) {
    return answer(403, {
      error: "not-your-hull",
      parameter: "hullNumber",
      message: `Hull ${hullNumber} is not registered to you. Add your boat on your account page first.`,
    });
  }
  if (intent === "take-back") {
    const removed = await takeBackDoneToo(db, writeup.id, hullNumber);
    return answer(200, { ok: true, message: removed ? `Hull ${hullNumber} is no longer counted.` : `Hull ${hullNumber} was not counted.` });
  }
  if (hullNumber === writeup.authorHull) {
    return answer(400, {
      error: "bad-parameter",
      parameter: "hullNumber",
      message: `Hull ${hullNumber} is the boat this write-up was done on; it is counted already.`,
    });
  }
  const result = await recordDoneToo(db, { writeupId: writeup.id, hullNumber, userId: user.id });
  return answer(result === "recorded" ? 201 : 200, {
    ok: true,
    message: result === "recorded" ? `Hull ${hullNumber} is counted. Thank you.` : `Hull ${hullNumber} is counted already.`,
  });
}
