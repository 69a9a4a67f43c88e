import fs from "node:fs";
import path from "node:path";
import type { Route } from "./+types/dev.mail";
import { db } from "~/db/index.server";
import { listOutbox } from "~/models/outbox.server";
import { env } from "~/services/env.server";
import { requirePermission } from "~/services/session.server";

// What the local SMTP stand-in received: for administrators, in development only.
export async function loader({ request }: Route.LoaderArgs) {
  if (env.NODE_ENV !== "development" || !env.MAIL_STANDIN_DIR) throw new Response("Not found", { status: 404 });
  await requirePermission(request, "mail:inspect");
  const dir = env.MAIL_STANDIN_DIR;
  const files = fs.existsSync(dir) ? fs.readdirSync(dir).filter((f) => f.endsWith(".json")).sort().reverse().slice(0, 50) : [];
  const received = files.map((f) => {
    const m = JSON.parse(fs.readFileSync(path.join(dir, f), "utf8")) as { id: string; receivedAt: string; to: string[]; subject: string; text: string };
    return { id: m.id, receivedAt: m.receivedAt, to: m.to, subject: m.subject, text: m.text };
  });
  return { received, outbox: await listOutbox(db, { limit: 50 }) };
}

export default function DevMail({ loaderData }: Route.ComponentProps) {
  return (
    <div className="space-y-8">
      <h1 className="text-step-3 font-semibold">Mail caught by the local stand-in</h1>
      <p className="text-ink-soft">Development only. Nothing here left this machine.</p>
      <ul className="space-y-4">
        {loaderData.received.map((m) => (
          <li key={m.id} className="rounded-lg border border-cloth-200 bg-white p-4">
            <p className="font-medium">{m.subject}</p>
            <p className="text-step--1 text-ink-soft">To {m.to.join(", ")} · {m.receivedAt}</p>
            <pre className="mt-2 whitespace-pre-wrap text-step--1">{m.text}</pre>
          </li>
        ))}
      </ul>
      <h2 className="text-step-2 font-semibold">Outbox</h2>
      <table className="text-step--1">
        <tbody>
          {loaderData.outbox.map((o) => (
            <tr key={o.id}><td className="pr-3">{o.toAddress}</td><td className="pr-3">{o.subject}</td><td>{o.status}</td></tr>
          ))}
        </tbody>
      </table>
    </div>
  );
}
