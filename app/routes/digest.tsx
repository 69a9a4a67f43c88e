import { Link } from "react-router";
import type { Route } from "./+types/digest";
import { db } from "~/db/index.server";
import { digestTitle, formatDigestDate } from "~/domain/digest";
import { CLASS_NAME } from "~/domain/hulls";
import { can } from "~/domain/permissions";
import { listIssued } from "~/models/digests.server";
import { getUser } from "~/services/session.server";
import { keepPageForVisitors } from "~/services/page-cache.server";

export function meta() {
  return [{ title: `The yearly digest · ${CLASS_NAME} · Sistership` }];
}

// Visitors who are not signed in may be answered from memory (app/services/page-cache.server.ts).
export const middleware: Route.MiddlewareFunction[] = [keepPageForVisitors];

export async function loader({ request }: Route.LoaderArgs) {
  const [issued, user] = await Promise.all([listIssued(db), getUser(request)]);
  return { issued, className: CLASS_NAME, canCompile: user ? can(user.roles, "digest:compile") : false };
}

export default function DigestArchive({ loaderData }: Route.ComponentProps) {
  const { issued, className, canCompile } = loaderData;
  const years = [...new Set(issued.map((e) => e.year))];
  return (
    <div className="mx-auto max-w-3xl space-y-8">
      <header>
        <h1 className="text-step-3 font-semibold">The yearly digest</h1>
        <p className="mt-2 max-w-prose font-serif text-step-1 text-ink-soft">
          Each year the {className} class secretary gathers what owners did to their boats, as they wrote it up here.
          Every issue stays here as it was sent.
        </p>
        {canCompile && <p className="mt-3"><Link to="/secretary/digest" className="font-medium">Compile a digest</Link></p>}
      </header>
      {years.length === 0 ? (
        <p className="text-ink-soft">No digest has been issued yet.</p>
      ) : (
        <ol className="divide-y divide-cloth-200 border-y border-cloth-200">
          {years.map((year) => {
            const editions = issued.filter((e) => e.year === year);
            const latest = editions[0];
            return (
              <li key={year} className="flex flex-wrap items-baseline gap-x-6 gap-y-1 py-5">
                <Link to={`/digest/${year}`} className="font-serif text-step-3 font-bold text-deep-900 no-underline hover:underline">{year}</Link>
                <div className="min-w-0 flex-1">
                  <p className="font-serif text-step-1">{digestTitle(year, latest.edition)}</p>
                  <p className="text-step--1 text-ink-soft">
                    {latest.entries} write-up{latest.entries === 1 ? "" : "s"} · issued {formatDigestDate(latest.issuedAt)}
                    {editions.length > 1 && ` · corrects ${editions.length - 1} earlier edition${editions.length > 2 ? "s" : ""}`}
                  </p>
                </div>
                <Link to={`/digest/${year}/pdf?edition=${latest.edition}`} reloadDocument className="text-step--1 font-medium">PDF</Link>
              </li>
            );
          })}
        </ol>
      )}
    </div>
  );
}
