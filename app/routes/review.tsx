import { data, Form, Link } from "react-router";
import type { Route } from "./+types/review";
import { inputClass, Notice, quietButtonClass } from "~/components/ui/field";
import { db } from "~/db/index.server";
import { listSystemAndZoneChoices, type QueueSort, reviewQueue } from "~/models/writeup-editing.server";
import { readNotice, requirePermission } from "~/services/session.server";
import { formatDate } from "~/components/writeup-card";

export function meta() {
  return [{ title: "Waiting for review · Sistership" }];
}

const SORTS: QueueSort[] = ["waiting", "title", "author"];

export async function loader({ request }: Route.LoaderArgs) {
  await requirePermission(request, "writeup:review");
  const url = new URL(request.url);
  const sortParam = url.searchParams.get("sort") as QueueSort | null;
  const sort = sortParam && SORTS.includes(sortParam) ? sortParam : "waiting";
  const desc = url.searchParams.get("dir") === "desc";
  const system = url.searchParams.get("system") ?? "";
  const author = (url.searchParams.get("author") ?? "").slice(0, 80);
  const [{ systems }, rows, { notice, headers }] = await Promise.all([
    listSystemAndZoneChoices(db),
    reviewQueue(db, { system: system || undefined, author: author || undefined, sort, desc }),
    readNotice(request),
  ]);
  return data(
    { systems, sort, desc, system, author, notice, rows: rows.map((r) => ({ ...r, submittedAt: r.submittedAt?.toISOString() ?? null })) },
    { headers },
  );
}

function waitingFor(iso: string | null): string {
  if (!iso) return "";
  const days = Math.floor((Date.now() - Date.parse(iso)) / 86_400_000);
  return days <= 0 ? "today" : days === 1 ? "1 day" : `${days} days`;
}

export default function ReviewQueue({ loaderData }: Route.ComponentProps) {
  const { rows, systems, sort, desc, system, author, notice } = loaderData;
  const names = new Map(systems.map((s) => [s.slug, s.name]));
  const sortLink = (key: QueueSort) => {
    const p = new URLSearchParams({ sort: key, ...(system ? { system } : {}), ...(author ? { author } : {}) });
    if (key === sort && !desc) p.set("dir", "desc");
    return `?${p}`;
  };
  const sortMark = (key: QueueSort) => (key === sort ? (desc ? " ↓" : " ↑") : "");
  const ariaSort = (key: QueueSort) => (key === sort ? (desc ? "descending" : "ascending") : "none");
  return (
    <div className="space-y-6">
      <h1 className="text-step-3 font-semibold">Waiting for review</h1>
      {notice && <Notice>{notice}</Notice>}
      <Form method="get" className="flex flex-wrap items-end gap-3" role="search">
        <input type="hidden" name="sort" value={sort} />
        <div>
          <label htmlFor="system" className="block font-medium">System</label>
          <select id="system" name="system" defaultValue={system} className={`mt-1 ${inputClass}`}>
            <option value="">Any system</option>
            {systems.map((s) => <option key={s.slug} value={s.slug}>{s.name}</option>)}
          </select>
        </div>
        <div>
          <label htmlFor="author" className="block font-medium">Author</label>
          <input id="author" name="author" type="search" defaultValue={author} className={`mt-1 ${inputClass}`} />
        </div>
        <button type="submit" className={quietButtonClass}>Filter</button>
      </Form>
      {rows.length === 0 ? (
        system || author ? (
          <p className="text-ink-soft">
            No write-up waiting for review matches this filter. <Link to="/review">Show every write-up waiting</Link>.
          </p>
        ) : (
          <p className="text-ink-soft">Nothing is waiting. Thank you.</p>
        )
      ) : (
        <table className="w-full border-collapse text-left">
          <thead>
            <tr className="border-b border-cloth-300 text-step--1">
              <th scope="col" aria-sort={ariaSort("title")} className="py-2 pr-3"><Link to={sortLink("title")}>Write-up{sortMark("title")}</Link></th>
              <th scope="col" className="py-2 pr-3">Systems</th>
              <th scope="col" aria-sort={ariaSort("author")} className="py-2 pr-3"><Link to={sortLink("author")}>Author{sortMark("author")}</Link></th>
              <th scope="col" aria-sort={ariaSort("waiting")} className="py-2"><Link to={sortLink("waiting")}>Waiting since{sortMark("waiting")}</Link></th>
            </tr>
          </thead>
          <tbody>
            {rows.map((r) => (
              <tr key={r.revisionId} className="border-b border-cloth-200">
                <td className="py-2 pr-3">
                  <Link to={`/review/${r.revisionId}`}>{r.title}</Link>
                  {r.number > 1 && <span className="ml-2 text-step--1 text-ink-soft">revision {r.number}</span>}
                </td>
                <td className="py-2 pr-3 text-step--1">{r.systems.map((x) => names.get(x) ?? x).join(", ")}</td>
                <td className="py-2 pr-3">{r.author}</td>
                <td className="py-2 text-step--1">{r.submittedAt ? `${formatDate(r.submittedAt)} (${waitingFor(r.submittedAt)})` : ""}</td>
              </tr>
            ))}
          </tbody>
        </table>
      )}
    </div>
  );
}
