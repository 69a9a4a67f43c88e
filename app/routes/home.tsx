import { Link } from "react-router";
import type { Route } from "./+types/home";
import { WriteupCard } from "~/components/writeup-card";
import { db } from "~/db/index.server";
import { CLASS_NAME } from "~/domain/hulls";
import { listRecentPublished, listSystemsWithCounts } from "~/models/writeups.server";
import { keepPageForVisitors } from "~/services/page-cache.server";

export function meta() {
  return [
    { title: `Sistership: the ${CLASS_NAME} owners' knowledge base` },
    { name: "description", content: `Modifications, measured spaces and known fixes from ${CLASS_NAME} owners.` },
  ];
}

// Visitors who are not signed in may be answered from memory (app/services/page-cache.server.ts).
export const middleware: Route.MiddlewareFunction[] = [keepPageForVisitors];

export async function loader() {
  const [recent, systems] = await Promise.all([listRecentPublished(db, 6), listSystemsWithCounts(db)]);
  return { recent, systems };
}

export default function Home({ loaderData }: Route.ComponentProps) {
  const { recent, systems } = loaderData;
  return (
    <div className="space-y-12">
      <section className="max-w-3xl">
        <h1 className="text-step-4 font-semibold leading-tight">What owners have done to their boats, and how they measured it.</h1>
        <p className="mt-4 font-serif text-step-1 leading-relaxed text-ink-soft">
          Every {CLASS_NAME} came out of the same moulds, so what one owner found behind a panel is very nearly
          what you will find behind yours. Search the write-ups, check what fits where, and add your own.
        </p>
      </section>

      <section aria-labelledby="recent-heading">
        <h2 id="recent-heading" className="text-step-2 font-semibold">Recently published</h2>
        {recent.length === 0 ? (
          <p className="mt-4 text-ink-soft">Nothing has been published yet.</p>
        ) : (
          <div className="mt-4 grid gap-4 md:grid-cols-2">
            {recent.map((w) => <WriteupCard key={w.id} writeup={w} />)}
          </div>
        )}
      </section>

      <section aria-labelledby="systems-heading">
        <h2 id="systems-heading" className="text-step-2 font-semibold">Browse by boat system</h2>
        <ul className="mt-4 grid gap-3 sm:grid-cols-2 lg:grid-cols-3">
          {systems.map((sys) => (
            <li key={sys.slug}>
              <Link
                to={`/systems/${sys.slug}`}
                className="block h-full rounded-lg border-l-4 border-deep-500 bg-cloth-100 p-4 no-underline hover:bg-cloth-200"
              >
                <span className="flex items-baseline justify-between gap-2">
                  <span className="font-serif text-step-1 font-semibold text-deep-900">{sys.name}</span>
                  <span className="text-step--1 text-ink-soft">
                    {sys.count} {sys.count === 1 ? "write-up" : "write-ups"}
                  </span>
                </span>
                <span className="mt-1 block text-step--1 text-ink-soft">{sys.description}</span>
              </Link>
            </li>
          ))}
        </ul>
      </section>
    </div>
  );
}
