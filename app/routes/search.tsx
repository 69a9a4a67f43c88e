import type { Route } from "./+types/search";
import { WriteupCard } from "~/components/writeup-card";
import { db } from "~/db/index.server";
import { searchPublished } from "~/models/writeups.server";

export async function loader({ request }: Route.LoaderArgs) {
  const q = (new URL(request.url).searchParams.get("q") ?? "").trim().slice(0, 200);
  return { q, results: q ? await searchPublished(db, q) : [] };
}

export function meta({ loaderData }: Route.MetaArgs) {
  return [{ title: loaderData?.q ? `“${loaderData.q}” · Sistership search` : "Search · Sistership" }];
}

export default function SearchPage({ loaderData }: Route.ComponentProps) {
  const { q, results } = loaderData;
  return (
    <div>
      <h1 className="text-step-3 font-semibold">{q ? `Write-ups matching “${q}”` : "Search the write-ups"}</h1>
      {q && results.length > 0 && (
        <p className="mt-2 text-ink-soft">{results.length} {results.length === 1 ? "write-up" : "write-ups"}, best matches first.</p>
      )}
      {q && results.length === 0 && (
        <div className="mt-6 max-w-2xl rounded-lg bg-cloth-100 p-5">
          <p>No published write-up matches those words.</p>
          <p className="mt-2 text-step--1 text-ink-soft">
            Try fewer or plainer words (“battery settee”), put an exact phrase in quotes (“"cockpit locker"”),
            or leave a word out with a minus sign (battery -outboard).
          </p>
        </div>
      )}
      {!q && <p className="mt-4 text-ink-soft">Type what you would ask another owner, such as “battery box under the settee”.</p>}
      <div className="mt-6 grid gap-4">
        {results.map((w) => <WriteupCard key={w.id} writeup={w} />)}
      </div>
    </div>
  );
}
