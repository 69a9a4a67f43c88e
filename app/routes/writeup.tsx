import { data, Link } from "react-router";
import type { Route } from "./+types/writeup";
import { CautionList } from "~/components/cautions";
import { deferred } from "~/components/deferred";
import { Notice } from "~/components/ui/form-basics";
import { formatDate, SystemChips } from "~/components/writeup-card";
import { db } from "~/db/index.server";
import { cautionsFor } from "~/domain/cautions";
import { describeHullRange } from "~/domain/hulls";
import { renderMarkdownCached } from "~/services/rendered-markdown.server";
import { formatLength, formatWeight } from "~/domain/units";
import { getPublishedWriteup } from "~/models/writeups.server";
import { loadConversation } from "./conversation.server";
import { listPublishedCalculations } from "~/models/calculations.server";
import { readerUnit } from "./reader-unit.server";
import { keepPageForVisitors } from "~/services/page-cache.server";

// Visitors who are not signed in may be answered from memory (app/services/page-cache.server.ts).
export const middleware: Route.MiddlewareFunction[] = [keepPageForVisitors];

// The numbers and the conversation come in the page's HTML; the browser fetches their code after the
// page's first script (components/deferred.tsx, docs/decisions/0013-write-up-page-script-within-budget.md).
const WriteupCalculations = deferred(
  () => import("~/components/writeup-calculations").then((m) => m.WriteupCalculations),
  <p className="mt-10 text-step--1 text-ink-soft">Working out the numbers…</p>,
);
const WriteupConversation = deferred(
  () => import("~/components/writeup-conversation").then((m) => m.WriteupConversation),
  <p className="text-step--1 text-ink-soft">Loading the comments…</p>,
);

export async function loader({ params, request }: Route.LoaderArgs) {
  await Promise.all([WriteupCalculations.preload(), WriteupConversation.preload()]);
  const writeup = await getPublishedWriteup(db, params.slug);
  if (!writeup) throw data("No such write-up", { status: 404 });
  const { bodyMarkdown, ...rest } = writeup;
  const systems = writeup.systems.map((sys) => sys.slug);
  // Until readers choose their units (accounts), lengths and weights are shown in inches and pounds.
  const units = { length: "in" as const, weight: "lb" as const };
  const { conversation, headers } = await loadConversation(request, { id: writeup.id, slug: writeup.slug, authorHull: writeup.hullNumber }, { from: writeup.hullFrom, to: writeup.hullTo });
  return data({
    writeup: {
      ...rest,
      html: renderMarkdownCached(bodyMarkdown).html,
      parts: writeup.parts.map((p) => ({ ...p, weight: p.weightKg === null ? "" : formatWeight(p.weightKg, units.weight) })),
      spaces: writeup.spaces.map((sp) => ({
        ...sp,
        sections: sp.sections.map((sec) => ({
          label: sec.label,
          size: [sec.lengthMm, sec.widthMm, sec.heightMm].map((mm) => formatLength(mm, units.length)).join(" × "),
        })),
      })),
    },
    cautions: cautionsFor(systems),
    conversation,
    calculations: await listPublishedCalculations(db, writeup.id),
    readerUnit: await readerUnit(request),
  }, { headers });
}

export function meta({ loaderData }: Route.MetaArgs) {
  if (!loaderData) return [{ title: "Write-up not found · Sistership" }];
  return [
    { title: `${loaderData.writeup.title} · Sistership` },
    { name: "description", content: loaderData.writeup.summary },
  ];
}

const DIFFICULTY: Record<string, string> = { easy: "Straightforward", moderate: "Takes some skill", hard: "Demanding" };

