// "Done on my boat too": how many boats of the class carry this change, and a member's way to add
// one of their registered hulls (or take it back). Sent to /api/writeups/:slug/done-too with a
// fetcher; the same forms work as plain HTML forms before the page's script has loaded.
import { Link, useFetcher } from "react-router";
import { describeHullRange, type HullRange, rangeIncludes } from "~/domain/hulls";
import { buttonClass, FieldError, inputClass, quietButtonClass } from "~/components/ui/form-basics";

export type DoneTooView = {
  /** The hulls the write-up was written for. */
  appliesTo: HullRange;
  count: number;
  hulls: { hullNumber: number; boatName: string | null; isAuthors: boolean }[];
  /** The reader's registered boats (null: not signed in). */
  mine: { hullNumber: number; name: string | null; state: "open" | "counted" | "authors" }[] | null;
};

/** What /api/writeups/:slug/done-too answers (JSON). */
export type DoneTooReply = { ok?: true; error?: string; parameter?: string; message?: string; count?: number };

const apiPath = (slug: string) => `/api/writeups/${encodeURIComponent(slug)}/done-too`;
const boatLabel = (hull: number, name: string | null) => (name ? `${name} (hull ${hull})` : `Hull ${hull}`);

export function DoneToo({ slug, view }: { slug: string; view: DoneTooView }) {
  const { count, hulls, mine } = view;
  return (
    <section id="done-too" aria-labelledby="done-too-heading" className="scroll-mt-6 rounded-lg border border-cloth-200 bg-white/70 p-4">
      <h2 id="done-too-heading" className="text-step-1 font-semibold" aria-live="polite">
        {count === 0 ? "Not yet counted on any boat" : `Done on ${count} ${count === 1 ? "boat" : "boats"}`}
      </h2>
      {hulls.length > 0 && (
        <ul className="mt-2 flex flex-wrap gap-x-4 gap-y-1 text-step--1" aria-label="Hulls">
          {hulls.map((h) => (
            <li key={h.hullNumber}>
              <span className="tabular-nums">Hull {h.hullNumber}</span>
              {h.boatName ? <span className="text-ink-soft">, {h.boatName}</span> : null}
              {h.isAuthors ? <span className="text-ink-soft"> (the author's)</span> : null}
            </li>
          ))}
        </ul>
      )}
      <div className="mt-3 text-step--1">
        {mine === null ? (
          <p>
            Made the same change on your boat?{" "}
            <Link to={`/sign-in?redirectTo=${encodeURIComponent(`/writeups/${slug}#done-too`)}`} className="font-medium">Sign in</Link>
            {" "}to count it.
          </p>
        ) : mine.length === 0 ? (
          <p>
            Made the same change on your boat? <Link to="/account" className="font-medium">Register your boat on your account page</Link>
            {" "}and it can be counted here.
          </p>
        ) : (
          <MyBoats slug={slug} mine={mine} appliesTo={view.appliesTo} />
        )}
      </div>
    </section>
  );
}

function MyBoats({ slug, mine, appliesTo }: { slug: string; mine: NonNullable<DoneTooView["mine"]>; appliesTo: HullRange }) {
  const open = mine.filter((b) => b.state === "open");
  // A change can be made on a hull it was not written for; the owner is told, and may still count it.
  const elsewhere = open.filter((b) => !rangeIncludes(appliesTo, b.hullNumber));
  const counted = mine.filter((b) => b.state === "counted");
  const authors = mine.filter((b) => b.state === "authors");
  return (
    <div className="space-y-3">
      {authors.map((b) => <p key={b.hullNumber} className="text-ink-soft">{boatLabel(b.hullNumber, b.name)} is the boat this write-up was done on.</p>)}
      {counted.map((b) => <TakeBack key={b.hullNumber} slug={slug} boat={b} />)}
      {elsewhere.length > 0 && (
        <p className="text-ink-soft" data-testid="done-too-other-hulls">
          {`This write-up was written for ${describeHullRange(appliesTo).replace(/^H/, "h")}; ${
            elsewhere.length === 1 ? `hull ${elsewhere[0].hullNumber} is not among them` : `hulls ${elsewhere.map((b) => b.hullNumber).join(", ")} are not among them`
          }. Count it only if you made the same change on it.`}
        </p>
      )}
      {open.length > 0 && <RecordForm slug={slug} open={open} />}
    </div>
  );
}

function RecordForm({ slug, open }: { slug: string; open: NonNullable<DoneTooView["mine"]> }) {
  const fetcher = useFetcher<DoneTooReply>();
  const busy = fetcher.state !== "idle";
  const reply = fetcher.state === "idle" ? fetcher.data : undefined;
  const error = reply && !reply.ok ? reply.message : undefined;
  const errorId = "done-too-hull-error";
  return (
    <fetcher.Form method="post" action={apiPath(slug)} className="flex flex-wrap items-end gap-3" aria-label="Count my boat">
      <input type="hidden" name="intent" value="record" />
      {open.length === 1 ? (
        <>
          <input type="hidden" name="hullNumber" value={open[0].hullNumber} />
          <p className="basis-full">Made the same change on {boatLabel(open[0].hullNumber, open[0].name)}?</p>
        </>
      ) : (
        <div>
          <label htmlFor="done-too-hull" className="block font-medium">Which of your boats?</label>
          <select
            id="done-too-hull"
            name="hullNumber"
            className={`mt-1 ${inputClass}`}
            aria-invalid={error ? true : undefined}
            aria-describedby={error ? errorId : undefined}
          >
            {open.map((b) => <option key={b.hullNumber} value={b.hullNumber}>{boatLabel(b.hullNumber, b.name)}</option>)}
          </select>
        </div>
      )}
      <button type="submit" className={buttonClass} disabled={busy}>{busy ? "Counting…" : "Count my boat too"}</button>
      <div className="basis-full">
        <FieldError id={errorId} errors={error ? [error] : undefined} />
      </div>
    </fetcher.Form>
  );
}

function TakeBack({ slug, boat }: { slug: string; boat: NonNullable<DoneTooView["mine"]>[number] }) {
  const fetcher = useFetcher<DoneTooReply>();
  const busy = fetcher.state !== "idle";
  const reply = fetcher.state === "idle" ? fetcher.data : undefined;
  return (
    <fetcher.Form method="post" action={apiPath(slug)} className="flex flex-wrap items-center gap-3">
      <input type="hidden" name="intent" value="take-back" />
      <input type="hidden" name="hullNumber" value={boat.hullNumber} />
      <p>{boatLabel(boat.hullNumber, boat.name)} is counted.</p>
      <button type="submit" className={quietButtonClass} disabled={busy}>
        {busy ? "Taking it back…" : <>Take it back<span className="sr-only"> for hull {boat.hullNumber}</span></>}
      </button>
      {reply && !reply.ok && <p role="alert" className="basis-full font-medium text-bootstripe-600">{reply.message}</p>}
    </fetcher.Form>
  );
}
