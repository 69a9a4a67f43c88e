// The conversation under a published write-up: how many boats carry the change, and the comments.
// One module, so the write-up page can fetch its code after the page's first script
// (app/components/deferred.tsx); the forms work as plain HTML forms until it has come.
import { Comments, type CommentDraft, type CommentView } from "./comments";
import { DoneToo, type DoneTooView } from "./done-too";

export function WriteupConversation({ slug, doneToo, comments, signedIn, draft }: {
  slug: string;
  doneToo: DoneTooView;
  comments: CommentView[];
  signedIn: boolean;
  draft: CommentDraft | null;
}) {
  return (
    <>
      <DoneToo slug={slug} view={doneToo} />
      <Comments slug={slug} comments={comments} signedIn={signedIn} draft={draft} />
    </>
  );
}
