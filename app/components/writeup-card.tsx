import { Link } from "react-router";
import { describeHullRange, hullBesideCredit } from "~/domain/hulls";
import type { WriteupCard as Card } from "~/models/writeups.server";

export function formatDate(value: Date | string | null): string {
  if (!value) return "";
  return new Date(value).toLocaleDateString("en-GB", { day: "numeric", month: "long", year: "numeric", timeZone: "UTC" });
}

export function SystemChips({ systems }: { systems: Card["systems"] }) {
  return (
    <ul className="flex flex-wrap gap-1.5" aria-label="Systems">
      {systems.map((sys) => (
        <li key={sys.slug}>
          <Link
            to={`/systems/${sys.slug}`}
            className="inline-block rounded-sm border border-deep-200 bg-deep-50 px-2 py-0.5 text-step--1 text-deep-700 no-underline hover:border-deep-500"
          >
            {sys.name}
          </Link>
        </li>
      ))}
    </ul>
  );
}

export function WriteupCard({ writeup }: { writeup: Card }) {
  return (
    <article className="rounded-lg border border-cloth-200 bg-white/70 p-5 shadow-xs">
      <h3 className="text-step-1 font-semibold leading-snug">
        <Link to={`/writeups/${writeup.slug}`} className="text-deep-900 no-underline hover:underline">
          {writeup.title}
        </Link>
      </h3>
      <p className="mt-1 text-step--1 text-ink-soft">
        {writeup.authorCredit}
        {hullBesideCredit(writeup.authorCredit, writeup.hullNumber) ? ` · hull ${writeup.hullNumber}` : ""}
        {writeup.publishedAt ? ` · ${formatDate(writeup.publishedAt)}` : ""}
        {" · "}
        {describeHullRange({ from: writeup.hullFrom, to: writeup.hullTo })}
      </p>
      <p className="mt-3 font-serif leading-relaxed">{writeup.summary}</p>
      <div className="mt-3">
        <SystemChips systems={writeup.systems} />
      </div>
    </article>
  );
}
