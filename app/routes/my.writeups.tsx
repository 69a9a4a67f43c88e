import { data, Link } from "react-router";
import type { Route } from "./+types/my.writeups";
import { buttonClass, Notice } from "~/components/ui/field";
import { db } from "~/db/index.server";
import { STATE_LABELS } from "~/domain/writeup-lifecycle";
import { listMyWriteups } from "~/models/writeup-editing.server";
import { readNotice, requirePermission } from "~/services/session.server";
import { formatDate } from "~/components/writeup-card";

export function meta() {
  return [{ title: "Your write-ups · Sistership" }];
}

export async function loader({ request }: Route.LoaderArgs) {
  const user = await requirePermission(request, "writeup:write");
  const [rows, { notice, headers }] = await Promise.all([listMyWriteups(db, user.id), readNotice(request)]);
  return data({ rows: rows.map((r) => ({ ...r, updatedAt: r.updatedAt.toISOString() })), notice }, { headers });
}

export default function MyWriteups({ loaderData }: Route.ComponentProps) {
  const { rows, notice } = loaderData;
  return (
    <div className="space-y-6">
      <div className="flex flex-wrap items-center justify-between gap-3">
        <h1 className="text-step-3 font-semibold">Your write-ups</h1>
        <Link to="/my/writeups/new" className={`${buttonClass} no-underline`}>Write up a job</Link>
      </div>
      {notice && <Notice>{notice}</Notice>}
      {rows.length === 0 ? (
        <p className="text-ink-soft">You have not written anything up yet. Every job you did on your boat helps the next owner.</p>
      ) : (
        <table className="w-full border-collapse text-left">
          <thead>
            <tr className="border-b border-cloth-300 text-step--1">
              <th scope="col" className="py-2 pr-3">Title</th>
              <th scope="col" className="py-2 pr-3">State</th>
              <th scope="col" className="py-2">Last change</th>
            </tr>
          </thead>
          <tbody>
            {rows.map((r) => (
              <tr key={r.id} className="border-b border-cloth-200">
                <td className="py-2 pr-3"><Link to={`/my/writeups/${r.id}`}>{r.latestTitle ?? r.title}</Link></td>
                <td className="py-2 pr-3">
                  {r.status === "published" && r.latestStatus !== "published" ? `Published; a new revision is “${STATE_LABELS[r.latestStatus]}”` : STATE_LABELS[r.status]}
                </td>
                <td className="py-2 text-step--1 text-ink-soft">{formatDate(r.updatedAt)}</td>
              </tr>
            ))}
          </tbody>
        </table>
      )}
    </div>
  );
}
