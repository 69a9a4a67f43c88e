import { useEffect, useState } from "react";
import { data, Form, Link, type ShouldRevalidateFunctionArgs, useFetcher } from "react-router";
import type { Route } from "./+types/digest.$year";
import type { action as pdfAction } from "./digest.$year.pdf";
import { DigestDocument } from "~/components/digest-document";
import { DIGEST_CSS } from "~/components/digest-style";
import { Notice, quietButtonClass } from "~/components/ui/field";
import { db } from "~/db/index.server";
import { digestTitle, formatDigestDate } from "~/domain/digest";
import { CLASS_NAME } from "~/domain/hulls";
import { can } from "~/domain/permissions";
import { getIssued } from "~/models/digests.server";
import { env } from "~/services/env.server";
import { getUser, readNotice } from "~/services/session.server";
import { digestYearAndEdition } from "./digest-params.server";
import { keepPageForVisitors } from "~/services/page-cache.server";

export function meta({ loaderData }: Route.MetaArgs) {
  return [{ title: loaderData ? `${digestTitle(loaderData.snapshot.year, loaderData.snapshot.edition)} · ${loaderData.className} · Sistership` : "Yearly digest · Sistership" }];
}

// Visitors who are not signed in may be answered from memory (app/services/page-cache.server.ts).
export const middleware: Route.MiddlewareFunction[] = [keepPageForVisitors];

export async function loader({ request, params }: Route.LoaderArgs) {
  const { year, edition } = digestYearAndEdition(params, request);
  const [issued, user, { notice, headers }] = await Promise.all([getIssued(db, year, edition), getUser(request), readNotice(request)]);
  if (!issued) throw data(`No digest has been issued for ${year}.`, { status: 404 });
  return data({
    snapshot: issued.snapshot,
    latest: issued.latest,
    editions: issued.editions,
    pdfReady: issued.pdfKey !== null,
    className: CLASS_NAME,
    appUrl: env.APP_URL,
    canCompile: user ? can(user.roles, "digest:compile") : false,
    notice,
  }, { headers });
}

/** Building the PDF changes nothing the page shows: keep the page (and its notice) as it is. */
export function shouldRevalidate({ formAction, defaultShouldRevalidate }: ShouldRevalidateFunctionArgs) {
  if (formAction?.endsWith("/pdf")) return false;
  return defaultShouldRevalidate;
}

function kilobytes(bytes: number) {
  return bytes >= 1_000_000 ? `${(bytes / 1_000_000).toFixed(1)} MB` : `${Math.max(1, Math.round(bytes / 1000))} KB`;
}

/** Builds the PDF on the server (once per edition) with progress shown, then offers it. */
function PdfButton({ year, edition, entries, ready }: { year: number; edition: number; entries: number; ready: boolean }) {
  const fetcher = useFetcher<typeof pdfAction>();
  const [seconds, setSeconds] = useState(0);
  const building = fetcher.state !== "idle";
  useEffect(() => {
    if (!building) return;
    setSeconds(0);
    const started = Date.now();
    const timer = setInterval(() => setSeconds(Math.floor((Date.now() - started) / 1000)), 250);
    return () => clearInterval(timer);
  }, [building]);
  const result = fetcher.data;
  const href = `/digest/${year}/pdf?edition=${edition}`;
  return (
    <div className="space-y-2" aria-live="polite">
      {!building && !result && (
        <fetcher.Form method="post" action={`/digest/${year}/pdf`}>
          <input type="hidden" name="edition" value={edition} />
          <button type="submit" className={quietButtonClass}>{ready ? "Get the PDF" : "Make the PDF"}</button>
        </fetcher.Form>
      )}
      {building && (
        <div className="w-72" role="status">
          <p className="text-step--1 font-medium">
            {seconds < 2 ? "Starting the printer…" : `Setting ${entries} write-up${entries === 1 ? "" : "s"} in pages…`} {seconds > 0 ? `${seconds} s` : ""}
          </p>
          <progress className="mt-1 h-2 w-full accent-deep-700" aria-label="Building the PDF" />
        </div>
      )}
      {!building && result && (
        <p className="text-step--1">
          <a href={href} download={result.fileName} className="font-medium">Download the PDF</a>
          {" "}({kilobytes(result.bytes)}{result.builtNow ? `, made in ${(result.ms / 1000).toFixed(1)} s` : ""})
        </p>
      )}
    </div>
  );
}

export default function DigestYear({ loaderData }: Route.ComponentProps) {
  const { snapshot, latest, editions, pdfReady, className, appUrl, canCompile, notice } = loaderData;
  const entries = snapshot.sections.reduce((n, x) => n + x.entries.length, 0);
  return (
    <div className="space-y-6">
      <style dangerouslySetInnerHTML={{ __html: DIGEST_CSS }} />
      <div className="no-print space-y-4">
        <p className="text-step--1"><Link to="/digest">← Every yearly digest</Link></p>
        {notice && <Notice>{notice}</Notice>}
        {!latest && (
          <div role="note" className="rounded-md border-l-4 border-varnish-500 bg-cloth-100 p-3">
            This is edition {snapshot.edition}; it was corrected later. <Link to={`/digest/${snapshot.year}`}>Read the latest edition</Link>.
          </div>
        )}
        <div className="flex flex-wrap items-start gap-4 rounded-lg border border-cloth-200 bg-white p-4">
          <PdfButton key={snapshot.edition} year={snapshot.year} edition={snapshot.edition} entries={entries} ready={pdfReady} />
          <button type="button" className={quietButtonClass} onClick={() => window.print()}>Print this page</button>
          {editions.length > 1 && (
            <nav aria-label="Editions" className="text-step--1">
              <p className="font-medium">Editions</p>
              <ul>
                {editions.map((e) => (
                  <li key={e.edition}>
                    {e.edition === snapshot.edition ? <strong>Edition {e.edition}</strong> : <Link to={`/digest/${snapshot.year}?edition=${e.edition}`}>Edition {e.edition}</Link>}
                    {" "}· {formatDigestDate(e.issuedAt)}{e.correctionNote ? ` · ${e.correctionNote}` : ""}
                  </li>
                ))}
              </ul>
            </nav>
          )}
          {canCompile && latest && (
            <Form method="post" action="/secretary/digest" className="ml-auto">
              <input type="hidden" name="year" value={snapshot.year} />
              <button type="submit" className={quietButtonClass}>Prepare a correction</button>
            </Form>
          )}
        </div>
      </div>
      <div className="rounded-lg bg-white p-6 shadow-sm sm:p-10 print:p-0 print:shadow-none">
        <DigestDocument snapshot={snapshot} className={className} appUrl={appUrl} photoSrc={(key) => `/media/${key}`} />
      </div>
    </div>
  );
}
