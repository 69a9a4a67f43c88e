import { Link } from "react-router";
import type { Route } from "./+types/safety";
import { CAUTIONS } from "~/domain/cautions";
import { keepPageForVisitors } from "~/services/page-cache.server";

// Visitors who are not signed in may be answered from memory (app/services/page-cache.server.ts).
export const middleware: Route.MiddlewareFunction[] = [keepPageForVisitors];

export function meta() {
  return [{ title: "Safety and the limits of this advice · Sistership" }];
}

export default function SafetyPage() {
  return (
    <div className="max-w-3xl">
      <h1 className="text-step-3 font-semibold">Safety and the limits of this advice</h1>
      <div className="mt-6 space-y-4 font-serif text-step-0 leading-relaxed">
        <p>
          Sistership collects what owners did to their own boats. Moderators read every write-up before it is
          published and check that the usual cautions are there and that measurements look plausible, but they do
          not inspect the work, and no write-up is professional advice.
        </p>
        <p>
          The figures the product computes (what fits where, heel and trim, cable sizes) are estimates from simple,
          published relations and from measurements members made on their own hulls. Boats of one class still differ:
          check every measurement on your own boat before you cut.
        </p>
        <p>
          Follow the standards that apply to your boat (in the United States, the ABYC standards and the federal
          rules in 33 CFR Part 183), your local codes, and the manufacturer's instructions for every product you use.
          For wiring, rigging, structural and stability work, have a licensed or certified professional (a
          qualified marine electrician, rigger, surveyor or naval architect) do or check it.
        </p>
      </div>
      <h2 className="mt-10 text-step-2 font-semibold">The usual cautions</h2>
      <ul className="mt-4 space-y-4">
        {Object.values(CAUTIONS).map((c) => (
          <li key={c.key} className="rounded-lg border-l-4 border-bootstripe-600 bg-bootstripe-50 p-4">
            <h3 className="font-sans text-step-0 font-semibold text-bootstripe-800">{c.title}</h3>
            <p className="mt-1">{c.text}</p>
            <p className="mt-1 text-step--1 text-ink-soft">Source: {c.source}</p>
          </li>
        ))}
      </ul>
      <p className="mt-10"><Link to="/">Back to the write-ups</Link></p>
    </div>
  );
}
