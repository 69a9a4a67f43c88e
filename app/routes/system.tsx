import { data, Link } from "react-router";
import type { Route } from "./+types/system";
import { WriteupCard } from "~/components/writeup-card";
import { db } from "~/db/index.server";
import { getSystem, listPublishedBySystem } from "~/models/writeups.server";
import { keepPageForVisitors } from "~/services/page-cache.server";

// Visitors who are not signed in may be answered from memory (app/services/page-cache.server.ts).
export const middleware: Route.MiddlewareFunction[] = [keepPageForVisitors];

export async function loader({ params }: Route.LoaderArgs) {
  const system = await getSystem(db, params.slug);
  if (!system) throw data("No such system", { status: 404 });
  return { system, writeups: await listPublishedBySystem(db, system.slug) };
}

export function meta({ loaderData }: Route.MetaArgs) {
  return [{ title: loaderData ? `${loaderData.system.name} · Sistership` : "Sistership" }];
}

export default function SystemPage({ loaderData }: Route.ComponentProps) {
  const { system, writeups } = loaderData;
  return (
    <div>
      <p className="text-step--1"><Link to="/">Home</Link> / Systems</p>
      <h1 className="mt-2 text-step-3 font-semibold">{system.name}</h1>
      <p className="mt-2 max-w-2xl text-ink-soft">{system.description}</p>
      {writeups.length === 0 ? (
        <p className="mt-8">No published write-ups in this system yet.</p>
      ) : (
        <div className="mt-8 grid gap-4 md:grid-cols-2">
          {writeups.map((w) => <WriteupCard key={w.id} writeup={w} />)}
        </div>
      )}
    </div>
  );
}