export default function WriteupPage({ loaderData }: Route.ComponentProps) {
  const { writeup, cautions, conversation } = loaderData;
  const facts = [
    ["Applies to", describeHullRange({ from: writeup.hullFrom, to: writeup.hullTo })],
    ["Done on", writeup.hullNumber ? `Hull ${writeup.hullNumber}${writeup.boatName ? `, ${writeup.boatName}` : ""}` : ""],
    ["Difficulty", writeup.difficulty ? DIFFICULTY[writeup.difficulty] : ""],
    ["Time spent", writeup.hoursSpent ? `${writeup.hoursSpent} hours` : ""],
    ["Cost", writeup.costUsd ? `about $${writeup.costUsd.toLocaleString("en-US")}` : ""],
    ["Zones", writeup.zones.map((z) => z.name).join(", ")],
  ].filter(([, v]) => v);
  return (
    <article className="grid gap-10 lg:grid-cols-[minmax(0,1fr)_18rem]">
      <div className="min-w-0">
        <header>
          <SystemChips systems={writeup.systems} />
          <h1 className="mt-3 text-step-4 font-semibold leading-tight">{writeup.title}</h1>
          <p className="mt-3 font-serif text-step-1 leading-relaxed text-ink-soft">{writeup.summary}</p>
          <p className="mt-3 text-step--1 text-ink-soft">
            By {writeup.authorCredit}{writeup.publishedAt ? `, published ${formatDate(writeup.publishedAt)}` : ""}
          </p>
        </header>
        {cautions.length > 0 && <div className="mt-8"><CautionList cautions={cautions} /></div>}
        <div
          className="prose prose-lg mt-8 max-w-none font-serif prose-headings:text-deep-900 prose-a:text-deep-700 prose-table:text-step--1"
          dangerouslySetInnerHTML={{ __html: writeup.html }}
        />
        {loaderData.calculations.length > 0 && <WriteupCalculations calculations={loaderData.calculations} unit={loaderData.readerUnit} />}
        <div id="conversation" className="mt-12 space-y-10 border-t border-cloth-200 pt-8">
          {conversation.notice && <Notice>{conversation.notice}</Notice>}
          <WriteupConversation
            slug={writeup.slug}
            doneToo={conversation.doneToo}
            comments={conversation.comments}
            signedIn={conversation.signedIn}
            draft={conversation.draft}
          />
        </div>
      </div>
      <aside className="space-y-8 text-step--1">
        <dl className="grid grid-cols-[auto_1fr] gap-x-3 gap-y-2 rounded-lg bg-cloth-100 p-4">
          {facts.map(([k, v]) => (
            <div key={k} className="contents">
              <dt className="font-medium text-ink-soft">{k}</dt>
              <dd>{v}</dd>
            </div>
          ))}
        </dl>
        {writeup.parts.length > 0 && (
          <section>
            <h2 className="text-step-1 font-semibold">Parts</h2>
            <table className="mt-2 w-full border-collapse">
              <thead>
                <tr className="border-b border-cloth-300 text-left">
                  <th scope="col" className="py-1 pr-2 font-medium">Part</th>
                  <th scope="col" className="py-1 pr-2 text-right font-medium">Qty</th>
                  <th scope="col" className="py-1 text-right font-medium">Weight</th>
                </tr>
              </thead>
              <tbody>
                {writeup.parts.map((p, i) => (
                  <tr key={i} className="border-b border-cloth-200 align-top">
                    <td className="py-1 pr-2">{p.name}{p.note ? <span className="block text-ink-soft">{p.note}</span> : null}</td>
                    <td className="py-1 pr-2 text-right tabular-nums">{p.quantity}</td>
                    <td className="py-1 text-right tabular-nums whitespace-nowrap">{p.weight}</td>
                  </tr>
                ))}
              </tbody>
            </table>
          </section>
        )}
        {writeup.spaces.length > 0 && (
          <section>
            <h2 className="text-step-1 font-semibold">Spaces used</h2>
            <ul className="mt-2 space-y-3">
              {writeup.spaces.map((sp) => (
                <li key={sp.slug}>
                  <span className="font-medium">{sp.name}</span>
                  <ul className="text-ink-soft">
                    {sp.sections.map((sec, i) => (
                      <li key={i}>{sec.label}: {sec.size} <span className="sr-only">(length × width × height)</span></li>
                    ))}
                  </ul>
                </li>
              ))}
            </ul>
            <p className="mt-2 text-ink-soft">Length (fore and aft) × width × height.</p>
          </section>
        )}
        <p><Link to="/">← All write-ups</Link></p>
      </aside>
    </article>
  );
}
