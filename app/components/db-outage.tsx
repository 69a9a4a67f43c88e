// The page shown while the database cannot be reached (a 503 from app/services/db-outage.server.ts):
// what happened, what to do, and everything a posted form held, ready to send again.
import { Link } from "react-router";
import { DATABASE_OUTAGE, type DatabaseOutage } from "~/domain/db-outage";
import { buttonClass, inputClass } from "./ui/form-basics";

const HIDDEN = new Set(["intent", "redirectTo", "website"]);

/** "parts[0].weight" -> "parts 1 weight": a readable label for a field name. */
function labelOf(name: string): string {
  return name
    .replace(/\[(\d+)\]/g, (_, i: string) => ` ${Number(i) + 1} `)
    .replace(/[._-]+/g, " ")
    .replace(/([a-z])([A-Z])/g, "$1 $2")
    .replace(/\s+/g, " ")
    .trim()
    .toLowerCase();
}

export function DatabaseOutagePage({ outage }: { outage: DatabaseOutage }) {
  const shown = outage.fields.filter((f) => !HIDDEN.has(f.name));
  const hidden = outage.fields.filter((f) => HIDDEN.has(f.name));
  return (
    <section className="mx-auto max-w-2xl py-12" aria-labelledby="outage-title">
      <title>{`${DATABASE_OUTAGE.title} · Sistership`}</title>
      <h1 id="outage-title" className="text-step-3 font-semibold">{DATABASE_OUTAGE.title}</h1>
      <p className="mt-4 text-ink-soft">{outage.posted ? DATABASE_OUTAGE.postedMessage : DATABASE_OUTAGE.pageMessage}</p>
      {outage.posted && shown.length > 0 ? (
        <form method="post" action={outage.action} className="mt-8 space-y-4 rounded-lg border border-cloth-300 bg-cloth-100 p-4">
          <h2 className="text-step-1 font-semibold">What you typed</h2>
          {outage.secretsLeftOut ? <p className="text-step--1 text-ink-soft">{DATABASE_OUTAGE.secretsLeftOut}</p> : null}
          {hidden.map((f, i) => <input key={`h${i}`} type="hidden" name={f.name} value={f.value} />)}
          {shown.map((f, i) => (
            <div key={i}>
              <label htmlFor={`outage-field-${i}`} className="block text-step--1 font-medium text-ink">{labelOf(f.name)}</label>
              <textarea
                id={`outage-field-${i}`}
                name={f.name}
                defaultValue={f.value}
                rows={Math.min(12, Math.max(1, f.value.split("\n").length, Math.ceil(f.value.length / 70)))}
                className={`${inputClass} mt-1`}
              />
            </div>
          ))}
          <button type="submit" className={buttonClass}>Send again</button>
        </form>
      ) : outage.page ? (
        <p className="mt-8">
          <a href={outage.page} className="font-medium">Try this page again</a>
        </p>
      ) : null}
      <p className="mt-8">
        <Link to="/" className="font-medium">Back to the home page</Link>
      </p>
    </section>
  );
}
